// SPDX-License-Identifier: MIT
// The regulator (VRM) output seen from the rail: a rising, inductive impedance.
#pragma once

#include <string>

#include "quietrail/types.hpp"

namespace quietrail {

/// Two-element output model Z = R_out + j*2*pi*f*L_out (series R-L VRM model as used
/// in Smith et al., IEEE Trans. Adv. Packaging 1999; reduction of the 4-element model
/// of Hsiung et al., IEEE EDAPS 2012). Real regulators are active and may peak; this is
/// a first-order planning model.
struct Regulator {
  /// Output resistance, ohm. >= 0.
  double resistance = 0.0;
  /// Output inductance, H. >= 0.
  double inductance = 0.0;

  /// L_out from the loop bandwidth: the regulator holds about `flat_impedance` up to
  /// `bandwidth`, where omega*L_out equals it: L_out = Z_flat / (2*pi*f_bw).
  /// R_out is set to `resistance`. Throws InputError for non-positive values.
  static Regulator from_bandwidth(double resistance, double flat_impedance, double bandwidth);

  Complex impedance(double frequency) const {
    return Complex(resistance, omega(frequency) * inductance);
  }
  void validate(const std::string& file, const std::string& field) const;
};

}  // namespace quietrail
