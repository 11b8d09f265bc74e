// SPDX-License-Identifier: MIT
// Reading the JSON project file (schema in docs/project_file.md) and building the rail's
// Network from it: regulator, feed, plane, BOM (derated), load side; and the plan section's
// candidates, built as BOM lines are, for the PlanProblem.
#include "quietrail/io/project_file.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdint>
#include <limits>
#include <map>
#include <set>
#include <tuple>

#include "detail/checks.hpp"
#include "detail/text.hpp"
#include "io/element_json.hpp"
#include "io/json_support.hpp"
#include "quietrail/error.hpp"
#include "quietrail/io/bom_csv.hpp"
#include "quietrail/models/mounting.hpp"
#include "quietrail/network/topology.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

namespace fs = std::filesystem;
using detail::child;
using detail::describe;
using detail::Json;
using detail::JsonReader;
using detail::Keys;

// ---------------------------------------------------------------- schema tables

const Keys kTopKeys{"name",      "description", "rail", "target", "regulator", "plane",
                    "mounting",  "libraries",   "load", "view",   "bom",       "bom_csv",
                    "feed",      "plan"};
const Keys kRailKeys{"voltage", "ripple", "max_current", "step", "rise_time", "band", "temperature", "dc_voltage"};
const Keys kBandKeys{"start", "stop", "points_per_decade"};
const Keys kTargetKeys{"impedance", "segments", "points"};
const Keys kSegmentKeys{"start", "stop", "impedance", "impedance_at_start", "impedance_at_stop",
                        "slope_db_per_decade"};
const Keys kPointKeys{"frequency", "impedance"};
const Keys kLoadKeys{"package_inductance", "package_resistance", "die_capacitance", "die_resistance"};
const Keys kLineKeys{"part", "count", "mounting", "name"};
const Keys kFeedKeys{"part", "count", "mounting", "name", "supply_bom"};
const Keys kPlanKeys{"objective", "seed",         "alternatives", "node_limit", "candidates",
                     "voltage_margin", "max_per_part", "max_total", "max_area",   "keep", "impedance_margin"};
const Keys kCandidateKeys{"families", "packages", "dielectrics", "values", "parts", "exclude"};
const Keys kListedPartKeys{"part", "max_count"};
const Keys kFilterKeys{"families", "packages", "dielectrics", "values"};
// Keys of an inline part beyond the element keys of its kind.
const Keys kInlinePartKeys{"kind", "description", "package", "dielectric", "rated_voltage", "cost", "area",
                           "esl_includes_mounting"};

// Default lower band edge, Hz: the library's sweep default (frequency_grid.hpp), well below
// the crossover of switching regulators (tens of kHz and up; common practice).
constexpr double kDefaultBandStart = 1e3;
// Edge-rate rule for the upper band edge: f = 0.35 / t_r (Johnson & Graham 1993; common practice).
constexpr double kKneeFactor = 0.35;

std::string trim(std::string_view text) { return detail::trim_blanks(text); }
std::string lower(std::string_view text) { return detail::lower_ascii(text); }

// "3%" -> 3 (the number before a trailing '%'), std::nullopt when `text` has no '%'.
std::optional<double> percent_of(const JsonReader& in, const std::string& text, const std::string& pointer) {
  const std::string t = trim(text);
  if (t.empty() || t.back() != '%') return std::nullopt;
  return parse_value(trim(t.substr(0, t.size() - 1)), "", {in.file(), pointer});
}

// ---------------------------------------------------------------- reading state

struct Context {
  Context(const std::string& file, fs::path base_directory) : in(file), base(std::move(base_directory)) {}

  JsonReader in;
  fs::path base;
  PartLibrary library;
  std::map<std::string, double> mounting_by_package;  // lower-case package -> H
  DeratingConditions conditions;
  Project project;
  std::set<std::string> names;  // branch names in use
};

std::string unique_name(Context& c, const std::string& wanted) {
  std::string name = wanted;
  for (int k = 2; c.names.count(name) != 0; ++k) name = wanted + "_" + std::to_string(k);
  c.names.insert(name);
  return name;
}

BranchId add_branch(Context& c, const std::string& name, NodeId from, NodeId to, MountedPart part, BranchRole role,
                    BranchInfo info) {
  const BranchId id = c.project.network.add_branch(name, from, to, std::move(part), c.in.file());
  c.project.roles.push_back(role);
  c.project.branch_info.push_back(std::move(info));
  return id;
}

// ---------------------------------------------------------------- rail and band

// The ripple as a fraction of `voltage` (> 0, checked by the caller).
double read_ripple(Context& c, const Json& rail, double voltage) {
  const std::string p = "/rail/ripple";
  const Json* node = JsonReader::find(rail, "ripple");
  const std::string expected =
      "a ripple budget: a fraction such as 0.03, a percentage such as \"3%\" or a voltage such as \"25mV\"";
  if (!node) c.in.fail(p, expected, "nothing: the key is missing");
  double ripple = 0.0;
  if (node->is_number()) {
    ripple = node->get<double>();
    c.project.ripple_text = node->dump();
  } else if (node->is_string()) {
    const std::string text = node->get<std::string>();
    c.project.ripple_text = text;
    if (auto percent = percent_of(c.in, text, p)) {
      ripple = *percent / 100.0;
    } else {
      double volts = 0.0;
      try {
        volts = parse_value(text, "V", {c.in.file(), p});
      } catch (const InputError&) {
        c.in.fail(p, expected, detail::quoted(text));
      }
      ripple = volts / voltage;
    }
  } else {
    c.in.fail(p, expected, describe(*node));
  }
  if (!(std::isfinite(ripple) && ripple > 0.0 && ripple <= 1.0))
    c.in.fail(p, "a ripple above 0 and at most 100 % of the rail voltage",
              detail::quoted(c.project.ripple_text) + " (" + format_value(ripple * 100.0, "", 4) + " %)");
  return ripple;
}

void read_step(Context& c, const Json& rail, RailSpec& spec) {
  const Json* node = JsonReader::find(rail, "step");
  const std::string p = "/rail/step";
  if (!node) {
    c.project.notes.push_back("Current step " + format_value(spec.step_fraction * spec.max_current, "A") +
                              ": 50 % of the maximum current, the assumption of Smith et al. 1999.");
    return;
  }
  if (node->is_string()) {
    if (auto percent = percent_of(c.in, node->get<std::string>(), p)) {
      if (!(std::isfinite(*percent) && *percent > 0.0 && *percent <= 100.0))
        c.in.fail(p, "a step above 0 and at most 100 % of the maximum current", detail::quoted(node->get<std::string>()));
      spec.step_fraction = *percent / 100.0;
      return;
    }
  }
  spec.current_step = c.in.quantity(*node, p, "A");
}

double read_temperature(Context& c, const Json& rail) {
  const Json* node = JsonReader::find(rail, "temperature");
  const std::string p = "/rail/temperature";
  if (!node) {
    c.project.notes.push_back("Temperature 25 C: the reference temperature of nominal capacitance (default).");
    return 25.0;
  }
  if (node->is_number()) return node->get<double>();
  if (!node->is_string()) c.in.fail(p, "a temperature in degrees C such as 60 or \"60C\"", describe(*node));
  std::string text = trim(node->get<std::string>());
  for (const std::string_view suffix : {"\xC2\xB0" "C", "degC", "C"}) {
    if (text.size() > suffix.size() && text.compare(text.size() - suffix.size(), suffix.size(), suffix) == 0) {
      text = trim(text.substr(0, text.size() - suffix.size()));
      break;
    }
  }
  try {
    return parse_value(text, "", {c.in.file(), p});
  } catch (const InputError&) {
    c.in.fail(p, "a temperature in degrees C such as 60 or \"60C\"", detail::quoted(node->get<std::string>()));
  }
}

