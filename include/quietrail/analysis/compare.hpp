// SPDX-License-Identifier: MIT
// The compare job: two finished checks (analysis/check.hpp) side by side: verdicts, worst
// ratios, impedance peaks matched between the two with their shifts, and part totals.
// No files here; the CLI (src/cli/compare_command.cpp) builds the two checks.
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/peaks.hpp"

namespace quietrail {

/// Options for compare_checks.
struct CompareOptions {
  /// Two |Z| peaks, one from each side, may be matched only when their frequencies are
  /// within this factor of each other (|log f_other - log f_base| <= log factor). > 1.
  /// Default 2 (our choice): the anti-resonances of a ladder of values one decade apart sit
  /// about a factor sqrt(10) = 3.16 apart (REFERENCES §3: f_ar scales as 1/sqrt(C_s)), so
  /// a factor of 2 keeps neighbouring peaks apart while following a peak that moved by up
  /// to an octave.
  double match_factor = 2.0;

  /// Throws InputError (file "compare options", field "match_factor") unless finite and > 1.
  void validate() const;
};

/// A |Z| peak present on both sides.
struct PeakMatch {
  /// Index into base.peaks and other.peaks.
  std::size_t base_index = 0;
  std::size_t other_index = 0;
  /// The two peaks.
  Peak base;
  Peak other;
  /// other.frequency / base.frequency (> 1: moved up).
  double frequency_ratio = 1.0;
  /// other.magnitude / base.magnitude (> 1: higher).
  double magnitude_ratio = 1.0;
  /// other.ratio - base.ratio: the change in |Z|/Z_target at the peak.
  double target_ratio_delta = 0.0;
};

/// Differences of the part totals (other minus base).
struct TotalsDelta {
  int capacitor_count = 0;
  double cost = 0.0;
  double area = 0.0;
  /// True when both sides' totals are complete (PartTotals::cost_complete, area_complete).
  bool cost_complete = true;
  bool area_complete = true;
};

/// Everything compare_checks found.
struct CompareResult {
  /// The two verdicts.
  CheckStatus base_status = CheckStatus::pass;
  CheckStatus other_status = CheckStatus::pass;
  /// Worst refined |Z|/Z_target of each side, and where (Hz).
  double base_worst_ratio = 0.0;
  double other_worst_ratio = 0.0;
  double base_worst_frequency = 0.0;
  double other_worst_frequency = 0.0;
  /// other_worst_ratio - base_worst_ratio, and the same in dB (other_db - base_db).
  double worst_ratio_delta = 0.0;
  double worst_ratio_db_delta = 0.0;
  /// Matched |Z| peaks, ordered by base frequency.
  std::vector<PeakMatch> matched;
  /// Indices of the peaks of one side that have no partner, ordered by frequency.
  std::vector<std::size_t> only_base;
  std::vector<std::size_t> only_other;
  /// The two sides' part totals and their difference.
  PartTotals base_totals;
  PartTotals other_totals;
  TotalsDelta totals_delta;
  /// The match factor used.
  double match_factor = 2.0;

  /// One line for logs, e.g. "fail -> pass: worst 1.13 -> 0.92; 3 peaks matched, 1 only
  /// in base, 0 only in other".
  std::string brief() const;
};

/// Compares two checks, `base` and `other`, which should share a band (not required).
///
/// Peak matching (of CheckResult::peaks, the refined |Z| maxima): every pair (i, j) whose
/// frequencies lie within options.match_factor of each other is a candidate, and a peak at
/// a band edge pairs only with one at a band edge. Candidates are taken greedily by
/// increasing |log(f_j / f_i)| (ties: lower base index, then lower other index), each peak
/// used at most once. The rest are "only in base" / "only in other".
/// Throws InputError from options.validate().
CompareResult compare_checks(const CheckResult& base, const CheckResult& other, const CompareOptions& options = {});

}  // namespace quietrail
