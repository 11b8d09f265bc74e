// SPDX-License-Identifier: MIT
// The all-parallel fast path and the nodal solve against closed forms: parallel
// admittances add, N identical parts equal one scaled part, and the two-capacitor
// anti-resonance of REFERENCES §3. Every case runs through both paths (GENERATE).
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <string>
#include <vector>

#include "quietrail/error.hpp"
#include "quietrail/network/nodal_solver.hpp"
#include "quietrail/network/parallel_solver.hpp"

using namespace quietrail;
using Catch::Contains;

namespace {

// Closed form vs code: relative 1e-9 (REFERENCES, general tolerance guidance).
constexpr double kClosedForm = 1e-9;
// "Exact" identities that differ only by rounding (e.g. ESR/N vs N copies in parallel).
constexpr double kRounding = 1e-12;

enum class Path { parallel, nodal, nodal_branch_currents };

std::string describe(Path p) {
  switch (p) {
    case Path::parallel: return "parallel fast path";
    case Path::nodal: return "nodal elimination";
    case Path::nodal_branch_currents: return "nodal branch-current rows";
  }
  return {};
}

ComplexVector port_impedance(Path path, const Network& net, NodeId port, const FrequencyGrid& grid) {
  switch (path) {
    case Path::parallel: return ParallelSolver::for_network(net, port, grid).impedance(net.counts());
    case Path::nodal: return NodalSolver(net, grid).solve(port).impedance;
    case Path::nodal_branch_currents:
      return NodalSolver(net, grid, {NodalFormulation::branch_currents}).solve(port).impedance;
  }
  return {};
}

double relative_error(Complex got, Complex want) { return std::abs(got - want) / std::abs(want); }

double worst_relative_error(const ComplexVector& got, const std::vector<Complex>& want) {
  REQUIRE(static_cast<std::size_t>(got.size()) == want.size());
  double worst = 0.0;
  for (std::size_t i = 0; i < want.size(); ++i)
    worst = std::max(worst, relative_error(got[static_cast<Eigen::Index>(i)], want[i]));
  return worst;
}

const Complex j(0.0, 1.0);
constexpr double kPi_ = std::numbers::pi;

// Closed forms of the element models, written out from their documented equivalent
// circuits (series RLC: any circuits text; lossy dielectric G = w*C*tan(delta)).
Complex capacitor_z(double f, double c, double esr, double l, double r_leak = std::numeric_limits<double>::infinity(), double df = 0.0,
                    double f_skin = 0.0) {
  const double w = 2.0 * kPi_ * f;
  const double r = f_skin > 0.0 && f > f_skin ? esr * std::sqrt(f / f_skin) : esr;
  return r + j * w * l + 1.0 / (1.0 / r_leak + w * c * df + j * w * c);
}
Complex inductor_z(double f, double l, double r_dc, double c_p, double r_core) {
  const double w = 2.0 * kPi_ * f;
  return r_dc + 1.0 / (1.0 / (j * w * l) + 1.0 / r_core + j * w * c_p);
}
Complex rl_z(double f, double r, double l) { return r + j * (2.0 * kPi_ * f * l); }

}  // namespace