void read_rail(Context& c, const Json& root) {
  const Json* node = JsonReader::find(root, "rail");
  if (!node) c.in.fail("/rail", "the rail (an object with voltage, ripple, max_current, ...)", "nothing: the key is missing");
  const std::string p = "/rail";
  c.in.require_object(*node, p, "the rail");
  c.in.check_keys(*node, p, kRailKeys, "the rail");

  RailSpec& spec = c.project.rail;
  spec.voltage = c.in.required_quantity(*node, p, "voltage", "V");
  detail::require_positive(spec.voltage, c.in.file(), "/rail/voltage", "V");
  spec.ripple = read_ripple(c, *node, spec.voltage);
  spec.max_current = c.in.required_quantity(*node, p, "max_current", "A");
  detail::require_positive(spec.max_current, c.in.file(), "/rail/max_current", "A");
  read_step(c, *node, spec);
  spec.rise_time = c.in.optional_quantity(*node, p, "rise_time", "s");
  spec.temperature_c = read_temperature(c, *node);
  spec.validate(c.in.file(), p);

  c.project.dc_voltage = c.in.optional_quantity(*node, p, "dc_voltage", "V").value_or(spec.voltage);
  detail::require_finite(c.project.dc_voltage, c.in.file(), "/rail/dc_voltage", "V");
  c.conditions = DeratingConditions{.dc_voltage = c.project.dc_voltage, .temperature_c = spec.temperature_c};

  // The band.
  FrequencyGridOptions& band = c.project.band;
  band.start = kDefaultBandStart;
  const Json* b = JsonReader::find(*node, "band");
  const std::string bp = "/rail/band";
  std::optional<double> stop;
  if (b) {
    c.in.require_object(*b, bp, "the band of interest");
    c.in.check_keys(*b, bp, kBandKeys, "the band");
    if (auto v = c.in.optional_quantity(*b, bp, "start", "Hz")) band.start = *v;
    stop = c.in.optional_quantity(*b, bp, "stop", "Hz");
    if (auto v = c.in.optional_integer(*b, bp, "points_per_decade")) band.points_per_decade = *v;
  }
  if (!b || !JsonReader::find(*b, "start"))
    c.project.notes.push_back("Band start " + format_value(band.start, "Hz") + ": the default lower edge.");
  if (stop) {
    band.stop = *stop;
  } else if (spec.rise_time) {
    band.stop = kKneeFactor / *spec.rise_time;
    c.project.band_stop_from_rise_time = true;
    c.project.notes.push_back("Band stop " + format_value(band.stop, "Hz") + " = 0.35 / rise time " +
                              format_value(*spec.rise_time, "s") + " (common practice; Johnson & Graham 1993).");
  } else {
    c.in.fail(bp + "/stop", "an upper band edge (\"band\": {\"stop\": ...}) or a \"rise_time\" to derive it from",
              "neither");
  }
  if (std::isfinite(band.start) && std::isfinite(band.stop) && band.stop <= band.start)
    c.in.fail(bp + "/stop", "a stop frequency above the start (" + format_value(band.start, "Hz") + ")",
              format_value(band.stop, "Hz") + (c.project.band_stop_from_rise_time ? " (from the rise time)" : ""));
  c.in.within(bp, [&] { band.validate(); });
}

// ---------------------------------------------------------------- target

TargetImpedance read_target(Context& c, const Json& root) {
  const Json* node = JsonReader::find(root, "target");
  const std::string& file = c.in.file();
  if (!node) {
    TargetImpedance t = TargetImpedance::from_rail(c.project.rail, file, "/rail");
    c.project.notes.push_back("Target " + format_value(t.minimum(), "ohm") +
                              " flat = V * ripple / step (Smith et al. 1999).");
    return t;
  }
  const std::string p = "/target";
  if (node->is_number() || node->is_string()) return TargetImpedance::flat(c.in.quantity(*node, p, "ohm"), file, p);
  c.in.require_object(*node, p, "a target: an impedance, {\"impedance\": ...}, {\"segments\": [...]} or {\"points\": [...]}");
  c.in.check_keys(*node, p, kTargetKeys, "the target");
  if (node->size() != 1)
    c.in.fail(p, "exactly one of \"impedance\", \"segments\" or \"points\"", std::to_string(node->size()) + " of them");
  if (const Json* v = JsonReader::find(*node, "impedance"))
    return TargetImpedance::flat(c.in.quantity(*v, p + "/impedance", "ohm"), file, p + "/impedance");

  if (const Json* list = JsonReader::find(*node, "segments")) {
    const std::string lp = p + "/segments";
    c.in.require_array(*list, lp, "a list of segments");
    std::vector<TargetSegment> segments;
    for (std::size_t i = 0; i < list->size(); ++i) {
      const Json& s = (*list)[i];
      const std::string sp = child(lp, i);
      c.in.require_object(s, sp, "a segment {start, stop, impedance}");
      c.in.check_keys(s, sp, kSegmentKeys, "a segment");
      const double start = c.in.required_quantity(s, sp, "start", "Hz");
      const double stop = c.in.required_quantity(s, sp, "stop", "Hz");
      const auto flat = c.in.optional_quantity(s, sp, "impedance", "ohm");
      const auto at_start = c.in.optional_quantity(s, sp, "impedance_at_start", "ohm");
      const auto at_stop = c.in.optional_quantity(s, sp, "impedance_at_stop", "ohm");
      const auto slope = c.in.optional_quantity(s, sp, "slope_db_per_decade", "");
      const std::string forms =
          "either \"impedance\" (flat), or \"impedance_at_start\" with \"impedance_at_stop\" or "
          "\"slope_db_per_decade\"";
      if (flat) {
        if (at_start || at_stop || slope) c.in.fail(sp, forms, "both forms");
        segments.push_back(TargetSegment{start, stop, *flat, *flat});
      } else if (at_start && (at_stop.has_value() != slope.has_value())) {
        if (at_stop) {
          segments.push_back(TargetSegment{start, stop, *at_start, *at_stop});
        } else {
          for (const auto& [value, key] : {std::pair{start, "start"}, std::pair{stop, "stop"}})
            detail::require_positive(value, file, child(sp, key), "Hz");
          detail::require_positive(*at_start, file, child(sp, "impedance_at_start"), "ohm");
          segments.push_back(TargetSegment::sloped(start, stop, *at_start, *slope));
        }
      } else {
        c.in.fail(sp, forms, "neither");
      }
    }
    if (segments.empty()) c.in.fail(lp, "at least one segment", "an empty list");
    TargetImpedance t = TargetImpedance::from_segments(std::move(segments), file, lp);
    t.cover_band(c.project.band.start, c.project.band.stop, file, lp);
    return t;
  }

  const Json* list = JsonReader::find(*node, "points");
  QUIETRAIL_ASSERT(list != nullptr);
  const std::string lp = p + "/points";
  c.in.require_array(*list, lp, "a list of [frequency, impedance] pairs");
  std::vector<TargetPoint> points;
  for (std::size_t i = 0; i < list->size(); ++i) {
    const Json& pt = (*list)[i];
    const std::string pp = child(lp, i);
    if (pt.is_array() && pt.size() == 2) {
      points.push_back({c.in.quantity(pt[0], child(pp, std::size_t{0}), "Hz"),
                        c.in.quantity(pt[1], child(pp, std::size_t{1}), "ohm")});
    } else if (pt.is_object()) {
      c.in.check_keys(pt, pp, kPointKeys, "a target point");
      points.push_back({c.in.required_quantity(pt, pp, "frequency", "Hz"),
                        c.in.required_quantity(pt, pp, "impedance", "ohm")});
    } else {
      c.in.fail(pp, "a [frequency, impedance] pair such as [\"10MHz\", \"5m\"]", describe(pt));
    }
  }
  return TargetImpedance::from_points(std::move(points), file, lp);
}

