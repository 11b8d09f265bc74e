// SPDX-License-Identifier: MIT
// A self-contained single-file HTML report, built block by block: headings, text, key/value
// lists, tables, inline SVG plots, a verdict and the caution. Inline CSS only; nothing fetched.
#pragma once

#include <string>
#include <utility>
#include <vector>

namespace quietrail {

/// Builds one HTML5 document (UTF-8) from blocks added in reading order.
///
/// All text is escaped with escape_html (report/escape.hpp), so names from input files
/// cannot inject markup. The page carries its CSS in one <style> element, has no scripts,
/// fonts, images or links to fetch, reflows to narrow windows and prints on white paper.
///
/// Example:
///   HtmlReport report("Check of core rail");
///   report.add_verdict(false, "Target exceeded: worst 1.8 x target at 23 MHz");
///   report.add_svg(render_svg_loglog(series, markers, {}));
///   report.add_caution(kCaution);
///   write_file_atomically(path, report.render());
class HtmlReport {
 public:
  /// How a table row is marked: a coloured left edge and a light tint (kept in print).
  enum class RowTone { plain, pass, fail, warning, muted };
  /// Horizontal alignment of a table column; numbers read best right-aligned.
  enum class Align { left, right };

  /// `title` becomes the <title> and the page's top heading; any text.
  explicit HtmlReport(std::string title);

  /// A section heading; `level` 2 (section) or 3 (sub-section), clamped into 2..3.
  void add_heading(const std::string& text, int level = 2);

  /// A paragraph of plain text; line breaks in `text` are kept.
  void add_paragraph(const std::string& text);

  /// A two-column list of labels and values (e.g. the rail's specification).
  void add_key_values(const std::vector<std::pair<std::string, std::string>>& items);

  /// A table with a header row. Every row must have as many cells as `headers`
  /// (QUIETRAIL_ASSERT). `tones` marks rows (missing entries are plain); `align` sets each
  /// column's alignment (missing entries are left).
  void add_table(const std::vector<std::string>& headers, const std::vector<std::vector<std::string>>& rows,
                 const std::vector<RowTone>& tones = {}, const std::vector<Align>& align = {});

  /// Inlines an SVG image, e.g. from render_svg_loglog, with an optional caption (escaped).
  /// `svg` is trusted program output and inserted as is, except that a leading XML
  /// declaration is dropped; it must be a single <svg> element (QUIETRAIL_ASSERT that it
  /// starts with "<svg" after that).
  void add_svg(const std::string& svg, const std::string& caption = {});

  /// The verdict banner: "PASS" or "FAIL" in large type, then `text`.
  void add_verdict(bool pass, const std::string& text);

  /// A caution box (e.g. "Planning estimate: confirm on hardware ...").
  void add_caution(const std::string& text);

  /// The whole document: <!DOCTYPE html>, <html lang="en">, <meta charset="utf-8">, the
  /// viewport meta, the style sheet, the title heading and the blocks in order.
  std::string render() const;

 private:
  std::string title_;
  std::string body_;  // rendered blocks, already escaped
};

}  // namespace quietrail
