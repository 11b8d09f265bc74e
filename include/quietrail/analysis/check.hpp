// SPDX-License-Identifier: MIT
// The check job on a built Network: sweep the port impedance, refine every peak, compare
// with the target, attribute each peak, tabulate the parts. No files here (io/ builds the
// Network; report/ renders the result).
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "quietrail/analysis/attribution.hpp"
#include "quietrail/analysis/peaks.hpp"
#include "quietrail/analysis/target.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/models/part_response.hpp"
#include "quietrail/network/network.hpp"
#include "quietrail/types.hpp"

namespace quietrail {

/// Options for run_check.
struct CheckOptions {
  /// The band and its sampling. The defaults (1 kHz .. 1 GHz, 50 points/decade) are the
  /// library's sweep defaults (frequency_grid.hpp).
  FrequencyGridOptions grid{};
  /// Peak refinement (tolerance, densification, Q search).
  PeakOptions refinement{};
  /// Peak attribution.
  AttributionOptions attribution{};
  /// Keep the impedance of every branch (all copies) on the grid, for per-part plot curves.
  bool branch_curves = false;

  /// Throws InputError naming the offending field ("grid/start", "refinement/...",
  /// "attribution/...").
  void validate() const;
};

/// Facts about a branch that the Network does not hold, supplied by the caller (who has
/// the part library), one per branch in branch order. Every field is optional.
struct BranchInfo {
  /// Library part id, empty for an inline part.
  std::string library_id;
  /// Short description, e.g. "100 nF 0402 X7R 16 V".
  std::string description;
  /// Nominal capacitance before derating, F. The network holds the effective value.
  std::optional<double> nominal_capacitance{};
  /// Cost of one copy, in the library's cost unit (relative).
  std::optional<double> cost{};
  /// Footprint area of one copy, m^2.
  std::optional<double> area{};
};

/// One row of the per-part table (per branch). Per-copy values unless stated.
struct PartRow {
  /// The branch this row describes.
  BranchId branch = 0;
  /// Branch name.
  std::string name;
  /// element_kind(): "capacitor", "inductor", "resistor", "regulator" or "plane".
  std::string kind;
  /// Copies in parallel.
  int count = 1;
  /// Library part id (BranchInfo), empty for an inline part.
  std::string library_id;
  /// Short description (BranchInfo).
  std::string description;
  /// Nominal capacitance (BranchInfo), F.
  std::optional<double> nominal_capacitance{};
  /// Capacitance in the model (after derating), F: a capacitor's C, a plane's C, an
  /// inductor's interwinding capacitance.
  std::optional<double> effective_capacitance{};
  /// Series resistance, ohm: capacitor ESR, inductor DC resistance, regulator or resistor
  /// resistance, plane series resistance.
  std::optional<double> esr{};
  /// Body inductance, H: capacitor ESL, inductor L, regulator L_out, resistor L, plane
  /// spreading inductance.
  std::optional<double> esl{};
  /// Mounting inductance, H.
  double mounting_inductance = 0.0;
  /// Self-resonant frequency with mounting, Hz (part_response.hpp), when it has one.
  std::optional<double> srf{};
  /// Band where the mounted part behaves as a capacitor (part_response.hpp capacitive_band),
  /// for capacitors and planes.
  std::optional<Band> capacitive_band{};
  /// Cost of one copy (BranchInfo), in the library's cost unit.
  std::optional<double> cost_each{};
  /// cost_each * count.
  std::optional<double> cost_total{};
  /// Footprint area of one copy (BranchInfo), m^2.
  std::optional<double> area_each{};
  /// area_each * count, m^2.
  std::optional<double> area_total{};
};

/// Totals of the part table.
struct PartTotals {
  /// Sum of the counts of capacitor branches.
  int capacitor_count = 0;
  /// Sum of cost_total over the rows that have one, cost unit.
  double cost = 0.0;
  /// Sum of area_total over the rows that have one, m^2.
  double area = 0.0;
  /// False when some capacitor row has no cost: `cost` is then a lower bound.
  bool cost_complete = true;
  /// False when some capacitor row has no area: `area` is then a lower bound.
  bool area_complete = true;
};

/// Outcome of a check.
enum class CheckStatus {
  /// Every refined |Z|/Z_target <= 1 over the band. All fields are set.
  pass,
  /// Some refined ratio > 1 (or |Z| is not finite somewhere). All fields are set; `exceeded`
  /// lists where.
  fail,
};

/// "pass" or "fail".
std::string to_string(CheckStatus status);

/// Everything a check found. The verdict is made on refined maxima of |Z|/Z_target, never
/// on raw samples alone.
struct CheckResult {
  /// The verdict.
  CheckStatus status = CheckStatus::pass;
  /// One sentence: the verdict with the worst ratio and where.
  std::string message;
  /// Name of the port node the impedance is seen from.
  std::string port_name;
  /// target.describe().
  std::string target_description;

