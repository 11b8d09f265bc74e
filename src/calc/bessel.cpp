// SPDX-License-Identifier: MIT
// Power series near the origin, Hankel's asymptotic expansion further out. The switch
// at |z| = 13 balances the series' cancellation (terms up to ~e^|z| on the real axis)
// against the asymptotic series' smallest term (~e^-2|z|): both stay near 1e-11.
#include "quietrail/calc/bessel.hpp"

#include <cmath>
#include <limits>

namespace quietrail {
namespace {

constexpr double kSeriesLimit = 13.0;
constexpr int kMaxTerms = 200;
constexpr double kTiny = 1e-17;

// J_n(z) = sum_k (-z^2/4)^k (z/2)^n / (k! (k+n)!)   (Abramowitz & Stegun 9.1.10), n = 0, 1.
Complex series(int n, Complex z) {
  const Complex q = -0.25 * z * z;
  Complex term = n == 0 ? Complex(1.0) : 0.5 * z;
  Complex sum = term;
  const double peak = std::abs(z) / 2.0;  // terms grow until k ~ |z|/2, then shrink
  for (int k = 1; k < kMaxTerms; ++k) {
    term *= q / (static_cast<double>(k) * static_cast<double>(k + n));
    sum += term;
    if (k > peak && std::abs(term) <= kTiny * std::abs(sum)) break;
  }
  return sum;
}

struct HankelTerms {
  Complex p{1.0, 0.0};
  Complex q{0.0, 0.0};
};

// P and Q of A&S 9.2.9-9.2.10: a_k(n) / z^k with a_k = prod_{i<=k} (4n^2 - (2i-1)^2) / (k! 8^k),
// P = a0 - a2/z^2 + a4/z^4 - ..., Q = a1/z - a3/z^3 + .... Summed until the terms stop
// shrinking (the series is asymptotic, not convergent).
HankelTerms hankel_terms(int n, Complex z) {
  const double mu = 4.0 * n * n;
  HankelTerms out;
  Complex term(1.0, 0.0);
  double last = std::numeric_limits<double>::infinity();
  for (int k = 1; k < kMaxTerms; ++k) {
    const double odd = 2.0 * k - 1.0;
    term *= (mu - odd * odd) / (8.0 * k * z);
    const double size = std::abs(term);
    if (size >= last) break;
    last = size;
    switch (k % 4) {
      case 1:
        out.q += term;
        break;
      case 2:
        out.p -= term;
        break;
      case 3:
        out.q -= term;
        break;
      default:
        out.p += term;
        break;
    }
    if (size < kTiny) break;
  }
  return out;
}

// J_n(z) = sqrt(2/(pi z)) (P cos chi - Q sin chi), chi = z - (n/2 + 1/4) pi, Re z >= 0.
Complex hankel(int n, Complex z) {
  const HankelTerms t = hankel_terms(n, z);
  const Complex chi = z - (0.5 * n + 0.25) * kPi;
  return std::sqrt(2.0 / (kPi * z)) * (t.p * std::cos(chi) - t.q * std::sin(chi));
}

Complex bessel(int n, Complex z) {
  if (std::abs(z) <= kSeriesLimit) return series(n, z);
  // The expansion holds for |arg z| < pi; use J_n(-z) = (-1)^n J_n(z) on the left half.
  if (z.real() < 0.0) return n == 0 ? hankel(n, -z) : -hankel(n, -z);
  return hankel(n, z);
}

}  // namespace

Complex bessel_j0(Complex z) { return bessel(0, z); }

Complex bessel_j1(Complex z) { return bessel(1, z); }

Complex bessel_j0_over_j1(Complex z) {
  if (z == Complex(0.0, 0.0)) return {std::numeric_limits<double>::infinity(), 0.0};
  if (std::abs(z) <= kSeriesLimit) return series(0, z) / series(1, z);
  // J0/J1 is odd in z. With chi = z - pi/4 and t = tan(chi), dividing numerator and
  // denominator by cos(chi) gives (P0 - Q0 t) / (P1 t + Q1), which stays finite where
  // cos and sin overflow (tan tends to +-j for large |Im z|).
  const double sign = z.real() < 0.0 ? -1.0 : 1.0;
  const Complex w = sign * z;
  const HankelTerms t0 = hankel_terms(0, w);
  const HankelTerms t1 = hankel_terms(1, w);
  const Complex t = std::tan(w - 0.25 * kPi);
  return sign * (t0.p - t0.q * t) / (t1.p * t + t1.q);
}

}  // namespace quietrail
