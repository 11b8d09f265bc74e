// SPDX-License-Identifier: MIT
// SPICE export: deck structure, count scaling, names, warnings; and ngspice as the
// independent reference for the nodal solve on a board-like rail with 28 branches.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <sstream>
#include <string>
#include <vector>

#include "quietrail/error.hpp"
#include "quietrail/io/spice_netlist.hpp"
#include "quietrail/network/nodal_solver.hpp"
#include "support/ngspice.hpp"
#include "support/temp_dir.hpp"

using namespace quietrail;
using Catch::Contains;

namespace {

// Element lines (not comments, not dot-cards) of a deck.
std::vector<std::string> element_lines(const std::string& deck) {
  std::vector<std::string> out;
  std::istringstream in(deck);
  std::string line;
  std::getline(in, line);  // title
  while (std::getline(in, line))
    if (!line.empty() && line[0] != '*' && line[0] != '.' && line.find(' ') != std::string::npos &&
        (line[0] == 'R' || line[0] == 'L' || line[0] == 'C' || line[0] == 'I'))
      out.push_back(line);
  return out;
}

// The value field (4th word) of the element line whose name is `name`.
double value_of(const std::string& deck, const std::string& name) {
  for (const auto& line : element_lines(deck)) {
    std::istringstream words(line);
    std::string n, a, b, v;
    words >> n >> a >> b >> v;
    if (n == name) return std::stod(v);
  }
  FAIL("no element " << name << " in the deck:\n" << deck);
  return 0.0;
}

// A board-like rail (invented demo values; ngspice is the reference here, not the values):
// regulator R-L at the VRM node, a spreading/trace R-L to the rail, polymer and tantalum
// bulk, ceramics of many values with counts and mounting inductance, a lossless plane pair
// with spreading inductance, a bleeder (leakage) resistor and leakage on some capacitors,
// a package path to a die node, and a ferrite-bead-filtered sub-rail with its own ceramics
// and a series R-C damper.
Network board_rail() {
  Network net;
  for (const char* n : {"vrm", "vdd_core", "pkg", "vdd_pll", "damp"}) net.add_node(n);
  auto cap = [](double c, double esr, double esl, double mount, int count, double r_leak = std::numeric_limits<double>::infinity()) {
    Capacitor part{c, esr, esl};
    part.leakage_resistance = r_leak;
    return MountedPart{part, mount, count};
  };
  net.add_branch("VRM", "vrm", "gnd", MountedPart{Regulator{0.6e-3, 18e-9}});
  net.add_branch("SPREAD", "vrm", "vdd_core", MountedPart{Resistor{0.25e-3, 0.35e-9}});
  // Bulk: polymer aluminium 330 uF x2, polymer 100 uF, tantalum 47 uF (with leakage).
  net.add_branch("C_BULK_330U", "vdd_core", "gnd", cap(330e-6, 7e-3, 1.8e-9, 0.9e-9, 2));
  net.add_branch("C_BULK_100U", "vdd_core", "gnd", cap(100e-6, 12e-3, 1.5e-9, 0.8e-9, 1, 2e5));
  net.add_branch("C_TANT_47U", "vdd_core", "gnd", cap(47e-6, 45e-3, 1.2e-9, 0.8e-9, 1, 1e6));
  // Ceramics (values and counts typical of a core rail).
  net.add_branch("C22U_0805", "vdd_core", "gnd", cap(22e-6, 3e-3, 0.6e-9, 0.65e-9, 4, 2.3e7));
  net.add_branch("C10U_0603", "vdd_core", "gnd", cap(10e-6, 5e-3, 0.5e-9, 0.45e-9, 6));
  net.add_branch("C4U7_0603", "vdd_core", "gnd", cap(4.7e-6, 7e-3, 0.5e-9, 0.45e-9, 4));
  net.add_branch("C2U2_0402", "vdd_core", "gnd", cap(2.2e-6, 9e-3, 0.4e-9, 0.3e-9, 6));
  net.add_branch("C1U_0402", "vdd_core", "gnd", cap(1e-6, 12e-3, 0.4e-9, 0.3e-9, 10, 5e8));
  net.add_branch("C470N_0402", "vdd_core", "gnd", cap(470e-9, 18e-3, 0.4e-9, 0.3e-9, 8));
  net.add_branch("C220N_0402", "vdd_core", "gnd", cap(220e-9, 22e-3, 0.4e-9, 0.3e-9, 8));
  net.add_branch("C100N_0402", "vdd_core", "gnd", cap(100e-9, 30e-3, 0.4e-9, 0.3e-9, 20));
  net.add_branch("C47N_0201", "vdd_core", "gnd", cap(47e-9, 45e-3, 0.3e-9, 0.25e-9, 8));
  net.add_branch("C10N_0201", "vdd_core", "gnd", cap(10e-9, 80e-3, 0.3e-9, 0.25e-9, 8));
  net.add_branch("C1N_0201", "vdd_core", "gnd", cap(1e-9, 250e-3, 0.3e-9, 0.25e-9, 4));
  // Plane pair, 120 cm^2 at 75 um, FR-4-like; lossless for this comparison.
  net.add_branch("PLANE", "vdd_core", "gnd",
                 MountedPart{PlanePair{.area = 0.012, .separation = 75e-6, .relative_permittivity = 4.2,
                                       .loss_tangent = 0.0, .spreading_inductance = 60e-12,
                                       .series_resistance = 0.1e-3}});
  net.add_branch("R_BLEED", "vdd_core", "gnd", MountedPart{Resistor{1e3, 0.0}});
  // Package path to the die, on-die capacitance.
  net.add_branch("PKG", "vdd_core", "pkg", MountedPart{Resistor{0.4e-3, 40e-12}});
  net.add_branch("C_DIE", "pkg", "gnd", MountedPart{Capacitor{250e-9, 1.5e-3, 5e-12}});
  // Ferrite bead to the PLL sub-rail and its ceramics.
  net.add_branch("FB1", "vdd_core", "vdd_pll",
                 MountedPart{Inductor{.inductance = 1.2e-6, .dc_resistance = 0.08, .parallel_capacitance = 1.2e-12,
                                      .core_loss_resistance = 600.0},
                             0.3e-9});
  net.add_branch("C_PLL_10U", "vdd_pll", "gnd", cap(10e-6, 5e-3, 0.5e-9, 0.45e-9, 1));
  net.add_branch("C_PLL_1U", "vdd_pll", "gnd", cap(1e-6, 12e-3, 0.4e-9, 0.3e-9, 2, 5e8));
  net.add_branch("C_PLL_100N", "vdd_pll", "gnd", cap(100e-9, 30e-3, 0.4e-9, 0.3e-9, 3));
  net.add_branch("C_PLL_10N", "vdd_pll", "gnd", cap(10e-9, 80e-3, 0.3e-9, 0.25e-9, 1));
  net.add_branch("R_DAMP", "vdd_pll", "damp", MountedPart{Resistor{0.47, 0.4e-9}});
  net.add_branch("C_DAMP", "damp", "gnd", cap(22e-6, 4e-3, 0.6e-9, 0.5e-9, 1));
  return net;
}

double phase_deg(Complex z) { return std::arg(z) * 180.0 / std::numbers::pi; }

}  // namespace

