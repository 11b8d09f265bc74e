// SPDX-License-Identifier: MIT
// Reading the JSON network file (schema in docs/network_file.md). nlohmann_json stays
// in this file; everything that leaves it is a validated Network or an InputError.
#include "quietrail/io/network_file.hpp"

#include <cerrno>
#include <cmath>
#include <cstring>
#include <functional>
#include <fstream>
#include <limits>
#include <map>
#include <optional>
#include <set>
#include <sstream>
#include <system_error>

#include <nlohmann/json.hpp>

#include "quietrail/error.hpp"
#include "quietrail/models/mounting.hpp"
#include "quietrail/network/topology.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

using Json = nlohmann::json;
using Keys = std::vector<std::string_view>;

// ---------------------------------------------------------------- schema tables

const Keys kTopKeys{"name", "description", "port", "ground", "sweep", "branches"};
const Keys kSweepKeys{"start", "stop", "points_per_decade"};
const Keys kBranchKeys{"name", "kind", "from", "to", "count", "mounting", "note"};
const Keys kMountingKeys{"package",     "inductance", "via_length",   "via_diameter",     "via_pitch",
                         "trace_length", "trace_width", "trace_height", "vias_per_terminal"};
const Keys kGeometryKeys{"via_length",  "via_diameter", "via_pitch",        "trace_length",
                         "trace_width", "trace_height", "vias_per_terminal"};

// Element fields per kind, beyond kBranchKeys.
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

// ---------------------------------------------------------------- small helpers

std::string join(const Keys& keys) {
  std::string out;
  for (const auto key : keys) {
    if (!out.empty()) out += ", ";
    out += key;
  }
  return out;
}

bool contains(const Keys& keys, std::string_view key) {
  for (const auto k : keys)
    if (k == key) return true;
  return false;
}

// One reference token of a JSON pointer (RFC 6901, section 3: "~" -> "~0", "/" -> "~1").
std::string pointer_token(std::string_view key) {
  std::string out;
  for (const char c : key) {
    if (c == '~') out += "~0";
    else if (c == '/') out += "~1";
    else out += c;
  }
  return out;
}

std::string child(const std::string& pointer, std::string_view key) {
  std::string out = pointer;
  out += '/';
  out += pointer_token(key);
  return out;
}

std::string child(const std::string& pointer, std::size_t index) { return child(pointer, std::to_string(index)); }

// What a JSON value is, for "found ...": its type and a short rendering.
std::string describe(const Json& value) {
  std::string text = value.dump();
  if (text.size() > 40) text = text.substr(0, 37) + "...";
  if (value.is_object()) return "an object";
  if (value.is_array()) return "an array";
  if (value.is_null()) return "null";
  std::string out = std::string(value.type_name());
  out.append(" ").append(text);
  return out;
}

// "line:column" from a 1-based byte offset as nlohmann reports it (the last byte read).
std::pair<int, int> line_and_column(std::string_view text, std::size_t byte) {
  const std::size_t end = std::min(byte == 0 ? 0 : byte - 1, text.size());
  int line = 1;
  std::size_t line_start = 0;
  for (std::size_t i = 0; i < end; ++i) {
    if (text[i] == '\n') {
      ++line;
      line_start = i + 1;
    }
  }
  return {line, static_cast<int>(end - line_start) + 1};
}

// nlohmann's message without its "[json.exception...] parse error at line 3, column 5: "
// head, which we replace with our own location.
std::string parser_reason(const std::string& what) {
  const std::size_t head = what.find("] ");
  const std::size_t colon = what.find(": ", head == std::string::npos ? 0 : head);
  if (colon == std::string::npos) return what;
  return what.substr(colon + 2);
}

// Remembers the first key that appears twice in one object while nlohmann parses
// (nlohmann keeps the last silently, which would hide a typo'd copy-paste).
class DuplicateKeyWatch {
 public:
  bool operator()(int /*depth*/, Json::parse_event_t event, Json& parsed) {
    switch (event) {
      case Json::parse_event_t::object_start: stack_.push_back(Frame{.array = false}); break;
      case Json::parse_event_t::array_start: stack_.push_back(Frame{.array = true}); break;
      case Json::parse_event_t::key: {
        Frame& frame = stack_.back();
        frame.key = parsed.get<std::string>();
        if (!frame.seen.insert(frame.key).second && !duplicate_) duplicate_ = {container_pointer(), frame.key};
        break;
      }
      case Json::parse_event_t::object_end:
      case Json::parse_event_t::array_end:
        stack_.pop_back();
        element_done();
        break;
      case Json::parse_event_t::value: element_done(); break;
    }
    return true;
  }

