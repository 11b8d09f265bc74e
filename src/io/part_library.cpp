// SPDX-License-Identifier: MIT
// Reading part-library JSON files (format: docs/part_libraries.md) and looking parts up.
// nlohmann_json stays in this file and src/io/json_support.*; parts leave validated.
#include "quietrail/io/part_library.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <limits>
#include <map>
#include <tuple>

#include "detail/checks.hpp"
#include "detail/overloaded.hpp"
#include "io/element_json.hpp"
#include "io/json_support.hpp"
#include "quietrail/error.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

using detail::child;
using detail::Json;
using detail::JsonReader;
using detail::Keys;

constexpr int kFormatVersion = 1;

const Keys kTopKeys{"format_version", "header", "parts"};
const Keys kHeaderKeys{"family", "description", "values", "sources", "caveats"};
// Keys of every part, beyond the element keys of its kind.
const Keys kCommonPartKeys{"id", "kind", "description", "package", "tolerance", "area", "cost"};
const Keys kCapacitorPartKeys{"dielectric", "rated_voltage", "dc_bias", "esl_includes_mounting"};
const Keys kInductorPartKeys{"rated_current"};
const Keys kBeadPartKeys{"rated_current", "impedance_100mhz"};
const Keys kCurveKeys{"v_half", "exponent"};
const Keys kTableKeys{"points"};

std::string lower(std::string_view text) {
  std::string out(text);
  for (char& c : out) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return out;
}

std::string dielectric_list() {
  std::string out;
  for (const Dielectric d :
       {Dielectric::c0g, Dielectric::x5r, Dielectric::x7r, Dielectric::x6s, Dielectric::x7s, Dielectric::x8r,
        Dielectric::y5v, Dielectric::z5u, Dielectric::polymer_aluminium, Dielectric::polymer_tantalum,
        Dielectric::mno2_tantalum, Dielectric::wet_aluminium, Dielectric::none}) {
    if (!out.empty()) out += ", ";
    out += to_string(d);
  }
  return out;
}

// ---------------------------------------------------------------- reading one file

DcBias read_dc_bias(const JsonReader& in, const Json& node, const std::string& pointer) {
  in.require_object(node, pointer, "a DC-bias curve");
  if (node.contains("points")) {
    in.check_keys(node, pointer, kTableKeys, "a DC-bias table");
    const std::string list_pointer = child(pointer, "points");
    const Json& list = node.at("points");
    in.require_array(list, list_pointer, "a list of [voltage, factor] pairs");
    DcBiasTable table;
    for (std::size_t i = 0; i < list.size(); ++i) {
      const std::string at = child(list_pointer, i);
      const Json& pair = list[i];
      if (!pair.is_array() || pair.size() != 2)
        in.fail(at, "a [voltage, factor] pair such as [\"2.5V\", 0.7]", detail::describe(pair));
      table.points.push_back({in.quantity(pair[0], child(at, std::size_t{0}), "V"),
                              in.quantity(pair[1], child(at, std::size_t{1}), "")});
    }
    table.validate(in.file(), list_pointer);
    return table;
  }
  in.check_keys(node, pointer, kCurveKeys, "a DC-bias curve (or {\"points\": [...]} for a table)");
  DcBiasCurve curve;
  curve.v_half = in.required_quantity(node, pointer, "v_half", "V");
  curve.exponent = in.required_quantity(node, pointer, "exponent", "");
  curve.validate(in.file(), pointer);
  return curve;
}

bool read_bool(const JsonReader& in, const Json& object, const std::string& pointer, std::string_view key) {
  const Json* value = JsonReader::find(object, key);
  if (!value) return false;
  if (!value->is_boolean()) in.fail(child(pointer, key), "true or false", detail::describe(*value));
  return value->get<bool>();
}

