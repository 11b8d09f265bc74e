// SPDX-License-Identifier: MIT
// Sweep benchmark (single thread): the all-parallel fast path on a 30-part rail and the
// nodal solve on a 50-node plane mesh, both at 1000 frequency points. Median of 7 runs.
// A benchmark, not a test: it times and prints, and asserts nothing (figures in docs/benchmarks.md).
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <functional>
#include <string>
#include <vector>

#include <fmt/core.h>

#include "quietrail/frequency_grid.hpp"
#include "quietrail/network/nodal_solver.hpp"
#include "quietrail/network/parallel_solver.hpp"

using namespace quietrail;

namespace {

constexpr int kRuns = 7;
constexpr double kRunSeconds = 0.05;  // each timed run repeats the work for about this long
constexpr std::size_t kPoints = 1000;

using Clock = std::chrono::steady_clock;

// Median over kRuns of the seconds one call of `work` takes; each run repeats `work` enough
// times to last about kRunSeconds so clock resolution does not matter.
double median_seconds(const std::function<void()>& work) {
  const auto t0 = Clock::now();
  work();
  const double once = std::chrono::duration<double>(Clock::now() - t0).count();
  const int repeats = std::max(1, static_cast<int>(kRunSeconds / std::max(once, 1e-9)));
  std::vector<double> runs;
  for (int r = 0; r < kRuns; ++r) {
    const auto start = Clock::now();
    for (int k = 0; k < repeats; ++k) work();
    runs.push_back(std::chrono::duration<double>(Clock::now() - start).count() / repeats);
  }
  std::sort(runs.begin(), runs.end());
  return runs[runs.size() / 2];
}

FrequencyGrid log_grid(double start, double stop, std::size_t n) {
  std::vector<double> f(n);
  for (std::size_t i = 0; i < n; ++i)
    f[i] = start * std::pow(stop / start, static_cast<double>(i) / static_cast<double>(n - 1));
  return FrequencyGrid(f);
}

// 30 parts: a regulator, a plane, bulk and ceramics of several values (demo values).
std::vector<MountedPart> rail_parts() {
  std::vector<MountedPart> parts;
  parts.push_back(MountedPart{Regulator{0.5e-3, 15e-9}});
  parts.push_back(MountedPart{PlanePair{.area = 0.01, .separation = 75e-6, .relative_permittivity = 4.3,
                                        .loss_tangent = 0.02, .spreading_inductance = 50e-12,
                                        .series_resistance = 0.1e-3}});
  const double values[] = {330e-6, 100e-6, 47e-6, 22e-6, 10e-6, 4.7e-6, 2.2e-6, 1e-6, 470e-9, 220e-9, 100e-9, 47e-9, 22e-9, 10e-9};
  for (int k = 0; parts.size() < 30; ++k) {
    const double c = values[k % 14];
    Capacitor cap{c, 2e-3 + 3e-3 * (k % 5), 0.3e-9 + 0.1e-9 * (k % 4)};
    if (k % 3 == 0) cap.dissipation_factor = 0.025;
    parts.push_back(MountedPart{cap, 0.3e-9 + 0.05e-9 * (k % 6)});
  }
  return parts;
}

// A 5 x 10 plane mesh (50 nodes): cell R-L links, capacitors at 15 nodes, the regulator at
// one corner, the port at the far corner.
Network mesh_network() {
  constexpr int kRows = 5, kCols = 10;
  Network net;
  auto node = [](int r, int c) { return 1 + r * kCols + c; };
  for (int r = 0; r < kRows; ++r)
    for (int c = 0; c < kCols; ++c) net.add_node(fmt::format("m{}_{}", r, c));
  int b = 0;
  for (int r = 0; r < kRows; ++r)
    for (int c = 0; c < kCols; ++c) {
      if (c + 1 < kCols) net.add_branch(fmt::format("h{}", b++), node(r, c), node(r, c + 1), MountedPart{Resistor{0.4e-3, 30e-12}});
      if (r + 1 < kRows) net.add_branch(fmt::format("v{}", b++), node(r, c), node(r + 1, c), MountedPart{Resistor{0.4e-3, 30e-12}});
    }
  const auto parts = rail_parts();
  for (int k = 0; k < 15; ++k) {
    const int r = (k * 3) % kRows, c = (k * 7) % kCols;
    net.add_branch(fmt::format("c{}", k), node(r, c), Network::kGround, parts[static_cast<std::size_t>(2 + k)]);
  }
  net.add_branch("vrm", node(0, 0), Network::kGround, parts[0]);
  return net;
}

void row(const char* what, double seconds, double branch_points) {
  fmt::print("{:<44} {:>12.3f} {:>14.1f}\n", what, seconds * 1e6, branch_points / seconds / 1e6);
}

}  // namespace

