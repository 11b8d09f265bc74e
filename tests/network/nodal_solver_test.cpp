// SPDX-License-Identifier: MIT
// Nodal analysis against closed forms for networks that are not all-parallel: a ladder
// (series-parallel reduction), a bridge (not series-parallel), a bead-filtered sub-rail,
// and a branch whose impedance vanishes at one grid frequency.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <string>
#include <vector>

#include "quietrail/error.hpp"
#include "quietrail/network/nodal_solver.hpp"

using namespace quietrail;
using Catch::Contains;

namespace {

// Closed form vs code: relative 1e-9 (REFERENCES, general tolerance guidance).
constexpr double kClosedForm = 1e-9;
constexpr double kPi_ = std::numbers::pi;
const Complex j(0.0, 1.0);

NodalFormulation formulation_under_test() {
  return GENERATE(NodalFormulation::automatic, NodalFormulation::branch_currents);
}
const char* describe(NodalFormulation f) {
  return f == NodalFormulation::automatic ? "automatic (node elimination)" : "branch-current rows";
}

double relative_error(Complex got, Complex want) { return std::abs(got - want) / std::abs(want); }

// prefix + k, built by appending (GCC 12 warns falsely with -Wrestrict on "x" + std::string).
std::string indexed(const char* prefix, int k) {
  std::string out(prefix);
  out += std::to_string(k);
  return out;
}

Complex parallel(Complex a, Complex b) { return a * b / (a + b); }

// Series RLC (REFERENCES §2) and R + jwL.
Complex rlc(double f, double r, double l, double c) {
  const double w = 2.0 * kPi_ * f;
  return r + j * (w * l - 1.0 / (w * c));
}
Complex rl(double f, double r, double l) { return r + j * (2.0 * kPi_ * f * l); }
// Bead: R_dc + (jwL || R_core || 1/(jwC_p)) (REFERENCES §11).
Complex bead(double f, double l, double r_dc, double c_p, double r_core) {
  const double w = 2.0 * kPi_ * f;
  return r_dc + 1.0 / (1.0 / (j * w * l) + 1.0 / r_core + j * w * c_p);
}

// port -[series part]- m -[0.25 ohm]- gnd, with 100 nF / 20 mohm / 0.5 nH from port to gnd.
Network series_into_damped_port(const std::string& name, const MountedPart& series) {
  Network net;
  net.add_node("port");
  net.add_node("m");
  net.add_branch(name, "port", "m", series);
  net.add_branch("R_m", "m", "gnd", MountedPart{Resistor{0.25, 0.0}});
  net.add_branch("C_port", "port", "gnd", MountedPart{Capacitor{100e-9, 20e-3, 0.5e-9}});
  return net;
}

}  // namespace

TEST_CASE("a ten-section ladder equals its series-parallel reduction", "[network]") {
  const NodalFormulation formulation = formulation_under_test();
  INFO(describe(formulation));
  // port = n0; section k: series R-L from n_k to n_{k+1}, shunt capacitor from n_{k+1} to
  // ground; n0 also has its own capacitor. Values vary per section so no symmetry hides
  // an indexing error.
  constexpr int kSections = 10;
  Network net;
  net.add_node("n0");
  net.add_branch("C0", "n0", "gnd", MountedPart{Capacitor{1e-6, 5e-3, 0.5e-9}});
  for (int k = 0; k < kSections; ++k) {
    const std::string here = indexed("n", k), next = indexed("n", k + 1);
    net.add_node(next);
    net.add_branch(indexed("L", k), here, next, MountedPart{Resistor{1e-3 * (k + 1), 50e-12 * (k + 2)}});
    net.add_branch(indexed("C", k + 1), next, "gnd",
                   MountedPart{Capacitor{(k + 1) * 0.5e-6, 4e-3 + 1e-3 * k, 0.3e-9}, 0.2e-9, 1 + k % 3});
  }
  const FrequencyGrid grid(FrequencyGridOptions{1e3, 1e9, 20});
  const NodalResult result = NodalSolver(net, grid, {formulation}).solve(1);
  // Shunt at node n_k: C0 for k = 0, else C_k of section k - 1 (count N folded in as
  // ESR/N, L/N, N*C, REFERENCES §2).
  auto shunt = [](double f, int k) {
    if (k == 0) return rlc(f, 5e-3, 0.5e-9, 1e-6);
    const double n = 1 + (k - 1) % 3;
    return rlc(f, (4e-3 + 1e-3 * (k - 1)) / n, 0.5e-9 / n, k * 0.5e-6 * n);
  };
  double worst = 0.0;
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const double f = grid[i];
    // Reduce from the far end: Z_k = shunt_k || (L_k + Z_{k+1}) (series/parallel rules).
    Complex z = shunt(f, kSections);
    for (int k = kSections - 1; k >= 0; --k) z = parallel(shunt(f, k), rl(f, 1e-3 * (k + 1), 50e-12 * (k + 2)) + z);
    worst = std::max(worst, relative_error(result.impedance[static_cast<Eigen::Index>(i)], z));
  }
  CHECK(worst < kClosedForm);
}

