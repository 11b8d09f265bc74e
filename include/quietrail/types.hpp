// SPDX-License-Identifier: MIT
// Vocabulary types shared by every module: complex numbers, Eigen vectors over
// frequency, physical constants. All quantities inside the library are SI.
#pragma once

#include <complex>
#include <numbers>

#include <Eigen/Core>

namespace quietrail {

using Complex = std::complex<double>;
/// A complex value per frequency point (impedance or admittance).
using ComplexVector = Eigen::VectorXcd;
/// A real value per frequency point.
using RealVector = Eigen::VectorXd;

inline constexpr double kPi = std::numbers::pi;
inline constexpr double kTwoPi = 2.0 * std::numbers::pi;
/// Vacuum permeability, H/m (exact pre-2019 SI value 4*pi*1e-7; the 2019 value differs by 1e-10).
inline constexpr double kMu0 = 4.0e-7 * std::numbers::pi;
/// Vacuum permittivity, F/m (CODATA 2018).
inline constexpr double kEps0 = 8.8541878128e-12;
/// Speed of light in vacuum, m/s (exact).
inline constexpr double kSpeedOfLight = 299792458.0;
/// Resistivity of annealed copper at 20 C, ohm*m (IACS, 1913 standard value).
inline constexpr double kCopperResistivity = 1.724e-8;

/// Angular frequency for a frequency in Hz.
constexpr double omega(double frequency_hz) { return kTwoPi * frequency_hz; }

}  // namespace quietrail
