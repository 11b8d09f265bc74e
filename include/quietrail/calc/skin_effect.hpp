// SPDX-License-Identifier: MIT
// Skin depth, surface resistance and the AC resistance of a round conductor: the thin-
// skin form, the annulus form and the exact Bessel solution (calc/bessel.hpp).
#pragma once

#include <string>

#include "quietrail/types.hpp"

namespace quietrail {

/// Skin depth of a good conductor, m:
///   delta = sqrt(rho / (pi f mu0 mu_r))
/// `frequency` in Hz (> 0), `resistivity` in ohm*m (> 0; default annealed copper, IACS,
/// 1.724e-8) and `relative_permeability` (> 0; 1 for copper and other non-magnetic metals).
/// Source: Ramo, Whinnery & Van Duzer, "Fields and Waves in Communication Electronics";
/// W. C. Johnson, "Transmission Lines and Networks", 1963. Throws InputError naming
/// "/frequency", "/resistivity" or "/relative_permeability".
double skin_depth(double frequency, double resistivity = kCopperResistivity,
                  double relative_permeability = 1.0);

/// Surface resistance Rs = rho / delta = sqrt(pi f mu0 mu_r rho), ohm per square.
/// Same inputs, domain and sources as skin_depth().
double surface_resistance(double frequency, double resistivity = kCopperResistivity,
                          double relative_permeability = 1.0);

/// Internal impedance of a round conductor relative to its DC resistance, exact for an
/// isolated straight wire with the return path far away:
///   Z / R_dc = (k r / 2) J0(k r) / J1(k r),   k = (1 - j) / delta
/// `radius_over_skin_depth` = r / delta, finite and > 0 (else InputError naming
/// "/radius_over_skin_depth"). The real part is R_ac / R_dc; the imaginary part is
/// omega L_internal / R_dc. Source: Ramo, Whinnery & Van Duzer (round-wire internal
/// impedance; standard form, from memory). Tends to 1 + j (r/delta)^2 / 4 at low frequency
/// and to (1 + j) r/(2 delta) + 1/4 at high frequency.
Complex round_wire_impedance_ratio(double radius_over_skin_depth);

/// A round conductor at one frequency.
struct RoundConductorOptions {
  /// Frequency, Hz. > 0.
  double frequency = 0.0;
  /// Conductor diameter, m. > 0.
  double diameter = 0.0;
  /// Conductor length, m. > 0. The default 1 m gives per-metre values.
  double length = 1.0;
  /// Resistivity, ohm*m. > 0. Default: annealed copper at 20 C (IACS), 1.724e-8.
  double resistivity = kCopperResistivity;
  /// Relative permeability of the conductor. > 0. Default 1 (copper is non-magnetic).
  double relative_permeability = 1.0;

  /// Throws InputError naming `path` + "/frequency", "/diameter", "/length",
  /// "/resistivity" or "/relative_permeability".
  void validate(const std::string& file = {}, const std::string& path = {}) const;
};

/// Skin-effect figures of a round conductor (SI units; resistances for the given length).
struct RoundConductorResult {
  /// Skin depth, m.
  double skin_depth = 0.0;
  /// Surface resistance, ohm per square.
  double surface_resistance = 0.0;
  /// r / delta (the only parameter of the exact solution).
  double radius_over_skin_depth = 0.0;
  /// DC resistance rho l / (pi r^2), ohm.
  double dc_resistance = 0.0;
  /// Thin-skin form rho l / (2 pi r delta), ohm; only meaningful when delta << r
  /// (about 10 % low at r/delta = 5; below R_dc when delta > r/2).
  double thin_skin_resistance = 0.0;
  /// Annulus form rho l / (pi (2 r delta - delta^2)), ohm; the whole cross-section
  /// (R_dc) when delta >= r. Within about 0.5 % of exact at r/delta = 5.
  double annulus_resistance = 0.0;
  /// Exact R_ac = R_dc * Re(Z/R_dc) from the Bessel solution, ohm.
  double exact_resistance = 0.0;
  /// R_ac / R_dc from the Bessel solution.
  double resistance_ratio = 0.0;
  /// Internal inductance R_dc * Im(Z/R_dc) / omega, H (mu0 l / (8 pi) at DC).
  double internal_inductance = 0.0;
};

/// Skin depth and AC resistance of a round conductor (formulas above). Validates first.
/// Example: 0.644 mm copper at 1 MHz -> delta 66.08 um, R_dc 52.93 mohm/m, exact
/// 143.2 mohm/m (ratio 2.705).
RoundConductorResult round_conductor(const RoundConductorOptions& options);

}  // namespace quietrail
