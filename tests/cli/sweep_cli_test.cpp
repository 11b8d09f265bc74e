// SPDX-License-Identifier: MIT
// End-to-end `quietrail sweep`: runs the built binary on the examples and on bad input,
// checks exit codes, the CSV against closed forms, stderr, leftovers and colour rules.
#include <catch2/catch.hpp>

#include <unistd.h>

#include <cctype>
#include <cmath>
#include <complex>
#include <cstdlib>
#include <filesystem>
#include <numbers>
#include <sstream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "support/cli_runner.hpp"
#include "support/temp_dir.hpp"

namespace fs = std::filesystem;
using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::test::list_names;
using quietrail::test::read_text;
using quietrail::test::TempDir;
using quietrail::test::write_text;

namespace {

// The CSV prints 10 significant digits.
constexpr double kPrinted10 = 5e-9;
// Check values printed in REFERENCES.md to 4-5 significant figures.
constexpr double kReference = 1e-3;

const fs::path kSourceDir = QUIETRAIL_SOURCE_DIR;
const fs::path kCli = QUIETRAIL_CLI_PATH;

using Run = quietrail::test::CliRun;

// Runs the CLI with `args`, stdout and stderr captured (support/cli_runner.hpp).
Run run_cli(const TempDir& dir, const std::vector<std::string>& args) {
  return quietrail::test::run_cli(kCli, dir.path(), args);
}

std::vector<std::vector<std::string>> read_csv(const fs::path& path) {
  std::vector<std::vector<std::string>> rows;
  std::istringstream lines(read_text(path));
  std::string line;
  while (std::getline(lines, line)) {
    std::vector<std::string> cells;
    std::istringstream cells_in(line);
    std::string cell;
    while (std::getline(cells_in, cell, ',')) cells.push_back(cell);
    rows.push_back(cells);
  }
  return rows;
}

// Series RLC (REFERENCES §2): Z = ESR + j(2 pi f L - 1/(2 pi f C)).
std::complex<double> series_rlc(double f, double c, double l, double r) {
  const double w = 2.0 * std::numbers::pi * f;
  return {r, w * l - 1.0 / (w * c)};
}

// Runs the CLI on a pseudo-terminal with NO_COLOR set to `no_color` (nullptr: unset) and
// returns everything it wrote (support/cli_runner.hpp).
std::string run_on_terminal(const std::vector<std::string>& args, const char* no_color) {
  const Run run = quietrail::test::run_on_terminal(kCli, args, no_color);
  CHECK(run.exit_code == 0);
  return run.out;
}

const char* const kOneCapacitor = R"({
  "name": "one_cap",
  "port": "rail",
  "sweep": {"start": "1MHz", "stop": "100MHz", "points_per_decade": 10},
  "branches": [
    {"name": "C1", "kind": "capacitor", "capacitance": "100n", "esl": "0.5n", "esr": "20m"}
  ]
})";

}  // namespace

TEST_CASE("sweep of the core rail example writes 301 rows over 1 kHz to 1 GHz and exits 0", "[cli]") {
  TempDir dir("sweep");
  const Run run = run_cli(dir, {"sweep", (kSourceDir / "examples/projects/core_rail_network.json").string(), "--out",
                                (dir / "out").string()});
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  const fs::path csv = dir / "out" / "core_rail_impedance.csv";
  REQUIRE(fs::exists(csv));
  const auto rows = read_csv(csv);
  // Header + 6 decades * 50 points per decade + 1 (closed-form grid count).
  REQUIRE(rows.size() == 302);
  CHECK(rows[0][0] == "frequency_Hz");
  CHECK(std::stod(rows[1][0]) == 1e3);
  CHECK(std::stod(rows[301][0]) == 1e9);
  CHECK_THAT(run.out, Contains("parallel fast path"));
  CHECK_THAT(run.out, Contains("301 points"));
  CHECK_THAT(run.out, Contains("mlcc_100n_0402"));
  CHECK_THAT(run.out, Contains("Wrote " + csv.string()));
  CHECK_THAT(run.out, Contains("Planning estimate: confirm on hardware"));
  CHECK(run.out.find('\x1b') == std::string::npos);  // not a terminal: no colour
  {
    // The branch table is aligned: every row's right-aligned count ends under "Count".
    std::istringstream lines(run.out);
    std::string line;
    std::size_t count_end = std::string::npos;
    int rows_checked = 0;
    while (std::getline(lines, line)) {
      if (line.find("Branch") != std::string::npos && line.find("Count") != std::string::npos) {
        count_end = line.find("Count") + 5;
      } else if (count_end != std::string::npos && line.find("mlcc_") != std::string::npos) {
        REQUIRE(line.size() > count_end);
        CHECK(std::isdigit(static_cast<unsigned char>(line[count_end - 1])));
        CHECK(line[count_end] == ' ');
        ++rows_checked;
      }
    }
    CHECK(rows_checked == 4);
  }
  CHECK(list_names(dir / "out") == std::vector<std::string>{"core_rail_impedance.csv"});
}

