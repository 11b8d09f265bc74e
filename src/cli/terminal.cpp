// SPDX-License-Identifier: MIT
// Colour decisions and aligned tables for the CLI (see terminal.hpp).
#include "cli/terminal.hpp"

#include <unistd.h>

#include <algorithm>
#include <cstdlib>

#include "quietrail/error.hpp"

namespace quietrail::cli {
namespace {

// Display columns of UTF-8 text: one per code point (continuation bytes 10xxxxxx do
// not start a character). Wide East Asian characters would need more; names here are
// ASCII in practice.
std::size_t columns(std::string_view text) {
  std::size_t n = 0;
  for (const char c : text)
    if ((static_cast<unsigned char>(c) & 0xC0) != 0x80) ++n;
  return n;
}

std::string pad(std::string_view text, std::size_t width, TextTable::Align align) {
  const std::string fill(width - std::min(width, columns(text)), ' ');
  std::string out;
  if (align == TextTable::Align::right) out.append(fill).append(text);
  else out.append(text).append(fill);
  return out;
}

}  // namespace

bool colour_allowed(bool is_terminal, const char* no_color) {
  const bool opted_out = no_color != nullptr && no_color[0] != '\0';
  return is_terminal && !opted_out;
}

bool colour_enabled(std::FILE* stream) {
  return colour_allowed(::isatty(::fileno(stream)) == 1, std::getenv("NO_COLOR"));
}

std::string paint(std::string_view text, Tone tone, bool colour) {
  if (!colour || tone == Tone::plain) return std::string(text);
  // SGR parameters (ECMA-48 8.3.117): 1 bold, 2 faint, 31 red, 32 green, 33 yellow.
  std::string_view code;
  switch (tone) {
    case Tone::heading: code = "1"; break;
    case Tone::good: code = "32"; break;
    case Tone::warning: code = "33"; break;
    case Tone::bad: code = "1;31"; break;
    case Tone::muted: code = "2"; break;
    case Tone::plain: break;
  }
  std::string out = "\x1b[";
  out.append(code).append("m").append(text).append("\x1b[0m");
  return out;
}

TextTable::TextTable(std::vector<std::string> headers, std::vector<Align> align)
    : headers_(std::move(headers)), align_(std::move(align)) {
  align_.resize(headers_.size(), Align::left);
}

void TextTable::add_row(std::vector<std::string> cells) {
  QUIETRAIL_ASSERT(cells.size() == headers_.size());
  rows_.push_back(std::move(cells));
}

std::string TextTable::render(bool colour, int indent) const {
  std::vector<std::size_t> width(headers_.size());
  for (std::size_t c = 0; c < headers_.size(); ++c) {
    width[c] = columns(headers_[c]);
    for (const auto& row : rows_) width[c] = std::max(width[c], columns(row[c]));
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

  std::string out = margin + paint(line(headers_), Tone::heading, colour) + "\n";
  std::size_t total = 0;
  for (const auto w : width) total += w;
  total += 2 * (width.empty() ? 0 : width.size() - 1);
  out += margin + std::string(total, '-') + "\n";
  for (const auto& row : rows_) out += margin + line(row) + "\n";
  return out;
}

}  // namespace quietrail::cli
