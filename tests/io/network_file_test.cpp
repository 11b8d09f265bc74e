// SPDX-License-Identifier: MIT
// The JSON network file: values in SI or engineering notation land in the right model
// fields, and every kind of bad input is an InputError naming the file and JSON pointer.
// Numeric expectations name their source (REFERENCES sections, the SI brochure); error cases
// check the documented schema of docs/network_file.md.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>
#include <variant>

#include "quietrail/error.hpp"
#include "quietrail/io/network_file.hpp"
#include "quietrail/models/mounting.hpp"
#include "quietrail/types.hpp"
#include "support/temp_dir.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::InputError;
using quietrail::parse_network_json;

namespace {

// Decimal text to double, then one multiplication by a prefix.
constexpr double kExact = 1e-12;
// Check values printed in REFERENCES.md to 4 significant figures.
constexpr double kPrinted = 1e-3;

constexpr const char* kFile = "rail.json";

const char* const kFull = R"({
  "name": "demo rail",
  "description": "every kind of branch once",
  "port": "rail",
  "ground": "vss",
  "sweep": {"start": "10k", "stop": 1e8, "points_per_decade": 20},
  "branches": [
    {"name": "vrm", "kind": "regulator", "resistance": "0.5m",
     "flat_impedance": "5m", "bandwidth": "50k"},
    {"name": "C100n", "kind": "capacitor", "count": 8, "capacitance": "100n", "esr": "20mohm",
     "esl": 0.5e-9, "dissipation_factor": 0.02, "skin_corner": "10MHz",
     "leakage_resistance": "500meg", "mounting": {"package": "0402"}},
    {"name": "C1u", "kind": "capacitor", "capacitance": "1u", "esl": "0.3n",
     "mounting": {"via_length": "1.575mm", "via_diameter": "0.3mm", "via_pitch": "1mm"}},
    {"name": "Cbulk", "kind": "capacitor", "capacitance": "330u", "esr": "6m",
     "mounting": {"inductance": "1.5n"}, "note": "polymer"},
    {"name": "planes", "kind": "plane", "width": "254mm", "length": "203.2mm",
     "separation": "101.6u", "relative_permittivity": 4.3, "loss_tangent": 0.02,
     "spreading_inductance": "20p"},
    {"name": "FB1", "kind": "bead", "from": "rail", "to": "quiet", "inductance": "1u",
     "dc_resistance": 0.1, "parallel_capacitance": "1.5p", "core_loss_resistance": "1k"},
    {"name": "Cq", "kind": "capacitor", "from": "quiet", "capacitance": "10u", "esr": "5m"},
    {"name": "Rd", "kind": "resistor", "from": "quiet", "resistance": "R47", "series_inductance": "1n"}
  ]
})";

template <class T>
const T& element_of(const quietrail::NetworkFile& file, std::size_t branch) {
  return std::get<T>(file.network.branches().at(branch).part.element);
}

// Parses `text`, expecting an InputError whose field contains `field` and whose message
// contains `words`.
void expect_error(const std::string& text, const std::string& field, const std::string& words) {
  try {
    parse_network_json(text, kFile);
    FAIL("accepted: " << text);
  } catch (const InputError& e) {
    INFO(e.what());
    CHECK(e.where().file == kFile);
    CHECK_THAT(e.where().field, Contains(field));
    CHECK_THAT(e.what(), Contains(words));
  }
}

// A valid one-capacitor file with `branch_extra` spliced into the branch object.
std::string one_capacitor(const std::string& branch_extra, const std::string& top_extra = "") {
  return R"({"name": "t", "port": "rail", )" + top_extra + R"("branches": [{"name": "C1", "kind": "capacitor", )" +
         branch_extra + "}]}";
}

}  // namespace

