// SPDX-License-Identifier: MIT
// Terminal output for the CLI: whether to colour (TTY and NO_COLOR), colouring, and
// aligned text tables. The only place that decides about terminals (the library never prints).
#pragma once

#include <cstdio>
#include <string>
#include <string_view>
#include <vector>

namespace quietrail::cli {

/// The caution every report carries (README "Caution").
inline constexpr const char* kCaution =
    "Planning estimate: confirm on hardware; respect voltage ratings and derating; follow the "
    "part makers' data, local codes and licensed practice.";

/// The colour rule for known facts: colour only on a terminal, and never when the
/// NO_COLOR environment variable is present and not empty (no-color.org convention).
/// `no_color` is the variable's value, nullptr when unset.
bool colour_allowed(bool is_terminal, const char* no_color);

/// colour_allowed() for `stream` (isatty on its descriptor) and the current environment.
bool colour_enabled(std::FILE* stream);

/// What a piece of text means, not how it looks; paint() picks the look.
enum class Tone { plain, heading, good, warning, bad, muted };

/// `text` wrapped in ANSI SGR escape codes (ECMA-48) for `tone` when `colour` is true;
/// `text` unchanged otherwise.
std::string paint(std::string_view text, Tone tone, bool colour);

/// A table of text cells with aligned columns.
///
/// Example:
///   TextTable table({"Branch", "Count"}, {TextTable::Align::left, TextTable::Align::right});
///   table.add_row({"C1", "4"});
///   std::fputs(table.render(true).c_str(), stdout);
class TextTable {
 public:
  enum class Align { left, right };

  /// `align` per column; missing entries are left-aligned.
  explicit TextTable(std::vector<std::string> headers, std::vector<Align> align = {});

  /// Adds a row; it must have as many cells as there are headers (QUIETRAIL_ASSERT).
  void add_row(std::vector<std::string> cells);

  /// The table as lines ending in '\n': header, a rule of '-', the rows. Columns are
  /// separated by two spaces and padded to the widest cell (UTF-8 code points are
  /// counted as one column each); each line starts with `indent` spaces. The header is
  /// painted as Tone::heading when `colour` is true.
  std::string render(bool colour, int indent = 2) const;

 private:
  std::vector<std::string> headers_;
  std::vector<Align> align_;
  std::vector<std::vector<std::string>> rows_;
};

}  // namespace quietrail::cli
