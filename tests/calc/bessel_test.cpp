// SPDX-License-Identifier: MIT
// Complex-argument J0 and J1 against the real-axis standard library, tabulated Kelvin
// functions and an independent arbitrary-precision evaluation.
#include <catch2/catch.hpp>

#include <cmath>

#include "quietrail/calc/bessel.hpp"
#include "quietrail/types.hpp"

using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;
using quietrail::Complex;

namespace {
// The power series loses up to ~e^|z| / (pi |z|) ulps to cancellation on the real axis
// below the switch at |z| = 13, and the asymptotic series is good to ~e^-2|z|: 1e-10
// absolute covers both on the real axis, where |J| <= 1.
constexpr double kRealAxis = 1e-10;
constexpr double kComplex = 1e-10;  // relative, off the real axis (no zeros nearby)

void check_complex(Complex got, Complex expected, double rel) {
  CHECK_THAT(std::abs(got - expected) / std::abs(expected), WithinAbs(0.0, rel));
}
}  // namespace

TEST_CASE("J0 and J1 on the real axis match the standard library", "[calc]") {
  // std::cyl_bessel_j (C++17 special functions) is an independent real-only implementation.
  for (double x : {0.0, 0.5, 2.404825557695773, 5.0, 12.9, 13.1, 20.0, 50.0, 123.4}) {
    CAPTURE(x);
    CHECK_THAT(quietrail::bessel_j0(Complex(x, 0.0)).real(), WithinAbs(std::cyl_bessel_j(0.0, x), kRealAxis));
    CHECK_THAT(quietrail::bessel_j1(Complex(x, 0.0)).real(), WithinAbs(std::cyl_bessel_j(1.0, x), kRealAxis));
    CHECK_THAT(quietrail::bessel_j0(Complex(x, 0.0)).imag(), WithinAbs(0.0, kRealAxis));
  }
  // Parity: J0 even, J1 odd (A&S 9.1.5), across the asymptotic branch too.
  CHECK_THAT(quietrail::bessel_j1(Complex(-20.0, 0.0)).real(),
             WithinAbs(-std::cyl_bessel_j(1.0, 20.0), kRealAxis));
}

TEST_CASE("J0 on the 135 degree ray gives the Kelvin functions ber and bei", "[calc]") {
  // ber(x) + j bei(x) = J0(x e^{3 pi j/4}) (A&S 9.9.1). Values from A&S Table 9.12 (from
  // memory), confirmed to 30 digits with an arbitrary-precision library (mpmath 1.3).
  struct Row {
    double x, ber, bei;
  };
  const Row rows[] = {
      {1.0, 0.98438178121308688, 0.24956604003665972}, {2.0, 0.75173418271380823, 0.97229162730666121},
      {5.0, -6.2300824786663577, 0.11603438155020038}, {10.0, 138.84046594163265, 56.370458553906638},
      {20.0, 47489.370265061760, 114775.19736006622},  // asymptotic branch, left half-plane
  };
  const Complex ray = std::polar(1.0, 0.75 * quietrail::kPi);
  for (const Row& row : rows) {
    CAPTURE(row.x);
    check_complex(quietrail::bessel_j0(row.x * ray), Complex(row.ber, row.bei), kComplex);
  }
}

TEST_CASE("J0 and J1 far off the real axis match an arbitrary-precision reference", "[calc]") {
  // Reference values: mpmath 1.3 besselj at 30 digits (independent implementation).
  check_complex(quietrail::bessel_j0(Complex(3.0, -4.0)), Complex(-8.8121437936979055, 4.5984378997430350),
                kComplex);
  check_complex(quietrail::bessel_j1(Complex(3.0, -4.0)), Complex(3.6541102814142644, 8.4031042565830872),
                kComplex);
  check_complex(quietrail::bessel_j0(Complex(20.0, -20.0)), Complex(26598964.051830307, 25006015.587322083),
                kComplex);
  check_complex(quietrail::bessel_j1(Complex(-20.0, 20.0)), Complex(-25030292.655943653, 25950009.825167008),
                kComplex);
  check_complex(quietrail::bessel_j1(Complex(25.0, 5.0)), Complex(-8.4302537002099690, 8.1067103634114867),
                kComplex);
}

TEST_CASE("J0/J1 stays finite where J0 and J1 themselves overflow", "[calc]") {
  // Small |z|: the ratio equals the quotient of the two functions (definition).
  const Complex z(4.0, -4.0);
  check_complex(quietrail::bessel_j0_over_j1(z), quietrail::bessel_j0(z) / quietrail::bessel_j1(z), 1e-12);
  const Complex far(30.0, -30.0);  // asymptotic branch, both ways of computing work
  check_complex(quietrail::bessel_j0_over_j1(far), quietrail::bessel_j0(far) / quietrail::bessel_j1(far),
                1e-12);
  // |Im z| = 2400: cosh(2400) overflows a double. For large |z| with Im z < 0 the
  // Hankel expansion gives J0/J1 -> j + 1/(2z) (A&S 9.2.5, leading terms).
  const Complex huge(2400.0, -2400.0);
  const Complex ratio = quietrail::bessel_j0_over_j1(huge);
  REQUIRE(std::isfinite(ratio.real()));
  check_complex(ratio, Complex(0.0, 1.0) + 0.5 / huge, 1e-6);
}
