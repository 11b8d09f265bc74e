// SPDX-License-Identifier: MIT
// LC resonance calculator against the closed form and published worked values.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

#include "quietrail/calc/resonance.hpp"
#include "quietrail/error.hpp"
#include "quietrail/types.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::InputError;

namespace {
constexpr double kClosedForm = 1e-9;    // own closed form vs the code (REFERENCES: 1e-9)
constexpr double kPrinted = 1e-3;       // values printed to 3-4 significant figures
constexpr double kThreeFigures = 2e-3;  // half a unit in the third figure of "253"
}  // namespace

TEST_CASE("LC resonance follows f = 1/(2 pi sqrt(LC)) in all three directions", "[calc]") {
  const double l = 85e-9, c = 10e-9;
  const double f = 1.0 / (2.0 * quietrail::kPi * std::sqrt(l * c));  // closed form, any circuits text
  CHECK_THAT(quietrail::resonant_frequency(l, c), WithinRel(f, kClosedForm));
  CHECK_THAT(quietrail::resonant_inductance(f, c), WithinRel(l, kClosedForm));
  CHECK_THAT(quietrail::resonant_capacitance(f, l), WithinRel(c, kClosedForm));
  CHECK_THAT(quietrail::characteristic_impedance(l, c), WithinRel(std::sqrt(l / c), kClosedForm));
}

TEST_CASE("10 nF with 85 nH self-resonates near 5.46 MHz", "[calc]") {
  // Common practice (a classic leaded-capacitor example); 5.459 MHz from the formula.
  CHECK_THAT(quietrail::resonant_frequency(85e-9, 10e-9), WithinRel(5.46e6, kPrinted));
}

TEST_CASE("10 MHz needs about 253 uH with 1 pF and about 253 pH with 1 uF", "[calc]") {
  // Common practice: L*C = 1/(2 pi f)^2 = 2.533e-16 s^2 at 10 MHz, quoted as 253 (3 figures).
  CHECK_THAT(quietrail::resonant_inductance(10e6, 1e-12), WithinRel(253e-6, kThreeFigures));
  CHECK_THAT(quietrail::resonant_inductance(10e6, 1e-6), WithinRel(253e-12, kThreeFigures));
  // (2 pi)^2 = 39.48 (common practice): 1 H and 1 F resonate when (2 pi f)^2 = 1, i.e.
  // a 1 F capacitor needs 1/39.48 H at 1 Hz.
  CHECK_THAT(quietrail::resonant_inductance(1.0, 1.0), WithinRel(1.0 / 39.48, kPrinted));
}

TEST_CASE("lc_resonance completes the missing quantity from any two", "[calc]") {
  // REFERENCES section 2 worked value: 100 nF with 0.5 nH -> 22.508 MHz, X0 = 70.71 mohm.
  SECTION("frequency from L and C") {
    const auto r = quietrail::lc_resonance({.inductance = 0.5e-9, .capacitance = 100e-9});
    CHECK_THAT(r.frequency, WithinRel(22.508e6, kPrinted));
    CHECK_THAT(r.characteristic_impedance, WithinRel(70.71e-3, kPrinted));
  }
  SECTION("capacitance from f and L") {
    const auto r = quietrail::lc_resonance({.frequency = 22.508e6, .inductance = 0.5e-9});
    CHECK_THAT(r.capacitance, WithinRel(100e-9, kPrinted));
  }
  SECTION("inductance from f and C") {
    // REFERENCES section 2: 1 uF / 1.0 nH -> 5.0329 MHz.
    const auto r = quietrail::lc_resonance({.frequency = 5.0329e6, .capacitance = 1e-6});
    CHECK_THAT(r.inductance, WithinRel(1e-9, kPrinted));
    CHECK_THAT(r.characteristic_impedance, WithinRel(31.62e-3, kPrinted));  // sqrt(1n/1u)
  }
}

TEST_CASE("lc_resonance rejects anything but exactly two positive quantities", "[calc]") {
  CHECK_THROWS_WITH(quietrail::lc_resonance({.frequency = 1e6}), Contains("exactly two"));
  CHECK_THROWS_WITH(quietrail::lc_resonance({.frequency = 1e6, .inductance = 1e-9, .capacitance = 1e-6}),
                    Contains("found 3"));
  CHECK_THROWS_WITH(quietrail::lc_resonance({.inductance = 0.0, .capacitance = 1e-6}),
                    Contains("/inductance"));
  CHECK_THROWS_WITH(quietrail::lc_resonance({.frequency = -1.0, .capacitance = 1e-6}),
                    Contains("/frequency"));
  CHECK_THROWS_AS(
      quietrail::lc_resonance({.inductance = 1e-9, .capacitance = std::numeric_limits<double>::quiet_NaN()}),
      InputError);
  CHECK_THROWS_WITH(quietrail::resonant_frequency(1e-9, -1e-6), Contains("/capacitance"));
}