// ---------------------------------------------------------------- libraries and mounting

void read_libraries(Context& c, const Json& root) {
  const Json* list = JsonReader::find(root, "libraries");
  if (!list) return;
  c.in.require_array(*list, "/libraries", "a list of part library files");
  std::vector<fs::path> paths;
  for (std::size_t i = 0; i < list->size(); ++i) {
    const fs::path path = c.in.string((*list)[i], child("/libraries", i), "a library file path");
    const fs::path resolved = path.is_absolute() ? path : c.base / path;
    paths.push_back(resolved.lexically_normal());
  }
  for (const auto& path : paths) {
    c.library.add_file(path);
    c.project.libraries.push_back(path.string());
  }
}

void read_mounting_defaults(Context& c, const Json& root) {
  const Json* node = JsonReader::find(root, "mounting");
  if (!node) return;
  c.in.require_object(*node, "/mounting", "mounting inductance per package, e.g. {\"0402\": \"0.35n\"}");
  for (const auto& item : node->items()) {
    const std::string p = child("/mounting", item.key());
    const double value = c.in.quantity(item.value(), p, "H");
    require_input(std::isfinite(value) && value >= 0.0, {c.in.file(), p}, "a mounting inductance >= 0 H",
                  format_value(value, "H"));
    c.mounting_by_package[lower(item.key())] = value;
  }
}

// The project's mounting default for a package: exact (case-insensitive) key, or the same
// MLCC code written differently.
std::optional<double> project_mounting(const Context& c, const std::string& package) {
  if (package.empty()) return std::nullopt;
  if (const auto it = c.mounting_by_package.find(lower(package)); it != c.mounting_by_package.end()) return it->second;
  if (const auto code = parse_package(package))
    for (const auto& [key, value] : c.mounting_by_package)
      if (parse_package(key) == code) return value;
  return std::nullopt;
}

// ---------------------------------------------------------------- parts

std::string value_text(const LibraryPart& part) {
  return std::visit(
      [](const auto& e) -> std::string {
        using T = std::decay_t<decltype(e)>;
        if constexpr (std::is_same_v<T, Capacitor>) return format_value(e.capacitance, "F");
        else if constexpr (std::is_same_v<T, Inductor>) return format_value(e.inductance, "H");
        else return "-";
      },
      part.nominal);
}

LibraryPart read_inline_part(Context& c, const Json& node, const std::string& p) {
  c.in.require_object(node, p, "an inline part");
  const std::string kind_text = c.in.required_string(node, p, "kind", "a part kind: capacitor, inductor or bead");
  const auto kind = parse_part_kind(kind_text);
  if (!kind) c.in.fail(child(p, "kind"), "a part kind: capacitor, inductor or bead", detail::quoted(kind_text));
  Keys allowed = kInlinePartKeys;
  const Keys* element = detail::element_keys(kind_text);
  QUIETRAIL_ASSERT(element != nullptr);
  allowed.insert(allowed.end(), element->begin(), element->end());
  c.in.check_keys(node, p, allowed, "an inline " + kind_text + " part");

  LibraryPart part;
  part.family = "inline";
  part.kind = *kind;
  part.nominal = detail::read_element(c.in, kind_text, node, p);
  validate_element(part.nominal, c.in.file(), p);
  part.package = c.in.optional_string(node, p, "package", "a package such as \"0402\"").value_or("");
  part.mlcc_package = parse_package(part.package);
  if (auto d = c.in.optional_string(node, p, "dielectric", "a dielectric such as \"X7R\"")) {
    const auto parsed = parse_dielectric(*d);
    if (!parsed) c.in.fail(child(p, "dielectric"), "a dielectric such as X7R, X5R, C0G or polymer_aluminium", detail::quoted(*d));
    if (*kind != PartKind::capacitor) c.in.fail(child(p, "dielectric"), "no dielectric for a " + kind_text, detail::quoted(*d));
    part.dielectric = *parsed;
    part.temperature_class = temperature_class(*parsed);
  }
  if (auto v = c.in.optional_quantity(node, p, "rated_voltage", "V")) {
    detail::require_positive(*v, c.in.file(), child(p, "rated_voltage"), "V");
    part.rated_voltage = *v;
  }
  if (auto v = c.in.optional_quantity(node, p, "cost", "")) {
    detail::require_non_negative(*v, c.in.file(), child(p, "cost"), "");
    part.cost = *v;
  }
  if (const Json* a = JsonReader::find(node, "area")) {
    part.area = c.in.area(*a, child(p, "area"));
    detail::require_non_negative(part.area, c.in.file(), child(p, "area"), "m^2");
  }
  if (const Json* b = JsonReader::find(node, "esl_includes_mounting")) {
    if (!b->is_boolean()) c.in.fail(child(p, "esl_includes_mounting"), "true or false", describe(*b));
    part.esl_includes_mounting = b->get<bool>();
  }
  part.description = c.in.optional_string(node, p, "description", "a description").value_or("");
  if (part.description.empty()) {
    part.description = "inline " + kind_text + " " + value_text(part);
    if (!part.package.empty()) part.description += " " + part.package;
    if (part.dielectric != Dielectric::none) part.description += " " + std::string(to_string(part.dielectric));
  }
  return part;
}

// The library part with `id`; an unknown id is an error at `pointer` with the nearest ids.
const LibraryPart& library_part(const Context& c, const std::string& id, const std::string& pointer) {
  if (const LibraryPart* part = c.library.find(id)) return *part;
  std::string found = detail::quoted(id);
  if (c.library.parts().empty()) {
    found += "; no part library is loaded (give \"libraries\")";
  } else {
    std::string near;
    for (const auto& n : c.library.nearest(id)) near.append(near.empty() ? "" : ", ").append(n);
    found += "; nearest: " + near;
  }
  c.in.fail(pointer, "a part id of the loaded libraries", found);
}

// The part a line names: a library id or an inline object. `inline_part` is set for inline.
LibraryPart read_part_reference(Context& c, const Json& line, const std::string& p, bool& is_inline) {
  const Json* node = JsonReader::find(line, "part");
  const std::string pp = child(p, "part");
  if (!node) c.in.fail(pp, "a part: a library id such as \"mlcc-0402-x7r-100n-16v\" or an inline part object",
                       "nothing: the key is missing");
  if (node->is_object()) {
    is_inline = true;
    return read_inline_part(c, *node, pp);
  }
  is_inline = false;
  const std::string id = c.in.string(*node, pp, "a part id or an inline part object");
  return library_part(c, id, pp);
}

struct LineSettings {
  std::string name;          // given on the line: must be unused
  std::string default_name;  // derived: made unique with a suffix
  int count = 1;
  std::optional<double> mounting;  // override, H
  std::string source;
};

LineSettings read_line_settings(Context& c, const Json& line, const std::string& p) {
  LineSettings s;
  s.source = p;
  s.name = c.in.optional_string(line, p, "name", "a branch name").value_or("");
  if (auto count = c.in.optional_integer(line, p, "count")) {
    if (*count < 1) c.in.fail(child(p, "count"), "a count of at least 1", std::to_string(*count));
    s.count = *count;
  }
  if (const Json* m = JsonReader::find(line, "mounting")) {
    const std::string mp = child(p, "mounting");
    if (m->is_object()) {
      s.mounting = detail::read_mounting_inductance(c.in, *m, mp);
    } else {
      const double value = c.in.quantity(*m, mp, "H");
      require_input(std::isfinite(value) && value >= 0.0, {c.in.file(), mp}, "a mounting inductance >= 0 H",
                    format_value(value, "H"));
      s.mounting = value;
    }
  }
  return s;
}