LibraryPart read_part(const JsonReader& in, const Json& node, const std::string& p, const std::string& family) {
  in.require_object(node, p, "a part");
  LibraryPart part;
  part.family = family;
  part.source_file = in.file();

  const std::string kind_text = in.required_string(node, p, "kind", "a part kind: capacitor, inductor or bead");
  const auto kind = parse_part_kind(kind_text);
  if (!kind) in.fail(child(p, "kind"), "a part kind: capacitor, inductor or bead", "'" + kind_text + "'");
  part.kind = *kind;

  Keys allowed = kCommonPartKeys;
  const Keys& extra = part.kind == PartKind::capacitor ? kCapacitorPartKeys
                      : part.kind == PartKind::bead    ? kBeadPartKeys
                                                       : kInductorPartKeys;
  allowed.insert(allowed.end(), extra.begin(), extra.end());
  const Keys* element_keys = detail::element_keys(kind_text);
  QUIETRAIL_ASSERT(element_keys != nullptr);
  allowed.insert(allowed.end(), element_keys->begin(), element_keys->end());
  in.check_keys(node, p, allowed, "a " + kind_text + " part");

  part.id = in.required_string(node, p, "id", "a part id");
  part.description = in.optional_string(node, p, "description", "a description").value_or("");
  part.package = in.required_string(node, p, "package", "a package or case, e.g. \"0402\"");
  part.nominal = detail::read_element(in, kind_text, node, p);
  part.tolerance = in.required_quantity(node, p, "tolerance", "");
  const Json* area = JsonReader::find(node, "area");
  if (!area) in.fail(child(p, "area"), "a footprint area such as \"1.9mm^2\"", "nothing: the key is missing");
  part.area = in.area(*area, child(p, "area"));
  part.cost = in.required_quantity(node, p, "cost", "");

  if (part.kind == PartKind::capacitor) {
    const std::string text = in.required_string(node, p, "dielectric", "a dielectric: " + dielectric_list());
    const auto dielectric = parse_dielectric(text);
    if (!dielectric) in.fail(child(p, "dielectric"), "a dielectric: " + dielectric_list(), "'" + text + "'");
    part.dielectric = *dielectric;
    part.rated_voltage = in.required_quantity(node, p, "rated_voltage", "V");
    part.esl_includes_mounting = read_bool(in, node, p, "esl_includes_mounting");
    const Json* bias = JsonReader::find(node, "dc_bias");
    if (bias) {
      if (!is_class2(part.dielectric) && part.dielectric != Dielectric::none)
        in.fail(child(p, "dc_bias"),
                "no DC-bias curve: only class-2 ceramics (X5R, X7R, ...) lose capacitance with DC bias",
                "a curve for a " + text + " part");
      part.dc_bias = read_dc_bias(in, *bias, child(p, "dc_bias"));
    } else if (is_class2(part.dielectric)) {
      in.fail(child(p, "dc_bias"), "a DC-bias curve for a class-2 part ({\"v_half\": ..., \"exponent\": ...})",
              "nothing: the key is missing");
    }
  } else {
    if (auto v = in.optional_quantity(node, p, "rated_current", "A")) part.rated_current = *v;
    if (part.kind == PartKind::bead) {
      if (auto v = in.optional_quantity(node, p, "impedance_100mhz", "ohm")) part.impedance_100mhz = *v;
    }
  }
  return part;
}

struct FileContents {
  std::string family;
  std::vector<std::pair<LibraryPart, std::string>> parts;  // part and its JSON pointer
};

FileContents read_document(const JsonReader& in, const Json& root) {
  in.require_object(root, "", "a part library");
  in.check_keys(root, "", kTopKeys, "a part library file");

  const Json* version = JsonReader::find(root, "format_version");
  if (!version) in.fail("/format_version", "the format version 1", "nothing: the key is missing");
  const int v = in.integer(*version, "/format_version");
  if (v != kFormatVersion) in.fail("/format_version", "the format version 1", std::to_string(v));

  const Json* header = JsonReader::find(root, "header");
  if (!header) in.fail("/header", "a header object (family, description, values)", "nothing: the key is missing");
  in.require_object(*header, "/header", "the library header");
  in.check_keys(*header, "/header", kHeaderKeys, "the library header");
  FileContents out;
  out.family = in.required_string(*header, "/header", "family", "the family name, e.g. \"mlcc\"");
  (void)in.required_string(*header, "/header", "description", "a description of the family");
  (void)in.required_string(*header, "/header", "values", "where the values come from, e.g. \"typical, from common practice\"");
  for (const std::string_view key : {"sources", "caveats"}) {
    const Json* list = JsonReader::find(*header, key);
    if (!list) continue;
    const std::string pointer = child("/header", key);
    in.require_array(*list, pointer, "a list of strings");
    for (std::size_t i = 0; i < list->size(); ++i) (void)in.string((*list)[i], child(pointer, i), "a string");
  }

  const Json* parts = JsonReader::find(root, "parts");
  if (!parts) in.fail("/parts", "a list of parts (a JSON array)", "nothing: the key is missing");
  in.require_array(*parts, "/parts", "a list of parts");
  for (std::size_t i = 0; i < parts->size(); ++i) {
    const std::string p = child("/parts", i);
    out.parts.emplace_back(read_part(in, (*parts)[i], p, out.family), p);
  }
  return out;
}

