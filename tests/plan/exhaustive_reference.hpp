// SPDX-License-Identifier: MIT
// The referee of the plan tests: every count vector of a small rail, each judged on the
// continuous band (dense log grid plus golden-section refinement of every local maximum).
// Written from circuit theory alone; it includes nothing from quietrail, so it shares no
// code (solver, models, grid, target, peak search) with what it judges.
#pragma once

#include <algorithm>
#include <cmath>
#include <complex>
#include <cstddef>
#include <limits>
#include <numbers>
#include <optional>
#include <utility>
#include <vector>

namespace quietrail::test::reference {

using Cplx = std::complex<double>;

/// A series R-L-C branch: Z = R + j*w*L + 1/(j*w*C) (any circuits text). capacitance == 0
/// means no capacitor: an R-L branch such as a regulator's output.
struct SeriesRlc {
  double resistance = 0.0;   ///< ohm
  double inductance = 0.0;   ///< H (ESL plus mounting for a mounted part)
  double capacitance = 0.0;  ///< F; 0 = none

  Cplx impedance(double f) const {
    const double w = 2.0 * std::numbers::pi * f;
    double x = w * inductance;
    if (capacitance > 0.0) x -= 1.0 / (w * capacitance);
    return {resistance, x};
  }
};

/// One candidate: its branch per copy, the objective weight of a copy, the most copies.
struct Candidate {
  SeriesRlc branch;
  double weight = 1.0;
  int max_count = 0;
};

/// One log-log segment of the target: log Z runs linearly in log f from z_start at `start`
/// to z_stop at `stop`.
struct Segment {
  double start = 0.0, stop = 0.0;
  double z_start = 0.0, z_stop = 0.0;
};

/// Flat (`flat` > 0) or contiguous segments, held flat beyond the ends; at a shared edge the
/// lower value applies.
struct Target {
  double flat = 0.0;
  std::vector<Segment> segments;

  double at(double f) const {
    if (segments.empty()) return flat;
    if (f <= segments.front().start) return segments.front().z_start;
    if (f >= segments.back().stop) return segments.back().z_stop;
    double best = std::numeric_limits<double>::infinity();
    for (const Segment& s : segments) {
      if (f < s.start || f > s.stop) continue;
      const double t = std::log(f / s.start) / std::log(s.stop / s.start);
      best = std::min(best, std::exp(std::log(s.z_start) + t * std::log(s.z_stop / s.z_start)));
    }
    return best;
  }
};

/// The rail: fixed branches and candidates, all between the board node and ground, seen
/// from the board node.
struct Rail {
  std::vector<SeriesRlc> fixed;
  std::vector<Candidate> candidates;
  Target target;
  double start = 0.0, stop = 0.0;  ///< band, Hz
  std::optional<int> max_total{};  ///< most copies in all
  double target_scale = 1.0;       ///< the limit is target * target_scale

  /// |Z|/(Z_t * scale) at f for `counts`: Z = 1 / (sum of fixed admittances + sum n_k Y_k).
  double ratio(const std::vector<int>& counts, double f) const {
    Cplx y = 0.0;
    for (const SeriesRlc& b : fixed) y += 1.0 / b.impedance(f);
    for (std::size_t k = 0; k < candidates.size(); ++k)
      if (counts[k] > 0) y += static_cast<double>(counts[k]) / candidates[k].branch.impedance(f);
    return 1.0 / (std::abs(y) * target.at(f) * target_scale);
  }

