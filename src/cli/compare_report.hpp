// SPDX-License-Identifier: MIT
// What `quietrail compare` writes and prints, built from one finished comparison: the JSON
// diff, the curves CSV, the SVG plot, the HTML page and the terminal summary
// (compare_command.cpp).
#pragma once

#include <filesystem>
#include <string>
#include <vector>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/compare.hpp"
#include "quietrail/io/project_edits.hpp"
#include "quietrail/io/project_file.hpp"

namespace quietrail::cli {

/// Output files of one comparison.
struct CompareFiles {
  std::filesystem::path directory;
  std::filesystem::path json;
  std::filesystem::path csv;
  std::filesystem::path svg;
  std::filesystem::path html;
};

/// One side of a comparison: where it came from, the project and its check.
struct CompareSide {
  /// "base" or "edited" / "other", used as column titles.
  std::string label;
  std::filesystem::path input;
  Project project;
  CheckResult result;
};

/// A finished comparison.
struct CompareRun {
  CompareSide base;
  CompareSide other;
  /// The edits applied to the base (empty when the other side is a second project file).
  std::vector<ProjectEdit> edits;
  CompareResult diff;
  CompareFiles files;
};

/// The JSON report: both verdicts and the diff (docs/compare.md "Outputs").
std::string compare_json(const CompareRun& run);
/// Both curves on the base grid: frequency, base |Z| columns, base target, then the other
/// side's |Z| (re-evaluated exactly on the base grid when the grids differ) and target.
std::string compare_csv(const CompareRun& run);
/// Log-log plot: the other side's target mask, both curves, the other side's peaks.
std::string compare_svg(const CompareRun& run);
/// The single-file HTML report embedding `svg`.
std::string compare_html(const CompareRun& run, const std::string& svg);
/// The terminal summary; `colour` per the terminal rules (terminal.hpp).
std::string compare_text(const CompareRun& run, bool colour);

}  // namespace quietrail::cli
