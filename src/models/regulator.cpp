// SPDX-License-Identifier: MIT
#include "quietrail/models/regulator.hpp"

#include "detail/checks.hpp"

namespace quietrail {

Regulator Regulator::from_bandwidth(double resistance, double flat_impedance, double bandwidth) {
  detail::require_non_negative(resistance, "", "regulator resistance", "ohm");
  detail::require_positive(flat_impedance, "", "regulator flat impedance", "ohm");
  detail::require_positive(bandwidth, "", "regulator bandwidth", "Hz");
  return Regulator{resistance, flat_impedance / (kTwoPi * bandwidth)};
}

void Regulator::validate(const std::string& file, const std::string& field) const {
  detail::require_non_negative(resistance, file, field + "/resistance", "ohm");
  detail::require_non_negative(inductance, file, field + "/inductance", "H");
}

}  // namespace quietrail
