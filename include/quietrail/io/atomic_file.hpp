// SPDX-License-Identifier: MIT
// Safe output files: write `<out>.tmp` beside the target, then rename over it, so a
// reader never sees a half-written file and a failed run leaves nothing behind.
#pragma once

#include <filesystem>
#include <string_view>
#include <vector>

namespace quietrail {

/// Throws InputError (file = `output`, field "output") when `output` names the same file
/// as any of `inputs`, or when `<output>.tmp` does: paths are compared after resolving
/// symbolic links, "..", and the working directory (std::filesystem::weakly_canonical),
/// and by file identity when both exist (hard links). Never opens anything for writing.
void check_not_an_input(const std::filesystem::path& output,
                        const std::vector<std::filesystem::path>& inputs);

/// Writes `contents` to `output` all-or-nothing.
///
/// Checks `inputs` first (check_not_an_input), writes `<output>.tmp` in the same
/// directory, flushes it to disk (fsync), then renames it over `output`; rename within one
/// directory is atomic on POSIX file systems (POSIX rename(2)). On any failure the
/// temporary file is removed, `output` is left as it was, and InputError is thrown
/// naming `output` and the system's reason (a missing directory, no permission, a full
/// disk). The parent directory must exist; it is not created here.
void write_file_atomically(const std::filesystem::path& output, std::string_view contents,
                           const std::vector<std::filesystem::path>& inputs = {});

}  // namespace quietrail
