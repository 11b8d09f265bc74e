// SPDX-License-Identifier: MIT
// Engineering notation in and out: "100n", "4u7", "10MHz" to doubles and back.
// Parsing belongs at the input boundary (io/, cli/); the library works in SI doubles.
#pragma once

#include <string>
#include <string_view>

#include "quietrail/error.hpp"

namespace quietrail {

/// Parses a value in engineering notation, in the base unit of `unit` (e.g. "F", "Hz",
/// "ohm", "H", "m", or "" for a bare number).
///
/// Accepted: plain and scientific numbers ("1e-9", "0.5"), an SI prefix letter
/// (f p n u µ m k M G T; "meg" too), the prefix as decimal point as in IEC 60062 ("4u7",
/// "2k2", "R47" for ohms), optionally followed by the unit ("100nF", "10MHz", "2.2kohm",
/// "50mΩ") with or without a space. The unit, if written, must match `unit` (case-
/// insensitive for the unit word, never for the prefix: "m" is milli, "M" mega).
/// Throws InputError at `where` naming the text and what was expected. NaN and
/// infinities are rejected.
double parse_value(std::string_view text, std::string_view unit, const InputLocation& where);

/// Formats `value` in engineering notation with `significant` digits and the unit:
/// 1e-7, "F" -> "100 nF"; 0.0 -> "0 F"; infinity -> "inf F".
std::string format_value(double value, std::string_view unit, int significant = 4);

}  // namespace quietrail
