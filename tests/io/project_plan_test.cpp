// SPDX-License-Identifier: MIT
// The project file's `plan` section (docs/project_file.md): candidate filters, the voltage
// rule, the rating dedupe, candidates built like BOM lines (derating, mounting), the
// planning problem's fixed totals, and every bad plan input naming the file and pointer.
// The libraries are small files written here, so each expected value is hand-countable.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <string>
#include <variant>

#include "quietrail/error.hpp"
#include "quietrail/io/project_file.hpp"
#include "quietrail/models/mounting.hpp"
#include "support/input_error.hpp"
#include "support/temp_dir.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::parse_project_json;
using quietrail::PlanCandidate;
using quietrail::Project;
using quietrail::test::input_error_of;

namespace {

namespace fs = std::filesystem;

// Exact arithmetic on values that went through decimal parsing (REFERENCES general guidance).
constexpr double kExact = 1e-9;

constexpr const char* kFile = "project.json";

// A class-2 capacitor of the test library. Its DC-bias curve has exponent 1 so that
// C(V)/C0 = 1 / (1 + V / v_half) can be worked by hand (REFERENCES §8 model form).
std::string ceramic(const std::string& id, const std::string& package, const std::string& dielectric,
                    const std::string& value, const std::string& rating, double cost, const std::string& v_half) {
  return R"({"id": ")" + id + R"(", "kind": "capacitor", "package": ")" + package + R"(", "dielectric": ")" +
         dielectric + R"(", "capacitance": ")" + value + R"(", "esr": "10m", "esl": "0.4n", "rated_voltage": ")" +
         rating + R"(", "tolerance": 0.1, "area": "1.9mm^2", "cost": )" + std::to_string(cost) +
         R"(, "dc_bias": {"v_half": ")" + v_half + R"(", "exponent": 1}})";
}

// The test libraries: a ceramic family with three ratings of one value, two equal ratings
// of another (cost decides), a 0603 part, a bead; and a bulk family with a polymer part
// (mounted ESL) and a part without a dielectric.
void write_libraries(const fs::path& dir) {
  const std::string caps = R"({"format_version": 1,
    "header": {"family": "testcaps", "description": "test ceramics", "values": "made up for tests"},
    "parts": [)" + ceramic("t-0402-x5r-1u-4v", "0402", "X5R", "1u", "4V", 0.9, "3.3V") + ",\n" +
                           ceramic("t-0402-x5r-1u-6v3", "0402", "X5R", "1u", "6.3V", 1.1, "3.3V") + ",\n" +
                           ceramic("t-0402-x5r-1u-10v", "0402", "X5R", "1u", "10V", 1.3, "6V") + ",\n" +
                           ceramic("t-0402-x7r-100n-16v-a", "0402", "X7R", "100n", "16V", 0.5, "10V") + ",\n" +
                           ceramic("t-0402-x7r-100n-16v-b", "0402", "X7R", "100n", "16V", 0.4, "10V") + ",\n" +
                           ceramic("t-0603-x5r-10u-6v3", "0603", "X5R", "10u", "6.3V", 2.0, "3V") + R"(,
      {"id": "t-bead-0603", "kind": "bead", "package": "0603", "inductance": "1u", "dc_resistance": "0.1",
       "rated_current": "1A", "tolerance": 0.25, "area": "4.2mm^2", "cost": 2}
    ]})";
  const std::string bulk = R"({"format_version": 1,
    "header": {"family": "bulky", "description": "test bulk parts", "values": "made up for tests"},
    "parts": [
      {"id": "b-poly-100u-6v3", "kind": "capacitor", "package": "7.3x4.3 mm chip", "dielectric": "polymer_aluminium",
       "capacitance": "100u", "esr": "15m", "esl": "2n", "esl_includes_mounting": true, "rated_voltage": "6.3V",
       "tolerance": 0.2, "area": "19.2mm^2", "cost": 10},
      {"id": "b-film-10u-16v", "kind": "capacitor", "package": "7.3x4.3 mm chip", "dielectric": "none",
       "capacitance": "10u", "esr": "5m", "esl": "3n", "esl_includes_mounting": true, "rated_voltage": "16V",
       "tolerance": 0.1, "area": "19.2mm^2", "cost": 8}
    ]})";
  quietrail::test::write_text(dir / "caps.json", caps);
  quietrail::test::write_text(dir / "bulky.json", bulk);
}

