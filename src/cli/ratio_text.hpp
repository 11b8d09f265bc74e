// SPDX-License-Identifier: MIT
// How |Z|/Z_target ratios are written in every report: "0.897", "-0.9 dB", "inf", "-".
#pragma once

#include <cmath>
#include <string>

#include <fmt/core.h>

namespace quietrail::cli {

/// 20 log10(ratio), dB.
inline double db(double ratio) { return 20.0 * std::log10(ratio); }

/// Three significant digits, four near 1 (so 0.9999 does not read as a pass at exactly
/// 1); "inf" when not finite.
inline std::string ratio_text(double ratio) {
  if (!std::isfinite(ratio)) return "inf";
  return std::abs(ratio - 1.0) < 0.005 ? fmt::format("{:.4g}", ratio) : fmt::format("{:.3g}", ratio);
}

/// The ratio in dB with its sign, one decimal ("+5.3 dB"); "-" when it has none.
inline std::string db_text(double ratio) {
  if (!(ratio > 0.0) || !std::isfinite(ratio)) return "-";
  const double value = db(ratio);
  return std::abs(value) < 0.1 ? fmt::format("{:+.2f} dB", value) : fmt::format("{:+.1f} dB", value);
}

}  // namespace quietrail::cli
