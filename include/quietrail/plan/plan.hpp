// SPDX-License-Identifier: MIT
// The plan job: choose counts of candidate parts at the board node so that the rail's
// impedance, refined peaks included, stays under the target at the least cost (or count,
// or area). The search itself is in plan/search.hpp; this is the whole job around it:
// search on the grid, verify on refined peaks, add the frequencies that broke, repeat.
#pragma once

#include <cstddef>
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/target.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/models/element.hpp"
#include "quietrail/network/network.hpp"

namespace quietrail {

/// What the plan minimises.
enum class PlanObjective {
  cost,   ///< sum of count * relative cost (default)
  count,  ///< number of parts placed
  area,   ///< footprint area
};

/// "cost", "count" or "area".
std::string_view to_string(PlanObjective objective);
/// Parses "cost", "count" or "area"; std::nullopt otherwise.
std::optional<PlanObjective> parse_plan_objective(std::string_view text);

/// One part the plan may place at the board node, any number of copies up to max_count.
struct PlanCandidate {
  /// Branch name for the copies (unique among candidates and the fixed network's branches).
  std::string name;
  /// Library id, empty for an inline part.
  std::string library_id;
  /// One-line description for reports.
  std::string description;
  /// The model as placed: derated element plus mounting inductance. Its `count` is ignored.
  MountedPart part;
  /// Relative cost of one copy, > 0.
  double cost = 1.0;
  /// Footprint area of one copy, m^2, > 0.
  double area = 1e-6;
  /// Most copies the plan may place, >= 0.
  int max_count = 0;
  /// Nominal (before derating) capacitance, F, for reports; 0 when not a capacitor.
  double nominal_capacitance = 0.0;
};

/// Limits on the whole selection. Unset fields do not limit.
struct PlanLimits {
  /// Most copies the plan may place in all (the fixed network's parts not counted).
  std::optional<int> max_total{};
  /// Largest total footprint, m^2, the fixed parts' `fixed_area` included.
  std::optional<double> max_area{};
};

/// A planning problem: a fixed network (regulator, plane, parts already chosen, load
/// side) and candidates placed between `board` and ground.
struct PlanProblem {
  /// The fixed network. Must be solvable at `board` and `port` (check_topology).
  Network network;
  /// Where the candidates go (to ground).
  NodeId board = 0;
  /// Where the target applies: `board`, or e.g. the die behind a package.
  NodeId port = 0;
  /// The target over the band. Always set before use (optional only because a
  /// TargetImpedance has no default).
  std::optional<TargetImpedance> target{};
  /// Band and grid the search runs on.
  FrequencyGridOptions band{};
  /// The candidates.
  std::vector<PlanCandidate> candidates;
  /// Count and area limits.
  PlanLimits limits{};
  /// What to minimise.
  PlanObjective objective = PlanObjective::cost;
  /// Design margin below the target, dB, >= 0: the answer holds |Z| <= Z_t * 10^(-margin/20)
  /// on refined peaks (0: just meet the target).
  double margin_db = 0.0;
  /// Cost, area and count of the parts already in `network` (for totals and the area
  /// limit), in the candidates' units.
  double fixed_cost = 0.0;
  double fixed_area = 0.0;
  int fixed_count = 0;
  /// Facts about the fixed network's branches for the check's part table (run_check's
  /// `info`): empty, or one per branch of `network`.
  std::vector<BranchInfo> fixed_info;

