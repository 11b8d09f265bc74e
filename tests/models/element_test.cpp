// SPDX-License-Identifier: MIT
// Mounted parts: mounting in series, identical copies in parallel (REFERENCES §2).
#include <catch2/catch.hpp>

#include <cmath>

#include "quietrail/error.hpp"
#include "quietrail/models/element.hpp"

using namespace quietrail;
using Catch::Matchers::WithinRel;

TEST_CASE("N identical mounted capacitors equal one with ESR/N, L/N and N*C", "[models]") {
  Capacitor c;
  c.capacitance = 1e-6;
  c.esr = 0.008;
  c.esl = 0.4e-9;
  const double mount = 0.3e-9;
  const MountedPart ten{c, mount, 10};
  Capacitor equivalent;  // REFERENCES §2: N identical branches = ESR/N, L/N, N*C (exact)
  equivalent.capacitance = 10 * c.capacitance;
  equivalent.esr = c.esr / 10;
  equivalent.esl = (c.esl + mount) / 10;
  for (double f : {1e3, 1e6, 7.7e6, 1e9}) {
    const Complex a = ten.impedance(f);
    const Complex b = equivalent.impedance(f);
    CHECK_THAT(a.real(), WithinRel(b.real(), 1e-9));
    CHECK_THAT(a.imag(), WithinRel(b.imag(), 1e-9));
  }
}

TEST_CASE("element kinds are named and validated through the variant", "[models]") {
  Inductor bead;
  bead.inductance = 1e-6;
  const MountedPart part{bead, 0.0, 1};
  CHECK(element_kind(part.element) == "inductor");
  CHECK(element_kind(Element{PlanePair{}}) == "plane");
  // Closed form: jwL at 1 MHz for a bare inductor.
  CHECK_THAT(part.impedance(1e6).imag(), WithinRel(2 * M_PI * 1e6 * 1e-6, 1e-9));
  MountedPart none{bead, 0.0, 0};
  CHECK_THROWS_WITH(none.validate("x.json", "/branches/1"), Catch::Contains("/branches/1/count"));
  MountedPart negative_mount{bead, -1e-9, 1};
  CHECK_THROWS_AS(negative_mount.validate("x.json", "/b"), InputError);
}
