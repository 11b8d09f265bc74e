// SPDX-License-Identifier: MIT
// Derating models: the EIA-198 class-2 code table decodes exactly, the temperature factor
// follows its documented planning model and the class limits, DC bias follows its closed
// form or table. Sources beside each check (REFERENCES §8 for the code tables).
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <string>

#include "quietrail/error.hpp"
#include "quietrail/models/derating.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;
using quietrail::DcBiasCurve;
using quietrail::DcBiasTable;
using quietrail::Dielectric;
using quietrail::InputError;

namespace {

// Closed form vs the code's own evaluation of it (REFERENCES, general tolerance guidance).
constexpr double kClosedForm = 1e-9;

struct CodeRow {
  const char* code;
  double low_c, high_c, minus_percent, plus_percent;
};

}  // namespace

TEST_CASE("EIA-198 codes of the common class-2 dielectrics decode to their published ranges", "[models]") {
  // REFERENCES §8, EIA-198 (aligned with IEC 60384-22): the worked decodings listed there.
  const CodeRow rows[] = {
      {"X7R", -55, 125, 15, 15}, {"X5R", -55, 85, 15, 15}, {"X6S", -55, 105, 22, 22},
      {"X7S", -55, 125, 22, 22}, {"X8R", -55, 150, 15, 15}, {"Y5V", -30, 85, 82, 22},
      {"Z5U", 10, 85, 56, 22},
  };
  for (const auto& row : rows) {
    CAPTURE(row.code);
    const auto decoded = quietrail::decode_eia_class2(row.code);
    REQUIRE(decoded.has_value());
    CHECK(decoded->low_c == row.low_c);
    CHECK(decoded->high_c == row.high_c);
    CHECK_THAT(decoded->change_minus, WithinAbs(row.minus_percent / 100.0, 1e-15));
    CHECK_THAT(decoded->change_plus, WithinAbs(row.plus_percent / 100.0, 1e-15));
  }
}

TEST_CASE("every EIA-198 letter and digit decodes by its table entry", "[models]") {
  // REFERENCES §8: first letter X -55, Y -30, Z +10 C; digit 2 +45 ... 9 +200 C; last letter
  // A 1.0 ... S 22 % both ways, T +22/-33, U +22/-56, V +22/-82 %.
  const std::pair<char, double> lows[] = {{'X', -55}, {'Y', -30}, {'Z', 10}};
  const std::pair<char, double> highs[] = {{'2', 45}, {'4', 65},   {'5', 85}, {'6', 105},
                                           {'7', 125}, {'8', 150}, {'9', 200}};
  struct Change {
    char letter;
    double minus, plus;
  };
  const Change changes[] = {{'A', 1.0, 1.0},  {'B', 1.5, 1.5}, {'C', 2.2, 2.2},  {'D', 3.3, 3.3},
                            {'E', 4.7, 4.7},  {'F', 7.5, 7.5}, {'P', 10, 10},    {'R', 15, 15},
                            {'S', 22, 22},    {'T', 33, 22},   {'U', 56, 22},    {'V', 82, 22}};
  int decoded_count = 0;
  for (const auto& [low_letter, low] : lows) {
    for (const auto& [digit, high] : highs) {
      for (const auto& change : changes) {
        const std::string code{low_letter, digit, change.letter};
        CAPTURE(code);
        const auto decoded = quietrail::decode_eia_class2(code);
        REQUIRE(decoded.has_value());
        CHECK(decoded->low_c == low);
        CHECK(decoded->high_c == high);
        CHECK_THAT(decoded->change_minus, WithinAbs(change.minus / 100.0, 1e-15));
        CHECK_THAT(decoded->change_plus, WithinAbs(change.plus / 100.0, 1e-15));
        ++decoded_count;
      }
    }
  }
  CHECK(decoded_count == 3 * 7 * 12);
}

TEST_CASE("text that is not an EIA class-2 code does not decode", "[models]") {
  // REFERENCES §8 table: W, 1, 3 and Q appear in no position; codes have three characters.
  for (const char* code : {"", "X7", "X7RR", "W7R", "X3R", "X1R", "X7Q", "C0G", "7XR"}) {
    CAPTURE(code);
    CHECK_FALSE(quietrail::decode_eia_class2(code).has_value());
  }
  // Lower case is the same code.
  REQUIRE(quietrail::decode_eia_class2("x7r").has_value());
  CHECK(quietrail::decode_eia_class2("x7r")->high_c == 125.0);
}

