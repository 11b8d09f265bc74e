// SPDX-License-Identifier: MIT
// The log-spaced sweep axis (see frequency_grid.hpp for the rule at the top edge).
#include "quietrail/frequency_grid.hpp"

#include <cmath>
#include <string>

#include "detail/checks.hpp"
#include "quietrail/error.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

// A band that is a whole number of steps up to floating-point noise (log10 of a decimal
// band edge can land a hair off a whole number) must not grow a sliver step.
constexpr double kStepSnap = 1e-6;
// The header's rule: a final partial step shorter than this fraction of a step is merged
// into the step before it.
constexpr double kMinPartialStep = 0.25;

}  // namespace

void FrequencyGridOptions::validate() const {
  detail::require_positive(start, "", "start", "Hz");
  detail::require_positive(stop, "", "stop", "Hz");
  require_input(stop > start, {"", "stop"},
                "a stop frequency above the start frequency (" + format_value(start, "Hz") + ")",
                format_value(stop, "Hz"));
  require_input(points_per_decade >= 1 && points_per_decade <= kMaxPointsPerDecade,
                {"", "points_per_decade"},
                "a whole number of points per decade from 1 to " + std::to_string(kMaxPointsPerDecade),
                std::to_string(points_per_decade));
  // Difference of logs: stop/start itself may overflow (1e-300 .. 1e300).
  const double steps = (std::log10(stop) - std::log10(start)) * points_per_decade;
  require_input(steps <= kMaxGridPoints, {"", "points_per_decade"},
                "at most " + format_value(kMaxGridPoints, "") + " grid points in the band",
                format_value(steps, ""));
}

FrequencyGrid::FrequencyGrid(const FrequencyGridOptions& options) {
  options.validate();
  const double ppd = options.points_per_decade;
  const double steps = (std::log10(options.stop) - std::log10(options.start)) * ppd;
  auto whole = static_cast<long long>(std::floor(steps + kStepSnap));
  double partial = steps - static_cast<double>(whole);
  if (partial < kStepSnap) partial = 0.0;

  // Intervals on the grid: the whole steps, plus the partial one when it is long
  // enough; otherwise the partial step is absorbed by the last whole step.
  long long intervals = partial >= kMinPartialStep ? whole + 1 : whole;
  if (intervals < 1) intervals = 1;

  frequencies_.reserve(static_cast<std::size_t>(intervals) + 1);
  for (long long k = 0; k < intervals; ++k)
    frequencies_.push_back(options.start * std::pow(10.0, static_cast<double>(k) / ppd));
  frequencies_.push_back(options.stop);
  frequencies_.front() = options.start;
}

FrequencyGrid::FrequencyGrid(std::vector<double> frequencies) : frequencies_(std::move(frequencies)) {
  require_input(!frequencies_.empty(), {"", "frequencies"}, "at least one frequency", "none");
  for (std::size_t i = 0; i < frequencies_.size(); ++i) {
    const std::string field = "frequencies[" + std::to_string(i) + "]";
    detail::require_positive(frequencies_[i], "", field, "Hz");
    if (i > 0) {
      require_input(frequencies_[i] > frequencies_[i - 1], {"", field},
                    "frequencies in strictly increasing order (previous " +
                        format_value(frequencies_[i - 1], "Hz", 10) + ")",
                    format_value(frequencies_[i], "Hz", 10));
    }
  }
}

}  // namespace quietrail
