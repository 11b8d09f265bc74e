// SPDX-License-Identifier: MIT
#include "quietrail/error.hpp"

#include <sstream>

namespace quietrail {
namespace {

std::string compose(const InputLocation& where, const std::string& expected,
                    const std::string& found) {
  std::ostringstream out;
  if (!where.file.empty()) {
    out << where.file;
    if (where.line > 0) {
      out << ':' << where.line;
      if (where.column > 0) out << ':' << where.column;
    }
    out << ": ";
  }
  if (!where.field.empty()) out << where.field << ": ";
  out << "expected " << expected;
  if (!found.empty()) out << ", found " << found;
  return out.str();
}

}  // namespace

InputError::InputError(InputLocation where, std::string expected, std::string found)
    : std::runtime_error(compose(where, expected, found)),
      where_(std::move(where)),
      expected_(std::move(expected)),
      found_(std::move(found)) {}

void require_input(bool ok, const InputLocation& where, const std::string& expected,
                   const std::string& found) {
  if (!ok) throw InputError(where, expected, found);
}

namespace detail {
void internal_failure(const char* condition, const char* file, int line) {
  std::ostringstream out;
  out << "internal error: " << condition << " failed at " << file << ':' << line;
  throw InternalError(out.str());
}
}  // namespace detail

}  // namespace quietrail
