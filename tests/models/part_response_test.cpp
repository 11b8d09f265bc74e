// SPDX-License-Identifier: MIT
// Per-part SRF, Q and behaviour bands against closed forms (REFERENCES §2, §11).
#include <catch2/catch.hpp>

#include <cmath>

#include "quietrail/models/part_response.hpp"

using namespace quietrail;
using Catch::Matchers::WithinRel;

namespace {
constexpr double kExact = 1e-9;
constexpr double kPrinted = 1e-3;
constexpr double kBandEdge = 1e-9;  // bisection on log f goes to double precision
}  // namespace

TEST_CASE("SRF includes the mounting inductance", "[models]") {
  Capacitor c;
  c.capacitance = 1e-6;
  c.esl = 0.6e-9;
  // 1 uF with 1.0 nH in total -> 5.0329 MHz (REFERENCES §2).
  CHECK_THAT(*self_resonant_frequency(c, 0.4e-9), WithinRel(5.0329e6, kPrinted));
  // 10 nF with about 85 nH of lead inductance self-resonates near 5.5 MHz: 5.46 MHz by the
  // formula (common practice, leaded-part rule).
  Capacitor leaded;
  leaded.capacitance = 10e-9;
  CHECK_THAT(*self_resonant_frequency(leaded, 85e-9), WithinRel(5.46e6, 1e-3));
  CHECK_FALSE(self_resonant_frequency(leaded, 0.0).has_value());  // ideal: no resonance
}

TEST_CASE("inductor SRF is 1/(2 pi sqrt(L C_p))", "[models]") {
  Inductor b;
  b.inductance = 1e-6;
  b.parallel_capacitance = 1.5e-12;
  CHECK_THAT(*self_resonant_frequency(b), WithinRel(129.95e6, kPrinted));  // REFERENCES §11
}

TEST_CASE("quality factor is |X|/R", "[models]") {
  // REFERENCES §2: 100 nF, 20 mohm -> capacitor Q at 1 MHz = X_C / ESR = 79.58.
  Capacitor c;
  c.capacitance = 100e-9;
  c.esr = 0.020;
  CHECK_THAT(quality_factor(c.impedance(1e6)), WithinRel(79.58, kPrinted));
}

TEST_CASE("capacitive band ends where the reactance falls to -ESR", "[models]") {
  Capacitor c;
  c.capacitance = 100e-9;
  c.esl = 0.2e-9;
  c.esr = 0.020;
  const MountedPart part{c, 0.3e-9, 1};
  const double l = 0.5e-9, r = 0.020, cap = 100e-9;
  // wL - 1/(wC) = -R  ->  w = (-R + sqrt(R^2 + 4L/C)) / (2L) (closed form, quadratic in w).
  const double w = (-r + std::sqrt(r * r + 4 * l / cap)) / (2 * l);
  const auto band = capacitive_band(part);
  REQUIRE(band.has_value());
  CHECK(band->low == 0.0);  // no leakage: capacitive down to DC
  CHECK_THAT(band->high, WithinRel(w / (2 * M_PI), kBandEdge));
  CHECK(band->high < *self_resonant_frequency(c, 0.3e-9));
}

TEST_CASE("leakage sets the lower edge of the capacitive band at 1/(2 pi R C)", "[models]") {
  Capacitor c;
  c.capacitance = 1e-6;
  c.esr = 0.01;
  c.esl = 1e-9;
  c.leakage_resistance = 1e6;
  const auto band = capacitive_band(MountedPart{c, 0.0, 1});
  REQUIRE(band.has_value());
  // C || R_leak has |X| = R at w R C = 1 (closed form); ESR and ESL shift it by < 1e-7 here.
  CHECK_THAT(band->low, WithinRel(1.0 / (2 * M_PI * 1e6 * 1e-6), 1e-6));
}

TEST_CASE("a bead is inductive from R_dc/(2 pi L) up to below its peak", "[models]") {
  Inductor b;  // REFERENCES §11 generic bead
  b.inductance = 1e-6;
  b.core_loss_resistance = 1e3;
  b.parallel_capacitance = 1.5e-12;
  b.dc_resistance = 0.1;
  const auto band = inductive_band(MountedPart{b, 0.0, 1});
  REQUIRE(band.has_value());
  // Low edge wL = R_dc (closed form for R_dc + jwL; the core-loss term adds (wL)^2/R_ac,
  // 1e-5 relative here).
  CHECK_THAT(band->low, WithinRel(0.1 / (2 * M_PI * 1e-6), 1e-3));
  CHECK(band->high < 129.95e6);  // resistive near the peak (REFERENCES §11)
  CHECK_FALSE(capacitive_band(MountedPart{Resistor{1.0, 0.0}, 0.0, 1}).has_value());
}
