// SPDX-License-Identifier: MIT
// compare_checks (analysis/compare.hpp): peak matching on hand-built results whose expected
// pairs are written by hand from the documented rule, and the classic surprise: removing
// the mid-value group between a large and a small capacitor group raises the peak between
// them, at the frequency of the two-branch closed form (REFERENCES §3).
#include <catch2/catch.hpp>

#include <cmath>
#include <filesystem>
#include <string>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/compare.hpp"
#include "quietrail/io/project_edits.hpp"
#include "quietrail/io/project_file.hpp"
#include "support/input_error.hpp"
#include "support/temp_dir.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::CheckResult;
using quietrail::CheckStatus;
using quietrail::Peak;

namespace {

Peak peak(double frequency, double magnitude, double target = 1.0, bool edge = false) {
  Peak k;
  k.frequency = frequency;
  k.magnitude = magnitude;
  k.target = target;
  k.ratio = magnitude / target;
  k.at_band_edge = edge;
  return k;
}

CheckResult result(std::vector<Peak> peaks) {
  CheckResult r;
  r.peaks = std::move(peaks);
  return r;
}

}  // namespace

TEST_CASE("peaks are matched to the nearest peak within the factor, each once", "[analysis][compare]") {
  // Base peaks at 1, 3.7 and 11.8 MHz; other at 1.05, 11.3 and 40 MHz.
  // By the rule (factor 2, nearest log distance first): 1 <-> 1.05 (ratio 1.05),
  // 11.8 <-> 11.3 (1.044); 3.7 has no partner within 2x (1.05 is 3.5x away, 11.3 3.05x);
  // 40 has none (11.8 is 3.4x away).
  const CheckResult base = result({peak(1e6, 0.1), peak(3.7e6, 0.2), peak(11.8e6, 0.37)});
  const CheckResult other = result({peak(1.05e6, 0.1), peak(11.3e6, 0.49), peak(40e6, 0.05)});
  const auto r = quietrail::compare_checks(base, other);
  REQUIRE(r.matched.size() == 2);
  CHECK(r.matched[0].base_index == 0);
  CHECK(r.matched[0].other_index == 0);
  CHECK(r.matched[1].base_index == 2);
  CHECK(r.matched[1].other_index == 1);
  CHECK_THAT(r.matched[1].frequency_ratio, WithinRel(11.3 / 11.8, 1e-12));   // by hand
  CHECK_THAT(r.matched[1].magnitude_ratio, WithinRel(0.49 / 0.37, 1e-12));  // by hand
  CHECK(r.only_base == std::vector<std::size_t>{1});
  CHECK(r.only_other == std::vector<std::size_t>{2});
}

TEST_CASE("the nearest pair wins when two peaks compete for one", "[analysis][compare]") {
  // Other peaks at 9 and 12 MHz, base at 10 MHz: |ln(9/10)| = 0.105 < |ln(12/10)| = 0.182,
  // so 10 <-> 9 and 12 is only in other. A second base peak at 13 MHz then takes 12
  // (ratio 1.083).
  const auto r = quietrail::compare_checks(result({peak(10e6, 1.0)}), result({peak(9e6, 1.0), peak(12e6, 1.0)}));
  REQUIRE(r.matched.size() == 1);
  CHECK(r.matched[0].other_index == 0);
  CHECK(r.only_other == std::vector<std::size_t>{1});
  const auto r2 = quietrail::compare_checks(result({peak(10e6, 1.0), peak(13e6, 1.0)}),
                                            result({peak(9e6, 1.0), peak(12e6, 1.0)}));
  CHECK(r2.matched.size() == 2);
  CHECK(r2.only_base.empty());
}

TEST_CASE("the match factor bounds a match and band-edge peaks pair only with band-edge peaks",
          "[analysis][compare]") {
  // 1 MHz against 2.5 MHz: 2.5x, outside the default 2 but inside 3.
  CHECK(quietrail::compare_checks(result({peak(1e6, 1.0)}), result({peak(2.5e6, 1.0)})).matched.empty());
  CHECK(quietrail::compare_checks(result({peak(1e6, 1.0)}), result({peak(2.5e6, 1.0)}), {.match_factor = 3.0})
            .matched.size() == 1);
  const auto r = quietrail::compare_checks(result({peak(1e3, 1.0, 1.0, true)}), result({peak(1.1e3, 1.0)}));
  CHECK(r.matched.empty());
  CHECK_THAT(quietrail::test::input_error_of([] {
               quietrail::compare_checks(result({}), result({}), {.match_factor = 1.0});
             }),
             Contains("match_factor"));
}

TEST_CASE("verdicts, worst ratios and totals are compared", "[analysis][compare]") {
  CheckResult base = result({});
  base.status = CheckStatus::fail;
  base.worst_ratio = 1.5;
  base.worst_ratio_db = 20.0 * std::log10(1.5);
  base.totals = {.capacitor_count = 40, .cost = 10.0, .area = 40e-6, .cost_complete = true, .area_complete = true};
  CheckResult other = result({});
  other.worst_ratio = 0.9;
  other.worst_ratio_db = 20.0 * std::log10(0.9);
  other.totals = {.capacitor_count = 30, .cost = 12.5, .area = 35e-6, .cost_complete = false, .area_complete = true};
  const auto r = quietrail::compare_checks(base, other);
  CHECK(r.base_status == CheckStatus::fail);
  CHECK(r.other_status == CheckStatus::pass);
  CHECK_THAT(r.worst_ratio_delta, WithinRel(-0.6, 1e-12));                      // 0.9 - 1.5
  CHECK_THAT(r.worst_ratio_db_delta, WithinRel(20.0 * std::log10(0.6), 1e-12));  // 20 log10(0.9/1.5)
  CHECK(r.totals_delta.capacitor_count == -10);
  CHECK_THAT(r.totals_delta.cost, WithinRel(2.5, 1e-12));
  CHECK_THAT(r.totals_delta.area, WithinRel(-5e-6, 1e-9));
  CHECK_FALSE(r.totals_delta.cost_complete);
  CHECK(r.totals_delta.area_complete);
}

