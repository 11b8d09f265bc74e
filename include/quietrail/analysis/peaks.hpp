// SPDX-License-Identifier: MIT
// Finding and refining the maxima of |Z(f)| and |Z(f)|/Z_target(f) on a sampled curve,
// their Q, and the bands where the target is exceeded. Used by analysis/check.hpp.
#pragma once

#include <cstddef>
#include <functional>
#include <vector>

#include "quietrail/analysis/target.hpp"
#include "quietrail/types.hpp"

namespace quietrail {

/// Exact impedance at any frequency (Hz, > 0), ohm: the same model the grid was sampled
/// from, evaluated directly (never interpolated). Must not throw for frequencies in the band.
using ImpedanceFunction = std::function<Complex(double)>;

/// Options for find_peaks.
struct PeakOptions {
  /// Relative width in frequency to which each maximum and each band edge is bracketed.
  /// In (0, 1e-2]. Default 1e-9. At a smooth maximum the height is then exact to rounding,
  /// while the location is only determined to about sqrt(machine epsilon) ~ 1e-8 relative,
  /// because |Z| is flat to second order there (Brent 1973, ch. 5).
  double frequency_tolerance = 1e-9;
  /// Iteration cap of each one-dimensional search. >= 10. Default 200: golden-section
  /// steps from a two-grid-step bracket at 1 point/decade reach 1e-9 in about 50
  /// (common practice; Brent 1973).
  int max_iterations = 200;
  /// Local densification: when > 0, the two grid intervals around each candidate are
  /// resampled with the exact evaluator at this many points per decade before refining,
  /// and every local maximum of the denser samples is refined separately (this separates
  /// two maxima that share one bracket). 0 (default) = no densification. At most
  /// kMaxPointsPerDecade.
  int min_points_per_decade_near_peaks = 0;
  /// The half-power points used for Q are searched up to this factor away from the peak
  /// frequency (each side). > 1. Default 10 (one decade): a resonance with Q >= 0.1 has its
  /// half-power points within it (series/parallel RLC band edges; any circuits text).
  double q_search_ratio = 10.0;

  /// Throws InputError naming the field ("frequency_tolerance", "max_iterations",
  /// "min_points_per_decade_near_peaks" or "q_search_ratio") under `field`.
  void validate(const std::string& file = {}, const std::string& field = {}) const;
};

/// A refined maximum of |Z| or of |Z|/Z_target.
struct Peak {
  /// Frequency of the refined maximum, Hz.
  double frequency = 0.0;
  /// |Z| there, ohm.
  double magnitude = 0.0;
  /// Z_target there, ohm.
  double target = 0.0;
  /// magnitude / target.
  double ratio = 0.0;
  /// f_p / (f_high - f_low) with |Z(f_low)| = |Z(f_high)| = |Z_peak| / sqrt(2), the
  /// half-power bandwidth definition of Q (any circuits text). NaN when the peak is not a
  /// resonance: a maximum at a band edge, or no half-power point on one side within
  /// q_search_ratio, or the curve rises above the peak before reaching one.
  double q = 0.0;
  /// True when the maximum lies on the first or last grid frequency (within the tolerance).
  bool at_band_edge = false;
  /// The grid sample the search started from (the larger sample of its bracket).
  std::size_t grid_index = 0;
  /// |Z| of that grid sample, ohm: what an unrefined sweep would have reported.
  double raw_grid_magnitude = 0.0;
  /// |Z|/Z_target of that grid sample.
  double raw_grid_ratio = 0.0;
};

/// A contiguous frequency band where |Z|/Z_target > 1.
struct ExceedanceBand {
  /// Lower edge, Hz (refined crossing of ratio 1, or the band's start frequency).
  double start = 0.0;
  /// Upper edge, Hz (refined crossing, or the band's stop frequency).
  double stop = 0.0;
  /// Largest refined |Z|/Z_target inside.
  double worst_ratio = 0.0;
  /// Where it occurs, Hz.
  double worst_frequency = 0.0;
  /// True when the band starts at the first grid frequency (it may extend below).
  bool starts_at_band_edge = false;
  /// True when the band ends at the last grid frequency (it may extend above).
  bool stops_at_band_edge = false;
};

/// What find_peaks found.
struct PeakSearch {
  /// Refined maxima of |Z| (anti-resonances, plus a maximum at a band edge), sorted by
  /// frequency, duplicates merged.
  std::vector<Peak> impedance_peaks;
  /// Refined maxima of |Z|/Z_target, sorted by frequency, duplicates merged. The verdict
  /// of a check is made on these.
  std::vector<Peak> ratio_peaks;
  /// Bands above the target, in increasing frequency.
  std::vector<ExceedanceBand> exceeded;
  /// Largest |Z|/Z_target over the grid samples and all refined maxima.
  double worst_ratio = 0.0;
  /// Where it occurs, Hz.
  double worst_frequency = 0.0;
  /// Calls of the exact evaluator made by the search.
  std::size_t evaluations = 0;
};

/// Finds every maximum of |Z| and of |Z|/Z_target on the sampled curve and refines it with
/// the exact evaluator.
///
/// Candidates (each gives a bracket of grid frequencies):
///  - every discrete local maximum of the samples (samples within 1e-12 relative count as
///    equal, so rounding noise on a flat curve makes none), a plateau counting as one, the
///    first and last sample included when above their neighbour: bracket [f_{k-1}, f_{k+1}]
///    (one-sided at a band edge);
///  - every grid interval [f_k, f_{k+1}] where Im Z changes sign from + to - (inductive to
///    capacitive with rising frequency). In a lossless network the reactance rises with
///    frequency except across a pole (Foster's reactance theorem, 1924), so such a sign
///    change marks an anti-resonance between the samples even when its skirts do not
///    raise either neighbouring sample.
///  For the ratio, the same plus the discrete local maxima of the sampled ratio and the
///  grid interval around each corner or step of the target (TargetImpedance::outline).
/// A search that ends on an inner bracket end where the curve still rises outwards is
/// dropped (another candidate holds that maximum); a bracket around a discrete maximum
/// always reports at least its sample. Each bracket is searched by Brent's method (golden section with parabolic steps;
/// R. P. Brent, "Algorithms for Minimization without Derivatives", 1973, ch. 5) in log f
/// to `frequency_tolerance`. Q comes from the half-power points, found by bracketing
/// outwards and bisecting. Band edges of exceedance are bisected on ratio - 1.
///
/// Guarantee (what cannot be missed): a maximum is found when it makes a sample a discrete
/// local maximum, which holds when its half-power width spans more than one grid step,
/// or when it is an anti-resonance whose reactance crosses zero between two samples with
/// no other zero or pole of the reactance in the same interval (resonances more than one
/// grid step apart). A narrow peak on a steep background with a series resonance in the
/// same grid interval can still escape; raise the grid density or use
/// min_points_per_decade_near_peaks. The worst ratio is never below the largest sampled ratio.
///
/// `frequencies` (Hz, strictly increasing, >= 2) and `impedance` must have the same size
/// (else InternalError); options are validated (InputError).
PeakSearch find_peaks(const std::vector<double>& frequencies, const ComplexVector& impedance,
                      const ImpedanceFunction& evaluate, const TargetImpedance& target,
                      const PeakOptions& options = {});

}  // namespace quietrail