  /// The pointer of the object holding the duplicate and the key, if one was seen.
  const std::optional<std::pair<std::string, std::string>>& duplicate() const { return duplicate_; }

 private:
  struct Frame {
    bool array = false;
    std::size_t index = 0;
    std::string key{};
    std::set<std::string> seen{};
  };

  void element_done() {
    if (!stack_.empty() && stack_.back().array) ++stack_.back().index;
  }

  // Pointer of the innermost container: each ancestor contributes the key or index
  // under which its child was found.
  std::string container_pointer() const {
    std::string pointer;
    for (std::size_t i = 0; i + 1 < stack_.size(); ++i)
      pointer = stack_[i].array ? child(pointer, stack_[i].index) : child(pointer, stack_[i].key);
    return pointer;
  }

  std::vector<Frame> stack_;
  std::optional<std::pair<std::string, std::string>> duplicate_;
};

// ---------------------------------------------------------------- the reader

// Field-level reading with the file name and JSON pointer in every error.
class Reader {
 public:
  explicit Reader(std::string file) : file_(std::move(file)) {}

  const std::string& file() const { return file_; }

  [[noreturn]] void fail(const std::string& pointer, const std::string& expected, const std::string& found) const {
    throw InputError({file_, pointer}, expected, found);
  }

  void require_object(const Json& value, const std::string& pointer, const std::string& what) const {
    if (!value.is_object()) fail(pointer, what + " (a JSON object)", describe(value));
  }

  // Every key of `object` must be in `allowed`.
  void check_keys(const Json& object, const std::string& pointer, const Keys& allowed,
                  const std::string& what) const {
    for (const auto& item : object.items()) {
      if (!contains(allowed, item.key()))
        fail(child(pointer, item.key()), "one of the keys of " + what + ": " + join(allowed),
             "the unknown key '" + item.key() + "'");
    }
  }

  static const Json* find(const Json& object, std::string_view key) {
    const auto it = object.find(key);
    return it == object.end() ? nullptr : &*it;
  }

  std::string string(const Json& value, const std::string& pointer, const std::string& what) const {
    if (!value.is_string()) fail(pointer, what + " (a JSON string)", describe(value));
    std::string text = value.get<std::string>();
    if (text.empty()) fail(pointer, what + " (a non-empty string)", "an empty string");
    return text;
  }

  std::string required_string(const Json& object, const std::string& pointer, std::string_view key,
                              const std::string& what) const {
    const Json* value = find(object, key);
    if (!value) fail(child(pointer, key), what + " (a JSON string)", "nothing: the key is missing");
    return string(*value, child(pointer, key), what);
  }

  std::optional<std::string> optional_string(const Json& object, const std::string& pointer, std::string_view key,
                                             const std::string& what) const {
    const Json* value = find(object, key);
    if (!value) return std::nullopt;
    return string(*value, child(pointer, key), what);
  }

  // A quantity: a JSON number in SI units or an engineering-notation string.
  double quantity(const Json& value, const std::string& pointer, std::string_view unit) const {
    if (value.is_number()) return value.get<double>();
    if (value.is_string()) return parse_value(value.get<std::string>(), unit, {file_, pointer});
    std::string expected = "a number";
    if (!unit.empty()) expected.append(" in ").append(unit);
    fail(pointer, expected + " or an engineering-notation string such as \"" + example(unit) + "\"",
         describe(value));
  }

  std::optional<double> optional_quantity(const Json& object, const std::string& pointer, std::string_view key,
                                          std::string_view unit) const {
    const Json* value = find(object, key);
    if (!value) return std::nullopt;
    return quantity(*value, child(pointer, key), unit);
  }

  double required_quantity(const Json& object, const std::string& pointer, std::string_view key,
                           std::string_view unit) const {
    const Json* value = find(object, key);
    if (!value) {
      std::string expected = "a value";
      if (!unit.empty()) expected.append(" in ").append(unit);
      fail(child(pointer, key), expected + " such as \"" + example(unit) + "\"", "nothing: the key is missing");
    }
    return quantity(*value, child(pointer, key), unit);
  }

