// SPDX-License-Identifier: MIT
// Plane-pair capacitance, sheet inductance and cavity modes against REFERENCES section 7.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

#include "quietrail/calc/plane.hpp"
#include "quietrail/error.hpp"
#include "quietrail/types.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;

namespace {
constexpr double kClosedForm = 1e-9;  // own closed form vs the code (REFERENCES: 1e-9)
constexpr double kPrinted = 1e-3;     // values printed to 4-5 significant figures
constexpr double kInch = 0.0254;      // m, exact
constexpr double kMil = 25.4e-6;      // m, exact
}  // namespace

TEST_CASE("4 mil of er 4.3 gives about 0.24 nF per square inch", "[calc]") {
  // Parallel-plate physics, REFERENCES section 7: 241.76 pF/in^2 and 37.47 pF/cm^2.
  CHECK_THAT(quietrail::plane_capacitance(kInch * kInch, 4.0 * kMil, 4.3), WithinRel(241.76e-12, kPrinted));
  CHECK_THAT(quietrail::plane_capacitance(1e-4, 4.0 * kMil, 4.3), WithinRel(37.47e-12, kPrinted));
  // Inch-unit rule C[pF] = 0.2249 er A[in^2] / d[in] (common practice, 4 figures).
  CHECK_THAT(quietrail::plane_capacitance(kInch * kInch, 4.0 * kMil, 4.3),
             WithinRel(0.2249 * 4.3 * 1.0 / 0.004 * 1e-12, kPrinted));
}

TEST_CASE("a 10 x 8 in plane pair at 4 mil holds 19.34 nF and 127.7 pH per square", "[calc]") {
  // REFERENCES section 7 worked values.
  const auto r =
      quietrail::plane_pair({.length = 10.0 * kInch, .width = 8.0 * kInch, .separation = 4.0 * kMil});
  CHECK_THAT(r.capacitance, WithinRel(19.34e-9, kPrinted));
  CHECK_THAT(r.sheet_inductance, WithinRel(127.7e-12, kPrinted));
  CHECK_THAT(r.area, WithinRel(80.0 * kInch * kInch, kClosedForm));
  CHECK_THAT(r.capacitance_per_area * r.area, WithinRel(r.capacitance, kClosedForm));
}

TEST_CASE("sheet inductance is mu0 h, 31.9 pH per square per mil", "[calc]") {
  // Bogatin 2009 (REFERENCES section 7): 31.9 pH/sq per mil; Bogatin's rounder 33 is looser.
  CHECK_THAT(quietrail::plane_sheet_inductance(kMil), WithinRel(31.9e-12, kPrinted));
  CHECK_THAT(quietrail::plane_sheet_inductance(1e-4), WithinRel(quietrail::kMu0 * 1e-4, kClosedForm));
}

TEST_CASE("a 10 x 8 in FR-4 cavity first resonates at 284.59 MHz", "[calc]") {
  // f_mn = c / (2 sqrt(er)) sqrt((m/a)^2 + (n/b)^2); REFERENCES section 7 worked modes
  // (Hubing et al. 1995, from memory; Pozar, cavity theory).
  const auto modes = quietrail::cavity_modes({.length = 10.0 * kInch, .width = 8.0 * kInch, .count = 5});
  REQUIRE(modes.size() == 5);
  const struct {
    int m, n;
    double f;
  } expected[] = {{1, 0, 284.59e6}, {0, 1, 355.74e6}, {1, 1, 455.57e6}, {2, 0, 569.18e6}, {2, 1, 671.21e6}};
  for (std::size_t i = 0; i < 5; ++i) {
    CAPTURE(i);
    CHECK(modes[i].m == expected[i].m);
    CHECK(modes[i].n == expected[i].n);
    CHECK_THAT(modes[i].frequency, WithinRel(expected[i].f, kPrinted));
  }
}

TEST_CASE("cavity modes stop at the maximum frequency and follow the closed form", "[calc]") {
  const double a = 0.1, b = 0.07, er = 3.5;
  const auto modes = quietrail::cavity_modes(
      {.length = a, .width = b, .relative_permittivity = er, .max_frequency = 3e9, .count = 1000});
  REQUIRE(!modes.empty());
  const double v = quietrail::kSpeedOfLight / (2.0 * std::sqrt(er));
  int listed_below = 0;
  for (int m = 0; m < 50; ++m)
    for (int n = 0; n < 50; ++n)
      if ((m || n) && v * std::hypot(m / a, n / b) <= 3e9) ++listed_below;
  // Brute-force count of all modes under 3 GHz from the same closed form.
  CHECK(modes.size() == static_cast<std::size_t>(listed_below));
  for (std::size_t i = 0; i < modes.size(); ++i) {
    CHECK_THAT(modes[i].frequency, WithinRel(v * std::hypot(modes[i].m / a, modes[i].n / b), kClosedForm));
    CHECK(modes[i].frequency <= 3e9);
    if (i > 0) CHECK(modes[i - 1].frequency <= modes[i].frequency);
  }
}

TEST_CASE("a square cavity lists both modes of its degenerate pair, (0,1) then (1,0)", "[calc]") {
  // Equal sides give f01 = f10 (closed form); ties are ordered by m as documented.
  const auto modes = quietrail::cavity_modes({.length = 0.1, .width = 0.1, .count = 2});
  REQUIRE(modes.size() == 2);
  CHECK((modes[0].m == 0 && modes[0].n == 1));
  CHECK((modes[1].m == 1 && modes[1].n == 0));
  CHECK(modes[0].frequency == modes[1].frequency);
}

TEST_CASE("plane calculators name the offending field", "[calc]") {
  CHECK_THROWS_WITH(quietrail::plane_capacitance(-1.0, 1e-4, 4.3), Contains("/area"));
  CHECK_THROWS_WITH(quietrail::plane_capacitance(1.0, 0.0, 4.3), Contains("/separation"));
  CHECK_THROWS_WITH(
      quietrail::plane_pair({.length = 0.1, .width = 0.1, .separation = 1e-4, .relative_permittivity = 0.5}),
      Contains("/relative_permittivity"));
  CHECK_THROWS_WITH(
      quietrail::plane_pair(
          {.length = 0.1, .width = std::numeric_limits<double>::quiet_NaN(), .separation = 1e-4}),
      Contains("/width"));
  CHECK_THROWS_WITH(quietrail::cavity_modes({.length = 0.1, .width = 0.1, .count = 0}), Contains("/count"));
  CHECK_THROWS_WITH(quietrail::cavity_modes({.length = 0.1, .width = 0.1, .max_frequency = -1.0}),
                    Contains("/max_frequency"));
}
