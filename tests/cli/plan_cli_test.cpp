// SPDX-License-Identifier: MIT
// End-to-end `quietrail plan` on a small invented rail: exit codes 0/1/2, the files written
// (all or none), the planned project read back by `quietrail check`, the planned design's
// impedance against the closed form of regulator and capacitors, an impossible count limit
// shown impossible by enumeration, the command line's overrides and determinism.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <complex>
#include <filesystem>
#include <map>
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
using Json = nlohmann::json;

namespace {

const fs::path kCli = QUIETRAIL_CLI_PATH;
constexpr double kPi = 3.14159265358979323846;

// The curves CSV holds 10 significant digits (report/csv_curves.hpp); the closed form is
// evaluated in double, so 1e-6 leaves room for the rounding of both.
constexpr double kClosedForm = 1e-6;
// `plan` verifies its answer with run_check on its own network (candidates appended last);
// `check` builds the planned project's network in file order. Same models, sums in another
// order: the worst ratios agree to rounding.
constexpr double kSameCheck = 1e-9;

using Run = quietrail::test::CliRun;

Run run_cli(const TempDir& dir, const std::vector<std::string>& args) {
  return quietrail::test::run_cli(kCli, dir.path(), args);
}

// An invented test library (no real parts): C0G and polymer parts have no DC-bias loss
// and at 25 C no temperature loss (docs/part_libraries.md), so the placed capacitance is
// the nominal one and the closed form below needs no derating.
struct TestPart {
  const char* id;
  const char* package;
  double capacitance;  // F
  double esr;          // ohm
  double esl;          // H, body
  double mounting;     // H, from the project's "mounting" (0: included in the ESL)
};
const TestPart kParts[] = {
    {"t-220u", "7.3x4.3 mm chip", 220e-6, 6e-3, 1.2e-9, 0.0},
    {"t-10u", "0805", 10e-6, 3e-3, 0.5e-9, 0.4e-9},
    {"t-1u", "0603", 1e-6, 8e-3, 0.4e-9, 0.3e-9},
    {"t-100n", "0402", 100e-9, 25e-3, 0.3e-9, 0.2e-9},
};
// The regulator of the test rail: Z = R + j*omega*L (models/regulator.hpp, Smith et al. 1999).
constexpr double kRegulatorR = 2e-3;
constexpr double kRegulatorL = 20e-9;
// The rail's flat target, ohm, and band top, Hz.
constexpr double kTarget = 10e-3;
constexpr double kBandStop = 10e6;

const char* kLibrary = R"({"format_version": 1,
 "header": {"family": "testcaps", "description": "invented parts for the plan CLI tests", "values": "invented"},
 "parts": [
  {"id": "t-220u", "kind": "capacitor", "description": "220uF polymer test part", "package": "7.3x4.3 mm chip",
   "dielectric": "polymer_aluminium", "capacitance": "220u", "esr": "6m", "esl": "1.2n", "esl_includes_mounting": true,
   "rated_voltage": "2.5V", "tolerance": 0.2, "area": "30mm^2", "cost": 2.0},
  {"id": "t-10u", "kind": "capacitor", "description": "10uF test part", "package": "0805", "dielectric": "C0G",
   "capacitance": "10u", "esr": "3m", "esl": "0.5n", "rated_voltage": "6.3V", "tolerance": 0.05, "area": "3mm^2", "cost": 0.5},
  {"id": "t-1u", "kind": "capacitor", "description": "1uF test part", "package": "0603", "dielectric": "C0G",
   "capacitance": "1u", "esr": "8m", "esl": "0.4n", "rated_voltage": "6.3V", "tolerance": 0.05, "area": "1.6mm^2", "cost": 0.2},
  {"id": "t-100n", "kind": "capacitor", "description": "100nF test part", "package": "0402", "dielectric": "C0G",
   "capacitance": "100n", "esr": "25m", "esl": "0.3n", "rated_voltage": "16V", "tolerance": 0.05, "area": "1mm^2", "cost": 0.1}
 ]})";

