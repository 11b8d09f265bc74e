// SPDX-License-Identifier: MIT
// The log-spaced frequency axis every sweep runs on.
#pragma once

#include <cstddef>
#include <vector>

namespace quietrail {

/// Upper limit on points per decade. A lumped model shows nothing new beyond a few
/// hundred; the limit keeps a typo from allocating gigabytes (common practice).
inline constexpr int kMaxPointsPerDecade = 10000;
/// Upper limit on the points of one grid (16 MB per complex curve); guards against
/// a band of hundreds of decades by mistake (common practice).
inline constexpr double kMaxGridPoints = 1e6;

/// Options for a log-spaced grid. Both band edges are always grid points.
struct FrequencyGridOptions {
  /// Lowest frequency, Hz. > 0.
  double start = 1e3;
  /// Highest frequency, Hz. > start.
  double stop = 1e9;
  /// Points per decade, 1..kMaxPointsPerDecade. 50 resolves the peaks of typical mounted ceramics to a few
  /// percent before refinement (common practice).
  int points_per_decade = 50;

  /// Throws InputError naming the offending field ("start", "stop" or
  /// "points_per_decade", no file): start > 0 and finite, stop > start and finite, and
  /// at most kMaxGridPoints points in all.
  void validate() const;
};

/// Log-spaced frequencies from start to stop inclusive: f_k = start * 10^(k/ppd), with
/// the last point replaced by `stop` exactly and a final partial step kept only when it
/// is at least a quarter step (so no two points nearly coincide).
///
/// With s = ppd * log10(stop/start) steps (snapped to a whole number within 1e-6) and
/// n = floor(s), the grid has n + 1 points when s is whole or its fractional part is
/// below 1/4 (the last step is then up to 1.25 steps long), else n + 2 points. There
/// are always at least the two edges. Example: 1 kHz..1 GHz at 50/decade has 301 points.
class FrequencyGrid {
 public:
  /// Validates `options` (throws InputError) and builds the grid.
  explicit FrequencyGrid(const FrequencyGridOptions& options);
  /// A grid over explicit, strictly increasing, positive, finite frequencies (Hz).
  /// Throws InputError naming "frequencies[i]" for the first offending entry.
  explicit FrequencyGrid(std::vector<double> frequencies);

  const std::vector<double>& frequencies() const { return frequencies_; }
  std::size_t size() const { return frequencies_.size(); }
  double operator[](std::size_t i) const { return frequencies_[i]; }

 private:
  std::vector<double> frequencies_;
};

}  // namespace quietrail
