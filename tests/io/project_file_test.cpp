// SPDX-License-Identifier: MIT
// The project file: rail and target (Smith et al. 1999 worked values), band defaults
// (0.35 / t_r), derating of library parts, mounting defaults, the network it builds (checked
// against circuit-theory closed forms) and every kind of bad input naming file and pointer.
#include <catch2/catch.hpp>

#include <cmath>
#include <complex>
#include <filesystem>
#include <numbers>
#include <string>
#include <variant>

#include "quietrail/error.hpp"
#include "quietrail/io/project_file.hpp"
#include "quietrail/models/mounting.hpp"
#include "quietrail/network/nodal_solver.hpp"
#include "support/temp_dir.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::InputError;
using quietrail::parse_project_json;
using quietrail::Project;

namespace {

namespace fs = std::filesystem;

// Exact arithmetic on values that went through decimal parsing (REFERENCES general guidance).
constexpr double kExact = 1e-9;
// Check values printed in REFERENCES.md to 4 significant figures.
constexpr double kPrinted = 1e-3;

constexpr const char* kFile = "project.json";
const fs::path kLibraries = fs::path(QUIETRAIL_SOURCE_DIR) / "part_libraries";

Project parse(const std::string& text) { return parse_project_json(text, kFile, kLibraries); }

std::string error_of(const std::string& text) {
  try {
    (void)parse(text);
  } catch (const InputError& e) {
    return e.what();
  }
  FAIL("no InputError for:\n" << text);
  return {};
}

// A minimal valid project with `rail` and `rest` spliced in (libraries: the shipped ones).
std::string project(const std::string& rail, const std::string& rest) {
  return R"({"name": "p", "rail": {)" + rail + R"(},
    "regulator": {"resistance": "1m", "inductance": "10n"},
    "libraries": ["mlcc.json", "bulk.json", "beads.json"],)" +
         rest + "}";
}

const std::string kRail = R"("voltage": 1.0, "ripple": "5%", "max_current": 20, "band": {"stop": "100MHz"})";
const std::string kBom = R"("bom": [{"part": "mlcc-0402-x7r-100n-16v", "count": 4}])";

double magnitude(const quietrail::Network& network, quietrail::NodeId port, double f) {
  const quietrail::FrequencyGrid grid(std::vector<double>{f});
  return std::abs(quietrail::solve_port_impedance(network, port, grid)[0]);
}

}  // namespace

TEST_CASE("the target from the rail is V * ripple / step: 1.0 V, 5 %, 10 A gives 5 mohm", "[io]") {
  // Smith et al. 1999 (REFERENCES §1): Z_t = V r / dI; 1.0 V * 0.05 / 10 A = 5 mohm.
  const Project given_step = parse(project(R"("voltage": 1.0, "ripple": "5%", "max_current": 20, "step": 10,
                                              "band": {"stop": "100MHz"})",
                                           kBom));
  CHECK_THAT(given_step.target->at(1e6), WithinRel(5e-3, kExact));
  // The same step as the default 50 % of 20 A (Smith et al. 1999's assumption).
  const Project half = parse(project(kRail, kBom));
  CHECK_THAT(half.target->at(1e6), WithinRel(5e-3, kExact));
  // REFERENCES §1 worked value: 1.0 V, 5 %, I_max 10 A, dI 50 % = 5 A -> 10 mohm.
  const Project ten = parse(project(R"("voltage": 1.0, "ripple": 0.05, "max_current": 10, "band": {"stop": "1G"})", kBom));
  CHECK_THAT(ten.target->at(1e6), WithinRel(10e-3, kExact));
  // A step given as a percentage of the maximum: 25 % of 20 A = 5 A -> 10 mohm.
  const Project quarter = parse(project(R"("voltage": 1.0, "ripple": "5%", "max_current": 20, "step": "25%",
                                           "band": {"stop": "1G"})",
                                        kBom));
  CHECK_THAT(quarter.target->at(1e6), WithinRel(10e-3, kExact));
}

