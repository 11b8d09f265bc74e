// SPDX-License-Identifier: MIT
// Peak finding and refinement against closed forms: the two-branch anti-resonance of
// REFERENCES section 3, the parallel RLC tank, and series RLC crossings of a flat target.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <limits>

#include "quietrail/analysis/peaks.hpp"
#include "quietrail/error.hpp"
#include "quietrail/frequency_grid.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::Complex;
using quietrail::ComplexVector;
using quietrail::FrequencyGrid;
using quietrail::Peak;
using quietrail::PeakOptions;
using quietrail::TargetImpedance;

namespace {

constexpr double kTwoPi = 2.0 * 3.14159265358979323846;
constexpr double kPrinted = 1e-3;        // REFERENCES: values printed to 4-5 significant figures
constexpr double kIssueTolerance = 5e-3; // the issue's requirement: refined height within 0.5 %
constexpr double kRefined = 1e-6;        // refinement vs a dense sweep or an exact closed form

// Series RLC branch: Z = R + j(wL - 1/(wC)) (REFERENCES section 2).
Complex series_rlc(double f, double c, double l, double r) {
  const double w = kTwoPi * f;
  return {r, w * l - 1.0 / (w * c)};
}

// Parallel RLC tank: Z = 1 / (1/R + 1/(jwL) + jwC).
Complex parallel_rlc(double f, double r, double l, double c) {
  const double w = kTwoPi * f;
  return 1.0 / Complex(1.0 / r, w * c - 1.0 / (w * l));
}

// REFERENCES section 3 worked example: 10 uF / 1 nH / 5 mohm against 100 nF / 1 nH / 5 mohm.
constexpr double kC1 = 10e-6, kL1 = 1e-9, kR1 = 5e-3;
constexpr double kC2 = 100e-9, kL2 = 1e-9, kR2 = 5e-3;
Complex two_branch(double f) {
  const Complex z1 = series_rlc(f, kC1, kL1, kR1);
  const Complex z2 = series_rlc(f, kC2, kL2, kR2);
  return z1 * z2 / (z1 + z2);
}

ComplexVector sample(const FrequencyGrid& grid, const quietrail::ImpedanceFunction& z) {
  ComplexVector out(static_cast<Eigen::Index>(grid.size()));
  for (std::size_t i = 0; i < grid.size(); ++i) out[static_cast<Eigen::Index>(i)] = z(grid[i]);
  return out;
}

const Peak* peak_between(const std::vector<Peak>& peaks, double lo, double hi) {
  for (const Peak& p : peaks)
    if (p.frequency > lo && p.frequency < hi) return &p;
  return nullptr;
}

}  // namespace

TEST_CASE("a high-Q anti-resonance between grid points is refined to its true height", "[analysis]") {
  // 10 points/decade puts grid points at 10 MHz and 12.59 MHz, around f_ar = 11.31 MHz.
  const FrequencyGrid grid({.start = 1e3, .stop = 1e9, .points_per_decade = 10});
  const auto found = quietrail::find_peaks(grid.frequencies(), sample(grid, two_branch), two_branch,
                                           TargetImpedance::flat(1.0));
  const Peak* peak = peak_between(found.impedance_peaks, 10e6, 12.6e6);
  REQUIRE(peak != nullptr);

  // Dense brute-force sweep of the same closed form (2e5 linear steps of 13 Hz over the bracket).
  double dense_max = 0.0;
  double dense_at = 0.0;
  for (int k = 0; k <= 200000; ++k) {
    const double f = 10e6 + 2.6e6 * k / 200000.0;
    if (std::abs(two_branch(f)) > dense_max) {
      dense_max = std::abs(two_branch(f));
      dense_at = f;
    }
  }
  CHECK_THAT(peak->magnitude, WithinRel(dense_max, kIssueTolerance));
  CHECK_THAT(peak->magnitude, WithinRel(dense_max, kRefined));
  CHECK_THAT(peak->frequency, WithinRel(dense_at, 1e-5));  // dense step 13 Hz ~ 1.2e-6 relative

  // REFERENCES section 3: swept maximum 0.48889 ohm at 11.282 MHz.
  CHECK_THAT(peak->magnitude, WithinRel(0.48889, kPrinted));
  CHECK_THAT(peak->frequency, WithinRel(11.282e6, kPrinted));

  // REFERENCES section 3 closed form at f_ar = 1/(2 pi sqrt((L1+L2) Cs)):
  // |Z(f_ar)| = |X^2 + R1 R2 + jX(R2 - R1)| / (R1 + R2); the maximum is slightly off f_ar.
  const double cs = kC1 * kC2 / (kC1 + kC2);
  const double f_ar = 1.0 / (kTwoPi * std::sqrt((kL1 + kL2) * cs));
  const double x = kTwoPi * f_ar * kL1 - 1.0 / (kTwoPi * f_ar * kC1);
  const double z_ar = std::abs(Complex(x * x + kR1 * kR2, x * (kR2 - kR1))) / (kR1 + kR2);
  CHECK_THAT(z_ar, WithinRel(0.48770, kPrinted));
  CHECK_THAT(peak->magnitude, WithinRel(z_ar, kIssueTolerance));
  CHECK(peak->magnitude >= z_ar);

  // The raw grid underestimates it by far more than a few percent (0.162 ohm at 10 MHz).
  CHECK(peak->raw_grid_magnitude < 0.95 * peak->magnitude);
  CHECK(peak->raw_grid_magnitude == std::abs(two_branch(grid[peak->grid_index])));
  CHECK_FALSE(peak->at_band_edge);
  CHECK(found.evaluations > 0);
}

