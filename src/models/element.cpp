// SPDX-License-Identifier: MIT
#include "quietrail/models/element.hpp"

#include "detail/checks.hpp"
#include "detail/overloaded.hpp"

namespace quietrail {
std::string_view element_kind(const Element& element) {
  return std::visit(detail::Overloaded{
                        [](const Capacitor&) { return std::string_view("capacitor"); },
                        [](const Inductor&) { return std::string_view("inductor"); },
                        [](const Resistor&) { return std::string_view("resistor"); },
                        [](const Regulator&) { return std::string_view("regulator"); },
                        [](const PlanePair&) { return std::string_view("plane"); },
                    },
                    element);
}

Complex element_impedance(const Element& element, double frequency) {
  return std::visit([frequency](const auto& e) { return e.impedance(frequency); }, element);
}

void validate_element(const Element& element, const std::string& file, const std::string& field) {
  std::visit([&](const auto& e) { e.validate(file, field); }, element);
}

Complex MountedPart::impedance(double frequency) const {
  return (element_impedance(element, frequency) + Complex(0.0, omega(frequency) * mounting_inductance)) /
         static_cast<double>(count);
}

void MountedPart::validate(const std::string& file, const std::string& field) const {
  validate_element(element, file, field);
  detail::require_non_negative(mounting_inductance, file, field + "/mounting_inductance", "H");
  require_input(count >= 1, {file, field + "/count"}, "a whole number of parts >= 1",
                std::to_string(count));
}

}  // namespace quietrail