TEST_CASE("dielectric names round-trip and NP0 is another name for C0G", "[models]") {
  for (const Dielectric d :
       {Dielectric::none, Dielectric::c0g, Dielectric::x5r, Dielectric::x7r, Dielectric::x6s, Dielectric::x7s,
        Dielectric::x8r, Dielectric::y5v, Dielectric::z5u, Dielectric::polymer_aluminium,
        Dielectric::polymer_tantalum, Dielectric::mno2_tantalum, Dielectric::wet_aluminium}) {
    CAPTURE(quietrail::to_string(d));
    CHECK(quietrail::parse_dielectric(quietrail::to_string(d)) == d);
  }
  // EIA class 1: C0G is the same material class as the older name NP0 (REFERENCES §8).
  CHECK(quietrail::parse_dielectric("NP0") == Dielectric::c0g);
  CHECK(quietrail::parse_dielectric("x7r") == Dielectric::x7r);
  CHECK_FALSE(quietrail::parse_dielectric("X9Q").has_value());
  CHECK(quietrail::is_class2(Dielectric::y5v));
  CHECK_FALSE(quietrail::is_class2(Dielectric::c0g));
  CHECK(quietrail::is_ceramic(Dielectric::c0g));
  CHECK_FALSE(quietrail::is_ceramic(Dielectric::polymer_tantalum));
  // The class of a class-2 kind is its code's decoding.
  REQUIRE(quietrail::temperature_class(Dielectric::z5u).has_value());
  CHECK(quietrail::temperature_class(Dielectric::z5u)->low_c == 10.0);
  CHECK_FALSE(quietrail::temperature_class(Dielectric::c0g).has_value());
}

TEST_CASE("class-2 temperature factor is 1 at 25 C and reaches the class limit at both edges", "[models]") {
  // Documented planning model (common practice): 1 - change_minus * ((T-25)/(edge-25))^2,
  // with the class limits of REFERENCES §8 (X7R -15 % at -55 and 125 C, Y5V -82 % at -30 and 85 C).
  CHECK(quietrail::temperature_factor(Dielectric::x7r, 25.0) == 1.0);
  CHECK_THAT(quietrail::temperature_factor(Dielectric::x7r, 125.0), WithinRel(0.85, kClosedForm));
  CHECK_THAT(quietrail::temperature_factor(Dielectric::x7r, -55.0), WithinRel(0.85, kClosedForm));
  CHECK_THAT(quietrail::temperature_factor(Dielectric::x5r, 85.0), WithinRel(0.85, kClosedForm));
  CHECK_THAT(quietrail::temperature_factor(Dielectric::y5v, 85.0), WithinRel(0.18, kClosedForm));
  CHECK_THAT(quietrail::temperature_factor(Dielectric::y5v, -30.0), WithinRel(0.18, kClosedForm));
  CHECK_THAT(quietrail::temperature_factor(Dielectric::z5u, 10.0), WithinRel(0.44, kClosedForm));
  // Half way to the high edge of X7R: 1 - 0.15 * 0.25 (the model's closed form).
  CHECK_THAT(quietrail::temperature_factor(Dielectric::x7r, 75.0), WithinRel(1.0 - 0.15 * 0.25, kClosedForm));
  // Half way to the low edge of X6S (-55 C): T = -15 C, 1 - 0.22 * 0.25.
  CHECK_THAT(quietrail::temperature_factor(Dielectric::x6s, -15.0), WithinRel(1.0 - 0.22 * 0.25, kClosedForm));
}

TEST_CASE("class-2 temperature factor stays inside the EIA class band over the rated range", "[models]") {
  // EIA-198 meaning of the code (REFERENCES §8): C(T)/C(25 C) within [1 - minus, 1 + plus].
  for (const Dielectric d : {Dielectric::x5r, Dielectric::x7r, Dielectric::x6s, Dielectric::x7s, Dielectric::x8r,
                             Dielectric::y5v, Dielectric::z5u}) {
    const auto eia = quietrail::temperature_class(d);
    REQUIRE(eia.has_value());
    for (int i = 0; i <= 100; ++i) {
      const double t = eia->low_c + (eia->high_c - eia->low_c) * i / 100.0;
      const double f = quietrail::temperature_factor(d, t);
      CAPTURE(quietrail::to_string(d), t);
      CHECK(f >= 1.0 - eia->change_minus - 1e-12);
      CHECK(f <= 1.0 + eia->change_plus + 1e-12);
    }
  }
}

