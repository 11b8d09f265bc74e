// SPDX-License-Identifier: MIT
// Terminal output for the CLI: whether to colour (TTY and NO_COLOR), colouring, and
// the header colour of aligned text tables (report/text_table.hpp). The only place that
// decides about terminals (the library never prints).
#pragma once

#include <cstdio>
#include <string>
#include <string_view>
#include <vector>

#include "quietrail/report/text_table.hpp"

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

/// The library's aligned table (report/text_table.hpp) with the CLI's colour rule for the
/// header, so every command renders tables the same way.
///
/// Example:
///   TextTable table({"Branch", "Count"}, {TextTable::Align::left, TextTable::Align::right});
///   table.add_row({"C1", "4"});
///   std::fputs(table.render(colour_enabled(stdout)).c_str(), stdout);
class TextTable : public quietrail::TextTable {
 public:
  using quietrail::TextTable::TextTable;

  /// quietrail::TextTable::render with the header painted as Tone::heading when `colour`.
  std::string render(bool colour, int indent = 2) const;
};

}  // namespace quietrail::cli
