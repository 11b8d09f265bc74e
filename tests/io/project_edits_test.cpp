// SPDX-License-Identifier: MIT
// Project edits (io/project_edits.hpp): each edit kind changes the rebuilt Project as the
// edit says (expected counts and names written from the example project files and the
// edit, not from the code), and bad edits are InputErrors naming the option or the edits
// file and JSON pointer.
#include <catch2/catch.hpp>

#include <algorithm>
#include <filesystem>
#include <optional>
#include <string>

#include "quietrail/io/project_edits.hpp"
#include "quietrail/io/project_file.hpp"
#include "support/input_error.hpp"

namespace fs = std::filesystem;
using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::EditKind;
using quietrail::ProjectEdit;
using quietrail::test::input_error_of;

namespace {

const fs::path kExamples = fs::path(QUIETRAIL_SOURCE_DIR) / "examples" / "projects";
// decade_rail.json's BOM (read from the file): bulk_330u x2, c10u x10 (mlcc-0603-x5r-10u-6v3),
// c1u x10, c100n x10, c10n x10.
const fs::path kDecade = kExamples / "decade_rail.json";

ProjectEdit option(EditKind kind, const std::string& text, const std::string& name) {
  return quietrail::parse_edit_option(kind, text, name);
}

// The BOM line named `name`, or nullptr.
const quietrail::PlacedPart* line(const quietrail::Project& p, const std::string& name) {
  const auto it = std::find_if(p.parts.begin(), p.parts.end(), [&](const auto& part) { return part.name == name; });
  return it == p.parts.end() ? nullptr : &*it;
}

}  // namespace

TEST_CASE("each edit kind changes the rebuilt project as stated", "[io][compare]") {
  const quietrail::Project base = quietrail::read_project_file(kDecade);
  REQUIRE(base.parts.size() == 5);  // decade_rail.json lists five BOM lines

  SECTION("replace keeps the count and the given name, changes the part") {
    const auto p = quietrail::read_edited_project(
        kDecade, {option(EditKind::replace, "c10u=mlcc-0603-x5r-4u7-6v3", "--replace")});
    REQUIRE(line(p, "c10u"));
    CHECK(line(p, "c10u")->library_id == "mlcc-0603-x5r-4u7-6v3");
    CHECK(line(p, "c10u")->count == 10);
    // nominal 4.7 uF: the id names the value (part_libraries/mlcc.json)
    CHECK_THAT(*line(p, "c10u")->nominal_capacitance, WithinRel(4.7e-6, 1e-12));
  }
  SECTION("count changes one line; by library id when that id is used once") {
    const auto p = quietrail::read_edited_project(
        kDecade, {option(EditKind::count, "c100n=20", "--count"), option(EditKind::count, "mlcc-0402-x7r-10n-16v=3", "--count")});
    CHECK(line(p, "c100n")->count == 20);
    CHECK(line(p, "c10n")->count == 3);
    CHECK(line(p, "c1u")->count == 10);
  }
  SECTION("a count of 0 and remove both take the line out") {
    const auto p = quietrail::read_edited_project(
        kDecade, {option(EditKind::count, "c1u=0", "--count"), option(EditKind::remove, "c10n", "--remove")});
    CHECK(p.parts.size() == 3);
    CHECK(line(p, "c1u") == nullptr);
    CHECK(line(p, "c10n") == nullptr);
    CHECK(line(p, "c100n") != nullptr);
  }
  SECTION("add appends a BOM line named by its id") {
    const auto p = quietrail::read_edited_project(kDecade, {option(EditKind::add, "mlcc-0402-x7r-220n-6v3:4", "--add")});
    CHECK(p.parts.size() == 6);
    const auto* added = line(p, "mlcc-0402-x7r-220n-6v3");  // default name: the library id (project_file.md)
    REQUIRE(added);
    CHECK(added->count == 4);
  }
  SECTION("mounting sets the line's override") {
    const auto p = quietrail::read_edited_project(kDecade, {option(EditKind::mounting, "c1u=0.25n", "--mounting")});
    CHECK_THAT(line(p, "c1u")->mounting_inductance, WithinRel(0.25e-9, 1e-12));  // the value given
    // decade_rail.json's project mounting for 0402 is 0.35 nH; c100n keeps it
    CHECK_THAT(line(p, "c100n")->mounting_inductance, WithinRel(0.35e-9, 1e-12));
  }
  SECTION("an edits file gives the same edits") {
    const auto edits = quietrail::parse_edits_json(
        R"([{"replace": "c10u", "with": "mlcc-0603-x5r-4u7-6v3"}, {"count": "c100n", "to": 20},
            {"add": "mlcc-0402-x7r-220n-6v3", "count": 4}, {"remove": "c10n"}, {"mounting": "c1u", "to": "0.25n"}])",
        "edits.json");
    REQUIRE(edits.size() == 5);
    CHECK(edits[3].origin_field == "/3");
    const auto p = quietrail::read_edited_project(kDecade, edits);
    CHECK(line(p, "c10u")->library_id == "mlcc-0603-x5r-4u7-6v3");
    CHECK(line(p, "c100n")->count == 20);
    CHECK(line(p, "mlcc-0402-x7r-220n-6v3")->count == 4);
    CHECK(line(p, "c10n") == nullptr);
    CHECK_THAT(line(p, "c1u")->mounting_inductance, WithinRel(0.25e-9, 1e-12));
  }
}