// ---------------------------------------------------------------- matching helpers

bool same_package(const LibraryPart& part, const std::string& wanted) {
  const auto code = parse_package(wanted);
  if (code && part.mlcc_package) return *code == *part.mlcc_package;
  return lower(part.package) == lower(wanted);
}

// |log(a/b)|, +infinity when either is not > 0 (no value to compare).
double log_distance(double a, double b) {
  if (!(a > 0.0) || !(b > 0.0)) return std::numeric_limits<double>::infinity();
  return std::abs(std::log(a / b));
}

}  // namespace

// ---------------------------------------------------------------- public functions

std::string_view to_string(PartKind kind) {
  switch (kind) {
    case PartKind::capacitor: return "capacitor";
    case PartKind::inductor: return "inductor";
    case PartKind::bead: return "bead";
  }
  QUIETRAIL_ASSERT(false);
  return {};
}

std::optional<PartKind> parse_part_kind(std::string_view text) {
  for (const PartKind kind : {PartKind::capacitor, PartKind::inductor, PartKind::bead})
    if (to_string(kind) == text) return kind;
  return std::nullopt;
}

double matching_value(const LibraryPart& part) {
  switch (part.kind) {
    case PartKind::capacitor: return std::get<Capacitor>(part.nominal).capacitance;
    case PartKind::inductor: return std::get<Inductor>(part.nominal).inductance;
    case PartKind::bead: return part.impedance_100mhz;
  }
  QUIETRAIL_ASSERT(false);
  return 0.0;
}

double effective_capacitance(const LibraryPart& part, const DeratingConditions& conditions) {
  QUIETRAIL_ASSERT(part.kind == PartKind::capacitor && std::holds_alternative<Capacitor>(part.nominal));
  return effective_capacitance(std::get<Capacitor>(part.nominal).capacitance, part.dielectric, part.dc_bias,
                               conditions);
}

Element effective_part(const LibraryPart& part, const DeratingConditions& conditions) {
  conditions.validate();
  if (part.kind != PartKind::capacitor) return part.nominal;
  Capacitor capacitor = std::get<Capacitor>(part.nominal);
  capacitor.capacitance = effective_capacitance(part, conditions);
  return capacitor;
}

void validate_part(const LibraryPart& part, const std::string& file, const std::string& field) {
  require_input(!part.id.empty(), {file, field + "/id"}, "a non-empty part id", "an empty id");
  const bool capacitor_model = std::holds_alternative<Capacitor>(part.nominal);
  const bool inductor_model = std::holds_alternative<Inductor>(part.nominal);
  require_input(part.kind == PartKind::capacitor ? capacitor_model : inductor_model, {file, field + "/kind"},
                part.kind == PartKind::capacitor ? "a capacitor model for kind capacitor"
                                                 : "an inductor model for kind " + std::string(to_string(part.kind)),
                std::string("a ") + std::string(element_kind(part.nominal)) + " model");
  validate_element(part.nominal, file, field);
  require_input(std::isfinite(part.tolerance) && part.tolerance >= 0.0 && part.tolerance < 1.0,
                {file, field + "/tolerance"}, "a tolerance fraction in [0, 1), e.g. 0.1 for 10 %",
                detail::describe_number(part.tolerance, ""));
  detail::require_non_negative(part.rated_voltage, file, field + "/rated_voltage", "V");
  if (part.kind == PartKind::capacitor) detail::require_positive(part.rated_voltage, file, field + "/rated_voltage", "V");
  detail::require_non_negative(part.rated_current, file, field + "/rated_current", "A");
  detail::require_non_negative(part.impedance_100mhz, file, field + "/impedance_100mhz", "ohm");
  detail::require_positive(part.area, file, field + "/area", "m^2");
  detail::require_positive(part.cost, file, field + "/cost", "");
  std::visit(detail::Overloaded{
                 [](const std::monostate&) {},
                 [&](const DcBiasCurve& curve) { curve.validate(file, field + "/dc_bias"); },
                 [&](const DcBiasTable& table) { table.validate(file, field + "/dc_bias/points"); },
             },
             part.dc_bias);
}