// The mounting inductance of one copy of `part` and where it came from, by the rules of
// docs/project_file.md ("mounting"): the line's override, else the project's value for the
// package, else what the library says or the typical value for the package. A series feed
// element (`shunt` false) sits in the current path, not in a mounted loop to the planes, so
// it gets no default mounting. `found` is false when no rule applies (the caller warns).
// BOM lines and plan candidates both come through here, so a candidate is mounted exactly
// as the same part on a BOM line would be.
struct Mounting {
  double inductance = 0.0;
  std::string source;
  bool found = true;
};

Mounting choose_mounting(const Context& c, const LibraryPart& part, const std::optional<double>& line_override,
                         bool shunt) {
  if (line_override) return {*line_override, "line override"};
  if (!shunt) return {0.0, "none (series element)"};
  if (part.esl_includes_mounting) return {0.0, "included in the part's ESL (mounted value)"};
  if (const auto value = project_mounting(c, part.package)) return {*value, "project mounting for " + part.package};
  if (part.mlcc_package)
    return {typical_mounting_inductance(*part.mlcc_package),
            "typical for " + std::string(to_string(*part.mlcc_package)) + " (from memory)"};
  return {0.0, "none given", false};
}

// A caution when the rail's temperature is outside the capacitor's dielectric rating.
std::optional<std::string> temperature_caution(const Context& c, const LibraryPart& part, const std::string& name) {
  if (part.kind != PartKind::capacitor || part.dielectric == Dielectric::none) return std::nullopt;
  const TemperatureRange range = rated_temperature_range(part.dielectric);
  const double t = c.conditions.temperature_c;
  if (t >= range.low_c && t <= range.high_c) return std::nullopt;
  return name + " (" + std::string(to_string(part.dielectric)) + ") is rated " + format_value(range.low_c, "") + " to " +
         format_value(range.high_c, "") + " C; the rail runs at " + format_value(t, "") + " C.";
}

PlacedPart place_part(Context& c, const LibraryPart& part, bool is_inline, const LineSettings& s, BranchRole role,
                      NodeId from, NodeId to) {
  PlacedPart placed;
  placed.source = s.source;
  placed.library_id = is_inline ? std::string() : part.id;
  placed.kind = part.kind;
  placed.description = part.description.empty() ? part.id : part.description;
  placed.package = part.package;
  placed.dielectric = part.dielectric;
  placed.rated_voltage = part.rated_voltage;
  placed.count = s.count;
  placed.nominal = part.nominal;
  placed.effective = effective_part(part, c.conditions);
  if (part.kind == PartKind::capacitor) {
    placed.nominal_capacitance = std::get<Capacitor>(part.nominal).capacitance;
    placed.effective_capacitance = std::get<Capacitor>(placed.effective).capacitance;
  }
  if (part.cost > 0.0) placed.cost = part.cost;
  if (part.area > 0.0) placed.area = part.area;

  const Mounting mounting = choose_mounting(c, part, s.mounting, role != BranchRole::feed);
  placed.mounting_inductance = mounting.inductance;
  placed.mounting_source = mounting.source;
  if (!mounting.found)
    c.project.warnings.push_back(s.source + ": no mounting inductance for package " +
                                 detail::quoted(part.package.empty() ? "unknown" : part.package) +
                                 "; give \"mounting\" on the line or in the project.");

  // Name: the line's, else the derived one, else the library id (or the kind for an
  // inline part).
  if (!s.name.empty()) {
    if (c.names.count(s.name) != 0)
      c.in.fail(child(s.source, "name"), "a branch name used once", detail::quoted(s.name) + " is already taken");
    c.names.insert(s.name);
    placed.name = s.name;
  } else if (!s.default_name.empty()) {
    placed.name = unique_name(c, s.default_name);
  } else {
    placed.name = unique_name(c, is_inline ? "inline_" + std::string(to_string(part.kind)) : part.id);
  }

  // Cautions a designer must see, though the network is still valid.
  if (part.kind == PartKind::capacitor && part.rated_voltage > 0.0 && part.rated_voltage < std::abs(c.project.dc_voltage))
    c.project.warnings.push_back(placed.name + " is rated " + format_value(part.rated_voltage, "V") +
                                 ", below the rail's DC voltage of " + format_value(c.project.dc_voltage, "V") + ".");
  if (auto caution = temperature_caution(c, part, placed.name)) c.project.warnings.push_back(std::move(*caution));

  MountedPart mounted{placed.effective, placed.mounting_inductance, placed.count};
  mounted.validate(c.in.file(), s.source);
  BranchInfo info{.library_id = placed.library_id,
                  .description = placed.description,
                  .nominal_capacitance = placed.nominal_capacitance,
                  .cost = placed.cost,
                  .area = placed.area};
  placed.branch = add_branch(c, placed.name, from, to, std::move(mounted), role, std::move(info));
  return placed;
}

void read_lines(Context& c, const Json& list, const std::string& p, BranchRole role, NodeId node) {
  c.in.require_array(list, p, "a list of BOM lines");
  for (std::size_t i = 0; i < list.size(); ++i) {
    const Json& line = list[i];
    const std::string lp = child(p, i);
    c.in.require_object(line, lp, "a BOM line {\"part\": ..., \"count\": ...}");
    c.in.check_keys(line, lp, kLineKeys, "a BOM line");
    bool is_inline = false;
    const LibraryPart part = read_part_reference(c, line, lp, is_inline);
    const LineSettings settings = read_line_settings(c, line, lp);
    c.project.parts.push_back(place_part(c, part, is_inline, settings, role, node, Network::kGround));
  }
}

void read_bom_csv_lines(Context& c, const Json& root) {
  const Json* node = JsonReader::find(root, "bom_csv");
  if (!node) return;
  const fs::path path = c.in.string(*node, "/bom_csv", "a BOM CSV file path");
  const fs::path resolved = (path.is_absolute() ? path : c.base / path).lexically_normal();
  c.project.bom_csv = resolved.string();
  const auto lines =
      read_bom_csv(resolved, c.library, BomCsvOptions{.default_min_voltage = std::abs(c.project.dc_voltage)});
  for (const auto& line : lines) {
    const LibraryPart* part = c.library.find(line.part_id);
    QUIETRAIL_ASSERT(part != nullptr);
    LineSettings s;
    s.source = resolved.string() + ":" + std::to_string(line.line);
    s.count = line.count;
    // Named by its designators ("C1..C8"), else by the part id.
    if (!line.designator_list.empty()) {
      s.default_name = line.designator_list.front();
      if (line.designator_list.size() > 1) s.default_name += ".." + line.designator_list.back();
    }
    c.project.parts.push_back(place_part(c, *part, false, s, BranchRole::bom, c.project.board, Network::kGround));
  }
}

// ---------------------------------------------------------------- the network

void read_regulator(Context& c, const Json& root, NodeId node) {
  const Json* r = JsonReader::find(root, "regulator");
  const std::string p = "/regulator";
  if (!r)
    c.in.fail(p, "the regulator: {\"resistance\": ..., \"inductance\": ...} or {\"resistance\", \"flat_impedance\", \"bandwidth\"}",
              "nothing: the key is missing");
  c.in.require_object(*r, p, "the regulator");
  c.in.check_keys(*r, p, *detail::element_keys("regulator"), "the regulator");
  MountedPart part{detail::read_element(c.in, "regulator", *r, p)};
  part.validate(c.in.file(), p);
  add_branch(c, unique_name(c, "regulator"), node, Network::kGround, std::move(part), BranchRole::regulator, {});
}

