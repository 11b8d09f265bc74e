// SPDX-License-Identifier: MIT
#include <catch2/catch.hpp>
#include "quietrail/models/capacitor.hpp"
TEST_CASE("placeholder", "[models]") { CHECK(true); }
