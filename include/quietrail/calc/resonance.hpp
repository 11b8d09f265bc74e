// SPDX-License-Identifier: MIT
// LC resonance calculator: any two of frequency, inductance and capacitance give the
// third. A part's self-resonance with its mounting lives in calc/self_resonance.hpp.
#pragma once

#include <optional>
#include <string>

namespace quietrail {

/// Resonant frequency of an inductance and a capacitance, Hz:
///   f = 1 / (2*pi*sqrt(L*C))   (series or parallel LC; any circuits text).
/// `inductance` in H and `capacitance` in F, both finite and > 0; throws InputError
/// naming "/inductance" or "/capacitance" otherwise.
double resonant_frequency(double inductance, double capacitance);

/// Inductance that resonates with `capacitance` (F) at `frequency` (Hz), H:
///   L = 1 / ((2*pi*f)^2 * C). Both inputs finite and > 0, else InputError.
double resonant_inductance(double frequency, double capacitance);

/// Capacitance that resonates with `inductance` (H) at `frequency` (Hz), F:
///   C = 1 / ((2*pi*f)^2 * L). Both inputs finite and > 0, else InputError.
double resonant_capacitance(double frequency, double inductance);

/// Characteristic impedance (reactance of L and of C at resonance) sqrt(L/C), ohm.
/// `inductance` (H) and `capacitance` (F) finite and > 0, else InputError.
double characteristic_impedance(double inductance, double capacitance);

/// The question "which L, C or f resonates with the other two": exactly two given.
struct LcResonanceOptions {
  /// Resonant frequency, Hz. > 0 when given.
  std::optional<double> frequency{};
  /// Inductance, H. > 0 when given.
  std::optional<double> inductance{};
  /// Capacitance, F. > 0 when given.
  std::optional<double> capacitance{};

  /// Throws InputError unless exactly two fields are given and each is finite and > 0.
  /// Fields are named `path` + "/frequency" etc. in `file`.
  void validate(const std::string& file = {}, const std::string& path = {}) const;
};

/// All three quantities of the resonance plus its characteristic impedance (SI).
struct LcResonanceResult {
  double frequency = 0.0;                 ///< Hz
  double inductance = 0.0;                ///< H
  double capacitance = 0.0;               ///< F
  double characteristic_impedance = 0.0;  ///< sqrt(L/C), ohm
};

/// Completes an LC resonance from two of its three quantities (formulas above).
/// Validates first. Example: {.frequency = 10e6, .capacitance = 1e-12} -> L = 253.3 uH.
LcResonanceResult lc_resonance(const LcResonanceOptions& options);

}  // namespace quietrail
