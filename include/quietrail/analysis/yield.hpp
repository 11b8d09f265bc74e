// SPDX-License-Identifier: MIT
// Tolerance and derating yield: Monte Carlo over the capacitors' value tolerance, ESR and
// ESL spread, DC-bias derating over the rail's voltage band and temperature over the
// operating range; the fraction of builds that meet the target, |Z| percentile curves,
// the worst trial and two corners. Method and choices: docs/yield.md.
//
// Layering: this job sits beside plan/ above io/ only for yield_problem(Project, ...),
// which reads what the project file built; everything else needs only a Network.
#pragma once

#include <cstddef>
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/target.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/network/network.hpp"
#include "quietrail/types.hpp"

namespace quietrail {

struct Project;
class PartLibrary;

/// Most trials one run may ask for. A million trials of a 300-point grid already take
/// minutes; more would only hide a typo (our choice).
inline constexpr std::size_t kMaxYieldTrials = 1'000'000;

/// Value tolerance given to inline capacitors (no library entry): +/-20 %, tolerance letter
/// M (REFERENCES §8), the usual grade of high-value class-2 parts (common practice).
inline constexpr double kInlineCapacitanceTolerance = 0.2;

/// One capacitor branch whose values vary from build to build. All copies of the branch
/// (its `count`) share one draw per trial: they come from one reel lot (our choice; it is
/// the pessimistic reading, since independent copies would average out).
///
/// Per trial, with u_C, u_R, u_L uniform in [-1, 1), V the trial's DC voltage and T its
/// temperature:
///   C   = c_nominal * (1 + c_tolerance * u_C) * dc_bias_factor(V) * temperature_factor(T)
///   ESR = ESR_branch * (1 + esr_spread * u_R),  ESL = ESL_branch * (1 + esl_spread * u_L)
/// where ESR_branch and ESL_branch are the branch's capacitor values in the network. The
/// mounting inductance, leakage, dissipation factor and skin corner are not varied.
struct VariedPart {
  /// The branch (a Capacitor) in YieldProblem::network.
  BranchId branch = 0;
  /// Capacitance before derating (0 V, 25 C), F. > 0.
  double c_nominal = 0.0;
  /// Value tolerance, fraction, uniform +/- (0.1 for +/-10 %, letter K). In [0, 1).
  double c_tolerance = 0.0;
  /// ESR and ESL spread, fraction, uniform +/-; unset = YieldOptions::esr_spread /
  /// esl_spread. In [0, 1).
  std::optional<double> esr_spread{};
  std::optional<double> esl_spread{};
  /// C(V)/C0 at a DC voltage (V); empty = 1 (no DC-bias loss). models/derating.hpp.
  std::function<double(double)> dc_bias_factor{};
  /// C(T)/C(25 C) at a temperature (C); empty = 1. models/derating.hpp.
  std::function<double(double)> temperature_factor{};
  /// Where the part came from, for messages ("/bom/2", a CSV line); may be empty.
  std::string source{};
};

/// What the yield job varies and judges: the network, where it is seen, the target, the
/// band, the varied parts and the operating ranges.
struct YieldProblem {
  /// The rail with every part at its nominal (derated) values.
  Network network;
  /// The node the impedance is seen from.
  NodeId port = 0;
  /// The target (always set; optional only because TargetImpedance has no default).
  std::optional<TargetImpedance> target{};
  /// Band and sampling of the verdict.
  FrequencyGridOptions band{};
  /// The parts that vary, at most one entry per branch.
  std::vector<VariedPart> parts{};
  /// Nominal DC voltage across the capacitors, V (finite).
  double dc_voltage = 0.0;
  /// Half-width of the DC voltage band, fraction of dc_voltage, uniform +/-. In [0, 1]
  /// (a rail's ripple may be up to 100 %).
  /// yield_problem takes the rail's ripple (the allowed deviation; our choice, since the
  /// project gives no separate set-point tolerance).
  double voltage_tolerance = 0.0;
  /// Temperature range, C, drawn uniformly. Finite, min <= max. yield_problem takes 25 C
  /// (the nominal values' reference) to the rail's temperature, whichever is lower first.
  double temperature_min_c = 25.0;
  double temperature_max_c = 25.0;