int main() {
  const FrequencyGrid grid = log_grid(1e3, 1e9, kPoints);
  double checksum = 0.0;

  // (a) all-parallel fast path
  const auto parts = rail_parts();
  std::vector<int> counts(parts.size());
  for (std::size_t k = 0; k < counts.size(); ++k) counts[k] = 1 + static_cast<int>(k % 7);
  const double parallel_bp = static_cast<double>(parts.size() * kPoints);
  const double t_pre = median_seconds([&] { checksum += ParallelSolver(parts, grid).unit_admittance(3, 10).real(); });
  const ParallelSolver fast(parts, grid);
  const double t_z = median_seconds([&] { checksum += fast.impedance(counts)[500].real(); });
  ComplexVector running = fast.admittance(counts);
  int flip = 1;
  const double t_inc = median_seconds([&] { fast.add_part(7, flip, running); flip = -flip; });
  checksum += running[0].real();

  // (b) nodal solve on the mesh
  const Network mesh = mesh_network();
  const NodeId port = 50;  // far corner from the regulator
  const double nodal_bp = static_cast<double>(mesh.branch_count() * kPoints);
  const double t_npre = median_seconds([&] { checksum += NodalSolver(mesh, grid).frequency_count(); });
  const NodalSolver nodal(mesh, grid);
  NodalResult probe = nodal.solve(port);
  const double t_nsolve = median_seconds([&] { checksum += nodal.solve(port).impedance[500].real(); });
  const double t_ntotal = median_seconds([&] { checksum += solve_port_impedance(mesh, port, grid)[500].real(); });

  fmt::print("quietrail sweep benchmark: single thread, {} frequency points, median of {} runs\n\n", kPoints, kRuns);
  fmt::print("{:<44} {:>12} {:>14}\n", "case", "time [us]", "Mbranch*pt/s");
  fmt::print("{:-<72}\n", "");
  row(fmt::format("(a) parallel: precompute, {} parts", parts.size()).c_str(), t_pre, parallel_bp);
  row("(a) parallel: impedance(counts)", t_z, parallel_bp);
  row("(a) parallel: add_part (one count change)", t_inc, static_cast<double>(kPoints));
  row(fmt::format("(b) nodal: precompute, {} nodes {} branches", mesh.node_count() - 1, mesh.branch_count()).c_str(),
      t_npre, nodal_bp);
  row("(b) nodal: solve(port)", t_nsolve, nodal_bp);
  row("(b) nodal: solve_port_impedance (both)", t_ntotal, nodal_bp);
  fmt::print("{:-<72}\n", "");
  const double ratio = (nodal_bp / t_nsolve) > 0 ? (parallel_bp / t_z) / (nodal_bp / t_nsolve) : 0.0;
  fmt::print("per branch*point, parallel impedance() is {:.1f}x the nodal solve(); {:.1f}x solve_port_impedance()\n",
             ratio, (parallel_bp / t_z) / (nodal_bp / t_ntotal));
  fmt::print("nodal points needing the branch-current fallback: {} of {}\n", probe.branch_current_points, kPoints);
  fmt::print("(checksum {:.6g})\n", checksum);
  return 0;
}
