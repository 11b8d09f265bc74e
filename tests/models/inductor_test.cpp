// SPDX-License-Identifier: MIT
// Inductor / ferrite bead model against REFERENCES §11 (generic values, not a part).
#include <catch2/catch.hpp>

#include <cmath>

#include "quietrail/error.hpp"
#include "quietrail/models/inductor.hpp"

using namespace quietrail;
using Catch::Matchers::WithinRel;

namespace {
constexpr double kExact = 1e-9;
constexpr double kPrinted = 1e-3;

Inductor reference_bead() {  // REFERENCES §11 worked example
  Inductor b;
  b.inductance = 1e-6;
  b.core_loss_resistance = 1e3;
  b.parallel_capacitance = 1.5e-12;
  b.dc_resistance = 0.1;
  return b;
}
}  // namespace

TEST_CASE("bead impedance matches R_dc + (jwL || R_ac || 1/jwC_p) and its worked values", "[models]") {
  const Inductor b = reference_bead();
  for (double f : {1e5, 1e7, 3e8}) {
    const double w = 2.0 * M_PI * f;
    const Complex zl(0.0, w * b.inductance);
    const Complex zc(0.0, -1.0 / (w * b.parallel_capacitance));
    const Complex zr(b.core_loss_resistance, 0.0);
    const Complex expected = b.dc_resistance + 1.0 / (1.0 / zl + 1.0 / zr + 1.0 / zc);  // closed form
    CHECK_THAT(std::abs(b.impedance(f)), WithinRel(std::abs(expected), kExact));
  }
  // REFERENCES §11 worked magnitudes.
  CHECK_THAT(std::abs(b.impedance(1e6)), WithinRel(6.285, kPrinted));
  CHECK_THAT(std::abs(b.impedance(10e6)), WithinRel(63.09, kPrinted));
  CHECK_THAT(std::abs(b.impedance(100e6)), WithinRel(838.9, kPrinted));
  CHECK_THAT(std::abs(b.impedance(1e9)), WithinRel(107.3, kPrinted));
}

TEST_CASE("bead peaks at f_p = 1/(2 pi sqrt(L C_p)) with |Z| = R_dc + R_ac", "[models]") {
  const Inductor b = reference_bead();
  const double fp = 1.0 / (2.0 * M_PI * std::sqrt(b.inductance * b.parallel_capacitance));
  CHECK_THAT(fp, WithinRel(129.95e6, kPrinted));                   // REFERENCES §11
  CHECK_THAT(std::abs(b.impedance(fp)), WithinRel(1000.1, kPrinted));  // REFERENCES §11
}

TEST_CASE("a lossless inductor without winding capacitance is R_dc + jwL", "[models]") {
  Inductor l;
  l.inductance = 10e-9;
  l.dc_resistance = 0.002;
  const double f = 1e6;
  const Complex z = l.impedance(f);
  CHECK_THAT(z.real(), WithinRel(0.002, kExact));                       // closed form
  CHECK_THAT(z.imag(), WithinRel(2.0 * M_PI * f * 10e-9, kExact));      // closed form
}

TEST_CASE("inductor validation names the field", "[models]") {
  Inductor b = reference_bead();
  CHECK_NOTHROW(b.validate("f.json", "/branches/4"));
  b.inductance = 0.0;
  CHECK_THROWS_WITH(b.validate("f.json", "/branches/4"), Catch::Contains("/branches/4/inductance"));
  b = reference_bead();
  b.parallel_capacitance = -1e-12;
  CHECK_THROWS_AS(b.validate("f.json", "/b"), InputError);
}
