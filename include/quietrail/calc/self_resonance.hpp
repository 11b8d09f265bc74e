// SPDX-License-Identifier: MIT
// A capacitor's self-resonance with its mounting: SRF, |Z| at SRF, characteristic
// reactance, resonant Q and the capacitive band. Builds on models/part_response.hpp.
#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "quietrail/models/capacitor.hpp"
#include "quietrail/models/mounting.hpp"
#include "quietrail/models/part_response.hpp"

namespace quietrail {

/// Where the mounting inductance of a self-resonance calculation came from.
enum class MountingSource {
  none,             ///< no mounting: the bare part
  given,            ///< an explicit value
  typical_package,  ///< typical_mounting_inductance(package)
  geometry,         ///< MountingGeometry::inductance()
};

/// "none", "given", "typical-package" or "geometry".
std::string_view to_string(MountingSource source);

/// A capacitor and at most one description of its mounting.
struct SelfResonanceOptions {
  /// The part: capacitance (F, > 0), ESR (ohm, >= 0), ESL of the body (H, >= 0); the
  /// other Capacitor fields (leakage, dissipation, skin corner) shape the capacitive band.
  Capacitor capacitor{};
  /// Explicit mounting loop inductance, H, >= 0.
  std::optional<double> mounting_inductance{};
  /// Package whose typical mounting inductance to use (models/mounting.hpp).
  std::optional<Package> package{};
  /// Mounting geometry whose loop inductance to use (models/mounting.hpp).
  std::optional<MountingGeometry> geometry{};

  /// Throws InputError for an out-of-domain part or geometry value, when more than one
  /// mounting source is given ("/mounting_inductance"), or when ESL plus mounting is zero
  /// ("/esl": an ideal capacitor has no self-resonance).
  void validate(const std::string& file = {}, const std::string& path = {}) const;
};

/// The mounted part at its self-resonance (SI units).
struct SelfResonanceResult {
  /// Which mounting description was used.
  MountingSource mounting_source = MountingSource::none;
  /// Mounting inductance used, H.
  double mounting_inductance = 0.0;
  /// Body ESL plus mounting, H.
  double total_inductance = 0.0;
  /// Self-resonant frequency 1/(2*pi*sqrt(L_total*C)), Hz.
  double frequency = 0.0;
  /// |Z| of the mounted part evaluated at the SRF, ohm (equals the ESR for the series RLC).
  double impedance_at_resonance = 0.0;
  /// Characteristic reactance X0 = sqrt(L_total/C), ohm.
  double characteristic_reactance = 0.0;
  /// Resonant Q = X0 / ESR, with the ESR taken at the SRF (Capacitor::esr_at); infinity
  /// when that ESR is zero.
  double quality_factor = 0.0;
  /// Band where the mounted part acts as a capacitor (phase below -45 deg); see
  /// capacitive_band() in models/part_response.hpp. Empty when ESR > X0.
  std::optional<Band> capacitive_band{};
};

/// Self-resonance of a mounted capacitor (series RLC, any circuits text; REFERENCES:
/// SRF = 1/(2*pi*sqrt(L C)), |Z(SRF)| = ESR, X0 = sqrt(L/C), Q = X0/ESR).
/// Validates first. Example: 100 nF, 0.5 nH, 20 mohm -> 22.51 MHz, X0 70.71 mohm, Q 3.536.
SelfResonanceResult self_resonance(const SelfResonanceOptions& options);

}  // namespace quietrail