TEST_CASE("a bridge network equals the closed-form bridge impedance", "[network]") {
  const NodalFormulation formulation = formulation_under_test();
  INFO(describe(formulation));
  // Bridge: Z1 a-c, Z2 a-d, Z3 c-b, Z4 d-b, Z5 c-d, driven between a (port) and b = ground.
  // Z = [Z1 Z2 (Z3+Z4) + Z3 Z4 (Z1+Z2) + Z5 (Z1+Z3)(Z2+Z4)] / [(Z1+Z2)(Z3+Z4) + Z5 (Z1+Z2+Z3+Z4)]
  // (delta-star transformation, any circuits text; limits Z5 -> inf and Z5 -> 0 give the
  // two series-parallel forms, checked when deriving).
  Network net;
  net.add_node("a");
  net.add_node("c");
  net.add_node("d");
  net.add_branch("Z1", "a", "c", MountedPart{Resistor{0.02, 1e-9}});
  net.add_branch("Z2", "a", "d", MountedPart{Capacitor{2.2e-6, 8e-3, 0.6e-9}});
  net.add_branch("Z3", "c", "gnd", MountedPart{Capacitor{10e-6, 4e-3, 0.9e-9}, 0.3e-9});
  net.add_branch("Z4", "d", "gnd", MountedPart{Resistor{0.05, 2e-9}});
  net.add_branch("Z5", "c", "d", MountedPart{Inductor{100e-9, 0.01, 2e-12, 200.0}});
  const FrequencyGrid grid(FrequencyGridOptions{1e3, 1e9, 20});
  const ComplexVector z = NodalSolver(net, grid, {formulation}).solve(1).impedance;
  double worst = 0.0;
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const double f = grid[i];
    const Complex z1 = rl(f, 0.02, 1e-9), z2 = rlc(f, 8e-3, 0.6e-9, 2.2e-6), z3 = rlc(f, 4e-3, 1.2e-9, 10e-6),
                  z4 = rl(f, 0.05, 2e-9), z5 = bead(f, 100e-9, 0.01, 2e-12, 200.0);
    const Complex want = (z1 * z2 * (z3 + z4) + z3 * z4 * (z1 + z2) + z5 * (z1 + z3) * (z2 + z4)) /
                         ((z1 + z2) * (z3 + z4) + z5 * (z1 + z2 + z3 + z4));
    worst = std::max(worst, relative_error(z[static_cast<Eigen::Index>(i)], want));
  }
  CHECK(worst < kClosedForm);
}