// A 1.0 V rail with a flat 10 mohm target from 1 kHz to 10 MHz, regulator R + L, the test
// library and `plan` as its plan section ("" for none; then `bom` must hold something).
fs::path write_rail(const TempDir& dir, const std::string& plan, const std::string& bom = "") {
  write_text(dir / "lib.json", kLibrary);
  std::string text = R"({"name": "test_rail",
 "rail": {"voltage": 1.0, "ripple": "5%", "max_current": 10,
          "band": {"start": "1k", "stop": "10MHz", "points_per_decade": 30}},
 "target": "10m",
 "regulator": {"resistance": "2m", "inductance": "20n"},
 "mounting": {"0402": "0.2n", "0603": "0.3n", "0805": "0.4n"},
 "libraries": ["lib.json"])";
  if (!bom.empty()) text += R"(,
 "bom": )" + bom;
  if (!plan.empty()) text += R"(,
 "plan": )" + plan;
  text += "}\n";
  const fs::path path = dir / "rail.json";
  write_text(path, text);
  return path;
}

using Complex = std::complex<double>;

// One mounted copy: ESR + j*omega*(ESL + L_mount) + 1/(j*omega*C) (models/capacitor.hpp
// series RLC, any circuits text).
Complex part_impedance(const TestPart& p, double f) {
  const double w = 2.0 * kPi * f;
  return Complex(p.esr, w * (p.esl + p.mounting)) + 1.0 / Complex(0.0, w * p.capacitance);
}

// Closed form of the all-parallel rail: |Z| = 1 / |1/Z_reg + sum n_k / Z_k|.
double rail_magnitude(const std::map<std::string, int>& counts, double f) {
  Complex y = 1.0 / Complex(kRegulatorR, 2.0 * kPi * f * kRegulatorL);
  for (const auto& p : kParts) {
    const auto it = counts.find(p.id);
    if (it != counts.end()) y += static_cast<double>(it->second) / part_impedance(p, f);
  }
  return 1.0 / std::abs(y);
}

// The row of a curves CSV nearest `frequency` (within 1e-6 relative; the grid steps are
// far wider): its frequency and port |Z|. {0, 0} when there is none.
std::pair<double, double> curve_point(const std::string& csv, double frequency) {
  std::istringstream in(csv);
  std::string row;
  std::getline(in, row);  // header
  while (std::getline(in, row)) {
    std::istringstream cells(row);
    std::string f, z;
    std::getline(cells, f, ',');
    std::getline(cells, z, ',');
    if (std::abs(std::stod(f) - frequency) <= 1e-6 * frequency) return {std::stod(f), std::stod(z)};
  }
  return {0.0, 0.0};
}

const std::vector<std::string> kAllFiles{"test_rail_curves.csv",  "test_rail_front.svg",  "test_rail_impedance.svg",
                                         "test_rail_plan.json",    "test_rail_planned.json", "test_rail_planned_bom.csv",
                                         "test_rail_report.html"};

// True when some key anywhere in `j` contains `word`.
bool has_key_containing(const Json& j, const std::string& word) {
  if (j.is_object()) {
    for (const auto& item : j.items())
      if (item.key().find(word) != std::string::npos || has_key_containing(item.value(), word)) return true;
  } else if (j.is_array()) {
    for (const auto& v : j)
      if (has_key_containing(v, word)) return true;
  }
  return false;
}

}  // namespace

