// SPDX-License-Identifier: MIT
// Nodal analysis: a symbolic minimum-degree elimination (port last) computed once per
// port, then per frequency a stamp pass and a straight-line complex elimination over
// precomputed slot indices. Frequencies that lose a pivot are re-solved with
// branch-current rows by Eigen's sparse LU.
#include "quietrail/network/nodal_solver.hpp"

#include <algorithm>
#include <cstdint>
#include <cmath>
#include <limits>
#include <map>
#include <optional>
#include <set>
#include <unordered_map>
#include <utility>

#include <Eigen/SparseCore>
#include <Eigen/SparseLU>

#include "quietrail/error.hpp"
#include "quietrail/network/topology.hpp"

namespace quietrail {
namespace {

double norm1(Complex z) { return std::abs(z.real()) + std::abs(z.imag()); }

// 1/z without the NaN/overflow handling of the library division, which the operands here
// (finite, |z| well inside 1e-150..1e150) do not need; callers treat z == 0 themselves.
Complex reciprocal(Complex z) {
  const double d = z.real() * z.real() + z.imag() * z.imag();
  return {z.real() / d, -z.imag() / d};
}

// --- Node-voltage elimination -------------------------------------------------------
//
// The admittance matrix is complex symmetric (Y = Y^T for reciprocal branches), so only
// the upper triangle is stored, in "slots". Eliminating node v with remaining neighbours
// w_1..w_m updates A(w_i, w_j) -= A(v, w_i) * A(v, w_j) / A(v, v) for i <= j; the ordering
// and therefore every slot touched is fixed before any number is seen.
struct Update {
  int target;  // slot of A(w_i, w_j)
  int i;       // local index of w_i among the pivot's neighbours
  int source;  // slot of A(v, w_j), which no update of this step writes
};

struct Elimination {
  int slot_count = 0;  // slots in use: the pattern's (see NodalSolver), then fill-in
  std::vector<int> pivot_node, pivot_slot;           // per elimination step
  std::vector<int> neighbour_begin, neighbour_slot;  // A(v, w) slots per step
  std::vector<int> update_begin;
  std::vector<Update> updates;
  int port_node = 0;
  int port_slot = 0;
  int max_neighbours = 0;
};

// Orders the elimination of every unknown but the port. Slots 0..n-1 are the diagonal,
// n + e the off-diagonal of edges[e], n + edges.size() the sink; fill-in slots follow.
Elimination plan_elimination(int n, const std::vector<std::pair<int, int>>& edges, int port_node) {
  Elimination plan;
  // Sorted adjacency vectors and a hashed slot index: small and fast for the node counts
  // of a rail (this runs once per solve).
  std::vector<std::vector<int>> adjacent(n);
  auto link = [&](int a, int b) {
    auto& list = adjacent[a];
    const auto it = std::lower_bound(list.begin(), list.end(), b);
    if (it == list.end() || *it != b) list.insert(it, b);
  };
  auto unlink = [&](int a, int b) {
    auto& list = adjacent[a];
    const auto it = std::lower_bound(list.begin(), list.end(), b);
    if (it != list.end() && *it == b) list.erase(it);
  };
  std::unordered_map<std::uint64_t, int> slot_of;
  slot_of.reserve(4 * (static_cast<std::size_t>(n) + edges.size()));
  auto key = [](int a, int b) {
    const auto [lo, hi] = std::minmax(a, b);
    return (static_cast<std::uint64_t>(lo) << 32) | static_cast<std::uint32_t>(hi);
  };
  for (int u = 0; u < n; ++u) slot_of[key(u, u)] = u;
  for (std::size_t e = 0; e < edges.size(); ++e) {
    slot_of[key(edges[e].first, edges[e].second)] = n + static_cast<int>(e);
    link(edges[e].first, edges[e].second);
    link(edges[e].second, edges[e].first);
  }
  int next_slot = n + static_cast<int>(edges.size()) + 1;
  auto slot = [&](int a, int b) {
    const auto [it, inserted] = slot_of.try_emplace(key(a, b), next_slot);
    if (inserted) ++next_slot;
    return it->second;
  };

  // Minimum degree, ties to the lower index (deterministic); the port is eliminated last.
  std::set<std::pair<int, int>> queue;
  for (int u = 0; u < n; ++u)
    if (u != port_node) queue.insert({static_cast<int>(adjacent[u].size()), u});
  while (!queue.empty()) {
    const int v = queue.begin()->second;
    queue.erase(queue.begin());
    const std::vector<int> neighbours = adjacent[v];
    for (const int w : neighbours)
      if (w != port_node) queue.erase({static_cast<int>(adjacent[w].size()), w});

    plan.pivot_node.push_back(v);
    plan.pivot_slot.push_back(v);
    plan.neighbour_begin.push_back(static_cast<int>(plan.neighbour_slot.size()));
    plan.update_begin.push_back(static_cast<int>(plan.updates.size()));
    for (const int w : neighbours) plan.neighbour_slot.push_back(slot(v, w));
    const int m = static_cast<int>(neighbours.size());
    plan.max_neighbours = std::max(plan.max_neighbours, m);
    for (int i = 0; i < m; ++i) {
      for (int j = i; j < m; ++j) {
        const int wi = neighbours[i];
        const int wj = neighbours[j];
        plan.updates.push_back({slot(wi, wj), i, slot(v, wj)});
        if (i != j) {  // fill-in joins the neighbours into a clique
          link(wi, wj);
          link(wj, wi);
        }
      }
    }
    for (const int w : neighbours) unlink(w, v);
    adjacent[v].clear();
    for (const int w : neighbours)
      if (w != port_node) queue.insert({static_cast<int>(adjacent[w].size()), w});
  }
  plan.neighbour_begin.push_back(static_cast<int>(plan.neighbour_slot.size()));
  plan.update_begin.push_back(static_cast<int>(plan.updates.size()));
  plan.port_node = port_node;
  plan.port_slot = port_node;
  plan.slot_count = next_slot;
  return plan;
}

// Lane-wise complex arithmetic on one block slot (kLanes real parts, then kLanes imaginary
// parts). The pointers never overlap (distinct slots, or the separate `scaled` buffer), and
// saying so lets the compiler vectorise the fixed-length loops.
constexpr std::size_t kLanes = NodalSolver::kLanes;

// target -= t * r
inline void subtract_product(double* __restrict target, const double* __restrict t, const double* __restrict r) {
  for (std::size_t l = 0; l < kLanes; ++l) {
    target[l] -= t[l] * r[l] - t[kLanes + l] * r[kLanes + l];
    target[kLanes + l] -= t[l] * r[kLanes + l] + t[kLanes + l] * r[l];
  }
}

// target += sign * y
inline void accumulate(double* __restrict target, const double* __restrict y, double sign) {
  for (std::size_t l = 0; l < 2 * kLanes; ++l) target[l] += sign * y[l];
}

// Eliminates every node but the port in kLanes frequencies at once. `values` and `scale`
// are in the block layout of NodalSolver::solve; `scaled` has room for max_neighbours
// slots. lane_ok[l] ends false where a pivot was lost. This loop is nearly the whole cost
// of a solve, so on x86-64 it is also compiled for AVX2 and the loader picks the variant
// the CPU supports (GCC/Clang function multiversioning); results agree to rounding.
#if defined(__x86_64__) && (defined(__GNUC__) || defined(__clang__))
__attribute__((target_clones("avx2", "default")))
#endif
void eliminate(const Elimination& plan, double* values, const double* scale, double* scaled, bool* lane_ok) {
  constexpr std::size_t W = NodalSolver::kLanes;
  for (std::size_t l = 0; l < W; ++l) lane_ok[l] = true;
  const std::size_t steps = plan.pivot_node.size();
  for (std::size_t s = 0; s < steps; ++s) {
    const double* d = &values[plan.pivot_slot[s] * 2 * W];
    const double* node_scale = &scale[plan.pivot_node[s] * W];
    double inv_re[W], inv_im[W];
    for (std::size_t l = 0; l < W; ++l) {
      // "size <= max" is false for infinity and NaN: isfinite without a library call.
      const double size = std::abs(d[l]) + std::abs(d[W + l]);
      lane_ok[l] = lane_ok[l] & (size >= NodalSolver::kPivotRatio * node_scale[l]) &
                   (size <= std::numeric_limits<double>::max());
      const double inverse_norm = 1.0 / (d[l] * d[l] + d[W + l] * d[W + l]);
      inv_re[l] = d[l] * inverse_norm;
      inv_im[l] = -d[W + l] * inverse_norm;
    }
    const int first = plan.neighbour_begin[s];
    const int m = plan.neighbour_begin[s + 1] - first;
    for (int j = 0; j < m; ++j) {
      const double* a = &values[plan.neighbour_slot[first + j] * 2 * W];
      double* t = &scaled[j * 2 * W];
      for (std::size_t l = 0; l < W; ++l) {
        t[l] = a[l] * inv_re[l] - a[W + l] * inv_im[l];
        t[W + l] = a[l] * inv_im[l] + a[W + l] * inv_re[l];
      }
    }
    for (int u = plan.update_begin[s]; u < plan.update_begin[s + 1]; ++u) {
      const Update& op = plan.updates[u];
      subtract_product(&values[op.target * 2 * W], &scaled[op.i * 2 * W], &values[op.source * 2 * W]);
    }
  }
}

// --- Branch-current MNA (fallback and cross-check) ------------------------------------
//
// Unknowns: node voltages 0..n-1 (node u + 1), then one current per branch (from -> to).
// Rows 0..n-1 are KCL; row n + k is branch k's constitutive equation.
class BranchCurrentSystem {
 public:
  explicit BranchCurrentSystem(const Network& network) {
    const auto& branches = network.branches();
    nodes_ = static_cast<int>(network.node_count()) - 1;
    const int size = nodes_ + static_cast<int>(branches.size());
    std::vector<Eigen::Triplet<Complex>> triplets;
    for (std::size_t k = 0; k < branches.size(); ++k) {
      const int r = nodes_ + static_cast<int>(k);
      const int a = branches[k].from - 1;
      const int c = branches[k].to - 1;
      if (a >= 0) triplets.emplace_back(a, r, 1.0), triplets.emplace_back(r, a, 1.0);
      if (c >= 0) triplets.emplace_back(c, r, -1.0), triplets.emplace_back(r, c, -1.0);
      triplets.emplace_back(r, r, -1.0);
    }
    matrix_.resize(size, size);
    matrix_.setFromTriplets(triplets.begin(), triplets.end());
    matrix_.makeCompressed();
    const Complex* base = matrix_.valuePtr();
    for (std::size_t k = 0; k < branches.size(); ++k) {
      const int r = nodes_ + static_cast<int>(k);
      const int a = branches[k].from - 1;
      const int c = branches[k].to - 1;
      from_.push_back(a >= 0 ? static_cast<int>(&matrix_.coeffRef(r, a) - base) : -1);
      to_.push_back(c >= 0 ? static_cast<int>(&matrix_.coeffRef(r, c) - base) : -1);
      self_.push_back(static_cast<int>(&matrix_.coeffRef(r, r) - base));
    }
    lu_.analyzePattern(matrix_);
    rhs_ = Eigen::VectorXcd::Zero(size);
  }