TEST_CASE("an all-parallel rail equals 1 / sum(N_k / Z_k) on every solver path", "[network]") {
  const Path path = GENERATE(Path::parallel, Path::nodal, Path::nodal_branch_currents);
  INFO(describe(path));

  Network net;
  const NodeId vdd = net.add_node("vdd");
  MountedPart ceramic{Capacitor{1e-7, 0.02, 0.4e-9}, 0.3e-9, 12};
  MountedPart lossy{Capacitor{.capacitance = 10e-6, .esr = 3e-3, .esl = 0.5e-9, .leakage_resistance = 5e7,
                              .dissipation_factor = 0.05, .skin_corner = 2e6},
                    0.45e-9, 4};
  MountedPart bulk{Capacitor{330e-6, 6e-3, 1.2e-9}, 0.8e-9, 2};
  MountedPart bead_to_ground{Inductor{2e-6, 0.05, 1.5e-12, 400.0}, 0.2e-9, 1};
  MountedPart damper{Resistor{0.8, 0.3e-9}, 0.2e-9, 3};
  MountedPart vrm{Regulator{0.5e-3, 15e-9}, 0.0, 1};
  // 10 cm x 10 cm, 100 um FR-4-like dielectric (demo values).
  MountedPart plane{PlanePair{.area = 0.01, .separation = 100e-6, .relative_permittivity = 4.3,
                              .loss_tangent = 0.02, .spreading_inductance = 40e-12, .series_resistance = 0.2e-3},
                    0.0, 1};
  net.add_branch("C100n", vdd, Network::kGround, ceramic);
  net.add_branch("C10u", Network::kGround, vdd, lossy);
  net.add_branch("BULK", vdd, Network::kGround, bulk);
  net.add_branch("BEAD", vdd, Network::kGround, bead_to_ground);
  net.add_branch("RDAMP", vdd, Network::kGround, damper);
  net.add_branch("VRM", vdd, Network::kGround, vrm);
  net.add_branch("PLANE", vdd, Network::kGround, plane);

  const FrequencyGrid grid(FrequencyGridOptions{1e3, 1e9, 25});
  const double plane_c = 8.8541878128e-12 * 4.3 * 0.01 / 100e-6;  // C = eps0 er A / d
  std::vector<Complex> want;
  for (const double f : grid.frequencies()) {
    const double w = 2.0 * kPi_ * f;
    const Complex y = 12.0 / capacitor_z(f, 1e-7, 0.02, 0.7e-9) +
                      4.0 / capacitor_z(f, 10e-6, 3e-3, 0.95e-9, 5e7, 0.05, 2e6) +
                      2.0 / capacitor_z(f, 330e-6, 6e-3, 2.0e-9) +
                      1.0 / (inductor_z(f, 2e-6, 0.05, 1.5e-12, 400.0) + j * w * 0.2e-9) +
                      3.0 / rl_z(f, 0.8, 0.5e-9) + 1.0 / rl_z(f, 0.5e-3, 15e-9) +
                      1.0 / (0.2e-3 + j * w * 40e-12 + 1.0 / (j * w * plane_c * Complex(1.0, -0.02)));
    want.push_back(1.0 / y);
  }
  CHECK(worst_relative_error(port_impedance(path, net, vdd, grid), want) < kClosedForm);
}

TEST_CASE("the parallel fast path agrees with the nodal solve to 1e-9", "[network]") {
  // Same network as above, reduced: both paths against each other, point by point.
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("C1", vdd, Network::kGround, MountedPart{Capacitor{4.7e-6, 4e-3, 0.5e-9}, 0.5e-9, 6});
  net.add_branch("C2", vdd, Network::kGround, MountedPart{Capacitor{22e-9, 60e-3, 0.3e-9}, 0.25e-9, 9});
  net.add_branch("C3", vdd, Network::kGround, MountedPart{Capacitor{220e-6, 8e-3, 1.5e-9}, 1.0e-9, 3});
  net.add_branch("VRM", vdd, Network::kGround, MountedPart{Regulator{1e-3, 8e-9}});
  const FrequencyGrid grid(FrequencyGridOptions{1e3, 1e9, 50});
  const ComplexVector fast = ParallelSolver::for_network(net, vdd, grid).impedance(net.counts());
  const ComplexVector nodal = solve_port_impedance(net, vdd, grid);
  std::vector<Complex> reference(nodal.data(), nodal.data() + nodal.size());
  CHECK(worst_relative_error(fast, reference) < kClosedForm);
}

