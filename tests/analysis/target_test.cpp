// SPDX-License-Identifier: MIT
// Rail spec and target forms against REFERENCES section 1 and log-log closed forms.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>

#include "quietrail/analysis/target.hpp"
#include "quietrail/error.hpp"
#include "support/input_error.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::RailSpec;
using quietrail::TargetForm;
using quietrail::TargetImpedance;
using quietrail::TargetPoint;
using quietrail::TargetSegment;

using quietrail::test::input_error_of;

namespace {

constexpr double kClosedForm = 1e-9;  // REFERENCES section 1: exact arithmetic


}  // namespace

TEST_CASE("a 1.0 V rail with 5 % ripple and 10 A maximum has a 10 mohm target", "[analysis]") {
  // REFERENCES section 1 worked value; dI = 50 % of I_max (Smith et al. 1999, from memory).
  const RailSpec rail{.voltage = 1.0, .ripple = 0.05, .max_current = 10.0};
  CHECK_THAT(rail.step(), WithinRel(5.0, kClosedForm));
  CHECK_THAT(rail.target_impedance(), WithinRel(10e-3, kClosedForm));
  const auto t = TargetImpedance::from_rail(rail);
  CHECK(t.form() == TargetForm::flat);
  CHECK_THAT(t.at(1e3), WithinRel(10e-3, kClosedForm));
  CHECK_THAT(t.at(1e9), WithinRel(10e-3, kClosedForm));
  CHECK(t.describe() == "flat 10 mohm");
}

TEST_CASE("a 1.0 V rail with 5 % ripple and a 10 A step has a 5 mohm target", "[analysis]") {
  // Target-impedance method Z = V r / dI (Smith et al. 1999): 0.05 V / 10 A = 5 mohm.
  const RailSpec rail{.voltage = 1.0, .ripple = 0.05, .max_current = 10.0, .current_step = 10.0};
  CHECK_THAT(rail.target_impedance(), WithinRel(5e-3, kClosedForm));
}

TEST_CASE("the step fraction of the rail is a parameter", "[analysis]") {
  // Z = V r / (k I_max): 1.0 V, 5 %, k = 0.25 of 10 A -> 0.05 / 2.5 = 20 mohm (closed form).
  const RailSpec rail{.voltage = 1.0, .ripple = 0.05, .max_current = 10.0, .step_fraction = 0.25};
  CHECK_THAT(rail.target_impedance(), WithinRel(20e-3, kClosedForm));
}

TEST_CASE("a 1 ns load rise time puts the band's upper edge at 350 MHz", "[analysis]") {
  // 0.35 / t_r: common practice (Johnson & Graham 1993), REFERENCES section 1.
  const RailSpec rail{.voltage = 1.0, .ripple = 0.05, .max_current = 10.0, .rise_time = 1e-9};
  REQUIRE(rail.band_stop_from_rise_time().has_value());
  CHECK_THAT(*rail.band_stop_from_rise_time(), WithinRel(350e6, kClosedForm));
  CHECK_FALSE(RailSpec{.voltage = 1.0, .ripple = 0.05, .max_current = 10.0}.band_stop_from_rise_time());
}

TEST_CASE("a tabulated target interpolates log-log and holds flat outside", "[analysis]") {
  // (1 MHz, 1 mohm) to (100 MHz, 100 mohm) is Z = 1 mohm * f / 1 MHz on log-log axes, so
  // 10 MHz (the log midpoint) gives 10 mohm and 2 MHz gives 2 mohm (closed form).
  const auto t = TargetImpedance::from_points({{1e6, 1e-3}, {100e6, 100e-3}});
  CHECK(t.form() == TargetForm::table);
  CHECK_THAT(t.at(10e6), WithinRel(10e-3, kClosedForm));
  CHECK_THAT(t.at(2e6), WithinRel(2e-3, kClosedForm));
  CHECK_THAT(t.at(1e3), WithinRel(1e-3, kClosedForm));
  CHECK_THAT(t.at(1e9), WithinRel(100e-3, kClosedForm));
  CHECK_THAT(t.describe(), Contains("table of 2 points") && Contains("log-log"));
}

TEST_CASE("a sloped segment rises 20 dB per decade in proportion to frequency", "[analysis]") {
  // Flat 10 mohm to 100 MHz, then +20 dB/dec: Z = 10 mohm * f / 100 MHz (closed form),
  // 100 mohm at 1 GHz and 31.62 mohm at 1 GHz / sqrt(10).
  const auto t = TargetImpedance::from_segments(
      {TargetSegment::flat(1e3, 100e6, 10e-3), TargetSegment::sloped(100e6, 1e9, 10e-3, 20.0)});
  CHECK_THAT(t.segments()[1].impedance_at_stop, WithinRel(100e-3, kClosedForm));
  CHECK_THAT(t.at(50e6), WithinRel(10e-3, kClosedForm));
  CHECK_THAT(t.at(1e9 / std::sqrt(10.0)), WithinRel(10e-3 * std::sqrt(10.0), kClosedForm));
  CHECK_THAT(t.at(1e9), WithinRel(100e-3, kClosedForm));
  CHECK_THAT(t.describe(), Contains("2 segments") && Contains("rising to 100 mohm"));
  const auto corners = t.outline(1e3, 1e9);
  REQUIRE(corners.size() == 3);
  CHECK(corners[1].frequency == 100e6);
}

