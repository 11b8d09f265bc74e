// SPDX-License-Identifier: MIT
// Private helpers shared by the JSON readers in src/io/ (network file, project file, part
// libraries): parsing with line/column errors, JSON pointers, typed field reading.
#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "quietrail/error.hpp"

namespace quietrail::detail {

using Json = nlohmann::json;
using Keys = std::vector<std::string_view>;

/// "a, b, c".
std::string join(const Keys& keys);
/// True when `key` is one of `keys`.
bool contains(const Keys& keys, std::string_view key);

/// One reference token of a JSON pointer (RFC 6901, section 3: "~" -> "~0", "/" -> "~1").
std::string pointer_token(std::string_view key);
/// `pointer` extended by the object key `key`.
std::string child(const std::string& pointer, std::string_view key);
/// `pointer` extended by the array index `index`.
std::string child(const std::string& pointer, std::size_t index);

/// What a JSON value is, for "found ...": its type and a short rendering.
std::string describe(const Json& value);

/// (line, column), both 1-based, of the 1-based byte offset nlohmann reports (the last
/// byte read).
std::pair<int, int> line_and_column(std::string_view text, std::size_t byte);

/// Parses JSON text. Throws InputError naming `file`: malformed JSON with the line and
/// 1-based byte column; a key given twice in one object with its JSON pointer (nlohmann
/// would keep the last silently, hiding a copy-paste slip).
Json parse_json_text(std::string_view text, const std::string& file);

/// The whole of a file as text. Throws InputError naming the file and `what` (e.g. "a
/// readable project file (JSON)") when it is missing, not a regular file or unreadable.
std::string read_text_file(const std::filesystem::path& path, const std::string& what);

/// Field-level reading of a parsed document with the file name and JSON pointer in every
/// error. Quantities are JSON numbers in SI units or engineering-notation strings read by
/// parse_value.
class JsonReader {
 public:
  explicit JsonReader(std::string file) : file_(std::move(file)) {}

  const std::string& file() const { return file_; }

  /// Throws InputError at `pointer` in this file.
  [[noreturn]] void fail(const std::string& pointer, const std::string& expected, const std::string& found) const;

  void require_object(const Json& value, const std::string& pointer, const std::string& what) const;
  void require_array(const Json& value, const std::string& pointer, const std::string& what) const;

  /// Every key of `object` must be in `allowed`; the message lists the allowed keys.
  void check_keys(const Json& object, const std::string& pointer, const Keys& allowed,
                  const std::string& what) const;

  /// The member `key` of `object`, nullptr when absent.
  static const Json* find(const Json& object, std::string_view key);

  /// A non-empty JSON string.
  std::string string(const Json& value, const std::string& pointer, const std::string& what) const;
  std::string required_string(const Json& object, const std::string& pointer, std::string_view key,
                              const std::string& what) const;
  std::optional<std::string> optional_string(const Json& object, const std::string& pointer,
                                             std::string_view key, const std::string& what) const;

  /// A quantity in the base unit `unit`: a JSON number in SI units or an
  /// engineering-notation string ("100n", "10MHz").
  double quantity(const Json& value, const std::string& pointer, std::string_view unit) const;
  std::optional<double> optional_quantity(const Json& object, const std::string& pointer, std::string_view key,
                                          std::string_view unit) const;
  double required_quantity(const Json& object, const std::string& pointer, std::string_view key,
                           std::string_view unit) const;

  /// A whole number (JSON integer) in int range; domain checks are the caller's.
  int integer(const Json& value, const std::string& pointer) const;
  std::optional<int> optional_integer(const Json& object, const std::string& pointer, std::string_view key) const;

  /// An area in m^2: a number, or a string ending in m^2, cm^2 or mm^2 (also m2, cm2, mm2).
  double area(const Json& value, const std::string& pointer) const;

  /// Runs `check` and re-throws an InputError raised by a validate() that does not know
  /// the file or the pointer prefix (e.g. FrequencyGridOptions::validate names "start"),
  /// with the file set and the field placed under `prefix`.
  template <class F>
  void within(const std::string& prefix, F&& check) const {
    try {
      check();
    } catch (const InputError& e) {
      InputLocation where = e.where();
      where.file = file_;
      where.field = where.field.empty() ? prefix : child(prefix, where.field);
      throw InputError(where, e.expected(), e.found());
    }
  }

  /// An example spelling of a value in `unit`, for messages ("100n" for "F").
  static std::string example(std::string_view unit);

 private:
  std::string file_;
};

}  // namespace quietrail::detail