TEST_CASE("N identical branches equal one branch with ESR/N, L/N and N*C", "[network]") {
  // REFERENCES §2: N identical parts in parallel equal one part with ESR/N, L/N, N*C (exact).
  const Path path = GENERATE(Path::parallel, Path::nodal, Path::nodal_branch_currents);
  const int n = GENERATE(2, 7, 40);
  INFO(describe(path) << ", N = " << n);
  const double c = 1e-6, esr = 8e-3, esl = 0.4e-9, mount = 0.6e-9;

  Network counted;  // one branch holding N copies
  counted.add_node("vdd");
  counted.add_branch("C", 1, Network::kGround, MountedPart{Capacitor{c, esr, esl}, mount, n});
  Network separate;  // N branches of one copy each
  separate.add_node("vdd");
  for (int k = 0; k < n; ++k) {
    std::string name("C");  // built by appending: GCC 12 warns falsely on "C" + std::string
    name += std::to_string(k);
    separate.add_branch(name, 1, Network::kGround, MountedPart{Capacitor{c, esr, esl}, mount, 1});
  }
  Network scaled;  // one copy with ESR/N, L/N, N*C
  scaled.add_node("vdd");
  scaled.add_branch("C", 1, Network::kGround, MountedPart{Capacitor{n * c, esr / n, esl / n}, mount / n, 1});

  const FrequencyGrid grid(FrequencyGridOptions{1e3, 1e9, 20});
  const ComplexVector want = port_impedance(path, scaled, 1, grid);
  const std::vector<Complex> reference(want.data(), want.data() + want.size());
  CHECK(worst_relative_error(port_impedance(path, counted, 1, grid), reference) < kRounding);
  CHECK(worst_relative_error(port_impedance(path, separate, 1, grid), reference) < kRounding);
  // And against the series RLC closed form (REFERENCES §2).
  std::vector<Complex> closed;
  for (const double f : grid.frequencies()) closed.push_back(capacitor_z(f, n * c, esr / n, (esl + mount) / n));
  CHECK(worst_relative_error(want, closed) < kClosedForm);
}

TEST_CASE("two capacitors anti-resonate at f_ar with the exact peak of REFERENCES §3", "[network]") {
  const Path path = GENERATE(Path::parallel, Path::nodal, Path::nodal_branch_currents);
  INFO(describe(path));
  // REFERENCES §3 worked example: C1 = 10 uF, L1 = 1 nH, R1 = 5 mohm; C2 = 100 nF, L2 = 1 nH,
  // R2 = 5 mohm. L is split into body ESL and mounting to exercise both.
  const double c1 = 10e-6, l1 = 1e-9, r1 = 5e-3, c2 = 100e-9, l2 = 1e-9, r2 = 5e-3;
  Network net;
  net.add_node("vdd");
  net.add_branch("C1", 1, Network::kGround, MountedPart{Capacitor{c1, r1, 0.6e-9}, 0.4e-9});
  net.add_branch("C2", 1, Network::kGround, MountedPart{Capacitor{c2, r2, 0.3e-9}, 0.7e-9});

  // f_ar = 1 / (2 pi sqrt((L1 + L2) Cs)), Cs = C1 C2 / (C1 + C2) (derivation in REFERENCES §3).
  const double cs = c1 * c2 / (c1 + c2);
  const double f_ar = 1.0 / (2.0 * kPi_ * std::sqrt((l1 + l2) * cs));
  CHECK_THAT(f_ar, Catch::Matchers::WithinRel(11.310e6, 1e-4));  // printed to 5 figures

  const ComplexVector z = port_impedance(path, net, 1, FrequencyGrid(std::vector<double>{f_ar}));
  // Exact at f_ar: Z = [X^2 + R1 R2 + j X (R2 - R1)] / (R1 + R2), X = w L1 - 1/(w C1).
  const double w = 2.0 * kPi_ * f_ar;
  const double x = w * l1 - 1.0 / (w * c1);
  const Complex exact = (x * x + r1 * r2 + j * x * (r2 - r1)) / (r1 + r2);
  CHECK(relative_error(z[0], exact) < kClosedForm);
  CHECK_THAT(std::abs(z[0]), Catch::Matchers::WithinRel(0.48770, 1e-4));  // REFERENCES §3, 5 figures
  CHECK_THAT(x, Catch::Matchers::WithinRel(69.66e-3, 1e-3));              // X1 = +69.66 mohm

  // The swept maximum sits slightly below f_ar: 0.48889 ohm at 11.282 MHz (REFERENCES §3).
  std::vector<double> dense;
  for (int k = 0; k <= 4000; ++k) dense.push_back(11.0e6 + k * 150.0);  // 11.0..11.6 MHz, 150 Hz steps
  const ComplexVector sweep = port_impedance(path, net, 1, FrequencyGrid(dense));
  Eigen::Index peak = 0;
  sweep.cwiseAbs().maxCoeff(&peak);
  CHECK_THAT(std::abs(sweep[peak]), Catch::Matchers::WithinRel(0.48889, 1e-4));
  CHECK_THAT(dense[static_cast<std::size_t>(peak)], Catch::Matchers::WithinRel(11.282e6, 1e-4));
}

