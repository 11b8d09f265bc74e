// SPDX-License-Identifier: MIT
// The search behind run_plan, on a fixed set of frequencies: the rail seen from the board
// node as a function of the candidates' total admittance, a greedy construction, a local
// search and a branch and bound with admissible bounds. Exposed for tests and the bench.
#pragma once

#include <cstddef>
#include <cstdint>
#include <functional>
#include <optional>
#include <vector>

#include "quietrail/plan/plan.hpp"
#include "quietrail/types.hpp"

namespace quietrail {

/// Admittance per search frequency, S (a plain vector: the search indexes it in tight loops).
using AdmittanceVector = std::vector<Complex>;

/// The rail at the search's frequencies. With S the total admittance of the candidates'
/// copies at the board node, the port impedance is a bilinear (Moebius) function of S:
///
///   Z_port(S) = A + B / (1 + Z_bb * S),   A = Z_pp - Z_pb^2 / Z_bb,   B = Z_pb^2 / Z_bb,
///
/// where Z_bb, Z_pp are the fixed network's driving-point impedances at board and port and
/// Z_pb the transfer impedance (a shunt admittance at one node of a linear network; from the
/// two-port Z-parameters). For port == board, A = 0 and B = Z_bb: Z = 1 / (1/Z_bb + S).
///
/// |Z_port| <= Z_t is then, when |A| < Z_t, the outside of a disc in the S plane:
/// |S - centre| >= radius (Moebius maps send discs to discs). When |A| >= Z_t no S meets
/// the target at that frequency (`reachable` is false).
class SelectionModel {
 public:
  /// Solves the fixed network at `frequencies` (strictly increasing, Hz) and evaluates the
  /// candidates' unit admittances there. `target_scale` multiplies the target (a margin
  /// below 1 asks for headroom); the search also applies `guard`: the limit used is
  /// Z_t * target_scale * (1 - guard). Throws InputError for an unsolvable network.
  SelectionModel(const PlanProblem& problem, std::vector<double> frequencies, double target_scale = 1.0,
                 double guard = 0.0);

  std::size_t frequency_count() const { return frequencies_.size(); }
  std::size_t candidate_count() const { return candidates_; }
  const std::vector<double>& frequencies() const { return frequencies_; }

  /// Admittance of one copy of candidate k at frequency index i, S.
  Complex unit_admittance(std::size_t k, std::size_t i) const { return unit_[k * frequencies_.size() + i]; }
  /// Total candidate admittance for `counts`, S per frequency.
  AdmittanceVector admittance(const std::vector<int>& counts) const;
  /// total += delta * Y_k, O(frequencies).
  void add(std::size_t k, int delta, AdmittanceVector& total) const;

  /// Port impedance for total candidate admittance s at frequency index i, ohm.
  Complex port_impedance(std::size_t i, Complex s) const;
  /// |Z_port| / limit at index i (limit = Z_t * target_scale * (1 - guard)).
  double ratio(std::size_t i, Complex s) const;
  /// Largest ratio over the frequencies and its index.
  std::pair<double, std::size_t> worst(const AdmittanceVector& total) const;
  /// True when every ratio <= 1.
  bool meets(const AdmittanceVector& total) const;

  /// The feasible set at index i: |S - centre(i)| >= radius(i); meaningful only where
  /// reachable(i).
  Complex centre(std::size_t i) const { return centre_[i]; }
  double radius(std::size_t i) const { return radius_[i]; }
  bool reachable(std::size_t i) const { return reachable_[i]; }

  /// The least |Z_port| / limit over all S with |S| <= reach at index i (a relaxation of
  /// what `reach` siemens of added parts could do, phases ignored).
  double floor_ratio(std::size_t i, double reach) const;

  /// Limit at index i, ohm (Z_t * target_scale * (1 - guard)).
  double limit(std::size_t i) const { return limit_[i]; }
  /// The port's impedance with no candidate placed, and with the board node shorted (A).
  Complex open_impedance(std::size_t i) const { return a_[i] + b_[i]; }
  Complex shorted_impedance(std::size_t i) const { return a_[i]; }

