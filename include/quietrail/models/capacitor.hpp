// SPDX-License-Identifier: MIT
// A real capacitor as a frequency-domain impedance: series ESR and ESL around a
// capacitance shunted by leakage and dielectric loss. Mounting lives in mounting.hpp.
#pragma once

#include <limits>
#include <string>

#include "quietrail/types.hpp"

namespace quietrail {

/// Equivalent circuit (every term optional except C):
///
///   ESR(f) + j*2*pi*f*ESL + 1 / (G(f) + j*2*pi*f*C)
///   G(f)   = 1/R_leak + 2*pi*f*C*tan(delta)          (leakage, then dielectric loss)
///   ESR(f) = ESR                         for f <= f_skin
///          = ESR * sqrt(f / f_skin)      for f >  f_skin (conductor skin effect)
///
/// Series RLC: any circuits text. Constant-tan(delta) dielectric loss as a shunt
/// conductance omega*C*tan(delta) is the standard lossy-capacitor form; the sqrt(f)
/// conductor rise follows from skin depth ~ 1/sqrt(f) (Ramo, Whinnery & Van Duzer).
struct Capacitor {
  /// Capacitance, F. Must be > 0 and finite.
  double capacitance = 0.0;
  /// Equivalent series resistance at low frequency, ohm. >= 0.
  double esr = 0.0;
  /// Equivalent series inductance of the body alone, H. >= 0. Mounting adds to it.
  double esl = 0.0;
  /// Insulation (leakage) resistance across C, ohm. > 0; infinity = none (default).
  double leakage_resistance = std::numeric_limits<double>::infinity();
  /// Dissipation factor tan(delta) of the dielectric, dimensionless, >= 0. 0 = none.
  double dissipation_factor = 0.0;
  /// Frequency above which the ESR rises as sqrt(f / f_skin), Hz. 0 = no rise (default).
  double skin_corner = 0.0;

  /// Impedance at `frequency` (Hz, > 0), ohm.
  Complex impedance(double frequency) const;
  /// Series resistance at `frequency` including the skin-effect rise, ohm.
  double esr_at(double frequency) const;
  /// Throws InputError naming `field` (e.g. "/branches/2") for any out-of-domain value.
  void validate(const std::string& file, const std::string& field) const;
};

}  // namespace quietrail