TEST_CASE("the impedance at a bead-filtered node includes the bead and the main rail", "[network]") {
  const NodalFormulation formulation = formulation_under_test();
  INFO(describe(formulation));
  // vrm --trace-- rail --bead-- sub; capacitors on rail and sub; regulator R-L at vrm.
  Network net;
  for (const char* n : {"vrm", "rail", "sub"}) net.add_node(n);
  net.add_branch("VRM", "vrm", "gnd", MountedPart{Regulator{1e-3, 20e-9}});
  net.add_branch("TRACE", "vrm", "rail", MountedPart{Resistor{0.5e-3, 0.5e-9}});
  net.add_branch("C_RAIL", "rail", "gnd", MountedPart{Capacitor{47e-6, 5e-3, 1e-9}, 0.5e-9, 2});
  net.add_branch("FB", "rail", "sub", MountedPart{Inductor{1e-6, 0.1, 1.5e-12, 1000.0}});
  net.add_branch("C_SUB", "sub", "gnd", MountedPart{Capacitor{10e-6, 5e-3, 0.5e-9}, 0.4e-9, 1});
  const FrequencyGrid grid(FrequencyGridOptions{1e3, 1e9, 20});
  const NodalSolver solver(net, grid, {formulation});
  const ComplexVector z_sub = solver.solve(*net.find_node("sub")).impedance;
  const ComplexVector z_rail = solver.solve(*net.find_node("rail")).impedance;
  double worst = 0.0;
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const double f = grid[i];
    const Complex vrm = rl(f, 1e-3, 20e-9) + rl(f, 0.5e-3, 0.5e-9);
    const Complex rail_caps = rlc(f, 5e-3, 1.5e-9, 47e-6) / 2.0;
    const Complex sub_caps = rlc(f, 5e-3, 0.9e-9, 10e-6);
    const Complex fb = bead(f, 1e-6, 0.1, 1.5e-12, 1000.0);
    const Complex want_sub = parallel(sub_caps, fb + parallel(vrm, rail_caps));
    const Complex want_rail = parallel(parallel(vrm, rail_caps), fb + sub_caps);
    worst = std::max({worst, relative_error(z_sub[static_cast<Eigen::Index>(i)], want_sub),
                      relative_error(z_rail[static_cast<Eigen::Index>(i)], want_rail)});
  }
  CHECK(worst < kClosedForm);
}

TEST_CASE("a series branch with exactly zero impedance at one grid frequency is solved", "[network]") {
  // A lossless series L-C (capacitor with ESR 0) between the port and node m vanishes at its
  // resonance; in pure nodal form its admittance is infinite there. Pick f0 = 5 MHz and the
  // L, within a few ulps of 1/((2 pi f0)^2 C), for which the model's impedance is exactly
  // zero in floating point.
  const double c = 1e-6, f0 = 5e6;
  const double w0 = 2.0 * kPi_ * f0;
  const double nominal = 1.0 / (w0 * w0 * c);
  double l = nominal;
  double up = nominal, down = nominal;
  for (int step = 0; step < 1000 && MountedPart{Capacitor{c, 0.0, l}}.impedance(f0) != Complex(0.0, 0.0); ++step) {
    up = std::nextafter(up, 1.0);
    down = std::nextafter(down, 0.0);
    if (MountedPart{Capacitor{c, 0.0, up}}.impedance(f0) == Complex(0.0, 0.0)) l = up;
    if (MountedPart{Capacitor{c, 0.0, down}}.impedance(f0) == Complex(0.0, 0.0)) l = down;
  }
  const MountedPart series{Capacitor{c, 0.0, l}};
  REQUIRE(series.impedance(f0) == Complex(0.0, 0.0));

  const NodalFormulation formulation = formulation_under_test();
  INFO(describe(formulation));
  const Network net = series_into_damped_port("LC", series);
  const FrequencyGrid grid(std::vector<double>{0.5 * f0, f0, 2.0 * f0});
  const NodalResult result = NodalSolver(net, grid, {formulation}).solve(1);
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const double f = grid[i];
    // C_port || (Z_LC + R_m); at f0, Z_LC = 0 and Z = C_port || R_m.
    const Complex want = parallel(rlc(f, 20e-3, 0.5e-9, 100e-9), rlc(f, 0.0, l, c) + 0.25);
    CHECK(relative_error(result.impedance[static_cast<Eigen::Index>(i)], want) < kClosedForm);
  }
  // The resonance point cannot be eliminated as a node voltage: the fallback rows took it.
  CHECK(result.branch_current_points >= 1);
}