void read_plane(Context& c, const Json& root) {
  const Json* n = JsonReader::find(root, "plane");
  if (!n) return;
  const std::string p = "/plane";
  c.in.require_object(*n, p, "the plane pair");
  c.in.check_keys(*n, p, *detail::element_keys("plane"), "the plane pair");
  MountedPart part{detail::read_element(c.in, "plane", *n, p)};
  part.validate(c.in.file(), p);
  const double capacitance = std::get<PlanePair>(part.element).capacitance();
  BranchInfo info;
  info.description = "plane pair";
  info.nominal_capacitance = capacitance;
  add_branch(c, unique_name(c, "plane"), c.project.board, Network::kGround, std::move(part), BranchRole::plane,
             std::move(info));
}

void read_feed(Context& c, const Json& root) {
  const Json* f = JsonReader::find(root, "feed");
  if (!f) return;
  const std::string p = "/feed";
  c.in.require_object(*f, p, "the feed {\"part\": ..., \"supply_bom\": [...]}");
  c.in.check_keys(*f, p, kFeedKeys, "the feed");
  bool is_inline = false;
  const LibraryPart part = read_part_reference(c, *f, p, is_inline);
  if (part.kind == PartKind::capacitor)
    c.in.fail(child(p, "part"), "a series part: a bead or an inductor", "a capacitor");
  LineSettings s = read_line_settings(c, *f, p);
  s.default_name = "feed";
  c.project.parts.push_back(place_part(c, part, is_inline, s, BranchRole::feed, *c.project.supply, c.project.board));
  if (const Json* supply = JsonReader::find(*f, "supply_bom"))
    read_lines(c, *supply, child(p, "supply_bom"), BranchRole::supply, *c.project.supply);
}

// Facts of a load-side branch: not a board part, so it adds neither cost nor board area.
BranchInfo info_with(std::string description, std::optional<double> nominal_capacitance) {
  BranchInfo info;
  info.description = std::move(description);
  info.nominal_capacitance = nominal_capacitance;
  info.cost = 0.0;
  info.area = 0.0;
  return info;
}

void read_load(Context& c, const Json& root) {
  const Json* n = JsonReader::find(root, "load");
  if (!n) return;
  const std::string p = "/load";
  c.in.require_object(*n, p, "the load side");
  c.in.check_keys(*n, p, kLoadKeys, "the load side");
  LoadSide load;
  load.package_inductance = c.in.optional_quantity(*n, p, "package_inductance", "H").value_or(0.0);
  load.package_resistance = c.in.optional_quantity(*n, p, "package_resistance", "ohm").value_or(0.0);
  load.die_capacitance = c.in.required_quantity(*n, p, "die_capacitance", "F");
  load.die_resistance = c.in.optional_quantity(*n, p, "die_resistance", "ohm").value_or(0.0);
  const std::string& file = c.in.file();
  detail::require_non_negative(load.package_inductance, file, p + "/package_inductance", "H");
  detail::require_non_negative(load.package_resistance, file, p + "/package_resistance", "ohm");
  detail::require_positive(load.die_capacitance, file, p + "/die_capacitance", "F");
  detail::require_non_negative(load.die_resistance, file, p + "/die_resistance", "ohm");
  require_input(load.package_inductance > 0.0 || load.package_resistance > 0.0, {file, p + "/package_inductance"},
                "a package inductance or resistance above 0 (the package is the path to the die)", "both 0");

  Project& project = c.project;
  project.die = project.network.add_node("die");
  add_branch(c, unique_name(c, "package"), project.board, *project.die,
             MountedPart{Resistor{.resistance = load.package_resistance, .series_inductance = load.package_inductance}},
             BranchRole::package, info_with("package series R + L", std::nullopt));
  add_branch(c, unique_name(c, "die_capacitance"), *project.die, Network::kGround,
             MountedPart{Capacitor{.capacitance = load.die_capacitance, .esr = load.die_resistance}}, BranchRole::die,
             info_with("on-die capacitance", load.die_capacitance));
  project.load = load;
}

// ---------------------------------------------------------------- plan section

// Nominal values within this fraction name the same part: the BOM CSV resolution's
// tolerance (BomCsvOptions::value_tolerance; E-series values written with 2-3 digits).
constexpr double kValueTolerance = 0.005;
// A rating equal to voltage_margin * dc_voltage in decimal must not fail by rounding
// (1.1 * 1.5 is 1.6500000000000001 in binary).
constexpr double kRatingSlack = 1e-9;
// The default voltage margin: 1.5x rail voltage for ceramic and polymer parts on
// low-voltage rails (common practice; a reliability margin, DC bias is modelled apart).
constexpr double kDefaultVoltageMargin = 1.5;
// Most copies of one candidate by default (our choice: more than a board area normally
// holds of one value, few enough to keep the search small).
constexpr int kDefaultMaxPerPart = 50;
constexpr int kMaxAlternatives = 50;

// Totals of the parts at the board node (BOM lines and kept lines).
struct FixedTotals {
  double cost = 0.0;
  double area = 0.0;
  int count = 0;
};

FixedTotals fixed_totals(const Project& project) {
  FixedTotals t;
  for (const auto& part : project.parts) {
    if (project.roles[static_cast<std::size_t>(part.branch)] != BranchRole::bom) continue;
    t.cost += part.cost.value_or(0.0) * part.count;
    t.area += part.area.value_or(0.0) * part.count;
    t.count += part.count;
  }
  return t;
}

// "1 candidate", "3 candidates".
std::string counted(std::size_t n, const std::string& noun) {
  return std::to_string(n) + " " + noun + (n == 1 ? "" : "s");
}

std::string mm2(double area) { return format_value(area * 1e6, "", 4) + " mm^2"; }

std::string joined(const std::vector<std::string>& items) {
  std::string out;
  for (const auto& item : items) out.append(out.empty() ? "" : ", ").append(item);
  return out;
}

// A whole number in [low, high] (for counts wider than int: seed, node limit).
std::uint64_t read_whole(const Context& c, const Json& value, const std::string& p, std::uint64_t low,
                         std::uint64_t high) {
  const std::string expected = "a whole number from " + std::to_string(low) + " to " + std::to_string(high);
  // nlohmann holds a non-negative JSON integer as unsigned; negatives and fractions fail here.
  if (!value.is_number_unsigned()) c.in.fail(p, expected, describe(value));
  const auto v = value.get<std::uint64_t>();
  if (v < low || v > high) c.in.fail(p, expected, describe(value));
  return v;
}

// An optional int in [low, high].
std::optional<int> read_bounded(const Context& c, const Json& object, const std::string& p, std::string_view key,
                                int low, int high) {
  const auto v = c.in.optional_integer(object, p, key);
  if (v && (*v < low || *v > high)) {
    const std::string range = high == std::numeric_limits<int>::max()
                                  ? "a whole number >= " + std::to_string(low)
                                  : "a whole number from " + std::to_string(low) + " to " + std::to_string(high);
    c.in.fail(child(p, key), range, std::to_string(*v));
  }
  return v;
}

// A list of non-empty strings.
std::vector<std::string> read_strings(const Context& c, const Json& list, const std::string& p,
                                      const std::string& what) {
  c.in.require_array(list, p, "a list of " + what);
  std::vector<std::string> out;
  for (std::size_t i = 0; i < list.size(); ++i) out.push_back(c.in.string(list[i], child(p, i), what));
  return out;
}

// The distinct strings `key` gives over `parts`, in order.
template <class Key>
std::vector<std::string> distinct(const std::vector<const LibraryPart*>& parts, Key key) {
  std::vector<std::string> out;
  for (const LibraryPart* part : parts) {
    std::string k = key(*part);
    if (std::find(out.begin(), out.end(), k) == out.end()) out.push_back(std::move(k));
  }
  return out;
}

bool same_value(const LibraryPart& part, double value) {
  return std::abs(matching_value(part) - value) <= kValueTolerance * value;
}

// Keeps the parts of `pool` for which `keep` holds; returns how many are left.
template <class Keep>
std::size_t narrow(std::vector<const LibraryPart*>& pool, Keep keep) {
  pool.erase(std::remove_if(pool.begin(), pool.end(), [&](const LibraryPart* p) { return !keep(*p); }), pool.end());
  return pool.size();
}

