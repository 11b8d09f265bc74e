// SPDX-License-Identifier: MIT
// The log-spaced frequency axis every sweep runs on.
#pragma once

#include <cstddef>
#include <vector>

namespace quietrail {

/// Options for a log-spaced grid. Both band edges are always grid points.
struct FrequencyGridOptions {
  /// Lowest frequency, Hz. > 0.
  double start = 1e3;
  /// Highest frequency, Hz. > start.
  double stop = 1e9;
  /// Points per decade. >= 1. 50 resolves the peaks of typical mounted ceramics to a few
  /// percent before refinement (common practice).
  int points_per_decade = 50;

  /// Throws InputError naming the offending field.
  void validate() const;
};

/// Log-spaced frequencies from start to stop inclusive: f_k = start * 10^(k/ppd), with
/// the last point replaced by `stop` exactly and a final partial step kept only when it
/// is at least a quarter step (so no two points nearly coincide).
class FrequencyGrid {
 public:
  explicit FrequencyGrid(const FrequencyGridOptions& options);
  /// A grid over explicit, strictly increasing, positive frequencies (Hz).
  explicit FrequencyGrid(std::vector<double> frequencies);

  const std::vector<double>& frequencies() const { return frequencies_; }
  std::size_t size() const { return frequencies_.size(); }
  double operator[](std::size_t i) const { return frequencies_[i]; }

 private:
  std::vector<double> frequencies_;
};

}  // namespace quietrail