TEST_CASE("the bead-filtered example is solved by nodal analysis", "[cli]") {
  TempDir dir("sweep");
  const Run run = run_cli(dir, {"sweep", (kSourceDir / "examples/projects/filtered_analog_network.json").string(),
                                "--out", (dir / "out").string(), "--json"});
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  const auto report = nlohmann::json::parse(run.out);
  CHECK(report["solver"] == "nodal");
  CHECK(report["band"]["points"] == 301);
  CHECK(report["branches"].size() == 7);
  CHECK(report["branches"][2]["kind"] == "bead");
  // Bead self-resonance 1/(2 pi sqrt(L C_p)), L = 1 uH, C_p = 1.5 pF: 129.95 MHz (REFERENCES §11).
  CHECK_THAT(report["branches"][2]["srf_hz"].get<double>(), WithinRel(129.95e6, kReference));
  CHECK(fs::exists(dir / "out" / "filtered_analog_impedance.csv"));
}

TEST_CASE("the swept |Z| of one capacitor equals the series RLC closed form", "[cli]") {
  TempDir dir("sweep");
  write_text(dir / "one_cap.json", kOneCapacitor);
  const Run run = run_cli(dir, {"sweep", (dir / "one_cap.json").string(), "--out", (dir / "out").string(), "--json"});
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  const auto rows = read_csv(dir / "out" / "one_cap_impedance.csv");
  // 2 decades at 10 per decade: 21 points (closed form) plus the header.
  REQUIRE(rows.size() == 22);

  // REFERENCES §2 worked value: C = 100 nF, L = 0.5 nH, ESR = 20 mohm -> |Z(1 MHz)| = 1.5885 ohm.
  REQUIRE(std::stod(rows[1][0]) == 1e6);
  CHECK_THAT(std::stod(rows[1][1]), WithinRel(1.5885, kReference));
  // ... and |Z(100 MHz)| = 0.2989 ohm at the last grid point (the stop, exact).
  REQUIRE(std::stod(rows[21][0]) == 1e8);
  CHECK_THAT(std::stod(rows[21][1]), WithinRel(0.2989, kReference));

  // Every row against the closed form, magnitude and phase (atan2(X, R) in degrees).
  for (std::size_t i = 1; i < rows.size(); ++i) {
    const double f = std::stod(rows[i][0]);
    const auto z = series_rlc(f, 100e-9, 0.5e-9, 20e-3);
    INFO("f = " << f);
    CHECK_THAT(std::stod(rows[i][1]), WithinRel(std::abs(z), kPrinted10));
    CHECK_THAT(std::stod(rows[i][2]), WithinRel(std::arg(z) * 180.0 / std::numbers::pi, kPrinted10));
    CHECK_THAT(std::stod(rows[i][3]), WithinRel(z.real(), kPrinted10));
    CHECK_THAT(std::stod(rows[i][4]), WithinRel(z.imag(), kPrinted10));
  }

  const auto report = nlohmann::json::parse(run.out);
  CHECK(report["solver"] == "parallel");
  // SRF = 1/(2 pi sqrt(LC)) = 22.508 MHz (REFERENCES §2).
  CHECK_THAT(report["branches"][0]["srf_hz"].get<double>(), WithinRel(22.508e6, kReference));
}