TEST_CASE("plan writes all seven files and its planned project checks to the plan's verdict", "[cli][plan]") {
  const TempDir dir("plan-cli");
  const fs::path input = write_rail(dir, R"({"max_per_part": 10})");
  const fs::path out = dir / "out";
  const Run run = run_cli(dir, {"plan", input.string(), "--out", out.string()});
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  CHECK(list_names(out) == kAllFiles);
  CHECK_THAT(run.out, Contains("Chosen parts") && Contains("Planning estimate") &&
                          Contains((out / "test_rail_planned.json").string()));
  CHECK(run.out.find('\x1b') == std::string::npos);  // not a terminal: no colour, no progress line
  CHECK(run.err.empty());

  const Json plan = Json::parse(read_text(out / "test_rail_plan.json"));
  CHECK((plan["status"] == "optimal" || plan["status"] == "feasible"));
  CHECK(plan["best"]["verified"] == true);
  const double plan_worst = plan["best"]["worst_ratio"].get<double>();
  CHECK(plan_worst <= 1.0);
  std::map<std::string, int> counts;
  for (const auto& part : plan["best"]["parts"]) counts[part["library_id"].get<std::string>()] = part["count"].get<int>();
  REQUIRE(!counts.empty());

  // The planned project names the libraries from the output directory.
  const Json planned = Json::parse(read_text(out / "test_rail_planned.json"));
  CHECK(planned["libraries"] == Json::array({"../lib.json"}));
  CHECK(planned.contains("plan"));

  // Consistency check (same code path as the plan's verification): `check` on the planned
  // project reads it unchanged and reaches the plan's worst ratio and verdict.
  const Run check = run_cli(dir, {"check", (out / "test_rail_planned.json").string(), "--out", (dir / "c").string(), "--json"});
  INFO(check.err);
  REQUIRE(check.exit_code == 0);
  const Json report = Json::parse(check.out);
  CHECK_THAT(report["verdict"]["worst_ratio"].get<double>(), WithinRel(plan_worst, kSameCheck));
  CHECK(report["verdict"] == plan["check"]["verdict"]);

  // An outside value: the planned design's |Z| is the closed form 1/|1/Z_reg + sum n_k Y_k|
  // of the regulator and the chosen copies. At 100 kHz one copy more or less of any chosen
  // part moves |Z| by 1e-3 or more, and at 1 MHz the mounting inductance by far more than
  // the tolerance, so the counts, values and mountings are all checked.
  const std::string curves = read_text(out / "test_rail_curves.csv");
  for (const double frequency : {1e5, 1e6}) {
    INFO(frequency << " Hz");
    const auto [f, z] = curve_point(curves, frequency);
    REQUIRE(f > 0.0);  // a grid point: 30 per decade from 1 kHz
    CHECK_THAT(z, WithinRel(rail_magnitude(counts, f), kClosedForm));
  }

  // The planned BOM CSV is read by the project's bom_csv reader to the same rail (a project
  // without its own BOM, so the CSV's lines are the whole BOM).
  write_text(dir / "from_csv.json", R"({"name": "from_csv",
 "rail": {"voltage": 1.0, "ripple": "5%", "max_current": 10,
          "band": {"start": "1k", "stop": "10MHz", "points_per_decade": 30}},
 "target": "10m", "regulator": {"resistance": "2m", "inductance": "20n"},
 "mounting": {"0402": "0.2n", "0603": "0.3n", "0805": "0.4n"},
 "libraries": ["lib.json"], "bom_csv": "out/test_rail_planned_bom.csv"})");
  const Run csv = run_cli(dir, {"check", (dir / "from_csv.json").string(), "--out", (dir / "c2").string(), "--json"});
  INFO(csv.err);
  REQUIRE(csv.exit_code == 0);
  CHECK_THAT(Json::parse(csv.out)["verdict"]["worst_ratio"].get<double>(), WithinRel(plan_worst, kSameCheck));

  // A self-contained page with the caution and both plots.
  const std::string html = read_text(out / "test_rail_report.html");
  CHECK_THAT(html, Contains("id=\"plan-front\"") && Contains("id=\"check-plot\"") && Contains("Planning estimate"));
  CHECK(html.find("<script") == std::string::npos);
  CHECK(html.find("src=") == std::string::npos);
}

