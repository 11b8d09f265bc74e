// SPDX-License-Identifier: MIT
// All-or-nothing file output (see atomic_file.hpp). POSIX calls rather than streams,
// because only they can fsync before the rename.
#include "quietrail/io/atomic_file.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <string>
#include <system_error>

#include "quietrail/error.hpp"

namespace quietrail {
namespace fs = std::filesystem;
namespace {

// weakly_canonical can itself fail (e.g. a permission error on a parent); fall back to
// the absolute, lexically normal path so the comparison still happens.
fs::path resolved(const fs::path& path) {
  std::error_code error;
  fs::path out = fs::weakly_canonical(path, error);
  if (error) out = fs::absolute(path, error).lexically_normal();
  return out;
}

bool same_file(const fs::path& a, const fs::path& b) {
  if (resolved(a) == resolved(b)) return true;
  std::error_code error;
  return fs::exists(a, error) && fs::exists(b, error) && fs::equivalent(a, b, error) && !error;
}

fs::path temporary_for(const fs::path& output) {
  fs::path tmp = output;
  tmp += ".tmp";
  return tmp;
}

[[noreturn]] void fail(const fs::path& output, const std::string& action, int error_number) {
  throw InputError({output.string(), "output"}, "a writable output file",
                   action + " failed: " + std::strerror(error_number));
}

// Closes and removes the temporary file, then reports the failure.
[[noreturn]] void abandon(int fd, const fs::path& tmp, const fs::path& output, const std::string& action,
                          int error_number) {
  if (fd >= 0) ::close(fd);
  ::unlink(tmp.c_str());
  fail(output, action, error_number);
}

}  // namespace

void check_not_an_input(const fs::path& output, const std::vector<fs::path>& inputs) {
  const fs::path tmp = temporary_for(output);
  for (const fs::path& input : inputs) {
    require_input(!same_file(output, input), {output.string(), "output"},
                  "an output path that is not one of this run's inputs", "it is the input " + input.string());
    require_input(!same_file(tmp, input), {output.string(), "output"},
                  "an output path whose temporary file (" + tmp.string() + ") is not one of this run's inputs",
                  "it is the input " + input.string());
  }
}

void write_file_atomically(const fs::path& output, std::string_view contents, const std::vector<fs::path>& inputs) {
  check_not_an_input(output, inputs);
  const fs::path tmp = temporary_for(output);

  // A stale temporary from a crashed run is replaced, never written through: O_EXCL
  // refuses to follow a symbolic link left at that name.
  // errno is copied before any string is built, since allocation may change it.
  if (::unlink(tmp.c_str()) != 0 && errno != ENOENT) {
    const int e = errno;
    fail(output, "removing the stale " + tmp.string(), e);
  }
  const int fd = ::open(tmp.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0666);
  if (fd < 0) {
    const int e = errno;
    fail(output, "creating " + tmp.string(), e);
  }

  // From here on, every failure path removes the temporary file.
  const char* data = contents.data();
  std::size_t left = contents.size();
  while (left > 0) {
    const ssize_t written = ::write(fd, data, left);
    if (written < 0) {
      const int e = errno;
      if (e == EINTR) continue;
      abandon(fd, tmp, output, "writing " + tmp.string(), e);
    }
    data += written;
    left -= static_cast<std::size_t>(written);
  }
  if (::fsync(fd) != 0) {
    const int e = errno;
    abandon(fd, tmp, output, "flushing " + tmp.string(), e);
  }
  if (::close(fd) != 0) {
    const int e = errno;
    abandon(-1, tmp, output, "closing " + tmp.string(), e);
  }
  if (::rename(tmp.c_str(), output.c_str()) != 0) {
    const int e = errno;
    abandon(-1, tmp, output, "renaming " + tmp.string() + " to " + output.string(), e);
  }
  // Make the rename itself durable; a failure here loses nothing already written.
  fs::path directory = output.parent_path();
  if (directory.empty()) directory = ".";
  const int dir_fd = ::open(directory.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (dir_fd >= 0) {
    ::fsync(dir_fd);
    ::close(dir_fd);
  }
}

}  // namespace quietrail