TEST_CASE("a network file sets every model field from numbers and engineering strings", "[io]") {
  const auto file = parse_network_json(kFull, kFile);
  CHECK(file.name == "demo rail");
  CHECK(file.network.node_name(quietrail::Network::kGround) == "vss");
  CHECK(file.network.node_name(file.port) == "rail");
  CHECK(file.sweep.start == 1e4);
  CHECK(file.sweep.stop == 1e8);
  CHECK(file.sweep.points_per_decade == 20);
  REQUIRE(file.network.branches().size() == 8);
  CHECK(file.branch_kinds ==
        std::vector<std::string>{"regulator", "capacitor", "capacitor", "capacitor", "plane", "bead", "capacitor",
                                 "resistor"});

  SECTION("regulator inductance from the loop bandwidth") {
    // REFERENCES §9: Z_flat = 5 mohm, f_bw = 50 kHz -> L_out = 15.92 nH.
    const auto& vrm = element_of<quietrail::Regulator>(file, 0);
    CHECK_THAT(vrm.inductance, WithinRel(15.92e-9, kPrinted));
    CHECK_THAT(vrm.resistance, WithinRel(0.5e-3, kExact));
  }
  SECTION("capacitor fields, count and package mounting") {
    const auto& branch = file.network.branches()[1];
    const auto& c = element_of<quietrail::Capacitor>(file, 1);
    CHECK_THAT(c.capacitance, WithinRel(100e-9, kExact));
    CHECK_THAT(c.esr, WithinRel(20e-3, kExact));
    CHECK(c.esl == 0.5e-9);
    CHECK(c.dissipation_factor == 0.02);
    CHECK_THAT(c.skin_corner, WithinRel(10e6, kExact));
    CHECK_THAT(c.leakage_resistance, WithinRel(500e6, kExact));
    CHECK(branch.part.count == 8);
    // The package form takes the mounting module's typical value for that package.
    CHECK(branch.part.mounting_inductance == quietrail::typical_mounting_inductance(quietrail::Package::p0402));
    CHECK(branch.from == file.port);  // "from" defaults to the port
    CHECK(branch.to == quietrail::Network::kGround);  // "to" defaults to ground
  }
  SECTION("mounting from via geometry") {
    // REFERENCES §6 via pair: h = 1.575 mm, s = 1.0 mm, r = 0.15 mm -> 1.181 nH (acosh form).
    CHECK_THAT(file.network.branches()[2].part.mounting_inductance, WithinRel(1.181e-9, kPrinted));
  }
  SECTION("mounting given as an inductance") {
    CHECK_THAT(file.network.branches()[3].part.mounting_inductance, WithinRel(1.5e-9, kExact));
  }
  SECTION("plane pair from width and length") {
    // REFERENCES §7: 10 x 8 in, er 4.3, 4 mil -> 19.34 nF.
    const auto& plane = element_of<quietrail::PlanePair>(file, 4);
    CHECK_THAT(plane.capacitance(), WithinRel(19.34e-9, kPrinted));
    CHECK_THAT(plane.spreading_inductance, WithinRel(20e-12, kExact));
    CHECK(plane.loss_tangent == 0.02);
  }
  SECTION("bead between two named nodes, resistor with an IEC 60062 value") {
    const auto& bead = file.network.branches()[5];
    CHECK(file.network.node_name(bead.from) == "rail");
    CHECK(file.network.node_name(bead.to) == "quiet");
    const auto& fb = element_of<quietrail::Inductor>(file, 5);
    CHECK_THAT(fb.inductance, WithinRel(1e-6, kExact));
    CHECK_THAT(fb.parallel_capacitance, WithinRel(1.5e-12, kExact));
    CHECK_THAT(fb.core_loss_resistance, WithinRel(1e3, kExact));
    CHECK_THAT(element_of<quietrail::Resistor>(file, 7).resistance, WithinRel(0.47, kExact));  // "R47"
  }
}

TEST_CASE("plane areas are read in m^2, cm^2 and mm^2", "[io]") {
  auto plane_area = [](const std::string& area) {
    const auto file = parse_network_json(
        R"({"name": "p", "port": "rail", "branches": [{"name": "P", "kind": "plane", "area": )" + area +
            R"(, "separation": "100u"}]})",
        kFile);
    return std::get<quietrail::PlanePair>(file.network.branches()[0].part.element).area;
  };
  // 1 cm^2 = 1e-4 m^2, 1 mm^2 = 1e-6 m^2 (SI brochure, 9th ed., prefixes on squared units).
  CHECK_THAT(plane_area("0.01"), WithinRel(0.01, kExact));
  CHECK_THAT(plane_area("\"100cm^2\""), WithinRel(0.01, kExact));
  CHECK_THAT(plane_area("\"10000 mm^2\""), WithinRel(0.01, kExact));
  CHECK_THAT(plane_area("\"0.01m2\""), WithinRel(0.01, kExact));
  // Parallel plate C = eps0 er A / d (REFERENCES §7) with the default er 4.3.
  const auto file = parse_network_json(
      R"({"name": "p", "port": "rail", "branches": [{"name": "P", "kind": "plane", "area": "100cm^2",
          "separation": "100u"}]})",
      kFile);
  CHECK_THAT(std::get<quietrail::PlanePair>(file.network.branches()[0].part.element).capacitance(),
             WithinRel(quietrail::kEps0 * 4.3 * 0.01 / 100e-6, kExact));
}

