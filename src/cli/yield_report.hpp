// SPDX-License-Identifier: MIT
// What `quietrail yield` draws and writes for people: the percentile plot (SVG) and the
// self-contained HTML page, built from one finished run (yield_command.cpp, docs/yield.md).
#pragma once

#include <cstdint>
#include <string>

#include "quietrail/analysis/yield.hpp"
#include "quietrail/io/project_file.hpp"

namespace quietrail::cli {

/// A finished yield run: the project, the problem built from it, the options used and the
/// result. The references must outlive the renderers' calls.
struct YieldRun {
  const Project& project;
  const YieldProblem& problem;
  const YieldOptions& options;
  const YieldResult& result;
};

/// Legend name of a percentile curve: 0.05 -> "5th percentile", 0.5 -> "50th percentile",
/// 0.975 -> "97.5th percentile" (English ordinal suffixes; 11th-13th take "th").
std::string percentile_name(double fraction);

/// The log-log plot (id "yield-plot"): the target mask, the nominal |Z| (bold), one thin
/// curve per percentile, the worst trial's refined-check |Z| (thin) and a marker at its
/// worst point. The y axis spans every curve, widened to whole decades, so no curve is
/// clipped. Title: the project and the yield.
std::string yield_svg(const YieldRun& run);

/// The single-file HTML page embedding `svg`: the yield and its interval, the nominal
/// check's verdict banner, key values, the plot, the corners, the worst trial and its
/// drawn values, what varies, and the caution.
std::string yield_html(const YieldRun& run, const std::string& svg);

}  // namespace quietrail::cli
