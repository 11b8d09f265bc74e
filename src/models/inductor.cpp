// SPDX-License-Identifier: MIT
#include "quietrail/models/inductor.hpp"

#include "detail/checks.hpp"

namespace quietrail {

Complex Inductor::impedance(double frequency) const {
  const double w = omega(frequency);
  // Admittance of the parallel tank: -j/(wL) + 1/R_core + j*w*C_p.
  const Complex y(1.0 / core_loss_resistance, w * parallel_capacitance - 1.0 / (w * inductance));
  return dc_resistance + 1.0 / y;
}

void Inductor::validate(const std::string& file, const std::string& field) const {
  detail::require_positive(inductance, file, field + "/inductance", "H");
  detail::require_non_negative(dc_resistance, file, field + "/dc_resistance", "ohm");
  detail::require_non_negative(parallel_capacitance, file, field + "/parallel_capacitance", "F");
  detail::require_positive_or_infinite(core_loss_resistance, file, field + "/core_loss_resistance", "ohm");
}

}  // namespace quietrail
