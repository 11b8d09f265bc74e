// SPDX-License-Identifier: MIT
// A bill of materials as board designers export it (CSV), resolved line by line against a
// part library by value, package, dielectric and voltage rating. Format: docs/project_file.md.
#pragma once

#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "quietrail/error.hpp"
#include "quietrail/io/part_library.hpp"

namespace quietrail {

/// How BOM lines are matched to library parts.
struct BomCsvOptions {
  /// Lowest acceptable rated voltage for a line that states no rating, V. >= 0. The
  /// project reader passes the rail's DC voltage, so an unrated line never resolves to a
  /// part rated below the rail (common practice: never run a part above its rating).
  double default_min_voltage = 0.0;
  /// Largest relative difference between the line's value and the part's value for a
  /// match, in [0, 0.5). Default 0.005: values are written with two or three significant
  /// digits ("4.7u", "4u7"), so an E6/E12 value matches only itself.
  double value_tolerance = 0.005;

  /// Throws InputError naming "default_min_voltage" or "value_tolerance".
  void validate() const;
};

/// One resolved BOM line.
struct BomCsvLine {
  /// 1-based line number in the file where the record starts (the header is line 1 in a
  /// file without leading blank lines).
  int line = 0;
  /// Designators as written ("C1, C2, C5-C8"); empty without a designator column.
  std::string designators;
  /// The designators expanded ("C1", "C2", "C5", "C6", "C7", "C8").
  std::vector<std::string> designator_list;
  /// Copies: the quantity column, else the number of designators. >= 1.
  int count = 1;
  /// The resolved library part id.
  std::string part_id;
  /// The value and description text of the line, joined by a space (for messages).
  std::string text;
};

/// Reads a BOM CSV and resolves every line to a part of `library`.
///
/// Format (RFC 4180): comma-separated, fields with commas, quotes or line breaks in double
/// quotes, a doubled quote inside quotes stands for one; CRLF or LF line ends; a UTF-8 byte
/// order mark is skipped; blank lines are skipped. The first non-blank record is the header.
/// Column names are matched case-insensitively, ignoring spaces, '_', '-' and '.':
///  - value text, at least one of: "value", "description", "comment", "desc", "part
///    description" (all of them are read for tokens);
///  - count, at least one of: "qty", "quantity", "count", "qnty" or designators:
///    "designator", "designators", "reference", "references", "ref", "refdes";
///  - optional: "package", "footprint", "case", "size"; "dielectric", "tc"; "voltage",
///    "rating", "rated voltage"; "part id", "library id", "id" (a library id resolves the
///    line directly).
/// The value text is read as tokens: a value with its unit ("100nF", "4u7F", "100n" with F
/// understood, "220uH", "120ohm" or "120R" for a bead's |Z| at 100 MHz), a package code
/// ("0402"), a dielectric ("X7R", "C0G"/"NP0") and a rating ("16V", "6.3V"). Designator lists
/// are split at commas, semicolons or spaces; "C5-C8" and "C5-8" are ranges (both ends with
/// the same prefix, ascending).
///
/// Resolution: the parts of the kind the unit implies whose value is within
/// options.value_tolerance, whose package and dielectric match when the line gives them,
/// and whose rated voltage is at least the line's rating (or options.default_min_voltage);
/// among those the smallest adequate rating wins, then the lowest cost (the order of
/// PartLibrary::candidates). A line that leaves out the package or the dielectric while
/// the matching parts differ in it is ambiguous and an error listing the choices: a BOM
/// line is never resolved by guessing a package or dielectric.
///
/// Throws InputError naming the file, and the line where one applies: unreadable file; an
/// unterminated quote; no header; missing columns (naming the columns expected and those
/// found); a line with more cells than the header; a line whose text has no value; a
/// quantity that is not a whole number >= 1; a quantity that disagrees with the number of
/// designators; a malformed designator range; a designator used twice; an unknown library
/// id; a line that no part matches (naming the nearest candidates and what differs);
/// a file with no part lines.
std::vector<BomCsvLine> read_bom_csv(const std::filesystem::path& path, const PartLibrary& library,
                                     const BomCsvOptions& options = {});

/// As read_bom_csv, from CSV text in memory; `file` names the source in messages.
std::vector<BomCsvLine> parse_bom_csv(std::string_view text, const std::string& file, const PartLibrary& library,
                                      const BomCsvOptions& options = {});

/// Expands a designator list such as "C1, C2, C5-C8" (or "C5-8") into single designators.
/// Throws InputError at `where` for a malformed or descending range or an empty list.
std::vector<std::string> expand_designators(std::string_view text, const InputLocation& where);

/// One record of a CSV file.
struct CsvRecord {
  /// 1-based line number where the record starts.
  int line = 0;
  /// The cells, unquoted.
  std::vector<std::string> cells;
};

/// Splits CSV text into records of cells (RFC 4180 as read_bom_csv describes). Blank lines
/// give no record; a UTF-8 byte order mark is skipped. Throws InputError naming `file` and
/// the line of an unterminated quoted field or of text after a closing quote.
std::vector<CsvRecord> split_csv(std::string_view text, const std::string& file);

}  // namespace quietrail
