// SPDX-License-Identifier: MIT
// Writing a command's report files together: the output directory, and every file of a run
// or none (check_command.cpp, plan_command.cpp). Each file goes through io/atomic_file.hpp.
#pragma once

#include <filesystem>
#include <string>
#include <utility>
#include <vector>

namespace quietrail::cli {

/// One output file and its whole contents.
using OutputFile = std::pair<std::filesystem::path, std::string>;

/// Creates `directory` and its parents. Throws InputError (file = the directory, field
/// "--out") when it cannot be created.
void create_output_directory(const std::filesystem::path& directory);

/// Writes every file or none: each is written atomically (write_file_atomically), every
/// path is first checked against `inputs` (check_not_an_input), and when a later file
/// fails the earlier ones of this call are removed again before the error is rethrown, so
/// a failed run leaves no partial report.
void write_all_or_none(const std::vector<OutputFile>& outputs, const std::vector<std::filesystem::path>& inputs);

}  // namespace quietrail::cli