TEST_CASE("the deck drives the port with 1 A AC and writes its voltage with wrdata", "[io]") {
  Network net;
  net.add_node("vdd");
  net.add_branch("C1", "vdd", "gnd", MountedPart{Capacitor{1e-6, 5e-3, 0.5e-9}, 0.3e-9});
  SpiceNetlistOptions options;
  options.title = "two\nlines";
  options.sweep = {1e3, 1e9, 50};
  options.output_file = "z.txt";
  const SpiceNetlist deck = spice_netlist(net, 1, options);
  CHECK(deck.port_node == "n1_vdd");
  CHECK(deck.warnings.empty());
  CHECK_THAT(deck.text, Contains("Iport 0 n1_vdd DC 0 AC 1\n"));
  CHECK_THAT(deck.text, Contains(".ac dec 50 1000 1e+09\n"));
  CHECK_THAT(deck.text, Contains("wrdata z.txt v(n1_vdd)\n"));
  CHECK_THAT(deck.text, Contains(".control\n") && Contains(".endc\n.end\n"));
  CHECK(deck.text.substr(0, deck.text.find('\n')) == "two?lines");  // title stays one line
  // ESR, then ESL + mounting, then C, chained through one internal node per section.
  CHECK_THAT(deck.text, Contains("R1_C1_esr n1_vdd b1_1 0.005\n"));
  CHECK_THAT(deck.text, Contains("L1_C1_esl b1_1 b1_2 8e-10\n"));
  CHECK_THAT(deck.text, Contains("C1_C1_c b1_2 0 1e-06\n"));
}

