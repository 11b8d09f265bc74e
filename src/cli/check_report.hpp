// SPDX-License-Identifier: MIT
// What `quietrail check` writes and prints, built from one finished run: the JSON report,
// the curves CSV, the SVG plot, the HTML page and the terminal summary (check_command.cpp).
#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/sensitivity.hpp"
#include "quietrail/io/project_file.hpp"
#include "quietrail/types.hpp"

namespace quietrail::cli {

/// Output files of one check.
struct CheckFiles {
  std::filesystem::path directory;
  std::filesystem::path json;
  std::filesystem::path csv;
  std::filesystem::path svg;
  std::filesystem::path html;
};

/// A finished check: the project, the result and the other view's curve when the project
/// has a load side (the board curve for a die view, the die curve for a board view).
struct CheckRun {
  std::filesystem::path input;
  Project project;
  CheckResult result;
  /// |Z| seen from the node of the other view, ohm, on the result's grid; empty without one.
  ComplexVector other_view;
  std::string other_view_name;
  /// What lowers the worst peak most (rank_changes over the BOM lines); empty changes when
  /// not computed.
  Sensitivity sensitivity;
  CheckFiles files;
};

/// Checks `run.project` as `quietrail check` does: run_check at the view's port, and with a
/// load side the other view's |Z| on the same grid. Fills result, other_view and its name.
void check_project(CheckRun& run);

/// rank_changes for a finished check of `run.project`: the BOM-role branches may change.
Sensitivity check_sensitivity(const Project& project, const CheckResult& result);

/// The JSON report (every number; see docs/project_file.md "Outputs").
std::string check_json(const CheckRun& run);
/// The curves as CSV: port |Z|, phase, Re, Im, target_ohm, ratio, then each branch.
std::string check_csv(const CheckRun& run);
/// The log-log plot: target mask, total curve, other view, per-branch curves, refined peaks.
std::string check_svg(const CheckRun& run);
/// The single-file HTML report embedding `svg`.
std::string check_html(const CheckRun& run, const std::string& svg);
/// The terminal summary; `colour` per the terminal rules (terminal.hpp).
std::string check_text(const CheckRun& run, bool colour);

}  // namespace quietrail::cli
