// SPDX-License-Identifier: MIT
// Lumped plane pair against the parallel-plate worked values of REFERENCES §7.
// Parallel-plate closed form C = eps0 er A / d is the source of every expected value.
#include <catch2/catch.hpp>

#include <cmath>

#include "quietrail/error.hpp"
#include "quietrail/models/plane_pair.hpp"

using namespace quietrail;
using Catch::Matchers::WithinRel;

namespace {
constexpr double kInch = 0.0254;
constexpr double kMil = 0.0254e-3;
}  // namespace

TEST_CASE("plane-pair capacitance follows eps0 er A / d", "[models]") {
  PlanePair p;
  p.relative_permittivity = 4.3;
  p.separation = 4 * kMil;
  p.area = kInch * kInch;
  // REFERENCES §7: 241.76 pF per square inch at 4 mil, er 4.3 ("about 0.24 nF/in^2").
  CHECK_THAT(p.capacitance(), WithinRel(241.76e-12, 1e-3));
  p.area = (10 * kInch) * (8 * kInch);
  CHECK_THAT(p.capacitance(), WithinRel(19.34e-9, 1e-3));  // REFERENCES §7, 10 x 8 in pair
}

TEST_CASE("plane loss tangent gives a shunt conductance wC tan(delta)", "[models]") {
  PlanePair p;
  p.area = 0.01;
  p.separation = 100e-6;
  p.relative_permittivity = 4.3;
  p.loss_tangent = 0.02;
  p.spreading_inductance = 50e-12;
  const double f = 10e6;
  const double w = 2.0 * M_PI * f;
  const double c = p.capacitance();
  // Complex permittivity er(1 - j tan d): Y = jwC + wC tan d (Pozar, ch. 1); plus series jwL.
  const Complex expected = Complex(0.0, w * 50e-12) + 1.0 / Complex(w * c * 0.02, w * c);
  CHECK_THAT(std::abs(p.impedance(f)), WithinRel(std::abs(expected), 1e-9));
  CHECK_THAT(p.impedance(f).real(), WithinRel(expected.real(), 1e-9));
}

TEST_CASE("plane validation rejects er below 1 and zero separation", "[models]") {
  PlanePair p;
  p.area = 0.01;
  p.separation = 0.0;
  CHECK_THROWS_WITH(p.validate("b.json", "/plane"), Catch::Contains("/plane/separation"));
  p.separation = 1e-4;
  p.relative_permittivity = 0.5;
  CHECK_THROWS_AS(p.validate("b.json", "/plane"), InputError);
}
