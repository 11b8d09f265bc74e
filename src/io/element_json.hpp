// SPDX-License-Identifier: MIT
// Private readers for the model objects that several JSON files share (capacitor,
// inductor/bead, resistor, regulator, plane pair, mounting): network and project files.
#pragma once

#include <string>
#include <string_view>

#include "io/json_support.hpp"
#include "quietrail/models/element.hpp"

namespace quietrail::detail {

/// The element keys of `kind` ("capacitor", "inductor", "bead", "resistor", "regulator",
/// "plane"), beyond any keys the containing object adds; nullptr for an unknown kind.
const Keys* element_keys(std::string_view kind);

/// "bead, capacitor, inductor, plane, regulator, resistor".
std::string element_kind_list();

/// Reads the element fields of `kind` from `object` at `pointer` (keys are not checked
/// here; call check_keys with element_keys first). Quantities as JsonReader::quantity.
/// A regulator takes "resistance" with either "inductance" or "flat_impedance" plus
/// "bandwidth"; a plane takes "area" or "width" with "length", and "separation".
/// Domain checks beyond those stated are the models' validate().
Element read_element(const JsonReader& in, const std::string& kind, const Json& object, const std::string& pointer);

/// The keys of a mounting object: "package", "inductance" or the geometry fields.
const Keys& mounting_keys();

/// The mounting inductance of one copy, H, from a mounting object at `pointer`: exactly
/// one of {"package": "0402"} (typical_mounting_inductance), {"inductance": "0.4n"} or the
/// MountingGeometry fields. Throws InputError naming the file and field.
double read_mounting_inductance(const JsonReader& in, const Json& mounting, const std::string& pointer);

}  // namespace quietrail::detail
