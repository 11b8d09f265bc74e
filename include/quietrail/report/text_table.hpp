// SPDX-License-Identifier: MIT
// Aligned plain-text tables for terminal summaries. No colour here: the CLI decides about
// terminals (src/cli/terminal.hpp) and may style the header line through a callback.
#pragma once

#include <cstddef>
#include <functional>
#include <string>
#include <string_view>
#include <vector>

namespace quietrail {

/// A table of text cells with aligned columns.
///
/// Example:
///   TextTable table({"Branch", "Count"}, {TextTable::Align::left, TextTable::Align::right});
///   table.add_row({"C1", "4"});
///   table.add_rule();
///   table.add_row({"Total", "4"});
///   std::string text = table.render();
class TextTable {
 public:
  /// Alignment of a column's cells (the header follows it).
  enum class Align { left, right };
  /// Styles the header line's text (without the indent), e.g. with terminal escape codes.
  using HeaderStyle = std::function<std::string(std::string_view)>;

  /// `align` per column; missing entries are left-aligned.
  explicit TextTable(std::vector<std::string> headers, std::vector<Align> align = {});

  /// Adds a row; it must have as many cells as there are headers (QUIETRAIL_ASSERT).
  void add_row(std::vector<std::string> cells);

  /// Adds a rule of '-' across the table before the next row (e.g. above a totals row).
  void add_rule();

  /// Number of rows added (rules not counted).
  std::size_t row_count() const;

  /// The table as lines ending in '\n': header, a rule of '-', the rows. Columns are
  /// separated by two spaces and padded to the widest cell, counting one column per UTF-8
  /// code point (wide East Asian characters would need two; names here are ASCII in
  /// practice). Lines carry no trailing blanks and start with `indent` spaces (negative
  /// counts as 0). `header_style`, when set, is applied to the header text.
  std::string render(int indent = 2, const HeaderStyle& header_style = {}) const;

 private:
  std::vector<std::string> headers_;
  std::vector<Align> align_;
  struct Row {
    std::vector<std::string> cells;  // empty for a rule
    bool rule = false;
  };
  std::vector<Row> rows_;
};

/// Display columns of UTF-8 text: one per code point (bytes 10xxxxxx continue a code point).
std::size_t text_columns(std::string_view text);

}  // namespace quietrail
