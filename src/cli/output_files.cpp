// SPDX-License-Identifier: MIT
// Every report file of a run or none (see output_files.hpp).
#include "cli/output_files.hpp"

#include <system_error>

#include "quietrail/error.hpp"
#include "quietrail/io/atomic_file.hpp"

namespace quietrail::cli {

namespace fs = std::filesystem;

void create_output_directory(const fs::path& directory) {
  std::error_code error;
  fs::create_directories(directory, error);
  if (error)
    throw InputError({directory.string(), "--out"}, "an output directory that exists or can be created",
                     error.message());
}

void write_all_or_none(const std::vector<OutputFile>& outputs, const std::vector<fs::path>& inputs) {
  // Every path is checked before the first byte is written.
  for (const auto& [path, text] : outputs) check_not_an_input(path, inputs);
  std::vector<fs::path> written;
  try {
    for (const auto& [path, text] : outputs) {
      write_file_atomically(path, text, inputs);
      written.push_back(path);
    }
  } catch (...) {
    std::error_code ignored;
    for (const auto& path : written) fs::remove(path, ignored);
    throw;
  }
}

}  // namespace quietrail::cli
