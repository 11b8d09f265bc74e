// SPDX-License-Identifier: MIT
// Plane-pair calculators: parallel-plate capacitance, sheet (loop) inductance per
// square and the resonant modes of a rectangular plane cavity with open edges.
#pragma once

#include <cstddef>
#include <limits>
#include <string>
#include <vector>

namespace quietrail {

/// Parallel-plate capacitance C = eps0 er A / d, F (fringing neglected).
/// `area` m^2 > 0, `separation` m > 0, `relative_permittivity` >= 1; else InputError
/// naming "/area", "/separation" or "/relative_permittivity". Source: parallel-plate physics.
double plane_capacitance(double area, double separation, double relative_permittivity);

/// Sheet (loop) inductance of a plane pair, mu0 h, H per square (31.9 pH/sq per mil of
/// separation). `separation` m > 0, else InputError naming "/separation".
/// Source: E. Bogatin, "Signal and Power Integrity - Simplified", 2009.
double plane_sheet_inductance(double separation);

/// A rectangular plane pair.
struct PlanePairOptions {
  /// Plane length (first side), m. > 0.
  double length = 0.0;
  /// Plane width (second side), m. > 0.
  double width = 0.0;
  /// Dielectric thickness between the planes, m. > 0.
  double separation = 0.0;
  /// Relative permittivity of the dielectric, >= 1. Default 4.3, a mid FR-4 value
  /// (FR-4 is about 4.2-4.7 near 1 GHz; from memory).
  double relative_permittivity = 4.3;

  /// Throws InputError naming `path` + "/length", "/width", "/separation" or
  /// "/relative_permittivity".
  void validate(const std::string& file = {}, const std::string& path = {}) const;
};

/// Lumped figures of a plane pair (SI units).
struct PlanePairResult {
  /// Overlap area, m^2.
  double area = 0.0;
  /// Capacitance eps0 er A / d, F.
  double capacitance = 0.0;
  /// Capacitance per area eps0 er / d, F/m^2.
  double capacitance_per_area = 0.0;
  /// Sheet inductance mu0 h, H per square.
  double sheet_inductance = 0.0;
};

/// Capacitance and sheet inductance of a rectangular plane pair. Validates first.
/// Example: 10 x 8 in, 4 mil, er 4.3 -> 19.34 nF, 127.7 pH/sq.
PlanePairResult plane_pair(const PlanePairOptions& options);

/// A rectangular cavity formed by a plane pair with open (magnetic-wall) edges.
struct CavityOptions {
  /// Side a (along which index m counts), m. > 0.
  double length = 0.0;
  /// Side b (along which index n counts), m. > 0.
  double width = 0.0;
  /// Relative permittivity of the dielectric, >= 1. Default 4.3 (mid FR-4, from memory).
  double relative_permittivity = 4.3;
  /// Highest mode frequency to list, Hz. > 0; infinity (default) = no limit.
  double max_frequency = std::numeric_limits<double>::infinity();
  /// Most modes to list, 1..1000. Default 10: the first few modes are the ones that
  /// matter for a decoupling plan.
  int count = 10;

  /// Throws InputError naming `path` + "/length", "/width", "/relative_permittivity",
  /// "/max_frequency" or "/count".
  void validate(const std::string& file = {}, const std::string& path = {}) const;
};

/// One cavity mode TM_mn (field uniform across the thickness).
struct CavityMode {
  int m = 0;               ///< half-wavelengths along the length
  int n = 0;               ///< half-wavelengths along the width
  double frequency = 0.0;  ///< Hz
};

/// Resonant modes of the cavity, lowest first (ties by m, then n), excluding the static
/// (0,0) mode, at most `count` of them and none above `max_frequency`:
///   f_mn = c / (2 sqrt(er)) * sqrt((m/a)^2 + (n/b)^2)
/// Validates first. Sources: Hubing, Drewniak, Van Doren & Hockanson, IEEE Trans. EMC
/// 37(2), 1995 (from memory); D. M. Pozar, "Microwave Engineering" (cavity theory).
/// Example: 10 x 8 in, er 4.3 -> 284.6, 355.7, 455.6, 569.2, 671.2 MHz, ...
std::vector<CavityMode> cavity_modes(const CavityOptions& options);

}  // namespace quietrail
