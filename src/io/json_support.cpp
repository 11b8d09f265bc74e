// SPDX-License-Identifier: MIT
// Private helpers shared by the JSON readers in src/io/ (see json_support.hpp).
#include "io/json_support.hpp"

#include <cerrno>
#include <cstdint>
#include <cstring>
#include <fstream>
#include <functional>
#include <limits>
#include <set>
#include <sstream>
#include <system_error>

#include "quietrail/units.hpp"

namespace quietrail::detail {
namespace {

// nlohmann's message without its "[json.exception...] parse error at line 3, column 5: "
// head, which we replace with our own location.
std::string parser_reason(const std::string& what) {
  const std::size_t head = what.find("] ");
  const std::size_t colon = what.find(": ", head == std::string::npos ? 0 : head);
  if (colon == std::string::npos) return what;
  return what.substr(colon + 2);
}

// Remembers the first key that appears twice in one object while nlohmann parses
// (nlohmann keeps the last silently, which would hide a typo'd copy-paste).
class DuplicateKeyWatch {
 public:
  bool operator()(int /*depth*/, Json::parse_event_t event, Json& parsed) {
    switch (event) {
      case Json::parse_event_t::object_start: stack_.push_back(Frame{.array = false}); break;
      case Json::parse_event_t::array_start: stack_.push_back(Frame{.array = true}); break;
      case Json::parse_event_t::key: {
        Frame& frame = stack_.back();
        frame.key = parsed.get<std::string>();
        if (!frame.seen.insert(frame.key).second && !duplicate_) duplicate_ = {container_pointer(), frame.key};
        break;
      }
      case Json::parse_event_t::object_end:
      case Json::parse_event_t::array_end:
        stack_.pop_back();
        element_done();
        break;
      case Json::parse_event_t::value: element_done(); break;
    }
    return true;
  }

  // The pointer of the object holding the duplicate and the key, if one was seen.
  const std::optional<std::pair<std::string, std::string>>& duplicate() const { return duplicate_; }

 private:
  struct Frame {
    bool array = false;
    std::size_t index = 0;
    std::string key{};
    std::set<std::string> seen{};
  };

  void element_done() {
    if (!stack_.empty() && stack_.back().array) ++stack_.back().index;
  }

  // Pointer of the innermost container: each ancestor contributes the key or index
  // under which its child was found.
  std::string container_pointer() const {
    std::string pointer;
    for (std::size_t i = 0; i + 1 < stack_.size(); ++i)
      pointer = stack_[i].array ? child(pointer, stack_[i].index) : child(pointer, stack_[i].key);
    return pointer;
  }

