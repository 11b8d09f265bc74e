// SPDX-License-Identifier: MIT
// The closed set of two-terminal elements a network branch can hold, and a mounted
// part: an element plus its mounting inductance, repeated `count` times in parallel.
#pragma once

#include <string>
#include <string_view>
#include <variant>

#include "quietrail/models/capacitor.hpp"
#include "quietrail/models/inductor.hpp"
#include "quietrail/models/plane_pair.hpp"
#include "quietrail/models/regulator.hpp"
#include "quietrail/models/resistor.hpp"

namespace quietrail {

using Element = std::variant<Capacitor, Inductor, Resistor, Regulator, PlanePair>;

/// "capacitor", "inductor", "resistor", "regulator" or "plane".
std::string_view element_kind(const Element& element);

/// Impedance of the bare element at `frequency` (Hz), ohm.
Complex element_impedance(const Element& element, double frequency);

/// Throws InputError naming `field` for an out-of-domain value.
void validate_element(const Element& element, const std::string& file, const std::string& field);

/// An element with its mounting, `count` identical copies in parallel:
///   Z = (Z_element(f) + j*2*pi*f*L_mount) / count
/// Each copy is taken to have its own mounting and no mutual coupling to the others.
struct MountedPart {
  Element element;
  /// Mounting loop inductance in series with each copy, H. >= 0.
  double mounting_inductance = 0.0;
  /// Identical copies in parallel. >= 1.
  int count = 1;

  Complex impedance(double frequency) const;
  void validate(const std::string& file, const std::string& field) const;
};

}  // namespace quietrail
