// SPDX-License-Identifier: MIT
// End-to-end `quietrail check`: the three example projects (exit codes, files, JSON), their
// analysed curves against ngspice as an independent reference, bad input (exit 2, named
// file and field, nothing written), escaping of names from input, and the colour rules.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "quietrail/analysis/check.hpp"
#include "quietrail/io/project_file.hpp"
#include "quietrail/io/spice_netlist.hpp"
#include "support/cli_runner.hpp"
#include "support/ngspice.hpp"
#include "support/temp_dir.hpp"

namespace fs = std::filesystem;
using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::test::list_names;
using quietrail::test::read_text;
using quietrail::test::TempDir;
using quietrail::test::write_text;

namespace {

// The issue's acceptance bound for the analysed curve against ngspice.
constexpr double kNgspiceAgreement = 1e-3;
// Grid frequencies shared by ngspice's `.ac dec` stepping and FrequencyGrid coincide to
// rounding of 10^(k/ppd) (spice_netlist.hpp).
constexpr double kSameFrequency = 1e-9;

const fs::path kSourceDir = QUIETRAIL_SOURCE_DIR;
const fs::path kCli = QUIETRAIL_CLI_PATH;
const fs::path kExamples = kSourceDir / "examples" / "projects";
const std::string kLibraries = (kSourceDir / "part_libraries").string();

using Run = quietrail::test::CliRun;

// Runs the CLI with `args`, stdout and stderr captured (support/cli_runner.hpp).
Run run_cli(const TempDir& dir, const std::vector<std::string>& args) {
  return quietrail::test::run_cli(kCli, dir.path(), args);
}

// Compares the analysed curve of `project_path` with ngspice on the same network.
void check_against_ngspice(const fs::path& project_path) {
  const auto ngspice = quietrail::test::find_on_path("ngspice");
  if (!ngspice) FAIL(quietrail::test::kNgspiceMissing);
  const quietrail::Project project = quietrail::read_project_file(project_path);
  const quietrail::CheckResult result = quietrail::run_check(project.network, project.port, *project.target,
                                                             project.check_options(), project.branch_info);
  const TempDir dir("check-ngspice");
  quietrail::SpiceNetlistOptions options;
  options.title = project.name;
  options.sweep = project.band;
  options.output_file = "z.txt";
  const auto warnings = quietrail::write_spice_netlist(dir / "rail.cir", project.network, project.port, options);
  INFO("deck warnings: " << warnings.size());
  REQUIRE(warnings.empty());  // every term of the examples is an exact R/L/C primitive
  const int status = quietrail::test::run_ngspice(*ngspice, dir.path(), "rail.cir");
  INFO("ngspice log:\n" << read_text(dir / "ngspice.log"));
  REQUIRE(status == 0);
  const auto rows = quietrail::test::read_wrdata(dir / "z.txt");
  REQUIRE(rows.size() > 100);

  // Every ngspice frequency against the exact evaluator the check refines with, and those
  // that are also grid frequencies against the check's own curve.
  const auto exact = quietrail::port_impedance_function(project.network, project.port);
  std::size_t on_grid = 0;
  std::size_t k = 0;
  for (const auto& row : rows) {
    INFO(project.name << " at " << row.frequency << " Hz");
    CHECK_THAT(std::abs(exact(row.frequency)), WithinRel(std::abs(row.value), kNgspiceAgreement));
    while (k + 1 < result.frequencies.size() && result.frequencies[k] < row.frequency * (1.0 - kSameFrequency)) ++k;
    if (std::abs(result.frequencies[k] - row.frequency) <= kSameFrequency * row.frequency) {
      CHECK_THAT(std::abs(result.impedance[static_cast<Eigen::Index>(k)]),
                 WithinRel(std::abs(row.value), kNgspiceAgreement));
      ++on_grid;
    }
  }
  // The examples' bands are whole numbers of grid steps, where ngspice steps exactly like
  // FrequencyGrid (spice_netlist.hpp), so every point is shared.
  CHECK(on_grid == rows.size());
}

// A project file in `dir` around `body` (rail, regulator and libraries filled in).
fs::path write_project(const TempDir& dir, const std::string& name, const std::string& body) {
  const fs::path path = dir / name;
  write_text(path, R"({"name": "bad", "rail": {"voltage": 1.0, "ripple": "5%", "max_current": 20,
      "band": {"stop": "100MHz"}},
    "regulator": {"resistance": "1m", "inductance": "10n"},
    "libraries": [")" + kLibraries + R"(/mlcc.json"],)" + body + "}");
  return path;
}

}  // namespace

