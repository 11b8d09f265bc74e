// SPDX-License-Identifier: MIT
// Aligned plain-text tables (see text_table.hpp).
#include "quietrail/report/text_table.hpp"

#include <algorithm>

#include "quietrail/error.hpp"

namespace quietrail {
namespace {

std::string pad(std::string_view text, std::size_t width, TextTable::Align align) {
  const std::string fill(width - std::min(width, text_columns(text)), ' ');
  std::string out;
  if (align == TextTable::Align::right) out.append(fill).append(text);
  else out.append(text).append(fill);
  return out;
}

}  // namespace

std::size_t text_columns(std::string_view text) {
  std::size_t n = 0;
  for (const char c : text)
    if ((static_cast<unsigned char>(c) & 0xC0) != 0x80) ++n;
  return n;
}

TextTable::TextTable(std::vector<std::string> headers, std::vector<Align> align)
    : headers_(std::move(headers)), align_(std::move(align)) {
  align_.resize(headers_.size(), Align::left);
}

void TextTable::add_row(std::vector<std::string> cells) {
  QUIETRAIL_ASSERT(cells.size() == headers_.size());
  rows_.push_back({std::move(cells), false});
}

void TextTable::add_rule() { rows_.push_back({{}, true}); }

std::size_t TextTable::row_count() const {
  return static_cast<std::size_t>(std::count_if(rows_.begin(), rows_.end(), [](const Row& r) { return !r.rule; }));
}

std::string TextTable::render(int indent, const HeaderStyle& header_style) const {
  std::vector<std::size_t> width(headers_.size());
  for (std::size_t c = 0; c < headers_.size(); ++c) {
    width[c] = text_columns(headers_[c]);
    for (const auto& row : rows_)
      if (!row.rule) width[c] = std::max(width[c], text_columns(row.cells[c]));
  }
  const std::string margin(static_cast<std::size_t>(std::max(indent, 0)), ' ');
  auto line = [&](const std::vector<std::string>& cells) {
    std::string out;
    for (std::size_t c = 0; c < cells.size(); ++c) {
      if (c > 0) out += "  ";
      out += pad(cells[c], width[c], align_[c]);
    }
    while (!out.empty() && out.back() == ' ') out.pop_back();  // no trailing blanks
    return out;
  };
  std::size_t total = 0;
  for (const auto w : width) total += w;
  total += 2 * (width.empty() ? 0 : width.size() - 1);
  const std::string rule = margin + std::string(total, '-') + "\n";

  const std::string header = line(headers_);
  std::string out = margin + (header_style ? header_style(header) : header) + "\n" + rule;
  for (const auto& row : rows_) out += row.rule ? rule : margin + line(row.cells) + "\n";
  return out;
}

}  // namespace quietrail
