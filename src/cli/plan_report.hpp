// SPDX-License-Identifier: MIT
// What `quietrail plan` writes and prints, built from one finished plan (plan_command.cpp):
// the planned project and its BOM CSV, the plan JSON, the cost-against-margin plot, the HTML
// page and the terminal summary. The planned design's own reports come from check_report.
#pragma once

#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "cli/check_report.hpp"
#include "quietrail/io/project_file.hpp"
#include "quietrail/plan/plan.hpp"

namespace quietrail::cli {

/// Output files of one plan (docs/reports.md, "plan").
struct PlanFiles {
  std::filesystem::path directory;
  std::filesystem::path planned_project;  ///< <name>_planned.json: the answer as a project file
  std::filesystem::path planned_bom;      ///< <name>_planned_bom.csv: the lines the plan added
  std::filesystem::path impedance_svg;    ///< <name>_impedance.svg: check_svg of the planned design
  std::filesystem::path curves_csv;       ///< <name>_curves.csv: check_csv of the planned design
  std::filesystem::path plan_json;        ///< <name>_plan.json
  std::filesystem::path front_svg;        ///< <name>_front.svg (not written for an infeasible plan)
  std::filesystem::path html;             ///< <name>_report.html
};

/// A finished plan and the check of its planned design.
struct PlanRun {
  std::filesystem::path input;
  /// The project as read.
  Project project;
  /// The problem and options run_plan was given (the command line's overrides applied).
  PlanProblem problem;
  PlanOptions options;
  PlanResult result;
  /// The text of <name>_planned.json.
  std::string planned_project;
  /// The planned project read back from that text (output directory as base) and checked,
  /// exactly as `quietrail check` would; its files point at the plan's outputs.
  CheckRun planned;
  PlanFiles files;
};

/// The planned project file: `input_text` (the project as given) with `bom` = its own lines
/// followed by {"part": library id, "count": n} for each candidate with counts[k] > 0, and
/// `libraries` and `bom_csv` rewritten so that they resolve from `directory` (relative
/// paths, absolute where no relative one exists). Everything else, the `plan` section
/// included, is kept. Candidates must come from a library (QUIETRAIL_ASSERT).
std::string planned_project_json(std::string_view input_text, const Project& project, const PlanProblem& problem,
                                 const std::vector<int>& counts, const std::filesystem::path& directory);

/// The lines the plan added as a BOM CSV the project's `bom_csv` reader accepts: Qty, Value,
/// Package, Dielectric, Voltage, Library ID (a header only when nothing was added).
std::string planned_bom_csv(const PlanRun& run);

/// The plan JSON: status, selection, totals, alternatives, front, infeasibility, stats,
/// candidates, notes, the caution and the planned design's check report under "check".
/// Holds no timing, so the same inputs and seed give the same bytes.
std::string plan_json(const PlanRun& run);

/// The cost-against-margin front: worst |Z|/Z_t of each front point against its objective,
/// log-log, with the target ratio 1 as a mask. Meant for plans that are not infeasible.
std::string front_svg(const PlanRun& run);

/// The single-file HTML report; `front` (empty for an infeasible plan) and `impedance`
/// are the SVGs to embed.
std::string plan_html(const PlanRun& run, const std::string& front, const std::string& impedance);

/// The terminal summary; `colour` per the terminal rules (terminal.hpp).
std::string plan_text(const PlanRun& run, bool colour);

}  // namespace quietrail::cli
