// SPDX-License-Identifier: MIT
// Engineering notation: accepted spellings, rejections with their messages, round trip.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <string>
#include <utility>
#include <vector>

#include "quietrail/units.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::format_value;
using quietrail::InputError;
using quietrail::InputLocation;
using quietrail::parse_value;

namespace {

// Decimal text to double differs from the product mantissa * 10^k by a rounding or two.
constexpr double kParseTolerance = 1e-12;

const InputLocation kWhere{"rail.json", "/branches/0/capacitance"};

struct Accepted {
  const char* text;
  const char* unit;
  double value;
};

}  // namespace

TEST_CASE("engineering notation is read with SI prefixes, units and IEC 60062 letter codes", "[units]") {
  // Prefix factors: BIPM, The International System of Units (SI brochure), 9th ed. 2019,
  // table 7 (f 1e-15, p 1e-12, n 1e-9, micro 1e-6, m 1e-3, k 1e3, M 1e6, G 1e9, T 1e12).
  // Letter-as-decimal-point codes ("4u7", "2k2", "R47", "4K7"): IEC 60062 (RKM code),
  // from memory. "meg" for mega: the circuit-netlist convention (common practice).
  const std::vector<Accepted> table{
      {"100n", "F", 100e-9},      {"100nF", "F", 100e-9},    {"4.7u", "F", 4.7e-6},
      {"4u7", "F", 4.7e-6},       {"4\xC2\xB5" "7", "F", 4.7e-6},  // micro sign
      {"1 uF", "F", 1e-6},        {"2.2\xCE\xBC" "F", "F", 2.2e-6},  // Greek mu
      {"p68", "F", 0.68e-12},     {"330u", "F", 330e-6},     {"1e-9", "F", 1e-9},
      {"1E-9F", "F", 1e-9},       {"5f", "F", 5e-15},        {"0.1", "F", 0.1},
      {"R47", "ohm", 0.47},       {"4R7", "ohm", 4.7},       {"10R", "ohm", 10.0},
      {"2.2k", "ohm", 2.2e3},     {"2k2", "ohm", 2.2e3},     {"4K7", "ohm", 4.7e3},
      {"0.5m", "ohm", 0.5e-3},    {"50m\xCE\xA9", "ohm", 50e-3},  // Greek capital omega
      {"50m\xE2\x84\xA6", "ohm", 50e-3},                         // ohm sign
      {"20mohm", "ohm", 20e-3},   {"1 Mohm", "ohm", 1e6},    {"3 ohms", "ohm", 3.0},
      {"10MHz", "Hz", 10e6},      {"10 MHz", "Hz", 10e6},    {"1k", "Hz", 1e3},
      {"1G", "Hz", 1e9},          {"2meg", "Hz", 2e6},       {"2MEGHz", "Hz", 2e6},
      {"1e9", "Hz", 1e9},         {"10hz", "Hz", 10.0},      {"1T", "Hz", 1e12},
      {"0.5n", "H", 0.5e-9},      {"1.2nH", "H", 1.2e-9},    {"150p", "H", 150e-12},
      {"1.6mm", "m", 1.6e-3},     {"100u", "m", 100e-6},     {"0.0016", "m", 0.0016},
      {"-5n", "F", -5e-9},        {"+2.5", "", 2.5},         {".5", "", 0.5},
      {"  4k7  ", "", 4.7e3},     {"3", "", 3.0},
  };
  for (const auto& row : table) {
    INFO(row.text << " as " << row.unit);
    CHECK_THAT(parse_value(row.text, row.unit, kWhere), WithinRel(row.value, kParseTolerance));
  }
}

TEST_CASE("a lone prefix letter is a prefix even where it spells a unit", "[units]") {
  // The rule documented in units.hpp: "5m" is 5e-3 for metres too; "5 F" is farads.
  CHECK_THAT(parse_value("5m", "m", kWhere), WithinRel(5e-3, kParseTolerance));
  CHECK_THAT(parse_value("5f", "F", kWhere), WithinRel(5e-15, kParseTolerance));
  CHECK_THAT(parse_value("5 F", "F", kWhere), WithinRel(5.0, kParseTolerance));
  // Prefixes are case-sensitive (SI brochure: m is milli, M is mega).
  CHECK_THAT(parse_value("3m", "Hz", kWhere), WithinRel(3e-3, kParseTolerance));
  CHECK_THAT(parse_value("3M", "Hz", kWhere), WithinRel(3e6, kParseTolerance));
}

