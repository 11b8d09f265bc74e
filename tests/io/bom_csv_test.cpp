// SPDX-License-Identifier: MIT
// BOM CSV: RFC 4180 splitting, designator lists, header names, resolution to library parts
// by value, package, dielectric and rating, and every error naming the file and line.
// Splitting follows the published standard RFC 4180 (its section 2 rules are quoted beside the checks); matching
// follows the rules documented in docs/project_file.md ("BOM from CSV").
#include <catch2/catch.hpp>

#include <string>
#include <vector>

#include "quietrail/error.hpp"
#include "quietrail/io/bom_csv.hpp"
#include "quietrail/io/part_library.hpp"
#include "support/temp_dir.hpp"

using Catch::Matchers::Contains;
using quietrail::BomCsvOptions;
using quietrail::InputError;
using quietrail::PartLibrary;
using quietrail::parse_bom_csv;

namespace {

constexpr const char* kFile = "bom.csv";

// A small library: 100 nF 0402 X7R at three ratings, the same value in X5R and in 0603,
// 10 uF 0603 X5R, and a bead. Values are invented for matching only.
PartLibrary small_library() {
  PartLibrary library;
  library.add_json(R"({
    "format_version": 1,
    "header": {"family": "test", "description": "matching fixture", "values": "invented"},
    "parts": [
      {"id": "c100n-0402-x7r-10v", "kind": "capacitor", "package": "0402", "dielectric": "X7R",
       "capacitance": "100n", "esr": "30m", "esl": "0.4n", "rated_voltage": "10V", "tolerance": 0.1,
       "area": "1.9mm^2", "cost": 1.0, "dc_bias": {"v_half": "6V", "exponent": 1.5}},
      {"id": "c100n-0402-x7r-16v", "kind": "capacitor", "package": "0402", "dielectric": "X7R",
       "capacitance": "100n", "esr": "30m", "esl": "0.4n", "rated_voltage": "16V", "tolerance": 0.1,
       "area": "1.9mm^2", "cost": 1.1, "dc_bias": {"v_half": "9V", "exponent": 1.5}},
      {"id": "c100n-0402-x7r-25v", "kind": "capacitor", "package": "0402", "dielectric": "X7R",
       "capacitance": "100n", "esr": "30m", "esl": "0.4n", "rated_voltage": "25V", "tolerance": 0.1,
       "area": "1.9mm^2", "cost": 1.3, "dc_bias": {"v_half": "14V", "exponent": 1.5}},
      {"id": "c100n-0402-x5r-16v", "kind": "capacitor", "package": "0402", "dielectric": "X5R",
       "capacitance": "100n", "esr": "30m", "esl": "0.4n", "rated_voltage": "16V", "tolerance": 0.1,
       "area": "1.9mm^2", "cost": 0.9, "dc_bias": {"v_half": "8V", "exponent": 1.5}},
      {"id": "c100n-0603-x7r-16v", "kind": "capacitor", "package": "0603", "dielectric": "X7R",
       "capacitance": "100n", "esr": "30m", "esl": "0.6n", "rated_voltage": "16V", "tolerance": 0.1,
       "area": "4.2mm^2", "cost": 1.2, "dc_bias": {"v_half": "12V", "exponent": 1.5}},
      {"id": "c10u-0603-x5r-6v3", "kind": "capacitor", "package": "0603", "dielectric": "X5R",
       "capacitance": "10u", "esr": "5m", "esl": "0.6n", "rated_voltage": "6.3V", "tolerance": 0.2,
       "area": "4.2mm^2", "cost": 4.0, "dc_bias": {"v_half": "4V", "exponent": 1.5}},
      {"id": "bead-0603-600r", "kind": "bead", "package": "0603", "inductance": "1u",
       "dc_resistance": "150m", "core_loss_resistance": "780", "parallel_capacitance": "0.8p",
       "impedance_100mhz": "600ohm", "tolerance": 0.25, "area": "4.2mm^2", "cost": 2.0}
    ]})",
                   "test_library.json");
  return library;
}

std::string error_of(const std::string& csv, const PartLibrary& library, const BomCsvOptions& options = {}) {
  try {
    (void)parse_bom_csv(csv, kFile, library, options);
  } catch (const InputError& e) {
    return e.what();
  }
  FAIL("no InputError for:\n" << csv);
  return {};
}

}  // namespace

