// SPDX-License-Identifier: MIT
// Per-part figures an engineer reads off a datasheet curve: self-resonance with
// mounting, Q at a frequency, and the band where the part still acts as intended.
#pragma once

#include <optional>

#include "quietrail/models/element.hpp"

namespace quietrail {

/// Self-resonant frequency of a mounted capacitor, Hz:
///   SRF = 1 / (2*pi*sqrt((ESL + L_mount) * C))   (series RLC, any circuits text).
/// std::nullopt when ESL + L_mount is zero (an ideal capacitor never resonates).
std::optional<double> self_resonant_frequency(const Capacitor& capacitor, double mounting_inductance);

/// Self-resonant frequency of an inductor or bead with interwinding capacitance, Hz:
///   SRF = 1 / (2*pi*sqrt(L * C_p)). std::nullopt when C_p is zero.
std::optional<double> self_resonant_frequency(const Inductor& inductor);

/// Quality factor |X| / R of an impedance; infinity when R is zero.
double quality_factor(Complex impedance);

/// A frequency band [low, high], Hz. `high` may be infinity.
struct Band {
  double low = 0.0;
  double high = 0.0;
};

/// The band where the mounted part still behaves as a capacitor: its reactance is
/// capacitive and larger than its resistance (phase below -45 degrees). `low` is 0
/// without leakage; above SRF the part is inductive. std::nullopt when the part is never
/// capacitive in that sense (e.g. ESR larger than the characteristic reactance sqrt(L/C)).
/// For the plain series RLC the upper edge is the root of 2*pi*f*L - 1/(2*pi*f*C) = -R:
///   omega = (-R + sqrt(R^2 + 4 L / C)) / (2 L).
std::optional<Band> capacitive_band(const MountedPart& part);

/// The band where the part behaves as an inductor (phase above +45 degrees).
std::optional<Band> inductive_band(const MountedPart& part);

}  // namespace quietrail