  /// Throws InputError naming the field: "target" unset, "parts/<i>/branch" unknown, not a
  /// capacitor or repeated, "parts/<i>/c_nominal" not > 0, "parts/<i>/c_tolerance",
  /// ".../esr_spread", ".../esl_spread" outside [0, 1), "dc_voltage" not finite,
  /// "voltage_tolerance" outside [0, 1], "temperature_min_c"/"temperature_max_c" not
  /// finite or reversed; band errors as FrequencyGridOptions::validate.
  void validate() const;
};

/// Builds the yield problem of a project: its network, port, target and band; one
/// VariedPart per capacitor in project.parts, with the library part's tolerance, DC-bias
/// curve and dielectric temperature model (`library` must hold the project's library
/// parts; InputError naming the part's source otherwise). An inline capacitor varies by
/// kInlineCapacitanceTolerance around its effective value, without derating spread (its
/// curves are not kept). DC voltage project.dc_voltage, voltage_tolerance the rail's
/// ripple, temperatures from min(25, T_rail) to max(25, T_rail).
YieldProblem yield_problem(const Project& project, const PartLibrary& library);
/// As above, reading project.libraries.
YieldProblem yield_problem(const Project& project);

/// Options for run_yield.
struct YieldOptions {
  /// Builds simulated, 1..kMaxYieldTrials. 2000 gives the yield to about +/-2 % (95 %
  /// Wilson half-width at p = 0.5 is 1.96 * sqrt(0.25 / 2000) = 2.2 %).
  std::size_t trials = 2000;
  /// Seed: with the same problem and options the result is identical for any thread count.
  std::uint64_t seed = 1;
  /// Worker threads; 0 = std::thread::hardware_concurrency(). At most 1024.
  unsigned threads = 0;
  /// Default ESR spread, fraction, uniform +/-. 0.2: our choice (no published spread for
  /// generic parts; REFERENCES §8 gives ESR only as ranges).
  double esr_spread = 0.2;
  /// Default ESL spread, fraction, uniform +/-. 0.1: our choice (body ESL is set by
  /// geometry, which varies less than ESR).
  double esl_spread = 0.1;
  /// Percentiles of |Z| to report per frequency, each in [0, 1] (0.05 = 5 %).
  std::vector<double> percentiles{0.05, 0.5, 0.95};
  /// Confidence level of the yield interval, in (0, 1). 0.95 (common practice).
  double confidence = 0.95;
  /// Run run_check (with peak refinement) on the worst trial and the corners.
  bool refine_worst = true;

