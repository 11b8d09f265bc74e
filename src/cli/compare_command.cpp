// SPDX-License-Identifier: MIT
// `quietrail compare`: a base project against a second project file or against the base
// with edits (io/project_edits.hpp); both are checked, compared (analysis/compare.hpp) and
// reported side by side (docs/compare.md).
#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <map>
#include <memory>
#include <string>
#include <tuple>
#include <vector>

#include <CLI/CLI.hpp>
#include <fmt/core.h>

#include "cli/commands.hpp"
#include "cli/compare_report.hpp"
#include "cli/exit_code.hpp"
#include "cli/file_names.hpp"
#include "cli/output_files.hpp"
#include "cli/terminal.hpp"
#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/compare.hpp"
#include "quietrail/error.hpp"
#include "quietrail/io/project_edits.hpp"
#include "quietrail/io/project_file.hpp"

namespace quietrail::cli {
namespace {

namespace fs = std::filesystem;

struct CompareArgs {
  std::string base_file;
  std::string other_file;
  std::vector<std::string> replace, count, add, remove, mounting;
  std::string edits_file;
  std::string out_dir;
  bool json = false;
  // Command-line edits in the order given (kind, text, option), filled after parsing from
  // CLI11's parse order and parsed in run(), where InputError maps to exit 2.
  std::vector<std::tuple<EditKind, std::string, std::string>> command_line_edits;
};

// A project with no BOM line has nothing to check (as `check` says).
void require_bom(const Project& project) {
  if (std::none_of(project.roles.begin(), project.roles.end(), [](BranchRole role) { return role == BranchRole::bom; }))
    throw InputError({project.file, "/bom"}, "a BOM to compare (at least one BOM line)", "no BOM line");
}

CompareSide checked(std::string label, const fs::path& input, Project project) {
  require_bom(project);
  CompareSide side{std::move(label), input, std::move(project), {}};
  side.result = run_check(side.project.network, side.project.port, *side.project.target,
                          side.project.check_options(), side.project.branch_info);
  return side;
}

int run(const CompareArgs& args) {
  // Everything that can fail on bad input happens before anything is written.
  std::vector<ProjectEdit> edits;
  if (!args.edits_file.empty()) edits = read_edits_file(args.edits_file);
  for (const auto& [kind, text, option] : args.command_line_edits) edits.push_back(parse_edit_option(kind, text, option));
  if (!args.other_file.empty() && !edits.empty())
    throw InputError({"command line", "OTHER"}, "either a second project file or edits, not both",
                     "a second project file and " + std::to_string(edits.size()) + " edits");
  if (args.other_file.empty() && edits.empty())
    throw InputError({"command line", "OTHER"},
                     "a second project file or at least one edit (--replace, --count, --add, --remove, --mounting, "
                     "--edits)",
                     "neither");

  const fs::path base_path = args.base_file;
  CompareRun run;
  run.edits = edits;
  run.base = checked("base", base_path, read_project_file(base_path));
  if (args.other_file.empty())
    run.other = checked("edited", base_path, read_edited_project(base_path, edits));
  else
    run.other = checked("other", args.other_file, read_project_file(args.other_file));
  run.diff = compare_checks(run.base.result, run.other.result);

  CompareFiles& files = run.files;
  files.directory = args.out_dir.empty() ? fs::path("out") / (base_path.stem().string() + "_compare") : fs::path(args.out_dir);
  const std::string stem = file_stem_for(run.base.project.name, base_path.stem().string());
  files.json = files.directory / (stem + "_compare.json");
  files.csv = files.directory / (stem + "_compare_curves.csv");
  files.svg = files.directory / (stem + "_compare.svg");
  files.html = files.directory / (stem + "_compare.html");

  std::vector<fs::path> inputs{base_path};
  if (!args.other_file.empty()) inputs.emplace_back(args.other_file);
  if (!args.edits_file.empty()) inputs.emplace_back(args.edits_file);
  for (const Project* p : {&run.base.project, &run.other.project}) {
    for (const auto& library : p->libraries) inputs.emplace_back(library);
    if (!p->bom_csv.empty()) inputs.emplace_back(p->bom_csv);
  }

  const std::string json = compare_json(run);
  const std::string svg = compare_svg(run);
  const std::vector<OutputFile> outputs{
      {files.json, json}, {files.csv, compare_csv(run)}, {files.svg, svg}, {files.html, compare_html(run, svg)}};
  create_output_directory(files.directory);
  write_all_or_none(outputs, inputs);

  if (args.json) fmt::print("{}", json);
  else fmt::print("{}", compare_text(run, colour_enabled(stdout)));
  return run.diff.other_status == CheckStatus::pass ? kExitOk : kExitTargetNotMet;
}

}  // namespace

void register_compare(CLI::App& app, Action& action) {
  auto args = std::make_shared<CompareArgs>();
  CLI::App* sub = app.add_subcommand(
      "compare",
      "Compare a rail with an edited copy or a second project: verdicts, worst ratios, peak shifts, cost and "
      "area; exit 0 when the second configuration meets its target, 1 when not, 2 on bad input; writes "
      "<out>/<name>_compare.html, .json, .svg and _compare_curves.csv");
  sub->add_option("base", args->base_file, "base project file (JSON; see docs/project_file.md)")->required();
  sub->add_option("other", args->other_file, "second project file (instead of edits)");
  std::map<const CLI::Option*, std::pair<EditKind, std::vector<std::string>*>> edit_options;
  const auto add_edit = [&](const char* name, EditKind kind, std::vector<std::string>& target, const char* help) {
    CLI::Option* option = sub->add_option(name, target, help)->allow_extra_args(false)->type_name("TEXT");
    edit_options[option] = {kind, &target};
  };
  add_edit("--replace", EditKind::replace, args->replace, "NAME=PART_ID: the line NAME gets library part PART_ID");
  add_edit("--count", EditKind::count, args->count, "NAME=N: the line NAME gets N copies (0 removes it)");
  add_edit("--add", EditKind::add, args->add, "PART_ID[:N]: a new BOM line of N copies (default 1)");
  add_edit("--remove", EditKind::remove, args->remove, "NAME: the line NAME is removed");
  add_edit("--mounting", EditKind::mounting, args->mounting, "NAME=VALUE: mounting inductance of each copy, e.g. 0.25n");
  sub->add_option("--edits", args->edits_file, "edits file (JSON list, see docs/compare.md), applied before the options");
  sub->add_option("--out", args->out_dir, "output directory (default: out/<base file stem>_compare)");
  sub->add_flag("--json", args->json, "print the JSON report on stdout instead of the summary");
  sub->footer(
      "NAME is a BOM line's branch name (as check's parts table shows it) or its library id when unique.\n"
      "Example: quietrail compare examples/projects/decade_rail.json --remove mlcc-0402-x7r-1u-16v");
  sub->callback([&action, args, sub, edit_options] {
    // Command-line edits apply in the order they were given, across options.
    std::map<const CLI::Option*, std::size_t> used;
    args->command_line_edits.clear();
    for (const CLI::Option* option : sub->parse_order()) {
      const auto it = edit_options.find(option);
      if (it == edit_options.end()) continue;
      const auto& [kind, values] = it->second;
      const std::size_t k = used[option]++;
      if (k < values->size())
        args->command_line_edits.emplace_back(kind, (*values)[k], option->get_name());
    }
    action = [args] { return run(*args); };
  });
}

}  // namespace quietrail::cli
