// SPDX-License-Identifier: MIT
// Mounting inductance: geometry formulas (REFERENCES §6, §7) and the typical table as bounds.
#include <catch2/catch.hpp>

#include "quietrail/error.hpp"
#include "quietrail/models/mounting.hpp"

using namespace quietrail;
using Catch::Matchers::WithinRel;

namespace {
constexpr double kMil = 0.0254e-3;
}

TEST_CASE("via-pair mounting follows the two-wire acosh form", "[models]") {
  MountingGeometry g;
  g.via_length = 1.575e-3;
  g.via_pitch = 1.0e-3;
  g.via_diameter = 0.3e-3;
  // REFERENCES §6 worked value: h 1.575 mm, s 1.0 mm, r 0.15 mm -> 1.181 nH (acosh form);
  // two-wire line inductance, used for via pairs by Bogatin (from memory).
  CHECK_THAT(g.inductance(), WithinRel(1.181e-9, 1e-3));
  g.vias_per_terminal = 2;  // two independent pairs in parallel: half
  CHECK_THAT(g.inductance(), WithinRel(1.181e-9 / 2, 1e-3));
}

TEST_CASE("fan-out traces add the plane sheet inductance per square", "[models]") {
  MountingGeometry g;
  g.via_length = 1.575e-3;
  g.via_pitch = 1.0e-3;
  g.via_diameter = 0.3e-3;
  const double vias = g.inductance();
  g.trace_height = 4 * kMil;
  g.trace_length = 1.0e-3;
  g.trace_width = 0.5e-3;
  // Two traces of 2 squares each = 4 squares at 4 mil; sheet inductance mu0*h is 127.7 pH per
  // square at 4 mil (REFERENCES §7, Bogatin's rule of ~32 pH/sq per mil).
  CHECK_THAT(g.inductance() - vias, WithinRel(4 * 127.7e-12, 1e-3));
}

TEST_CASE("typical package mounting plus body ESL lands in the typical mounted-loop range", "[models]") {
  // REFERENCES §6 typical table (from memory), used only as plausibility bounds:
  // package, body ESL range, mounted loop range (short fan-out).
  struct Row { Package p; double body_lo, body_hi, loop_lo, loop_hi; };
  const Row rows[] = {
      {Package::p0402, 0.3e-9, 0.5e-9, 0.4e-9, 1.0e-9},
      {Package::p0603, 0.4e-9, 0.8e-9, 0.6e-9, 1.5e-9},
      {Package::p0805, 0.5e-9, 1.0e-9, 0.8e-9, 2.0e-9},
      {Package::p1206, 0.8e-9, 1.2e-9, 1.0e-9, 2.5e-9},
  };
  for (const Row& r : rows) {
    const double m = typical_mounting_inductance(r.p);
    CHECK(m + r.body_lo >= r.loop_lo);
    CHECK(m + r.body_hi <= r.loop_hi);
  }
  // Larger packages have longer current loops (common practice).
  CHECK(typical_mounting_inductance(Package::p0201) < typical_mounting_inductance(Package::p0402));
  CHECK(typical_mounting_inductance(Package::p1206) < typical_mounting_inductance(Package::p1210));
}

TEST_CASE("package codes parse and print", "[models]") {
  CHECK(parse_package("0402") == Package::p0402);
  CHECK(parse_package("case 1210") == Package::p1210);
  CHECK_FALSE(parse_package("0404").has_value());
  CHECK(to_string(Package::p0603) == "0603");
}

TEST_CASE("mounting geometry validation names the field", "[models]") {
  MountingGeometry g;
  g.via_length = 1e-3;
  g.via_diameter = 0.3e-3;
  g.via_pitch = 0.2e-3;  // overlapping vias
  CHECK_THROWS_WITH(g.validate("p.json", "/m"), Catch::Contains("/m/via_pitch"));
  g.via_pitch = 1e-3;
  g.trace_length = 1e-3;  // trace without width
  CHECK_THROWS_WITH(g.validate("p.json", "/m"), Catch::Contains("/m/trace_width"));
}