TEST_CASE("malformed JSON is reported with its line and column", "[io]") {
  // Line 3 is `  "port" "rail",`: the string "rail" (columns 10-15) where ':' belongs;
  // the parser stops after reading its closing quote, column 15 (counted by hand).
  const std::string text = "{\n  \"name\": \"x\",\n  \"port\" \"rail\",\n  \"branches\": []\n}\n";
  try {
    parse_network_json(text, kFile);
    FAIL("accepted malformed JSON");
  } catch (const InputError& e) {
    CHECK(e.where().line == 3);
    CHECK(e.where().column == 15);
    CHECK_THAT(e.what(), Contains("rail.json:3:15"));
    CHECK_THAT(e.what(), Contains("valid JSON"));
  }
  SECTION("an unterminated document points at its end") {
    try {
      parse_network_json("{\"name\": \"x\",\n", kFile);
      FAIL("accepted a truncated document");
    } catch (const InputError& e) {
      CHECK(e.where().line == 2);
    }
  }
}

TEST_CASE("structural mistakes are rejected naming the JSON pointer", "[io]") {
  expect_error("[1, 2]", "", "a network description");
  expect_error(R"({"name": "t", "nmae": "x", "port": "rail", "branches": []})", "/nmae",
               "the unknown key 'nmae'");
  expect_error(R"({"name": "t", "nmae": "x", "port": "rail", "branches": []})", "/nmae", "name, description, port");
  expect_error(R"({"port": "rail", "branches": []})", "/name", "missing");
  expect_error(R"({"name": "t", "branches": []})", "/port", "missing");
  expect_error(R"({"name": "t", "port": "rail", "branches": []})", "/branches", "a non-empty list");
  expect_error(R"({"name": "t", "port": "gnd", "branches": []})", "/port", "other than the ground");
  expect_error(R"({"name": 5, "port": "rail", "branches": []})", "/name", "number 5");
  // A key given twice: the pointer of the object and the key.
  expect_error(one_capacitor(R"("capacitance": "1u", "esr": "5m", "esr": "6m")"), "/branches/0/esr", "given twice");
  // RFC 6901: "/" in a key is written "~1" in the pointer.
  expect_error(R"({"name": "t", "a/b": 1, "port": "rail", "branches": []})", "/a~1b", "unknown key");
}

TEST_CASE("branch mistakes are rejected naming the branch's JSON pointer", "[io]") {
  expect_error(one_capacitor(R"("capacitance": "1u", "esrr": "5m")"), "/branches/0/esrr", "the unknown key 'esrr'");
  expect_error(one_capacitor(R"("capacitance": "1u", "esrr": "5m")"), "/branches/0/esrr", "capacitance, esr, esl");
  expect_error(one_capacitor(R"("esr": "5m")"), "/branches/0/capacitance", "missing");
  expect_error(one_capacitor(R"("capacitance": "1u", "esr": true)"), "/branches/0/esr", "boolean true");
  expect_error(one_capacitor(R"("capacitance": "1u", "esr": "5mH")"), "/branches/0/esr", "a resistance such as");
  expect_error(one_capacitor(R"("capacitance": "-100n")"), "/branches/0/capacitance", "> 0");
  expect_error(one_capacitor(R"("capacitance": "1u", "esl": -1e-9)"), "/branches/0/esl", ">= 0");
  expect_error(one_capacitor(R"("capacitance": "1u", "count": 0)"), "/branches/0/count", ">= 1");
  expect_error(one_capacitor(R"("capacitance": "1u", "count": 2.5)"), "/branches/0/count", "a whole number");
  expect_error(one_capacitor(R"("capacitance": "1u", "count": "2")"), "/branches/0/count", "a whole number");
  expect_error(one_capacitor(R"("capacitance": "1u", "to": "rail")"), "/branches/0/to", "other than");
  expect_error(one_capacitor(R"("capacitance": "1u", "inductance": "1n")"), "/branches/0/inductance",
               "unknown key");
  expect_error(R"({"name": "t", "port": "rail", "branches": [{"name": "X", "kind": "capacitr"}]})",
               "/branches/0/kind", "'capacitr'");
  expect_error(R"({"name": "t", "port": "rail", "branches": [{"name": "X"}]})", "/branches/0/kind", "missing");
  expect_error(R"({"name": "t", "port": "rail", "branches": [
      {"name": "C", "kind": "capacitor", "capacitance": "1u"},
      {"name": "C", "kind": "capacitor", "capacitance": "2u"}]})",
               "/branches/1/name", "used once");
}