 private:
  std::vector<double> frequencies_;
  std::size_t candidates_ = 0;
  std::vector<Complex> unit_;  // unit_[k * F + i]
  std::vector<Complex> a_, b_, zbb_;
  std::vector<double> limit_;
  std::vector<Complex> centre_;
  std::vector<double> radius_;
  std::vector<bool> reachable_;
};

/// The budgets and weights the search works with (from a PlanProblem).
struct SearchSpec {
  /// Objective weight of one copy of each candidate (cost, 1 or area).
  std::vector<double> weight;
  /// Upper bound per candidate.
  std::vector<int> max_count;
  /// Area of one copy per candidate, m^2 (for the area budget).
  std::vector<double> area;
  /// Copies in all, and area in all (after the fixed parts), left for the candidates.
  std::optional<int> max_total{};
  std::optional<double> max_area{};

  /// From a problem: weights by its objective, area budget minus fixed_area.
  static SearchSpec from_problem(const PlanProblem& problem);
  /// Objective of `counts`.
  double objective(const std::vector<int>& counts) const;
  /// True when `counts` respects max_count, max_total and max_area.
  bool within_limits(const std::vector<int>& counts) const;
};

/// A small deterministic random source (SplitMix64, Steele, Lea & Flood, OOPSLA 2014),
/// with its own bounded draw so that results do not depend on the standard library's
/// distributions (which differ between implementations).
class SplitMix64 {
 public:
  explicit SplitMix64(std::uint64_t seed) : state_(seed) {}
  std::uint64_t next();
  /// Uniform in [0, n), n >= 1 (rejection sampling, unbiased).
  std::uint64_t below(std::uint64_t n);

 private:
  std::uint64_t state_;
};

/// Counters shared by the searches.
struct SearchCounters {
  std::size_t moves = 0;  ///< selections evaluated by the heuristics
  std::size_t nodes = 0;  ///< branch-and-bound nodes
};

/// Greedy construction: from all counts zero, repeatedly add the copy that removes the
/// most violation (sum over frequencies of log(ratio) where ratio > 1) per unit of
/// objective, until the target is met or nothing helps within the limits. The result may
/// not meet the target (check model.meets). Deterministic.
std::vector<int> greedy_construct(const SelectionModel& model, const SearchSpec& spec, SearchCounters& counters);

/// Local search from `start` (which must meet the target): first-improvement moves that
/// keep the target met and lower the objective (drop one copy; swap one copy for one of
/// another candidate; swap two for one), until none helps; then `rounds` perturbations
/// (drop a few random copies, repair greedily, descend again), keeping the best.
std::vector<int> improve_locally(const SelectionModel& model, const SearchSpec& spec, std::vector<int> start,
                                 std::size_t rounds, SplitMix64& random, SearchCounters& counters);

/// Greedy toward the lowest worst ratio within the limits (for impossible targets): add
/// the copy that lowers the worst ratio most until no copy lowers it.
std::vector<int> greedy_min_ratio(const SelectionModel& model, const SearchSpec& spec, SearchCounters& counters);

/// Result of branch_and_bound.
struct BranchAndBoundResult {
  /// The best distinct selections that meet the target, by objective (ties by counts),
  /// at most `keep` of them (the incumbents given included when still among the best).
  std::vector<std::vector<int>> best;
  /// True when the tree was searched completely: `best` are then the `keep` best there are.
  bool complete = false;
  /// Lower bound on the objective of every selection that meets the target and is not in
  /// `best` (= the best's objective when complete and best is not empty; +inf when complete
  /// and nothing meets the target).
  double bound = 0.0;
};

/// Exact search over the integer counts 0..max_count, depth-first, candidates ordered by
/// capacitance (largest first). At each node, with S_a the admittance placed so far and R
/// the most the unassigned candidates could add at each frequency (sum of max_count_k *
/// |Y_k|, capped by the count left times the largest |Y_k|), the node is pruned when some
/// frequency has |S_a - centre| + R < radius (the triangle inequality: no completion
/// reaches the feasible set), or when objective_a + max over frequencies of
/// (radius - |S_a - centre|) / max_k(|Y_k| / w_k) is not below the K-th best objective
/// (a fractional covering bound). Both bounds are admissible, so a complete search is exact.
/// `incumbents` (selections that meet the target) seed the pruning. Stops after
/// `node_limit` nodes.
BranchAndBoundResult branch_and_bound(const SelectionModel& model, const SearchSpec& spec,
                                      const std::vector<std::vector<int>>& incumbents, std::size_t keep,
                                      std::size_t node_limit, SearchCounters& counters,
                                      const std::function<void(double, double, std::size_t)>& progress = {});

}  // namespace quietrail
