// SPDX-License-Identifier: MIT
// Colour decisions and the coloured table header for the CLI (see terminal.hpp).
#include "cli/terminal.hpp"

#include <unistd.h>

#include <cstdlib>

namespace quietrail::cli {

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

std::string TextTable::render(bool colour, int indent) const {
  return quietrail::TextTable::render(indent, [colour](std::string_view header) {
    return paint(header, Tone::heading, colour);
  });
}

}  // namespace quietrail::cli