TEST_CASE("mounting, regulator and plane forms must be given one way", "[io]") {
  expect_error(one_capacitor(R"("capacitance": "1u", "mounting": {"package": "0403"})"),
               "/branches/0/mounting/package", "0402");
  expect_error(one_capacitor(R"("capacitance": "1u", "mounting": {"package": "0402", "inductance": "1n"})"),
               "/branches/0/mounting", "exactly one way");
  expect_error(one_capacitor(R"("capacitance": "1u", "mounting": {})"), "/branches/0/mounting", "exactly one way");
  expect_error(one_capacitor(R"("capacitance": "1u", "mounting": {"inductance": "-1n"})"),
               "/branches/0/mounting/inductance", ">= 0");
  expect_error(one_capacitor(R"("capacitance": "1u", "mounting": {"via_length": "1mm", "via_diameter": "0.3mm"})"),
               "/branches/0/mounting/via_pitch", "missing");
  expect_error(one_capacitor(R"("capacitance": "1u", "mounting": {"via_length": "1mm", "via_diameter": "0.3mm",
               "via_pitch": "0.2mm"})"),
               "/branches/0/mounting/via_pitch", "larger than the via diameter");
  expect_error(R"({"name": "t", "port": "rail", "branches": [{"name": "V", "kind": "regulator", "resistance": "1m",
               "inductance": "1n", "bandwidth": "50k"}]})",
               "/branches/0", "either \"inductance\"");
  expect_error(R"({"name": "t", "port": "rail", "branches": [{"name": "V", "kind": "regulator", "resistance": "1m",
               "flat_impedance": "1m"}]})",
               "/branches/0/bandwidth", "alone");
  expect_error(R"({"name": "t", "port": "rail", "branches": [{"name": "V", "kind": "regulator", "resistance": "1m",
               "flat_impedance": "1m", "bandwidth": 0}]})",
               "/branches/0/bandwidth", "> 0");
  expect_error(R"({"name": "t", "port": "rail", "branches": [{"name": "P", "kind": "plane", "separation": "1u"}]})",
               "/branches/0/area", "either \"area\"");
  expect_error(R"({"name": "t", "port": "rail", "branches": [{"name": "P", "kind": "plane", "area": "1cm^3",
               "separation": "1u"}]})",
               "/branches/0/area", "an area such as");
  expect_error(R"({"name": "t", "port": "rail", "branches": [{"name": "P", "kind": "plane", "width": "10mm",
               "separation": "1u"}]})",
               "/branches/0/length", "missing");
}

TEST_CASE("sweep values are validated under /sweep", "[io]") {
  expect_error(one_capacitor(R"("capacitance": "1u")", R"("sweep": {"start": "1M", "stop": "1k"}, )"), "/sweep/stop",
               "above the start");
  expect_error(one_capacitor(R"("capacitance": "1u")", R"("sweep": {"start": "0"}, )"), "/sweep/start", "> 0");
  expect_error(one_capacitor(R"("capacitance": "1u")", R"("sweep": {"points_per_decade": 0}, )"),
               "/sweep/points_per_decade", "points per decade");
  expect_error(one_capacitor(R"("capacitance": "1u")", R"("sweep": {"stepz": 3}, )"), "/sweep/stepz", "unknown key");
  expect_error(one_capacitor(R"("capacitance": "1u")", R"("sweep": {"start": "1kF"}, )"), "/sweep/start",
               "a frequency");
}

TEST_CASE("a network that cannot be solved from its port is rejected", "[io]") {
  // Topology rules of network/topology.hpp: every branch reachable from the port.
  expect_error(R"({"name": "t", "port": "rail", "branches": [
      {"name": "C1", "kind": "capacitor", "capacitance": "1u"},
      {"name": "C2", "kind": "capacitor", "from": "island", "to": "reef", "capacitance": "1u"}]})",
               "/branches", "'C2'");
  // The port must be a node a branch touches.
  expect_error(R"({"name": "t", "port": "rial", "branches": [
      {"name": "C1", "kind": "capacitor", "from": "rail", "capacitance": "1u"}]})",
               "/port", "'rial'");
}

TEST_CASE("reading from disk names the file when it is missing", "[io]") {
  quietrail::test::TempDir dir("netfile");
  CHECK_THROWS_WITH(quietrail::read_network_file(dir / "absent.json"), Contains("absent.json") && Contains("no such file"));
  quietrail::test::write_text(dir / "rail.json", one_capacitor(R"("capacitance": "1u")"));
  const auto file = quietrail::read_network_file(dir / "rail.json");
  CHECK(file.network.branches().size() == 1);
  CHECK_THROWS_WITH(quietrail::read_network_file(dir.path()), Contains("not a regular file"));
}
