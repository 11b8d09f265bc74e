// SPDX-License-Identifier: MIT
// All-parallel rail: precomputed unit admittances, summed with integer weights. The sums
// are plain real axpy loops over interleaved (re, im) data, which compilers vectorise.
#include "quietrail/network/parallel_solver.hpp"

#include <limits>
#include <string>

#include "quietrail/error.hpp"
#include "quietrail/network/topology.hpp"

namespace quietrail {
namespace {

// y += c * x over n doubles; no branches, no aliasing.
void axpy(double c, const double* __restrict x, double* __restrict y, std::size_t n) {
  for (std::size_t j = 0; j < n; ++j) y[j] += c * x[j];
}

}  // namespace

ParallelSolver::ParallelSolver(const std::vector<MountedPart>& parts, const FrequencyGrid& grid)
    : parts_(parts.size()), frequencies_(grid.size()) {
  for (std::size_t k = 0; k < parts.size(); ++k) {
    const std::string field = "/parts/" + std::to_string(k);
    parts[k].validate("", field);
    require_input(!is_ideal_short(parts[k]), {"", field},
                  "a part with non-zero impedance (not an ideal short)", "zero resistance and inductance");
  }
  unit_.resize(2 * parts_ * frequencies_);
  for (std::size_t k = 0; k < parts_; ++k) {
    for (std::size_t i = 0; i < frequencies_; ++i) {
      const double f = grid[i];
      const Complex z = element_impedance(parts[k].element, f) + Complex(0.0, omega(f) * parts[k].mounting_inductance);
      // conj(z)/|z|^2 instead of the library division (much slower, guards overflow that
      // part impedances cannot reach). z can still be exactly 0 at one frequency (a lossless
      // series resonance on a grid point): the admittance is then infinite.
      const double d = z.real() * z.real() + z.imag() * z.imag();
      Complex y(z.real() / d, -z.imag() / d);
      if (d == 0.0) y = Complex(std::numeric_limits<double>::infinity(), 0.0);
      if (!std::isfinite(d)) y = Complex(0.0, 0.0);  // exact open (lossless parallel resonance)
      unit_[2 * (k * frequencies_ + i)] = y.real();
      unit_[2 * (k * frequencies_ + i) + 1] = y.imag();
    }
  }
}

ParallelSolver ParallelSolver::for_network(const Network& network, NodeId port, const FrequencyGrid& grid) {
  require_input(network.has_node(port) && port != Network::kGround, {"", "/branches"},
                "a port that is a node other than ground", "node id " + std::to_string(port));
  std::vector<MountedPart> parts;
  parts.reserve(network.branch_count());
  for (const auto& b : network.branches()) {
    const bool across = (b.from == port && b.to == Network::kGround) || (b.to == port && b.from == Network::kGround);
    require_input(across, {"", "/branches/" + b.name},
                  "a branch from port '" + network.node_name(port) + "' to ground (all-parallel network)",
                  "a branch from '" + network.node_name(b.from) + "' to '" + network.node_name(b.to) + "'");
    parts.push_back(b.part);
  }
  return ParallelSolver(parts, grid);
}

void ParallelSolver::check_counts(const std::vector<int>& counts) const {
  require_input(counts.size() == parts_, {"", "counts"}, std::to_string(parts_) + " counts (one per part)",
                std::to_string(counts.size()));
  for (std::size_t k = 0; k < counts.size(); ++k)
    require_input(counts[k] >= 0, {"", "counts[" + std::to_string(k) + "]"}, "a count >= 0",
                  std::to_string(counts[k]));
}

ComplexVector ParallelSolver::admittance(const std::vector<int>& counts) const {
  check_counts(counts);
  ComplexVector total = ComplexVector::Zero(static_cast<Eigen::Index>(frequencies_));
  // std::complex is layout-compatible with double[2] ([complex.numbers.general]).
  double* out = reinterpret_cast<double*>(total.data());
  const std::size_t n = 2 * frequencies_;
  for (std::size_t k = 0; k < parts_; ++k) axpy(static_cast<double>(counts[k]), unit_.data() + k * n, out, n);
  return total;
}

ComplexVector ParallelSolver::impedance(const std::vector<int>& counts) const {
  ComplexVector z = admittance(counts);
  double* v = reinterpret_cast<double*>(z.data());
  for (std::size_t i = 0; i < frequencies_; ++i) {
    // 1/y = conj(y)/|y|^2: the magnitudes of a rail admittance need no overflow guard.
    const double re = v[2 * i];
    const double im = v[2 * i + 1];
    const double d = re * re + im * im;
    v[2 * i] = re / d;
    v[2 * i + 1] = -im / d;
  }
  return z;
}

void ParallelSolver::add_part(std::size_t part, int delta, ComplexVector& total) const {
  QUIETRAIL_ASSERT(part < parts_);
  QUIETRAIL_ASSERT(static_cast<std::size_t>(total.size()) == frequencies_);
  const std::size_t n = 2 * frequencies_;
  axpy(static_cast<double>(delta), unit_.data() + part * n, reinterpret_cast<double*>(total.data()), n);
}

Complex ParallelSolver::unit_admittance(std::size_t part, std::size_t i) const {
  QUIETRAIL_ASSERT(part < parts_ && i < frequencies_);
  return {unit_[2 * (part * frequencies_ + i)], unit_[2 * (part * frequencies_ + i) + 1]};
}

}  // namespace quietrail
