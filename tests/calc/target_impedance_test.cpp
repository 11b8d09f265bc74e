// SPDX-License-Identifier: MIT
// Target impedance against the worked values of REFERENCES section 1.
#include <catch2/catch.hpp>

#include <limits>

#include "quietrail/calc/target_impedance.hpp"
#include "quietrail/error.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::CurrentStepSource;
using quietrail::TargetImpedanceOptions;

namespace {
constexpr double kClosedForm = 1e-9;  // exact arithmetic (REFERENCES section 1: 1e-9)
constexpr double kPrinted = 1e-3;     // values printed to 4 significant figures
}  // namespace

TEST_CASE("1.0 V with 5 % ripple and a 10 A maximum needs 10 mohm", "[calc]") {
  // Smith et al. 1999: dI = 50 % of I_max (from memory) -> 0.05 V / 5 A = 10.0 mohm.
  const auto r = quietrail::target_impedance({.voltage = 1.0, .ripple = 0.05, .max_current = 10.0});
  CHECK(r.current_step_source == CurrentStepSource::max_current);
  CHECK_THAT(r.current_step, WithinRel(5.0, kClosedForm));
  CHECK_THAT(r.impedance, WithinRel(10.0e-3, kClosedForm));
}

TEST_CASE("1.0 V with 5 % ripple and a 10 A step needs 5 mohm", "[calc]") {
  // Z_t = V r / dI with the step given directly: 0.05 V / 10 A (target-impedance method).
  const auto r = quietrail::target_impedance({.voltage = 1.0, .ripple = 0.05, .current_step = 10.0});
  CHECK(r.current_step_source == CurrentStepSource::given);
  CHECK_THAT(r.ripple_voltage, WithinRel(0.05, kClosedForm));
  CHECK_THAT(r.impedance, WithinRel(5.0e-3, kClosedForm));
}

TEST_CASE("1.2 V, 3 % and 24 W give 3.600 mohm by either route", "[calc]") {
  // REFERENCES section 1: I_max = 20 A, dI = 10 A -> 3.600 mohm; Smith form
  // V^2 r / (0.5 P) = 1.44 * 0.03 / 12 = 3.600 mohm.
  const auto by_power = quietrail::target_impedance({.voltage = 1.2, .ripple = 0.03, .power = 24.0});
  CHECK(by_power.current_step_source == CurrentStepSource::power);
  CHECK_THAT(by_power.impedance, WithinRel(3.600e-3, kClosedForm));
  const auto by_step = quietrail::target_impedance({.voltage = 1.2, .ripple = 0.03, .current_step = 10.0});
  CHECK_THAT(by_step.impedance, WithinRel(3.600e-3, kClosedForm));
}

TEST_CASE("0.8 V, 2 % and a 40 A step give 0.400 mohm", "[calc]") {
  // REFERENCES section 1 worked value.
  const auto r = quietrail::target_impedance({.voltage = 0.8, .ripple = 0.02, .current_step = 40.0});
  CHECK_THAT(r.impedance, WithinRel(0.400e-3, kClosedForm));
}

TEST_CASE("the step fraction is a parameter", "[calc]") {
  // Z_t = V r / (k I_max): with k = 1 the full 10 A steps -> 5 mohm (closed form).
  const auto r = quietrail::target_impedance(
      {.voltage = 1.0, .ripple = 0.05, .max_current = 10.0, .step_fraction = 1.0});
  CHECK_THAT(r.impedance, WithinRel(5.0e-3, kClosedForm));
}

TEST_CASE("a 1 ns rise time puts the band edge at 350 MHz (or 318.3 MHz)", "[calc]") {
  // 0.35 / t_r: common practice (Johnson & Graham 1993; Bogatin 2009); 1/(pi t_r) = 318.3 MHz.
  const auto r =
      quietrail::target_impedance({.voltage = 1.0, .ripple = 0.05, .current_step = 5.0, .rise_time = 1e-9});
  REQUIRE(r.knee_frequency.has_value());
  REQUIRE(r.corner_frequency.has_value());
  CHECK_THAT(*r.knee_frequency, WithinRel(350e6, kClosedForm));
  CHECK_THAT(*r.corner_frequency, WithinRel(318.3e6, kPrinted));
  CHECK_FALSE(r.required_capacitance.has_value());
}

TEST_CASE("holding 10 mohm down to a 50 kHz handoff takes 318.3 uF", "[calc]") {
  // C >= 1 / (2 pi f_low Z_t): REFERENCES section 1 worked value.
  const auto r = quietrail::target_impedance(
      {.voltage = 1.0, .ripple = 0.05, .current_step = 5.0, .handoff_frequency = 50e3});
  REQUIRE(r.required_capacitance.has_value());
  CHECK_THAT(*r.required_capacitance, WithinRel(318.3e-6, kPrinted));
}

TEST_CASE("target impedance rejects bad rail specs by field", "[calc]") {
  const TargetImpedanceOptions good{.voltage = 1.0, .ripple = 0.05, .current_step = 5.0};
  auto with = [&](auto change) {
    TargetImpedanceOptions o = good;
    change(o);
    return o;
  };
  const double nan = std::numeric_limits<double>::quiet_NaN();
  CHECK_THROWS_WITH(quietrail::target_impedance(with([](auto& o) { o.voltage = 0.0; })),
                    Contains("/voltage"));
  CHECK_THROWS_WITH(quietrail::target_impedance(with([](auto& o) { o.ripple = 0.0; })), Contains("/ripple"));
  CHECK_THROWS_WITH(quietrail::target_impedance(with([](auto& o) { o.ripple = 5.0; })), Contains("(0, 1]"));
  CHECK_THROWS_WITH(quietrail::target_impedance(with([&](auto& o) { o.current_step = nan; })),
                    Contains("/current_step"));
  CHECK_THROWS_WITH(quietrail::target_impedance(with([](auto& o) { o.current_step.reset(); })),
                    Contains("a current step, a maximum current or a load power"));
  CHECK_THROWS_WITH(quietrail::target_impedance(with([](auto& o) {
                      o.current_step.reset();
                      o.max_current = 10.0;
                      o.power = 10.0;
                    })),
                    Contains("/power"));
  CHECK_THROWS_WITH(quietrail::target_impedance(with([](auto& o) { o.max_current = 2.0; })),
                    Contains("/current_step"));
  CHECK_THROWS_WITH(quietrail::target_impedance(with([](auto& o) { o.step_fraction = -0.5; })),
                    Contains("/step_fraction"));
  CHECK_THROWS_WITH(quietrail::target_impedance(with([](auto& o) { o.rise_time = -1e-9; })),
                    Contains("/rise_time"));
  CHECK_THROWS_WITH(quietrail::target_impedance(with([](auto& o) { o.handoff_frequency = 0.0; })),
                    Contains("/handoff_frequency"));
}
