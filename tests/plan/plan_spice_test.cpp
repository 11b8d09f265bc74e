// SPDX-License-Identifier: MIT
// A planned rail checked by ngspice: the plan's network is exported as a SPICE deck, swept
// on a fine AC grid, and must stay under the target there and agree with the plan's check.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <string>
#include <vector>

#include "quietrail/analysis/target.hpp"
#include "quietrail/io/spice_netlist.hpp"
#include "quietrail/network/network.hpp"
#include "quietrail/plan/plan.hpp"
#include "support/ngspice.hpp"
#include "support/temp_dir.hpp"

using namespace quietrail;

namespace {

// ngspice's AC analysis and our solvers agree to 0.1 % in |Z| and 0.1 degree in phase
// (the project's acceptance bound; tests/io/spice_netlist_test.cpp and the check examples
// in tests/cli/check_cli_test.cpp hold it on larger rails).
constexpr double kMagnitudeTolerance = 1e-3;
constexpr double kPhaseToleranceDeg = 0.1;

constexpr double kTarget = 20e-3;  // flat, ohm

double phase_deg(Complex z) { return std::arg(z) * 180.0 / std::numbers::pi; }

// A small rail (invented demo values): regulator R-L at the board and three mounted
// ceramics to choose from.
PlanProblem small_rail() {
  PlanProblem problem;
  problem.board = problem.network.add_node("board");
  problem.port = problem.board;
  problem.network.add_branch("VRM", problem.board, Network::kGround,
                             MountedPart{Regulator{.resistance = 1e-3, .inductance = 20e-9}});
  problem.target = TargetImpedance::flat(kTarget);
  // 2 decades at 50 per decade: a whole number of steps, so ngspice's `.ac dec` points
  // include this grid (spice_netlist.hpp).
  problem.band = {.start = 1e5, .stop = 1e7, .points_per_decade = 50};
  auto candidate = [](const char* name, double c, double esr, double esl, double mount, double cost) {
    PlanCandidate k;
    k.name = name;
    k.part = MountedPart{Capacitor{.capacitance = c, .esr = esr, .esl = esl}, mount};
    k.cost = cost;
    k.max_count = 12;
    k.nominal_capacitance = c;
    return k;
  };
  problem.candidates = {candidate("C22U_0805", 22e-6, 3e-3, 0.6e-9, 0.6e-9, 3.0),
                        candidate("C2U2_0402", 2.2e-6, 9e-3, 0.4e-9, 0.3e-9, 1.0),
                        candidate("C100N_0402", 100e-9, 30e-3, 0.4e-9, 0.3e-9, 1.0)};
  return problem;
}

}  // namespace

TEST_CASE("a planned rail stays under its target in ngspice and matches the plan's check", "[plan][spice]") {
  const auto ngspice = test::find_on_path("ngspice");
  if (!ngspice) FAIL(test::kNgspiceMissing);

  const PlanProblem problem = small_rail();
  PlanOptions options;
  options.front_margins_db = {};
  const PlanResult result = run_plan(problem, options);
  INFO(result.message);
  REQUIRE(result.status == PlanStatus::optimal);
  // The planned network holds the chosen copies, one branch per candidate placed.
  for (std::size_t k = 0; k < problem.candidates.size(); ++k) {
    const auto branch = result.network.find_branch(problem.candidates[k].name);
    CHECK(branch.has_value() == (result.best.counts[k] > 0));
    if (branch) CHECK(result.network.branches()[static_cast<std::size_t>(*branch)].part.count == result.best.counts[k]);
  }

  // A fine sweep: 500 points per decade, every 10th of which is a point of the plan's grid.
  const test::TempDir dir("plan-ngspice");
  SpiceNetlistOptions deck;
  deck.title = "planned rail";
  deck.sweep = {.start = problem.band.start, .stop = problem.band.stop, .points_per_decade = 500};
  deck.output_file = "z.txt";
  const auto warnings = write_spice_netlist(dir.path() / "plan.cir", result.network, problem.port, deck);
  CHECK(warnings.empty());  // lossless ceramics: the deck is exact
  const int status = test::run_ngspice(*ngspice, dir.path(), "plan.cir");
  INFO("ngspice log:\n" << test::read_text(dir.path() / "ngspice.log"));
  REQUIRE(status == 0);
  const auto rows = test::read_wrdata(dir.path() / "z.txt");
  REQUIRE(rows.size() == 1001);  // 2 decades at 500 per decade, both ends

  // Under the target at every ngspice point, within ngspice's agreement with our solver.
  double worst = 0.0, worst_at = 0.0;
  for (const auto& row : rows) {
    const double ratio = std::abs(row.value) / kTarget;
    if (ratio > worst) worst = ratio, worst_at = row.frequency;
  }
  INFO("ngspice worst |Z|/Z_t " << worst << " at " << worst_at << " Hz; plan's " << result.best.worst_ratio);
  CHECK(worst <= 1.0 + kMagnitudeTolerance);
  // The plan's refined worst ratio is a maximum over the band: no ngspice sample exceeds it.
  CHECK(worst <= result.best.worst_ratio * (1.0 + kMagnitudeTolerance));

  // The plan's check curve against ngspice at the plan's grid points.
  REQUIRE(result.check.frequencies.size() == 101);
  std::size_t matched = 0;
  double worst_magnitude = 0.0, worst_phase = 0.0;
  for (std::size_t i = 0; i < result.check.frequencies.size(); ++i) {
    const double f = result.check.frequencies[i];
    const auto row = std::find_if(rows.begin(), rows.end(),
                                  [f](const test::WrdataRow& r) { return std::abs(r.frequency / f - 1.0) < 1e-9; });
    if (row == rows.end()) continue;
    ++matched;
    const Complex ours = result.check.impedance[static_cast<Eigen::Index>(i)];
    worst_magnitude = std::max(worst_magnitude, std::abs(std::abs(ours) / std::abs(row->value) - 1.0));
    double phase = std::abs(phase_deg(ours) - phase_deg(row->value));
    worst_phase = std::max(worst_phase, std::min(phase, 360.0 - phase));
  }
  INFO("worst |Z| deviation " << worst_magnitude << ", worst phase deviation " << worst_phase << " deg");
  CHECK(matched == result.check.frequencies.size());
  CHECK(worst_magnitude < kMagnitudeTolerance);
  CHECK(worst_phase < kPhaseToleranceDeg);
}
