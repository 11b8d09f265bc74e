// SPDX-License-Identifier: MIT
// Monte Carlo yield (analysis/yield.hpp): zero spread reproduces the nominal check through
// all three evaluation paths, a single capacitor's tolerance gives the closed-form SRF and
// |Z| spread, the result does not depend on the thread count, the Wilson interval matches
// published values, and bad inputs name their field.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <string>
#include <vector>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/yield.hpp"
#include "quietrail/error.hpp"
#include "quietrail/io/project_file.hpp"
#include "quietrail/network/network.hpp"
#include "support/input_error.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;
using quietrail::Capacitor;
using quietrail::CheckOptions;
using quietrail::CheckResult;
using quietrail::CheckStatus;
using quietrail::FrequencyGridOptions;
using quietrail::MountedPart;
using quietrail::Network;
using quietrail::NodeId;
using quietrail::Resistor;
using quietrail::TargetImpedance;
using quietrail::TrialDraw;
using quietrail::VariedPart;
using quietrail::YieldEvaluation;
using quietrail::YieldOptions;
using quietrail::YieldProblem;
using quietrail::YieldResult;
using quietrail::test::input_error_of;

namespace {

constexpr double kTwoPi = 2.0 * 3.14159265358979323846;
// Same arithmetic in a different order (sum of admittances vs the solvers): rounding only.
constexpr double kSameCurve = 1e-12;

// Hyndman & Fan (1996) definition 7, written here from the definition on a sorted copy.
double type7(std::vector<double> values, double p) {
  std::sort(values.begin(), values.end());
  const double h = static_cast<double>(values.size() - 1) * p;
  const auto k = static_cast<std::size_t>(std::floor(h));
  if (k + 1 >= values.size()) return values.back();
  return values[k] + (h - static_cast<double>(k)) * (values[k + 1] - values[k]);
}

// REFERENCES §3 example: 10 uF / 1 nH / 5 mohm and 100 nF / 1 nH / 5 mohm. With `series`
// the second capacitor sits behind a 10 mohm resistor (not at the port), so the network is
// not all-parallel.
YieldProblem two_capacitor_problem(double target, bool series, bool vary_behind) {
  YieldProblem problem;
  const NodeId vdd = problem.network.add_node("vdd");
  problem.network.add_branch("C1", vdd, Network::kGround,
                             MountedPart{Capacitor{.capacitance = 10e-6, .esr = 5e-3, .esl = 1e-9}});
  if (series) {
    const NodeId x = problem.network.add_node("x");
    problem.network.add_branch("R", vdd, x, MountedPart{Resistor{.resistance = 10e-3}});
    problem.network.add_branch("C2", x, Network::kGround,
                               MountedPart{Capacitor{.capacitance = 100e-9, .esr = 5e-3, .esl = 1e-9}});
  } else {
    problem.network.add_branch("C2", vdd, Network::kGround,
                               MountedPart{Capacitor{.capacitance = 100e-9, .esr = 5e-3, .esl = 1e-9}, 0.0, 3});
  }
  problem.port = vdd;
  problem.target = TargetImpedance::flat(target);
  problem.band = FrequencyGridOptions{.start = 100e3, .stop = 1e9, .points_per_decade = 40};
  problem.dc_voltage = 1.0;
  problem.parts.push_back(VariedPart{.branch = 0, .c_nominal = 10e-6});
  if (!series || vary_behind) problem.parts.push_back(VariedPart{.branch = series ? 2 : 1, .c_nominal = 100e-9});
  return problem;
}

YieldProblem core_rail_problem(quietrail::Project& project) {
  project = quietrail::read_project_file(std::filesystem::path(QUIETRAIL_SOURCE_DIR) /
                                         "examples/projects/core_rail.json");
  return quietrail::yield_problem(project);
}

}  // namespace

