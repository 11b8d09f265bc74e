// SPDX-License-Identifier: MIT
#include "quietrail/models/part_response.hpp"

#include <cmath>
#include <functional>
#include <limits>

namespace quietrail {
namespace {

// The scan spans every frequency a board-level part can matter at, with margin.
constexpr double kScanLow = 1e-3;   // Hz
constexpr double kScanHigh = 1e13;  // Hz
constexpr int kScanPerDecade = 40;
constexpr int kBisections = 100;    // far past double precision on a log axis

// Widest contiguous band where `inside(f)` holds, edges refined by bisection on log f.
std::optional<Band> widest_band(const std::function<bool(double)>& inside) {
  const int decades = static_cast<int>(std::log10(kScanHigh / kScanLow));
  const int n = decades * kScanPerDecade;
  auto f_at = [&](int i) { return kScanLow * std::pow(10.0, static_cast<double>(i) / kScanPerDecade); };
  auto refine = [&](double a, double b) {  // inside(a) != inside(b); returns the crossing
    const bool at_a = inside(a);
    for (int k = 0; k < kBisections; ++k) {
      const double m = std::sqrt(a * b);
      if (inside(m) == at_a) a = m; else b = m;
    }
    return std::sqrt(a * b);
  };
  std::optional<Band> best;
  double best_width = -1.0;
  int i = 0;
  while (i <= n) {
    if (!inside(f_at(i))) { ++i; continue; }
    const int start = i;
    while (i <= n && inside(f_at(i))) ++i;
    const double low = start == 0 ? 0.0 : refine(f_at(start - 1), f_at(start));
    const double high = i > n ? std::numeric_limits<double>::infinity() : refine(f_at(i - 1), f_at(i));
    const double width = std::log10((i > n ? kScanHigh : high) / (start == 0 ? kScanLow : low));
    if (width > best_width) { best_width = width; best = Band{low, high}; }
  }
  return best;
}

}  // namespace

std::optional<double> self_resonant_frequency(const Capacitor& capacitor, double mounting_inductance) {
  const double l = capacitor.esl + mounting_inductance;
  if (l <= 0.0) return std::nullopt;
  return 1.0 / (kTwoPi * std::sqrt(l * capacitor.capacitance));
}

std::optional<double> self_resonant_frequency(const Inductor& inductor) {
  if (inductor.parallel_capacitance <= 0.0) return std::nullopt;
  return 1.0 / (kTwoPi * std::sqrt(inductor.inductance * inductor.parallel_capacitance));
}

double quality_factor(Complex impedance) {
  if (impedance.real() == 0.0) return std::numeric_limits<double>::infinity();
  return std::abs(impedance.imag()) / std::abs(impedance.real());
}

std::optional<Band> capacitive_band(const MountedPart& part) {
  return widest_band([&](double f) {
    const Complex z = part.impedance(f);
    return z.imag() < 0.0 && -z.imag() > z.real();
  });
}

std::optional<Band> inductive_band(const MountedPart& part) {
  return widest_band([&](double f) {
    const Complex z = part.impedance(f);
    return z.imag() > 0.0 && z.imag() > z.real();
  });
}

}  // namespace quietrail