TEST_CASE("the three example projects exit 0, 1 and 1 as designed and write all four files", "[cli]") {
  struct Example {
    const char* file;
    int exit_code;
    const char* stem;
  };
  // core_rail is tuned to pass; memory_rail lacks parts between 10 uF and 100 nF; the
  // analog rail shows bead-capacitor peaking (examples/projects and docs/project_file.md).
  const Example examples[] = {{"core_rail.json", 0, "core_rail"},
                              {"memory_rail.json", 1, "memory_rail"},
                              {"analog_rail.json", 1, "analog_rail"}};
  for (const auto& example : examples) {
    INFO(example.file);
    const TempDir dir("check-example");
    const fs::path out = dir / "out";
    const Run run = run_cli(dir, {"check", (kExamples / example.file).string(), "--out", out.string()});
    INFO(run.err);
    CHECK(run.exit_code == example.exit_code);
    const std::string stem = example.stem;
    CHECK(list_names(out) == std::vector<std::string>{stem + "_check.json", stem + "_curves.csv",
                                                      stem + "_impedance.svg", stem + "_report.html"});
    const auto json = nlohmann::json::parse(read_text(out / (stem + "_check.json")));
    CHECK(json["verdict"]["pass"].get<bool>() == (example.exit_code == 0));
    CHECK(json["verdict"]["view"] == "board");
    CHECK(json["parts"].size() >= 3);
    CHECK(json["peaks"].size() >= 1);
    // The verdict's worst ratio is the largest refined ratio maximum.
    double largest = 0.0;
    for (const auto& peak : json["ratio_peaks"]) largest = std::max(largest, peak["ratio"].get<double>());
    CHECK(json["verdict"]["worst_ratio"].get<double>() >= largest * (1.0 - 1e-12));
    CHECK((json["verdict"]["worst_ratio"].get<double>() > 1.0) == (example.exit_code == 1));
    CHECK(json["exceeded"].empty() == (example.exit_code == 0));
    // The summary states the verdict, the view and where the report went.
    CHECK_THAT(run.out, Contains(example.exit_code == 0 ? "PASS" : "FAIL") && Contains("View      board") &&
                            Contains((out / (stem + "_report.html")).string()));
    CHECK(run.out.find('\x1b') == std::string::npos);  // not a terminal: no colour
    // A self-contained page: no scripts, no fetched resources.
    const std::string html = read_text(out / (stem + "_report.html"));
    CHECK_THAT(html, Contains("<svg") && Contains("Planning estimate"));
    CHECK(html.find("<script") == std::string::npos);
    CHECK(html.find("src=") == std::string::npos);
    CHECK(html.find("<link") == std::string::npos);
    CHECK(html.find("url(http") == std::string::npos);  // only in-page references such as url(#clip)
  }
}

