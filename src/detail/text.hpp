// SPDX-License-Identifier: MIT
// Small ASCII text helpers for the input readers (src/io/): case folding and trimming.
#pragma once

#include <cctype>
#include <string>
#include <string_view>

namespace quietrail::detail {

/// `text` with ASCII letters in lower case (other bytes, UTF-8 included, unchanged).
inline std::string lower_ascii(std::string_view text) {
  std::string out(text);
  for (char& c : out) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return out;
}

/// `text` without leading and trailing spaces, tabs, CR and LF.
inline std::string trim_blanks(std::string_view text) {
  const auto first = text.find_first_not_of(" \t\r\n");
  if (first == std::string_view::npos) return {};
  const auto last = text.find_last_not_of(" \t\r\n");
  return std::string(text.substr(first, last - first + 1));
}

}  // namespace quietrail::detail