TEST_CASE("a count limit no selection can meet exits 1 and explains the bands out of reach", "[cli][plan]") {
  const TempDir dir("plan-cli");
  const fs::path input = write_rail(dir, R"({"max_per_part": 10, "max_total": 1})");
  const fs::path out = dir / "out";

  // Independent enumeration: with at most one copy in all, at the band's top the best the
  // rail can do is 1/|1/Z_reg + 1/Z_k| for the best single part k, above the target for
  // every part (closed form above), so no selection meets the target.
  double best_single = 1e300;
  for (const auto& p : kParts) best_single = std::min(best_single, rail_magnitude({{p.id, 1}}, kBandStop));
  REQUIRE(best_single > kTarget);

  const Run run = run_cli(dir, {"plan", input.string(), "--out", out.string(), "--json"});
  INFO(run.err);
  REQUIRE(run.exit_code == 1);
  const Json plan = Json::parse(run.out);
  CHECK(plan == Json::parse(read_text(out / "test_rail_plan.json")));
  CHECK(plan["status"] == "infeasible");
  REQUIRE(plan["infeasibility"].is_object());
  const auto& bands = plan["infeasibility"]["bands"];
  REQUIRE(!bands.empty());
  for (const auto& band : bands) {
    CHECK(band["floor_ratio"].get<double>() > 1.0);
    CHECK(!band["reason"].get<std::string>().empty());
  }
  // The last band reaches the band's top, where the enumeration above fails.
  CHECK_THAT(bands.back()["stop_hz"].get<double>(), WithinRel(kBandStop, 1e-12));
  // No selection within the limits beats the best single part at the band's top.
  CHECK(plan["best"]["worst_ratio"].get<double>() >= best_single / kTarget * (1.0 - 1e-9));
  CHECK(plan["best"]["totals"]["count"].get<int>() <= 1);
  CHECK(plan["front"].empty());
  // Reports are still written, without the front plot.
  std::vector<std::string> expected = kAllFiles;
  expected.erase(std::find(expected.begin(), expected.end(), "test_rail_front.svg"));
  CHECK(list_names(out) == expected);
  const Run check = run_cli(dir, {"check", (out / "test_rail_planned.json").string(), "--out", (dir / "c").string()});
  CHECK(check.exit_code == 1);
}

TEST_CASE("bad plan input exits 2, names the field and writes nothing", "[cli][plan]") {
  struct Case {
    const char* label;
    std::string plan;                // the plan section ("" for none)
    std::string bom;                 // the BOM ("" for none)
    std::vector<std::string> extra;  // more command-line arguments
    std::vector<std::string> mentions;
  };
  const std::vector<Case> cases{
      {"unknown objective", R"({"max_per_part": 10})", "", {"--objective", "price"},
       {"--objective", "cost", "count", "area", "price"}},
      {"no plan section", "", R"([{"part": "t-1u", "count": 2}])", {}, {"rail.json", "/plan"}},
      {"max_per_part 0 and no listed part", R"({"max_per_part": 0})", "", {}, {"rail.json", "/plan/max_per_part"}},
      {"negative seed", R"({"max_per_part": 10})", "", {"--seed", "-1"}, {"--seed"}},
      {"no alternatives", R"({"max_per_part": 10})", "", {"--alternatives", "0"}, {"--alternatives"}},
  };
  for (const auto& c : cases) {
    INFO(c.label);
    const TempDir dir("plan-cli-bad");
    const fs::path input = write_rail(dir, c.plan, c.bom);
    std::vector<std::string> args{"plan", input.string(), "--out", (dir / "out").string()};
    args.insert(args.end(), c.extra.begin(), c.extra.end());
    const Run run = run_cli(dir, args);
    CHECK(run.exit_code == 2);
    for (const auto& m : c.mentions) CHECK_THAT(run.err, Contains(m));
    CHECK(list_names(dir / "out").empty());
  }
}

TEST_CASE("a file that cannot be written leaves no file of the plan behind", "[cli][plan]") {
  const TempDir dir("plan-cli-write");
  const fs::path input = write_rail(dir, R"({"max_per_part": 10})");
  const fs::path out = dir / "out";
  // The report is written last; a directory in its place makes that write fail after the
  // other six files have been written, so they must be removed again.
  fs::create_directories(out / "test_rail_report.html");
  const Run run = run_cli(dir, {"plan", input.string(), "--out", out.string()});
  CHECK(run.exit_code == 2);
  CHECK_THAT(run.err, Contains("test_rail_report.html"));
  CHECK(list_names(out) == std::vector<std::string>{"test_rail_report.html"});
}

