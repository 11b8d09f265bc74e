// SPDX-License-Identifier: MIT
// Part libraries: generic capacitors, beads and inductors read from the JSON files in
// part_libraries/ (format in docs/part_libraries.md), with look-up by id and by value.
#pragma once

#include <cstddef>
#include <filesystem>
#include <functional>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "quietrail/models/derating.hpp"
#include "quietrail/models/element.hpp"
#include "quietrail/models/mounting.hpp"

namespace quietrail {

/// What a library part is electrically.
enum class PartKind {
  capacitor,  ///< model is a Capacitor
  inductor,   ///< wound inductor; model is an Inductor
  bead,       ///< ferrite bead; model is an Inductor (same circuit, bead values)
};

/// "capacitor", "inductor" or "bead".
std::string_view to_string(PartKind kind);
/// Parses the strings of to_string; std::nullopt otherwise.
std::optional<PartKind> parse_part_kind(std::string_view text);

/// One part of a library, after reading and validation. All quantities SI.
struct LibraryPart {
  /// Unique id across all loaded files, e.g. "mlcc-0402-x7r-100n-16v".
  std::string id{};
  /// Family from the file header, e.g. "mlcc", "bulk", "beads".
  std::string family{};
  PartKind kind = PartKind::capacitor;
  /// Nominal model at 0 V and 25 C: a Capacitor for kind capacitor, an Inductor otherwise.
  Element nominal{};
  /// Package or case as written, e.g. "0402", "7.3x4.3 mm", "8x10 mm can".
  std::string package{};
  /// The package as an MLCC size code when it is one (parse_package), else std::nullopt.
  std::optional<Package> mlcc_package{};
  /// Dielectric kind; Dielectric::none for inductors and beads.
  Dielectric dielectric = Dielectric::none;
  /// Rated DC voltage, V; 0 when not applicable (inductors, beads).
  double rated_voltage = 0.0;
  /// Rated DC current, A; 0 when not given (capacitors).
  double rated_current = 0.0;
  /// Value tolerance as a fraction (0.1 for +/-10 %), symmetric.
  double tolerance = 0.0;
  /// DC-bias behaviour; std::monostate when the part loses none (C0G, bulk, inductors).
  DcBias dc_bias{};
  /// EIA class-2 temperature class, derived from the dielectric (temperature_class()).
  std::optional<TemperatureClass> temperature_class{};
  /// True when the model's ESL is a typical *mounted* loop value (bulk parts: REFERENCES
  /// §8 gives bulk ESL as mounted), so no default mounting inductance should be added.
  bool esl_includes_mounting = false;
  /// Footprint (land pattern courtyard) area, m^2. > 0.
  double area = 0.0;
  /// Relative cost, dimensionless, > 0 (library values are invented, for ranking only).
  double cost = 0.0;
  /// Beads: |Z| at 100 MHz as stated for the part, ohm (descriptive); 0 when not given.
  double impedance_100mhz = 0.0;
  /// One-line human description.
  std::string description{};
  /// The file the part was read from ("" when added in code).
  std::string source_file{};
};

/// The value a BOM line names for `part`: capacitance (F) for a capacitor, inductance (H)
/// for an inductor, |Z| at 100 MHz (ohm) for a bead.
double matching_value(const LibraryPart& part);

/// The effective capacitance of a capacitor part at `conditions`, F:
///   C_nominal * dc_bias_factor(part.dc_bias, V) * temperature_factor(part.dielectric, T)
/// (models/derating.hpp). QUIETRAIL_ASSERT that the part is a capacitor.
double effective_capacitance(const LibraryPart& part, const DeratingConditions& conditions);

/// The part's model at `conditions`: a Capacitor with effective_capacitance() (ESR, ESL and
/// the rest unchanged), or the nominal Inductor unchanged (no current derating).
/// Throws InputError (from conditions.validate()) for non-finite conditions.
Element effective_part(const LibraryPart& part, const DeratingConditions& conditions);

/// What to look for in candidates(). Unset fields do not filter.
struct PartQuery {
  /// The wanted matching_value (F, H or ohm by kind). > 0.
  double value = 0.0;
  /// Kind to search. Only parts of this kind are returned.
  PartKind kind = PartKind::capacitor;
  /// Package as written in the library (compared case-insensitively; MLCC codes also
  /// through parse_package, so "case 0402" matches "0402").
  std::optional<std::string> package{};
  /// Dielectric to require.
  std::optional<Dielectric> dielectric{};
  /// Lowest acceptable rated voltage, V (capacitors). 0 = any.
  double min_voltage = 0.0;
};

/// A set of library parts read from one or more files, ids unique across all of them.
///
/// Example:
///   PartLibrary library;
///   library.add_file("part_libraries/mlcc.json");
///   const LibraryPart* part = library.find("mlcc-0402-x7r-100n-16v");
///   Element model = effective_part(*part, {.dc_voltage = 1.0, .temperature_c = 60.0});
class PartLibrary {
 public:
  /// An empty library.
  PartLibrary() = default;

