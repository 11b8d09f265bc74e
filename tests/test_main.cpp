// SPDX-License-Identifier: MIT
// Catch2's main, alone in its translation unit so test files rebuild quickly.
#define CATCH_CONFIG_MAIN
#include <catch2/catch.hpp>