  double objective(const std::vector<int>& counts) const {
    double sum = 0.0;
    for (std::size_t k = 0; k < candidates.size(); ++k) sum += counts[k] * candidates[k].weight;
    return sum;
  }
};

/// Decides the worst ratio of a count vector, either on the continuous band or on a given
/// set of frequencies only (what a search that trusts its grid would see).
class Judge {
 public:
  /// The continuous band: `points_per_decade` log-spaced points from start to stop (both
  /// included), then golden-section refinement in log f of every local maximum of the ratio
  /// over its two neighbouring intervals. 400 points per decade put about 7 points inside
  /// the half-power width of a peak with Q = 50, so no maximum hides between points.
  static Judge continuous(const Rail& rail, int points_per_decade = 400) {
    const double decades = std::log10(rail.stop / rail.start);
    const auto steps = static_cast<std::size_t>(std::ceil(decades * points_per_decade - 1e-9));
    std::vector<double> f(steps + 1);
    for (std::size_t j = 0; j <= steps; ++j)
      f[j] = std::exp(std::log(rail.start) + (std::log(rail.stop) - std::log(rail.start)) * j / steps);
    f.back() = rail.stop;
    return Judge(rail, std::move(f), true);
  }
  /// These frequencies only, no refinement.
  static Judge discrete(const Rail& rail, std::vector<double> frequencies) {
    return Judge(rail, std::move(frequencies), false);
  }
  /// start * 10^(k / ppd), k = 0.., ending exactly at stop (for bands that are a whole number
  /// of steps): the log grid a coarse search would use.
  static std::vector<double> log_grid(double start, double stop, int points_per_decade) {
    const auto steps = static_cast<int>(std::lround(std::log10(stop / start) * points_per_decade));
    std::vector<double> f;
    for (int k = 0; k <= steps; ++k) f.push_back(start * std::pow(10.0, static_cast<double>(k) / points_per_decade));
    f.back() = stop;
    return f;
  }

  /// The worst ratio of `counts`. When `stop_above` is given, returns as soon as some
  /// sampled ratio exceeds it (that value, a lower bound of the worst).
  double worst(const std::vector<int>& counts, std::optional<double> stop_above = std::nullopt) const {
    return evaluate(counts, stop_above).first;
  }
  /// The worst ratio of `counts` and where it is, Hz.
  std::pair<double, double> worst_at(const std::vector<int>& counts) const { return evaluate(counts, std::nullopt); }

  const std::vector<double>& frequencies() const { return frequencies_; }

 private:
  Judge(const Rail& rail, std::vector<double> frequencies, bool refine)
      : rail_(rail), frequencies_(std::move(frequencies)), refine_(refine) {
    // Admittances at the sampled frequencies, kept so that a vector costs one sum per point.
    const std::size_t n = frequencies_.size();
    fixed_.assign(n, 0.0);
    unit_.assign(rail_.candidates.size() * n, 0.0);
    limit_.assign(n, 0.0);
    for (std::size_t j = 0; j < n; ++j) {
      const double f = frequencies_[j];
      for (const SeriesRlc& b : rail_.fixed) fixed_[j] += 1.0 / b.impedance(f);
      for (std::size_t k = 0; k < rail_.candidates.size(); ++k)
        unit_[k * n + j] = 1.0 / rail_.candidates[k].branch.impedance(f);
      limit_[j] = rail_.target.at(f) * rail_.target_scale;
    }
  }

  std::pair<double, double> evaluate(const std::vector<int>& counts, std::optional<double> stop_above) const {
    const std::size_t n = frequencies_.size();
    if (stop_above && last_violation_ < n) {
      const double r = sample(counts, last_violation_);
      if (r > *stop_above) return {r, frequencies_[last_violation_]};
    }
    std::vector<double> r(n);
    std::pair<double, double> worst{0.0, 0.0};
    for (std::size_t j = 0; j < n; ++j) {
      r[j] = sample(counts, j);
      if (r[j] > worst.first) worst = {r[j], frequencies_[j]};
      if (stop_above && r[j] > *stop_above) {
        last_violation_ = j;
        return worst;
      }
    }
    if (!refine_) return worst;
    for (std::size_t j = 0; j < n; ++j) {
      const bool left_ok = j == 0 || r[j] >= r[j - 1];
      const bool right_ok = j + 1 == n || r[j] >= r[j + 1];
      if (!left_ok || !right_ok || n < 2) continue;
      const double lo = std::log(frequencies_[j == 0 ? 0 : j - 1]);
      const double hi = std::log(frequencies_[j + 1 == n ? n - 1 : j + 1]);
      const auto refined = golden_max(counts, lo, hi);
      if (refined.first > worst.first) worst = refined;
    }
    return worst;
  }

  double sample(const std::vector<int>& counts, std::size_t j) const {
    const std::size_t n = frequencies_.size();
    Cplx y = fixed_[j];
    for (std::size_t k = 0; k < rail_.candidates.size(); ++k)
      if (counts[k] > 0) y += static_cast<double>(counts[k]) * unit_[k * n + j];
    return 1.0 / (std::abs(y) * limit_[j]);
  }

