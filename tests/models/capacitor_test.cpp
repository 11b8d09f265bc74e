// SPDX-License-Identifier: MIT
// Capacitor model against closed forms and the worked values of REFERENCES §2.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

#include "quietrail/error.hpp"
#include "quietrail/models/capacitor.hpp"

using namespace quietrail;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {
constexpr double kExact = 1e-9;    // the model against its own closed form
constexpr double kPrinted = 1e-3;  // against values printed to 4 significant figures

Capacitor reference_part() {  // REFERENCES §2 worked example
  Capacitor c;
  c.capacitance = 100e-9;
  c.esl = 0.5e-9;
  c.esr = 0.020;
  return c;
}
}  // namespace

TEST_CASE("series RLC impedance matches the closed form and its worked values", "[models]") {
  const Capacitor c = reference_part();
  // Closed form Z = ESR + j(wL - 1/(wC)) (series RLC, any circuits text).
  for (double f : {1e3, 1e6, 3.3e7, 1e9}) {
    const double w = 2.0 * M_PI * f;
    const double x = w * c.esl - 1.0 / (w * c.capacitance);
    CHECK_THAT(std::abs(c.impedance(f)), WithinRel(std::hypot(c.esr, x), kExact));
  }
  // REFERENCES §2 worked values for 100 nF / 0.5 nH / 20 mohm.
  CHECK_THAT(std::abs(c.impedance(1e6)), WithinRel(1.5885, kPrinted));
  CHECK_THAT(std::abs(c.impedance(100e6)), WithinRel(0.2989, kPrinted));
}

TEST_CASE("|Z| at the self-resonant frequency equals ESR and is the minimum", "[models]") {
  const Capacitor c = reference_part();
  const double srf = 1.0 / (2.0 * M_PI * std::sqrt(c.esl * c.capacitance));  // f = 1/(2 pi sqrt(LC))
  CHECK_THAT(srf, WithinRel(22.508e6, kPrinted));                              // REFERENCES §2
  CHECK_THAT(c.impedance(srf).real(), WithinRel(c.esr, kExact));
  CHECK(std::abs(c.impedance(srf).imag()) < 1e-9);
  CHECK(std::abs(c.impedance(srf * 1.01)) > c.esr);
  CHECK(std::abs(c.impedance(srf / 1.01)) > c.esr);
}

TEST_CASE("dissipation factor adds a series loss tan(delta)/(wC) that falls as 1/f", "[models]") {
  Capacitor c;
  c.capacitance = 1e-6;
  c.dissipation_factor = 0.025;
  // Shunt conductance wC tan(d) seen in series: Re Z = tan(d) / (wC (1 + tan^2 d)) (derived,
  // elementary circuit algebra); REFERENCES §2 prints the series form tan(d)/(wC) = 3.979 ohm
  // at 1 kHz and 3.979 mohm at 1 MHz, which differs by the factor 1 + tan^2 d = 1.000625.
  for (double f : {1e3, 1e6}) {
    const double w = 2.0 * M_PI * f;
    const double d = c.dissipation_factor;
    CHECK_THAT(c.impedance(f).real(), WithinRel(d / (w * c.capacitance * (1 + d * d)), kExact));
  }
  CHECK_THAT(c.impedance(1e3).real(), WithinRel(3.979, kPrinted));
  CHECK_THAT(c.impedance(1e6).real(), WithinRel(3.979e-3, kPrinted));
}

TEST_CASE("leakage resistance makes the capacitor resistive at very low frequency", "[models]") {
  Capacitor c;
  c.capacitance = 1e-6;
  // 500 Mohm*uF insulation spec for 1 uF -> 500 Mohm, tau = 500 s (REFERENCES §2, from memory).
  c.leakage_resistance = 500e6;
  // C || R: Z = R / (1 + j w R C) (closed form).
  for (double f : {1e-5, 1e-3, 1.0}) {
    const double w = 2.0 * M_PI * f;
    const Complex expected = c.leakage_resistance / Complex(1.0, w * c.leakage_resistance * c.capacitance);
    CHECK_THAT(std::abs(c.impedance(f) - expected), WithinAbs(0.0, std::abs(expected) * kExact));
  }
  CHECK_THAT(c.leakage_resistance * c.capacitance, WithinRel(500.0, kExact));
}

TEST_CASE("ESR rises as sqrt(f) above the skin-effect corner", "[models]") {
  Capacitor c;
  c.capacitance = 1e-6;
  c.esr = 0.010;
  c.skin_corner = 10e6;
  // REFERENCES §2: 10 mohm at 10 MHz -> 31.62 mohm at 100 MHz (sqrt scaling).
  CHECK_THAT(c.esr_at(100e6), WithinRel(0.03162, kPrinted));
  CHECK_THAT(c.esr_at(1e6), WithinRel(0.010, kExact));
  CHECK_THAT(c.esr_at(10e6), WithinRel(0.010, kExact));
}

TEST_CASE("capacitor validation names the field and rejects zero, negative and NaN", "[models]") {
  Capacitor c = reference_part();
  CHECK_NOTHROW(c.validate("rail.json", "/branches/0"));
  c.capacitance = 0.0;
  CHECK_THROWS_WITH(c.validate("rail.json", "/branches/0"), Catch::Contains("/branches/0/capacitance"));
  c.capacitance = -1e-6;
  CHECK_THROWS_AS(c.validate("rail.json", "/branches/0"), InputError);
  c.capacitance = std::numeric_limits<double>::quiet_NaN();
  CHECK_THROWS_WITH(c.validate("rail.json", "/branches/0"), Catch::Contains("NaN"));
  c = reference_part();
  c.esr = -0.1;
  CHECK_THROWS_WITH(c.validate("rail.json", "/b"), Catch::Contains("rail.json") && Catch::Contains("/b/esr"));
  c = reference_part();
  c.leakage_resistance = 0.0;
  CHECK_THROWS_WITH(c.validate("", "/b"), Catch::Contains("leakage_resistance"));
}
