// SPDX-License-Identifier: MIT
// Planning benchmark (single thread): the shipped core-rail example's rail, regulator,
// plane and load, with 14 candidate parts from the shipped libraries, 1 kHz .. 1 GHz at 50
// points per decade, at most 60 parts. Times run_plan to its answer (proven or with the
// gap) without and with the cost-against-margin front; median of 5 runs; reports moves
// and nodes per second and the peak resident memory.
// A benchmark, not a test: it times and prints, and asserts nothing (figures in
// docs/benchmarks.md).
#include <sys/resource.h>

#include <algorithm>
#include <chrono>
#include <cstdlib>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include <fmt/core.h>
#include <nlohmann/json.hpp>

#include "quietrail/io/project_file.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/plan/plan.hpp"
#include "quietrail/plan/search.hpp"

using namespace quietrail;

namespace {

using Clock = std::chrono::steady_clock;
int kRuns = 5;  // QUIETRAIL_BENCH_RUNS overrides

std::string read_text(const std::filesystem::path& path) {
  std::ifstream in(path);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

// The core-rail example with the bench's band, target and plan section.
Project bench_project(const std::filesystem::path& source_dir) {
  const std::filesystem::path file = source_dir / "examples/projects/core_rail.json";
  nlohmann::json project = nlohmann::json::parse(read_text(file));
  project["rail"]["band"] = {{"start", "1k"}, {"stop", "1G"}, {"points_per_decade", 50}};
  // The example's target (1.02 mohm to 1 MHz, then +20 dB/decade), carried on to 1 GHz.
  project["target"] = {{"segments",
                        {{{"start", "1k"}, {"stop", "1MHz"}, {"impedance", "1.02m"}},
                         {{"start", "1MHz"}, {"stop", "1GHz"}, {"impedance_at_start", "1.02m"},
                          {"slope_db_per_decade", 20}}}}};
  project.erase("bom");
  project.erase("bom_csv");
  project["plan"] = {
      {"objective", "cost"},
      {"max_per_part", 30},
      {"max_total", 60},
      {"candidates",
       {{"parts",
         {"poly-al-820u-2v5", "poly-al-470u-2v5", "poly-al-220u-2v5", "mlcc-0805-x5r-22u-6v3",
          "mlcc-0603-x5r-10u-6v3", "mlcc-0603-x5r-4u7-6v3", "mlcc-0603-x7r-2u2-6v3", "mlcc-0402-x5r-1u-6v3",
          "mlcc-0402-x7r-470n-6v3", "mlcc-0402-x7r-220n-6v3", "mlcc-0402-x7r-100n-10v", "mlcc-0402-x7r-47n-10v",
          "mlcc-0402-x7r-22n-16v", "mlcc-0402-x7r-10n-16v"}}}}};
  return parse_project_json(project.dump(), file.string(), file.parent_path());
}

double peak_rss_mb() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_maxrss) / 1024.0;  // Linux reports KiB
}

struct Timing {
  double median = 0.0;
  PlanResult last;
};

Timing time_plan(const PlanProblem& problem, const PlanOptions& options) {
  std::vector<double> seconds;
  Timing t;
  for (int r = 0; r < kRuns; ++r) {
    const auto start = Clock::now();
    t.last = run_plan(problem, options);
    seconds.push_back(std::chrono::duration<double>(Clock::now() - start).count());
  }
  std::sort(seconds.begin(), seconds.end());
  t.median = seconds[seconds.size() / 2];
  return t;
}

void report(const char* label, const Timing& t) {
  const PlanResult& r = t.last;
  fmt::print("{:<28} {:>8.3f} s  {}\n", label, t.median, r.message);
  std::size_t proven = 0;
  for (const FrontPoint& p : r.front) proven += p.proven ? 1 : 0;
  fmt::print("{:<28} nodes {} ({:.2f} M/s), rounds {}, frequencies {}, gap {:.3g} %, {} alternatives ({}), "
             "front {} of {} proven\n",
             "", r.stats.nodes, r.stats.nodes / t.median / 1e6, r.stats.rounds, r.stats.frequencies, 100.0 * r.gap,
             r.alternatives.size(), r.alternatives_complete ? "complete" : "search stopped", proven, r.front.size());
}

}  // namespace

int main(int argc, char** argv) {
  const std::filesystem::path source = argc > 1 ? argv[1] : QUIETRAIL_SOURCE_DIR;
  if (const char* runs = std::getenv("QUIETRAIL_BENCH_RUNS")) kRuns = std::max(1, std::atoi(runs));
  const Project project = bench_project(source);
  const PlanProblem problem = project.plan_problem();
  fmt::print("plan bench: {} candidates, {} .. {} Hz at {} points/decade, at most {} parts, {} runs (median)\n",
             problem.candidates.size(), problem.band.start, problem.band.stop, problem.band.points_per_decade,
             *problem.limits.max_total, kRuns);

  PlanOptions answer_only = project.plan_options();
  answer_only.front_margins_db.clear();
  report("answer (5 alternatives)", time_plan(problem, answer_only));

  PlanOptions single = answer_only;
  single.alternatives = 1;
  report("answer (1 alternative)", time_plan(problem, single));

  report("answer + front (5 margins)", time_plan(problem, project.plan_options()));

  // The heuristic alone on the grid: moves evaluated per second (each move is one
  // O(frequencies) evaluation of a changed selection).
  const SelectionModel model(problem, FrequencyGrid(problem.band).frequencies());
  const SearchSpec spec = SearchSpec::from_problem(problem);
  std::vector<double> seconds;
  SearchCounters counters;
  for (int r = 0; r < kRuns; ++r) {
    counters = {};
    const auto start = Clock::now();
    SplitMix64 random(1);
    const std::vector<int> greedy = greedy_construct(model, spec, counters);
    if (model.meets(model.admittance(greedy))) (void)improve_locally(model, spec, greedy, 40, random, counters);
    seconds.push_back(std::chrono::duration<double>(Clock::now() - start).count());
  }
  std::sort(seconds.begin(), seconds.end());
  const double median = seconds[seconds.size() / 2];
  fmt::print("{:<28} {:>8.3f} s  {} moves on {} frequencies: {:.2f} M moves/s\n", "heuristic only (grid)", median,
             counters.moves, model.frequency_count(), counters.moves / median / 1e6);
  fmt::print("peak resident memory: {:.1f} MB\n", peak_rss_mb());
  return 0;
}