  /// The grid, Hz.
  std::vector<double> frequencies;
  /// Port impedance on the grid, ohm.
  ComplexVector impedance;
  /// Target on the grid, ohm.
  RealVector target;
  /// Refined maxima of |Z| (anti-resonances and band-edge maxima), by frequency.
  std::vector<Peak> peaks;
  /// attribute_peak for each entry of `peaks`, same order.
  std::vector<PeakAttribution> attributions;
  /// Refined maxima of |Z|/Z_target, by frequency (the verdict's basis).
  std::vector<Peak> ratio_peaks;
  /// Bands where the target is exceeded.
  std::vector<ExceedanceBand> exceeded;
  /// Largest refined |Z|/Z_target over the band (grid samples included).
  double worst_ratio = 0.0;
  /// Where it occurs, Hz.
  double worst_frequency = 0.0;
  /// 20 log10(worst_ratio), dB; above 0 dB fails.
  double worst_ratio_db = 0.0;
  /// |Z| at the worst frequency, ohm.
  double worst_magnitude = 0.0;
  /// Z_target at the worst frequency, ohm.
  double worst_target = 0.0;
  /// Grid points requested (options.grid).
  std::size_t grid_points_requested = 0;
  /// Exact evaluations used by refinement on top of the grid.
  std::size_t evaluations_used = 0;
  /// One row per branch, in branch order.
  std::vector<PartRow> parts;
  /// Totals of `parts`.
  PartTotals totals;
  /// Impedance of each branch (all copies) on the grid, ohm, in branch order, when
  /// CheckOptions::branch_curves; else empty.
  std::vector<ComplexVector> branch_impedance;
  /// True when the parallel fast path was used (all branches between port and ground).
  bool all_parallel = false;

  /// One line for logs, e.g. "fail: worst |Z|/Z_t 1.83 (+5.25 dB) at 11.28 MHz; 3 peaks;
  /// 1 band above target; 301 grid points + 412 evaluations".
  std::string brief() const;
};

/// The exact port impedance at any frequency, ohm, for refinement: for an all-parallel
/// network 1 / sum_k Y_k(f) (count included), otherwise NodalSolver on a one-point grid.
/// Runs check_topology first (InputError). The function keeps its own copy of the network.
ImpedanceFunction port_impedance_function(const Network& network, NodeId port);

/// Checks the impedance seen at `port` against `target` over options.grid.
///
/// Steps: validate options and the target's cover of the band (InputError); check_topology;
/// sweep the grid (ParallelSolver when is_all_parallel, else NodalSolver); find_peaks with
/// the exact evaluator; attribute each |Z| peak; build the part table. `info`, when not
/// empty, must have one entry per branch (InputError naming "info" otherwise).
/// Verdict: pass iff every refined ratio maximum and every grid sample has |Z|/Z_t <= 1.
///
/// Example:
///   Network net;
///   const NodeId vdd = net.add_node("vdd");
///   net.add_branch("C1", vdd, Network::kGround,
///                  MountedPart{Capacitor{.capacitance = 1e-6, .esr = 5e-3, .esl = 0.5e-9}});
///   const CheckResult r = run_check(net, vdd, TargetImpedance::flat(10e-3), {});
///   if (r.status == CheckStatus::fail) { /* r.exceeded says where */ }
CheckResult run_check(const Network& network, NodeId port, const TargetImpedance& target,
                      const CheckOptions& options = {}, const std::vector<BranchInfo>& info = {});

}  // namespace quietrail
