// SPDX-License-Identifier: MIT
// Wound inductors and ferrite beads: one model, different typical values.
#pragma once

#include <limits>
#include <string>

#include "quietrail/types.hpp"

namespace quietrail {

/// Equivalent circuit: DC resistance in series with the parallel combination of the
/// inductance, the core-loss resistance and the interwinding capacitance:
///
///   Z = R_dc + 1 / ( 1/(j*2*pi*f*L) + 1/R_core + j*2*pi*f*C_p )
///
/// For a bead, R_core dominates near f_p = 1/(2*pi*sqrt(L*C_p)) where Z ~ R_dc + R_core.
/// Form used for ferrite beads in the PI literature (e.g. Swaminathan & Engin 2007, from memory).
struct Inductor {
  /// Inductance, H. > 0. Linear model: valid at the DC bias the value was taken at.
  double inductance = 0.0;
  /// DC (winding) resistance, ohm. >= 0.
  double dc_resistance = 0.0;
  /// Interwinding (parallel) capacitance, F. >= 0; 0 = none.
  double parallel_capacitance = 0.0;
  /// Core-loss resistance in parallel with L, ohm. > 0; infinity = lossless core.
  double core_loss_resistance = std::numeric_limits<double>::infinity();

  /// Impedance at `frequency` (Hz, > 0), ohm.
  Complex impedance(double frequency) const;
  void validate(const std::string& file, const std::string& field) const;
};

}  // namespace quietrail