TEST_CASE("a series branch that is an exact open at one grid frequency carries no current there", "[network]") {
  // A lossless inductor with interwinding capacitance (no core loss) is an open circuit at
  // f_p = 1/(2 pi sqrt(L C_p)) (REFERENCES §11 with R_ac infinite). Pick f0 = 100 MHz and
  // the C_p, within a few ulps of 1/((2 pi f0)^2 L), where the tank admittance is exactly 0.
  const double l = 1e-6, f0 = 1e8;
  const double w0 = 2.0 * kPi_ * f0;
  auto open_at_f0 = [&](double c_p) { return w0 * c_p - 1.0 / (w0 * l) == 0.0; };
  const double nominal = 1.0 / (w0 * w0 * l);
  double c_p = nominal, up = nominal, down = nominal;
  for (int step = 0; step < 1000 && !open_at_f0(c_p); ++step) {
    up = std::nextafter(up, 1.0);
    down = std::nextafter(down, 0.0);
    if (open_at_f0(up)) c_p = up;
    if (open_at_f0(down)) c_p = down;
  }
  REQUIRE(open_at_f0(c_p));
  const MountedPart tank{Inductor{l, 0.0, c_p, std::numeric_limits<double>::infinity()}};

  const NodalFormulation formulation = formulation_under_test();
  INFO(describe(formulation));
  const Network net = series_into_damped_port("TANK", tank);
  const FrequencyGrid grid(std::vector<double>{0.5 * f0, f0, 2.0 * f0});
  const NodalResult result = NodalSolver(net, grid, {formulation}).solve(1);
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const double f = grid[i];
    const double w = 2.0 * kPi_ * f;
    // C_port || (tank + R_m), tank = 1 / (1/(jwL) + jwC_p); at f0 the tank is open: Z = C_port.
    const Complex c_port = rlc(f, 20e-3, 0.5e-9, 100e-9);
    const Complex want = i == 1 ? c_port : parallel(c_port, 1.0 / (1.0 / (j * w * l) + j * w * c_p) + 0.25);
    CHECK(relative_error(result.impedance[static_cast<Eigen::Index>(i)], want) < kClosedForm);
  }
}

TEST_CASE("a near short between two nodes keeps full accuracy", "[network]") {
  // A 1 nohm link between the port and node m: eliminating m cancels 1e9 S against 1e9 S
  // at the port, so the pivot check must send these points to the branch-current rows.
  const NodalFormulation formulation = formulation_under_test();
  INFO(describe(formulation));
  Network net;
  net.add_node("port");
  net.add_node("m");
  net.add_branch("LINK", "port", "m", MountedPart{Resistor{1e-9, 0.0}});
  net.add_branch("R_m", "m", "gnd", MountedPart{Resistor{0.25, 0.0}});
  net.add_branch("C_port", "port", "gnd", MountedPart{Capacitor{100e-9, 20e-3, 0.5e-9}});
  const FrequencyGrid grid(FrequencyGridOptions{1e3, 1e9, 10});
  const NodalResult result = NodalSolver(net, grid, {formulation}).solve(1);
  double worst = 0.0;
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const Complex want = parallel(rlc(grid[i], 20e-3, 0.5e-9, 100e-9), Complex(0.25 + 1e-9, 0.0));
    worst = std::max(worst, relative_error(result.impedance[static_cast<Eigen::Index>(i)], want));
  }
  CHECK(worst < kClosedForm);
}

TEST_CASE("the nodal solver reports topology problems by name", "[network]") {
  Network net;
  net.add_node("vdd");
  net.add_node("orphan");
  net.add_branch("C1", "vdd", "gnd", MountedPart{Capacitor{1e-6, 1e-2, 1e-9}});
  const FrequencyGrid grid(FrequencyGridOptions{1e3, 1e6, 5});
  CHECK_THROWS_AS(solve_port_impedance(net, 1, grid), InputError);
  CHECK_THROWS_WITH(solve_port_impedance(net, 1, grid), Contains("orphan"));
  CHECK_THROWS_WITH(NodalSolver(Network{}, grid), Contains("at least one branch"));
}