TEST_CASE("edits of BOM CSV lines write the CSV lines into the project's bom", "[io][compare]") {
  // memory_rail_bom.csv: C1 (330 uF x1), C2..C5 (10 uF x4), C10..C29 (100 nF x20)
  const fs::path memory = kExamples / "memory_rail.json";
  const auto p = quietrail::read_edited_project(memory, {option(EditKind::count, "C10..C29=30", "--count")});
  CHECK(p.bom_csv.empty());
  CHECK(line(p, "C10..C29")->count == 30);
  CHECK(line(p, "C2..C5")->count == 4);
  CHECK(line(p, "C1")->count == 1);
}

TEST_CASE("bad edits are input errors naming the option or the file and pointer", "[io][compare]") {
  SECTION("an unknown name, with the nearest names") {
    const auto message =
        input_error_of([] { quietrail::read_edited_project(kDecade, {option(EditKind::remove, "c100", "--remove")}); });
    CHECK_THAT(message, Contains("command line"));
    CHECK_THAT(message, Contains("--remove"));
    CHECK_THAT(message, Contains("c100n"));
  }
  SECTION("a negative count on the command line") {
    const auto message = input_error_of([] { option(EditKind::count, "c100n=-2", "--count"); });
    CHECK_THAT(message, Contains("--count"));
    CHECK_THAT(message, Contains("-2"));
  }
  SECTION("a negative count in an edits file names the pointer") {
    const auto message = input_error_of(
        [] { quietrail::parse_edits_json(R"([{"remove": "c10n"}, {"count": "c100n", "to": -1}])", "e.json"); });
    CHECK_THAT(message, Contains("e.json"));
    CHECK_THAT(message, Contains("/1/to"));
  }
  SECTION("an unknown part id in a replace, with the nearest ids") {
    const auto message = input_error_of([] {
      quietrail::read_edited_project(kDecade, {option(EditKind::replace, "c10u=mlcc-0603-x5r-10u-6v", "--replace")});
    });
    CHECK_THAT(message, Contains("--replace"));
    CHECK_THAT(message, Contains("mlcc-0603-x5r-10u-6v3"));
  }
  SECTION("a line removed twice") {
    const auto message = input_error_of([] {
      quietrail::read_edited_project(kDecade,
                                     {option(EditKind::remove, "c10n", "--remove"), option(EditKind::count, "c10n=2", "--count")});
    });
    CHECK_THAT(message, Contains("--count"));
    CHECK_THAT(message, Contains("removed"));
  }
  SECTION("an unknown key and a missing value in an edits file") {
    CHECK_THAT(input_error_of([] { quietrail::parse_edits_json(R"([{"remove": "c10n", "to": 3}])", "e.json"); }),
               Contains("/0/to"));
    CHECK_THAT(input_error_of([] { quietrail::parse_edits_json(R"([{"replace": "c10n"}])", "e.json"); }),
               Contains("/0/with"));
    CHECK_THAT(input_error_of([] { quietrail::parse_edits_json(R"({"remove": "c10n"})", "e.json"); }),
               Contains("a list of edits"));
  }
  SECTION("malformed options") {
    CHECK_THAT(input_error_of([] { option(EditKind::replace, "c10u", "--replace"); }), Contains("NAME=PART_ID"));
    CHECK_THAT(input_error_of([] { option(EditKind::add, "mlcc-0402-x7r-220n-6v3:x", "--add"); }), Contains("--add"));
    CHECK_THAT(input_error_of([] { option(EditKind::add, "mlcc-0402-x7r-220n-6v3:0", "--add"); }),
               Contains("at least 1"));
  }
}