TEST_CASE("with no spread every percentile curve is the nominal check curve and yield is 1 or 0",
          "[analysis][yield]") {
  struct Case {
    bool series;
    bool vary_behind;
    YieldEvaluation mode;
  };
  const Case c = GENERATE(Case{false, false, YieldEvaluation::parallel_sum},
                          Case{true, false, YieldEvaluation::port_reduction},
                          Case{true, true, YieldEvaluation::nodal});
  // The REFERENCES §3 pair peaks near 0.49 ohm and rises to about 3 ohm at 1 GHz
  // (omega * L / 2): a 10 ohm target passes everywhere, a 0.1 ohm target fails.
  const double target = GENERATE(10.0, 0.1);
  const YieldProblem problem = two_capacitor_problem(target, c.series, c.vary_behind);
  const YieldOptions options{.trials = 40, .seed = 3, .threads = 2, .esr_spread = 0.0, .esl_spread = 0.0};
  const YieldResult r = quietrail::run_yield(problem, options);
  CHECK(r.evaluation == c.mode);

  // Independent reference: run_check on the unchanged network.
  const CheckResult nominal = quietrail::run_check(problem.network, problem.port, *problem.target,
                                                   CheckOptions{.grid = problem.band});
  bool grid_pass = true;
  for (Eigen::Index j = 0; j < nominal.impedance.size(); ++j)
    grid_pass = grid_pass && std::abs(nominal.impedance[j]) <= nominal.target[j];
  REQUIRE(grid_pass == (target > 1.0));
  CHECK(r.yield == (grid_pass ? 1.0 : 0.0));
  for (const auto& curve : r.percentile_magnitude) {
    REQUIRE(curve.size() == nominal.impedance.size());
    for (Eigen::Index j = 0; j < curve.size(); ++j)
      REQUIRE_THAT(curve[j], WithinRel(std::abs(nominal.impedance[j]), kSameCurve));
  }
}

TEST_CASE("the core-rail example with zero tolerances reproduces its nominal check", "[analysis][yield]") {
  quietrail::Project project;
  YieldProblem problem = core_rail_problem(project);
  REQUIRE(problem.parts.size() == 6);
  for (VariedPart& part : problem.parts) part.c_tolerance = 0.0;
  problem.voltage_tolerance = 0.0;
  problem.temperature_min_c = problem.temperature_max_c = project.rail.temperature_c;
  const YieldResult r =
      quietrail::run_yield(problem, YieldOptions{.trials = 20, .threads = 1, .esr_spread = 0.0, .esl_spread = 0.0});
  // The library derating functions at the rail's own voltage and temperature give back the
  // capacitances the project reader put in the network (io/project_file.hpp).
  const CheckResult nominal =
      quietrail::run_check(project.network, project.port, *project.target, project.check_options());
  bool grid_pass = true;
  for (Eigen::Index j = 0; j < nominal.impedance.size(); ++j)
    grid_pass = grid_pass && std::abs(nominal.impedance[j]) <= nominal.target[j];
  CHECK(r.yield == (grid_pass ? 1.0 : 0.0));
  for (const auto& curve : r.percentile_magnitude)
    for (Eigen::Index j = 0; j < curve.size(); ++j)
      REQUIRE_THAT(curve[j], WithinRel(std::abs(nominal.impedance[j]), kSameCurve));
}