TEST_CASE("counts are folded into the values as ESR/N, L/N and N*C", "[io]") {
  // N identical parallel copies equal one with ESR/N, L/N, N*C (REFERENCES §2).
  Network net;
  net.add_node("vdd");
  Capacitor c{2.2e-6, 8e-3, 0.4e-9};
  c.leakage_resistance = 1e8;
  net.add_branch("C", "vdd", "gnd", MountedPart{c, 0.6e-9, 4});
  net.add_branch("FB", "vdd", "gnd", MountedPart{Inductor{1e-6, 0.1, 2e-12, 500.0}, 0.2e-9, 2});
  const std::string deck = spice_netlist(net, 1).text;
  CHECK_THAT(value_of(deck, "R1_C_esr"), Catch::Matchers::WithinRel(8e-3 / 4, 1e-15));
  CHECK_THAT(value_of(deck, "L1_C_esl"), Catch::Matchers::WithinRel(1e-9 / 4, 1e-15));
  CHECK_THAT(value_of(deck, "C1_C_c"), Catch::Matchers::WithinRel(2.2e-6 * 4, 1e-15));
  CHECK_THAT(value_of(deck, "R1_C_leak"), Catch::Matchers::WithinRel(1e8 / 4, 1e-15));
  CHECK_THAT(value_of(deck, "R2_FB_dcr"), Catch::Matchers::WithinRel(0.1 / 2, 1e-15));
  CHECK_THAT(value_of(deck, "L2_FB_mount"), Catch::Matchers::WithinRel(0.2e-9 / 2, 1e-15));
  CHECK_THAT(value_of(deck, "L2_FB_l"), Catch::Matchers::WithinRel(1e-6 / 2, 1e-15));
  CHECK_THAT(value_of(deck, "R2_FB_core"), Catch::Matchers::WithinRel(500.0 / 2, 1e-15));
  CHECK_THAT(value_of(deck, "C2_FB_cp"), Catch::Matchers::WithinRel(2e-12 * 2, 1e-15));
}

TEST_CASE("names are made SPICE-safe and unique, with the originals in comments", "[io]") {
  Network net("0V");
  net.add_node("gnd");  // not the reference here: ngspice would treat a node "gnd" as ground
  net.add_node("VDD core/1.0");
  net.add_node("VDD_core_1_0");
  net.add_branch("C 1", "gnd", "0V", MountedPart{Capacitor{1e-6, 5e-3, 0.5e-9}});
  net.add_branch("C;1", "VDD core/1.0", "0V", MountedPart{Capacitor{1e-6, 5e-3, 0.5e-9}});
  net.add_branch("R1", "gnd", "VDD core/1.0", MountedPart{Resistor{0.01, 0.0}});
  net.add_branch("R2", "VDD_core_1_0", "VDD core/1.0", MountedPart{Resistor{0.01, 0.0}});
  net.add_branch("C2", "VDD_core_1_0", "0V", MountedPart{Capacitor{1e-6, 5e-3, 0.5e-9}});
  const std::string deck = spice_netlist(net, 2).text;
  CHECK_THAT(deck, Contains("n1_gnd") && Contains("n2_VDD_core_1_0") && Contains("n3_VDD_core_1_0"));
  CHECK_THAT(deck, Contains("R1_C_1_esr") && Contains("R2_C_1_esr"));
  CHECK_THAT(deck, Contains("* branch 'C;1'") && Contains("'VDD core/1.0'"));
  for (const auto& line : element_lines(deck))
    for (const char ch : line) CHECK((std::isalnum(static_cast<unsigned char>(ch)) || std::string_view("_ .-+()").find(ch) != std::string_view::npos));
}

TEST_CASE("terms SPICE primitives cannot express are warned about, never silently dropped", "[io]") {
  Network net;
  net.add_node("vdd");
  Capacitor lossy{10e-6, 3e-3, 0.5e-9};
  lossy.dissipation_factor = 0.05;
  lossy.skin_corner = 5e6;
  net.add_branch("C_LOSSY", "vdd", "gnd", MountedPart{lossy});
  net.add_branch("PLANE", "vdd", "gnd", MountedPart{PlanePair{.area = 0.01, .separation = 1e-4, .loss_tangent = 0.02}});
  const SpiceNetlist deck = spice_netlist(net, 1);
  REQUIRE(deck.warnings.size() == 3);
  CHECK_THAT(deck.warnings[0], Contains("C_LOSSY") && Contains("dissipation factor"));
  CHECK_THAT(deck.warnings[1], Contains("C_LOSSY") && Contains("skin-effect"));
  CHECK_THAT(deck.warnings[2], Contains("PLANE") && Contains("loss tangent"));
  CHECK_THAT(deck.text, Contains("* WARNING: branch 'C_LOSSY': dissipation factor") &&
                            Contains("* WARNING: branch 'PLANE': loss tangent"));
}

