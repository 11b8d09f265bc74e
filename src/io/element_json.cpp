// SPDX-License-Identifier: MIT
// Private readers for the model objects shared by the JSON files (see element_json.hpp).
#include "io/element_json.hpp"

#include <cmath>
#include <map>

#include "quietrail/error.hpp"
#include "quietrail/models/mounting.hpp"
#include "quietrail/units.hpp"

namespace quietrail::detail {
namespace {

using Reader = JsonReader;

const Keys kMountingKeys{"package",     "inductance", "via_length",   "via_diameter",     "via_pitch",
                         "trace_length", "trace_width", "trace_height", "vias_per_terminal"};
const Keys kGeometryKeys{"via_length",  "via_diameter", "via_pitch",        "trace_length",
                         "trace_width", "trace_height", "vias_per_terminal"};

// Element fields per kind, beyond the keys of the object holding them (a branch, a BOM line).
const std::map<std::string_view, Keys> kKindKeys{
    {"capacitor",
     {"capacitance", "esr", "esl", "leakage_resistance", "dissipation_factor", "skin_corner"}},
    {"inductor", {"inductance", "dc_resistance", "parallel_capacitance", "core_loss_resistance"}},
    {"bead", {"inductance", "dc_resistance", "parallel_capacitance", "core_loss_resistance"}},
    {"resistor", {"resistance", "series_inductance"}},
    {"regulator", {"resistance", "inductance", "flat_impedance", "bandwidth"}},
    {"plane",
     {"area", "width", "length", "separation", "relative_permittivity", "loss_tangent", "spreading_inductance",
      "series_resistance"}},
};

Capacitor read_capacitor(const Reader& in, const Json& b, const std::string& p) {
  Capacitor c;
  c.capacitance = in.required_quantity(b, p, "capacitance", "F");
  if (auto v = in.optional_quantity(b, p, "esr", "ohm")) c.esr = *v;
  if (auto v = in.optional_quantity(b, p, "esl", "H")) c.esl = *v;
  if (auto v = in.optional_quantity(b, p, "leakage_resistance", "ohm")) c.leakage_resistance = *v;
  if (auto v = in.optional_quantity(b, p, "dissipation_factor", "")) c.dissipation_factor = *v;
  if (auto v = in.optional_quantity(b, p, "skin_corner", "Hz")) c.skin_corner = *v;
  return c;
}

Inductor read_inductor(const Reader& in, const Json& b, const std::string& p) {
  Inductor l;
  l.inductance = in.required_quantity(b, p, "inductance", "H");
  if (auto v = in.optional_quantity(b, p, "dc_resistance", "ohm")) l.dc_resistance = *v;
  if (auto v = in.optional_quantity(b, p, "parallel_capacitance", "F")) l.parallel_capacitance = *v;
  if (auto v = in.optional_quantity(b, p, "core_loss_resistance", "ohm")) l.core_loss_resistance = *v;
  return l;
}

Resistor read_resistor(const Reader& in, const Json& b, const std::string& p) {
  Resistor r;
  r.resistance = in.required_quantity(b, p, "resistance", "ohm");
  if (auto v = in.optional_quantity(b, p, "series_inductance", "H")) r.series_inductance = *v;
  return r;
}

Regulator read_regulator(const Reader& in, const Json& b, const std::string& p) {
  const double resistance = in.required_quantity(b, p, "resistance", "ohm");
  const auto inductance = in.optional_quantity(b, p, "inductance", "H");
  const auto flat = in.optional_quantity(b, p, "flat_impedance", "ohm");
  const auto bandwidth = in.optional_quantity(b, p, "bandwidth", "Hz");
  const std::string expected = "either \"inductance\", or \"flat_impedance\" with \"bandwidth\"";
  if (inductance) {
    if (flat || bandwidth) in.fail(p, expected, "both forms");
    return Regulator{resistance, *inductance};
  }
  if (!flat) in.fail(child(p, "flat_impedance"), expected, bandwidth ? "\"bandwidth\" alone" : "neither");
  if (!bandwidth) in.fail(child(p, "bandwidth"), expected, "\"flat_impedance\" alone");
  // from_bandwidth would name its own fields without the file; check here first.
  require_input(std::isfinite(resistance) && resistance >= 0.0, {in.file(), child(p, "resistance")},
                "a resistance >= 0 ohm", format_value(resistance, "ohm"));
  require_input(std::isfinite(*flat) && *flat > 0.0, {in.file(), child(p, "flat_impedance")},
                "an impedance > 0 ohm", format_value(*flat, "ohm"));
  require_input(std::isfinite(*bandwidth) && *bandwidth > 0.0, {in.file(), child(p, "bandwidth")},
                "a bandwidth > 0 Hz", format_value(*bandwidth, "Hz"));
  return Regulator::from_bandwidth(resistance, *flat, *bandwidth);
}

PlanePair read_plane(const Reader& in, const Json& b, const std::string& p) {
  PlanePair plane;
  const Json* area = Reader::find(b, "area");
  const bool sides = b.contains("width") || b.contains("length");
  const std::string expected = "either \"area\", or \"width\" with \"length\"";
  if (area && sides) in.fail(p, expected, "both forms");
  if (area) {
    plane.area = in.area(*area, child(p, "area"));
  } else if (sides) {
    const double width = in.required_quantity(b, p, "width", "m");
    const double length = in.required_quantity(b, p, "length", "m");
    require_input(std::isfinite(width) && width > 0.0, {in.file(), child(p, "width")}, "a width > 0 m",
                  format_value(width, "m"));
    require_input(std::isfinite(length) && length > 0.0, {in.file(), child(p, "length")}, "a length > 0 m",
                  format_value(length, "m"));
    plane.area = width * length;
  } else {
    in.fail(child(p, "area"), expected, "neither");
  }
  plane.separation = in.required_quantity(b, p, "separation", "m");
  if (auto v = in.optional_quantity(b, p, "relative_permittivity", "")) plane.relative_permittivity = *v;
  if (auto v = in.optional_quantity(b, p, "loss_tangent", "")) plane.loss_tangent = *v;
  if (auto v = in.optional_quantity(b, p, "spreading_inductance", "H")) plane.spreading_inductance = *v;
  if (auto v = in.optional_quantity(b, p, "series_resistance", "ohm")) plane.series_resistance = *v;
  return plane;
}

}  // namespace

Element read_element(const Reader& in, const std::string& kind, const Json& b, const std::string& p) {
  if (kind == "capacitor") return read_capacitor(in, b, p);
  if (kind == "inductor" || kind == "bead") return read_inductor(in, b, p);
  if (kind == "resistor") return read_resistor(in, b, p);
  if (kind == "regulator") return read_regulator(in, b, p);
  QUIETRAIL_ASSERT(kind == "plane");
  return read_plane(in, b, p);
}


const Keys* element_keys(std::string_view kind) {
  const auto it = kKindKeys.find(kind);
  return it == kKindKeys.end() ? nullptr : &it->second;
}

std::string element_kind_list() {
  Keys kinds;
  for (const auto& [kind, keys] : kKindKeys) kinds.push_back(kind);
  return join(kinds);
}

const Keys& mounting_keys() { return kMountingKeys; }

double read_mounting_inductance(const JsonReader& in, const Json& mounting, const std::string& pointer) {
  const Json* node = &mounting;
  in.require_object(*node, pointer, "a mounting");
  in.check_keys(*node, pointer, kMountingKeys, "a mounting");

  const bool by_package = node->contains("package");
  const bool by_inductance = node->contains("inductance");
  bool by_geometry = false;
  for (const auto key : kGeometryKeys) by_geometry = by_geometry || node->contains(key);
  const int forms = int{by_package} + int{by_inductance} + int{by_geometry};
  if (forms != 1) {
    in.fail(pointer, "exactly one way to give the mounting: \"package\", \"inductance\", or the geometry fields",
            forms == 0 ? std::string("none of them") : std::string("more than one"));
  }

  if (by_package) {
    const std::string code = in.string(node->at("package"), child(pointer, "package"), "a package code");
    const auto package = parse_package(code);
    if (!package) in.fail(child(pointer, "package"), "one of the package codes 0201, 0402, 0603, 0805, 1206, 1210",
                          "'" + code + "'");
    return typical_mounting_inductance(*package);
  }
  if (by_inductance) {
    const double inductance = in.required_quantity(*node, pointer, "inductance", "H");
    require_input(std::isfinite(inductance) && inductance >= 0.0, {in.file(), child(pointer, "inductance")},
                  "a mounting inductance >= 0 H", format_value(inductance, "H"));
    return inductance;
  }
  MountingGeometry geometry;
  geometry.via_length = in.required_quantity(*node, pointer, "via_length", "m");
  geometry.via_diameter = in.required_quantity(*node, pointer, "via_diameter", "m");
  geometry.via_pitch = in.required_quantity(*node, pointer, "via_pitch", "m");
  if (auto v = in.optional_quantity(*node, pointer, "trace_length", "m")) geometry.trace_length = *v;
  if (auto v = in.optional_quantity(*node, pointer, "trace_width", "m")) geometry.trace_width = *v;
  if (auto v = in.optional_quantity(*node, pointer, "trace_height", "m")) geometry.trace_height = *v;
  if (auto v = in.optional_integer(*node, pointer, "vias_per_terminal")) geometry.vias_per_terminal = *v;
  geometry.validate(in.file(), pointer);
  return geometry.inductance();
}

}  // namespace quietrail::detail