TEST_CASE("a single capacitor with +/-20 % tolerance spreads its SRF as sqrt(1/C)", "[analysis][yield]") {
  // REFERENCES §2: 100 nF, 0.5 nH, 20 mohm; SRF = 1/(2 pi sqrt(L C)) = 22.508 MHz.
  const double c0 = 100e-9, l = 0.5e-9, esr = 20e-3, tolerance = 0.2;
  YieldProblem problem;
  const NodeId vdd = problem.network.add_node("vdd");
  problem.network.add_branch("C", vdd, Network::kGround, MountedPart{Capacitor{.capacitance = c0, .esr = esr, .esl = l}});
  problem.port = vdd;
  problem.target = TargetImpedance::flat(1.0);
  problem.band = FrequencyGridOptions{.start = 1e5, .stop = 1e8, .points_per_decade = 20};  // 1 MHz is a grid point
  problem.dc_voltage = 1.0;
  problem.parts.push_back(VariedPart{.branch = 0, .c_nominal = c0, .c_tolerance = tolerance});
  const YieldOptions options{.trials = 2000, .seed = 11, .esr_spread = 0.0, .esl_spread = 0.0, .percentiles = {0.05, 0.5, 0.95}};
  const YieldResult r = quietrail::run_yield(problem, options);

  std::vector<double> srf, z_1mhz;
  const double w = kTwoPi * 1e6;
  for (std::size_t t = 0; t < options.trials; ++t) {
    const TrialDraw d = quietrail::draw_trial(problem, options, t);
    const double c = d.parts.at(0).capacitance;
    REQUIRE(c >= c0 * (1.0 - tolerance));  // uniform +/-20 %
    REQUIRE(c < c0 * (1.0 + tolerance));
    REQUIRE(d.parts[0].esr == esr);
    REQUIRE(d.parts[0].esl == l);
    srf.push_back(1.0 / (kTwoPi * std::sqrt(l * c)));  // closed form, REFERENCES §2
    z_1mhz.push_back(std::hypot(esr, w * l - 1.0 / (w * c)));
  }
  // SRF ~ sqrt(1/C): its 5th percentile is the SRF of the 95th-percentile C, which for C
  // uniform on c0 (1 +/- 0.2) is c0 (1 + 0.9 * 0.2). Sampling error of a sample quantile
  // (asymptotic variance p(1-p)/(n f^2), any statistics text): sd of u at p = 0.95,
  // n = 2000 is 2 sqrt(0.0475/2000) = 0.0097, i.e. 0.2 % in C and 0.1 % in SRF; 0.5 % is 5 sd.
  const double f0 = 1.0 / (kTwoPi * std::sqrt(l * c0));
  REQUIRE_THAT(f0, WithinRel(22.508e6, 1e-3));  // REFERENCES §2 printed value
  CHECK_THAT(type7(srf, 0.05), WithinRel(f0 / std::sqrt(1.0 + 0.9 * tolerance), 5e-3));
  CHECK_THAT(type7(srf, 0.95), WithinRel(f0 / std::sqrt(1.0 - 0.9 * tolerance), 5e-3));
  CHECK_THAT(type7(srf, 0.50), WithinRel(f0, 5e-3));

  // The run's |Z| percentiles at 1 MHz are the order statistics of the closed-form |Z| of
  // the drawn values (series RLC, REFERENCES §2), definition 7 written in this test.
  const auto at = std::find_if(r.frequencies.begin(), r.frequencies.end(),
                               [](double f) { return std::abs(f / 1e6 - 1.0) < 1e-9; });
  REQUIRE(at != r.frequencies.end());
  const auto j = static_cast<Eigen::Index>(at - r.frequencies.begin());
  for (std::size_t q = 0; q < options.percentiles.size(); ++q)
    CHECK_THAT(r.percentile_magnitude[q][j], WithinRel(type7(z_1mhz, options.percentiles[q]), kSameCurve));

  // Corners: every variate at its end, so C = c0 (1 -/+ 0.2).
  CHECK_THAT(r.low_corner.draw.parts[0].capacitance, WithinRel(c0 * 0.8, 1e-15));
  CHECK_THAT(r.high_corner.draw.parts[0].capacitance, WithinRel(c0 * 1.2, 1e-15));
  // The worst trial is the largest grid ratio (target 1 ohm fails at 100 kHz, where
  // 1/(omega C) is 16 ohm, so every trial fails and the smallest C is the worst).
  CHECK(r.passes == 0);
  CHECK(r.trial_worst_ratio[r.worst_trial] ==
        *std::max_element(r.trial_worst_ratio.begin(), r.trial_worst_ratio.end()));
  CHECK(r.worst_draw.parts[0].capacitance ==
        quietrail::draw_trial(problem, options, r.worst_trial).parts[0].capacitance);
}

