// SPDX-License-Identifier: MIT
// compare_checks (analysis/compare.hpp): verdicts, worst ratios, greedy nearest-log-frequency
// peak matching, totals. Works on finished CheckResults only; nothing is re-solved.
#include "quietrail/analysis/compare.hpp"

#include <algorithm>
#include <cmath>
#include <tuple>

#include <fmt/core.h>

#include "quietrail/error.hpp"

namespace quietrail {

void CompareOptions::validate() const {
  require_input(std::isfinite(match_factor) && match_factor > 1.0, {"compare options", "match_factor"},
                "a finite factor above 1", fmt::format("{}", match_factor));
}

std::string CompareResult::brief() const {
  return fmt::format("{} -> {}: worst {:.3g} -> {:.3g}; {} peaks matched, {} only in base, {} only in other",
                     to_string(base_status), to_string(other_status), base_worst_ratio, other_worst_ratio,
                     matched.size(), only_base.size(), only_other.size());
}

CompareResult compare_checks(const CheckResult& base, const CheckResult& other, const CompareOptions& options) {
  options.validate();
  CompareResult r;
  r.match_factor = options.match_factor;
  r.base_status = base.status;
  r.other_status = other.status;
  r.base_worst_ratio = base.worst_ratio;
  r.other_worst_ratio = other.worst_ratio;
  r.base_worst_frequency = base.worst_frequency;
  r.other_worst_frequency = other.worst_frequency;
  r.worst_ratio_delta = other.worst_ratio - base.worst_ratio;
  r.worst_ratio_db_delta = other.worst_ratio_db - base.worst_ratio_db;

  // Candidate pairs within the factor, nearest in log frequency first.
  const double limit = std::log(options.match_factor);
  std::vector<std::tuple<double, std::size_t, std::size_t>> pairs;
  for (std::size_t i = 0; i < base.peaks.size(); ++i)
    for (std::size_t j = 0; j < other.peaks.size(); ++j) {
      const Peak& a = base.peaks[i];
      const Peak& b = other.peaks[j];
      if (a.at_band_edge != b.at_band_edge || !(a.frequency > 0.0) || !(b.frequency > 0.0)) continue;
      const double distance = std::abs(std::log(b.frequency / a.frequency));
      if (distance <= limit) pairs.emplace_back(distance, i, j);
    }
  std::sort(pairs.begin(), pairs.end());
  std::vector<bool> base_used(base.peaks.size(), false);
  std::vector<bool> other_used(other.peaks.size(), false);
  for (const auto& [distance, i, j] : pairs) {
    if (base_used[i] || other_used[j]) continue;
    base_used[i] = other_used[j] = true;
    PeakMatch m;
    m.base_index = i;
    m.other_index = j;
    m.base = base.peaks[i];
    m.other = other.peaks[j];
    m.frequency_ratio = m.other.frequency / m.base.frequency;
    m.magnitude_ratio = m.other.magnitude / m.base.magnitude;
    m.target_ratio_delta = m.other.ratio - m.base.ratio;
    r.matched.push_back(m);
  }
  std::sort(r.matched.begin(), r.matched.end(),
            [](const PeakMatch& a, const PeakMatch& b) { return a.base.frequency < b.base.frequency; });
  // CheckResult::peaks are ordered by frequency, so index order is frequency order.
  for (std::size_t i = 0; i < base_used.size(); ++i)
    if (!base_used[i]) r.only_base.push_back(i);
  for (std::size_t j = 0; j < other_used.size(); ++j)
    if (!other_used[j]) r.only_other.push_back(j);

  r.base_totals = base.totals;
  r.other_totals = other.totals;
  r.totals_delta.capacitor_count = other.totals.capacitor_count - base.totals.capacitor_count;
  r.totals_delta.cost = other.totals.cost - base.totals.cost;
  r.totals_delta.area = other.totals.area - base.totals.area;
  r.totals_delta.cost_complete = base.totals.cost_complete && other.totals.cost_complete;
  r.totals_delta.area_complete = base.totals.area_complete && other.totals.area_complete;
  return r;
}

}  // namespace quietrail