TEST_CASE("a ripple in volts is a fraction of the rail voltage", "[io]") {
  // 25 mV on 1.0 V is 2.5 %; with a 10 A step Z_t = 25 mV / 10 A = 2.5 mohm (Ohm's law).
  const Project p = parse(project(R"("voltage": 1.0, "ripple": "25mV", "max_current": 20,
                                     "band": {"stop": "1G"})",
                                  kBom));
  CHECK_THAT(p.rail.ripple, WithinRel(0.025, kExact));
  CHECK_THAT(p.target->at(1e3), WithinRel(2.5e-3, kExact));
}

TEST_CASE("the band stops at 0.35 / rise time when no stop is given", "[io]") {
  // REFERENCES §1: t_r = 1 ns -> f_max = 350 MHz (0.35 / t_r; common practice).
  const Project p = parse(project(R"("voltage": 1.0, "ripple": "5%", "max_current": 20, "rise_time": "1ns")", kBom));
  CHECK_THAT(p.band.stop, WithinRel(350e6, kPrinted));
  CHECK(p.band_stop_from_rise_time);
  // The documented default start and grid density (docs/project_file.md).
  CHECK(p.band.start == 1e3);
  CHECK(p.band.points_per_decade == 50);
}

TEST_CASE("targets given as segments or points are interpolated log-log", "[io]") {
  // Log-log midpoint of 1 mohm at 1 MHz and 100 mohm at 100 MHz is 10 mohm at 10 MHz.
  const Project points = parse(project(kRail, R"("target": {"points": [["1MHz", "1m"], {"frequency": "100MHz", "impedance": "100m"}]},)" + kBom));
  CHECK_THAT(points.target->at(10e6), WithinRel(10e-3, kExact));
  // +20 dB per decade is a factor of 10 per decade: 5 mohm at 1 MHz -> 50 mohm at 10 MHz.
  const Project segments = parse(project(kRail, R"("target": {"segments": [
      {"start": "1k", "stop": "1MHz", "impedance": "5m"},
      {"start": "1MHz", "stop": "100MHz", "impedance_at_start": "5m", "slope_db_per_decade": 20}]},)" + kBom));
  CHECK_THAT(segments.target->at(10e6), WithinRel(50e-3, kExact));
  CHECK_THAT(segments.target->at(1e4), WithinRel(5e-3, kExact));
}

TEST_CASE("library capacitors enter the network at their derated capacitance, nominal kept", "[io]") {
  // mlcc-0402-x7r-100n-16v documents its DC-bias curve as v_half = 9.37 V, exponent 1.5
  // (part_libraries/mlcc.json; model form C/C0 = 1/(1 + (V/v_half)^p), REFERENCES §8).
  // At 25 C the temperature factor is 1 by definition (25 C is the reference).
  const Project p = parse(project(R"("voltage": 3.3, "ripple": "3%", "max_current": 2, "temperature": 25,
                                     "band": {"stop": "100MHz"})",
                                  kBom));
  REQUIRE(p.parts.size() == 1);
  const auto& part = p.parts[0];
  const double factor = 1.0 / (1.0 + std::pow(3.3 / 9.37, 1.5));
  CHECK_THAT(*part.nominal_capacitance, WithinRel(100e-9, kExact));
  CHECK_THAT(*part.effective_capacitance, WithinRel(100e-9 * factor, kExact));
  const auto& branch = p.network.branches()[static_cast<std::size_t>(part.branch)];
  CHECK_THAT(std::get<quietrail::Capacitor>(branch.part.element).capacitance, WithinRel(100e-9 * factor, kExact));
  CHECK(branch.part.count == 4);
  // BranchInfo carries the nominal value for run_check's part table.
  CHECK_THAT(*p.branch_info[static_cast<std::size_t>(part.branch)].nominal_capacitance, WithinRel(100e-9, kExact));
  CHECK(p.branch_info[static_cast<std::size_t>(part.branch)].library_id == "mlcc-0402-x7r-100n-16v");
}