  // A whole number (JSON integer) in int range; domain checks are the caller's.
  std::optional<int> optional_integer(const Json& object, const std::string& pointer, std::string_view key) const {
    const Json* value = find(object, key);
    if (!value) return std::nullopt;
    const std::string field = child(pointer, key);
    if (value->is_number_unsigned()) {
      const auto v = value->get<std::uint64_t>();
      if (v > static_cast<std::uint64_t>(std::numeric_limits<int>::max()))
        fail(field, "a whole number up to " + std::to_string(std::numeric_limits<int>::max()), describe(*value));
      return static_cast<int>(v);
    }
    if (value->is_number_integer()) {
      const auto v = value->get<std::int64_t>();
      if (v < std::numeric_limits<int>::min()) fail(field, "a whole number", describe(*value));
      return static_cast<int>(v);
    }
    fail(field, "a whole number (a JSON integer such as 4)", describe(*value));
  }

  // An area in m^2: a number, or a string ending in m^2, cm^2 or mm^2 (also m2, cm2, mm2).
  double area(const Json& value, const std::string& pointer) const {
    static const std::string kExpected = "an area such as \"100cm^2\", \"2500mm^2\" or 0.01 (m^2)";
    if (value.is_number()) return value.get<double>();
    if (!value.is_string()) fail(pointer, kExpected, describe(value));
    std::string text = value.get<std::string>();
    double scale = 1.0;
    const std::pair<std::string_view, double> suffixes[] = {
        {"mm^2", 1e-6}, {"cm^2", 1e-4}, {"m^2", 1.0}, {"mm2", 1e-6}, {"cm2", 1e-4}, {"m2", 1.0}};
    for (const auto& [suffix, factor] : suffixes) {
      if (text.size() >= suffix.size() && text.compare(text.size() - suffix.size(), suffix.size(), suffix) == 0) {
        text.resize(text.size() - suffix.size());
        scale = factor;
        break;
      }
    }
    try {
      return parse_value(text, "", {file_, pointer}) * scale;
    } catch (const InputError&) {
      fail(pointer, kExpected, "'" + value.get<std::string>() + "'");
    }
  }

  // Re-throws an InputError raised by a validate() that does not know the file or the
  // pointer prefix (e.g. FrequencyGridOptions::validate names "start").
  template <class F>
  void within(const std::string& prefix, F&& check) const {
    try {
      check();
    } catch (const InputError& e) {
      InputLocation where = e.where();
      where.file = file_;
      where.field = where.field.empty() ? prefix : child(prefix, where.field);
      throw InputError(where, e.expected(), e.found());
    }
  }

 private:
  static std::string example(std::string_view unit) {
    if (unit == "F") return "100n";
    if (unit == "H") return "0.5n";
    if (unit == "ohm") return "20m";
    if (unit == "Hz") return "10MHz";
    if (unit == "m") return "1.6mm";
    return "2.5";
  }

  std::string file_;
};

// ---------------------------------------------------------------- sections

FrequencyGridOptions read_sweep(const Reader& in, const Json& root) {
  FrequencyGridOptions sweep;
  const Json* node = Reader::find(root, "sweep");
  if (!node) return sweep;
  const std::string pointer = "/sweep";
  in.require_object(*node, pointer, "the sweep band");
  in.check_keys(*node, pointer, kSweepKeys, "the sweep");
  if (auto v = in.optional_quantity(*node, pointer, "start", "Hz")) sweep.start = *v;
  if (auto v = in.optional_quantity(*node, pointer, "stop", "Hz")) sweep.stop = *v;
  if (auto v = in.optional_integer(*node, pointer, "points_per_decade")) sweep.points_per_decade = *v;
  in.within(pointer, [&] { sweep.validate(); });
  return sweep;
}