  /// Reads every file of `paths` in order (see add_file).
  static PartLibrary from_files(const std::vector<std::filesystem::path>& paths);

  /// Reads one library file and adds its parts. Throws InputError naming the file and,
  /// where one applies, the JSON pointer (e.g. "/parts/12/esr"): unreadable file;
  /// malformed JSON (line and column); a key given twice; an unknown key; a missing or
  /// mistyped field; a value out of its domain; an id already loaded (from this or an
  /// earlier file, named in the message). On error nothing from the file is added.
  void add_file(const std::filesystem::path& path);

  /// As add_file, from JSON text in memory; `file` names the source in messages.
  void add_json(std::string_view text, const std::string& file);

  /// Adds one part built in code (tests, inline BOM parts). Sets mlcc_package from the
  /// package, temperature_class from the dielectric and source_file to `file`. Throws
  /// InputError at `file`, field "/id" for a duplicate id, and for an out-of-domain value
  /// (validate_part). add_file and add_json set the same derived fields.
  void add(LibraryPart part, const std::string& file = {});

  /// The part with `id` (exact, case-sensitive), or nullptr. Pointers into the library
  /// stay valid until the next add, add_file or add_json.
  const LibraryPart* find(std::string_view id) const;

  /// All parts, in load order.
  const std::vector<LibraryPart>& parts() const { return parts_; }

  /// Files read so far, in order.
  const std::vector<std::string>& files() const { return files_; }

  /// Parts matching `query`'s kind, package, dielectric and minimum voltage, ordered by
  /// closeness: first |log(matching_value / query.value)|, then the lowest rated voltage
  /// that meets min_voltage, then cost, then id. An exact value match therefore comes first.
  /// Values are not filtered: compare matching_value() to decide whether the first is
  /// close enough. At most `limit` parts (0 = no limit).
  std::vector<const LibraryPart*> candidates(const PartQuery& query, std::size_t limit = 0) const;

  /// Up to `limit` ids closest to `id` by edit distance (Levenshtein, case-insensitive),
  /// nearest first, ties by id: suggestions for an unknown id.
  std::vector<std::string> nearest(std::string_view id, std::size_t limit = 3) const;

 private:
  std::vector<LibraryPart> parts_;
  std::vector<std::string> files_;
  std::map<std::string, std::size_t, std::less<>> index_;  // id -> position in parts_
};

/// Throws InputError at `file`, `field` (a JSON pointer prefix such as "/parts/3") for a
/// part whose values are out of domain: empty id, model of the wrong kind or invalid,
/// tolerance outside [0, 1), a capacitor's rated voltage not > 0, a negative rated current,
/// area or cost not > 0, an invalid DC-bias curve.
void validate_part(const LibraryPart& part, const std::string& file, const std::string& field);

/// Edit distance (Levenshtein: insertions, deletions, substitutions each cost 1) between
/// `a` and `b`, comparing ASCII letters case-insensitively.
std::size_t edit_distance(std::string_view a, std::string_view b);

}  // namespace quietrail