TEST_CASE("designator lists expand ranges written both ways and count each designator once", "[io]") {
  // "C5-C8" and "C5-8" both name C5, C6, C7, C8: four parts (the usual range notation).
  const auto list = quietrail::expand_designators("C1, C2, C5-C8", {kFile, "Designator", 2});
  CHECK(list == std::vector<std::string>{"C1", "C2", "C5", "C6", "C7", "C8"});
  CHECK(quietrail::expand_designators("C10-12;C3 C4", {}).size() == 5);
  CHECK_THROWS_WITH(quietrail::expand_designators("C8-C5", {kFile, "Designator", 7}),
                    Contains("bom.csv:7") && Contains("Designator") && Contains("C8-C5"));
  CHECK_THROWS_AS(quietrail::expand_designators("C5-R8", {}), InputError);
  CHECK_THROWS_AS(quietrail::expand_designators(" , ", {}), InputError);
}

TEST_CASE("CSV records follow RFC 4180 quoting and keep their starting line numbers", "[io]") {
  // RFC 4180 section 2, rules 5-7: fields may be enclosed in double quotes; such fields may
  // hold commas and line breaks; a double quote inside is written as two double quotes.
  const std::string text = "a,b,c\r\n\"x, y\",\"say \"\"hi\"\"\",\"two\nlines\"\n\nlast,,end\n";
  const auto records = quietrail::split_csv(text, kFile);
  REQUIRE(records.size() == 3);
  CHECK(records[1].cells == std::vector<std::string>{"x, y", "say \"hi\"", "two\nlines"});
  CHECK(records[1].line == 2);
  // The quoted line break moves the next record to line 4; the blank line 4 is skipped.
  CHECK(records[2].line == 5);
  CHECK(records[2].cells == std::vector<std::string>{"last", "", "end"});
  // A UTF-8 byte order mark (as spreadsheet programs write) is not part of the first cell.
  CHECK(quietrail::split_csv("\xEF\xBB\xBFQty\n1\n", kFile)[0].cells[0] == "Qty");
  CHECK_THROWS_WITH(quietrail::split_csv("a\n\"open,b\n", kFile), Contains("bom.csv:2") && Contains("closing"));
}

TEST_CASE("a line resolves by value, package and dielectric to the smallest adequate rating", "[io]") {
  const PartLibrary library = small_library();
  const std::string csv =
      "Designator,Quantity,Description\n"
      "\"C1, C2, C5-C8\",6,\"CAP CER 100nF 0402 X7R 16V\"\n"
      "C10,1,100n 0402 X7R 6.3V\n"
      "C11,1,100nF 0402 X7R 20V\n"
      "C12,1,4u7 0603 X5R\n";
  // 4u7 is not in the library: only the first three lines here.
  const auto lines = parse_bom_csv(csv.substr(0, csv.rfind("C12")), kFile, library);
  REQUIRE(lines.size() == 3);
  CHECK(lines[0].part_id == "c100n-0402-x7r-16v");
  CHECK(lines[0].count == 6);
  CHECK(lines[0].designator_list.size() == 6);
  CHECK(lines[0].line == 2);
  // 6.3 V asked: the 10 V part is the smallest rating at or above it.
  CHECK(lines[1].part_id == "c100n-0402-x7r-10v");
  // 20 V asked: 25 V is the smallest adequate rating.
  CHECK(lines[2].part_id == "c100n-0402-x7r-25v");
}

TEST_CASE("an unrated line never resolves below the rail voltage the caller gives", "[io]") {
  const PartLibrary library = small_library();
  const std::string csv = "Qty,Value,Package,Dielectric\n2,100nF,0402,X7R\n";
  CHECK(parse_bom_csv(csv, kFile, library)[0].part_id == "c100n-0402-x7r-10v");
  CHECK(parse_bom_csv(csv, kFile, library, BomCsvOptions{.default_min_voltage = 12.0})[0].part_id ==
        "c100n-0402-x7r-16v");
}