TEST_CASE("beyond its rated range a class-2 part keeps the edge value", "[models]") {
  // Documented clamp of the planning model (X7R rated -55..125 C, REFERENCES §8).
  CHECK(quietrail::temperature_factor(Dielectric::x7r, 150.0) ==
        quietrail::temperature_factor(Dielectric::x7r, 125.0));
  CHECK(quietrail::temperature_factor(Dielectric::x7r, -80.0) ==
        quietrail::temperature_factor(Dielectric::x7r, -55.0));
  const auto range = quietrail::rated_temperature_range(Dielectric::x5r);
  CHECK(range.low_c == -55.0);
  CHECK(range.high_c == 85.0);
}

TEST_CASE("C0G is flat at its nominal 0 ppm/K and linear in its coefficient", "[models]") {
  // EIA class 1, C0G = 0 +/- 30 ppm/K (REFERENCES §8).
  CHECK(quietrail::kC0gTemperatureCoefficient == 0.0);
  CHECK_THAT(quietrail::kC0gCoefficientTolerance, WithinRel(30e-6, 1e-12));
  for (const double t : {-55.0, 25.0, 125.0}) CHECK(quietrail::temperature_factor(Dielectric::c0g, t) == 1.0);
  // Linear coefficient: +30 ppm/K over 100 K is +0.3 %.
  CHECK_THAT(quietrail::class1_temperature_factor(30e-6, 125.0), WithinRel(1.003, kClosedForm));
  CHECK_THAT(quietrail::class1_temperature_factor(-30e-6, -55.0), WithinRel(1.0024, kClosedForm));
}

TEST_CASE("bulk kinds follow their documented temperature assumptions", "[models]") {
  // Planning assumptions stated in derating.hpp (typical, from memory): polymer and MnO2
  // kinds flat; wet aluminium linear to -20 % at -40 C, flat above 25 C.
  for (const Dielectric d : {Dielectric::polymer_aluminium, Dielectric::polymer_tantalum, Dielectric::mno2_tantalum,
                             Dielectric::none})
    CHECK(quietrail::temperature_factor(d, -40.0) == 1.0);
  CHECK_THAT(quietrail::temperature_factor(Dielectric::wet_aluminium, -40.0), WithinRel(0.8, kClosedForm));
  CHECK_THAT(quietrail::temperature_factor(Dielectric::wet_aluminium, -7.5), WithinRel(0.9, kClosedForm));
  CHECK(quietrail::temperature_factor(Dielectric::wet_aluminium, 85.0) == 1.0);
  CHECK(quietrail::temperature_factor(Dielectric::wet_aluminium, -60.0) ==
        quietrail::temperature_factor(Dielectric::wet_aluminium, -40.0));
}

TEST_CASE("DC-bias curve is exactly 1 at 0 V and follows 1/(1+(V/Vh)^p)", "[models]") {
  // Model form of REFERENCES §8.
  const DcBiasCurve curve{.v_half = 4.0, .exponent = 1.5};
  CHECK(curve.factor(0.0) == 1.0);
  CHECK_THAT(curve.factor(4.0), WithinRel(0.5, kClosedForm));  // V = Vh leaves half
  CHECK_THAT(curve.factor(-4.0), WithinRel(0.5, kClosedForm));  // the field's sign does not matter
  CHECK_THAT(curve.factor(1.0), WithinRel(1.0 / (1.0 + std::pow(0.25, 1.5)), kClosedForm));
  CHECK_THAT(curve.factor(16.0), WithinRel(1.0 / 9.0, kClosedForm));  // (16/4)^1.5 = 8
  const DcBiasCurve square{.v_half = 2.0, .exponent = 2.0};
  CHECK_THAT(square.factor(4.0), WithinRel(0.2, kClosedForm));  // 1/(1+4)
  const DcBiasCurve none{.v_half = std::numeric_limits<double>::infinity(), .exponent = 1.0};
  CHECK(none.factor(50.0) == 1.0);
}

