// SPDX-License-Identifier: MIT
#include "quietrail/models/resistor.hpp"

#include "detail/checks.hpp"

namespace quietrail {

void Resistor::validate(const std::string& file, const std::string& field) const {
  detail::require_non_negative(resistance, file, field + "/resistance", "ohm");
  detail::require_non_negative(series_inductance, file, field + "/series_inductance", "H");
}

}  // namespace quietrail