TEST_CASE("header names match in any case and spelling, and a library id column resolves directly", "[io]") {
  const PartLibrary library = small_library();
  const auto lines = parse_bom_csv(
      "REF DES;x,QTY,Part_Description,Foot-print,library id\n"
      "C1-C3,3,10uF 6.3V X5R,0603,\n"
      "FB1,1,,,bead-0603-600r\n",
      kFile, library);
  REQUIRE(lines.size() == 2);
  // "REF DES;x" is not a designator column name, so the quantity gives the count.
  CHECK(lines[0].part_id == "c10u-0603-x5r-6v3");
  CHECK(lines[0].count == 3);
  CHECK(lines[1].part_id == "bead-0603-600r");
}

TEST_CASE("a line no part matches names its line and the nearest candidates", "[io]") {
  const PartLibrary library = small_library();
  const std::string message = error_of("Designator,Qty,Value\nC1,1,100nF 0402 X7R 16V\nC2,1,4.7uF 0603 X5R\n", library);
  CHECK_THAT(message, Contains("bom.csv:3") && Contains("Value") && Contains("4.7uF 0603 X5R"));
  CHECK_THAT(message, Contains("nearest") && Contains("c10u-0603-x5r-6v3"));
  // A rating above every part's names what exists.
  CHECK_THAT(error_of("Qty,Value\n1,100nF 0402 X7R 50V\n", library),
             Contains("bom.csv:2") && Contains("rated >= 50 V") && Contains("c100n-0402-x7r-25v"));
  // An unknown library id names the nearest ids.
  CHECK_THAT(error_of("Qty,Part ID\n1,bead-0603-600\n", library),
             Contains("bom.csv:2") && Contains("Part ID") && Contains("bead-0603-600r"));
}

TEST_CASE("a line that leaves out a package or dielectric the matches differ in is ambiguous", "[io]") {
  const PartLibrary library = small_library();
  CHECK_THAT(error_of("Qty,Value\n1,100nF X7R 16V\n", library),
             Contains("bom.csv:2") && Contains("package") && Contains("0402, 0603"));
  CHECK_THAT(error_of("Qty,Value\n1,100nF 0402 16V\n", library),
             Contains("bom.csv:2") && Contains("dielectric") && Contains("X5R, X7R"));
}

TEST_CASE("missing columns are named with the columns expected and found", "[io]") {
  const PartLibrary library = small_library();
  const std::string no_count = error_of("Value,Package\n100nF,0402\n", library);
  CHECK_THAT(no_count, Contains("bom.csv:1") && Contains("header") && Contains("quantity column") &&
                           Contains("designator") && Contains("'Value', 'Package'"));
  const std::string no_value = error_of("Designator,Qty\nC1,1\n", library);
  CHECK_THAT(no_value, Contains("value or description column"));
}

TEST_CASE("counts must be whole, positive and agree with the designators", "[io]") {
  const PartLibrary library = small_library();
  CHECK_THAT(error_of("Qty,Value\n-2,100nF 0402 X7R 16V\n", library), Contains("bom.csv:2") && Contains("Qty") && Contains(">= 1"));
  CHECK_THAT(error_of("Designator,Qty,Value\nC1-C3,4,100nF 0402 X7R 16V\n", library),
             Contains("bom.csv:2") && Contains("number of designators (3"));
  CHECK_THAT(error_of("Designator,Value\nC1,100nF 0402 X7R 16V\nC1,100nF 0402 X7R 16V\n", library),
             Contains("bom.csv:3") && Contains("also on line 2"));
  CHECK_THAT(error_of("Designator,Value\nC1,0402 X7R\n", library), Contains("bom.csv:2") && Contains("a value"));
  CHECK_THAT(error_of("Designator,Value\n", library), Contains("at least one part line"));
  CHECK_THAT(error_of("Designator,Value\nC1,100nF 0402 X7R 16V,extra\n", library), Contains("bom.csv:2"));
}

TEST_CASE("a BOM file is read from disk and a missing file is named", "[io]") {
  const PartLibrary library = small_library();
  const quietrail::test::TempDir dir("bom");
  quietrail::test::write_text(dir / "b.csv", "Qty,Value\n3,10uF 0603 X5R\n");
  CHECK(quietrail::read_bom_csv(dir / "b.csv", library)[0].count == 3);
  CHECK_THROWS_WITH(quietrail::read_bom_csv(dir / "none.csv", library), Contains("none.csv") && Contains("no such file"));
}