TEST_CASE("DC-bias table interpolates linearly from an implicit (0 V, 1) and holds its last value", "[models]") {
  // The documented table form ("a user table C(V)/C0", REFERENCES §8); linear interpolation.
  const DcBiasTable table{{{2.0, 0.8}, {4.0, 0.5}}};
  CHECK(table.factor(0.0) == 1.0);
  CHECK_THAT(table.factor(1.0), WithinRel(0.9, kClosedForm));
  CHECK_THAT(table.factor(3.0), WithinRel(0.65, kClosedForm));
  CHECK_THAT(table.factor(4.0), WithinRel(0.5, kClosedForm));
  CHECK_THAT(table.factor(10.0), WithinRel(0.5, kClosedForm));
  CHECK_THAT(table.factor(-3.0), WithinRel(0.65, kClosedForm));
  const DcBiasTable with_zero{{{0.0, 1.0}, {5.0, 0.6}}};
  CHECK(with_zero.factor(0.0) == 1.0);
  CHECK_THAT(with_zero.factor(2.5), WithinRel(0.8, kClosedForm));
  CHECK(DcBiasTable{}.factor(3.0) == 1.0);
  // Through the variant.
  CHECK(quietrail::dc_bias_factor(quietrail::DcBias{}, 25.0) == 1.0);
  CHECK_THAT(quietrail::dc_bias_factor(quietrail::DcBias{table}, 3.0), WithinRel(0.65, kClosedForm));
}

TEST_CASE("invalid DC-bias curves and tables are input errors naming the field", "[models]") {
  // Domains documented in derating.hpp.
  CHECK_THROWS_WITH((DcBiasCurve{.v_half = 0.0, .exponent = 1.0}.validate("lib.json", "/parts/3/dc_bias")),
                    Contains("lib.json") && Contains("/parts/3/dc_bias/v_half"));
  CHECK_THROWS_WITH((DcBiasCurve{.v_half = 3.0, .exponent = -1.0}.validate("lib.json", "/b")), Contains("/b/exponent"));
  CHECK_THROWS_WITH((DcBiasTable{{{4.0, 0.5}, {2.0, 0.8}}}.validate("lib.json", "/p")),
                    Contains("/p/1") && Contains("increasing"));
  CHECK_THROWS_WITH((DcBiasTable{{{2.0, 1.2}}}.validate("lib.json", "/p")), Contains("/p/0") && Contains("(0, 1]"));
  CHECK_THROWS_WITH((DcBiasTable{{{0.0, 0.9}}}.validate("lib.json", "/p")), Contains("/p/0") && Contains("0 V"));
  CHECK_THROWS_AS((DcBiasTable{{{-1.0, 0.9}}}.validate("lib.json", "/p")), InputError);
  CHECK_NOTHROW((DcBiasTable{{{0.0, 1.0}, {2.0, 0.8}}}.validate("lib.json", "/p")));
}

TEST_CASE("effective capacitance multiplies the DC-bias and temperature factors", "[models]") {
  // Product of the two documented factors (closed forms above).
  const quietrail::DcBias bias = DcBiasCurve{.v_half = 3.0, .exponent = 1.5};
  const double c0 = 10e-6;
  const double expected = c0 / (1.0 + std::pow(1.8 / 3.0, 1.5)) * (1.0 - 0.15 * std::pow(60.0 / 60.0, 2));
  CHECK_THAT(quietrail::effective_capacitance(c0, Dielectric::x5r, bias, {.dc_voltage = 1.8, .temperature_c = 85.0}),
             WithinRel(expected, kClosedForm));
  // At 0 V and 25 C every kind keeps its nominal value exactly.
  for (const Dielectric d : {Dielectric::x5r, Dielectric::c0g, Dielectric::wet_aluminium})
    CHECK(quietrail::effective_capacitance(c0, d, bias, {}) == c0);
}

TEST_CASE("derating conditions reject non-finite values by field", "[models]") {
  CHECK_NOTHROW(quietrail::DeratingConditions{.dc_voltage = 1.0, .temperature_c = 60.0}.validate());
  CHECK_THROWS_WITH((quietrail::DeratingConditions{.dc_voltage = std::nan(""), .temperature_c = 25.0}.validate()),
                    Contains("dc_voltage"));
  CHECK_THROWS_WITH((quietrail::DeratingConditions{.dc_voltage = 1.0,
                                                   .temperature_c = std::numeric_limits<double>::infinity()}
                         .validate()),
                    Contains("temperature_c"));
}
