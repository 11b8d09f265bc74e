// SPDX-License-Identifier: MIT
// A power/ground plane pair as a lumped element: parallel-plate capacitance with
// dielectric loss, in series with the spreading inductance to the load.
#pragma once

#include <string>

#include "quietrail/types.hpp"

namespace quietrail {

/// Lumped plane pair, valid well below the first cavity resonance (calc/plane.hpp):
///
///   C = eps0 * er * A / d                             (parallel-plate capacitance)
///   Z = R_s + j*2*pi*f*L_s + 1 / (j*2*pi*f*C * (1 - j*tan(delta)))
///
/// The loss tangent makes the admittance G + jB with G = omega*C*tan(delta).
/// Sources: parallel-plate physics; lossy dielectric as complex permittivity (Pozar,
/// Microwave Engineering, ch. 1).
struct PlanePair {
  /// Overlapping area of the two planes, m^2. > 0.
  double area = 0.0;
  /// Dielectric thickness between the planes, m. > 0.
  double separation = 0.0;
  /// Relative permittivity of the dielectric. >= 1. FR-4 is about 4.2-4.7 (from memory).
  double relative_permittivity = 4.3;
  /// Dielectric loss tangent. >= 0. FR-4 about 0.015-0.02 near 1 GHz (from memory).
  double loss_tangent = 0.0;
  /// Lumped spreading inductance from the plane to the load port, H. >= 0.
  double spreading_inductance = 0.0;
  /// Lumped series resistance of the planes, ohm. >= 0.
  double series_resistance = 0.0;

  /// Parallel-plate capacitance, F.
  double capacitance() const;
  /// Impedance at `frequency` (Hz, > 0), ohm.
  Complex impedance(double frequency) const;
  void validate(const std::string& file, const std::string& field) const;
};

}  // namespace quietrail