  std::vector<Frame> stack_;
  std::optional<std::pair<std::string, std::string>> duplicate_;
};

}  // namespace

// ---------------------------------------------------------------- small helpers

std::string join(const Keys& keys) {
  std::string out;
  for (const auto key : keys) {
    if (!out.empty()) out += ", ";
    out += key;
  }
  return out;
}

bool contains(const Keys& keys, std::string_view key) {
  for (const auto k : keys)
    if (k == key) return true;
  return false;
}

std::string pointer_token(std::string_view key) {
  std::string out;
  for (const char c : key) {
    if (c == '~') out += "~0";
    else if (c == '/') out += "~1";
    else out += c;
  }
  return out;
}

std::string child(const std::string& pointer, std::string_view key) {
  std::string out = pointer;
  out += '/';
  out += pointer_token(key);
  return out;
}

std::string child(const std::string& pointer, std::size_t index) { return child(pointer, std::to_string(index)); }

std::string describe(const Json& value) {
  std::string text = value.dump();
  if (text.size() > 40) text = text.substr(0, 37) + "...";
  if (value.is_object()) return "an object";
  if (value.is_array()) return "an array";
  if (value.is_null()) return "null";
  std::string out = std::string(value.type_name());
  out.append(" ").append(text);
  return out;
}

std::pair<int, int> line_and_column(std::string_view text, std::size_t byte) {
  const std::size_t end = std::min(byte == 0 ? 0 : byte - 1, text.size());
  int line = 1;
  std::size_t line_start = 0;
  for (std::size_t i = 0; i < end; ++i) {
    if (text[i] == '\n') {
      ++line;
      line_start = i + 1;
    }
  }
  return {line, static_cast<int>(end - line_start) + 1};
}

Json parse_json_text(std::string_view text, const std::string& file) {
  DuplicateKeyWatch watch;
  Json root;
  try {
    root = Json::parse(text.begin(), text.end(), std::ref(watch));
  } catch (const Json::parse_error& e) {
    const auto [line, column] = line_and_column(text, e.byte);
    throw InputError({file, "", line, column}, "valid JSON", parser_reason(e.what()));
  } catch (const Json::exception& e) {
    throw InputError({file, ""}, "valid JSON", parser_reason(e.what()));
  }
  if (const auto& dup = watch.duplicate())
    throw InputError({file, child(dup->first, dup->second)}, "each key once per object",
                     "'" + dup->second + "' given twice");
  return root;
}

std::string read_text_file(const std::filesystem::path& path, const std::string& what) {
  const std::string file = path.string();
  std::error_code error;
  if (!std::filesystem::is_regular_file(path, error))
    throw InputError({file, ""}, what, std::filesystem::exists(path, error) ? "not a regular file" : "no such file");
  std::ifstream stream(path, std::ios::binary);
  if (!stream) throw InputError({file, ""}, what, std::strerror(errno));
  std::ostringstream text;
  text << stream.rdbuf();
  if (stream.bad()) throw InputError({file, ""}, what, "a read error");
  return text.str();
}

// ---------------------------------------------------------------- JsonReader

void JsonReader::fail(const std::string& pointer, const std::string& expected, const std::string& found) const {
  throw InputError({file_, pointer}, expected, found);
}

void JsonReader::require_object(const Json& value, const std::string& pointer, const std::string& what) const {
  if (!value.is_object()) fail(pointer, what + " (a JSON object)", describe(value));
}

void JsonReader::require_array(const Json& value, const std::string& pointer, const std::string& what) const {
  if (!value.is_array()) fail(pointer, what + " (a JSON array)", describe(value));
}

void JsonReader::check_keys(const Json& object, const std::string& pointer, const Keys& allowed,
                            const std::string& what) const {
  for (const auto& item : object.items()) {
    if (!contains(allowed, item.key()))
      fail(child(pointer, item.key()), "one of the keys of " + what + ": " + join(allowed),
           "the unknown key '" + item.key() + "'");
  }
}

const Json* JsonReader::find(const Json& object, std::string_view key) {
  if (!object.is_object()) return nullptr;
  const auto it = object.find(key);
  return it == object.end() ? nullptr : &*it;
}

std::string JsonReader::string(const Json& value, const std::string& pointer, const std::string& what) const {
  if (!value.is_string()) fail(pointer, what + " (a JSON string)", describe(value));
  std::string text = value.get<std::string>();
  if (text.empty()) fail(pointer, what + " (a non-empty string)", "an empty string");
  return text;
}

std::string JsonReader::required_string(const Json& object, const std::string& pointer, std::string_view key,
                                        const std::string& what) const {
  const Json* value = find(object, key);
  if (!value) fail(child(pointer, key), what + " (a JSON string)", "nothing: the key is missing");
  return string(*value, child(pointer, key), what);
}

std::optional<std::string> JsonReader::optional_string(const Json& object, const std::string& pointer,
                                                       std::string_view key, const std::string& what) const {
  const Json* value = find(object, key);
  if (!value) return std::nullopt;
  return string(*value, child(pointer, key), what);
}

double JsonReader::quantity(const Json& value, const std::string& pointer, std::string_view unit) const {
  if (value.is_number()) return value.get<double>();
  if (value.is_string()) return parse_value(value.get<std::string>(), unit, {file_, pointer});
  std::string expected = "a number";
  if (!unit.empty()) expected.append(" in ").append(unit);
  fail(pointer, expected + " or an engineering-notation string such as \"" + example(unit) + "\"", describe(value));
}

std::optional<double> JsonReader::optional_quantity(const Json& object, const std::string& pointer,
                                                    std::string_view key, std::string_view unit) const {
  const Json* value = find(object, key);
  if (!value) return std::nullopt;
  return quantity(*value, child(pointer, key), unit);
}

double JsonReader::required_quantity(const Json& object, const std::string& pointer, std::string_view key,
                                     std::string_view unit) const {
  const Json* value = find(object, key);
  if (!value) {
    std::string expected = "a value";
    if (!unit.empty()) expected.append(" in ").append(unit);
    fail(child(pointer, key), expected + " such as \"" + example(unit) + "\"", "nothing: the key is missing");
  }
  return quantity(*value, child(pointer, key), unit);
}

int JsonReader::integer(const Json& value, const std::string& pointer) const {
  if (value.is_number_unsigned()) {
    const auto v = value.get<std::uint64_t>();
    if (v > static_cast<std::uint64_t>(std::numeric_limits<int>::max()))
      fail(pointer, "a whole number up to " + std::to_string(std::numeric_limits<int>::max()), describe(value));
    return static_cast<int>(v);
  }
  if (value.is_number_integer()) {
    const auto v = value.get<std::int64_t>();
    if (v < std::numeric_limits<int>::min()) fail(pointer, "a whole number", describe(value));
    return static_cast<int>(v);
  }
  fail(pointer, "a whole number (a JSON integer such as 4)", describe(value));
}

std::optional<int> JsonReader::optional_integer(const Json& object, const std::string& pointer,
                                                std::string_view key) const {
  const Json* value = find(object, key);
  if (!value) return std::nullopt;
  return integer(*value, child(pointer, key));
}

double JsonReader::area(const Json& value, const std::string& pointer) const {
  static const std::string kExpected = "an area such as \"100cm^2\", \"2500mm^2\" or 0.01 (m^2)";
  if (value.is_number()) return value.get<double>();
  if (!value.is_string()) fail(pointer, kExpected, describe(value));
  std::string text = value.get<std::string>();
  double scale = 1.0;
  const std::pair<std::string_view, double> suffixes[] = {{"mm^2", 1e-6}, {"cm^2", 1e-4}, {"m^2", 1.0},
                                                          {"mm2", 1e-6},  {"cm2", 1e-4},  {"m2", 1.0}};
  for (const auto& [suffix, factor] : suffixes) {
    if (text.size() >= suffix.size() && text.compare(text.size() - suffix.size(), suffix.size(), suffix) == 0) {
      text.resize(text.size() - suffix.size());
      scale = factor;
      break;
    }
  }
  try {
    return parse_value(text, "", {file_, pointer}) * scale;
  } catch (const InputError&) {
    fail(pointer, kExpected, "'" + value.get<std::string>() + "'");
  }
}

std::string JsonReader::example(std::string_view unit) {
  if (unit == "F") return "100n";
  if (unit == "H") return "0.5n";
  if (unit == "ohm") return "20m";
  if (unit == "Hz") return "10MHz";
  if (unit == "m") return "1.6mm";
  if (unit == "V") return "1.2";
  if (unit == "A") return "10";
  if (unit == "s") return "1ns";
  return "2.5";
}

}  // namespace quietrail::detail