TEST_CASE("the swept |Z| of a bead-fed capacitor equals the series-parallel closed form", "[cli]") {
  // Not all-parallel, so the nodal path runs. Port "out": C to ground, in parallel with
  // the bead (REFERENCES §11 generic values) in series with a 0.1 ohm source resistor.
  TempDir dir("sweep");
  write_text(dir / "bead.json", R"({
    "name": "bead", "port": "out",
    "sweep": {"start": "10k", "stop": "1G", "points_per_decade": 5},
    "branches": [
      {"name": "Rs", "kind": "resistor", "from": "in", "resistance": 0.1},
      {"name": "FB", "kind": "bead", "from": "in", "to": "out", "inductance": "1u",
       "dc_resistance": 0.1, "parallel_capacitance": "1.5p", "core_loss_resistance": "1k"},
      {"name": "C", "kind": "capacitor", "capacitance": "10u", "esr": "5m", "esl": "0.5n"}
    ]})");
  const Run run = run_cli(dir, {"sweep", (dir / "bead.json").string(), "--out", (dir / "out").string(), "--json"});
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  CHECK(nlohmann::json::parse(run.out)["solver"] == "nodal");
  const auto rows = read_csv(dir / "out" / "bead_impedance.csv");
  REQUIRE(rows.size() == 27);  // 5 decades * 5 + 1 points (closed form) plus the header
  for (std::size_t i = 1; i < rows.size(); ++i) {
    const double f = std::stod(rows[i][0]);
    const double w = 2.0 * std::numbers::pi * f;
    using C = std::complex<double>;
    // Bead: R_dc + 1/(1/(jwL) + 1/R_core + jwC_p) (REFERENCES §11).
    const C bead = 0.1 + 1.0 / (1.0 / C(0.0, w * 1e-6) + 1.0 / 1e3 + C(0.0, w * 1.5e-12));
    const C cap = series_rlc(f, 10e-6, 0.5e-9, 5e-3);
    const C z = 1.0 / (1.0 / cap + 1.0 / (bead + 0.1));  // parallel of the two paths to ground
    INFO("f = " << f);
    CHECK_THAT(std::stod(rows[i][1]), WithinRel(std::abs(z), kPrinted10));
    CHECK_THAT(std::stod(rows[i][3]), WithinRel(z.real(), kPrinted10));
  }
}

TEST_CASE("command-line band options override the file's sweep", "[cli]") {
  TempDir dir("sweep");
  write_text(dir / "one_cap.json", kOneCapacitor);
  const Run run = run_cli(dir, {"sweep", (dir / "one_cap.json").string(), "--out", (dir / "out").string(), "--start",
                                "1k", "--stop", "1MHz", "--points-per-decade", "20"});
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  const auto rows = read_csv(dir / "out" / "one_cap_impedance.csv");
  // 3 decades * 20 + 1 = 61 points (closed form) plus the header.
  REQUIRE(rows.size() == 62);
  CHECK(std::stod(rows[1][0]) == 1e3);
  CHECK(std::stod(rows[61][0]) == 1e6);
  // Last row again at 1 MHz: REFERENCES §2, 1.5885 ohm.
  CHECK_THAT(std::stod(rows[61][1]), WithinRel(1.5885, kReference));
}