  /// Throws InputError (no file; fields "candidates", "candidates/<name>/max_count",
  /// "limits/max_area", ...) for: no target; an invalid band; no candidates; every
  /// max_count zero; a negative max_count; a non-positive cost or area; a duplicate or
  /// taken name; a max_total < 0; fixed parts already above max_area.
  void validate() const;
};

/// Options of run_plan. Every limit is a count, never a time, so that the same inputs and
/// seed give the same answer on any machine.
struct PlanOptions {
  /// Seed of the heuristic's random perturbations.
  std::uint64_t seed = 1;
  /// How many of the best distinct selections to keep (the answer first). >= 1.
  std::size_t alternatives = 5;
  /// Branch-and-bound nodes per search before it stops and reports the gap. >= 1.
  std::size_t node_limit = 2'000'000;
  /// Perturbation rounds of the heuristic (iterated local search).
  std::size_t heuristic_rounds = 40;
  /// Margins below the target, dB, for which the cost-against-margin front is searched
  /// (each point is the least objective with worst ratio <= 10^(-margin/20)). Empty: no
  /// front. 0 dB is the answer itself and is always included.
  std::vector<double> front_margins_db{1.0, 2.0, 3.0, 4.5, 6.0};
  /// Nodes for the alternatives search and for each front point: both are guides, and
  /// say whether their search finished.
  std::size_t guide_node_limit = 200'000;
  /// Most search-verify rounds before giving up (each round adds the refined peak
  /// frequencies that broke the target to the constraint set). >= 1.
  int max_rounds = 8;
  /// The search holds |Z| <= Z_t * (1 - guard) on its frequencies, so that rounding in the
  /// two evaluation paths (search and check) cannot ping-pong at ratio 1 (our choice).
  double guard = 1e-9;
  /// Peak refinement for the verification (run_check).
  PeakOptions refinement{};
  /// Called now and then during long searches (best objective so far, bound, nodes); may
  /// be empty. Must not throw.
  std::function<void(double best, double bound, std::size_t nodes)> progress{};

