// SPDX-License-Identifier: MIT
// Engineering-notation parsing and formatting (see units.hpp). A small hand-written
// scanner: mantissa, optional IEC 60062 letter-as-decimal-point, prefix, unit.
#include "quietrail/units.hpp"

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <optional>

namespace quietrail {
namespace {

struct Prefix {
  std::string_view text;
  double scale;
};

// SI prefixes (BIPM SI brochure, 9th ed., table 7) that matter on a board, the micro
// sign and Greek mu as they arrive from copy-paste, "u" as the ASCII stand-in, "K" as
// IEC 60062 writes kilo in resistance codes, and "meg" as circuit netlists write mega.
// Longer spellings first so "meg" wins over "m".
constexpr std::array<Prefix, 15> kPrefixes{{
    {"meg", 1e6},
    {"Meg", 1e6},
    {"MEG", 1e6},
    {"\xC2\xB5", 1e-6},  // U+00B5 MICRO SIGN
    {"\xCE\xBC", 1e-6},  // U+03BC GREEK SMALL LETTER MU
    {"f", 1e-15},
    {"p", 1e-12},
    {"n", 1e-9},
    {"u", 1e-6},
    {"m", 1e-3},
    {"k", 1e3},
    {"K", 1e3},
    {"M", 1e6},
    {"G", 1e9},
    {"T", 1e12},
}};

// Prefixes used when formatting, from 1e-15 to 1e12 in steps of 10^3.
constexpr std::array<std::string_view, 10> kFormatPrefixes{"f", "p", "n", "u", "m", "", "k", "M", "G", "T"};
constexpr int kLowestExponent = -15;
constexpr int kHighestExponent = 12;

bool starts_with(std::string_view text, std::string_view head) { return text.substr(0, head.size()) == head; }

bool is_digit(char c) { return c >= '0' && c <= '9'; }

bool iequals(std::string_view a, std::string_view b) {
  if (a.size() != b.size()) return false;
  for (std::size_t i = 0; i < a.size(); ++i) {
    auto lower = [](char c) { return (c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c; };
    if (lower(a[i]) != lower(b[i])) return false;
  }
  return true;
}

std::string_view trim(std::string_view text) {
  auto space = [](char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r'; };
  while (!text.empty() && space(text.front())) text.remove_prefix(1);
  while (!text.empty() && space(text.back())) text.remove_suffix(1);
  return text;
}

bool is_ohm(std::string_view unit) { return iequals(unit, "ohm"); }

// The prefix at the start of `text`, if any.
std::optional<Prefix> leading_prefix(std::string_view text) {
  for (const auto& p : kPrefixes)
    if (starts_with(text, p.text)) return p;
  return std::nullopt;
}

// Spellings accepted for the unit `unit` (compared case-insensitively, except the
// ohm symbols which are multi-byte).
bool is_unit_word(std::string_view word, std::string_view unit) {
  if (unit.empty() || word.empty()) return false;
  if (is_ohm(unit)) {
    return iequals(word, "ohm") || iequals(word, "ohms") || word == "\xCE\xA9" /* U+03A9 */ ||
           word == "\xE2\x84\xA6" /* U+2126 OHM SIGN */;
  }
  return iequals(word, unit);
}

std::string expectation(std::string_view unit) {
  if (unit == "F") return "a capacitance such as 100n, 100nF, 4u7 or 1e-7";
  if (unit == "H") return "an inductance such as 0.5n, 1.2nH or 1e-9";
  if (is_ohm(unit)) return "a resistance such as 20m, 20mohm, R47, 2k2 or 0.02";
  if (unit == "Hz") return "a frequency such as 1k, 10MHz or 1e9";
  if (unit == "m") return "a length such as 1.6mm, 100u or 0.0016";
  if (unit == "V") return "a voltage such as 0.9, 900m or 900mV";
  if (unit == "A") return "a current such as 5, 500m or 5A";
  if (unit == "s") return "a time such as 1n, 1ns or 1e-9";
  if (unit.empty()) return "a number such as 2.5, 4k7 or 1e3";
  return std::string("a value in ").append(unit).append(" such as 2.5, 2.5k or 2.5e3");
}

// Converts "[sign]digits[.digits][e[sign]digits]" (already checked) to a double,
// independent of the C locale.
std::optional<double> to_double(const std::string& number) {
  double value = 0.0;
  const char* first = number.data();
  if (!number.empty() && number.front() == '+') ++first;
  const auto [end, error] = std::from_chars(first, number.data() + number.size(), value);
  if (error != std::errc() || end != number.data() + number.size()) return std::nullopt;
  return value;
}

struct Scanner {
  std::string_view text;
  std::size_t pos = 0;

  bool done() const { return pos >= text.size(); }
  char peek() const { return done() ? '\0' : text[pos]; }
  std::string_view rest() const { return text.substr(pos); }
  std::string digits() {
    std::string out;
    while (is_digit(peek())) out += text[pos++];
    return out;
  }
};

// The parse proper; std::nullopt for any text outside the grammar in units.hpp.
std::optional<double> scan(std::string_view text, std::string_view unit) {
  Scanner s{text};
  std::string number;
  if (s.peek() == '+' || s.peek() == '-') number += text[s.pos++];

  std::string whole = s.digits();
  std::string fraction;
  double letter_scale = 1.0;  // the IEC 60062 letter standing in for the decimal point
  bool letter_point = false;

  if (s.peek() == '.') {
    ++s.pos;
    fraction = s.digits();
  } else {
    // IEC 60062: the multiplier letter written where the decimal point goes ("4u7",
    // "2k2", "R47"), recognised only when a digit follows ("2k" is a plain prefix);
    // for ohms a trailing R also reads as the point ("10R").
    std::optional<Prefix> letter = leading_prefix(s.rest());
    if (is_ohm(unit) && s.peek() == 'R') letter = Prefix{"R", 1.0};
    if (letter) {
      const std::size_t after = s.pos + letter->text.size();
      const bool digit_follows = after < text.size() && is_digit(text[after]);
      if (digit_follows || (whole.empty() == false && letter->text == "R")) {
        s.pos = after;
        letter_point = true;
        letter_scale = letter->scale;
        fraction = s.digits();
      }
    }
  }
  if (whole.empty() && fraction.empty()) return std::nullopt;
  number += whole.empty() ? "0" : whole;
  if (!fraction.empty()) number.append(".").append(fraction);

  bool has_exponent = false;
  if (!letter_point && (s.peek() == 'e' || s.peek() == 'E')) {
    // An exponent needs a digit after its optional sign; "2E" stays an error below.
    std::size_t look = s.pos + 1;
    if (look < text.size() && (text[look] == '+' || text[look] == '-')) ++look;
    if (look < text.size() && is_digit(text[look])) {
      number += 'e';
      s.pos += 1;
      if (s.peek() == '+' || s.peek() == '-') number += text[s.pos++];
      number += s.digits();
      has_exponent = true;
    }
  }
  std::optional<double> mantissa = to_double(number);
  if (!mantissa) return std::nullopt;

  // Suffix: optional spaces, then [prefix][unit]. A lone prefix letter is always a
  // prefix ("5m" is 5e-3 even for metres), so single-letter units never shadow one.
  std::string_view tail = trim(s.rest());
  double scale = letter_scale;
  if (!tail.empty()) {
    std::optional<Prefix> prefix = leading_prefix(tail);
    if (prefix && tail.size() == prefix->text.size()) {
      if (letter_point || has_exponent) return std::nullopt;  // two multipliers
      scale = prefix->scale;
    } else if (is_unit_word(tail, unit)) {
      // unit alone
    } else if (prefix && is_unit_word(tail.substr(prefix->text.size()), unit)) {
      if (letter_point || has_exponent) return std::nullopt;
      scale = prefix->scale;
    } else {
      return std::nullopt;
    }
  }
  const double value = *mantissa * scale;
  if (!std::isfinite(value)) return std::nullopt;
  return value;
}

}  // namespace

double parse_value(std::string_view text, std::string_view unit, const InputLocation& where) {
  const std::string_view trimmed = trim(text);
  const std::optional<double> value = trimmed.empty() ? std::nullopt : scan(trimmed, unit);
  if (!value) {
    throw InputError(where, expectation(unit),
                     trimmed.empty() ? std::string("an empty value") : std::string("'").append(text).append("'"));
  }
  return *value;
}

std::string format_value(double value, std::string_view unit, int significant) {
  QUIETRAIL_ASSERT(significant >= 1 && significant <= 17);
  // Built by append: GCC 12 warns falsely (-Wrestrict) on "literal" + std::string.
  auto with_unit = [unit](std::string text, std::string_view prefix) {
    if (unit.empty() && prefix.empty()) return text;
    text.append(" ").append(prefix).append(unit);
    return text;
  };
  if (std::isnan(value)) return with_unit("nan", "");
  if (std::isinf(value)) return with_unit(value < 0 ? "-inf" : "inf", "");
  if (value == 0.0) return with_unit("0", "");

  int exponent = static_cast<int>(std::floor(std::log10(std::abs(value)) / 3.0)) * 3;
  std::string digits;
  if (exponent < kLowestExponent || exponent > kHighestExponent) {
    // Beyond the prefixes: scientific notation, which parse_value reads back.
    std::array<char, 64> buffer{};
    const auto written = std::to_chars(buffer.data(), buffer.data() + buffer.size(), value,
                                       std::chars_format::scientific, significant - 1);
    QUIETRAIL_ASSERT(written.ec == std::errc());
    digits.assign(buffer.data(), written.ptr);
    const std::size_t e = digits.find('e');
    std::string mantissa = digits.substr(0, e);
    if (mantissa.find('.') != std::string::npos) {
      while (mantissa.back() == '0') mantissa.pop_back();
      if (mantissa.back() == '.') mantissa.pop_back();
    }
    return with_unit(mantissa + digits.substr(e), "");
  }
  for (int attempt = 0; attempt < 2; ++attempt) {
    const double mantissa = value / std::pow(10.0, exponent);
    const int magnitude = static_cast<int>(std::floor(std::log10(std::abs(mantissa))));
    const int decimals = std::max(0, significant - 1 - magnitude);
    // to_chars/from_chars: the same text whatever the C locale says.
    std::array<char, 128> buffer{};
    const auto written =
        std::to_chars(buffer.data(), buffer.data() + buffer.size(), mantissa, std::chars_format::fixed, decimals);
    QUIETRAIL_ASSERT(written.ec == std::errc());
    digits.assign(buffer.data(), written.ptr);
    // Rounding 999.96 to "1000.0" belongs to the next prefix up.
    double rounded = 0.0;
    std::from_chars(digits.data() + (digits.front() == '-' ? 1 : 0), digits.data() + digits.size(), rounded);
    if (rounded >= 1000.0 && exponent < kHighestExponent) {
      exponent += 3;
      continue;
    }
    break;
  }
  if (digits.find('.') != std::string::npos) {
    while (digits.back() == '0') digits.pop_back();
    if (digits.back() == '.') digits.pop_back();
  }
  if (digits == "-0") digits = "0";
  return with_unit(std::move(digits), kFormatPrefixes[static_cast<std::size_t>((exponent - kLowestExponent) / 3)]);
}

}  // namespace quietrail
