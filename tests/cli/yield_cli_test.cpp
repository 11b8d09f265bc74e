// SPDX-License-Identifier: MIT
// End-to-end `quietrail yield`: the core-rail example (exit 0, both files, the summary
// agrees with the library run on one thread for the same seed), and bad trial counts
// (exit 2, the field and the cap named, nothing written).
#include <catch2/catch.hpp>

#include <filesystem>
#include <string>
#include <variant>
#include <vector>

#include <nlohmann/json.hpp>

#include "quietrail/analysis/yield.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/io/project_file.hpp"
#include "support/cli_runner.hpp"
#include "support/temp_dir.hpp"

namespace fs = std::filesystem;
using Catch::Matchers::Contains;
using quietrail::test::read_text;
using quietrail::test::TempDir;

namespace {

const fs::path kSourceDir = QUIETRAIL_SOURCE_DIR;
const fs::path kCli = QUIETRAIL_CLI_PATH;
const fs::path kCoreRail = kSourceDir / "examples" / "projects" / "core_rail.json";

std::size_t count_lines(const std::string& text) {
  std::size_t lines = 0;
  for (const char c : text) lines += c == '\n' ? 1 : 0;
  return lines;
}

}  // namespace

TEST_CASE("yield on the core-rail example writes its summary and curves", "[cli][yield]") {
  const TempDir dir("yield-cli");
  const auto run = quietrail::test::run_cli(
      kCli, dir.path(), {"yield", kCoreRail.string(), "--trials", "300", "--seed", "4", "--out", (dir / "out").string()});
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  CHECK_THAT(run.out, Contains("yield "));
  const auto summary = nlohmann::json::parse(read_text(dir / "out" / "core_rail_yield.json"));
  const std::size_t passes = summary.at("passes").get<std::size_t>();
  CHECK(summary.at("trials").get<std::size_t>() == 300);
  CHECK(summary.at("yield").get<double>() == static_cast<double>(passes) / 300.0);
  // The CLI's threads (all cores) and the library on one thread give the same builds
  // (determinism by seed, analysis/yield.hpp).
  const quietrail::Project project = quietrail::read_project_file(kCoreRail);
  const auto library = quietrail::run_yield(quietrail::yield_problem(project),
                                            {.trials = 300, .seed = 4, .threads = 1, .refine_worst = false});
  CHECK(library.passes == passes);
  CHECK(summary.at("worst").at("draw").at("trial").get<std::size_t>() == library.worst_trial);

  // The worst trial saved as a project: `check`'s reader gives the drawn capacitances and
  // the refined worst ratio the yield run reported for that trial.
  const quietrail::Project worst = quietrail::read_project_file(dir / "out" / "core_rail_yield_worst.json");
  const quietrail::CheckResult recheck =
      quietrail::run_check(worst.network, worst.port, *worst.target, worst.check_options());
  CHECK_THAT(recheck.worst_ratio,
             Catch::Matchers::WithinRel(summary.at("worst").at("check").at("worst_ratio").get<double>(), 1e-12));
  for (const auto& part : summary.at("worst").at("draw").at("parts")) {
    const auto branch = worst.network.find_branch(part.at("branch").get<std::string>());
    REQUIRE(branch);
    const auto& c = std::get<quietrail::Capacitor>(worst.network.branches()[static_cast<std::size_t>(*branch)].part.element);
    CHECK(c.capacitance == part.at("capacitance").get<double>());
  }

  // One CSV row per grid point of the project's band, after the header.
  const std::string csv = read_text(dir / "out" / "core_rail_yield_curves.csv");
  CHECK_THAT(csv, Contains("p5_ohm,p50_ohm,p95_ohm"));
  CHECK(count_lines(csv) == quietrail::FrequencyGrid(project.band).size() + 1);
}

TEST_CASE("yield rejects a zero or absurd trial count with exit 2 and writes nothing", "[cli][yield]") {
  const std::string count = GENERATE(std::string("0"), std::string("5000000"));
  const TempDir dir("yield-cli-bad");
  const fs::path out = dir / "out";
  const auto run =
      quietrail::test::run_cli(kCli, dir.path(), {"yield", kCoreRail.string(), "--trials", count, "--out", out.string()});
  CHECK(run.exit_code == 2);
  CHECK_THAT(run.err, Contains("trials"));
  CHECK_THAT(run.err, Contains("1000000"));  // the cap is named
  CHECK_FALSE(fs::exists(out));
}