// A 3.3 V rail at 25 C (temperature factor 1 by definition) with the test libraries, 0402
// mounting given by the project, `bom` and `plan` spliced in.
std::string project(const std::string& bom, const std::string& plan) {
  return R"({"name": "p",
    "rail": {"voltage": 3.3, "ripple": "3%", "max_current": 2, "temperature": 25, "band": {"stop": "100MHz"}},
    "regulator": {"resistance": "1m", "inductance": "10n"},
    "mounting": {"0402": "0.3n"},
    "libraries": ["caps.json", "bulky.json"])" +
         (bom.empty() ? "" : ",\n" + bom) + (plan.empty() ? "" : ",\n\"plan\": " + plan) + "}";
}

struct Fixture {
  quietrail::test::TempDir dir{"project-plan"};
  Fixture() { write_libraries(dir.path()); }
  Project parse(const std::string& text) const { return parse_project_json(text, kFile, dir.path()); }
  std::string error_of(const std::string& text) const {
    const std::string message = input_error_of([&] { (void)parse(text); });
    if (message.empty()) FAIL("no InputError for:\n" << text);
    return message;
  }
};

const PlanCandidate* find(const Project& p, const std::string& id) {
  const auto& list = p.plan->candidates;
  const auto it = std::find_if(list.begin(), list.end(), [&](const PlanCandidate& c) { return c.library_id == id; });
  return it == list.end() ? nullptr : &*it;
}

double capacitance(const PlanCandidate& c) { return std::get<quietrail::Capacitor>(c.part.element).capacitance; }

}  // namespace

TEST_CASE("the voltage rule drops a 4 V part for a 3.3 V rail at margin 1.5 and keeps 6.3 V", "[project][plan]") {
  const Fixture f;
  // Arithmetic of the stated rule: 1.5 x 3.3 V = 4.95 V; 4 V < 4.95 V <= 6.3 V.
  const Project p = f.parse(project("", R"({"candidates": {"families": ["testcaps"], "values": ["1u"]}})"));
  REQUIRE(p.plan);
  CHECK(find(p, "t-0402-x5r-1u-4v") == nullptr);
  CHECK(find(p, "t-0402-x5r-1u-6v3") != nullptr);
  CHECK_THAT(p.plan->notes.front(), Contains("4.95 V"));
  // A margin of 1.2 asks 3.96 V (1.2 x 3.3 V), which the 4 V part meets.
  const Project low = f.parse(project("", R"({"voltage_margin": 1.2, "candidates": {"values": ["1u"]}})"));
  CHECK(find(low, "t-0402-x5r-1u-4v") != nullptr);
}

TEST_CASE("of one value, package and dielectric only the lowest adequate rating is kept, then the cheaper",
          "[project][plan]") {
  const Fixture f;
  const Project p = f.parse(project("", R"({"candidates": {"families": ["testcaps"]}})"));
  // 1 uF 0402 X5R comes in 4, 6.3 and 10 V: 4 V fails the rule (4.95 V), 6.3 V is the lowest
  // that passes, so 10 V is dropped (the documented dedupe).
  CHECK(find(p, "t-0402-x5r-1u-6v3") != nullptr);
  CHECK(find(p, "t-0402-x5r-1u-10v") == nullptr);
  // Two 16 V 100 nF parts: the cheaper (0.4 < 0.5) wins although its id sorts later.
  CHECK(find(p, "t-0402-x7r-100n-16v-b") != nullptr);
  CHECK(find(p, "t-0402-x7r-100n-16v-a") == nullptr);
  // Beads are never candidates; the family filter keeps the bulk family out. Hand count:
  // 1u-6v3, 100n-16v-b, 10u-6v3.
  CHECK(find(p, "t-bead-0603") == nullptr);
  CHECK(p.plan->candidates.size() == 3);
  REQUIRE(p.plan->candidate_facts.size() == 3);
  // A listed part is considered anyway, with its own max_count.
  const Project listed = f.parse(project(
      "", R"({"candidates": {"families": ["testcaps"], "parts": [{"part": "t-0402-x5r-1u-10v", "max_count": 7}]}})"));
  REQUIRE(find(listed, "t-0402-x5r-1u-10v") != nullptr);
  CHECK(find(listed, "t-0402-x5r-1u-10v")->max_count == 7);
  CHECK(find(listed, "t-0402-x5r-1u-6v3")->max_count == 50);  // the documented default
  CHECK(listed.plan->candidates.size() == 4);
}