std::size_t edit_distance(std::string_view a, std::string_view b) {
  // Wagner-Fischer with one row.
  std::vector<std::size_t> row(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) row[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    std::size_t diagonal = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const bool same = std::tolower(static_cast<unsigned char>(a[i - 1])) ==
                        std::tolower(static_cast<unsigned char>(b[j - 1]));
      const std::size_t next = std::min({row[j] + 1, row[j - 1] + 1, diagonal + (same ? 0 : 1)});
      diagonal = row[j];
      row[j] = next;
    }
  }
  return row[b.size()];
}

PartLibrary PartLibrary::from_files(const std::vector<std::filesystem::path>& paths) {
  PartLibrary library;
  for (const auto& path : paths) library.add_file(path);
  return library;
}

void PartLibrary::add_file(const std::filesystem::path& path) {
  add_json(detail::read_text_file(path, "a readable part library (JSON)"), path.string());
}

void PartLibrary::add_json(std::string_view text, const std::string& file) {
  const JsonReader in(file);
  FileContents contents = read_document(in, detail::parse_json_text(text, file));

  // Check the whole file before adding any of it, so a failed file leaves no trace.
  std::map<std::string, std::string, std::less<>> seen;  // id -> pointer in this file
  for (auto& [part, pointer] : contents.parts) {
    part.mlcc_package = parse_package(part.package);
    part.temperature_class = temperature_class(part.dielectric);
    validate_part(part, file, pointer);
    if (const auto* earlier = find(part.id))
      in.fail(child(pointer, "id"), "a part id not used before",
              "'" + part.id + "', already in " + (earlier->source_file.empty() ? "the library" : earlier->source_file));
    if (const auto it = seen.find(part.id); it != seen.end())
      in.fail(child(pointer, "id"), "a part id used once", "'" + part.id + "', also at " + it->second);
    seen.emplace(part.id, pointer);
  }
  for (auto& entry : contents.parts) {
    index_.emplace(entry.first.id, parts_.size());
    parts_.push_back(std::move(entry.first));
  }
  files_.push_back(file);
}

void PartLibrary::add(LibraryPart part, const std::string& file) {
  part.mlcc_package = parse_package(part.package);
  part.temperature_class = temperature_class(part.dielectric);
  part.source_file = file;
  validate_part(part, file, "");
  if (const auto* earlier = find(part.id))
    throw InputError({file, "/id"}, "a part id not used before",
                     "'" + part.id + "', already in " + (earlier->source_file.empty() ? "the library" : earlier->source_file));
  index_.emplace(part.id, parts_.size());
  parts_.push_back(std::move(part));
}

const LibraryPart* PartLibrary::find(std::string_view id) const {
  const auto it = index_.find(id);
  return it == index_.end() ? nullptr : &parts_[it->second];
}

std::vector<const LibraryPart*> PartLibrary::candidates(const PartQuery& query, std::size_t limit) const {
  std::vector<const LibraryPart*> out;
  for (const auto& part : parts_) {
    if (part.kind != query.kind) continue;
    if (query.package && !same_package(part, *query.package)) continue;
    if (query.dielectric && part.dielectric != *query.dielectric) continue;
    if (part.rated_voltage < query.min_voltage) continue;
    out.push_back(&part);
  }
  const auto key = [&](const LibraryPart* part) {
    return std::make_tuple(log_distance(matching_value(*part), query.value), part->rated_voltage, part->cost,
                           std::string_view(part->id));
  };
  std::stable_sort(out.begin(), out.end(), [&](const LibraryPart* a, const LibraryPart* b) { return key(a) < key(b); });
  if (limit > 0 && out.size() > limit) out.resize(limit);
  return out;
}

std::vector<std::string> PartLibrary::nearest(std::string_view id, std::size_t limit) const {
  std::vector<std::pair<std::size_t, std::string_view>> scored;
  scored.reserve(parts_.size());
  for (const auto& part : parts_) scored.emplace_back(edit_distance(id, part.id), part.id);
  std::sort(scored.begin(), scored.end());
  std::vector<std::string> out;
  for (std::size_t i = 0; i < scored.size() && i < limit; ++i) out.emplace_back(scored[i].second);
  return out;
}

}  // namespace quietrail
