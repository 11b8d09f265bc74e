// SPDX-License-Identifier: MIT
#include "quietrail/models/capacitor.hpp"

#include <cmath>

#include "quietrail/error.hpp"
#include "detail/checks.hpp"

namespace quietrail {

double Capacitor::esr_at(double frequency) const {
  if (skin_corner > 0.0 && frequency > skin_corner) return esr * std::sqrt(frequency / skin_corner);
  return esr;
}

Complex Capacitor::impedance(double frequency) const {
  const double w = omega(frequency);
  const double g = 1.0 / leakage_resistance + w * capacitance * dissipation_factor;
  return Complex(esr_at(frequency), w * esl) + 1.0 / Complex(g, w * capacitance);
}

void Capacitor::validate(const std::string& file, const std::string& field) const {
  detail::require_positive(capacitance, file, field + "/capacitance", "F");
  detail::require_non_negative(esr, file, field + "/esr", "ohm");
  detail::require_non_negative(esl, file, field + "/esl", "H");
  detail::require_positive_or_infinite(leakage_resistance, file, field + "/leakage_resistance", "ohm");
  detail::require_non_negative(dissipation_factor, file, field + "/dissipation_factor", "");
  detail::require_non_negative(skin_corner, file, field + "/skin_corner", "Hz");
}

}  // namespace quietrail