TEST_CASE("a dc_voltage other than the nominal sets the derating point", "[io]") {
  const Project p = parse(project(R"("voltage": 3.3, "ripple": "3%", "max_current": 2, "temperature": "25C",
                                     "dc_voltage": 0, "band": {"stop": "100MHz"})",
                                  kBom));
  // At 0 V a capacitor keeps its nominal value (C(0)/C0 = 1, REFERENCES §8).
  CHECK_THAT(*p.parts[0].effective_capacitance, WithinRel(100e-9, kExact));
}

TEST_CASE("mounting comes from the line, the project, the part or the package, in that order", "[io]") {
  const Project p = parse(project(kRail, R"("mounting": {"0603": "0.45n"},
    "bom": [
      {"part": "mlcc-0402-x7r-100n-16v", "mounting": "0.2n"},
      {"part": "mlcc-0402-x7r-100n-25v", "mounting": {"inductance": "0.25n"}},
      {"part": "mlcc-0603-x7r-100n-16v"},
      {"part": "mlcc-0805-x7r-100n-16v"},
      {"part": "poly-al-330u-2v5"}
    ])"));
  REQUIRE(p.parts.size() == 5);
  CHECK_THAT(p.parts[0].mounting_inductance, WithinRel(0.2e-9, kExact));
  CHECK_THAT(p.parts[1].mounting_inductance, WithinRel(0.25e-9, kExact));
  CHECK_THAT(p.parts[2].mounting_inductance, WithinRel(0.45e-9, kExact));
  // No project value for 0805: the typical value for the package (models/mounting.hpp).
  CHECK(p.parts[3].mounting_inductance == quietrail::typical_mounting_inductance(quietrail::Package::p0805));
  // Bulk parts state a mounted ESL (esl_includes_mounting), so nothing is added.
  CHECK(p.parts[4].mounting_inductance == 0.0);
  CHECK_THAT(p.parts[4].mounting_source, Contains("included"));
}

TEST_CASE("the board view sees the regulator, plane and BOM in parallel", "[io]") {
  // One inline capacitor, no derating (no dielectric), against a regulator R + jwL and a
  // plane pair: Z = 1 / (1/Z_reg + 1/Z_cap + 1/Z_plane) (parallel branches, circuit theory).
  const Project p = parse(project(kRail, R"("plane": {"area": "100cm^2", "separation": "100um"},
    "bom": [{"part": {"kind": "capacitor", "capacitance": "10u", "esr": "5m", "esl": "0.5n"},
             "mounting": "0.5n", "count": 2, "name": "C_in"}])"));
  const double f = 1e6;
  const double w = 2.0 * std::numbers::pi * f;
  using C = std::complex<double>;
  const C z_reg(1e-3, w * 10e-9);
  const C z_cap = (C(5e-3, w * 1e-9) + 1.0 / C(0.0, w * 10e-6)) / 2.0;
  const double c_plane = 8.8541878128e-12 * 4.3 * 0.01 / 100e-6;  // eps0 er A / d
  const C z_plane = 1.0 / C(0.0, w * c_plane);
  const C expected = 1.0 / (1.0 / z_reg + 1.0 / z_cap + 1.0 / z_plane);
  CHECK(p.port == p.board);
  CHECK(p.network.branch_count() == 3);
  CHECK_THAT(magnitude(p.network, p.port, f), WithinRel(std::abs(expected), kExact));
}

TEST_CASE("a load side puts the die behind the package, and the die view looks from there", "[io]") {
  // Z_die_view = (Z_board + Z_pkg) || Z_die with Z_pkg = R + jwL, Z_die = R + 1/(jwC).
  const Project p = parse(project(kRail, R"("view": "die",
    "load": {"package_inductance": "50p", "package_resistance": "0.5m", "die_capacitance": "100n", "die_resistance": "1m"},
    "bom": [{"part": {"kind": "capacitor", "capacitance": "10u", "esr": "5m", "esl": "0.5n"}}])"));
  REQUIRE(p.die);
  CHECK(p.port == *p.die);
  const double f = 20e6;
  const double w = 2.0 * std::numbers::pi * f;
  using C = std::complex<double>;
  const C z_reg(1e-3, w * 10e-9);
  const C z_cap = C(5e-3, w * 0.5e-9) + 1.0 / C(0.0, w * 10e-6);
  const C z_board = 1.0 / (1.0 / z_reg + 1.0 / z_cap);
  const C z_pkg(0.5e-3, w * 50e-12);
  const C z_die = C(1e-3, 0.0) + 1.0 / C(0.0, w * 100e-9);
  const C expected = 1.0 / (1.0 / (z_board + z_pkg) + 1.0 / z_die);
  CHECK_THAT(magnitude(p.network, p.port, f), WithinRel(std::abs(expected), kExact));
}

TEST_CASE("a feed puts the regulator and supply parts behind a series bead", "[io]") {
  // Z = (Z_supply + Z_bead) || Z_cap, Z_supply = Z_reg || Z_supply_cap; the bead per
  // models/inductor.hpp: R_dc + 1/(1/(jwL) + 1/R_core + jwC_p) with the library's values
  // for bead-0603-600r-1a (1.03 uH, 150 mohm, 780 ohm, 759 fF; part_libraries/beads.json).
  const Project p = parse(project(kRail, R"("feed": {"part": "bead-0603-600r-1a",
        "supply_bom": [{"part": {"kind": "capacitor", "capacitance": "22u", "esr": "3m", "esl": "1n"}}]},
    "bom": [{"part": {"kind": "capacitor", "capacitance": "10u", "esr": "5m", "esl": "0.5n"}}])"));
  REQUIRE(p.supply);
  const double f = 50e3;
  const double w = 2.0 * std::numbers::pi * f;
  using C = std::complex<double>;
  const C z_reg(1e-3, w * 10e-9);
  const C z_supply_cap = C(3e-3, w * 1e-9) + 1.0 / C(0.0, w * 22e-6);
  const C z_supply = 1.0 / (1.0 / z_reg + 1.0 / z_supply_cap);
  const C z_bead = 0.150 + 1.0 / (1.0 / C(0.0, w * 1.03e-6) + 1.0 / 780.0 + C(0.0, w * 759e-15));
  const C z_cap = C(5e-3, w * 0.5e-9) + 1.0 / C(0.0, w * 10e-6);
  const C expected = 1.0 / (1.0 / (z_supply + z_bead) + 1.0 / z_cap);
  CHECK_THAT(magnitude(p.network, p.port, f), WithinRel(std::abs(expected), kExact));
  CHECK(p.parts[0].mounting_inductance == 0.0);  // a series element gets no mounting default
}

TEST_CASE("a BOM CSV next to the project file is read and resolved", "[io]") {
  const quietrail::test::TempDir dir("project");
  quietrail::test::write_text(dir / "bom.csv", "Designator,Value\n\"C1-C4\",100nF 0402 X7R 16V\n");
  const std::string libs = (kLibraries / "mlcc.json").string();
  quietrail::test::write_text(dir / "p.json", std::string(R"({"name": "p", "rail": {)") + kRail + R"(},
    "regulator": {"resistance": "1m", "inductance": "10n"}, "libraries": [")" + libs +
                                                  R"("], "bom_csv": "bom.csv"})");
  const Project p = quietrail::read_project_file(dir / "p.json");
  REQUIRE(p.parts.size() == 1);
  CHECK(p.parts[0].library_id == "mlcc-0402-x7r-100n-16v");
  CHECK(p.parts[0].count == 4);
  CHECK(p.parts[0].name == "C1..C4");
  CHECK_THAT(p.parts[0].source, Contains("bom.csv:2"));
}

TEST_CASE("malformed JSON is reported with the file, line and column", "[io]") {
  const std::string message = error_of("{\n  \"name\": \"p\",\n  \"rail\": {,}\n}");
  CHECK_THAT(message, Contains("project.json:3:12"));
}

TEST_CASE("each kind of bad project input names the file and the JSON pointer", "[io]") {
  SECTION("unknown part id, with the nearest ids") {
    CHECK_THAT(error_of(project(kRail, R"("bom": [{"part": "mlcc-0402-x7r-100n-61v"}])")),
               Contains("project.json") && Contains("/bom/0/part") && Contains("mlcc-0402-x7r-100n-16v"));
  }
  SECTION("negative count") {
    CHECK_THAT(error_of(project(kRail, R"("bom": [{"part": "mlcc-0402-x7r-100n-16v", "count": -3}])")),
               Contains("/bom/0/count") && Contains("-3"));
  }
  SECTION("reversed band") {
    CHECK_THAT(error_of(project(R"("voltage": 1, "ripple": "5%", "max_current": 20, "band": {"start": "10MHz", "stop": "1MHz"})", kBom)),
               Contains("/rail/band/stop") && Contains("above the start"));
  }
  SECTION("zero and negative targets") {
    CHECK_THAT(error_of(project(kRail, R"("target": {"impedance": 0},)" + kBom)), Contains("/target/impedance"));
    CHECK_THAT(error_of(project(kRail, R"("target": {"points": [["1MHz", "1m"], ["10MHz", "-1m"]]},)" + kBom)),
               Contains("/target/points"));
  }
  SECTION("ripple over 100 %") {
    CHECK_THAT(error_of(project(R"("voltage": 1, "ripple": "150%", "max_current": 20, "band": {"stop": "1G"})", kBom)),
               Contains("/rail/ripple") && Contains("100 %"));
    CHECK_THAT(error_of(project(R"("voltage": 1, "ripple": "1.5V", "max_current": 20, "band": {"stop": "1G"})", kBom)),
               Contains("/rail/ripple"));
  }
  SECTION("a BOM with no parts") {
    CHECK_THAT(error_of(project(kRail, R"("bom": [])")), Contains("/bom") && Contains("at least one part"));
    CHECK_THAT(error_of(project(kRail, R"("view": "board")")), Contains("/bom"));
  }
  SECTION("unknown keys, listing the allowed ones") {
    CHECK_THAT(error_of(project(kRail, R"("bom": [{"part": "mlcc-0402-x7r-100n-16v", "qty": 2}])")),
               Contains("/bom/0/qty") && Contains("count"));
    CHECK_THAT(error_of(project(kRail + R"(, "ripple_mv": 3)", kBom)), Contains("/rail/ripple_mv"));
  }
  SECTION("a die view without a load side") {
    CHECK_THAT(error_of(project(kRail, R"("view": "die",)" + kBom)), Contains("/view") && Contains("load"));
  }
  SECTION("a band with neither a stop nor a rise time") {
    CHECK_THAT(error_of(project(R"("voltage": 1, "ripple": "5%", "max_current": 20)", kBom)),
               Contains("/rail/band/stop") && Contains("rise_time"));
  }
  SECTION("a branch name used twice") {
    CHECK_THAT(error_of(project(kRail, R"("bom": [{"part": "mlcc-0402-x7r-100n-16v", "name": "C1"},
                                                   {"part": "mlcc-0402-x7r-1n-16v", "name": "C1"}])")),
               Contains("/bom/1/name"));
  }
  SECTION("a capacitor as the feed") {
    CHECK_THAT(error_of(project(kRail, R"("feed": {"part": "mlcc-0402-x7r-100n-16v"},)" + kBom)),
               Contains("/feed/part") && Contains("bead"));
  }
}

TEST_CASE("a part rated below the rail's DC voltage is a warning, not an error", "[io]") {
  const Project p = parse(project(R"("voltage": 12, "ripple": "1%", "max_current": 1, "band": {"stop": "1G"})",
                                  R"("bom": [{"part": "mlcc-0402-x5r-1u-6v3"}])"));
  REQUIRE(p.warnings.size() == 1);
  CHECK_THAT(p.warnings[0], Contains("6.3 V") && Contains("12 V"));
}
