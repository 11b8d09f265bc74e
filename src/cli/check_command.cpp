// SPDX-License-Identifier: MIT
// `quietrail check`: read a project (docs/project_file.md), check the rail's impedance
// against its target, write JSON, CSV, SVG and HTML reports and print a summary.
#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <memory>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>
#include <fmt/core.h>

#include "cli/check_report.hpp"
#include "cli/commands.hpp"
#include "cli/exit_code.hpp"
#include "cli/file_names.hpp"
#include "cli/output_files.hpp"
#include "cli/terminal.hpp"
#include "quietrail/analysis/check.hpp"
#include "quietrail/error.hpp"
#include "quietrail/io/project_file.hpp"

namespace quietrail::cli {
namespace {

namespace fs = std::filesystem;

struct CheckArgs {
  std::string project_file;
  std::string out_dir;
  bool json = false;
};

CheckFiles output_files(const fs::path& input, const Project& project, const std::string& out_dir) {
  CheckFiles files;
  files.directory = out_dir.empty() ? fs::path("out") / input.stem() : fs::path(out_dir);
  const std::string stem = file_stem_for(project.name, input.stem().string());
  files.json = files.directory / (stem + "_check.json");
  files.csv = files.directory / (stem + "_curves.csv");
  files.svg = files.directory / (stem + "_impedance.svg");
  files.html = files.directory / (stem + "_report.html");
  return files;
}

int run(const CheckArgs& args) {
  // Everything that can fail on bad input happens before anything is written.
  CheckRun run;
  run.input = args.project_file;
  run.project = read_project_file(run.input);
  const Project& project = run.project;
  // A project with only a plan section has nothing to check yet.
  if (std::none_of(project.roles.begin(), project.roles.end(), [](BranchRole role) { return role == BranchRole::bom; }))
    throw InputError({project.file, "/bom"},
                     "a BOM to check (this project has only a plan section; run `quietrail plan` first, then check "
                     "its planned project)",
                     "no BOM line");
  check_project(run);
  run.sensitivity = check_sensitivity(project, run.result);
  run.files = output_files(run.input, project, args.out_dir);

  std::vector<fs::path> inputs{run.input};
  for (const auto& library : project.libraries) inputs.emplace_back(library);
  if (!project.bom_csv.empty()) inputs.emplace_back(project.bom_csv);

  const std::string json = check_json(run);
  const std::string svg = check_svg(run);
  const std::vector<OutputFile> outputs{
      {run.files.json, json}, {run.files.csv, check_csv(run)}, {run.files.svg, svg},
      {run.files.html, check_html(run, svg)}};

  create_output_directory(run.files.directory);
  write_all_or_none(outputs, inputs);

  if (args.json) fmt::print("{}", json);
  else fmt::print("{}", check_text(run, colour_enabled(stdout)));
  return run.result.status == CheckStatus::pass ? kExitOk : kExitTargetNotMet;
}

}  // namespace

void register_check(CLI::App& app, Action& action) {
  auto args = std::make_shared<CheckArgs>();
  CLI::App* sub = app.add_subcommand(
      "check",
      "Check a rail's BOM against its target impedance: exit 0 when met, 1 when not, 2 on bad input; writes "
      "<out>/<name>_report.html, _check.json, _curves.csv and _impedance.svg");
  sub->add_option("project", args->project_file, "project file (JSON; see docs/project_file.md)")->required();
  sub->add_option("--out", args->out_dir, "output directory (default: out/<project file stem>)");
  sub->add_flag("--json", args->json, "print the JSON report on stdout instead of the summary");
  sub->footer("Example: quietrail check examples/projects/core_rail.json");
  sub->callback([&action, args] { action = [args] { return run(*args); }; });
}

}  // namespace quietrail::cli
