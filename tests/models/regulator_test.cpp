// SPDX-License-Identifier: MIT
// Regulator output model against REFERENCES §9 worked values.
#include <catch2/catch.hpp>

#include "quietrail/error.hpp"
#include "quietrail/models/regulator.hpp"

using namespace quietrail;
using Catch::Matchers::WithinRel;

TEST_CASE("regulator inductance from bandwidth is Z_flat / (2 pi f_bw)", "[models]") {
  constexpr double kPrinted = 1e-3;
  // REFERENCES §9 (series R-L VRM model, Smith et al. 1999, from memory): worked values.
  CHECK_THAT(Regulator::from_bandwidth(0.0, 5e-3, 50e3).inductance, WithinRel(15.92e-9, kPrinted));
  CHECK_THAT(Regulator::from_bandwidth(0.0, 5e-3, 100e3).inductance, WithinRel(7.958e-9, kPrinted));
  CHECK_THAT(Regulator::from_bandwidth(0.0, 1e-3, 20e3).inductance, WithinRel(7.958e-9, kPrinted));
}

TEST_CASE("regulator impedance is R + jwL and reaches Z_flat in reactance at the bandwidth", "[models]") {
  const Regulator r = Regulator::from_bandwidth(0.5e-3, 5e-3, 50e3);
  // wL = Z_flat at f_bw by construction of the model (REFERENCES §9).
  CHECK_THAT(r.impedance(50e3).imag(), WithinRel(5e-3, 1e-9));
  CHECK_THAT(r.impedance(50e3).real(), WithinRel(0.5e-3, 1e-9));
}

TEST_CASE("regulator bandwidth must be positive", "[models]") {
  CHECK_THROWS_AS(Regulator::from_bandwidth(0.0, 5e-3, 0.0), InputError);
  CHECK_THROWS_WITH(Regulator::from_bandwidth(0.0, -1.0, 1e3), Catch::Contains("flat impedance"));
}
