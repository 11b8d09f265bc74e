// SPDX-License-Identifier: MIT
// Self-resonance of a mounted capacitor against the series-RLC closed forms.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

#include "quietrail/calc/self_resonance.hpp"
#include "quietrail/error.hpp"
#include "quietrail/types.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::Capacitor;
using quietrail::MountingSource;
using quietrail::SelfResonanceOptions;

namespace {
constexpr double kClosedForm = 1e-9;  // own closed form vs the code (REFERENCES: 1e-9)
constexpr double kPrinted = 1e-3;     // values printed to 3-5 significant figures
}  // namespace

TEST_CASE("100 nF with 0.5 nH and 20 mohm resonates at 22.508 MHz with Q 3.536", "[calc]") {
  // REFERENCES section 2 worked value (series RLC, any circuits text).
  const auto r =
      quietrail::self_resonance({.capacitor = Capacitor{.capacitance = 100e-9, .esr = 0.02, .esl = 0.5e-9}});
  CHECK(r.mounting_source == MountingSource::none);
  CHECK_THAT(r.frequency, WithinRel(22.508e6, kPrinted));
  CHECK_THAT(r.characteristic_reactance, WithinRel(70.71e-3, kPrinted));
  CHECK_THAT(r.quality_factor, WithinRel(3.536, kPrinted));
  // |Z(SRF)| = ESR: the reactances cancel exactly at resonance (closed form).
  CHECK_THAT(r.impedance_at_resonance, WithinRel(0.02, kClosedForm));
}

TEST_CASE("an explicit mounting inductance adds to the body ESL", "[calc]") {
  // REFERENCES section 2: 100 nF / 0.6 nH -> 20.547 MHz; here 0.4 nH body + 0.2 nH mounting.
  const auto r =
      quietrail::self_resonance({.capacitor = Capacitor{.capacitance = 100e-9, .esr = 0.02, .esl = 0.4e-9},
                                 .mounting_inductance = 0.2e-9});
  CHECK(r.mounting_source == MountingSource::given);
  CHECK_THAT(r.total_inductance, WithinRel(0.6e-9, kClosedForm));
  CHECK_THAT(r.frequency, WithinRel(20.547e6, kPrinted));
}

TEST_CASE("further SRF worked values hold for a part with no mounting", "[calc]") {
  // REFERENCES section 2: 1 uF / 1.0 nH -> 5.0329 MHz; 10 nF / 0.4 nH -> 79.577 MHz.
  CHECK_THAT(quietrail::self_resonance({.capacitor = Capacitor{.capacitance = 1e-6, .esl = 1e-9}}).frequency,
             WithinRel(5.0329e6, kPrinted));
  CHECK_THAT(
      quietrail::self_resonance({.capacitor = Capacitor{.capacitance = 10e-9, .esl = 0.4e-9}}).frequency,
      WithinRel(79.577e6, kPrinted));
}

TEST_CASE("a typical package mounting gives the closed-form SRF of the total inductance", "[calc]") {
  const Capacitor part{.capacitance = 100e-9, .esr = 0.02, .esl = 0.3e-9};
  const auto r = quietrail::self_resonance({.capacitor = part, .package = quietrail::Package::p0402});
  CHECK(r.mounting_source == MountingSource::typical_package);
  // Series RLC closed form, evaluated here on whatever total the typical table gives.
  const double l = 0.3e-9 + r.mounting_inductance;
  CHECK_THAT(r.frequency, WithinRel(1.0 / (quietrail::kTwoPi * std::sqrt(l * 100e-9)), kClosedForm));
  // Typical 0402 mounted loop 0.4-1.0 nH in total (REFERENCES section 6, from memory): bounds only.
  CHECK(l >= 0.4e-9);
  CHECK(l <= 1.0e-9);
}

TEST_CASE("a via-pair mounting geometry gives the two-wire-line loop inductance", "[calc]") {
  // REFERENCES section 6: h = 1.575 mm, s = 1.0 mm, r = 0.15 mm -> 1.181 nH (acosh form).
  quietrail::MountingGeometry geometry{.via_length = 1.575e-3, .via_diameter = 0.3e-3, .via_pitch = 1.0e-3};
  const auto r =
      quietrail::self_resonance({.capacitor = Capacitor{.capacitance = 100e-9}, .geometry = geometry});
  CHECK(r.mounting_source == MountingSource::geometry);
  CHECK_THAT(r.mounting_inductance, WithinRel(1.181e-9, kPrinted));
}

TEST_CASE("the capacitive band ends where the reactance equals minus the ESR", "[calc]") {
  // Series RLC: 2 pi f L - 1/(2 pi f C) = -R  ->  omega = (-R + sqrt(R^2 + 4 L/C)) / (2 L)
  // (root of the quadratic; REFERENCES section 2 part values).
  const double c = 100e-9, l = 0.5e-9, esr = 0.02;
  const auto r = quietrail::self_resonance({.capacitor = Capacitor{.capacitance = c, .esr = esr, .esl = l}});
  REQUIRE(r.capacitive_band.has_value());
  const double w = (-esr + std::sqrt(esr * esr + 4.0 * l / c)) / (2.0 * l);
  CHECK(r.capacitive_band->low == 0.0);  // no leakage: capacitive down to DC
  CHECK_THAT(r.capacitive_band->high, WithinRel(w / quietrail::kTwoPi, kClosedForm));
}

TEST_CASE("a lossless part has infinite resonant Q", "[calc]") {
  const auto r = quietrail::self_resonance({.capacitor = Capacitor{.capacitance = 1e-6, .esl = 1e-9}});
  CHECK(std::isinf(r.quality_factor));
}

TEST_CASE("self_resonance names the offending field for bad input", "[calc]") {
  const Capacitor good{.capacitance = 100e-9, .esr = 0.02, .esl = 0.5e-9};
  SECTION("zero capacitance") {
    Capacitor bad = good;
    bad.capacitance = 0.0;
    CHECK_THROWS_WITH(quietrail::self_resonance({.capacitor = bad}), Contains("/capacitance"));
  }
  SECTION("NaN ESR") {
    Capacitor bad = good;
    bad.esr = std::numeric_limits<double>::quiet_NaN();
    CHECK_THROWS_WITH(quietrail::self_resonance({.capacitor = bad}), Contains("/esr"));
  }
  SECTION("no inductance at all") {
    CHECK_THROWS_WITH(quietrail::self_resonance({.capacitor = Capacitor{.capacitance = 1e-6}}),
                      Contains("/esl"));
  }
  SECTION("negative mounting inductance") {
    CHECK_THROWS_WITH(quietrail::self_resonance({.capacitor = good, .mounting_inductance = -1e-9}),
                      Contains("/mounting_inductance"));
  }
  SECTION("two mounting sources") {
    CHECK_THROWS_WITH(
        quietrail::self_resonance(
            {.capacitor = good, .mounting_inductance = 1e-9, .package = quietrail::Package::p0603}),
        Contains("at most one"));
  }
  SECTION("overlapping vias") {
    quietrail::MountingGeometry geometry{.via_length = 1e-3, .via_diameter = 0.3e-3, .via_pitch = 0.2e-3};
    CHECK_THROWS_WITH(quietrail::self_resonance({.capacitor = good, .geometry = geometry}),
                      Contains("/geometry/via_pitch"));
  }
}
