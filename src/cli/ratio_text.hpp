// SPDX-License-Identifier: MIT
// How |Z|/Z_target ratios are written in every report: "0.897", "-0.9 dB", "inf", "-".
#pragma once

#include <cmath>
#include <string>

#include <fmt/core.h>

namespace quietrail::cli {

/// 20 log10(ratio), dB.
inline double db(double ratio) { return 20.0 * std::log10(ratio); }

/// Three significant digits; "inf" when not finite.
inline std::string ratio_text(double ratio) {
  if (!std::isfinite(ratio)) return "inf";
  return fmt::format("{:.3g}", ratio);
}

/// The ratio in dB with its sign, one decimal ("+5.3 dB"); "-" when it has none.
inline std::string db_text(double ratio) {
  if (!(ratio > 0.0) || !std::isfinite(ratio)) return "-";
  return fmt::format("{:+.1f} dB", db(ratio));
}

}  // namespace quietrail::cli
