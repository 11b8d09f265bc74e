// SPDX-License-Identifier: MIT
// `quietrail plan`: read a project with a `plan` section (docs/project_file.md), choose the
// candidates' counts with run_plan (docs/planning.md), write the planned project, its BOM,
// the plan and check reports (docs/reports.md, "plan") and print a summary.
#include <unistd.h>

#include <algorithm>
#include <charconv>
#include <chrono>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <system_error>
#include <filesystem>
#include <fstream>
#include <memory>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>
#include <fmt/core.h>

#include "cli/check_report.hpp"
#include "cli/commands.hpp"
#include "cli/exit_code.hpp"
#include "cli/file_names.hpp"
#include "cli/output_files.hpp"
#include "cli/plan_report.hpp"
#include "cli/terminal.hpp"
#include "quietrail/analysis/check.hpp"
#include "quietrail/error.hpp"
#include "quietrail/io/project_file.hpp"
#include "quietrail/plan/plan.hpp"

namespace quietrail::cli {
namespace {

namespace fs = std::filesystem;

constexpr const char* kCommandLine = "command line";
// The project file's range for "alternatives" (docs/project_file.md, `plan`).
constexpr long long kMaxAlternatives = 50;

struct PlanArgs {
  std::string project_file;
  std::string out_dir;
  bool json = false;
  std::string objective;  // empty: the plan section's
  std::string seed;  // empty: the plan section's; parsed here (CLI11 wraps "-1" into 2^64 - 1)
  std::optional<long long> alternatives;
  std::optional<long long> node_limit;
};

PlanFiles output_files(const fs::path& input, const Project& project, const std::string& out_dir) {
  PlanFiles files;
  files.directory = out_dir.empty() ? fs::path("out") / input.stem() : fs::path(out_dir);
  const std::string stem = file_stem_for(project.name, input.stem().string());
  files.planned_project = files.directory / (stem + "_planned.json");
  files.planned_bom = files.directory / (stem + "_planned_bom.csv");
  files.impedance_svg = files.directory / (stem + "_impedance.svg");
  files.curves_csv = files.directory / (stem + "_curves.csv");
  files.plan_json = files.directory / (stem + "_plan.json");
  files.front_svg = files.directory / (stem + "_front.svg");
  files.html = files.directory / (stem + "_report.html");
  return files;
}

// The project text as given, to carry every field over into the planned project.
std::string read_input_text(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  if (!in && !in.eof()) throw InputError({path.string(), ""}, "a readable project file (JSON)", "a read error");
  return text.str();
}

// One line on stderr, rewritten in place, while a long search runs on a terminal. Wall-clock
// time decides only whether and how often to draw; the search never sees it.
class ProgressLine {
 public:
  using Clock = std::chrono::steady_clock;
  static constexpr std::chrono::milliseconds kQuietFor{1000};  // short plans print nothing
  static constexpr std::chrono::milliseconds kEvery{100};      // redraws at most 10 times a second

  void update(double best, double bound, std::size_t nodes) noexcept {
    try {
      const auto now = Clock::now();
      if (now - start_ < kQuietFor || (shown_ && now - last_ < kEvery)) return;
      last_ = now;
      const double seconds = std::chrono::duration<double>(now - start_).count();
      std::string text = fmt::format("planning: best {}, bound {}, {} nodes, {:.1f} s",
                                     std::isfinite(best) ? fmt::format("{:.4g}", best) : std::string("none yet"),
                                     std::isfinite(bound) ? fmt::format("{:.4g}", bound) : std::string("-"), nodes,
                                     seconds);
      const std::size_t length = text.size();
      if (length < width_) text.append(width_ - length, ' ');
      width_ = std::max(width_, length);
      fmt::print(stderr, "\r{}", text);
      std::fflush(stderr);
      shown_ = true;
    } catch (...) {
      // A progress display must never stop the plan.
    }
  }

  void clear() noexcept {
    if (!shown_) return;
    std::fprintf(stderr, "\r%*s\r", static_cast<int>(width_), "");
    std::fflush(stderr);
    shown_ = false;
  }