  /// Throws InputError naming the field ("alternatives", "node_limit", "max_rounds",
  /// "front_margins_db", "guard").
  void validate() const;
};

/// How a plan ended.
enum class PlanStatus {
  /// A selection meets the target and no selection within the limits has a lower objective.
  optimal,
  /// A selection meets the target; the search stopped at its node limit with `gap` left.
  feasible,
  /// No selection found meets the target; `infeasibility` says how close one gets and why.
  infeasible,
};

/// "optimal", "feasible" or "infeasible".
std::string_view to_string(PlanStatus status);

/// Counts per candidate and what they add up to.
struct Selection {
  /// Copies per candidate, in candidate order.
  std::vector<int> counts;
  /// The objective (over the candidates only: the fixed parts are the same in every
  /// selection).
  double objective = 0.0;
  /// Totals of the candidates placed: relative cost, area (m^2) and copies.
  double cost = 0.0;
  double area = 0.0;
  int count = 0;
  /// Worst |Z|/Z_t: on the search's frequencies from the search, replaced by the refined
  /// value once verified.
  double worst_ratio = 0.0;
  /// Where, Hz.
  double worst_frequency = 0.0;
  /// True once run_check (refined peaks) has confirmed worst_ratio.
  bool verified = false;
};

/// A band the target cannot be met in with any selection inside the limits.
struct UnreachableBand {
  double start = 0.0;  ///< Hz
  double stop = 0.0;   ///< Hz
  /// The least |Z|/Z_t any selection could reach at the worst point of the band (a
  /// relaxation: the true best is at least this), and where, Hz.
  double floor_ratio = 0.0;
  double frequency = 0.0;
  /// What sets the floor: "inductance", "capacitance", "resistance" (of the best
  /// candidate there at its most copies) or "load path" (the port's impedance with the
  /// board node shorted already exceeds the target).
  std::string limit;
  /// One or two sentences with the numbers, e.g. "above 180 MHz: 40 x 0201 with 0.2 nH
  /// mounted give at best omega*L/N = ...; add on-package capacitance or lower-inductance
  /// mounting".
  std::string reason;
};

/// The answer to an impossible target.
struct Infeasibility {
  /// Best worst-ratio found within the limits (refined, verified), and its selection.
  double best_ratio = 0.0;
  Selection best;
  /// No selection within the limits has a worst ratio below this: the larger of the
  /// per-frequency relaxation floor and the highest ratio an exact search proved out of
  /// reach (bisection steps that finished). Within 1 % of best_ratio when every step of
  /// the bisection finished.
  double ratio_lower_bound = 0.0;
  /// Where even the relaxation cannot meet the target. May be empty when the target is
  /// missed only by the interplay of parts (no single frequency is out of reach).
  std::vector<UnreachableBand> bands;
  /// True when the search proved that no selection meets the target (it finished within
  /// the node limit); false when it only failed to find one.
  bool proven = false;
};

/// One point of the cost-against-margin front.
struct FrontPoint {
  /// The margin asked for, dB below the target (0 = just meet it).
  double margin_db = 0.0;
  /// The least-objective selection found with worst ratio <= 10^(-margin/20) (verified;
  /// margins at or below the problem's own margin_db are not searched again),
  /// or std::nullopt when none was found within the limits.
  std::optional<Selection> selection{};
  /// Achieved margin, dB: -20 log10(selection->worst_ratio).
  double achieved_margin_db = 0.0;
  /// True when the search for this point finished within its node limit.
  bool proven = false;
  /// Lower bound on the objective of any selection with this margin (= the selection's
  /// objective when proven; +inf when proven that none exists).
  double bound = 0.0;
};

/// Counters of the search, for the reports and the benchmark.
struct PlanStats {
  std::size_t nodes = 0;            ///< branch-and-bound nodes, all rounds
  std::size_t moves = 0;            ///< heuristic moves evaluated, all rounds
  int rounds = 0;                   ///< search-verify rounds
  std::size_t frequencies = 0;      ///< constraint frequencies in the last round
  std::size_t candidates = 0;       ///< candidates with max_count > 0
};

/// Everything a plan found.
struct PlanResult {
  PlanStatus status = PlanStatus::infeasible;
  /// One sentence, e.g. "optimal: cost 41.5 (14 parts), worst |Z|/Z_t 0.97 at 6.1 MHz".
  std::string message;
  /// The answer (status optimal or feasible); for infeasible, infeasibility->best.
  Selection best;
  /// Lower bound on the objective of any selection that meets the target, and the
  /// relative gap (best.objective - bound) / best.objective (0 when optimal).
  double bound = 0.0;
  double gap = 0.0;
  /// The best distinct selections that meet the target, best first (best included),
  /// each verified on refined peaks (one that fails its refined check is left out).
  std::vector<Selection> alternatives;
  /// True when the search for `alternatives` finished: they are then the K best there are
  /// (on the search's frequencies).
  bool alternatives_complete = false;
  /// Cost against margin: the answer (0 dB) and each PlanOptions::front_margins_db.
  std::vector<FrontPoint> front;
  /// Set when status is infeasible.
  std::optional<Infeasibility> infeasibility{};
  /// Frequencies that joined the search's grid, Hz, in the order added: around each refined
  /// peak where an answer (the heuristic's or the exact search's) broke the target between
  /// grid points, a cluster one grid step either side, spaced at a quarter of the peak's
  /// half-power width.
  std::vector<double> added_frequencies;
  /// The fixed network plus the chosen copies (one branch per candidate with count > 0,
  /// named as the candidate), and its check (the reports are built from it).
  Network network;
  CheckResult check;
  PlanStats stats;
};

/// The ratio limit a plan holds: 10^(-margin_db/20) (1 without a margin).
double margin_ratio(const PlanProblem& problem);

/// Plans the rail. Steps: validate (InputError); search on the grid (heuristic to seed,
/// then branch and bound); build the network and run_check it; while a refined peak
/// breaks the target (or the margin), add frequencies around it to the search's and search
/// again. Then the alternatives and the front, or for an impossible target the
/// infeasibility analysis (relaxation floors per frequency, then a bisection on the ratio
/// with exact searches for the best worst ratio within the limits).
///
/// Example:
///   PlanProblem problem{...};               // fixed network, target, candidates
///   const PlanResult plan = run_plan(problem, {});
///   if (plan.status == PlanStatus::infeasible) { /* plan.infeasibility says why */ }
PlanResult run_plan(const PlanProblem& problem, const PlanOptions& options = {});

/// The fixed network plus `counts` copies of each candidate (a branch per candidate with a
/// count > 0, named as the candidate, between board and ground).
Network planned_network(const PlanProblem& problem, const std::vector<int>& counts);

/// Totals of `counts` under `problem`'s objective (Selection without the ratio fields).
Selection selection_totals(const PlanProblem& problem, const std::vector<int>& counts);

}  // namespace quietrail
