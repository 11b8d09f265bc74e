// SPDX-License-Identifier: MIT
// One-line domain checks used by the models' validate(): each names the field.
#pragma once

#include <cmath>
#include <string>
#include <string_view>

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

namespace quietrail::detail {

/// 'name' in single quotes, for messages. Built by appending: GCC 12 warns falsely
/// (-Wrestrict) on "'" + std::string + "'".
inline std::string quoted(std::string_view name) {
  std::string out;
  out.reserve(name.size() + 2);
  out.push_back('\'');
  out.append(name);
  out.push_back('\'');
  return out;
}

}  // namespace quietrail::detail