TEST_CASE("a peak whose skirts leave the samples monotone is found by the reactance sign change", "[analysis]") {
  // A high-Q tank (R_t = 10 ohm, L = 1 nH, f0 = 11.3 MHz, Q = R_t sqrt(C/L) ~ 140) in series
  // with a resistance rising as sqrt(f) (skin effect, REFERENCES section 2). Test
  // construction: the background rises 12 % per grid step while the tank's skirts add under
  // 1 % (in quadrature) at the neighbouring samples, so no sample is a local maximum.
  const double f0 = 11.3e6;
  const double l = 1e-9;
  const double c = 1.0 / ((kTwoPi * f0) * (kTwoPi * f0) * l);
  auto z = [&](double f) { return Complex(std::sqrt(f / 1e6), 0.0) + parallel_rlc(f, 10.0, l, c); };
  const FrequencyGrid grid({.start = 1e3, .stop = 1e9, .points_per_decade = 10});
  const ComplexVector samples = sample(grid, z);
  for (std::size_t i = 0; i + 1 < grid.size(); ++i)
    REQUIRE(std::abs(samples[static_cast<Eigen::Index>(i + 1)]) > std::abs(samples[static_cast<Eigen::Index>(i)]));

  const auto found = quietrail::find_peaks(grid.frequencies(), samples, z, TargetImpedance::flat(100.0));
  const Peak* peak = peak_between(found.impedance_peaks, 10e6, 12.6e6);
  REQUIRE(peak != nullptr);
  // At f0 the tank is exactly R_t, so |Z(f0)| = sqrt(f0 / 1 MHz) + R_t is a lower bound.
  const double at_f0 = std::sqrt(f0 / 1e6) + 10.0;
  CHECK(peak->magnitude >= at_f0);
  // Dense brute-force sweep of +-1 % around f0 (4e5 steps of 0.56 Hz).
  double dense_max = 0.0;
  double dense_at = 0.0;
  for (int k = 0; k <= 400000; ++k) {
    const double f = f0 * (0.99 + 0.02 * k / 400000.0);
    if (std::abs(z(f)) > dense_max) {
      dense_max = std::abs(z(f));
      dense_at = f;
    }
  }
  CHECK_THAT(peak->magnitude, WithinRel(dense_max, kRefined));
  CHECK_THAT(peak->frequency, WithinRel(dense_at, 1e-6));
}

TEST_CASE("the half-power Q of a parallel RLC tank is R sqrt(C/L)", "[analysis]") {
  // Parallel RLC: peak R at f0 = 1/(2 pi sqrt(LC)), half-power bandwidth 1/(2 pi R C), so
  // Q = f0 / bandwidth = R sqrt(C/L) exactly (any circuits text).
  const double r = 1.0;
  const double l = 1e-9;
  const double c = 200e-9;
  auto z = [&](double f) { return parallel_rlc(f, r, l, c); };
  const FrequencyGrid grid({.start = 1e5, .stop = 1e9, .points_per_decade = 10});
  const auto found = quietrail::find_peaks(grid.frequencies(), sample(grid, z), z, TargetImpedance::flat(10.0));
  REQUIRE(found.impedance_peaks.size() == 1);
  const Peak& p = found.impedance_peaks.front();
  const double f0 = 1.0 / (kTwoPi * std::sqrt(l * c));
  CHECK_THAT(p.frequency, WithinRel(f0, 1e-7));  // location resolved to ~sqrt(eps) (peaks.hpp)
  CHECK_THAT(p.magnitude, WithinRel(r, 1e-12));
  CHECK_THAT(p.q, WithinRel(r * std::sqrt(c / l), kRefined));
}

