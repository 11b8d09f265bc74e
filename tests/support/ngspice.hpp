// SPDX-License-Identifier: MIT
// Test helpers for running ngspice as an independent AC reference: find it on PATH, run a
// deck in batch mode in a directory, read the `wrdata` table it writes. Header-only (the
// test target compiles only *_test.cpp files); scratch directories: support/temp_dir.hpp.
#pragma once

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <optional>
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

#include <unistd.h>

#include "quietrail/types.hpp"

namespace quietrail::test {

/// The message a test fails with when ngspice is missing.
inline constexpr const char* kNgspiceMissing =
    "ngspice not found: run scripts/install-deps.sh (installs the Debian package ngspice)";

/// Full path of `program` found on PATH (executable regular file), std::nullopt if none.
inline std::optional<std::filesystem::path> find_on_path(std::string_view program) {
  const char* path = std::getenv("PATH");
  if (path == nullptr) return std::nullopt;
  std::stringstream dirs(path);
  std::string dir;
  while (std::getline(dirs, dir, ':')) {
    const std::filesystem::path base = dir.empty() ? std::filesystem::path(".") : std::filesystem::path(dir);
    const std::filesystem::path candidate = base / program;
    std::error_code ec;
    if (std::filesystem::is_regular_file(candidate, ec) && ::access(candidate.c_str(), X_OK) == 0)
      return candidate;
  }
  return std::nullopt;
}

/// Runs `ngspice -b <deck>` with `dir` as working directory, stdout and stderr to
/// `dir`/ngspice.log. Returns the shell's exit status (0 on success).
inline int run_ngspice(const std::filesystem::path& ngspice, const std::filesystem::path& dir,
                       const std::string& deck_name) {
  // Paths come from temp_directory_path and fixed names: no shell quoting issues beyond
  // spaces, which the single quotes cover.
  const std::string command = "cd '" + dir.string() + "' && '" + ngspice.string() + "' -b '" + deck_name +
                              "' > ngspice.log 2>&1";
  return std::system(command.c_str());
}

/// One row of a `wrdata` table for one complex vector with `wr_singlescale`.
struct WrdataRow {
  double frequency = 0.0;
  Complex value;
};

/// Reads "frequency re im" rows; lines that do not start with a number (the header
/// written with `wr_vecnames`) are skipped.
inline std::vector<WrdataRow> read_wrdata(const std::filesystem::path& file) {
  std::ifstream in(file);
  std::vector<WrdataRow> rows;
  std::string line;
  while (std::getline(in, line)) {
    std::istringstream fields(line);
    double f = 0.0, re = 0.0, im = 0.0;
    if (fields >> f >> re >> im) rows.push_back({f, Complex(re, im)});
  }
  return rows;
}

}  // namespace quietrail::test
