// SPDX-License-Identifier: MIT
// Peak candidates from the samples, Brent refinement in log f, half-power Q, and the
// bands above the target (see peaks.hpp for the guarantee).
#include "quietrail/analysis/peaks.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "detail/checks.hpp"
#include "quietrail/error.hpp"
#include "quietrail/frequency_grid.hpp"

namespace quietrail {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
// Refined maxima closer than this (relative) are the same maximum found from two brackets.
constexpr double kMergeDistance = 1e-6;
// First outward step of the half-power search, in ln f: below the half-bandwidth 1/(2Q) of
// any Q up to 5e4, and doubled until a half-power point is passed.
constexpr double kFirstQStep = 1e-5;
// A sample beyond the peak that is higher than this fraction above it means another
// maximum is nearer than the half-power point.
constexpr double kRiseAbovePeak = 1e-9;
// Samples this close (relative) are equal for finding discrete maxima: well above the
// rounding of a sweep (~1e-15), well below any feature worth a peak.
constexpr double kSampleNoise = 1e-12;

// |Z| with a non-finite or NaN value read as an open circuit: the conservative reading.
double magnitude(Complex z) {
  const double m = std::abs(z);
  return std::isnan(m) ? kInf : m;
}

// The exact evaluator with a call count.
class Evaluator {
 public:
  Evaluator(const ImpedanceFunction& f, const TargetImpedance& target) : f_(f), target_(target) {}
  double impedance(double frequency) {
    ++calls_;
    return magnitude(f_(frequency));
  }
  double ratio(double frequency) { return impedance(frequency) / target_.at(frequency); }
  double target(double frequency) const { return target_.at(frequency); }
  std::size_t calls() const { return calls_; }