// The mounting inductance of one copy, H (0 without a "mounting" object).
double read_mounting(const Reader& in, const Json& branch, const std::string& branch_pointer) {
  const Json* node = Reader::find(branch, "mounting");
  if (!node) return 0.0;
  const std::string pointer = child(branch_pointer, "mounting");
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

Element read_element(const Reader& in, const std::string& kind, const Json& b, const std::string& p) {
  if (kind == "capacitor") return read_capacitor(in, b, p);
  if (kind == "inductor" || kind == "bead") return read_inductor(in, b, p);
  if (kind == "resistor") return read_resistor(in, b, p);
  if (kind == "regulator") return read_regulator(in, b, p);
  QUIETRAIL_ASSERT(kind == "plane");
  return read_plane(in, b, p);
}

std::string kind_list() {
  Keys kinds;
  for (const auto& [kind, keys] : kKindKeys) kinds.push_back(kind);
  return join(kinds);
}

void read_branches(const Reader& in, const Json& root, const std::string& port_name, NetworkFile& out) {
  const Json* list = Reader::find(root, "branches");
  if (!list) in.fail("/branches", "a list of branches (a JSON array)", "nothing: the key is missing");
  if (!list->is_array() || list->empty())
    in.fail("/branches", "a non-empty list of branches (a JSON array)", describe(*list));

  std::map<std::string, std::size_t> names;
  for (std::size_t i = 0; i < list->size(); ++i) {
    const Json& b = (*list)[i];
    const std::string p = child("/branches", i);
    in.require_object(b, p, "a branch");
    const std::string kind = in.required_string(b, p, "kind", "a branch kind: " + kind_list());
    const auto kind_keys = kKindKeys.find(kind);
    if (kind_keys == kKindKeys.end())
      in.fail(child(p, "kind"), "a branch kind: " + kind_list(), "'" + kind + "'");
    Keys allowed = kBranchKeys;
    allowed.insert(allowed.end(), kind_keys->second.begin(), kind_keys->second.end());
    in.check_keys(b, p, allowed, "a " + kind + " branch");

    const std::string name = in.required_string(b, p, "name", "a branch name");
    if (const auto first = names.find(name); first != names.end())
      in.fail(child(p, "name"), "a branch name used once", "'" + name + "', also used by /branches/" +
                                                                std::to_string(first->second));
    names.emplace(name, i);

    (void)in.optional_string(b, p, "note", "a note");
    const std::string from = in.optional_string(b, p, "from", "a node name").value_or(port_name);
    const std::string to =
        in.optional_string(b, p, "to", "a node name").value_or(out.network.node_name(Network::kGround));
    if (from == to) in.fail(child(p, "to"), "a node other than \"from\" ('" + from + "')", "'" + to + "'");

    MountedPart part{read_element(in, kind, b, p)};
    part.mounting_inductance = read_mounting(in, b, p);
    if (auto count = in.optional_integer(b, p, "count")) part.count = *count;
    part.validate(in.file(), p);

    const NodeId from_id = out.network.node_or_add(from);
    const NodeId to_id = out.network.node_or_add(to);
    out.network.add_branch(name, from_id, to_id, std::move(part), in.file());
    out.branch_kinds.push_back(kind);
  }
}

NetworkFile read_document(const Reader& in, const Json& root) {
  in.require_object(root, "", "a network description");
  in.check_keys(root, "", kTopKeys, "a network file");

  NetworkFile out;
  out.name = in.required_string(root, "", "name", "the network's name");
  const std::string ground = in.optional_string(root, "", "ground", "the ground node's name").value_or("gnd");
  const std::string port = in.required_string(root, "", "port", "the node where the impedance is seen");
  if (port == ground) in.fail("/port", "a node other than the ground node '" + ground + "'", "'" + port + "'");
  (void)in.optional_string(root, "", "description", "a description");
  out.sweep = read_sweep(in, root);

  out.network = Network(ground);
  read_branches(in, root, port, out);

  const auto port_id = out.network.find_node(port);
  if (!port_id) {
    std::string nodes;
    for (const auto& node : out.network.node_names()) nodes.append(nodes.empty() ? "" : ", ").append(node);
    in.fail("/port", "the name of a node a branch connects to (nodes: " + nodes + ")", "'" + port + "'");
  }
  out.port = *port_id;
  check_topology(out.network, out.port, in.file());
  return out;
}

}  // namespace

NetworkFile parse_network_json(std::string_view text, const std::string& file) {
  const Reader in(file);
  DuplicateKeyWatch watch;
  Json root;
  try {
    root = Json::parse(text.begin(), text.end(), std::ref(watch));
  } catch (const Json::parse_error& e) {
    const auto [line, column] = line_and_column(text, e.byte);
    throw InputError({file, "", line, column}, "valid JSON", parser_reason(e.what()));
  } catch (const Json::exception& e) {
    throw InputError({file, ""}, "valid JSON", parser_reason(e.what()));
  }
  if (const auto& dup = watch.duplicate())
    in.fail(child(dup->first, dup->second), "each key once per object", "'" + dup->second + "' given twice");
  return read_document(in, root);
}

NetworkFile read_network_file(const std::filesystem::path& path) {
  const std::string file = path.string();
  std::error_code error;
  if (!std::filesystem::is_regular_file(path, error))
    throw InputError({file, ""}, "a readable network file (JSON)",
                     std::filesystem::exists(path, error) ? "not a regular file" : "no such file");
  std::ifstream stream(path, std::ios::binary);
  if (!stream) throw InputError({file, ""}, "a readable network file (JSON)", std::strerror(errno));
  std::ostringstream text;
  text << stream.rdbuf();
  if (stream.bad()) throw InputError({file, ""}, "a readable network file (JSON)", "a read error");
  return parse_network_json(text.str(), file);
}

}  // namespace quietrail