// One part given in "parts": where, and its max_count.
struct ListedPart {
  const LibraryPart* part = nullptr;
  std::string source;
  int max_count = 0;
};

// The filters of "candidates" applied to the libraries' capacitors, each entry checked to
// select something (a typo must not silently empty the set), then the voltage rule and the
// rating dedupe. Returns the chosen parts in library order; notes say what each step left.
std::vector<const LibraryPart*> filtered_candidates(const Context& c, const Json* node, double min_rating,
                                                    const std::vector<const LibraryPart*>& excluded,
                                                    std::vector<std::string>& notes, std::string& summary) {
  const std::string p = "/plan/candidates";
  std::vector<const LibraryPart*> capacitors;
  for (const auto& part : c.library.parts())
    if (part.kind == PartKind::capacitor) capacitors.push_back(&part);
  // "parts" alone means those parts: selecting every capacitor beside them would surprise.
  if (node && JsonReader::find(*node, "parts") &&
      std::none_of(kFilterKeys.begin(), kFilterKeys.end(), [&](std::string_view k) { return JsonReader::find(*node, k); })) {
    summary = "only listed parts were asked for, and the list is empty";
    notes.push_back("Candidates: the listed parts only (no filter given).");
    return {};
  }
  std::vector<const LibraryPart*> pool = capacitors;
  std::vector<std::string> steps{std::to_string(pool.size()) + " capacitors in the libraries"};

  if (node) {
    if (const Json* list = JsonReader::find(*node, "families")) {
      const std::string lp = child(p, "families");
      const auto families = read_strings(c, *list, lp, "a library family such as \"mlcc\"");
      const auto known = distinct(capacitors, [](const LibraryPart& part) { return part.family; });
      std::vector<std::string> wanted;
      for (std::size_t i = 0; i < families.size(); ++i) {
        const auto it = std::find_if(known.begin(), known.end(),
                                     [&](const std::string& k) { return lower(k) == lower(families[i]); });
        if (it == known.end())
          c.in.fail(child(lp, i), "a family with capacitors in the loaded libraries: " + joined(known),
                    detail::quoted(families[i]));
        wanted.push_back(*it);
      }
      const auto n = narrow(pool, [&](const LibraryPart& part) {
        return std::find(wanted.begin(), wanted.end(), part.family) != wanted.end();
      });
      steps.push_back(std::to_string(n) + " in the families " + joined(families));
    }
    if (const Json* list = JsonReader::find(*node, "packages")) {
      const std::string lp = child(p, "packages");
      const auto packages = read_strings(c, *list, lp, "a package such as \"0402\"");
      std::set<const LibraryPart*> selected;
      for (std::size_t i = 0; i < packages.size(); ++i) {
        // PartLibrary::candidates compares packages as every part look-up does:
        // case-insensitive, MLCC codes in any spelling. Values are not filtered there.
        const auto found = c.library.candidates(PartQuery{.value = 1.0, .package = packages[i]});
        if (found.empty())
          c.in.fail(child(lp, i),
                    "a package of the loaded capacitors: " +
                        joined(distinct(capacitors, [](const LibraryPart& part) { return part.package; })),
                    detail::quoted(packages[i]));
        selected.insert(found.begin(), found.end());
      }
      const auto n = narrow(pool, [&](const LibraryPart& part) { return selected.count(&part) != 0; });
      steps.push_back(std::to_string(n) + " in the packages " + joined(packages));
    }
    if (const Json* list = JsonReader::find(*node, "dielectrics")) {
      const std::string lp = child(p, "dielectrics");
      const auto texts = read_strings(c, *list, lp, "a dielectric such as \"X7R\"");
      const auto present = distinct(capacitors, [](const LibraryPart& part) { return std::string(to_string(part.dielectric)); });
      std::vector<Dielectric> wanted;
      for (std::size_t i = 0; i < texts.size(); ++i) {
        const auto d = parse_dielectric(texts[i]);
        if (!d || std::find(present.begin(), present.end(), to_string(*d)) == present.end())
          c.in.fail(child(lp, i), "a dielectric of the loaded capacitors: " + joined(present), detail::quoted(texts[i]));
        wanted.push_back(*d);
      }
      // Parts without a dielectric have nothing to filter on and pass.
      const auto n = narrow(pool, [&](const LibraryPart& part) {
        return part.dielectric == Dielectric::none ||
               std::find(wanted.begin(), wanted.end(), part.dielectric) != wanted.end();
      });
      steps.push_back(std::to_string(n) + " with the dielectrics " + joined(texts) + " (or none)");
    }
    if (const Json* list = JsonReader::find(*node, "values")) {
      const std::string lp = child(p, "values");
      c.in.require_array(*list, lp, "a list of capacitances such as \"100n\"");
      std::vector<double> values;
      std::vector<std::string> texts;
      for (std::size_t i = 0; i < list->size(); ++i) {
        const std::string vp = child(lp, i);
        const double v = c.in.quantity((*list)[i], vp, "F");
        detail::require_positive(v, c.in.file(), vp, "F");
        if (std::none_of(capacitors.begin(), capacitors.end(), [&](const LibraryPart* part) { return same_value(*part, v); })) {
          auto near = c.library.candidates(PartQuery{.value = v});
          std::vector<std::string> near_values;
          for (const LibraryPart* part : near) {
            const std::string text = format_value(matching_value(*part), "F");
            if (std::find(near_values.begin(), near_values.end(), text) == near_values.end()) near_values.push_back(text);
            if (near_values.size() == 3) break;
          }
          c.in.fail(vp, "a nominal capacitance of a loaded capacitor (within 0.5 %)",
                    format_value(v, "F") + (near_values.empty() ? "" : "; nearest: " + joined(near_values)));
        }
        values.push_back(v);
        texts.push_back(format_value(v, "F"));
      }
      const auto n = narrow(pool, [&](const LibraryPart& part) {
        return std::any_of(values.begin(), values.end(), [&](double v) { return same_value(part, v); });
      });
      steps.push_back(std::to_string(n) + " with the values " + joined(texts));
    }
    if (!excluded.empty()) {
      const auto n = narrow(pool, [&](const LibraryPart& part) {
        return std::find(excluded.begin(), excluded.end(), &part) == excluded.end();
      });
      steps.push_back(std::to_string(n) + " after the exclusions");
    }
  }

  const auto rated = narrow(pool, [&](const LibraryPart& part) { return part.rated_voltage >= min_rating * (1.0 - kRatingSlack); });
  steps.push_back(std::to_string(rated) + " rated at least " + format_value(min_rating, "V"));

  // Of parts alike but for their rating, the lowest adequate rating (then the lower cost,
  // then the id): a higher rating of the same value costs more and differs only in its
  // smaller DC-bias loss.
  using Group = std::tuple<std::string, std::string, Dielectric, long long>;
  std::map<Group, const LibraryPart*> best;
  for (const LibraryPart* part : pool) {
    const std::string package =
        part->mlcc_package ? "mlcc " + std::string(to_string(*part->mlcc_package)) : lower(part->package);
    // Femtofarad steps: values that went through decimal parsing group exactly.
    const Group group{part->family, package, part->dielectric, std::llround(matching_value(*part) * 1e15)};
    const auto it = best.find(group);
    const auto key = [](const LibraryPart* q) { return std::make_tuple(q->rated_voltage, q->cost, std::string_view(q->id)); };
    if (it == best.end()) best.emplace(group, part);
    else if (key(part) < key(it->second)) it->second = part;
  }
  std::set<const LibraryPart*> kept;
  for (const auto& [group, part] : best) kept.insert(part);
  const auto n = narrow(pool, [&](const LibraryPart& part) { return kept.count(&part) != 0; });
  steps.push_back(std::to_string(n) + " after keeping the lowest adequate rating of each family, package, dielectric and value");

  summary = joined(steps);
  notes.push_back("Candidates from the filters: " + summary + ".");
  return pool;
}