TEST_CASE("bad input exits 2, names the file and field, and leaves no output", "[cli]") {
  TempDir dir("sweep");
  const fs::path out = dir / "out";
  auto expect_rejected = [&](const std::string& file_name, const std::string& text,
                             const std::vector<std::string>& words, const std::vector<std::string>& extra = {}) {
    write_text(dir / file_name, text);
    std::vector<std::string> args{"sweep", (dir / file_name).string(), "--out", out.string()};
    args.insert(args.end(), extra.begin(), extra.end());
    const Run run = run_cli(dir, args);
    INFO(file_name << ": " << run.err);
    CHECK(run.exit_code == 2);
    for (const auto& w : words) CHECK_THAT(run.err, Contains(w));
    CHECK(list_names(out).empty());  // no CSV, no temporary
  };

  SECTION("malformed JSON: line and column") {
    // Line 3 is ` "port" "rail"`: the parser stops at the closing quote of "rail", column 14.
    expect_rejected("broken.json", "{\n \"name\": \"x\",\n \"port\" \"rail\"\n}\n", {"broken.json:3:14", "valid JSON"});
  }
  SECTION("unknown key") {
    expect_rejected("typo.json",
                    R"({"name": "t", "port": "rail", "branches": [
                        {"name": "C1", "kind": "capacitor", "capacitance": "1u", "esrr": "5m"}]})",
                    {"typo.json", "/branches/0/esrr", "unknown key"});
  }
  SECTION("negative capacitance") {
    expect_rejected("negative.json",
                    R"({"name": "t", "port": "rail", "branches": [
                        {"name": "C1", "kind": "capacitor", "capacitance": "-100n"}]})",
                    {"negative.json", "/branches/0/capacitance", "> 0"});
  }
  SECTION("disconnected node") {
    expect_rejected("island.json",
                    R"({"name": "t", "port": "rail", "branches": [
                        {"name": "C1", "kind": "capacitor", "capacitance": "1u"},
                        {"name": "C2", "kind": "capacitor", "from": "island", "to": "reef", "capacitance": "1u"}]})",
                    {"island.json", "/branches", "'C2'", "not connected"});
  }
  SECTION("a bad band option names the option") {
    expect_rejected("fine.json", kOneCapacitor, {"--points-per-decade", "a whole number"},
                    {"--points-per-decade", "ten"});
  }
  SECTION("a stop below the start names the options") {
    expect_rejected("fine.json", kOneCapacitor, {"--start", "above the start"}, {"--start", "1G"});
  }
  SECTION("a missing file") {
    const Run run = run_cli(dir, {"sweep", (dir / "absent.json").string(), "--out", out.string()});
    CHECK(run.exit_code == 2);
    CHECK_THAT(run.err, Contains("absent.json"));
    CHECK(list_names(out).empty());
  }
}

TEST_CASE("sweep refuses to write its CSV over its own input", "[cli]") {
  TempDir dir("sweep");
  // The network "t" writes t_impedance.csv; make that the input file itself.
  const std::string text = R"({"name": "t", "port": "rail", "branches": [
      {"name": "C1", "kind": "capacitor", "capacitance": "1u"}]})";
  write_text(dir / "t_impedance.csv", text);
  const Run run = run_cli(dir, {"sweep", (dir / "t_impedance.csv").string(), "--out", dir.path().string()});
  CHECK(run.exit_code == 2);
  CHECK_THAT(run.err, Contains("not one of this run's inputs"));
  CHECK(read_text(dir / "t_impedance.csv") == text);
  CHECK(list_names(dir.path()) == std::vector<std::string>{"t_impedance.csv"});
}

TEST_CASE("colour appears only on a terminal and never with NO_COLOR set", "[cli]") {
  // Rule from no-color.org: NO_COLOR present and not empty disables colour.
  TempDir dir("sweep");
  write_text(dir / "one_cap.json", kOneCapacitor);
  const std::vector<std::string> args{"sweep", (dir / "one_cap.json").string(), "--out", (dir / "out").string()};
  const std::string esc = "\x1b[";
  CHECK_THAT(run_on_terminal(args, nullptr), Contains(esc));
  CHECK_THAT(run_on_terminal(args, ""), Contains(esc));
  const std::string plain = run_on_terminal(args, "1");
  CHECK(plain.find(esc) == std::string::npos);
  CHECK_THAT(plain, Contains("Wrote"));
}