TEST_CASE("the memory rail fails between its 10 uF and 100 nF groups and says which parts form the peak", "[cli]") {
  const TempDir dir("check-memory");
  const Run run = run_cli(dir, {"check", (kExamples / "memory_rail.json").string(), "--out", (dir / "o").string(), "--json"});
  REQUIRE(run.exit_code == 1);
  const auto json = nlohmann::json::parse(run.out);  // --json prints the report on stdout
  CHECK(json == nlohmann::json::parse(read_text(dir / "o" / "memory_rail_check.json")));
  REQUIRE(json["exceeded"].size() == 1);
  // The anti-resonance of the two groups (REFERENCES §3) lies between the SRFs of 10 uF and
  // 100 nF parts with their mounting: about 1.7 MHz and 19 MHz (the parts table's SRFs).
  const double f = json["exceeded"][0]["worst_frequency_hz"].get<double>();
  CHECK(f > json["parts"][3]["srf_mounted_hz"].get<double>());
  CHECK(f < json["parts"][4]["srf_mounted_hz"].get<double>());
  const nlohmann::json* worst = &json["peaks"][0];
  for (const auto& peak : json["peaks"])
    if (peak["ratio"].get<double>() > (*worst)["ratio"].get<double>()) worst = &peak;
  const std::string formed_by = (*worst)["formed_by"];
  CHECK_THAT(formed_by, Contains("C2..C5") && Contains("C10..C29"));
  // The CSV BOM's designators name the branches and its lines are the sources.
  CHECK(json["parts"][4]["source"].get<std::string>().find("memory_rail_bom.csv:4") != std::string::npos);
  // The sensitivity ranking starts from the verdict's worst peak (same number, consistency)
  // and lists changes lowest new peak first; filling the gap between the two groups with a
  // value between them (the classic fix of this anti-resonance, REFERENCES §3: it splits one
  // tall loop into two lower ones) brings the peak under the target.
  const auto& sensitivity = json["sensitivity"];
  CHECK_THAT(sensitivity["peak_ratio"].get<double>(), WithinRel(json["verdict"]["worst_ratio"].get<double>(), 1e-12));
  REQUIRE(sensitivity["changes"].size() >= 4);
  double previous = 0.0;
  for (const auto& change : sensitivity["changes"]) {
    CHECK(change["peak_ratio"].get<double>() >= previous);
    previous = change["peak_ratio"].get<double>();
  }
  CHECK(sensitivity["changes"][0]["kind"] == "value between");
  CHECK(sensitivity["changes"][0]["peak_ratio"].get<double>() < 1.0);
}

TEST_CASE("each example's analysed curve agrees with ngspice within 0.1 %", "[cli]") {
  // Reference: ngspice, an independent general-purpose circuit simulator, on the network the
  // project loader built (exported with io/spice_netlist).
  for (const char* example : {"core_rail.json", "memory_rail.json", "analog_rail.json"}) {
    INFO(example);
    check_against_ngspice(kExamples / example);
  }
}

TEST_CASE("bad project input exits 2, names the file and field, and writes nothing", "[cli]") {
  struct Case {
    const char* label;
    std::string body;
    std::vector<std::string> mentions;
  };
  const std::string bom = R"("bom": [{"part": "mlcc-0402-x7r-100n-16v", "count": 4}])";
  const std::vector<Case> cases{
      {"unknown part id", R"("bom": [{"part": "mlcc-0402-x7r-100n-99v"}])", {"/bom/0/part", "nearest"}},
      {"negative count", R"("bom": [{"part": "mlcc-0402-x7r-100n-16v", "count": -1}])", {"/bom/0/count"}},
      {"zero target", R"("target": {"impedance": "0"},)" + bom, {"/target/impedance"}},
      {"empty BOM", R"("bom": [])", {"/bom"}},
  };
  for (const auto& c : cases) {
    INFO(c.label);
    const TempDir dir("check-bad");
    const fs::path input = write_project(dir, "bad.json", c.body);
    const Run run = run_cli(dir, {"check", input.string(), "--out", (dir / "out").string()});
    CHECK(run.exit_code == 2);
    CHECK_THAT(run.err, Contains("bad.json"));
    for (const auto& m : c.mentions) CHECK_THAT(run.err, Contains(m));
    CHECK(list_names(dir / "out").empty());
  }

  SECTION("malformed JSON, reversed band and ripple over 100 %") {
    const TempDir dir("check-bad");
    write_text(dir / "broken.json", "{\"name\": \"x\",\n \"rail\": [}\n");
    Run run = run_cli(dir, {"check", (dir / "broken.json").string(), "--out", (dir / "out").string()});
    CHECK(run.exit_code == 2);
    CHECK_THAT(run.err, Contains("broken.json:2:"));
    write_text(dir / "band.json", R"({"name": "x", "rail": {"voltage": 1, "ripple": "5%", "max_current": 2,
        "band": {"start": "1G", "stop": "1M"}}, "regulator": {"resistance": "1m", "inductance": "1n"},
        "bom": [{"part": {"kind": "capacitor", "capacitance": "1u"}}]})");
    run = run_cli(dir, {"check", (dir / "band.json").string(), "--out", (dir / "out").string()});
    CHECK(run.exit_code == 2);
    CHECK_THAT(run.err, Contains("band.json") && Contains("/rail/band/stop"));
    write_text(dir / "ripple.json", R"({"name": "x", "rail": {"voltage": 1, "ripple": 1.2, "max_current": 2,
        "band": {"stop": "1G"}}, "regulator": {"resistance": "1m", "inductance": "1n"},
        "bom": [{"part": {"kind": "capacitor", "capacitance": "1u"}}]})");
    run = run_cli(dir, {"check", (dir / "ripple.json").string(), "--out", (dir / "out").string()});
    CHECK(run.exit_code == 2);
    CHECK_THAT(run.err, Contains("ripple.json") && Contains("/rail/ripple"));
    CHECK(list_names(dir / "out").empty());
  }

  SECTION("a BOM CSV with missing columns") {
    const TempDir dir("check-bad");
    write_text(dir / "bom.csv", "Value,Package\n100nF,0402\n");
    const fs::path input = write_project(dir, "csv.json", R"("bom_csv": "bom.csv")");
    const Run run = run_cli(dir, {"check", input.string(), "--out", (dir / "out").string()});
    CHECK(run.exit_code == 2);
    CHECK_THAT(run.err, Contains("bom.csv:1") && Contains("quantity column") && Contains("designator column"));
    CHECK(list_names(dir / "out").empty());
  }
}

