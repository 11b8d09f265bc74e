// SPDX-License-Identifier: MIT
// Output file names derived from names in input files (sweep, check): safe on every file
// system and never a path.
#pragma once

#include <string>

namespace quietrail::cli {

/// A file name stem from `name`: letters, digits, '.', '-' and '_' kept, anything else
/// (path separators included) replaced by '_'. `fallback` when nothing but '.' and '_'
/// would remain (so "..", "/" or "" never become a name).
inline std::string file_stem_for(const std::string& name, const std::string& fallback) {
  std::string out;
  for (const char c : name) {
    const bool keep = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '.' ||
                      c == '-' || c == '_';
    out += keep ? c : '_';
  }
  if (out.find_first_not_of("._") == std::string::npos) return fallback;
  return out;
}

}  // namespace quietrail::cli
