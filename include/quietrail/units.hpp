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
/// Accepted: plain and scientific numbers ("1e-9", "0.5", "-5"), an SI prefix letter
/// (f p n u µ m k M G T; "meg"/"MEG" too, and "K" as IEC 60062 writes kilo), the prefix as
/// decimal point as in IEC 60062 ("4u7", "2k2", "p68"; for ohms also R: "R47", "4R7",
/// "10R"), optionally followed by the unit ("100nF", "10MHz", "2.2kohm", "50mΩ") with or
/// without a space. The unit, if written, must match `unit` (case-insensitive for the
/// unit word, never for the prefix: "m" is milli, "M" mega); "ohm", "ohms", U+03A9 and
/// U+2126 all spell ohm. A lone prefix letter is always a prefix, so "5m" is 5e-3 even
/// when `unit` is "m" and "5f" is 5e-15 for "F" (write "5 F" for farads).
/// Prefix factors: BIPM SI brochure, 9th ed. 2019, table 7.
///
/// Rejected: empty text, trailing junk ("100x", "1,5"), a different unit ("10nH" for
/// "F"), two multipliers ("10nnF", "2k2k", "1e3k"), NaN, infinities and values that
/// overflow a double. Throws InputError at `where` naming the text and what was expected
/// (e.g. "a capacitance such as 100n, 100nF, 4u7 or 1e-7"). Independent of the C locale.
double parse_value(std::string_view text, std::string_view unit, const InputLocation& where);

/// Formats `value` in engineering notation with `significant` digits (1..17) and the unit:
/// 1e-7, "F" -> "100 nF"; 4.7e-6 -> "4.7 uF" (ASCII "u" for micro); 22.508e6, "Hz" ->
/// "22.51 MHz"; 0.0 -> "0 F"; infinity -> "inf F"; 2500, "" -> "2.5 k". Trailing zeros are
/// trimmed; prefixes run from f to T, and values beyond them are written in scientific
/// notation ("2e-18 F", "5e+15 Hz").
/// The result parses back with parse_value to within half a unit in the last digit.
std::string format_value(double value, std::string_view unit, int significant = 4);

}  // namespace quietrail