TEST_CASE("a fixed seed gives identical results on 1, 2 and 3 threads", "[analysis][yield]") {
  quietrail::Project project;
  const YieldProblem problem = core_rail_problem(project);
  const YieldResult one = quietrail::run_yield(problem, YieldOptions{.trials = 300, .seed = 5, .threads = 1});
  for (const unsigned threads : {2u, 3u}) {
    const YieldResult many = quietrail::run_yield(problem, YieldOptions{.trials = 300, .seed = 5, .threads = threads});
    CHECK(many.passes == one.passes);
    CHECK(many.worst_trial == one.worst_trial);
    CHECK(many.trial_worst_ratio == one.trial_worst_ratio);  // bit-identical
    for (std::size_t q = 0; q < one.percentile_magnitude.size(); ++q)
      CHECK((many.percentile_magnitude[q].array() == one.percentile_magnitude[q].array()).all());
    CHECK(many.worst_check->worst_ratio == one.worst_check->worst_ratio);
  }
  // A different seed draws different builds.
  const YieldResult other = quietrail::run_yield(problem, YieldOptions{.trials = 300, .seed = 6, .threads = 2});
  CHECK(other.trial_worst_ratio != one.trial_worst_ratio);
}

TEST_CASE("Wilson score interval matches published values", "[analysis][yield]") {
  const double z = quietrail::two_sided_normal_quantile(0.95);
  CHECK_THAT(z, WithinRel(1.959963985, 1e-9));  // standard normal table, z_0.975
  CHECK_THAT(quietrail::two_sided_normal_quantile(0.99), WithinRel(2.575829304, 1e-9));  // z_0.995
  // Newcombe, Stat. Med. 17, 857-872 (1998), Table II, Wilson score method (from memory),
  // printed to 4 decimals.
  struct Case {
    std::size_t x, n;
    double low, high;
  };
  for (const Case c : {Case{81, 263, 0.2553, 0.3662}, Case{15, 148, 0.0624, 0.1605}, Case{0, 20, 0.0, 0.1611},
                       Case{1, 29, 0.0061, 0.1718}}) {
    const auto i = quietrail::wilson_interval(c.x, c.n, z);
    CHECK_THAT(i.low, WithinAbs(c.low, 6e-5));
    CHECK_THAT(i.high, WithinAbs(c.high, 6e-5));
  }
  // Hand-computed, Wilson 1927 formula: 8 of 10, p = 0.8, z^2/n = 0.38415:
  // centre (0.8 + 0.19207) / 1.38415 = 0.71674, half 1.95996 * sqrt(0.016 + 0.0096037) / 1.38415 = 0.22658.
  const auto i = quietrail::wilson_interval(8, 10, z);
  CHECK_THAT(i.low, WithinAbs(0.49016, 1e-5));
  CHECK_THAT(i.high, WithinAbs(0.94332, 1e-5));
}

TEST_CASE("bad yield inputs throw InputError naming the field", "[analysis][yield]") {
  const YieldProblem good = two_capacitor_problem(10.0, false, false);
  auto run = [&](const YieldProblem& p, const YieldOptions& o) { return [&p, o] { quietrail::run_yield(p, o); }; };
  CHECK_THAT(input_error_of(run(good, YieldOptions{.trials = 0})), Contains("trials"));
  const std::string too_many = input_error_of(run(good, YieldOptions{.trials = quietrail::kMaxYieldTrials + 1}));
  CHECK_THAT(too_many, Contains("trials"));
  CHECK_THAT(too_many, Contains("1000000"));
  CHECK_THAT(input_error_of(run(good, YieldOptions{.esr_spread = -0.1})), Contains("esr_spread"));
  CHECK_THAT(input_error_of(run(good, YieldOptions{.esl_spread = 1.0})), Contains("esl_spread"));
  CHECK_THAT(input_error_of(run(good, YieldOptions{.percentiles = {0.5, 1.5}})), Contains("percentiles/1"));

  YieldProblem p = good;
  p.parts[0].c_tolerance = 1.0;
  CHECK_THAT(input_error_of(run(p, {})), Contains("parts/0/c_tolerance"));
  p = good;
  p.temperature_min_c = 85.0;
  p.temperature_max_c = -40.0;
  CHECK_THAT(input_error_of(run(p, {})), Contains("temperature_max_c"));
  p = good;
  p.parts[1].branch = 0;
  CHECK_THAT(input_error_of(run(p, {})), Contains("parts/1/branch"));
  p = two_capacitor_problem(10.0, true, false);
  p.parts[0].branch = 1;  // the resistor
  CHECK_THAT(input_error_of(run(p, {})), Contains("parts/0/branch"));
}