  /// Throws InputError naming "trials" (with the limit), "threads", "esr_spread",
  /// "esl_spread", "percentiles/<i>" or "confidence".
  void validate() const;
};

/// The values one trial drew (SI; C, ESR and ESL per copy, after derating).
struct PartDraw {
  BranchId branch = 0;
  double capacitance = 0.0;  ///< F
  double esr = 0.0;          ///< ohm
  double esl = 0.0;          ///< H (body, without mounting)
};

/// One build: its operating point and its parts.
struct TrialDraw {
  /// Trial index (the corners use the trial count and count + 1).
  std::size_t trial = 0;
  /// DC voltage, V, and temperature, C.
  double dc_voltage = 0.0;
  double temperature_c = 25.0;
  /// One per YieldProblem::parts entry, same order.
  std::vector<PartDraw> parts;
};

/// How the trials were evaluated.
enum class YieldEvaluation {
  /// Every branch joins the port to ground: Y = sum of the branch admittances.
  parallel_sum,
  /// The varied parts join the port to ground; the rest of the network is reduced once to
  /// its admittance at the port (1/Z_nominal minus the nominal varied admittances).
  port_reduction,
  /// A varied part elsewhere: a nodal solve per trial (slow).
  nodal,
};

/// "parallel_sum", "port_reduction" or "nodal".
std::string to_string(YieldEvaluation evaluation);

/// A two-sided confidence interval on a proportion.
struct ProportionInterval {
  double low = 0.0;
  double high = 1.0;
};

/// Wilson score interval for `successes` out of `n` (n >= 1) at normal quantile `z`:
///   (p + z^2/2n -/+ z sqrt(p(1-p)/n + z^2/4n^2)) / (1 + z^2/n),  p = successes / n.
/// E. B. Wilson, "Probable inference, the law of succession, and statistical inference",
/// JASA 22(158), 209-212, 1927. Unlike p -/+ z sqrt(p(1-p)/n) it stays inside [0, 1] and
/// is not empty at 0 or n successes.
ProportionInterval wilson_interval(std::size_t successes, std::size_t n, double z);

/// Standard normal quantile z with P(|Z| <= z) = `confidence` (0 < confidence < 1), e.g.
/// 1.959964 for 0.95: the root of erf(z / sqrt(2)) = confidence by safeguarded Newton
/// steps on std::erf (to about 1e-14).
double two_sided_normal_quantile(double confidence);

/// A corner build: every drawn variate at the low end (-1) or the high end (+1) of its
/// range. "Low" is low in each quantity itself: low tolerance, ESR, ESL, DC voltage (so
/// less DC-bias loss) and temperature.
struct YieldCorner {
  /// "low" or "high".
  std::string name;
  TrialDraw draw;
  /// Largest |Z|/Z_t on the grid samples.
  double grid_worst_ratio = 0.0;
  /// run_check on the corner's network (peaks refined), when YieldOptions::refine_worst.
  std::optional<CheckResult> check{};
};

/// Everything a yield run found.
struct YieldResult {
  /// Trials run and how many met the target on every grid sample.
  std::size_t trials = 0;
  std::size_t passes = 0;
  /// passes / trials.
  double yield = 0.0;
  /// Wilson score interval at `confidence`.
  ProportionInterval interval{};
  double confidence = 0.95;
  /// The grid, Hz, and the target on it, ohm.
  std::vector<double> frequencies;
  RealVector target;
  /// run_check of the nominal network (refined).
  CheckResult nominal;
  /// The requested percentiles (as given) and, per percentile, |Z| per frequency, ohm.
  /// Order statistics with linear interpolation: h = (n - 1) p, x_(floor h) + (h - floor h)
  /// (x_(floor h + 1) - x_(floor h)) on the sorted trials (Hyndman & Fan 1996 definition 7).
  std::vector<double> percentiles;
  std::vector<RealVector> percentile_magnitude;
  /// Per trial, the largest |Z|/Z_t on the grid (+inf when |Z| is not finite somewhere).
  std::vector<double> trial_worst_ratio;
  /// The trial with the largest grid ratio (lowest index on ties), its draw and, with
  /// refine_worst, its run_check (whose refined ratio may exceed the grid ratio).
  std::size_t worst_trial = 0;
  TrialDraw worst_draw;
  std::optional<CheckResult> worst_check{};
  /// All-low and all-high corners.
  YieldCorner low_corner;
  YieldCorner high_corner;
  /// How trials were evaluated and on how many threads.
  YieldEvaluation evaluation = YieldEvaluation::parallel_sum;
  unsigned threads_used = 1;

  /// One line, e.g. "yield 97.3 % (1946/2000; 95 % CI 96.5-97.9 %); worst 1.12 at trial 812".
  std::string brief() const;
};

/// The draw of trial `trial` (any index, also beyond options.trials): a pure function of
/// (options.seed, trial) and the problem. Validates nothing.
TrialDraw draw_trial(const YieldProblem& problem, const YieldOptions& options, std::size_t trial);

/// The corner draw: every variate at `u` (-1 low, +1 high).
TrialDraw corner_draw(const YieldProblem& problem, const YieldOptions& options, double u);

/// The problem's network with the drawn values put in (names, nodes, mounting, counts
/// unchanged), ready for run_check or a network file.
Network trial_network(const YieldProblem& problem, const TrialDraw& draw);

/// Runs the Monte Carlo. Validates problem and options (InputError), checks the topology.
/// Each trial is judged on the grid samples only (a sharp peak between samples can be
/// missed; docs/yield.md measures how often for the examples). Trials are split over
/// threads in contiguous ranges and merged by index, so the result does not depend on
/// the thread count.
///
/// Example:
///   YieldProblem problem = yield_problem(read_project_file("rail.json"));
///   YieldResult r = run_yield(problem, {.trials = 5000, .seed = 7});
///   // r.yield, r.interval, r.percentile_magnitude[1] (the median curve)
YieldResult run_yield(const YieldProblem& problem, const YieldOptions& options = {});

}  // namespace quietrail