// The parts given in "candidates/parts": each a capacitor that meets the voltage rule.
std::vector<ListedPart> listed_parts(const Context& c, const Json* node, double min_rating, double dc_voltage,
                                     double margin, int max_per_part) {
  std::vector<ListedPart> out;
  const Json* list = node ? JsonReader::find(*node, "parts") : nullptr;
  if (!list) return out;
  const std::string lp = "/plan/candidates/parts";
  c.in.require_array(*list, lp, "a list of parts: ids or {\"part\": id, \"max_count\": n}");
  for (std::size_t i = 0; i < list->size(); ++i) {
    const Json& entry = (*list)[i];
    const std::string ep = child(lp, i);
    ListedPart listed;
    listed.source = ep;
    listed.max_count = max_per_part;
    std::string id_pointer = ep;
    std::string id;
    if (entry.is_object()) {
      c.in.check_keys(entry, ep, kListedPartKeys, "a listed part");
      id_pointer = child(ep, "part");
      id = c.in.required_string(entry, ep, "part", "a part id");
      if (auto m = read_bounded(c, entry, ep, "max_count", 0, std::numeric_limits<int>::max())) listed.max_count = *m;
    } else {
      id = c.in.string(entry, ep, "a part id or {\"part\": id, \"max_count\": n}");
    }
    const LibraryPart& part = library_part(c, id, id_pointer);
    if (part.kind != PartKind::capacitor)
      c.in.fail(id_pointer, "a capacitor (beads and inductors are never candidates)",
                detail::quoted(id) + ", a " + std::string(to_string(part.kind)));
    if (!(part.rated_voltage >= min_rating * (1.0 - kRatingSlack)))
      c.in.fail(ep,
                "a part rated at least " + format_value(min_rating, "V") + " (voltage_margin " +
                    format_value(margin, "", 4) + " x dc_voltage " + format_value(std::abs(dc_voltage), "V") + ")",
                detail::quoted(id) + " rated " + format_value(part.rated_voltage, "V"));
    for (const auto& earlier : out)
      if (earlier.part == &part) c.in.fail(id_pointer, "a part listed once", detail::quoted(id) + " is listed twice");
    listed.part = &part;
    out.push_back(std::move(listed));
  }
  return out;
}

PlanSection read_plan(Context& c, const Json& node) {
  const std::string p = "/plan";
  PlanSection plan;
  if (auto text = c.in.optional_string(node, p, "objective", "\"cost\", \"count\" or \"area\"")) {
    const auto objective = parse_plan_objective(*text);
    if (!objective) c.in.fail(child(p, "objective"), "\"cost\", \"count\" or \"area\"", detail::quoted(*text));
    plan.objective = *objective;
  }
  if (const Json* v = JsonReader::find(node, "seed"))
    plan.seed = read_whole(c, *v, child(p, "seed"), 0, std::numeric_limits<std::uint64_t>::max());
  if (auto v = read_bounded(c, node, p, "alternatives", 1, kMaxAlternatives)) plan.alternatives = static_cast<std::size_t>(*v);
  if (const Json* v = JsonReader::find(node, "node_limit"))
    plan.node_limit = static_cast<std::size_t>(
        read_whole(c, *v, child(p, "node_limit"), 1, std::numeric_limits<std::size_t>::max()));
  plan.voltage_margin = c.in.optional_quantity(node, p, "voltage_margin", "").value_or(kDefaultVoltageMargin);
  require_input(std::isfinite(plan.voltage_margin) && plan.voltage_margin >= 1.0, {c.in.file(), child(p, "voltage_margin")},
                "a voltage margin >= 1 (a factor on the rail's DC voltage)", format_value(plan.voltage_margin, "", 4));
  // The design margin below the target, dB: a number or "1dB".
  plan.margin_db = c.in.optional_quantity(node, p, "impedance_margin", "dB").value_or(0.0);
  require_input(std::isfinite(plan.margin_db) && plan.margin_db >= 0.0 && plan.margin_db <= 40.0,
                {c.in.file(), child(p, "impedance_margin")}, "a margin below the target from 0 to 40 dB",
                format_value(plan.margin_db, "dB", 4));
  plan.max_per_part = read_bounded(c, node, p, "max_per_part", 0, std::numeric_limits<int>::max()).value_or(kDefaultMaxPerPart);
  plan.limits.max_total = read_bounded(c, node, p, "max_total", 1, std::numeric_limits<int>::max());
  if (const Json* a = JsonReader::find(node, "max_area")) {
    const std::string ap = child(p, "max_area");
    const double area = c.in.area(*a, ap);
    detail::require_positive(area, c.in.file(), ap, "m^2");
    const FixedTotals fixed = fixed_totals(c.project);
    if (fixed.area > area)
      c.in.fail(ap,
                "a max_area at least the area of the parts already at the board node (bom, bom_csv, keep: " +
                    mm2(fixed.area) + ")",
                mm2(area) + ", less than the " + mm2(fixed.area) + " already placed (conflicting constraints)");
    plan.limits.max_area = area;
  }

  const double dc = c.project.dc_voltage;
  const double min_rating = plan.voltage_margin * std::abs(dc);
  plan.notes.push_back("Voltage rule: every candidate is rated at least " + format_value(plan.voltage_margin, "", 4) +
                       " x " + format_value(std::abs(dc), "V") + " = " + format_value(min_rating, "V") +
                       " (voltage_margin x dc_voltage; 1.5x is common practice for ceramic and polymer parts on "
                       "low-voltage rails, a reliability margin; DC-bias loss is modelled separately).");

  const std::string cp = "/plan/candidates";
  const Json* cand = JsonReader::find(node, "candidates");
  if (cand) {
    c.in.require_object(*cand, cp, "the candidate filters {\"families\", \"packages\", \"dielectrics\", \"values\", \"parts\", \"exclude\"}");
    c.in.check_keys(*cand, cp, kCandidateKeys, "the candidate filters");
  }
  const auto listed = listed_parts(c, cand, min_rating, dc, plan.voltage_margin, plan.max_per_part);
  // Excluded ids: known, and not also listed (that would contradict itself).
  std::vector<const LibraryPart*> excluded;
  if (const Json* list = cand ? JsonReader::find(*cand, "exclude") : nullptr) {
    const std::string lp = child(cp, "exclude");
    const auto ids = read_strings(c, *list, lp, "a part id");
    for (std::size_t i = 0; i < ids.size(); ++i) {
      const LibraryPart* part = &library_part(c, ids[i], child(lp, i));
      if (std::any_of(listed.begin(), listed.end(), [&](const ListedPart& l) { return l.part == part; }))
        c.in.fail(child(lp, i), "an id not also listed in \"parts\"", detail::quoted(ids[i]) + " is in both");
      excluded.push_back(part);
    }
  }
  std::string summary;
  const auto filtered = filtered_candidates(c, cand, min_rating, excluded, plan.notes, summary);
  if (!listed.empty())
    plan.notes.push_back(counted(listed.size(), "listed part") +
                         " added as given (not filtered, not deduplicated by rating).");

  // Library order, each part once; a listed part keeps its own source and max_count.
  for (const auto& part : c.library.parts()) {
    const auto l = std::find_if(listed.begin(), listed.end(), [&](const ListedPart& x) { return x.part == &part; });
    const bool chosen = std::find(filtered.begin(), filtered.end(), &part) != filtered.end();
    if (l == listed.end() && !chosen) continue;

    PlanCandidate candidate;
    PlanCandidateFacts facts;
    facts.source = l != listed.end() ? l->source : cp;
    candidate.max_count = l != listed.end() ? l->max_count : plan.max_per_part;
    candidate.library_id = part.id;
    candidate.description = part.description.empty() ? part.id : part.description;
    const Mounting mounting = choose_mounting(c, part, std::nullopt, true);
    candidate.part = MountedPart{effective_part(part, c.conditions), mounting.inductance, 1};
    candidate.part.validate(c.in.file(), facts.source);
    candidate.cost = part.cost;
    candidate.area = part.area;
    candidate.nominal_capacitance = std::get<Capacitor>(part.nominal).capacitance;
    // Its own id, unless a branch of the fixed network (a BOM line of the same part) has it.
    candidate.name = unique_name(c, c.names.count(part.id) != 0 ? part.id + "_plan" : part.id);

    facts.family = part.family;
    facts.package = part.package;
    facts.dielectric = part.dielectric;
    facts.rated_voltage = part.rated_voltage;
    facts.mounting_source = mounting.source;
    if (!mounting.found)
      plan.warnings.push_back("Candidate " + candidate.name + ": no mounting inductance for package " +
                              detail::quoted(part.package.empty() ? "unknown" : part.package) +
                              "; give it in the project's \"mounting\".");
    if (auto caution = temperature_caution(c, part, "Candidate " + candidate.name))
      plan.warnings.push_back(std::move(*caution));
    plan.candidates.push_back(std::move(candidate));
    plan.candidate_facts.push_back(std::move(facts));
  }

  if (plan.candidates.empty()) {
    std::string found;
    if (c.library.parts().empty()) found = "none: no part library is loaded (give \"libraries\")";
    else found = "none: " + summary;
    c.in.fail(cp, "at least one capacitor part from the libraries that passes the filters and the voltage rule", found);
  }
  if (std::all_of(plan.candidates.begin(), plan.candidates.end(), [](const PlanCandidate& x) { return x.max_count == 0; })) {
    if (plan.max_per_part == 0)
      c.in.fail(child(p, "max_per_part"), "a max_per_part above 0, or a listed part with a max_count above 0",
                "0 and no listed part allowed any copy");
    c.in.fail(child(cp, "parts"), "at least one candidate with a max_count above 0", "every listed part has max_count 0");
  }
  plan.notes.push_back(counted(plan.candidates.size(), "candidate") + ", at most " +
                       std::to_string(plan.max_per_part) + " copies each unless listed otherwise.");
  return plan;
}