  // Golden-section search for the maximum of the ratio over log f in [lo, hi] (Kiefer
  // 1953; any numerical methods text), to 1e-12 in log f. Returns the largest value seen
  // and its frequency.
  std::pair<double, double> golden_max(const std::vector<int>& counts, double lo, double hi) const {
    const double g = (std::sqrt(5.0) - 1.0) / 2.0;
    std::pair<double, double> best{0.0, 0.0};
    auto value = [&](double x) {
      const double v = rail_.ratio(counts, std::exp(x));
      if (v > best.first) best = {v, std::exp(x)};
      return v;
    };
    value(lo);
    value(hi);
    double a = lo, b = hi;
    double c = b - g * (b - a), d = a + g * (b - a);
    double fc = value(c), fd = value(d);
    for (int it = 0; it < 200 && b - a > 1e-12; ++it) {
      if (fc >= fd) {
        b = d, d = c, fd = fc;
        c = b - g * (b - a);
        fc = value(c);
      } else {
        a = c, c = d, fc = fd;
        d = a + g * (b - a);
        fd = value(d);
      }
    }
    return best;
  }

  Rail rail_;
  std::vector<double> frequencies_;
  bool refine_ = true;
  std::vector<Cplx> fixed_;
  std::vector<Cplx> unit_;  // unit_[k * n + j]
  std::vector<double> limit_;
  mutable std::size_t last_violation_ = std::numeric_limits<std::size_t>::max();
};

/// Every count vector within the limits (counts 0..max_count each, max_total), in odometer
/// order (candidate 0 fastest).
inline std::vector<std::vector<int>> all_vectors(const Rail& rail) {
  std::vector<std::vector<int>> out;
  std::vector<int> counts(rail.candidates.size(), 0);
  for (;;) {
    int total = 0;
    for (const int c : counts) total += c;
    if (!rail.max_total || total <= *rail.max_total) out.push_back(counts);
    std::size_t k = 0;
    while (k < counts.size() && counts[k] == rail.candidates[k].max_count) counts[k++] = 0;
    if (k == counts.size()) break;
    ++counts[k];
  }
  return out;
}

/// What the enumeration found.
struct Outcome {
  /// Vectors within the limits (all judged).
  std::size_t vectors = 0;
  /// Least objective with worst ratio <= 1 (+inf when none), one vector that has it (the
  /// first in odometer order), and how many feasible vectors share it.
  double optimum = std::numeric_limits<double>::infinity();
  std::vector<int> counts;
  std::size_t ties = 0;
  /// The objective of every feasible vector, ascending, one entry per vector.
  std::vector<double> feasible_objectives;
  /// Least |worst - 1| over all vectors (for a vector rejected early, the distance of the
  /// sample that rejected it, which is no larger). A verdict is robust to the rounding and
  /// refinement tolerances of the code under test only when this is clear of 0.
  double closest_to_one = std::numeric_limits<double>::infinity();

  bool feasible() const { return !feasible_objectives.empty(); }
};

/// Exhaustive search: judges every vector within the limits. A vector is feasible when its
/// worst ratio <= 1. A sample clearly above 1 rejects a vector at once (its worst can only
/// be larger); otherwise the whole band is judged, refinement included.
inline Outcome solve(const Rail& rail, const Judge& judge) {
  constexpr double kClearlyAbove = 1.0 + 1e-6;
  Outcome out;
  for (const auto& v : all_vectors(rail)) {
    ++out.vectors;
    const double w = judge.worst(v, kClearlyAbove);
    out.closest_to_one = std::min(out.closest_to_one, std::abs(w - 1.0));
    if (w > 1.0) continue;
    const double obj = rail.objective(v);
    out.feasible_objectives.push_back(obj);
    if (obj < out.optimum) out.optimum = obj, out.counts = v, out.ties = 0;
    if (obj == out.optimum) ++out.ties;
  }
  std::sort(out.feasible_objectives.begin(), out.feasible_objectives.end());
  return out;
}

/// The least worst ratio over every vector within the limits (each judged in full), and
/// one vector that has it.
struct RatioFloor {
  double ratio = std::numeric_limits<double>::infinity();
  std::vector<int> counts;
};

inline RatioFloor least_worst_ratio(const Rail& rail, const Judge& judge) {
  RatioFloor out;
  for (const auto& v : all_vectors(rail)) {
    const double w = judge.worst(v);
    if (w < out.ratio) out.ratio = w, out.counts = v;
  }
  return out;
}

}  // namespace quietrail::test::reference
