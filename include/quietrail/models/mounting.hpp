// SPDX-License-Identifier: MIT
// Mounting inductance: what the pads, fan-out traces and vias add in series with a
// part's own ESL. Either a typical value per package or computed from geometry.
#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace quietrail {

/// Surface-mount package size codes (EIA inch codes) for which typical values exist.
enum class Package { p0201, p0402, p0603, p0805, p1206, p1210 };

/// "0402" etc.
std::string_view to_string(Package package);
/// Parses "0402" (also "case 0402"); std::nullopt for an unknown code.
std::optional<Package> parse_package(std::string_view text);

/// Typical mounting loop inductance of `package` (pads, short fan-out, a via pair to a
/// plane pair near the surface), excluding the body ESL, H.
/// Typical, from memory: mid-range mounted-loop totals for short fan-out minus mid-range
/// body ESL (0402 0.4-1.0 nH total, 0.3-0.5 nH body; 0603 0.6-1.5 / 0.4-0.8; 0805 0.8-2.0 /
/// 0.5-1.0; 1206 1.0-2.5 / 0.8-1.2), extrapolated for 0201 and 1210. Planning defaults only.
double typical_mounting_inductance(Package package);

/// Mounting described by its geometry. All lengths in m.
///
/// L = L_traces + L_vias, where
///   L_traces = mu0 * h_trace * (2 * trace_length) / trace_width
///              (two fan-out traces over the nearest plane, wide-trace sheet approximation;
///               Bogatin, Signal and Power Integrity - Simplified, 2009)
///   L_vias   = (mu0 * via_length / pi) * acosh(via_pitch / via_diameter) / vias_per_terminal
///              (two-wire line of via length and centre spacing s with radius r = d/2,
///               acosh(s/2r); any EM text, used for via pairs by Bogatin. Parallel via pairs
///               are taken as independent, which ignores their mutual inductance and so
///               is optimistic.)
struct MountingGeometry {
  /// Via length from the part's layer to the plane pair (plane depth), m. > 0.
  double via_length = 0.0;
  /// Finished via barrel diameter, m. > 0.
  double via_diameter = 0.0;
  /// Centre-to-centre spacing of the power and ground vias, m. > via_diameter.
  double via_pitch = 0.0;
  /// Length of each fan-out trace from pad to via, m. >= 0 (0 = via in or beside pad).
  double trace_length = 0.0;
  /// Width of the fan-out traces, m. > 0 when trace_length > 0.
  double trace_width = 0.0;
  /// Height of the trace above its reference plane, m. > 0 when trace_length > 0.
  double trace_height = 0.0;
  /// Via pairs in parallel (vias per terminal). >= 1.
  int vias_per_terminal = 1;

  /// Loop inductance of the mounting, H.
  double inductance() const;
  void validate(const std::string& file, const std::string& field) const;
};

}  // namespace quietrail