// The values of REFERENCES §3's worked example: 10 uF / 100 nF, 5 mohm each, 1 nH total
// inductance per branch (0.5 nH ESL + 0.5 nH mounting), with a 1 uF group of the same
// construction between them. The regulator (0.3 ohm + 1 uH) is about 500x the branches'
// reactance near 11 MHz, so it shifts the anti-resonance by well under 0.1 %.
constexpr const char* kThreeGroupRail = R"({
  "name": "three_groups",
  "rail": {"voltage": 1.0, "ripple": "5%", "max_current": 1,
           "band": {"start": "1k", "stop": "100MHz", "points_per_decade": 50}},
  "target": "50m",
  "regulator": {"resistance": 0.3, "inductance": "1u"},
  "bom": [
    {"part": {"kind": "capacitor", "capacitance": "10u", "esr": "5m", "esl": "0.5n"}, "mounting": "0.5n", "name": "c10u"},
    {"part": {"kind": "capacitor", "capacitance": "1u", "esr": "5m", "esl": "0.5n"}, "mounting": "0.5n", "name": "c1u"},
    {"part": {"kind": "capacitor", "capacitance": "100n", "esr": "5m", "esl": "0.5n"}, "mounting": "0.5n", "name": "c100n"}
  ]
})";

TEST_CASE("removing the mid group raises the peak between the large and small groups", "[analysis][compare]") {
  const quietrail::test::TempDir dir("compare-surprise");
  quietrail::test::write_text(dir / "rail.json", kThreeGroupRail);
  const auto base = quietrail::read_project_file(dir / "rail.json");
  const auto edited = quietrail::read_edited_project(
      dir / "rail.json", {quietrail::parse_edit_option(quietrail::EditKind::remove, "c1u", "--remove")});
  REQUIRE(edited.parts.size() == 2);
  for (const auto& part : edited.parts)  // no dielectric, 25 C: no derating, so C is as given
    REQUIRE_THAT(*part.effective_capacitance, WithinRel(*part.nominal_capacitance, 1e-12));

  const auto a = quietrail::run_check(base.network, base.port, *base.target, base.check_options(), base.branch_info);
  const auto b = quietrail::run_check(edited.network, edited.port, *edited.target, edited.check_options(),
                                      edited.branch_info);
  const auto r = quietrail::compare_checks(a, b);

  // Closed form, REFERENCES §3: f_ar = 1 / (2 pi sqrt((L1 + L2) Cs)), Cs = C1 C2 / (C1 + C2),
  // from the component values above.
  const double pi = std::acos(-1.0);
  const double c1 = 10e-6, c2 = 100e-9, l1 = 1e-9, l2 = 1e-9, r1 = 5e-3, r2 = 5e-3;
  const double cs = c1 * c2 / (c1 + c2);
  const double f_ar = 1.0 / (2.0 * pi * std::sqrt((l1 + l2) * cs));
  CHECK_THAT(f_ar, WithinRel(11.310e6, 1e-4));  // REFERENCES §3 worked example: 11.310 MHz
  // |Z_peak| ~ X^2 / (R1 + R2), X the reactance of one branch at f_ar (REFERENCES §3).
  const double w = 2.0 * pi * f_ar;
  const double x = w * l1 - 1.0 / (w * c1);
  const double z_peak = x * x / (r1 + r2);

  // The matched peak of the edited rail nearest f_ar.
  const quietrail::PeakMatch* m = nullptr;
  for (const auto& match : r.matched)
    if (!m || std::abs(std::log(match.other.frequency / f_ar)) < std::abs(std::log(m->other.frequency / f_ar)))
      m = &match;
  REQUIRE(m != nullptr);
  INFO("base peak " << m->base.frequency << " Hz, " << m->base.magnitude << " ohm; edited " << m->other.frequency
                    << " Hz, " << m->other.magnitude << " ohm");
  // REFERENCES §3: the swept maximum lies 0.25 % below the lossless f_ar for these values
  // (11.282 MHz); 0.5 % covers that and the regulator's shunt.
  CHECK_THAT(m->other.frequency, WithinRel(f_ar, 5e-3));
  // REFERENCES §3: the approximation is within 1 % of the sweep when X/(R1+R2) >= 5 (here 7);
  // 2 % allows for the regulator.
  REQUIRE(x / (r1 + r2) >= 5.0);
  CHECK_THAT(m->other.magnitude, WithinRel(z_peak, 2e-2));
  // The surprise: the peak that was between the mid and small groups is now higher.
  CHECK(m->magnitude_ratio > 1.0);
  CHECK(m->other.magnitude > m->base.magnitude);
  // One peak fewer: the 10 uF / 1 uF anti-resonance is gone (its closed form, 3.73 MHz, is
  // more than 2x from any edited peak).
  const double f_large_mid = 1.0 / (2.0 * pi * std::sqrt((l1 + l1) * (c1 * 1e-6 / (c1 + 1e-6))));
  bool gone = false;
  for (const auto i : r.only_base) gone = gone || std::abs(a.peaks[i].frequency / f_large_mid - 1.0) < 0.05;
  CHECK(gone);
  CHECK(r.totals_delta.capacitor_count == -1);
}
