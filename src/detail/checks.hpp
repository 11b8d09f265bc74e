// SPDX-License-Identifier: MIT
// One-line domain checks used by the models' validate(): each names the field.
#pragma once

#include <cmath>
#include <string>

#include "quietrail/error.hpp"

namespace quietrail::detail {

std::string describe_number(double value, const std::string& unit);

inline void require_finite(double v, const std::string& file, const std::string& field,
                           const std::string& unit) {
  require_input(std::isfinite(v), {file, field}, "a finite number" + (unit.empty() ? "" : " in " + unit),
                describe_number(v, unit));
}
inline void require_positive(double v, const std::string& file, const std::string& field,
                             const std::string& unit) {
  require_input(std::isfinite(v) && v > 0.0, {file, field},
                "a finite value > 0" + (unit.empty() ? "" : " " + unit), describe_number(v, unit));
}
inline void require_non_negative(double v, const std::string& file, const std::string& field,
                                 const std::string& unit) {
  require_input(std::isfinite(v) && v >= 0.0, {file, field},
                "a finite value >= 0" + (unit.empty() ? "" : " " + unit), describe_number(v, unit));
}
inline void require_positive_or_infinite(double v, const std::string& file, const std::string& field,
                                         const std::string& unit) {
  require_input(!std::isnan(v) && v > 0.0, {file, field},
                "a value > 0" + (unit.empty() ? "" : " " + unit) + " (or none)", describe_number(v, unit));
}

}  // namespace quietrail::detail