 private:
  Clock::time_point start_ = Clock::now();
  Clock::time_point last_{};
  std::size_t width_ = 0;
  bool shown_ = false;
};

// A seed as written: decimal digits only, 0 to 2^64 - 1 (as the plan section's "seed").
std::uint64_t parse_seed(const std::string& text) {
  std::uint64_t value = 0;
  const char* end = text.data() + text.size();
  const auto [ptr, error] = std::from_chars(text.data(), end, value);
  if (text.empty() || error != std::errc() || ptr != end)
    throw InputError({kCommandLine, "--seed"}, "a whole number from 0 to 18446744073709551615", "'" + text + "'");
  return value;
}

// The command line's options, checked before anything is read.
void check_arguments(const PlanArgs& args) {
  if (!args.seed.empty()) parse_seed(args.seed);
  if (!args.objective.empty() && !parse_plan_objective(args.objective))
    throw InputError({kCommandLine, "--objective"}, "one of cost, count or area", "'" + args.objective + "'");
  if (args.alternatives && (*args.alternatives < 1 || *args.alternatives > kMaxAlternatives))
    throw InputError({kCommandLine, "--alternatives"}, fmt::format("a whole number from 1 to {}", kMaxAlternatives),
                     std::to_string(*args.alternatives));
  if (args.node_limit && *args.node_limit < 1)
    throw InputError({kCommandLine, "--node-limit"}, "a whole number >= 1", std::to_string(*args.node_limit));
}

// The command line's overrides of the plan section (checked by check_arguments).
void apply_overrides(const PlanArgs& args, PlanProblem& problem, PlanOptions& options) {
  if (!args.objective.empty()) problem.objective = *parse_plan_objective(args.objective);
  if (!args.seed.empty()) options.seed = parse_seed(args.seed);
  if (args.alternatives) options.alternatives = static_cast<std::size_t>(*args.alternatives);
  if (args.node_limit) options.node_limit = static_cast<std::size_t>(*args.node_limit);
}

// The planned project read back and checked exactly as `quietrail check` does
// (check_command.cpp), other view included.
CheckRun check_planned(const PlanRun& run) {
  CheckRun check;
  check.input = run.files.planned_project;
  try {
    check.project = parse_project_json(run.planned_project, run.files.planned_project.string(), run.files.directory);
  } catch (const InputError& e) {
    // The reader accepted the input and the plan added only library lines: a bug.
    throw InternalError(std::string("the planned project does not read back: ") + e.what());
  }
  check_project(check);
  // The plan writes no separate check JSON or page: the check lives inside the plan's.
  check.files.directory = run.files.directory;
  check.files.json = run.files.plan_json;
  check.files.csv = run.files.curves_csv;
  check.files.svg = run.files.impedance_svg;
  check.files.html = run.files.html;
  return check;
}

int run(const PlanArgs& args) {
  // Everything that can fail on bad input happens before anything is written.
  check_arguments(args);
  PlanRun run;
  run.input = args.project_file;
  run.project = read_project_file(run.input);
  const std::string input_text = read_input_text(run.input);
  run.problem = run.project.plan_problem();  // InputError at "/plan" without a plan section
  run.options = run.project.plan_options();
  apply_overrides(args, run.problem, run.options);
  run.files = output_files(run.input, run.project, args.out_dir);

  ProgressLine progress;
  PlanOptions options = run.options;
  if (::isatty(::fileno(stderr)) == 1)
    options.progress = [&progress](double best, double bound, std::size_t nodes) { progress.update(best, bound, nodes); };
  try {
    run.result = run_plan(run.problem, options);
  } catch (...) {
    progress.clear();
    throw;
  }
  progress.clear();

  run.planned_project =
      planned_project_json(input_text, run.project, run.problem, run.result.best.counts, run.files.directory);
  run.planned = check_planned(run);

  std::vector<fs::path> inputs{run.input};
  for (const auto& library : run.project.libraries) inputs.emplace_back(library);
  if (!run.project.bom_csv.empty()) inputs.emplace_back(run.project.bom_csv);

  const bool feasible = run.result.status != PlanStatus::infeasible;
  const std::string json = plan_json(run);
  const std::string impedance = check_svg(run.planned);
  const std::string front = feasible ? front_svg(run) : std::string();
  std::vector<OutputFile> outputs{{run.files.planned_project, run.planned_project},
                                  {run.files.planned_bom, planned_bom_csv(run)},
                                  {run.files.plan_json, json},
                                  {run.files.impedance_svg, impedance},
                                  {run.files.curves_csv, check_csv(run.planned)}};
  if (feasible) outputs.emplace_back(run.files.front_svg, front);
  outputs.emplace_back(run.files.html, plan_html(run, front, impedance));

  create_output_directory(run.files.directory);
  write_all_or_none(outputs, inputs);

  if (args.json) fmt::print("{}", json);
  else fmt::print("{}", plan_text(run, colour_enabled(stdout)));
  return feasible ? kExitOk : kExitTargetNotMet;
}

}  // namespace

void register_plan(CLI::App& app, Action& action) {
  auto args = std::make_shared<PlanArgs>();
  CLI::App* sub = app.add_subcommand(
      "plan",
      "Choose capacitor counts that hold the rail under its target impedance at the least cost: exit 0 when a "
      "selection meets it, 1 when none within the limits does, 2 on bad input; writes <out>/<name>_planned.json "
      "(check it with `quietrail check`), _planned_bom.csv, _plan.json, _report.html, _front.svg, _impedance.svg "
      "and _curves.csv");
  sub->add_option("project", args->project_file, "project file with a \"plan\" section (JSON; docs/project_file.md)")
      ->required();
  sub->add_option("--out", args->out_dir, "output directory (default: out/<project file stem>)");
  sub->add_flag("--json", args->json, "print the plan JSON on stdout instead of the summary");
  sub->add_option("--objective", args->objective, "what to minimise: cost, count or area (default: the plan section's)");
  sub->add_option("--seed", args->seed, "seed of the search's random perturbations, 0 to 2^64 - 1");
  sub->add_option_function<long long>(
      "--alternatives", [args](const long long& v) { args->alternatives = v; },
      "how many of the best distinct selections to report, 1 to 50");
  sub->add_option_function<long long>(
      "--node-limit", [args](const long long& v) { args->node_limit = v; },
      "branch-and-bound nodes per search before it stops and reports the gap");
  sub->footer("Example: quietrail plan examples/projects/core_rail.json && quietrail check "
              "out/core_rail/core_rail_planned.json");
  sub->callback([&action, args] { action = [args] { return run(*args); }; });
}

}  // namespace quietrail::cli