TEST_CASE("the export checks the topology and its options", "[io]") {
  Network net;
  net.add_node("vdd");
  net.add_node("stub");
  net.add_branch("C1", "vdd", "gnd", MountedPart{Capacitor{1e-6, 5e-3, 0.5e-9}});
  net.add_branch("C_STUB", "vdd", "stub", MountedPart{Capacitor{1e-6, 5e-3, 0.5e-9}});
  CHECK_THROWS_WITH(spice_netlist(net, 1), Contains("C_STUB"));
  Network ok;
  ok.add_node("vdd");
  ok.add_branch("C1", "vdd", "gnd", MountedPart{Capacitor{1e-6, 5e-3, 0.5e-9}});
  SpiceNetlistOptions options;
  options.output_file = "my file.txt";
  CHECK_THROWS_WITH(spice_netlist(ok, 1, options), Contains("output_file"));
  options.output_file = "z.txt";
  options.sweep.stop = 10.0;
  CHECK_THROWS_WITH(spice_netlist(ok, 1, options), Contains("stop"));
}

TEST_CASE("the nodal solve matches ngspice within 0.1 % and 0.1 degree from 1 kHz to 1 GHz", "[io]") {
  // Reference: ngspice (a general-purpose circuit simulator, Debian package) running the
  // exported deck. Tolerances from the project brief: 0.1 % in |Z|, 0.1 degree in phase.
  constexpr double kMagnitudeTolerance = 1e-3;
  constexpr double kPhaseToleranceDeg = 0.1;
  const auto ngspice = test::find_on_path("ngspice");
  if (!ngspice) FAIL(test::kNgspiceMissing);

  const Network net = board_rail();
  REQUIRE(net.branch_count() >= 20);
  const char* port_name = GENERATE("vdd_core", "vdd_pll");
  INFO("port " << port_name);
  const NodeId port = *net.find_node(port_name);

  const test::TempDir dir("ngspice");
  SpiceNetlistOptions options;
  options.sweep = {1e3, 1e9, 50};
  options.output_file = "z.txt";
  const auto warnings = write_spice_netlist(dir.path() / "rail.cir", net, port, options);
  CHECK(warnings.empty());
  const int status = test::run_ngspice(*ngspice, dir.path(), "rail.cir");
  INFO("ngspice log:\n" << test::read_text(dir.path() / "ngspice.log"));
  REQUIRE(status == 0);
  const auto rows = test::read_wrdata(dir.path() / "z.txt");
  REQUIRE(rows.size() == 301);  // 6 decades at 50 per decade, both ends
  CHECK_THAT(rows.front().frequency, Catch::Matchers::WithinRel(1e3, 1e-9));
  CHECK_THAT(rows.back().frequency, Catch::Matchers::WithinRel(1e9, 1e-9));

  std::vector<double> frequencies;
  for (const auto& row : rows) frequencies.push_back(row.frequency);
  const ComplexVector z = solve_port_impedance(net, port, FrequencyGrid(frequencies));
  double worst_magnitude = 0.0, worst_phase = 0.0, worst_magnitude_at = 0.0, worst_phase_at = 0.0;
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const Complex ours = z[static_cast<Eigen::Index>(i)];
    const Complex theirs = rows[i].value;
    const double magnitude = std::abs(std::abs(ours) / std::abs(theirs) - 1.0);
    double phase = std::abs(phase_deg(ours) - phase_deg(theirs));
    phase = std::min(phase, 360.0 - phase);
    if (magnitude > worst_magnitude) worst_magnitude = magnitude, worst_magnitude_at = rows[i].frequency;
    if (phase > worst_phase) worst_phase = phase, worst_phase_at = rows[i].frequency;
  }
  INFO("worst |Z| deviation " << worst_magnitude << " at " << worst_magnitude_at << " Hz; worst phase deviation "
                               << worst_phase << " deg at " << worst_phase_at << " Hz");
  CHECK(worst_magnitude < kMagnitudeTolerance);
  CHECK(worst_phase < kPhaseToleranceDeg);
}