TEST_CASE("filters combine with AND; a dielectric filter passes parts without a dielectric", "[project][plan]") {
  const Fixture f;
  const Project p = f.parse(project("", R"({"candidates": {"packages": ["0402", "7.3x4.3 MM CHIP"],
                                                            "dielectrics": ["X5R"]}})"));
  // 0402 and the chip package (compared without case); X5R, or no dielectric:
  // t-0402-x5r-1u-6v3 and b-film-10u-16v. The polymer part has a dielectric that is not X5R,
  // the 0603 part the wrong package, the X7R parts the wrong dielectric.
  CHECK(p.plan->candidates.size() == 2);
  CHECK(find(p, "t-0402-x5r-1u-6v3") != nullptr);
  CHECK(find(p, "b-film-10u-16v") != nullptr);
  CHECK(find(p, "b-poly-100u-6v3") == nullptr);
  // A listed part needs no filter; an excluded one is gone. 1u +- 0.5 % matches "1.004u".
  const Project q = f.parse(project("", R"({"candidates": {"values": ["1.004u"], "exclude": ["t-0402-x5r-1u-6v3"],
                                                            "parts": ["t-0603-x5r-10u-6v3"]}})"));
  // With 6.3 V excluded, the 10 V part is the lowest adequate rating of 1 uF.
  CHECK(find(q, "t-0402-x5r-1u-10v") != nullptr);
  CHECK(find(q, "t-0402-x5r-1u-6v3") == nullptr);
  CHECK(find(q, "t-0603-x5r-10u-6v3") != nullptr);
  CHECK(q.plan->candidates.size() == 2);
  const std::size_t listed = static_cast<std::size_t>(find(q, "t-0603-x5r-10u-6v3") - q.plan->candidates.data());
  CHECK(q.plan->candidate_facts[listed].source == "/plan/candidates/parts/0");
}

TEST_CASE("a candidate is derated and mounted as a BOM line of the same part", "[project][plan]") {
  const Fixture f;
  const Project p = f.parse(project(R"("bom": [{"part": "t-0402-x5r-1u-6v3", "count": 2},
                                               {"part": "t-0603-x5r-10u-6v3"}, {"part": "b-poly-100u-6v3"}])",
                                    R"({"candidates": {"parts": ["t-0402-x5r-1u-6v3", "t-0603-x5r-10u-6v3",
                                                                  "b-poly-100u-6v3"]}})"));
  // "parts" without a filter: the listed parts only (docs/project_file.md).
  REQUIRE(p.plan->candidates.size() == 3);
  const PlanCandidate& c = *find(p, "t-0402-x5r-1u-6v3");
  // Closed form of the library's DC-bias model (REFERENCES §8): 1 uF / (1 + 3.3 V / 3.3 V) = 0.5 uF;
  // at 25 C the temperature factor is 1 (25 C is the reference).
  CHECK_THAT(capacitance(c), WithinRel(0.5e-6, kExact));
  CHECK_THAT(c.nominal_capacitance, WithinRel(1e-6, kExact));
  CHECK_THAT(c.cost, WithinRel(1.1, kExact));
  CHECK_THAT(c.area, WithinRel(1.9e-6, kExact));
  for (const auto& part : p.parts) {
    const PlanCandidate* cand = find(p, part.library_id);
    REQUIRE(cand != nullptr);
    INFO(part.library_id);
    // Same mounting and same derated element as the BOM line.
    CHECK(cand->part.mounting_inductance == part.mounting_inductance);
    CHECK(capacitance(*cand) == *part.effective_capacitance);
    // The candidate does not reuse the BOM line's branch name.
    CHECK(cand->name != part.name);
  }
  // The mounting rules themselves: the project's 0402 value; the typical 0603 value (no
  // project entry); none for a part whose ESL is a mounted value (docs/project_file.md).
  CHECK_THAT(c.part.mounting_inductance, WithinRel(0.3e-9, kExact));
  CHECK(find(p, "t-0603-x5r-10u-6v3")->part.mounting_inductance ==
        quietrail::typical_mounting_inductance(quietrail::Package::p0603));
  CHECK(find(p, "b-poly-100u-6v3")->part.mounting_inductance == 0.0);
  CHECK(c.name == "t-0402-x5r-1u-6v3_plan");
}

