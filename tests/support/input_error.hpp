// SPDX-License-Identifier: MIT
// Test helper: the message of the InputError a callable throws, or "" when none is thrown.
#pragma once

#include <string>

#include "quietrail/error.hpp"

namespace quietrail::test {

template <class F>
std::string input_error_of(F&& f) {
  try {
    f();
  } catch (const quietrail::InputError& e) {
    return e.what();
  }
  return {};
}

}  // namespace quietrail::test
