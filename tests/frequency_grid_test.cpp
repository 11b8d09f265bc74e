// SPDX-License-Identifier: MIT
// The log-spaced sweep axis: point counts, spacing and edges from closed forms.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

#include "quietrail/error.hpp"
#include "quietrail/frequency_grid.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::FrequencyGrid;
using quietrail::FrequencyGridOptions;
using quietrail::InputError;

namespace {
// pow() and the product start * 10^(k/ppd) are each good to a few ulps.
constexpr double kSpacingTolerance = 1e-12;
}  // namespace

TEST_CASE("1 kHz to 1 GHz at 50 per decade has 301 log-spaced points with exact edges", "[units]") {
  const FrequencyGrid grid(FrequencyGridOptions{.start = 1e3, .stop = 1e9, .points_per_decade = 50});
  // Closed form: 6 decades * 50 steps = 300 intervals, 301 points.
  REQUIRE(grid.size() == 301);
  CHECK(grid[0] == 1e3);
  CHECK(grid[300] == 1e9);
  // Log spacing: every ratio is 10^(1/50) (closed form), and f_k = 1e3 * 10^(k/50).
  const double ratio = std::pow(10.0, 1.0 / 50.0);
  for (std::size_t i = 1; i < grid.size(); ++i) CHECK_THAT(grid[i] / grid[i - 1], WithinRel(ratio, kSpacingTolerance));
  // Decade points fall on the grid: k = 50 is 10 kHz, k = 150 is 1 MHz.
  CHECK_THAT(grid[50], WithinRel(1e4, kSpacingTolerance));
  CHECK_THAT(grid[150], WithinRel(1e6, kSpacingTolerance));
}

TEST_CASE("a band that is not whole decades keeps a partial last step of a quarter step or more", "[units]") {
  SECTION("1 kHz to 3 MHz at 10 per decade: 34.77 steps -> 34 whole + 1 partial, 36 points") {
    // 10 * log10(3000) = 34.771 (closed form); the partial 0.771 >= 1/4 is kept.
    const FrequencyGrid grid(FrequencyGridOptions{.start = 1e3, .stop = 3e6, .points_per_decade = 10});
    REQUIRE(grid.size() == 36);
    CHECK(grid[0] == 1e3);
    CHECK(grid[35] == 3e6);
    CHECK_THAT(grid[34], WithinRel(1e3 * std::pow(10.0, 3.4), kSpacingTolerance));
    // The last step is the partial one: 3e6 / 10^6.4 = 10^(log10(3e6) - 6.4).
    CHECK_THAT(grid[35] / grid[34], WithinRel(std::pow(10.0, std::log10(3e6) - 6.4), kSpacingTolerance));
  }
  SECTION("1 kHz to 1.05 MHz at 10 per decade: 30.21 steps -> the sliver merges, 31 points") {
    // 10 * log10(1050) = 30.212; the partial 0.212 < 1/4 is merged into the 30th step.
    const FrequencyGrid grid(FrequencyGridOptions{.start = 1e3, .stop = 1.05e6, .points_per_decade = 10});
    REQUIRE(grid.size() == 31);
    CHECK(grid[30] == 1.05e6);
    CHECK_THAT(grid[29], WithinRel(1e3 * std::pow(10.0, 2.9), kSpacingTolerance));
    // No step is shorter than a whole step: 1.05e6 / 10^5.9 = 1.3219 > 10^0.1 = 1.2589.
    CHECK(grid[30] / grid[29] > std::pow(10.0, 0.1));
  }
  SECTION("a band narrower than a quarter step still has both edges") {
    const FrequencyGrid grid(FrequencyGridOptions{.start = 1e6, .stop = 1.01e6, .points_per_decade = 1});
    REQUIRE(grid.size() == 2);
    CHECK(grid[0] == 1e6);
    CHECK(grid[1] == 1.01e6);
  }
  SECTION("one point per decade over 2 decades gives 3 points") {
    const FrequencyGrid grid(FrequencyGridOptions{.start = 10.0, .stop = 1000.0, .points_per_decade = 1});
    REQUIRE(grid.size() == 3);
    CHECK_THAT(grid[1], WithinRel(100.0, kSpacingTolerance));
  }
}

TEST_CASE("grid options that cannot form a band are rejected naming the field", "[units]") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double inf = std::numeric_limits<double>::infinity();
  auto fails_on = [](FrequencyGridOptions options, const char* field) {
    try {
      options.validate();
      FAIL("accepted an invalid option for " << field);
    } catch (const InputError& e) {
      CHECK(e.where().field == field);
    }
    CHECK_THROWS_AS(FrequencyGrid(options), InputError);
  };
  fails_on({.start = 0.0}, "start");
  fails_on({.start = -1e3}, "start");
  fails_on({.start = nan}, "start");
  fails_on({.start = 1e3, .stop = nan}, "stop");
  fails_on({.start = 1e3, .stop = inf}, "stop");
  fails_on({.start = 1e6, .stop = 1e6}, "stop");
  fails_on({.start = 1e6, .stop = 1e3}, "stop");
  fails_on({.points_per_decade = 0}, "points_per_decade");
  fails_on({.points_per_decade = -5}, "points_per_decade");
  fails_on({.points_per_decade = quietrail::kMaxPointsPerDecade + 1}, "points_per_decade");
  // 600 decades at 10000 per decade: 6e6 points, above kMaxGridPoints.
  fails_on({.start = 1e-300, .stop = 1e300, .points_per_decade = 10000}, "points_per_decade");
  const FrequencyGridOptions reversed{.start = 1e6, .stop = 1e3};
  CHECK_THROWS_WITH(reversed.validate(), Contains("above the start"));
}

TEST_CASE("an explicit frequency list must be positive and strictly increasing", "[units]") {
  CHECK(FrequencyGrid(std::vector<double>{1.0, 2.0, 5.0}).size() == 3);
  CHECK_THROWS_AS(FrequencyGrid(std::vector<double>{}), InputError);
  CHECK_THROWS_WITH(FrequencyGrid(std::vector<double>{1.0, 1.0}), Contains("frequencies[1]"));
  CHECK_THROWS_WITH(FrequencyGrid(std::vector<double>{-1.0, 1.0}), Contains("frequencies[0]"));
  CHECK_THROWS_WITH(FrequencyGrid(std::vector<double>{1.0, std::numeric_limits<double>::quiet_NaN()}),
                    Contains("frequencies[1]"));
}