Project read_document(Context& c, const Json& root) {
  c.in.require_object(root, "", "a project");
  c.in.check_keys(root, "", kTopKeys, "a project file");
  Project& project = c.project;
  project.file = c.in.file();
  project.name = c.in.required_string(root, "", "name", "the project's name");
  project.description = c.in.optional_string(root, "", "description", "a description").value_or("");

  read_rail(c, root);
  project.target = read_target(c, root);
  // Segments must cover the band (checked above); flat and tables always do.
  read_mounting_defaults(c, root);
  read_libraries(c, root);

  // View before building, so a die view without a load side names "/view".
  if (auto v = c.in.optional_string(root, "", "view", "the view: board or die")) {
    const auto view = parse_load_view(*v);
    if (!view) c.in.fail("/view", "\"board\" or \"die\"", detail::quoted(*v));
    project.view = *view;
  }
  if (project.view == LoadView::die && !JsonReader::find(root, "load"))
    c.in.fail("/view", "a \"load\" side (package and die) for the die view", "no \"load\"");

  // Nodes: the board node carries the BOM; with a feed the regulator sits behind it.
  project.network = Network("gnd");
  project.board = project.network.add_node("board");
  const bool has_feed = JsonReader::find(root, "feed") != nullptr;
  if (has_feed) project.supply = project.network.add_node("supply");
  read_regulator(c, root, has_feed ? *project.supply : project.board);
  read_feed(c, root);
  read_plane(c, root);

  // With a plan section the BOM is what the plan adds to, and may be empty.
  const Json* plan = JsonReader::find(root, "plan");
  if (plan) {
    c.in.require_object(*plan, "/plan", "the plan constraints (an object)");
    c.in.check_keys(*plan, "/plan", kPlanKeys, "the plan section");
  }
  const Json* bom = JsonReader::find(root, "bom");
  const Json* csv = JsonReader::find(root, "bom_csv");
  if (!bom && !csv && !plan) c.in.fail("/bom", "a \"bom\" list of parts or a \"bom_csv\" file", "neither");
  const std::size_t before = project.parts.size();
  if (bom) read_lines(c, *bom, "/bom", BranchRole::bom, project.board);
  read_bom_csv_lines(c, root);
  if (project.parts.size() == before && !plan) c.in.fail("/bom", "a BOM with at least one part", "an empty list");
  // Kept lines are fixed parts like BOM lines (sources "/plan/keep/<i>").
  if (plan)
    if (const Json* keep = JsonReader::find(*plan, "keep")) read_lines(c, *keep, "/plan/keep", BranchRole::bom, project.board);

  read_load(c, root);
  project.port = project.view == LoadView::die ? *project.die : project.board;
  check_topology(project.network, project.port, c.in.file());
  // Candidates last, so their names avoid every branch of the fixed network.
  if (plan) project.plan = read_plan(c, *plan);
  if (!project.libraries.empty())
    project.notes.push_back("Capacitance derated to " + format_value(c.conditions.dc_voltage, "V") + " DC and " +
                            format_value(c.conditions.temperature_c, "") + " C (part library DC-bias and temperature models).");
  return std::move(c.project);
}

}  // namespace

std::string_view to_string(LoadView view) { return view == LoadView::die ? "die" : "board"; }

std::optional<LoadView> parse_load_view(std::string_view text) {
  if (text == "board") return LoadView::board;
  if (text == "die") return LoadView::die;
  return std::nullopt;
}

std::string_view to_string(BranchRole role) {
  switch (role) {
    case BranchRole::regulator: return "regulator";
    case BranchRole::plane: return "plane";
    case BranchRole::feed: return "feed";
    case BranchRole::supply: return "supply";
    case BranchRole::bom: return "bom";
    case BranchRole::package: return "package";
    case BranchRole::die: return "die";
  }
  QUIETRAIL_ASSERT(false);
  return {};
}

CheckOptions Project::check_options() const {
  CheckOptions options;
  options.grid = band;
  options.branch_curves = true;
  return options;
}

PlanProblem Project::plan_problem() const {
  if (!plan) throw InputError({file, "/plan"}, "a \"plan\" section (the constraints for quietrail plan)", "none");
  PlanProblem problem;
  problem.network = network;
  problem.board = board;
  problem.port = port;
  problem.target = target;
  problem.band = band;
  problem.candidates = plan->candidates;
  problem.limits = plan->limits;
  problem.objective = plan->objective;
  problem.margin_db = plan->margin_db;
  problem.fixed_info = branch_info;
  const FixedTotals fixed = fixed_totals(*this);
  problem.fixed_cost = fixed.cost;
  problem.fixed_area = fixed.area;
  problem.fixed_count = fixed.count;
  return problem;
}

PlanOptions Project::plan_options() const {
  if (!plan) throw InputError({file, "/plan"}, "a \"plan\" section (the constraints for quietrail plan)", "none");
  PlanOptions options;
  options.seed = plan->seed;
  options.alternatives = plan->alternatives;
  options.node_limit = plan->node_limit;
  return options;
}

Project parse_project_json(std::string_view text, const std::string& file, const fs::path& base_directory) {
  Context c(file, base_directory);
  return read_document(c, detail::parse_json_text(text, file));
}

Project read_project_file(const fs::path& path) {
  const std::string text = detail::read_text_file(path, "a readable project file (JSON)");
  return parse_project_json(text, path.string(), path.parent_path());
}

}  // namespace quietrail