TEST_CASE("a plan-only project parses, and the plan problem sums the fixed parts", "[project][plan]") {
  const Fixture f;
  const Project only = f.parse(project("", R"({"objective": "count", "seed": 7, "alternatives": 3,
                                                "node_limit": 1000, "max_total": 30, "max_area": "100mm^2"})"));
  REQUIRE(only.plan);
  CHECK(only.parts.empty());
  CHECK(only.plan->objective == quietrail::PlanObjective::count);
  const quietrail::PlanProblem empty = only.plan_problem();
  CHECK(empty.fixed_count == 0);
  CHECK(empty.fixed_cost == 0.0);
  CHECK(empty.limits.max_total == 30);
  CHECK_THAT(*empty.limits.max_area, WithinRel(100e-6, kExact));
  const quietrail::PlanOptions options = only.plan_options();
  CHECK(options.seed == 7);
  CHECK(options.alternatives == 3);
  CHECK(options.node_limit == 1000);
  // No filters: the 8 capacitors of both libraries, less the 4 V part (rule), the 10 V 1 uF
  // and the dearer 100 nF (dedupe): 8 - 3 = 5; the bead is not a capacitor.
  CHECK(empty.candidates.size() == 5);

  // A BOM line and a kept line: 4 x (cost 1.1, 1.9 mm^2) + 2 x (cost 10, 19.2 mm^2), by hand:
  // cost 4.4 + 20 = 24.4, area 7.6 + 38.4 = 46 mm^2, 6 parts.
  const Project p = f.parse(project(R"("bom": [{"part": "t-0402-x5r-1u-6v3", "count": 4}])",
                                    R"({"keep": [{"part": "b-poly-100u-6v3", "count": 2, "name": "bulk"}]})"));
  const quietrail::PlanProblem problem = p.plan_problem();
  CHECK_THAT(problem.fixed_cost, WithinRel(24.4, kExact));
  CHECK_THAT(problem.fixed_area, WithinRel(46e-6, kExact));
  CHECK(problem.fixed_count == 6);
  CHECK(problem.network.find_branch("bulk").has_value());
  CHECK(problem.board == p.board);
  CHECK(problem.port == p.port);
  REQUIRE(p.parts.size() == 2);
  CHECK(p.parts[1].source == "/plan/keep/0");
  CHECK(p.roles[static_cast<std::size_t>(p.parts[1].branch)] == quietrail::BranchRole::bom);

  // Without a plan section there is no problem to build.
  const Project none = f.parse(project(R"("bom": [{"part": "t-0402-x5r-1u-6v3"}])", ""));
  CHECK_THAT(input_error_of([&] { (void)none.plan_problem(); }), Contains("/plan"));
}

TEST_CASE("the impedance margin reads as dB, as a number or with its unit", "[project][plan]") {
  const Fixture f;
  const auto margin = [&](const std::string& plan) { return f.parse(project("", plan)).plan_problem().margin_db; };
  // docs/project_file.md: "impedance_margin" in dB, default 0.
  CHECK(margin(R"({"candidates": {"values": ["1u"]}})") == 0.0);
  CHECK_THAT(margin(R"({"impedance_margin": 1.5, "candidates": {"values": ["1u"]}})"), Catch::Matchers::WithinAbs(1.5, kExact));
  CHECK_THAT(margin(R"({"impedance_margin": "3dB", "candidates": {"values": ["1u"]}})"), Catch::Matchers::WithinAbs(3.0, kExact));
}

