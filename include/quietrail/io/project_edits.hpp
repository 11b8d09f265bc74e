// SPDX-License-Identifier: MIT
// Edits to a project file for `quietrail compare`: replace a part, change a count, add or
// remove a line, change a mounting. Edits work on the project's JSON text, and the ordinary
// reader (io/project_file.hpp) then builds the edited project, so every check of the
// reader applies to the result. Edits file format: docs/compare.md.
#pragma once

#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "quietrail/io/project_file.hpp"

namespace quietrail {

/// What one edit does.
enum class EditKind {
  replace,   ///< the line `target` gets library part `part_id` (count and mounting kept)
  count,     ///< the line `target` gets `count` copies; 0 removes the line
  add,       ///< a new `bom` line of library part `part_id` with `count` copies
  remove,    ///< the line `target` is removed
  mounting,  ///< the line `target` gets the mounting override `mounting_json`
};

/// "replace", "count", "add", "remove" or "mounting".
std::string_view to_string(EditKind kind);

/// One edit and where it was given, for messages.
struct ProjectEdit {
  EditKind kind = EditKind::replace;
  /// The line edited (all kinds but add): a branch name as check's parts table shows it,
  /// or a library id used by exactly one line.
  std::string target;
  /// Library part id (replace, add).
  std::string part_id;
  /// Copies (count: the new count, >= 0; add: >= 1).
  int count = 1;
  /// The mounting override as JSON text (mounting): a quantity in H such as "\"0.25n\""
  /// or 2.5e-10, or a mounting object as a BOM line's "mounting" takes.
  std::string mounting_json;
  /// Where the edit was given: "command line" or the edits file, and the option
  /// ("--replace") or JSON pointer ("/2") there.
  std::string origin_file;
  std::string origin_field;
};

/// Parses one command-line edit `text` of `kind` as the compare command takes it:
///   replace  NAME=PART_ID      count  NAME=N        add  PART_ID or PART_ID:N
///   remove   NAME              mounting  NAME=VALUE (a quantity in H, e.g. 0.25n)
/// `option` names it in messages ("--replace"). Throws InputError (file "command line",
/// field `option`) for a missing '=', an empty name or id, a count that is not a whole
/// number, a negative count (or an add count below 1).
ProjectEdit parse_edit_option(EditKind kind, std::string_view text, const std::string& option);

/// Parses an edits file's JSON text: a list of objects, each with exactly one of the keys
/// "replace", "count", "add", "remove", "mounting" (docs/compare.md):
///   {"replace": NAME, "with": PART_ID}   {"count": NAME, "to": N}
///   {"add": PART_ID, "count": N}         {"remove": NAME}     {"mounting": NAME, "to": VALUE}
/// Throws InputError naming `file` and the JSON pointer ("/2/to") for malformed JSON, an
/// entry that is not such an object, an unknown or missing key, a mistyped value or a
/// negative count.
std::vector<ProjectEdit> parse_edits_json(std::string_view text, const std::string& file);

/// As parse_edits_json, from a file (InputError when it cannot be read).
std::vector<ProjectEdit> read_edits_file(const std::filesystem::path& path);

/// Applies `edits` in order to `project_json`, the text `base` was read from, and returns
/// the edited JSON text. Names are resolved against `base` (and the lines added by earlier
/// edits are not nameable). Lines from `bom_csv` are written into `bom` (part id, count,
/// name) when an edit touches one, and `bom_csv` dropped. Lines under `bom`, `plan/keep`
/// and `feed/supply_bom` can be edited; the feed itself cannot.
/// Throws InputError at the edit's origin (file and option or pointer): a name that is no
/// such line (with the nearest names), a library id used by several lines, a line already
/// removed, a part id not in the project's libraries (with the nearest ids), a negative
/// count. The result is not validated here: read it with parse_project_json.
std::string apply_project_edits(std::string_view project_json, const Project& base,
                                const std::vector<ProjectEdit>& edits);

/// Reads the project at `path`, applies `edits` and reads the edited text with
/// parse_project_json (file named "<path> (edited)", relative paths against the project's
/// directory), so every check of the reader applies to the edited project.
Project read_edited_project(const std::filesystem::path& path, const std::vector<ProjectEdit>& edits);

}  // namespace quietrail