TEST_CASE("densification separates two anti-resonances inside one grid interval", "[analysis]") {
  // Two tanks in series (R = 10 ohm, L = 1 nH, Q ~ 150) at 10.6 and 11.8 MHz, both between
  // the samples at 10 and 12.59 MHz: one bracket, two maxima.
  const double l = 1e-9;
  const double fa = 10.6e6;
  const double fb = 11.8e6;
  const double ca = 1.0 / ((kTwoPi * fa) * (kTwoPi * fa) * l);
  const double cb = 1.0 / ((kTwoPi * fb) * (kTwoPi * fb) * l);
  auto z = [&](double f) { return parallel_rlc(f, 10.0, l, ca) + parallel_rlc(f, 10.0, l, cb); };
  const FrequencyGrid grid({.start = 1e5, .stop = 1e9, .points_per_decade = 10});
  const auto found = quietrail::find_peaks(grid.frequencies(), sample(grid, z), z, TargetImpedance::flat(100.0),
                                           PeakOptions{.min_points_per_decade_near_peaks = 400});
  for (const double f : {fa, fb}) {
    const Peak* p = peak_between(found.impedance_peaks, 0.98 * f, 1.02 * f);
    REQUIRE(p != nullptr);
    // Dense brute-force sweep of +-1 % around the tank's resonance (2e5 steps).
    double dense_max = 0.0;
    for (int k = 0; k <= 200000; ++k) dense_max = std::max(dense_max, std::abs(z(f * (0.99 + 0.02 * k / 200000.0))));
    CHECK_THAT(p->magnitude, WithinRel(dense_max, kRefined));
    // Each maximum sits near its tank's 1/(2 pi sqrt(LC)); the other tank shifts it slightly.
    CHECK_THAT(p->frequency, WithinRel(f, 1e-3));
    // |Z(f)| there is R plus the other tank's small contribution (closed form lower bound).
    CHECK(p->magnitude >= std::abs(z(f)));
  }
}

TEST_CASE("bands above a flat target end at the closed-form roots of |Z| = Z_t", "[analysis]") {
  // Series RLC 100 nF / 0.5 nH / 20 mohm (REFERENCES section 2) against 50 mohm: |Z| = Z_t
  // where wL - 1/(wC) = -+X_t, X_t = sqrt(Z_t^2 - R^2): w = (-+X_t + sqrt(X_t^2 + 4L/C)) / (2L).
  const double c = 100e-9, l = 0.5e-9, r = 20e-3, zt = 50e-3;
  auto z = [&](double f) { return series_rlc(f, c, l, r); };
  const double xt = std::sqrt(zt * zt - r * r);
  const double f_lo = (-xt + std::sqrt(xt * xt + 4.0 * l / c)) / (2.0 * l) / kTwoPi;
  const double f_hi = (xt + std::sqrt(xt * xt + 4.0 * l / c)) / (2.0 * l) / kTwoPi;
  const FrequencyGrid grid({.start = 1e3, .stop = 1e9, .points_per_decade = 50});
  const auto found = quietrail::find_peaks(grid.frequencies(), sample(grid, z), z, TargetImpedance::flat(zt));
  REQUIRE(found.exceeded.size() == 2);
  const auto& below = found.exceeded[0];
  const auto& above = found.exceeded[1];
  CHECK(below.starts_at_band_edge);
  CHECK(below.start == 1e3);
  CHECK_THAT(below.stop, WithinRel(f_lo, kRefined));
  CHECK_THAT(above.start, WithinRel(f_hi, kRefined));
  CHECK(above.stops_at_band_edge);
  CHECK(above.stop == 1e9);
  // Worst: the band edge at 1 kHz, |Z(1 kHz)| / Z_t from the same closed form.
  CHECK_THAT(found.worst_ratio, WithinRel(std::abs(z(1e3)) / zt, 1e-12));
  CHECK(found.worst_frequency == 1e3);
}

TEST_CASE("a maximum on the band edge is flagged and has no Q", "[analysis]") {
  // A capacitor below its SRF falls as 1/f: the largest |Z| is at the lowest frequency.
  const double c = 100e-9, l = 0.5e-9, r = 20e-3;
  auto z = [&](double f) { return series_rlc(f, c, l, r); };
  const FrequencyGrid grid({.start = 1e3, .stop = 1e6, .points_per_decade = 20});
  const auto found = quietrail::find_peaks(grid.frequencies(), sample(grid, z), z, TargetImpedance::flat(1e4));
  REQUIRE(found.impedance_peaks.size() == 1);
  const Peak& p = found.impedance_peaks.front();
  CHECK(p.at_band_edge);
  CHECK(p.frequency == 1e3);
  CHECK(std::isnan(p.q));
  CHECK_THAT(p.magnitude, WithinRel(std::abs(z(1e3)), 1e-12));  // closed form at the edge
  CHECK(found.exceeded.empty());
}

