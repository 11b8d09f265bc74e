// SPDX-License-Identifier: MIT
// `quietrail yield`: Monte Carlo of a project's BOM over tolerance, ESR/ESL spread and
// derating (analysis/yield.hpp, docs/yield.md); prints a summary and writes the percentile
// curves (CSV), the summary with the worst trial and corners (JSON), the percentile plot
// (SVG) and the page (HTML; yield_report.hpp).
#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <optional>
#include <sstream>
#include <memory>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>
#include <fmt/core.h>
#include <nlohmann/json.hpp>

#include "cli/commands.hpp"
#include "cli/terminal.hpp"
#include "cli/exit_code.hpp"
#include "cli/file_names.hpp"
#include "cli/output_files.hpp"
#include "cli/yield_report.hpp"
#include "quietrail/analysis/yield.hpp"
#include "quietrail/error.hpp"
#include "quietrail/io/project_file.hpp"

namespace quietrail::cli {
namespace {

namespace fs = std::filesystem;

struct YieldArgs {
  std::string project_file;
  std::string out_dir;
  std::size_t trials = YieldOptions{}.trials;
  std::uint64_t seed = YieldOptions{}.seed;
  unsigned threads = 0;
  bool json = false;
};

nlohmann::json draw_json(const YieldProblem& problem, const TrialDraw& draw) {
  nlohmann::json parts = nlohmann::json::array();
  for (const PartDraw& part : draw.parts)
    parts.push_back({{"branch", problem.network.branches()[static_cast<std::size_t>(part.branch)].name},
                     {"capacitance", part.capacitance},
                     {"esr", part.esr},
                     {"esl", part.esl}});
  return {{"trial", draw.trial}, {"dc_voltage", draw.dc_voltage}, {"temperature_c", draw.temperature_c},
          {"parts", parts}};
}

nlohmann::json check_json(const std::optional<CheckResult>& check) {
  if (!check) return nullptr;
  return {{"status", to_string(check->status)},
          {"worst_ratio", check->worst_ratio},
          {"worst_frequency", check->worst_frequency}};
}

std::string curves_csv(const YieldResult& r) {
  std::string out = "frequency_hz,target_ohm,nominal_ohm";
  for (const double p : r.percentiles) out += fmt::format(",p{:g}_ohm", 100.0 * p);
  out += "\n";
  for (std::size_t j = 0; j < r.frequencies.size(); ++j) {
    const auto i = static_cast<Eigen::Index>(j);
    out += fmt::format("{:.9g},{:.9g},{:.9g}", r.frequencies[j], r.target[i], std::abs(r.nominal.impedance[i]));
    for (const RealVector& curve : r.percentile_magnitude) out += fmt::format(",{:.9g}", curve[i]);
    out += "\n";
  }
  return out;
}


// The worst trial as a project file `quietrail check` can re-run: the input project with
// each varied BOM line turned into an inline capacitor holding the drawn values (no
// dielectric, so it is not derated again), its mounting as a line override and its branch
// name; library and CSV paths made absolute; the plan section dropped. std::nullopt, with
// the reason in `why`, when a varied part is not a "/bom/<i>" line (BOM CSV, supply side,
// plan.keep).
std::optional<std::string> worst_project_json(const fs::path& input, const Project& project,
                                              const YieldProblem& problem, const TrialDraw& draw, std::string& why) {
  std::ifstream in(input);
  std::ostringstream text;
  text << in.rdbuf();
  nlohmann::json j = nlohmann::json::parse(text.str());
  // Where each placed line lives in the JSON: its source is a JSON pointer ("/bom/3",
  // "/plan/keep/0", "/feed/supply_bom/1"), except for lines of a BOM CSV, which first become
  // ordinary "bom" lines (library id, count, name) so the file needs no CSV.
  std::map<BranchId, std::string> pointer_of;
  const auto from_csv = [&](const PlacedPart& p) {
    return !project.bom_csv.empty() && p.source.rfind(project.bom_csv, 0) == 0;
  };
  for (const PlacedPart& p : project.parts)
    if (!p.source.empty() && p.source.front() == '/' && !from_csv(p)) pointer_of[p.branch] = p.source;
  if (!project.bom_csv.empty()) {
    if (!j.contains("bom")) j["bom"] = nlohmann::json::array();
    for (const PlacedPart& p : project.parts) {
      if (pointer_of.count(p.branch) != 0) continue;
      if (p.library_id.empty()) {
        why = "the line at " + p.source + " is not a library part";
        return std::nullopt;
      }
      pointer_of[p.branch] = "/bom/" + std::to_string(j["bom"].size());
      j["bom"].push_back({{"part", p.library_id}, {"count", p.count}, {"name", p.name}});
    }
    j.erase("bom_csv");
  }
  for (const PartDraw& d : draw.parts) {
    const auto where = pointer_of.find(d.branch);
    if (where == pointer_of.end()) {
      why = "a varied part has no line in the project file";
      return std::nullopt;
    }
    const NetworkBranch& branch = problem.network.branches()[static_cast<std::size_t>(d.branch)];
    const auto& base = std::get<Capacitor>(branch.part.element);
    nlohmann::json part = {{"kind", "capacitor"}, {"capacitance", d.capacitance}, {"esr", d.esr}, {"esl", d.esl}};
    if (std::isfinite(base.leakage_resistance)) part["leakage_resistance"] = base.leakage_resistance;
    if (base.dissipation_factor > 0.0) part["dissipation_factor"] = base.dissipation_factor;
    if (base.skin_corner > 0.0) part["skin_corner"] = base.skin_corner;
    nlohmann::json& line = j.at(nlohmann::json::json_pointer(where->second));
    line["part"] = part;
    line["mounting"] = branch.part.mounting_inductance;
    line["name"] = branch.name;
  }
  nlohmann::json libraries = nlohmann::json::array();
  for (const auto& library : project.libraries) libraries.push_back(fs::absolute(library).string());
  if (j.contains("libraries")) j["libraries"] = libraries;
  j.erase("plan");
  j["name"] = project.name + "_worst_trial_" + std::to_string(draw.trial);
  j["description"] = "Worst trial " + std::to_string(draw.trial) + " of a yield run of " + project.name + " (" +
                     fmt::format("{:.4g} V DC, {:.4g} C", draw.dc_voltage, draw.temperature_c) +
                     "): drawn capacitances, ESR and ESL as inline parts.";
  return j.dump(2) + "\n";
}

int run(const YieldArgs& args) {
  // Everything that can fail on bad input happens before anything is written.
  const fs::path input = args.project_file;
  const Project project = read_project_file(input);
  const YieldProblem problem = yield_problem(project);
  const YieldOptions options{.trials = args.trials, .seed = args.seed, .threads = args.threads};
  const YieldResult r = run_yield(problem, options);

  nlohmann::json summary = {
      {"project", project.name},
      {"trials", r.trials},
      {"passes", r.passes},
      {"yield", r.yield},
      {"interval", {{"confidence", r.confidence}, {"low", r.interval.low}, {"high", r.interval.high}}},
      {"seed", options.seed},
      {"evaluation", to_string(r.evaluation)},
      {"verdict_basis", "grid samples (docs/yield.md)"},
      {"nominal", check_json(r.nominal)},
      {"worst", {{"grid_ratio", r.trial_worst_ratio[r.worst_trial]}, {"draw", draw_json(problem, r.worst_draw)},
                 {"check", check_json(r.worst_check)}}},
      {"corners",
       {{"low", {{"grid_ratio", r.low_corner.grid_worst_ratio}, {"draw", draw_json(problem, r.low_corner.draw)},
                 {"check", check_json(r.low_corner.check)}}},
        {"high", {{"grid_ratio", r.high_corner.grid_worst_ratio}, {"draw", draw_json(problem, r.high_corner.draw)},
                  {"check", check_json(r.high_corner.check)}}}}},
      {"caution", kCaution}};

  const fs::path directory = args.out_dir.empty() ? fs::path("out") / input.stem() : fs::path(args.out_dir);
  const std::string stem = file_stem_for(project.name, input.stem().string());
  std::vector<fs::path> inputs{input};
  for (const auto& library : project.libraries) inputs.emplace_back(library);
  if (!project.bom_csv.empty()) inputs.emplace_back(project.bom_csv);
  const std::string json = summary.dump(2) + "\n";
  std::vector<OutputFile> outputs{{directory / (stem + "_yield.json"), json},
                                  {directory / (stem + "_yield_curves.csv"), curves_csv(r)}};
  std::string why;
  if (auto worst = worst_project_json(input, project, problem, r.worst_draw, why))
    outputs.emplace_back(directory / (stem + "_yield_worst.json"), std::move(*worst));
  const YieldRun report{.project = project, .problem = problem, .options = options, .result = r};
  const std::string svg = yield_svg(report);
  outputs.emplace_back(directory / (stem + "_yield.svg"), svg);
  outputs.emplace_back(directory / (stem + "_yield.html"), yield_html(report, svg));
  create_output_directory(directory);
  write_all_or_none(outputs, inputs);

  if (args.json) {
    fmt::print("{}", json);
  } else {
    fmt::print("Yield of {} ({} trials, seed {})\n", project.name, r.trials, options.seed);
    fmt::print("{}\n", r.brief());
    const auto refined = [](const std::optional<CheckResult>& c) {
      return c ? fmt::format(" (refined {:.3g}, {})", c->worst_ratio, to_string(c->status)) : std::string();
    };
    fmt::print("nominal: {}\n", r.nominal.brief());
    fmt::print("corner low: grid |Z|/Z_t {:.3g}{}\n", r.low_corner.grid_worst_ratio, refined(r.low_corner.check));
    fmt::print("corner high: grid |Z|/Z_t {:.3g}{}\n", r.high_corner.grid_worst_ratio, refined(r.high_corner.check));
    fmt::print("worst trial {}{}\n", r.worst_trial, refined(r.worst_check));
    for (const OutputFile& file : outputs) fmt::print("wrote {}\n", file.first.string());
    if (!why.empty()) fmt::print("worst trial not saved as a project: {}\n", why);
    fmt::print("{}\n", kCaution);
  }
  return kExitOk;
}

}  // namespace

void register_yield(CLI::App& app, Action& action) {
  auto args = std::make_shared<YieldArgs>();
  CLI::App* sub = app.add_subcommand(
      "yield",
      "Monte Carlo of a project's BOM over capacitance tolerance, ESR/ESL spread, DC-bias and temperature "
      "derating: the fraction of builds that meet the target; writes <out>/<name>_yield.json, "
      "_yield_curves.csv, _yield.svg, _yield.html and _yield_worst.json");
  sub->add_option("project", args->project_file, "project file (JSON; see docs/project_file.md)")->required();
  sub->add_option("--trials", args->trials,
                  "builds to simulate, 1 to " + std::to_string(kMaxYieldTrials) + " (default 2000)");
  sub->add_option("--seed", args->seed, "random seed; the same seed gives the same result (default 1)");
  sub->add_option("--threads", args->threads, "worker threads, 0 = all cores (default 0)");
  sub->add_option("--out", args->out_dir, "output directory (default: out/<project file stem>)");
  sub->add_flag("--json", args->json, "print the JSON summary on stdout instead of the text summary");
  sub->footer("Example: quietrail yield examples/projects/core_rail.json --trials 5000 --seed 7");
  sub->callback([&action, args] { action = [args] { return run(*args); }; });
}

}  // namespace quietrail::cli
