// SPDX-License-Identifier: MIT
// End-to-end `quietrail compare`: exit codes (0 second configuration meets its target, 1 not,
// 2 bad input), the four files written, nothing written on bad input, --json parses. The
// expected behaviour is the documented contract (docs/compare.md); the rail's numbers come
// from the REFERENCES §3 two-branch closed form, as noted beside each check.
#include <catch2/catch.hpp>

#include <filesystem>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "support/cli_runner.hpp"
#include "support/temp_dir.hpp"

namespace fs = std::filesystem;
using Catch::Matchers::Contains;
using quietrail::test::list_names;
using quietrail::test::read_text;
using quietrail::test::TempDir;
using quietrail::test::write_text;

namespace {

const fs::path kCli = QUIETRAIL_CLI_PATH;

// Three groups of series R-L-C capacitors (10 uF, 1 uF, 100 nF; 5 mohm, 1 nH mounted) on a
// 0.3 ohm + 1 uH regulator. Removing the 1 uF group leaves the 10 uF / 100 nF
// anti-resonance at about 0.49 ohm (REFERENCES §3 worked example), above a 50 mohm target.
std::string rail(const std::string& target) {
  return R"({
  "name": "three_groups",
  "rail": {"voltage": 1.0, "ripple": "5%", "max_current": 1,
           "band": {"start": "1k", "stop": "100MHz", "points_per_decade": 40}},
  "target": ")" + target + R"(",
  "regulator": {"resistance": 0.3, "inductance": "1u"},
  "bom": [
    {"part": {"kind": "capacitor", "capacitance": "10u", "esr": "5m", "esl": "0.5n"}, "mounting": "0.5n", "name": "c10u"},
    {"part": {"kind": "capacitor", "capacitance": "1u", "esr": "5m", "esl": "0.5n"}, "mounting": "0.5n", "name": "c1u"},
    {"part": {"kind": "capacitor", "capacitance": "100n", "esr": "5m", "esl": "0.5n"}, "mounting": "0.5n", "name": "c100n"}
  ]
})";
}

quietrail::test::CliRun run_cli(const TempDir& dir, const std::vector<std::string>& args) {
  return quietrail::test::run_cli(kCli, dir.path(), args);
}

const std::vector<std::string> kFiles{"three_groups_compare.html", "three_groups_compare.json",
                                      "three_groups_compare.svg", "three_groups_compare_curves.csv"};

}  // namespace

TEST_CASE("compare with an edit writes four files and exits 1 when the edited rail fails", "[cli][compare]") {
  const TempDir dir("compare-cli");
  write_text(dir / "rail.json", rail("50m"));
  const auto out = dir / "out";
  const auto run = run_cli(dir, {"compare", (dir / "rail.json").string(), "--remove", "c1u", "--out", out.string()});
  INFO(run.out << run.err);
  CHECK(run.exit_code == 1);  // 0.49 ohm peak against 50 mohm (REFERENCES §3)
  CHECK(list_names(out) == kFiles);
  CHECK_THAT(run.out, Contains("remove c1u"));
  CHECK_THAT(read_text(out / "three_groups_compare.html"), Contains("<svg"));
  CHECK_THAT(read_text(out / "three_groups_compare_curves.csv"), Contains("edited abs_ohm"));

  const auto json = nlohmann::json::parse(read_text(out / "three_groups_compare.json"));
  CHECK(json["other"]["verdict"] == "fail");
  CHECK(json["edits"].size() == 1);
  CHECK(json["diff"]["totals"]["capacitor_count"] == -1);  // one capacitor removed
}

TEST_CASE("compare --json prints the JSON report and two passing files exit 0", "[cli][compare]") {
  const TempDir dir("compare-cli-json");
  // A 2 ohm target is above every peak of either rail (0.49 ohm at most, REFERENCES §3; the
  // regulator/bulk resonance is damped by the 0.3 ohm regulator).
  write_text(dir / "a.json", rail("2"));
  write_text(dir / "b.json", rail("2"));
  const auto run = run_cli(dir, {"compare", (dir / "a.json").string(), (dir / "b.json").string(), "--json", "--out",
                                 (dir / "out").string()});
  INFO(run.err);
  CHECK(run.exit_code == 0);
  const auto json = nlohmann::json::parse(run.out);
  CHECK(json["base"]["verdict"] == "pass");
  CHECK(json["other"]["verdict"] == "pass");
  // The same rail twice: every peak matched with itself, no frequency shift.
  CHECK(json["diff"]["only_in_base"].empty());
  CHECK(json["diff"]["only_in_other"].empty());
  for (const auto& m : json["diff"]["matched_peaks"]) CHECK(m["frequency_ratio"] == 1.0);
}

TEST_CASE("compare refuses bad edits with exit 2 and writes nothing", "[cli][compare]") {
  const TempDir dir("compare-cli-bad");
  write_text(dir / "rail.json", rail("50m"));
  const auto out = dir / "out";
  const std::string base = (dir / "rail.json").string();
  SECTION("unknown name") {
    const auto run = run_cli(dir, {"compare", base, "--remove", "c1", "--out", out.string()});
    CHECK(run.exit_code == 2);
    CHECK_THAT(run.err, Contains("--remove"));
    CHECK_THAT(run.err, Contains("c1u"));  // nearest names suggested
  }
  SECTION("negative count") {
    const auto run = run_cli(dir, {"compare", base, "--count", "c1u=-3", "--out", out.string()});
    CHECK(run.exit_code == 2);
    CHECK_THAT(run.err, Contains("--count"));
  }
  SECTION("edits file with a bad entry") {
    write_text(dir / "edits.json", R"([{"remove": "c1u"}, {"count": "c100n", "to": -1}])");
    const auto run = run_cli(dir, {"compare", base, "--edits", (dir / "edits.json").string(), "--out", out.string()});
    CHECK(run.exit_code == 2);
    CHECK_THAT(run.err, Contains("edits.json"));
    CHECK_THAT(run.err, Contains("/1/to"));
  }
  SECTION("nothing to compare with") {
    const auto run = run_cli(dir, {"compare", base, "--out", out.string()});
    CHECK(run.exit_code == 2);
  }
  SECTION("removing every line leaves no BOM") {
    const auto run = run_cli(dir, {"compare", base, "--remove", "c1u", "--remove", "c10u", "--remove", "c100n", "--out",
                                   out.string()});
    CHECK(run.exit_code == 2);
  }
  CHECK(list_names(out).empty());
}
