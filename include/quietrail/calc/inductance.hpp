// SPDX-License-Identifier: MIT
// Partial self-inductance of straight round conductors: a wire (Rosa / Grover), a single
// via (Johnson & Graham) and the loop of a power/return via pair (two-wire line).
#pragma once

#include <optional>
#include <string>

namespace quietrail {

/// Diameter of American Wire Gauge `gauge`, m:
///   d = 0.127 mm * 92^((36 - n) / 39)   (ASTM B258 definition of the gauge series).
/// Gauges 0, 00, 000, 0000 are n = 0, -1, -2, -3. Valid for -3 <= n <= 56, else
/// InputError naming "/awg".
double awg_diameter(int gauge);

/// A straight round wire far from other conductors.
struct WireInductanceOptions {
  /// Wire length, m. > 0 and longer than the diameter (the formulas assume l >> r).
  double length = 0.0;
  /// Wire diameter, m. > 0.
  double diameter = 0.0;

  /// Throws InputError naming `path` + "/length" or "/diameter" for bad values.
  void validate(const std::string& file = {}, const std::string& path = {}) const;
};

/// Partial self-inductance of the wire by three published forms, H.
struct WireInductanceResult {
  /// Low-frequency (uniform current) form, Rosa 1908:
  ///   L = (mu0 l / 2 pi) [ln(2l/r) - 3/4]   (= 2 l [ln(2l/r) - 3/4] nH with l, r in cm).
  double low_frequency = 0.0;
  /// High-frequency (surface current) form, Rosa 1908 / Wadell 1991 sec. 6.2.1.1:
  ///   L = (mu0 l / 2 pi) [ln(2l/r) - 1].
  double high_frequency = 0.0;
  /// Fuller low-frequency form without l >> r, Rosa & Grover 1912 / Grover 1946:
  ///   L = (mu0 l / 2 pi) [ln((l + sqrt(l^2 + r^2))/r) - sqrt(1 + r^2/l^2) + r/l + 1/4].
  double exact_low_frequency = 0.0;
};

/// Partial self-inductance of a straight round wire (forms above). Validates first.
/// Sources: E. B. Rosa, Bull. Bureau of Standards 4(2), 1908; F. W. Grover, "Inductance
/// Calculations", 1946. Example: 2 in of 22 AWG -> 50.84 nH (LF), 48.30 nH (HF).
WireInductanceResult wire_inductance(const WireInductanceOptions& options);

/// A via through a board, optionally with a return via beside it.
struct ViaInductanceOptions {
  /// Via length (board or plane depth), m. > 0.
  double length = 0.0;
  /// Barrel diameter, m. > 0.
  double diameter = 0.0;
  /// Centre spacing to a parallel return via, m. > diameter when given.
  std::optional<double> pitch{};

  /// Throws InputError naming `path` + "/length", "/diameter" or "/pitch" for bad values,
  /// including a length below d / (4e), where ln(4h/d) + 1 and so the inductance turn negative.
  void validate(const std::string& file = {}, const std::string& path = {}) const;
};

/// Via inductances, H.
struct ViaInductanceResult {
  /// Partial inductance of the single via (return path ignored), Johnson & Graham 1993:
  ///   L = (mu0 h / 2 pi) [ln(4h/d) + 1]   (= 5.08 h [ln(4h/d) + 1] nH with h, d in inches).
  double single = 0.0;
  /// Loop inductance of the via pair (two-wire line), when a pitch is given:
  ///   L = (mu0 h / pi) acosh(s / 2r)   (any EM text; used for via pairs by Bogatin 2009).
  std::optional<double> pair{};
  /// The same loop with the common approximation acosh(x) ~ ln(2x): (mu0 h / pi) ln(s / r).
  std::optional<double> pair_log_form{};
};

/// Via inductance (forms above). Validates first. Source: H. Johnson & M. Graham,
/// "High-Speed Digital Design", Prentice Hall 1993, section on vias.
/// Example: 0.063 in long, 0.016 in diameter -> 1.202 nH.
ViaInductanceResult via_inductance(const ViaInductanceOptions& options);

}  // namespace quietrail