 private:
  const ImpedanceFunction& f_;
  const TargetImpedance& target_;
  std::size_t calls_ = 0;
};

struct Maximum {
  double frequency = 0.0;
  double value = 0.0;
};

// Brent's minimiser (Brent 1973, ch. 5: golden section with parabolic interpolation), run
// on -g(e^x) over [a, b] in x = ln f; never evaluates the ends. Returns the best point seen.
template <class G>
Maximum brent_maximum(G&& g, double a, double b, double tol, int max_iterations) {
  const double golden = 0.5 * (3.0 - std::sqrt(5.0));
  const double eps = 2.0 * std::numeric_limits<double>::epsilon();
  auto h = [&](double x) { return -g(std::exp(x)); };
  double x = a + golden * (b - a);
  double w = x;
  double v = x;
  double fx = h(x);
  double fw = fx;
  double fv = fx;
  double d = 0.0;
  double e = 0.0;
  for (int it = 0; it < max_iterations; ++it) {
    const double m = 0.5 * (a + b);
    const double t = eps * std::abs(x) + tol;
    const double t2 = 2.0 * t;
    if (std::abs(x - m) <= t2 - 0.5 * (b - a)) break;
    bool parabolic = false;
    if (std::abs(e) > t && std::isfinite(fx) && std::isfinite(fw) && std::isfinite(fv)) {
      double r = (x - w) * (fx - fv);
      double q = (x - v) * (fx - fw);
      double p = (x - v) * q - (x - w) * r;
      q = 2.0 * (q - r);
      if (q > 0.0) p = -p;
      q = std::abs(q);
      r = e;
      e = d;
      if (std::abs(p) < std::abs(0.5 * q * r) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const double u = x + d;
        if (u - a < t2 || b - u < t2) d = x < m ? t : -t;
        parabolic = true;
      }
    }
    if (!parabolic) {
      e = x < m ? b - x : a - x;
      d = golden * e;
    }
    const double u = x + (std::abs(d) >= t ? d : (d > 0.0 ? t : -t));
    const double fu = h(u);
    if (fu <= fx) {
      if (u < x) b = x; else a = x;
      v = w; fv = fw;
      w = x; fw = fx;
      x = u; fx = fu;
    } else {
      if (u < x) a = u; else b = u;
      if (fu <= fw || w == x) {
        v = w; fv = fw;
        w = u; fw = fu;
      } else if (fu <= fv || v == x || v == w) {
        v = u; fv = fu;
      }
    }
  }
  return {std::exp(x), -fx};
}

// Bisection in ln f for the point where g crosses `level` between `inside` (g > level) and
// `outside` (g <= level). Returns the last point found above the level, so an edge always
// belongs to its band.
template <class G>
double bisect_crossing(G&& g, double inside, double outside, double level, double tol, int max_iterations) {
  double xi = std::log(inside);
  double xo = std::log(outside);
  for (int it = 0; it < max_iterations && std::abs(xi - xo) > tol; ++it) {
    const double xm = 0.5 * (xi + xo);
    if (g(std::exp(xm)) > level) xi = xm; else xo = xm;
  }
  return std::exp(xi);
}

// The maxima of g inside [lo, hi] (Hz): one Brent search, or one per local maximum of a
// denser sampling when densification is on. A result that sits on a bracket end which is
// not a band edge and is not a local maximum there (the curve keeps rising out of the
// bracket) is dropped: another candidate covers that maximum.
template <class G>
std::vector<Maximum> search_bracket(G&& g, double lo, double hi, double band_lo, double band_hi,
                                    const PeakOptions& options) {
  const double tol = options.frequency_tolerance / 4.0;
  std::vector<std::pair<double, double>> brackets;
  if (options.min_points_per_decade_near_peaks > 0) {
    const double decades = std::log10(hi / lo);
    const int n = std::max(3, static_cast<int>(std::ceil(decades * options.min_points_per_decade_near_peaks)) + 1);
    std::vector<double> f(static_cast<std::size_t>(n));
    std::vector<double> v(f.size());
    for (int i = 0; i < n; ++i) {
      f[static_cast<std::size_t>(i)] = lo * std::pow(hi / lo, static_cast<double>(i) / (n - 1));
      v[static_cast<std::size_t>(i)] = g(f[static_cast<std::size_t>(i)]);
    }
    for (std::size_t i = 0; i < f.size(); ++i) {
      const double left = i == 0 ? -kInf : v[i - 1];
      const double right = i + 1 == f.size() ? -kInf : v[i + 1];
      if (v[i] >= left && v[i] >= right && (v[i] > left || v[i] > right))
        brackets.emplace_back(f[i == 0 ? 0 : i - 1], f[std::min(i + 1, f.size() - 1)]);
    }
  } else {
    brackets.emplace_back(lo, hi);
  }
  std::vector<Maximum> out;
  for (const auto& [a, b] : brackets) {
    Maximum best = brent_maximum(g, std::log(a), std::log(b), tol, options.max_iterations);
    // The ends are never evaluated by Brent; a maximum on a band edge lives there.
    for (double end : {a, b}) {
      if (end != band_lo && end != band_hi) continue;
      const double ve = g(end);
      if (ve >= best.value) best = {end, ve};
    }
    const bool near_end = std::abs(std::log(best.frequency / a)) <= 4.0 * tol ||
                          std::abs(std::log(best.frequency / b)) <= 4.0 * tol;
    const bool on_band_edge = best.frequency == band_lo || best.frequency == band_hi;
    if (near_end && !on_band_edge) {
      const double step = std::max(1e3 * options.frequency_tolerance, 1e-7);
      if (g(best.frequency * (1.0 + step)) > best.value || g(best.frequency * (1.0 - step)) > best.value)
        continue;
    }
    out.push_back(best);
  }
  return out;
}

// Discrete local maxima of `v`, as (first index, last index) of each run. Samples within
// kSampleNoise (relative) of each other count as equal, so a flat curve's rounding noise
// makes no maxima; a plateau counts once; an end sample counts when above its one
// neighbour; a curve that is one plateau from edge to edge has no maximum.
std::vector<std::pair<std::size_t, std::size_t>> discrete_maxima(const std::vector<double>& v) {
  auto same = [](double a, double b) {
    return a == b || std::abs(a - b) <= kSampleNoise * std::max(std::abs(a), std::abs(b));
  };
  std::vector<std::pair<std::size_t, std::size_t>> out;
  const std::size_t n = v.size();
  std::size_t i = 0;
  while (i < n) {
    std::size_t j = i;
    while (j + 1 < n && same(v[j + 1], v[i])) ++j;
    const bool has_left = i > 0;
    const bool has_right = j + 1 < n;
    const bool above_left = !has_left || v[i] > v[i - 1];
    const bool above_right = !has_right || v[j] > v[j + 1];
    if ((has_left || has_right) && above_left && above_right) out.emplace_back(i, j);
    i = j + 1;
  }
  return out;
}

struct Bracket {
  std::size_t lo = 0;
  std::size_t hi = 0;
  std::size_t start = 0;  // the sample the search starts from
  bool sample_is_maximum = true;  // a discrete local maximum (not a reactance sign change)
};

// Half-power Q of the |Z| maximum at f_p (see Peak::q).
double half_power_q(Evaluator& eval, double fp, double peak, const PeakOptions& options) {
  const double level = peak / std::sqrt(2.0);
  const double reach = std::log(options.q_search_ratio);
  double edges[2] = {0.0, 0.0};
  for (int side = 0; side < 2; ++side) {
    const double dir = side == 0 ? -1.0 : 1.0;
    double inside = fp;
    double step = kFirstQStep;
    bool found = false;
    while (step <= 2.0 * reach) {
      const double s = std::min(step, reach);
      const double f = fp * std::exp(dir * s);
      const double v = eval.impedance(f);
      if (v > peak * (1.0 + kRiseAbovePeak)) return std::numeric_limits<double>::quiet_NaN();
      if (v <= level) {
        edges[side] = bisect_crossing([&](double x) { return eval.impedance(x); }, inside, f, level,
                                      options.frequency_tolerance, options.max_iterations);
        found = true;
        break;
      }
      inside = f;
      if (s >= reach) break;
      step *= 2.0;
    }
    if (!found) return std::numeric_limits<double>::quiet_NaN();
  }
  return fp / (edges[1] - edges[0]);
}

// Sorts by frequency and merges maxima found twice, keeping the higher value.
std::vector<Peak> merge(std::vector<Peak> peaks, bool by_ratio) {
  std::sort(peaks.begin(), peaks.end(), [](const Peak& a, const Peak& b) { return a.frequency < b.frequency; });
  std::vector<Peak> out;
  for (const Peak& p : peaks) {
    if (!out.empty() && p.frequency - out.back().frequency <= kMergeDistance * p.frequency) {
      const bool higher = by_ratio ? p.ratio > out.back().ratio : p.magnitude > out.back().magnitude;
      if (higher) out.back() = p;
      continue;
    }
    out.push_back(p);
  }
  return out;
}

}  // namespace