TEST_CASE("malformed engineering values are rejected naming where, what and the text", "[units]") {
  const std::vector<std::pair<const char*, const char*>> rejected{
      {"", "F"},         {"   ", "F"},       {"n", "F"},        {"100x", "F"},     {"100nFF", "F"},
      {"10nH", "F"},     {"10nnF", "F"},     {"2k2k", "ohm"},   {"1e3k", "Hz"},    {"4u7e3", "F"},
      {"nan", ""},       {"NaN", "F"},       {"inf", "F"},      {"-inf", ""},      {"1e400", ""},
      {"1.5.3", ""},     {"1,5", ""},        {"2E", ""},        {"1 k ohm", "ohm"}, {"R47", "F"},
      {"10kMHz", "Hz"},  {"+-5", ""},        {"5 5", ""},       {"0x10", ""},
  };
  for (const auto& [text, unit] : rejected) {
    INFO("'" << text << "' as " << unit);
    CHECK_THROWS_AS(parse_value(text, unit, kWhere), InputError);
  }

  SECTION("the message names the file, the field, the text and an example of what fits") {
    try {
      parse_value("10nH", "F", kWhere);
      FAIL("no exception");
    } catch (const InputError& e) {
      CHECK_THAT(e.what(), Contains("rail.json"));
      CHECK_THAT(e.what(), Contains("/branches/0/capacitance"));
      CHECK_THAT(e.what(), Contains("'10nH'"));
      CHECK_THAT(e.what(), Contains("a capacitance such as 100n, 100nF, 4u7"));
      CHECK(e.where().field == "/branches/0/capacitance");
    }
  }
  SECTION("each unit names its own kind of quantity") {
    CHECK_THROWS_WITH(parse_value("x", "Hz", {}), Contains("a frequency"));
    CHECK_THROWS_WITH(parse_value("x", "H", {}), Contains("an inductance"));
    CHECK_THROWS_WITH(parse_value("x", "ohm", {}), Contains("a resistance"));
    CHECK_THROWS_WITH(parse_value("x", "m", {}), Contains("a length"));
    CHECK_THROWS_WITH(parse_value("", "F", {}), Contains("an empty value"));
  }
}

TEST_CASE("values are formatted with engineering prefixes and trimmed digits", "[units]") {
  // Prefix choice per the SI brochure (9th ed., table 7); "u" stands in for micro.
  CHECK(format_value(1e-7, "F") == "100 nF");
  CHECK(format_value(4.7e-6, "F") == "4.7 uF");
  CHECK(format_value(22.51e6, "Hz") == "22.51 MHz");
  // SRF of 100 nF with 0.5 nH: 1/(2 pi sqrt(LC)) = 22.508 MHz (REFERENCES §2, series RLC).
  CHECK(format_value(22.5079079e6, "Hz") == "22.51 MHz");
  CHECK(format_value(22.5079079e6, "Hz", 5) == "22.508 MHz");
  CHECK(format_value(0.02, "ohm") == "20 mohm");
  CHECK(format_value(1.5885, "ohm") == "1.589 ohm");
  CHECK(format_value(1e3, "Hz") == "1 kHz");
  CHECK(format_value(1e9, "Hz") == "1 GHz");
  CHECK(format_value(0.0, "F") == "0 F");
  CHECK(format_value(-4.7e-3, "V") == "-4.7 mV");
  CHECK(format_value(2500.0, "") == "2.5 k");
  CHECK(format_value(2.5, "") == "2.5");
  CHECK(format_value(std::numeric_limits<double>::infinity(), "F") == "inf F");
  SECTION("rounding up to 1000 moves to the next prefix") {
    CHECK(format_value(999.96, "Hz") == "1 kHz");
    CHECK(format_value(999.94e-9, "F") == "999.9 nF");
  }
  SECTION("values beyond the prefix range are written in scientific notation") {
    CHECK(format_value(2e-18, "F") == "2e-18 F");
    CHECK(format_value(5e15, "Hz") == "5e+15 Hz");
    CHECK(format_value(-1.23456e-300, "", 3) == "-1.23e-300");
    CHECK(format_value(1e300, "F") == "1e+300 F");
  }
}

TEST_CASE("formatting then parsing gives the value back to the printed precision", "[units]") {
  // Rounding to n significant digits moves a value by at most half a unit in the last
  // place: relative error <= 0.5 * 10^(1-n) (elementary numerics).
  const int digits = GENERATE(3, 4, 6);
  const double tolerance = 0.5 * std::pow(10.0, 1 - digits);
  for (double value : {1e-300, 2e-18, 1e-15, 3.3e-12, 4.7e-9, 0.1e-6, 22e-6, 330e-6, 0.999, 1.0, 1234.5678, 6.02e8, 7.7e11, 5e15, 1e300}) {
    for (const char* unit : {"F", "Hz", "ohm", "H", ""}) {
      const std::string text = format_value(value, unit, digits);
      INFO(value << " -> " << text);
      CHECK_THAT(parse_value(text, unit, {}), WithinRel(value, tolerance));
    }
  }
}
