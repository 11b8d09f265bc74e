// SPDX-License-Identifier: MIT
// The two kinds of failure that are exceptions: bad input (InputError, exit 2 in
// the CLI) and bugs (InternalError, exit 3). Legitimate outcomes such as "target
// not met" are results, never exceptions.
#pragma once

#include <stdexcept>
#include <string>

namespace quietrail {

/// Where a bad value came from: a file (or "command line"), a field path and a line.
struct InputLocation {
  std::string file;   ///< file name, "command line", or empty when built in code
  std::string field;  ///< field path, e.g. "/branches/3/esr" or "--capacitance"
  int line = 0;       ///< 1-based line number, 0 when unknown
  int column = 0;     ///< 1-based column, 0 when unknown
};

/// Bad input: names the file, field (and line where known), what was expected and what was found.
class InputError : public std::runtime_error {
 public:
  InputError(InputLocation where, std::string expected, std::string found = {});

  const InputLocation& where() const { return where_; }
  const std::string& expected() const { return expected_; }
  const std::string& found() const { return found_; }

 private:
  InputLocation where_;
  std::string expected_;
  std::string found_;
};

/// A broken invariant inside the library: a bug to report, never the user's fault.
class InternalError : public std::logic_error {
 public:
  using std::logic_error::logic_error;
};

/// Throws InputError for `field` in `where` unless `ok`. The one helper used by validate().
void require_input(bool ok, const InputLocation& where, const std::string& expected,
                   const std::string& found = {});

namespace detail {
[[noreturn]] void internal_failure(const char* condition, const char* file, int line);
}  // namespace detail

}  // namespace quietrail

/// Checks an invariant in every build type; throws InternalError so callers can clean up.
#define QUIETRAIL_ASSERT(cond) \
  ((cond) ? static_cast<void>(0) : ::quietrail::detail::internal_failure(#cond, __FILE__, __LINE__))