void PeakOptions::validate(const std::string& file, const std::string& field) const {
  const std::string at = field.empty() ? "" : field + "/";
  require_input(std::isfinite(frequency_tolerance) && frequency_tolerance > 0.0 && frequency_tolerance <= 1e-2,
                {file, at + "frequency_tolerance"}, "a relative tolerance in (0, 0.01]",
                detail::describe_number(frequency_tolerance, ""));
  require_input(max_iterations >= 10, {file, at + "max_iterations"}, "at least 10 iterations",
                std::to_string(max_iterations));
  require_input(min_points_per_decade_near_peaks >= 0 && min_points_per_decade_near_peaks <= kMaxPointsPerDecade,
                {file, at + "min_points_per_decade_near_peaks"},
                "0 (off) or a whole number of points per decade up to " + std::to_string(kMaxPointsPerDecade),
                std::to_string(min_points_per_decade_near_peaks));
  require_input(std::isfinite(q_search_ratio) && q_search_ratio > 1.0, {file, at + "q_search_ratio"},
                "a frequency ratio > 1", detail::describe_number(q_search_ratio, ""));
}

PeakSearch find_peaks(const std::vector<double>& frequencies, const ComplexVector& impedance,
                      const ImpedanceFunction& evaluate, const TargetImpedance& target, const PeakOptions& options) {
  options.validate();
  const std::size_t n = frequencies.size();
  QUIETRAIL_ASSERT(n >= 2 && static_cast<std::size_t>(impedance.size()) == n);
  QUIETRAIL_ASSERT(static_cast<bool>(evaluate));
  Evaluator eval(evaluate, target);
  const double band_lo = frequencies.front();
  const double band_hi = frequencies.back();

  std::vector<double> mag(n);
  std::vector<double> tgt(n);
  std::vector<double> ratio(n);
  for (std::size_t i = 0; i < n; ++i) {
    mag[i] = magnitude(impedance[static_cast<Eigen::Index>(i)]);
    tgt[i] = target.at(frequencies[i]);
    ratio[i] = mag[i] / tgt[i];
  }

  // PREAMBLE: candidate brackets on the grid.
  std::vector<Bracket> z_brackets;
  for (const auto& [i, j] : discrete_maxima(mag))
    z_brackets.push_back({i == 0 ? 0 : i - 1, std::min(j + 1, n - 1), i});
  for (std::size_t k = 0; k + 1 < n; ++k) {
    const double x0 = impedance[static_cast<Eigen::Index>(k)].imag();
    const double x1 = impedance[static_cast<Eigen::Index>(k + 1)].imag();
    // Foster: rising reactance jumps from + to - only across a pole (an anti-resonance).
    // Reactance within rounding of zero (a resistive curve) has no sign worth reading.
    if (x0 > kSampleNoise * mag[k] && x1 < -kSampleNoise * mag[k + 1]) z_brackets.push_back({k, k + 1, mag[k] >= mag[k + 1] ? k : k + 1, false});
  }
  std::vector<Bracket> r_brackets = z_brackets;
  for (const auto& [i, j] : discrete_maxima(ratio))
    r_brackets.push_back({i == 0 ? 0 : i - 1, std::min(j + 1, n - 1), i});
  // The target's corners and steps: the ratio can peak on one between two samples.
  const auto outline = target.outline(band_lo, band_hi);
  for (std::size_t c = 1; c + 1 < outline.size(); ++c) {
    const double fc = outline[c].frequency;
    const auto it = std::upper_bound(frequencies.begin(), frequencies.end(), fc);
    const std::size_t k = static_cast<std::size_t>(std::distance(frequencies.begin(), it)) - 1;
    const std::size_t k1 = std::min(k + 1, n - 1);
    r_brackets.push_back({k, k1, ratio[k] >= ratio[k1] ? k : k1, false});
  }

  auto make_peak = [&](const Maximum& m, const Bracket& b) {
    Peak p;
    p.frequency = m.frequency;
    p.magnitude = eval.impedance(m.frequency);
    p.target = target.at(m.frequency);
    p.ratio = p.magnitude / p.target;
    p.q = std::numeric_limits<double>::quiet_NaN();
    const double edge_tol = 4.0 * options.frequency_tolerance;
    p.at_band_edge = std::abs(std::log(m.frequency / band_lo)) <= edge_tol ||
                     std::abs(std::log(m.frequency / band_hi)) <= edge_tol;
    p.grid_index = b.start;
    p.raw_grid_magnitude = mag[b.start];
    p.raw_grid_ratio = ratio[b.start];
    return p;
  };
  // The refined maxima of one bracket. A bracket around a discrete local maximum always
  // yields one at least as high as its sample (Brent may settle on a lower local maximum
  // of a multi-modal bracket; the sample then stands in for it).
  auto refine = [&](auto&& g, const Bracket& b, const std::vector<double>& samples) {
    std::vector<Maximum> found = search_bracket(g, frequencies[b.lo], frequencies[b.hi], band_lo, band_hi, options);
    if (b.sample_is_maximum &&
        std::none_of(found.begin(), found.end(), [&](const Maximum& m) { return m.value >= samples[b.start]; }))
      found.push_back({frequencies[b.start], samples[b.start]});
    return found;
  };

  PeakSearch result;
  // PHASE 1: maxima of |Z|.
  std::vector<Peak> z_peaks;
  for (const Bracket& b : z_brackets) {
    for (const Maximum& m : refine([&](double f) { return eval.impedance(f); }, b, mag))
      z_peaks.push_back(make_peak(m, b));
  }
  result.impedance_peaks = merge(std::move(z_peaks), false);
  for (Peak& p : result.impedance_peaks)
    if (!p.at_band_edge) p.q = half_power_q(eval, p.frequency, p.magnitude, options);

  // PHASE 2: maxima of |Z|/Z_target.
  std::vector<Peak> r_peaks;
  for (const Bracket& b : r_brackets) {
    for (const Maximum& m : refine([&](double f) { return eval.ratio(f); }, b, ratio))
      r_peaks.push_back(make_peak(m, b));
  }
  result.ratio_peaks = merge(std::move(r_peaks), true);
  for (Peak& p : result.ratio_peaks) {
    for (const Peak& z : result.impedance_peaks)
      if (std::abs(z.frequency - p.frequency) <= kMergeDistance * p.frequency) p.q = z.q;
  }

  // PHASE 3: worst ratio over samples and refined maxima.
  result.worst_ratio = -kInf;
  for (std::size_t i = 0; i < n; ++i) {
    if (ratio[i] > result.worst_ratio) {
      result.worst_ratio = ratio[i];
      result.worst_frequency = frequencies[i];
    }
  }
  for (const Peak& p : result.ratio_peaks) {
    if (p.ratio > result.worst_ratio) {
      result.worst_ratio = p.ratio;
      result.worst_frequency = p.frequency;
    }
  }

  // PHASE 4: bands above the target. Runs of samples above 1, then refined maxima above 1
  // that sit between two samples at or below 1; edges bisected; touching bands merged.
  auto g_ratio = [&](double f) { return eval.ratio(f); };
  const double tol = options.frequency_tolerance;
  std::vector<ExceedanceBand> bands;
  for (std::size_t i = 0; i < n;) {
    if (!(ratio[i] > 1.0)) {
      ++i;
      continue;
    }
    std::size_t j = i;
    while (j + 1 < n && ratio[j + 1] > 1.0) ++j;
    ExceedanceBand band;
    band.starts_at_band_edge = i == 0;
    band.stops_at_band_edge = j + 1 == n;
    band.start = i == 0 ? band_lo
                        : bisect_crossing(g_ratio, frequencies[i], frequencies[i - 1], 1.0, tol, options.max_iterations);
    band.stop = j + 1 == n ? band_hi
                           : bisect_crossing(g_ratio, frequencies[j], frequencies[j + 1], 1.0, tol, options.max_iterations);
    band.worst_ratio = -kInf;
    for (std::size_t k = i; k <= j; ++k) {
      if (ratio[k] > band.worst_ratio) {
        band.worst_ratio = ratio[k];
        band.worst_frequency = frequencies[k];
      }
    }
    bands.push_back(band);
    i = j + 1;
  }
  for (const Peak& p : result.ratio_peaks) {
    if (!(p.ratio > 1.0)) continue;
    const auto it = std::upper_bound(frequencies.begin(), frequencies.end(), p.frequency);
    if (it == frequencies.begin() || it == frequencies.end()) continue;  // on the last sample: in a run
    const std::size_t k = static_cast<std::size_t>(std::distance(frequencies.begin(), it)) - 1;
    if (ratio[k] > 1.0 || ratio[k + 1] > 1.0) continue;  // handled with the run
    ExceedanceBand band;
    band.start = bisect_crossing(g_ratio, p.frequency, frequencies[k], 1.0, tol, options.max_iterations);
    band.stop = bisect_crossing(g_ratio, p.frequency, frequencies[k + 1], 1.0, tol, options.max_iterations);
    band.worst_ratio = p.ratio;
    band.worst_frequency = p.frequency;
    bands.push_back(band);
  }
  std::sort(bands.begin(), bands.end(),
            [](const ExceedanceBand& a, const ExceedanceBand& b) { return a.start < b.start; });
  for (const ExceedanceBand& b : bands) {
    if (!result.exceeded.empty() && b.start <= result.exceeded.back().stop) {
      ExceedanceBand& last = result.exceeded.back();
      if (b.stop > last.stop) {
        last.stop = b.stop;
        last.stops_at_band_edge = b.stops_at_band_edge;
      }
      if (b.worst_ratio > last.worst_ratio) {
        last.worst_ratio = b.worst_ratio;
        last.worst_frequency = b.worst_frequency;
      }
      continue;
    }
    result.exceeded.push_back(b);
  }
  // Refined maxima inside a band raise its worst value.
  for (ExceedanceBand& b : result.exceeded) {
    for (const Peak& p : result.ratio_peaks) {
      if (p.frequency >= b.start && p.frequency <= b.stop && p.ratio > b.worst_ratio) {
        b.worst_ratio = p.ratio;
        b.worst_frequency = p.frequency;
      }
    }
  }
  result.evaluations = eval.calls();
  return result;
}

}  // namespace quietrail
