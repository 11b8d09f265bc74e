// SPDX-License-Identifier: MIT
// Skin depth and AC resistance of copper against the worked values of REFERENCES section 5.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

#include "quietrail/calc/skin_effect.hpp"
#include "quietrail/error.hpp"
#include "quietrail/types.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;

namespace {
constexpr double kClosedForm = 1e-9;  // own closed form vs the code (REFERENCES: 1e-9)
constexpr double kPrinted = 1e-3;     // values printed to 4 significant figures
constexpr double kWire22 = 0.644e-3;  // 22 AWG diameter as tabulated, m (r = 0.322 mm)
// All worked values use annealed copper, rho = 1.724e-8 ohm*m (the library default).
}  // namespace

TEST_CASE("copper skin depth is 66.08 um at 1 MHz and scales as 1/sqrt(f)", "[calc]") {
  // Ramo, Whinnery & Van Duzer formula; REFERENCES section 5 worked values (rho 1.724e-8).
  CHECK_THAT(quietrail::skin_depth(1e6), WithinRel(0.06608e-3, kPrinted));
  CHECK_THAT(quietrail::skin_depth(100e6), WithinRel(6.608e-6, kPrinted));
  CHECK_THAT(quietrail::skin_depth(1e9), WithinRel(2.090e-6, kPrinted));
  CHECK_THAT(quietrail::skin_depth(60.0), WithinRel(8.531e-3, kPrinted));
  // Common practice: "about 0.066 mm at 1 MHz" (2 figures).
  CHECK_THAT(quietrail::skin_depth(1e6), WithinRel(0.066e-3, 0.01));
  // With pure copper's 1.68e-8 ohm*m the depth is 0.0652 mm (REFERENCES section 5).
  CHECK_THAT(quietrail::skin_depth(1e6, 1.68e-8), WithinRel(0.0652e-3, kPrinted));
}

TEST_CASE("skin depth and surface resistance follow their closed forms", "[calc]") {
  // delta = sqrt(rho / (pi f mu)), Rs = rho / delta = sqrt(pi f mu rho) (closed forms).
  const double f = 3.3e6, rho = 2.65e-8, mur = 2.0;
  const double mu = quietrail::kMu0 * mur;
  CHECK_THAT(quietrail::skin_depth(f, rho, mur),
             WithinRel(std::sqrt(rho / (quietrail::kPi * f * mu)), kClosedForm));
  CHECK_THAT(quietrail::surface_resistance(f, rho, mur),
             WithinRel(std::sqrt(quietrail::kPi * f * mu * rho), kClosedForm));
  // REFERENCES section 5: Rs(1 MHz) = 0.2609 mohm per square for copper.
  CHECK_THAT(quietrail::surface_resistance(1e6), WithinRel(0.2609e-3, kPrinted));
}

TEST_CASE("22 AWG copper at 1 MHz has 2.705 times its DC resistance", "[calc]") {
  // REFERENCES section 5 worked values for r = 0.322 mm at 1 MHz: r/delta = 4.873,
  // R_dc 52.93 mohm/m, thin-skin form 128.9, annulus form 143.7, exact Bessel 143.2 mohm/m
  // (ratio 2.705). Bessel form standard (Ramo, Whinnery & Van Duzer; from memory).
  const auto r = quietrail::round_conductor({.frequency = 1e6, .diameter = kWire22});
  CHECK_THAT(r.radius_over_skin_depth, WithinRel(4.873, kPrinted));
  CHECK_THAT(r.dc_resistance, WithinRel(52.93e-3, kPrinted));
  CHECK_THAT(r.thin_skin_resistance, WithinRel(128.9e-3, kPrinted));
  CHECK_THAT(r.annulus_resistance, WithinRel(143.7e-3, kPrinted));
  CHECK_THAT(r.exact_resistance, WithinRel(143.2e-3, kPrinted));
  CHECK_THAT(r.resistance_ratio, WithinRel(2.705, kPrinted));
  // REFERENCES: the annulus form is within 0.5 % of exact here, the thin-skin form ~10 % low.
  CHECK_THAT(r.annulus_resistance, WithinRel(r.exact_resistance, 0.005));
  CHECK(r.thin_skin_resistance < 0.92 * r.exact_resistance);
}

TEST_CASE("resistances scale with the conductor length", "[calc]") {
  const auto one = quietrail::round_conductor({.frequency = 1e6, .diameter = kWire22});
  const auto ten = quietrail::round_conductor({.frequency = 1e6, .diameter = kWire22, .length = 10.0});
  // R = rho l / A for every form (closed forms are linear in l).
  CHECK_THAT(ten.exact_resistance, WithinRel(10.0 * one.exact_resistance, kClosedForm));
  CHECK_THAT(ten.dc_resistance, WithinRel(10.0 * one.dc_resistance, kClosedForm));
}

TEST_CASE("at low frequency the wire shows R_dc and the internal inductance mu0/(8 pi)", "[calc]") {
  // Textbook limits: Z/R_dc -> 1 + j (r/delta)^2 / 4, i.e. L_internal = mu0 l / (8 pi) = 50 nH/m.
  const auto r = quietrail::round_conductor({.frequency = 1.0, .diameter = kWire22});
  CHECK_THAT(r.resistance_ratio, WithinRel(1.0, 1e-9));
  CHECK_THAT(r.internal_inductance, WithinRel(quietrail::kMu0 / (8.0 * quietrail::kPi), 1e-6));
  CHECK_THAT(r.annulus_resistance, WithinRel(r.dc_resistance, kClosedForm));  // delta > r: full section
}

TEST_CASE("at high frequency R_ac/R_dc approaches r/(2 delta) + 1/4", "[calc]") {
  // Asymptote in REFERENCES section 5; the next term is O(delta/r), 1e-7 relative here.
  for (double x : {1000.0, 2400.0}) {
    CAPTURE(x);
    const auto z = quietrail::round_wire_impedance_ratio(x);
    CHECK_THAT(z.real(), WithinRel(x / 2.0 + 0.25, 1e-6));
    CHECK_THAT(z.imag(), WithinRel(x / 2.0, 1e-6));
  }
  // At r/delta = 4.873 the asymptote gives 2.686 (REFERENCES), within 1 % of exact.
  CHECK_THAT(quietrail::round_wire_impedance_ratio(4.873).real(), WithinRel(2.686, 0.01));
}

TEST_CASE("skin-effect inputs are validated by name", "[calc]") {
  CHECK_THROWS_WITH(quietrail::skin_depth(0.0), Contains("/frequency"));
  CHECK_THROWS_WITH(quietrail::skin_depth(1e6, -1.0), Contains("/resistivity"));
  CHECK_THROWS_WITH(quietrail::surface_resistance(1e6, 1.7e-8, 0.0), Contains("/relative_permeability"));
  CHECK_THROWS_WITH(quietrail::round_conductor({.frequency = 1e6, .diameter = 0.0}), Contains("/diameter"));
  CHECK_THROWS_WITH(quietrail::round_conductor({.frequency = 1e6, .diameter = 1e-3, .length = -2.0}),
                    Contains("/length"));
  CHECK_THROWS_AS(
      quietrail::round_conductor({.frequency = std::numeric_limits<double>::quiet_NaN(), .diameter = 1e-3}),
      quietrail::InputError);
  CHECK_THROWS_WITH(quietrail::round_wire_impedance_ratio(-1.0), Contains("/radius_over_skin_depth"));
}
