// SPDX-License-Identifier: MIT
// Bessel functions of the first kind of orders 0 and 1 for complex arguments, as needed
// by the exact AC resistance of a round conductor (calc/skin_effect.hpp).
#pragma once

#include "quietrail/types.hpp"

namespace quietrail {

/// J0(z) for complex z. Power series for |z| <= 13 and Hankel's asymptotic expansion
/// beyond (Abramowitz & Stegun 9.1.10 and 9.2.5-9.2.10); relative error about 1e-11 or
/// better away from zeros. |J0| grows like exp(|Im z|), so it overflows for |Im z| > ~700;
/// use bessel_j0_over_j1() when only the ratio is needed.
Complex bessel_j0(Complex z);

/// J1(z) for complex z; same method, accuracy and range as bessel_j0().
Complex bessel_j1(Complex z);

/// The ratio J0(z) / J1(z) for complex z != 0, without overflow for large |Im z|: the
/// asymptotic branch divides both expansions by cos(z - pi/4) first. Infinity at z = 0.
Complex bessel_j0_over_j1(Complex z);

}  // namespace quietrail