TEST_CASE("at a step between segments the stricter value applies", "[analysis]") {
  // 20 mohm up to 1 MHz, 10 mohm above: at the shared edge the lower value is the target.
  const auto t = TargetImpedance::from_segments(
      {TargetSegment::flat(1e3, 1e6, 20e-3), TargetSegment::flat(1e6, 1e9, 10e-3)});
  CHECK(t.at(0.999e6) == 20e-3);
  CHECK(t.at(1e6) == 10e-3);
  CHECK(t.at(1.001e6) == 10e-3);
  CHECK(t.minimum() == 10e-3);
  const auto outline = t.outline(1e3, 1e9);
  REQUIRE(outline.size() == 4);  // start, both sides of the step, stop
  CHECK(outline[1].frequency == 1e6);
  CHECK(outline[1].impedance == 20e-3);
  CHECK(outline[2].frequency == 1e6);
  CHECK(outline[2].impedance == 10e-3);
}

TEST_CASE("target segments with a gap or an overlap are rejected naming both", "[analysis]") {
  const std::string gap = input_error_of([] {
    (void)TargetImpedance::from_segments({TargetSegment::flat(1e3, 1e6, 10e-3), TargetSegment::flat(2e6, 1e9, 10e-3)},
                                         "rail.json", "/target/segments");
  });
  CHECK_THAT(gap, Contains("rail.json") && Contains("/target/segments/1/start") && Contains("gap from 1 MHz to 2 MHz"));
  const std::string overlap = input_error_of([] {
    (void)TargetImpedance::from_segments({TargetSegment::flat(1e3, 2e6, 10e-3), TargetSegment::flat(1e6, 1e9, 10e-3)},
                                         "rail.json", "/target/segments");
  });
  CHECK_THAT(overlap, Contains("overlap from 1 MHz to 2 MHz") && Contains("segment 0"));
  // Edges equal to 1e-9 relative (as after unit parsing) count as shared.
  CHECK_NOTHROW(TargetImpedance::from_segments(
      {TargetSegment::flat(1e3, 1e6, 10e-3), TargetSegment::flat(1e6 * (1.0 + 1e-12), 1e9, 10e-3)}));
}

TEST_CASE("segments must cover the band of a check", "[analysis]") {
  const auto t = TargetImpedance::from_segments({TargetSegment::flat(10e3, 100e6, 10e-3)});
  CHECK_THAT(input_error_of([&] { t.cover_band(1e3, 100e6, "rail.json", "/target"); }),
             Contains("/target") && Contains("no target from 1 kHz to 10 kHz"));
  CHECK_THAT(input_error_of([&] { t.cover_band(10e3, 1e9); }), Contains("no target from 100 MHz to 1 GHz"));
  CHECK_NOTHROW(t.cover_band(10e3, 100e6));
  CHECK_NOTHROW(TargetImpedance::flat(1e-3).cover_band(1.0, 1e12));
}

TEST_CASE("bad targets and rails are rejected by field", "[analysis]") {
  CHECK_THAT(input_error_of([] { (void)TargetImpedance::flat(0.0, "r.json", "/target/impedance"); }),
             Contains("/target/impedance") && Contains("> 0"));
  CHECK_THAT(input_error_of([] { (void)TargetImpedance::flat(-1e-3); }), Contains("> 0"));
  CHECK_THAT(input_error_of([] { (void)TargetImpedance::from_points({{1e6, 1e-3}}, "r.json", "/target/points"); }),
             Contains("/target/points") && Contains("at least two points"));
  CHECK_THAT(input_error_of([] { (void)TargetImpedance::from_points({{1e6, 1e-3}, {1e6, 2e-3}}, "", "/t"); }),
             Contains("/t/1/frequency") && Contains("increasing"));
  CHECK_THAT(input_error_of([] { (void)TargetImpedance::from_points({{1e6, 1e-3}, {2e6, -2e-3}}, "", "/t"); }),
             Contains("/t/1/impedance"));
  CHECK_THAT(input_error_of([] { (void)TargetImpedance::from_segments({{1e6, 1e3, 1e-3, 1e-3}}, "", "/s"); }),
             Contains("/s/0/stop"));
  CHECK_THAT(input_error_of([] { (void)TargetImpedance::from_segments({}, "", "/s"); }), Contains("at least one"));

  const RailSpec good{.voltage = 1.0, .ripple = 0.05, .max_current = 10.0};
  auto rail_error = [&](auto change) {
    RailSpec r = good;
    change(r);
    return input_error_of([&] { r.validate("rail.json", "/rail"); });
  };
  CHECK(rail_error([](RailSpec&) {}).empty());
  CHECK_THAT(rail_error([](RailSpec& r) { r.ripple = 1.5; }), Contains("rail.json") && Contains("/rail/ripple"));
  CHECK_THAT(rail_error([](RailSpec& r) { r.voltage = 0.0; }), Contains("/rail/voltage"));
  CHECK_THAT(rail_error([](RailSpec& r) { r.max_current = -1.0; }), Contains("/rail/max_current"));
  CHECK_THAT(rail_error([](RailSpec& r) { r.current_step = 20.0; }), Contains("/rail/current_step"));
  CHECK_THAT(rail_error([](RailSpec& r) { r.step_fraction = 0.0; }), Contains("/rail/step_fraction"));
  CHECK_THAT(rail_error([](RailSpec& r) { r.rise_time = 0.0; }), Contains("/rail/rise_time"));
  CHECK_THAT(rail_error([](RailSpec& r) { r.temperature_c = -300.0; }), Contains("/rail/temperature_c"));
}