  // Port impedance for branch admittances `y` (one per branch); infinite when singular.
  Complex port_impedance(const Complex* y, int port_node) {
    Complex* values = matrix_.valuePtr();
    for (std::size_t k = 0; k < self_.size(); ++k) {
      Complex alpha = 1.0;
      Complex beta;
      if (!std::isfinite(norm1(y[k]))) {
        beta = 0.0;  // zero impedance
      } else if (std::abs(y[k]) >= 1.0) {
        beta = 1.0 / y[k];  // impedance row: V_a - V_b - Z I = 0
      } else {
        alpha = y[k];  // admittance row: Y (V_a - V_b) - I = 0
        beta = 1.0;
      }
      if (from_[k] >= 0) values[from_[k]] = alpha;
      if (to_[k] >= 0) values[to_[k]] = -alpha;
      values[self_[k]] = -beta;
    }
    lu_.factorize(matrix_);
    if (lu_.info() != Eigen::Success) return {std::numeric_limits<double>::infinity(), 0.0};
    rhs_.setZero();
    rhs_[port_node] = 1.0;
    const Eigen::VectorXcd x = lu_.solve(rhs_);
    const Complex z = x[port_node];
    if (!std::isfinite(norm1(z))) return {std::numeric_limits<double>::infinity(), 0.0};
    return z;
  }

