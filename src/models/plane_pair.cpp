// SPDX-License-Identifier: MIT
#include "quietrail/models/plane_pair.hpp"

#include "detail/checks.hpp"

namespace quietrail {

double PlanePair::capacitance() const { return kEps0 * relative_permittivity * area / separation; }

Complex PlanePair::impedance(double frequency) const {
  const double w = omega(frequency);
  const double c = capacitance();
  return Complex(series_resistance, w * spreading_inductance) + 1.0 / Complex(w * c * loss_tangent, w * c);
}

void PlanePair::validate(const std::string& file, const std::string& field) const {
  detail::require_positive(area, file, field + "/area", "m^2");
  detail::require_positive(separation, file, field + "/separation", "m");
  require_input(std::isfinite(relative_permittivity) && relative_permittivity >= 1.0,
                {file, field + "/relative_permittivity"}, "a relative permittivity >= 1",
                detail::describe_number(relative_permittivity, ""));
  detail::require_non_negative(loss_tangent, file, field + "/loss_tangent", "");
  detail::require_non_negative(spreading_inductance, file, field + "/spreading_inductance", "H");
  detail::require_non_negative(series_resistance, file, field + "/series_resistance", "ohm");
}

}  // namespace quietrail
