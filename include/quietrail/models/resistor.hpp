// SPDX-License-Identifier: MIT
// A resistor with optional series inductance (damping parts, sense resistors, probes).
#pragma once

#include <string>

#include "quietrail/types.hpp"

namespace quietrail {

/// Z = R + j*2*pi*f*L_series.
struct Resistor {
  /// Resistance, ohm. >= 0 (a zero resistor without inductance is an ideal short,
  /// which the network rejects).
  double resistance = 0.0;
  /// Series (body) inductance, H. >= 0.
  double series_inductance = 0.0;

  Complex impedance(double frequency) const {
    return Complex(resistance, omega(frequency) * series_inductance);
  }
  void validate(const std::string& file, const std::string& field) const;
};

}  // namespace quietrail