TEST_CASE("each kind of bad plan input names the file and the JSON pointer", "[project][plan]") {
  const Fixture f;
  const auto bad = [&](const std::string& plan) { return f.error_of(project("", plan)); };
  SECTION("without a plan the BOM is still required") {
    CHECK_THAT(f.error_of(project(R"("bom": [])", "")), Contains("project.json") && Contains("/bom"));
  }
  SECTION("a plan that is not an object, or has an unknown key") {
    CHECK_THAT(bad("[]"), Contains("/plan"));
    CHECK_THAT(bad(R"({"budget": 3})"), Contains("/plan") && Contains("budget") && Contains("voltage_margin"));
    CHECK_THAT(bad(R"({"candidates": {"sizes": []}})"), Contains("/plan/candidates") && Contains("families"));
  }
  SECTION("numbers out of range") {
    CHECK_THAT(bad(R"({"objective": "price"})"),
               Contains("/plan/objective") && Contains("cost") && Contains("count") && Contains("area"));
    CHECK_THAT(bad(R"({"seed": -1})"), Contains("/plan/seed"));
    CHECK_THAT(bad(R"({"alternatives": 0})"), Contains("/plan/alternatives"));
    CHECK_THAT(bad(R"({"alternatives": 51})"), Contains("/plan/alternatives"));
    CHECK_THAT(bad(R"({"node_limit": 0})"), Contains("/plan/node_limit"));
    CHECK_THAT(bad(R"({"voltage_margin": 0.9})"), Contains("/plan/voltage_margin"));
    CHECK_THAT(bad(R"({"impedance_margin": -1})"), Contains("/plan/impedance_margin"));
    CHECK_THAT(bad(R"({"impedance_margin": "50dB"})"), Contains("/plan/impedance_margin"));
    CHECK_THAT(bad(R"({"max_per_part": -1})"), Contains("/plan/max_per_part"));
    CHECK_THAT(bad(R"({"max_total": 0})"), Contains("/plan/max_total"));
    CHECK_THAT(bad(R"({"max_area": "0mm^2"})"), Contains("/plan/max_area"));
  }
  SECTION("no copy allowed of any candidate") {
    CHECK_THAT(bad(R"({"max_per_part": 0})"), Contains("/plan/max_per_part"));
    // A listed part with copies allowed makes max_per_part 0 valid.
    CHECK_NOTHROW(f.parse(project("", R"({"max_per_part": 0, "candidates": {"parts": [{"part": "t-0603-x5r-10u-6v3",
                                                                                       "max_count": 3}]}})")));
  }
  SECTION("filter entries that select nothing, unknown ids") {
    CHECK_THAT(bad(R"({"candidates": {"families": ["mlcc"]}})"),
               Contains("/plan/candidates/families/0") && Contains("testcaps") && Contains("bulky"));
    CHECK_THAT(bad(R"({"candidates": {"packages": ["0805"]}})"),
               Contains("/plan/candidates/packages/0") && Contains("0603"));
    CHECK_THAT(bad(R"({"candidates": {"dielectrics": ["X5R", "Z5U"]}})"), Contains("/plan/candidates/dielectrics/1"));
    CHECK_THAT(bad(R"({"candidates": {"dielectrics": ["X9Q"]}})"), Contains("/plan/candidates/dielectrics/0"));
    CHECK_THAT(bad(R"({"candidates": {"values": ["2u2"]}})"),
               Contains("/plan/candidates/values/0") && Contains("nearest"));
    CHECK_THAT(bad(R"({"candidates": {"parts": [{"part": "t-0402-x5r-1u-6v"}]}})"),
               Contains("/plan/candidates/parts/0/part") && Contains("t-0402-x5r-1u-6v3"));
    CHECK_THAT(bad(R"({"candidates": {"exclude": ["t-0603-x5r-10u-6v"]}})"),
               Contains("/plan/candidates/exclude/0") && Contains("t-0603-x5r-10u-6v3"));
  }
  SECTION("a listed part below the voltage rule, a listed bead, a part both listed and excluded") {
    // 1.5 x 3.3 V = 4.95 V needed (arithmetic of the stated rule); the part is rated 4 V.
    CHECK_THAT(bad(R"({"candidates": {"parts": ["t-0402-x5r-1u-4v"]}})"),
               Contains("/plan/candidates/parts/0") && Contains("4.95 V") && Contains("4 V"));
    CHECK_THAT(bad(R"({"candidates": {"parts": ["t-bead-0603"]}})"),
               Contains("/plan/candidates/parts/0") && Contains("capacitor"));
    CHECK_THAT(bad(R"({"candidates": {"parts": ["t-0603-x5r-10u-6v3"], "exclude": ["t-0603-x5r-10u-6v3"]}})"),
               Contains("/plan/candidates/exclude/0"));
    CHECK_THAT(bad(R"({"candidates": {"parts": ["t-0603-x5r-10u-6v3"], "exclude": [3]}})"),
               Contains("/plan/candidates/exclude/0"));
  }
  SECTION("filters that together leave nothing") {
    // 0603 exists and 100 nF exists, but no 0603 100 nF part.
    CHECK_THAT(bad(R"({"candidates": {"packages": ["0603"], "values": ["100n"]}})"),
               Contains("/plan/candidates") && Contains("at least one capacitor part"));
    // Every 1 uF part excluded or below the rule.
    CHECK_THAT(bad(R"({"candidates": {"values": ["1u"], "exclude": ["t-0402-x5r-1u-6v3", "t-0402-x5r-1u-10v"]}})"),
               Contains("/plan/candidates") && Contains("4.95 V"));
  }
  SECTION("kept and existing parts already above max_area") {
    // 4 x 1.9 mm^2 on the BOM + 2 x 19.2 mm^2 kept = 46 mm^2 > 40 mm^2 (hand sum).
    const std::string message = f.error_of(project(R"("bom": [{"part": "t-0402-x5r-1u-6v3", "count": 4}])",
                                                   R"({"max_area": "40mm^2", "keep": [{"part": "b-poly-100u-6v3", "count": 2}]})"));
    CHECK_THAT(message, Contains("/plan/max_area") && Contains("46 mm^2") && Contains("40 mm^2"));
  }
  SECTION("a bad kept line") {
    CHECK_THAT(bad(R"({"keep": [{"part": "t-0402-x5r-1u-6v3", "count": 0}]})"), Contains("/plan/keep/0/count"));
  }
}
