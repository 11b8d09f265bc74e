// SPDX-License-Identifier: MIT
#include "detail/checks.hpp"

#include <sstream>

namespace quietrail::detail {

std::string describe_number(double value, const std::string& unit) {
  if (std::isnan(value)) return "NaN";
  std::ostringstream out;
  out.precision(6);
  out << value;
  if (!unit.empty()) out << ' ' << unit;
  return out.str();
}

}  // namespace quietrail::detail