TEST_CASE("a narrow excursion above the target between two samples below it is a band", "[analysis]") {
  // Parallel RLC tank with R = 1 ohm peaking between samples that both sit well below a
  // 0.5 ohm target. The band is where |Z| = 0.5 ohm: |Y| = 2 S, i.e. (wC - 1/(wL))^2 = 3
  // (R = 1 ohm), roots w = (-+sqrt(3) + sqrt(3 + 4C/L)) / (2C).
  const double r = 1.0, l = 1e-9, c = 2e-6;  // Q = R sqrt(C/L) ~ 44.7
  auto z = [&](double f) { return parallel_rlc(f, r, l, c); };
  const FrequencyGrid grid({.start = 1e5, .stop = 1e9, .points_per_decade = 10});
  const auto samples = sample(grid, z);
  for (Eigen::Index i = 0; i < samples.size(); ++i) REQUIRE(std::abs(samples[i]) < 0.5);
  const auto found = quietrail::find_peaks(grid.frequencies(), samples, z, TargetImpedance::flat(0.5));
  REQUIRE(found.exceeded.size() == 1);
  const double s3 = std::sqrt(3.0);
  const double w_lo = (-s3 + std::sqrt(3.0 + 4.0 * c / l)) / (2.0 * c);
  const double w_hi = (s3 + std::sqrt(3.0 + 4.0 * c / l)) / (2.0 * c);
  CHECK_THAT(found.exceeded[0].start, WithinRel(w_lo / kTwoPi, kRefined));
  CHECK_THAT(found.exceeded[0].stop, WithinRel(w_hi / kTwoPi, kRefined));
  CHECK_THAT(found.exceeded[0].worst_ratio, WithinRel(r / 0.5, 1e-12));
  CHECK_THAT(found.worst_ratio, WithinRel(2.0, 1e-12));
}

TEST_CASE("a step down in the target between samples is judged at the step", "[analysis]") {
  // 1 uF / 1 mohm capacitor (|Z| falls as 1/f) against 1 ohm up to 1.1 MHz and 0.1 ohm
  // above. The ratio jumps at the step, so its largest value is |Z(1.1 MHz)| / 0.1 ohm
  // exactly there (the stricter value applies at the edge; target.hpp), with |Z| from the
  // series RLC closed form. No grid point lies on 1.1 MHz.
  const double c = 1e-6, r = 1e-3;
  auto z = [&](double f) { return series_rlc(f, c, 0.0, r); };
  const auto target = TargetImpedance::from_segments(
      {quietrail::TargetSegment::flat(2e5, 1.1e6, 1.0), quietrail::TargetSegment::flat(1.1e6, 1e8, 0.1)});
  // From 200 kHz (|Z| = 0.80 ohm, under 1 ohm) at 10/decade: samples at 1.002 and 1.262 MHz.
  const FrequencyGrid grid({.start = 2e5, .stop = 1e8, .points_per_decade = 10});
  const auto found = quietrail::find_peaks(grid.frequencies(), sample(grid, z), z, target);
  CHECK_THAT(found.worst_ratio, WithinRel(std::abs(z(1.1e6)) / 0.1, kRefined));
  CHECK_THAT(found.worst_frequency, WithinRel(1.1e6, kRefined));
  REQUIRE(found.exceeded.size() == 1);
  CHECK_THAT(found.exceeded[0].start, WithinRel(1.1e6, kRefined));
  // Above the step |Z| = 0.1 ohm where 1/(wC) = sqrt(0.01 - R^2) (closed form).
  CHECK_THAT(found.exceeded[0].stop, WithinRel(1.0 / (kTwoPi * c * std::sqrt(0.01 - r * r)), kRefined));
}

TEST_CASE("peak options are validated by field", "[analysis]") {
  auto error_for = [](PeakOptions o) {
    try {
      o.validate("p.json", "/analysis");
    } catch (const quietrail::InputError& e) {
      return std::string(e.what());
    }
    return std::string();
  };
  CHECK_THAT(error_for({.frequency_tolerance = 0.0}), Contains("p.json") && Contains("/analysis/frequency_tolerance"));
  CHECK_THAT(error_for({.max_iterations = 3}), Contains("max_iterations"));
  CHECK_THAT(error_for({.min_points_per_decade_near_peaks = -1}), Contains("min_points_per_decade_near_peaks"));
  CHECK_THAT(error_for({.q_search_ratio = 1.0}), Contains("q_search_ratio"));
  CHECK(error_for({}).empty());
}