TEST_CASE("names from a BOM are escaped in the HTML, SVG and CSV reports", "[cli]") {
  const TempDir dir("check-escape");
  const fs::path input = write_project(dir, "names.json", R"json("bom": [
      {"part": "mlcc-0402-x7r-100n-16v", "count": 8, "name": "<script>alert(1)</script>"},
      {"part": "mlcc-0402-x7r-1n-16v", "count": 2, "name": "=cmd()"}])json");
  const Run run = run_cli(dir, {"check", input.string(), "--out", (dir / "out").string()});
  REQUIRE((run.exit_code == 0 || run.exit_code == 1));
  const std::string html = read_text(dir / "out" / "bad_report.html");
  const std::string svg = read_text(dir / "out" / "bad_impedance.svg");
  const std::string csv = read_text(dir / "out" / "bad_curves.csv");
  // HTML and XML escaping (report/escape.hpp: OWASP rule 1; XML 1.0 section 2.4).
  CHECK(html.find("<script") == std::string::npos);
  CHECK_THAT(html, Contains("&lt;script&gt;alert(1)&lt;/script&gt;"));
  CHECK(svg.find("<script") == std::string::npos);
  CHECK_THAT(svg, Contains("&lt;script&gt;"));
  // Spreadsheet formula guard (OWASP "CSV Injection"): the cell starts with a quote.
  CHECK_THAT(csv, Contains(",'=cmd() abs_ohm"));
  CHECK(csv.find(",=cmd()") == std::string::npos);
  // JSON keeps the names as they are (it is data for scripts, escaped by the JSON syntax).
  const auto json = nlohmann::json::parse(read_text(dir / "out" / "bad_check.json"));
  bool found = false;
  for (const auto& part : json["parts"]) found = found || part["name"] == "<script>alert(1)</script>";
  CHECK(found);
}

TEST_CASE("check colours its summary only on a terminal and never with NO_COLOR set", "[cli]") {
  // The no-color.org convention (terminal.hpp): colour on a TTY unless NO_COLOR is non-empty.
  const TempDir dir("check-colour");
  const std::vector<std::string> args{"check", (kExamples / "core_rail.json").string(), "--out",
                                      (dir / "out").string()};
  const Run coloured = quietrail::test::run_on_terminal(kCli, args, nullptr);
  CHECK(coloured.exit_code == 0);  // core_rail passes
  CHECK(coloured.out.find("\x1b[") != std::string::npos);
  const Run plain = quietrail::test::run_on_terminal(kCli, args, "1");
  CHECK(plain.exit_code == 0);
  CHECK(plain.out.find("\x1b[") == std::string::npos);
}
