// SPDX-License-Identifier: MIT
// Yield benchmark: Monte Carlo of the shipped core-rail example (its own band: 1 kHz to
// 0.35 / t_r = 10 MHz at 50 points per decade), 2000 trials, on 1 thread and on all
// threads; reports trials per second per core (best of 3 runs). Then, to size the
// grid-sampling effect documented in docs/yield.md, re-checks the first 200 trials with
// run_check (refined peaks) and counts verdicts that differ from the grid verdict.
// A benchmark, not a test: it times and prints, and asserts nothing (figures in
// docs/benchmarks.md).
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <filesystem>
#include <thread>

#include <fmt/core.h>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/yield.hpp"
#include "quietrail/io/project_file.hpp"

using namespace quietrail;

namespace {

using Clock = std::chrono::steady_clock;

double best_seconds(const YieldProblem& problem, const YieldOptions& options, YieldResult& out) {
  double best = 1e300;
  for (int run = 0; run < 3; ++run) {
    const auto start = Clock::now();
    out = run_yield(problem, options);
    best = std::min(best, std::chrono::duration<double>(Clock::now() - start).count());
  }
  return best;
}

}  // namespace

int main() {
  const std::filesystem::path file = std::filesystem::path(QUIETRAIL_SOURCE_DIR) / "examples/projects/core_rail.json";
  const Project project = read_project_file(file);
  const YieldProblem problem = yield_problem(project);
  const unsigned cores = std::max(1u, std::thread::hardware_concurrency());
  fmt::print("core_rail: {} grid points, {} varied parts, {} hardware threads\n",
             FrequencyGrid(problem.band).size(), problem.parts.size(), cores);

  YieldResult result;
  for (const unsigned threads : {1u, cores}) {
    const YieldOptions options{.trials = 2000, .seed = 1, .threads = threads, .refine_worst = false};
    const double seconds = best_seconds(problem, options, result);
    const double rate = static_cast<double>(options.trials) / seconds;
    fmt::print("{} thread(s): {:.3f} s, {:.0f} trials/s, {:.0f} trials/s per core ({})\n", threads, seconds, rate,
               rate / threads, to_string(result.evaluation));
  }
  fmt::print("{}\n", result.brief());

  // Grid verdict against refined verdict on the first trials.
  const YieldOptions options{.trials = 2000, .seed = 1};
  const std::size_t checked = 200;
  std::size_t differ = 0;
  double largest_gap = 0.0;
  for (std::size_t trial = 0; trial < checked; ++trial) {
    const TrialDraw draw = draw_trial(problem, options, trial);
    const CheckResult check = run_check(trial_network(problem, draw), problem.port, *problem.target,
                                        CheckOptions{.grid = problem.band});
    const double grid = result.trial_worst_ratio[trial];
    if ((grid <= 1.0) != (check.status == CheckStatus::pass)) ++differ;
    largest_gap = std::max(largest_gap, check.worst_ratio / grid - 1.0);
  }
  fmt::print("grid vs refined verdict: {} of {} trials differ; refined worst ratio exceeds the grid's by up to {:.3f} %\n",
             differ, checked, 100.0 * largest_gap);
  return 0;
}
