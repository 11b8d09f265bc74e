// SPDX-License-Identifier: MIT
// A scratch directory per test, removed with everything in it when the test ends, and
// small file helpers for tests that read and write files.
#pragma once

#include <unistd.h>

#include <algorithm>
#include <atomic>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

namespace quietrail::test {

/// A fresh, empty directory under the system temp directory; removed on destruction.
class TempDir {
 public:
  explicit TempDir(std::string_view label = "test") {
    static std::atomic<int> counter{0};
    const auto base = std::filesystem::temp_directory_path();
    for (;;) {
      path_ = base / ("quietrail-" + std::string(label) + "-" + std::to_string(::getpid()) + "-" +
                      std::to_string(counter++));
      if (std::filesystem::create_directory(path_)) break;
    }
  }
  ~TempDir() {
    std::error_code ignored;
    std::filesystem::remove_all(path_, ignored);
  }
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;

  const std::filesystem::path& path() const { return path_; }
  std::filesystem::path operator/(const std::string& name) const { return path_ / name; }

 private:
  std::filesystem::path path_;
};

/// Writes `text` to `path` (plain stream: test fixtures only).
inline void write_text(const std::filesystem::path& path, std::string_view text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
}

/// The whole file as a string; empty when it cannot be read.
inline std::string read_text(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream out;
  out << in.rdbuf();
  return out.str();
}

/// Names of the entries in `directory`, sorted.
inline std::vector<std::string> list_names(const std::filesystem::path& directory) {
  std::vector<std::string> names;
  std::error_code ignored;
  if (!std::filesystem::exists(directory, ignored)) return names;
  for (const auto& entry : std::filesystem::directory_iterator(directory)) names.push_back(entry.path().filename().string());
  std::sort(names.begin(), names.end());
  return names;
}

}  // namespace quietrail::test