TEST_CASE("the command line's objective, alternatives and node limit override the plan section", "[cli][plan]") {
  const TempDir dir("plan-cli");
  const fs::path input = write_rail(dir, R"({"max_per_part": 10, "objective": "cost"})");
  auto plan_with = [&](const std::vector<std::string>& extra) {
    std::vector<std::string> args{"plan", input.string(), "--out", (dir / "out").string(), "--json"};
    args.insert(args.end(), extra.begin(), extra.end());
    const Run run = run_cli(dir, args);
    INFO(run.err);
    REQUIRE(run.exit_code == 0);
    return Json::parse(run.out);
  };
  const Json by_cost = plan_with({});
  const Json by_count = plan_with({"--objective", "count", "--alternatives", "2"});
  CHECK(by_cost["objective"] == "cost");
  CHECK(by_count["objective"] == "count");
  CHECK(by_count["alternatives"].size() <= 2);
  CHECK(by_count["best"]["objective"].get<double>() == by_count["best"]["totals"]["count"].get<int>());
  // Both searched completely: the least-count selection uses no more parts than the
  // least-cost one (which also meets the target), and costs no less.
  REQUIRE(by_cost["status"] == "optimal");
  REQUIRE(by_count["status"] == "optimal");
  CHECK(by_count["best"]["totals"]["count"].get<int>() <= by_cost["best"]["totals"]["count"].get<int>());
  CHECK(by_count["best"]["totals"]["cost"].get<double>() >= by_cost["best"]["totals"]["cost"].get<double>() - 1e-12);

  // One branch-and-bound node cannot search this problem's tree: the answer is reported as
  // feasible with its gap to the bound, and still meets the target.
  const Json cut = plan_with({"--node-limit", "1"});
  CHECK(cut["options"]["node_limit"] == 1);
  CHECK(cut["status"] == "feasible");
  const double objective = cut["best"]["objective"].get<double>();
  const double bound = cut["bound"].get<double>();
  CHECK(bound <= objective);
  CHECK_THAT(cut["gap"].get<double>(), WithinRel((objective - bound) / objective, 1e-12));
  CHECK(cut["best"]["worst_ratio"].get<double>() <= 1.0);
}

TEST_CASE("the same seed gives byte-identical plan outputs, with no timing in them", "[cli][plan]") {
  const TempDir dir("plan-cli");
  const fs::path input = write_rail(dir, R"({"max_per_part": 10, "seed": 5})");
  const fs::path out = dir / "out";
  const std::vector<std::string> names{"test_rail_plan.json", "test_rail_planned.json", "test_rail_front.svg",
                                       "test_rail_report.html"};
  auto plan_once = [&](const std::vector<std::string>& extra) {
    std::vector<std::string> args{"plan", input.string(), "--out", out.string()};
    args.insert(args.end(), extra.begin(), extra.end());
    const Run run = run_cli(dir, args);
    INFO(run.err);
    REQUIRE(run.exit_code == 0);
    std::vector<std::string> texts;
    for (const auto& name : names) texts.push_back(read_text(out / name));
    return texts;
  };
  const auto first = plan_once({});
  const auto second = plan_once({});
  for (std::size_t i = 0; i < names.size(); ++i) {
    INFO(names[i]);
    CHECK(first[i] == second[i]);
  }
  const Json plan = Json::parse(first[0]);
  CHECK(plan["seed"] == 5);
  for (const char* word : {"elapsed", "duration", "seconds", "wall", "clock", "timing"}) {
    INFO(word);
    CHECK_FALSE(has_key_containing(plan, word));
  }
  // The command line's seed overrides the file's and is reported.
  const auto seeded = plan_once({"--seed", "123"});
  CHECK(Json::parse(seeded[0])["seed"] == 123);
  CHECK(plan_once({"--seed", "123"})[0] == seeded[0]);
}