TEST_CASE("changing one count incrementally equals the closed form for the new counts", "[network]") {
  const std::vector<MountedPart> parts{MountedPart{Capacitor{1e-6, 10e-3, 0.5e-9}, 0.4e-9},
                                       MountedPart{Capacitor{100e-9, 25e-3, 0.4e-9}, 0.3e-9}};
  const FrequencyGrid grid(FrequencyGridOptions{1e4, 1e9, 10});
  const ParallelSolver solver(parts, grid);
  CHECK(solver.part_count() == 2);
  CHECK(solver.frequency_count() == grid.size());
  ComplexVector total = solver.admittance({3, 5});
  solver.add_part(1, -2, total);  // 5 -> 3 copies of the 100 nF part
  solver.add_part(0, 4, total);   // 3 -> 7 copies of the 1 uF part
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const double f = grid[i];
    // Series RLC per copy (REFERENCES §2), admittances of copies add.
    const Complex y = 7.0 / capacitor_z(f, 1e-6, 10e-3, 0.9e-9) + 3.0 / capacitor_z(f, 100e-9, 25e-3, 0.7e-9);
    CHECK(relative_error(total[static_cast<Eigen::Index>(i)], y) < kClosedForm);
    CHECK(relative_error(solver.unit_admittance(1, i), 1.0 / capacitor_z(f, 100e-9, 25e-3, 0.7e-9)) < kClosedForm);
  }
}

TEST_CASE("a zero count removes a part and all-zero counts leave the rail open", "[network]") {
  const std::vector<MountedPart> parts{MountedPart{Capacitor{1e-6, 10e-3, 0.5e-9}},
                                       MountedPart{Capacitor{100e-9, 25e-3, 0.4e-9}}};
  const FrequencyGrid grid(FrequencyGridOptions{1e4, 1e8, 5});
  const ParallelSolver solver(parts, grid);
  const ComplexVector z = solver.impedance({0, 2});
  for (std::size_t i = 0; i < grid.size(); ++i)
    CHECK(relative_error(z[static_cast<Eigen::Index>(i)], capacitor_z(grid[i], 100e-9, 25e-3, 0.4e-9) / 2.0) <
          kClosedForm);
  CHECK_FALSE(std::isfinite(std::abs(solver.impedance({0, 0})[0])));
}

TEST_CASE("the parallel solver rejects bad counts, ideal shorts and non-parallel networks", "[network]") {
  const FrequencyGrid grid(FrequencyGridOptions{1e3, 1e6, 5});
  const ParallelSolver solver({MountedPart{Capacitor{1e-6, 1e-2, 1e-9}}}, grid);
  CHECK_THROWS_WITH(solver.admittance({1, 2}), Contains("counts") && Contains("1 counts"));
  CHECK_THROWS_WITH(solver.impedance({-1}), Contains("counts[0]") && Contains("-1"));
  CHECK_THROWS_WITH(ParallelSolver({MountedPart{Resistor{0.0, 0.0}}}, grid), Contains("/parts/0"));

  Network net;
  net.add_node("vdd");
  net.add_node("sub");
  net.add_branch("C1", "vdd", "gnd", MountedPart{Capacitor{1e-6, 1e-2, 1e-9}});
  net.add_branch("FB1", "vdd", "sub", MountedPart{Inductor{1e-6, 0.1, 1e-12, 500.0}});
  net.add_branch("C2", "sub", "gnd", MountedPart{Capacitor{1e-6, 1e-2, 1e-9}});
  CHECK_THROWS_WITH(ParallelSolver::for_network(net, 1, grid), Contains("FB1") && Contains("all-parallel"));
}