 private:
  int nodes_ = 0;
  Eigen::SparseMatrix<Complex> matrix_;
  Eigen::SparseLU<Eigen::SparseMatrix<Complex>> lu_;
  Eigen::VectorXcd rhs_;
  std::vector<int> from_, to_, self_;
};

}  // namespace

NodalSolver::NodalSolver(const Network& network, const FrequencyGrid& grid, NodalOptions options)
    : network_(network), options_(options), frequencies_(grid.frequencies()) {
  require_input(network_.branch_count() > 0, {"", "/branches"}, "a network with at least one branch",
                "none");
  const auto& branches = network_.branches();
  constexpr std::size_t W = kLanes;
  const int n = static_cast<int>(network_.node_count()) - 1;  // unknown u is node u + 1
  nodes_ = static_cast<std::size_t>(n);

  // The pattern: one slot per node (diagonal), one per connected node pair (off-diagonal),
  // one sink that absorbs the stamps of ground ends.
  std::map<std::pair<int, int>, int> edge_slot;
  std::vector<int> diag_from, diag_to, off;
  for (const auto& b : branches) {
    const int a = b.from - 1;
    const int c = b.to - 1;
    diag_from.push_back(a >= 0 ? a : -1);
    diag_to.push_back(c >= 0 ? c : -1);
    if (a >= 0 && c >= 0) {
      const auto key = std::minmax(a, c);
      const auto [it, inserted] = edge_slot.try_emplace({key.first, key.second}, n + static_cast<int>(edges_.size()));
      if (inserted) edges_.push_back({key.first, key.second});
      off.push_back(it->second);
    } else {
      off.push_back(-1);
    }
  }
  const int sink = n + static_cast<int>(edges_.size());
  for (auto* list : {&diag_from, &diag_to, &off})
    for (int& slot : *list) slot = slot < 0 ? sink : slot;
  pattern_slots_ = static_cast<std::size_t>(sink) + 1;

  // Assemble the nodal matrix block by block; padding lanes repeat the last frequency.
  const std::size_t blocks = (frequencies_.size() + W - 1) / W;
  stamped_.assign(blocks * pattern_slots_ * 2 * W, 0.0);
  scale_.assign(blocks * (nodes_ + 1) * W, 0.0);
  for (std::size_t block = 0; block < blocks; ++block) {
    double* values = &stamped_[block * pattern_slots_ * 2 * W];
    double* scale = &scale_[block * (nodes_ + 1) * W];
    double f[W];
    for (std::size_t lane = 0; lane < W; ++lane) f[lane] = frequencies_[std::min(block * W + lane, frequencies_.size() - 1)];
    for (std::size_t k = 0; k < branches.size(); ++k) {
      double y[2 * W], size[W];
      for (std::size_t lane = 0; lane < W; ++lane) {
        const Complex a = branch_admittance(branches[k].part, f[lane]);
        y[lane] = a.real();
        y[W + lane] = a.imag();
        size[lane] = norm1(a);
      }
      double* from = &values[diag_from[k] * 2 * W];
      double* to = &values[diag_to[k] * 2 * W];
      double* between = &values[off[k] * 2 * W];
      for (std::size_t l = 0; l < 2 * W; ++l) from[l] += y[l];
      for (std::size_t l = 0; l < 2 * W; ++l) to[l] += y[l];
      for (std::size_t l = 0; l < 2 * W; ++l) between[l] -= y[l];
      // The scale's sink is index n (the pattern's sink slot is not a node).
      double* scale_from = &scale[(diag_from[k] == sink ? n : diag_from[k]) * W];
      double* scale_to = &scale[(diag_to[k] == sink ? n : diag_to[k]) * W];
      for (std::size_t l = 0; l < W; ++l) scale_from[l] += size[l];
      for (std::size_t l = 0; l < W; ++l) scale_to[l] += size[l];
    }
  }
}

Complex NodalSolver::branch_admittance(const MountedPart& part, double frequency) {
  // A branch can be an exact short (lossless series resonance) or an exact open (lossless
  // parallel resonance, where the model's division overflows) at one grid frequency:
  // infinite and zero admittance. The pivot checks route those points to the
  // branch-current rows.
  const Complex z = part.impedance(frequency);
  if (z == Complex(0.0, 0.0)) return {std::numeric_limits<double>::infinity(), 0.0};
  if (!std::isfinite(norm1(z))) return {0.0, 0.0};
  return reciprocal(z);
}

NodalResult NodalSolver::solve(NodeId port) const {
  check_topology(network_, port);
  constexpr std::size_t W = kLanes;
  const std::size_t f_count = frequencies_.size();
  const auto& branches = network_.branches();
  NodalResult result;
  result.impedance.resize(static_cast<Eigen::Index>(f_count));

  std::optional<BranchCurrentSystem> fallback;
  std::vector<Complex> branch_y(branches.size());
  auto robust = [&](std::size_t i) {
    if (!fallback) fallback.emplace(network_);
    ++result.branch_current_points;
    for (std::size_t k = 0; k < branches.size(); ++k) branch_y[k] = branch_admittance(branches[k].part, frequencies_[i]);
    return fallback->port_impedance(branch_y.data(), port - 1);
  };

  if (options_.formulation == NodalFormulation::branch_currents) {
    for (std::size_t i = 0; i < f_count; ++i) result.impedance[static_cast<Eigen::Index>(i)] = robust(i);
    return result;
  }

  // Block layout: slot s holds W real parts, then W imaginary parts. The pattern's slots
  // come assembled from the constructor; fill-in slots start at zero.
  const Elimination plan = plan_elimination(static_cast<int>(nodes_), edges_, port - 1);
  std::vector<double> values(plan.slot_count * 2 * W);
  std::vector<double> scaled(plan.max_neighbours * 2 * W);
  const std::size_t blocks = (f_count + W - 1) / W;
  const std::size_t pattern_size = pattern_slots_ * 2 * W;
  std::vector<std::size_t> lost;  // frequencies whose pivots were lost

  for (std::size_t block = 0; block < blocks; ++block) {
    std::copy_n(&stamped_[block * pattern_size], pattern_size, values.begin());
    std::fill(values.begin() + static_cast<std::ptrdiff_t>(pattern_size), values.end(), 0.0);
    const double* scale = &scale_[block * (nodes_ + 1) * W];

    // Lanes are independent: a lane that loses a pivot carries garbage to the end and is
    // then re-solved alone; the others are unaffected.
    bool lane_ok[W];
    eliminate(plan, values.data(), scale, scaled.data(), lane_ok);

    const double* d = &values[plan.port_slot * 2 * W];
    const double* port_scale = &scale[plan.port_node * W];
    for (std::size_t l = 0; l < W && block * W + l < f_count; ++l) {
      const std::size_t i = block * W + l;
      const double size = std::abs(d[l]) + std::abs(d[W + l]);
      const bool ok = lane_ok[l] && std::isfinite(size) && size > 0.0 && size >= kPivotRatio * port_scale[l];
      if (ok)
        result.impedance[static_cast<Eigen::Index>(i)] = reciprocal(Complex(d[l], d[W + l]));
      else
        lost.push_back(i);
    }
  }
  for (const std::size_t i : lost) result.impedance[static_cast<Eigen::Index>(i)] = robust(i);
  return result;
}

ComplexVector solve_port_impedance(const Network& network, NodeId port, const FrequencyGrid& grid) {
  return NodalSolver(network, grid).solve(port).impedance;
}

}  // namespace quietrail
