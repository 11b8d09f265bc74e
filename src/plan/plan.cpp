// SPDX-License-Identifier: MIT
#include "quietrail/plan/plan.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <functional>
#include <set>
#include <variant>

#include <fmt/core.h>

#include "detail/checks.hpp"
#include "quietrail/error.hpp"
#include "quietrail/plan/search.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

constexpr double kInfinity = std::numeric_limits<double>::infinity();

std::string candidate_field(const PlanCandidate& c, const char* field) {
  return "candidates/" + c.name + "/" + field;
}

CheckOptions check_options(const PlanProblem& problem, const PlanOptions& options) {
  CheckOptions check;
  check.grid = problem.band;
  check.refinement = options.refinement;
  check.branch_curves = true;
  return check;
}

std::vector<BranchInfo> planned_info(const PlanProblem& problem, const std::vector<int>& counts) {
  if (problem.fixed_info.empty()) return {};
  std::vector<BranchInfo> info = problem.fixed_info;
  for (std::size_t k = 0; k < counts.size(); ++k) {
    if (counts[k] == 0) continue;
    const PlanCandidate& c = problem.candidates[k];
    BranchInfo b;
    b.library_id = c.library_id;
    b.description = c.description;
    if (c.nominal_capacitance > 0.0) b.nominal_capacitance = c.nominal_capacitance;
    b.cost = c.cost;
    b.area = c.area;
    info.push_back(std::move(b));
  }
  return info;
}

CheckResult check_selection(const PlanProblem& problem, const PlanOptions& options, const std::vector<int>& counts) {
  return run_check(planned_network(problem, counts), problem.port, *problem.target, check_options(problem, options),
                   planned_info(problem, counts));
}

// Frequencies to add where `check` exceeds `limit_ratio` between the search's frequencies:
// around each breaking refined peak, a cluster spanning one grid step either side at a
// spacing of a quarter of the peak's half-power width (f/Q), so that a sharp peak cannot
// slip between the added points when the next answer shifts it a little. New points only.
std::vector<double> breaking_frequencies(const CheckResult& check, double limit_ratio,
                                         const std::vector<double>& known, const FrequencyGridOptions& band) {
  std::vector<double> wanted;
  const double step = std::pow(10.0, 1.0 / band.points_per_decade);
  const auto cluster = [&](double centre, double q) {
    wanted.push_back(centre);
    // Without a Q (a one-sided or band-edge maximum) assume a sharp one: 0.1 % spacing.
    const double spacing = std::isfinite(q) && q > 0.0 ? std::clamp(0.25 / q, 1e-4, 0.01) : 1e-3;
    for (double x = 1.0 + spacing; x < step; x *= 1.0 + spacing) {
      wanted.push_back(centre * x);
      wanted.push_back(centre / x);
    }
  };
  for (const Peak& p : check.ratio_peaks)
    if (p.ratio > limit_ratio) cluster(p.frequency, p.q);
  if (check.worst_ratio > limit_ratio) cluster(check.worst_frequency, std::nan(""));

  std::vector<double> out;
  std::sort(wanted.begin(), wanted.end());
  for (double f : wanted) {
    if (f < band.start || f > band.stop) continue;
    const double tolerance = 1e-9 * f;
    const auto it = std::lower_bound(known.begin(), known.end(), f);
    if (it != known.end() && std::abs(*it - f) <= tolerance) continue;
    if (it != known.begin() && std::abs(*(it - 1) - f) <= tolerance) continue;
    if (!out.empty() && std::abs(out.back() - f) <= tolerance) continue;
    out.push_back(f);
  }
  return out;
}

void verify(Selection& s, const CheckResult& check) {
  s.worst_ratio = check.worst_ratio;
  s.worst_frequency = check.worst_frequency;
  s.verified = true;
}

// The heuristic answer (greedy, then local search), empty when the greedy start does not
// meet the target.
std::vector<int> heuristic_answer(const SelectionModel& model, const SearchSpec& spec, const PlanOptions& options,
                                  SearchCounters& counters) {
  std::vector<int> start = greedy_construct(model, spec, counters);
  if (!model.meets(model.admittance(start))) return {};
  SplitMix64 random(options.seed);
  return improve_locally(model, spec, std::move(start), options.heuristic_rounds, random, counters);
}

// `counts` and the selections one move away from it (one copy more of a candidate; one
// copy traded for one of another) that meet the target within the limits: seeds that give
// a K-best search a finite threshold from its first node.
std::vector<std::vector<int>> neighbours(const SelectionModel& model, const SearchSpec& spec,
                                         const std::vector<int>& counts, SearchCounters& counters) {
  std::vector<std::vector<int>> out{counts};
  const auto consider = [&](std::vector<int> next) {
    if (!spec.within_limits(next)) return;
    ++counters.moves;
    if (model.meets(model.admittance(next))) out.push_back(std::move(next));
  };
  for (std::size_t b = 0; b < counts.size(); ++b) {
    std::vector<int> more = counts;
    ++more[b];
    consider(more);
    for (std::size_t a = 0; a < counts.size(); ++a) {
      if (a == b || counts[a] == 0) continue;
      std::vector<int> swapped = counts;
      --swapped[a];
      ++swapped[b];
      consider(swapped);
    }
  }
  return out;
}

// One search at `scale` times the target: heuristic to seed, then branch and bound.
struct SearchOutcome {
  BranchAndBoundResult exact;
  std::vector<int> heuristic;  // empty when the heuristic found nothing that meets the target
};

SearchOutcome search_once(const SelectionModel& model, const SearchSpec& spec, const PlanOptions& options,
                          std::size_t keep, std::size_t node_limit, SearchCounters& counters,
                          const std::vector<std::vector<int>>& seeds = {},
                          std::optional<std::vector<int>> heuristic = std::nullopt) {
  SearchOutcome out;
  out.heuristic = heuristic ? std::move(*heuristic) : heuristic_answer(model, spec, options, counters);
  // Earlier answers (a previous round's, or a neighbouring margin's) that still meet the
  // target tighten the pruning from the start.
  std::vector<std::vector<int>> incumbents = seeds;
  if (!out.heuristic.empty()) incumbents.push_back(out.heuristic);
  out.exact = branch_and_bound(model, spec, incumbents, keep, node_limit, counters, options.progress);
  return out;
}

// Contiguous runs of true in `flags`, as index ranges [first, last].
std::vector<std::pair<std::size_t, std::size_t>> runs(const std::vector<bool>& flags) {
  std::vector<std::pair<std::size_t, std::size_t>> out;
  for (std::size_t i = 0; i < flags.size(); ++i) {
    if (!flags[i]) continue;
    std::size_t j = i;
    while (j + 1 < flags.size() && flags[j + 1]) ++j;
    out.emplace_back(i, j);
    i = j;
  }
  return out;
}

// Why the target is out of reach at index i: the load path, or what limits the candidate
// that does most there at its most copies.
UnreachableBand explain(const PlanProblem& problem, const SelectionModel& model, const SearchSpec& spec,
                        std::size_t i, double floor) {
  UnreachableBand band;
  const double f = model.frequencies()[i];
  band.frequency = f;
  band.floor_ratio = floor;
  if (!model.reachable(i)) {
    band.limit = "load path";
    band.reason = fmt::format(
        "at {} the port sees {} even with the board node shorted, above the target of {}: the package and die "
        "path sets this floor, so the board's parts cannot help; add on-package or on-die capacitance or lower the "
        "package inductance",
        format_value(f, "Hz"), format_value(std::abs(model.shorted_impedance(i)), "ohm"),
        format_value(problem.target->at(f), "ohm"));
    return band;
  }
  std::size_t best = 0;
  double best_y = -1.0;
  for (std::size_t k = 0; k < model.candidate_count(); ++k) {
    const double y = spec.max_count[k] * std::abs(model.unit_admittance(k, i));
    if (y > best_y) {
      best_y = y;
      best = k;
    }
  }
  const PlanCandidate& c = problem.candidates[best];
  int n = spec.max_count[best];
  if (spec.max_total) n = std::min(n, *spec.max_total);
  // What limits the best part there: its ESR, or its net reactance (capacitive below its
  // SRF, inductive above, mounting included).
  const Complex z = 1.0 / model.unit_admittance(best, i);
  const double target = problem.target->at(f);
  const std::string where =
      fmt::format("at {} the most any selection within the limits can do leaves |Z| at {:.3g} x the target of {}; "
                  "the part that does most there, {} x {}, reaches at best |Z|/N = {} (ESR/N {}, reactance/N {})",
                  format_value(f, "Hz"), floor, format_value(target, "ohm"), n, c.name, format_value(std::abs(z) / n, "ohm"),
                  format_value(z.real() / n, "ohm"), format_value(z.imag() / n, "ohm"));
  if (std::abs(z.imag()) <= z.real()) {
    band.limit = "resistance";
    band.reason = where + ": allow more copies or choose parts with lower ESR";
  } else if (z.imag() > 0.0) {
    band.limit = "inductance";
    // The part's own ESL plus its mounting: what sets omega*L well above the SRF.
    double esl = c.part.mounting_inductance;
    if (const auto* cap = std::get_if<Capacitor>(&c.part.element)) esl += cap->esl;
    band.reason = where + fmt::format(
                              ": above its SRF the count limit times the mounted inductance ({} each, ESL plus "
                              "mounting) sets the floor omega*L/N; allow more copies, use lower-inductance mounting "
                              "or packages, or add on-package capacitance",
                              format_value(esl, "H"));
  } else {
    band.limit = "capacitance";
    band.reason = where + ": below its SRF there is not enough capacitance within the limits";
    if (f < 1e6) band.reason += " to take over from the regulator, whose impedance rises with frequency";
    band.reason += "; allow more (or larger) capacitors, or a regulator with a higher loop bandwidth";
  }
  return band;
}

Infeasibility analyse_infeasible(const PlanProblem& problem, const PlanOptions& options,
                                 const std::vector<double>& frequencies, const SearchSpec& spec, bool proven,
                                 SearchCounters& counters) {
  Infeasibility out;
  out.proven = proven;
  const double limit = margin_ratio(problem);
  const SelectionModel model(problem, frequencies);  // ratios against the target itself, no guard
  const std::size_t f = model.frequency_count();
  std::vector<double> floors(f, 0.0);
  std::vector<bool> out_of_reach(f, false);
  for (std::size_t i = 0; i < f; ++i) {
    double reach = 0.0, largest = 0.0;
    for (std::size_t k = 0; k < model.candidate_count(); ++k) {
      const double y = std::abs(model.unit_admittance(k, i));
      reach += spec.max_count[k] * y;
      if (spec.max_count[k] > 0) largest = std::max(largest, y);
    }
    if (spec.max_total) reach = std::min(reach, *spec.max_total * largest);
    floors[i] = model.reachable(i) ? model.floor_ratio(i, reach) : std::abs(model.shorted_impedance(i)) / model.limit(i);
    out_of_reach[i] = !model.reachable(i) || floors[i] > limit;
    out.ratio_lower_bound = std::max(out.ratio_lower_bound, floors[i]);
  }
  for (const auto& [first, last] : runs(out_of_reach)) {
    std::size_t worst = first;
    for (std::size_t i = first; i <= last; ++i)
      if (floors[i] > floors[worst]) worst = i;
    UnreachableBand band = explain(problem, model, spec, worst, floors[worst]);
    band.start = model.frequencies()[first];
    band.stop = model.frequencies()[last];
    out.bands.push_back(std::move(band));
  }

  // The best worst ratio within the limits: a greedy start, then bisection on the ratio
  // asked for, each step an exact search for any selection under it. A step that finds one
  // lowers the best (its refined ratio); one that proves there is none raises the bound;
  // one that stops at its node limit ends the bisection.
  std::vector<int> counts = greedy_min_ratio(model, spec, counters);
  out.best = selection_totals(problem, counts);
  verify(out.best, check_selection(problem, options, counts));
  double low = std::max(out.ratio_lower_bound, proven ? limit : 0.0);
  double high = out.best.worst_ratio;
  for (int step = 0; step < 12 && high > low * 1.01; ++step) {
    const double mid = low > 0.0 ? std::sqrt(low * high) : 0.5 * high;
    const SelectionModel scaled(problem, frequencies, mid, options.guard);
    const BranchAndBoundResult found = branch_and_bound(scaled, spec, {}, 1, options.guide_node_limit, counters);
    if (!found.best.empty()) {
      Selection s = selection_totals(problem, found.best.front());
      verify(s, check_selection(problem, options, s.counts));
      if (s.worst_ratio < out.best.worst_ratio) out.best = s;
      high = std::min(high, std::max(mid, s.worst_ratio));
      if (s.worst_ratio > mid) break;  // a peak between the search's frequencies: stop here
    } else if (found.complete) {
      low = mid;
    } else {
      break;
    }
  }
  out.ratio_lower_bound = std::max(out.ratio_lower_bound, low);
  out.best_ratio = out.best.worst_ratio;
  return out;
}

// A ratio in three digits, four near 1 (so 0.9999 does not read as exactly 1).
std::string ratio_digits(double ratio) {
  return std::abs(ratio - 1.0) < 0.005 ? fmt::format("{:.4g}", ratio) : fmt::format("{:.3g}", ratio);
}

std::string margin_phrase(const PlanProblem& problem) {
  return problem.margin_db > 0.0 ? fmt::format(" with {:.3g} dB of margin", problem.margin_db) : std::string();
}

std::string objective_text(const PlanProblem& problem, const Selection& s) {
  switch (problem.objective) {
    case PlanObjective::cost: return fmt::format("cost {:.4g} ({} parts)", s.cost, s.count);
    case PlanObjective::count: return fmt::format("{} parts (cost {:.4g})", s.count, s.cost);
    case PlanObjective::area: return fmt::format("area {:.4g} mm^2 ({} parts)", s.area * 1e6, s.count);
  }
  return {};
}

}  // namespace

std::string_view to_string(PlanObjective objective) {
  switch (objective) {
    case PlanObjective::cost: return "cost";
    case PlanObjective::count: return "count";
    case PlanObjective::area: return "area";
  }
  QUIETRAIL_ASSERT(false);
  return {};
}

std::optional<PlanObjective> parse_plan_objective(std::string_view text) {
  if (text == "cost") return PlanObjective::cost;
  if (text == "count") return PlanObjective::count;
  if (text == "area") return PlanObjective::area;
  return std::nullopt;
}

std::string_view to_string(PlanStatus status) {
  switch (status) {
    case PlanStatus::optimal: return "optimal";
    case PlanStatus::feasible: return "feasible";
    case PlanStatus::infeasible: return "infeasible";
  }
  QUIETRAIL_ASSERT(false);
  return {};
}

void PlanProblem::validate() const {
  require_input(target.has_value(), {"", "target"}, "a target impedance", "none");
  band.validate();
  target->cover_band(band.start, band.stop, "", "target");
  require_input(!candidates.empty(), {"", "candidates"}, "at least one candidate part", "none");
  require_input(std::isfinite(margin_db) && margin_db >= 0.0 && margin_db <= 40.0, {"", "margin_db"},
                "a margin from 0 to 40 dB", fmt::format("{}", margin_db));
  require_input(network.has_node(board) && board != Network::kGround, {"", "board"}, "a node of the network", "");
  require_input(network.has_node(port) && port != Network::kGround, {"", "port"}, "a node of the network", "");
  std::set<std::string> names;
  bool any = false;
  for (const PlanCandidate& c : candidates) {
    require_input(!c.name.empty(), {"", "candidates"}, "a name for every candidate", "an empty name");
    require_input(names.insert(c.name).second && !network.find_branch(c.name), {"", candidate_field(c, "name")},
                  "a name used once (candidates and the fixed network's branches)", detail::quoted(c.name));
    require_input(c.max_count >= 0, {"", candidate_field(c, "max_count")}, "a count limit >= 0",
                  std::to_string(c.max_count));
    detail::require_positive(c.cost, "", candidate_field(c, "cost"), "");
    detail::require_positive(c.area, "", candidate_field(c, "area"), "m^2");
    c.part.validate("", "candidates/" + c.name);
    any = any || c.max_count > 0;
  }
  require_input(any, {"", "candidates"}, "at least one candidate with max_count > 0", "every max_count is 0");
  if (limits.max_total)
    require_input(*limits.max_total >= 0, {"", "limits/max_total"}, "a total count limit >= 0",
                  std::to_string(*limits.max_total));
  if (limits.max_area) {
    detail::require_positive(*limits.max_area, "", "limits/max_area", "m^2");
    require_input(fixed_area <= *limits.max_area, {"", "limits/max_area"},
                  "an area limit that leaves room beyond the fixed parts (" + format_value(fixed_area, "m^2") + ")",
                  format_value(*limits.max_area, "m^2"));
  }
  if (!fixed_info.empty())
    require_input(fixed_info.size() == network.branch_count(), {"", "fixed_info"}, "one entry per fixed branch",
                  std::to_string(fixed_info.size()));
}

double margin_ratio(const PlanProblem& problem) { return std::pow(10.0, -problem.margin_db / 20.0); }

void PlanOptions::validate() const {
  require_input(alternatives >= 1 && alternatives <= 1000, {"", "alternatives"}, "1 to 1000 alternatives",
                std::to_string(alternatives));
  require_input(node_limit >= 1, {"", "node_limit"}, "a node limit >= 1", "0");
  require_input(guide_node_limit >= 1, {"", "guide_node_limit"}, "a node limit >= 1", "0");
  require_input(max_rounds >= 1, {"", "max_rounds"}, "at least one round", std::to_string(max_rounds));
  require_input(guard >= 0.0 && guard < 1e-3, {"", "guard"}, "a guard in [0, 1e-3)", fmt::format("{}", guard));
  for (double m : front_margins_db)
    require_input(std::isfinite(m) && m >= 0.0 && m <= 40.0, {"", "front_margins_db"}, "margins from 0 to 40 dB",
                  fmt::format("{}", m));
}

Network planned_network(const PlanProblem& problem, const std::vector<int>& counts) {
  QUIETRAIL_ASSERT(counts.size() == problem.candidates.size());
  Network network = problem.network;
  for (std::size_t k = 0; k < counts.size(); ++k) {
    if (counts[k] <= 0) continue;
    const PlanCandidate& c = problem.candidates[k];
    network.add_branch(c.name, problem.board, Network::kGround,
                       MountedPart{c.part.element, c.part.mounting_inductance, counts[k]});
  }
  return network;
}

Selection selection_totals(const PlanProblem& problem, const std::vector<int>& counts) {
  QUIETRAIL_ASSERT(counts.size() == problem.candidates.size());
  Selection s;
  s.counts = counts;
  for (std::size_t k = 0; k < counts.size(); ++k) {
    s.cost += counts[k] * problem.candidates[k].cost;
    s.area += counts[k] * problem.candidates[k].area;
    s.count += counts[k];
  }
  s.objective = SearchSpec::from_problem(problem).objective(counts);
  return s;
}

// A search held to `limit` (|Z|/Z_t on refined peaks) and verified: search on
// `frequencies`, check the answer with refined peaks, add the frequencies that broke it,
// repeat. `frequencies` keeps what was added (later searches start from it).
struct VerifiedSearch {
  bool verified = false;
  SearchOutcome outcome;     // the last round's search
  CheckResult check;         // the refined check of outcome.exact.best.front() when verified
  double guard = 0.0;        // the guard the last round used
  int rounds = 0;
};

VerifiedSearch search_verified(const PlanProblem& problem, const PlanOptions& options, const SearchSpec& spec,
                               double limit, std::size_t node_limit, std::vector<double>& frequencies,
                               std::vector<double>& added_frequencies, SearchCounters& counters,
                               std::vector<std::vector<int>> seeds = {}) {
  VerifiedSearch out;
  out.guard = options.guard;
  const auto holds = [limit](const CheckResult& check) { return check.worst_ratio <= limit; };
  const auto add = [&](const std::vector<double>& more) {
    for (double f : more) {
      frequencies.insert(std::lower_bound(frequencies.begin(), frequencies.end(), f), f);
      added_frequencies.push_back(f);
    }
  };
  int heuristic_rounds_left = 3;  // rounds that only check the heuristic's answer
  for (int round = 0; round < options.max_rounds; ++round) {
    out.rounds = round + 1;
    const SelectionModel model(problem, frequencies, limit, out.guard);
    // The heuristic's answer is checked first: a sharp peak it hides between grid points
    // is likely hidden by the exact answer too (both share the plane and the bulk), and
    // adding it now saves a whole exact search.
    std::vector<int> heuristic = heuristic_answer(model, spec, options, counters);
    if (!heuristic.empty() && heuristic_rounds_left > 0) {
      const CheckResult check = check_selection(problem, options, heuristic);
      const std::vector<double> added = breaking_frequencies(check, limit, frequencies, problem.band);
      if (!holds(check) && !added.empty()) {
        --heuristic_rounds_left;
        add(added);
        continue;
      }
    }
    out.outcome = search_once(model, spec, options, 1, node_limit, counters, seeds, heuristic);
    if (out.outcome.exact.best.empty()) break;
    out.check = check_selection(problem, options, out.outcome.exact.best.front());
    if (holds(out.check)) {
      out.verified = true;
      break;
    }
    seeds = out.outcome.exact.best;
    // A refined peak between the search's frequencies breaks the target: it joins them.
    const std::vector<double> added = breaking_frequencies(out.check, limit, frequencies, problem.band);
    if (added.empty()) {
      out.guard = std::min(1e-4, out.guard * 10.0 + 1e-12);  // the two evaluations disagree in the last digits
      continue;
    }
    add(added);
  }
  return out;
}

PlanResult run_plan(const PlanProblem& problem, const PlanOptions& options) {
  problem.validate();
  options.validate();
  PlanResult result;
  const SearchSpec spec = SearchSpec::from_problem(problem);
  SearchCounters counters;
  for (int m : spec.max_count) result.stats.candidates += m > 0 ? 1 : 0;

  // The answer must hold |Z|/Z_t <= limit on refined peaks (1 unless a margin is asked).
  std::vector<double> frequencies = FrequencyGrid(problem.band).frequencies();
  const double limit = margin_ratio(problem);
  const auto holds = [limit](const CheckResult& check) { return check.worst_ratio <= limit; };
  const VerifiedSearch answer_search = search_verified(problem, options, spec, limit, options.node_limit, frequencies,
                                                       result.added_frequencies, counters);
  const SearchOutcome& outcome = answer_search.outcome;
  const bool verified = answer_search.verified;
  const double guard = answer_search.guard;
  result.check = answer_search.check;
  result.stats.rounds = answer_search.rounds;
  result.stats.frequencies = frequencies.size();

  if (!verified) {
    // Nothing meets the target: say how close one gets, and why.
    const bool proven = outcome.exact.complete && outcome.exact.best.empty();
    result.status = PlanStatus::infeasible;
    result.infeasibility = analyse_infeasible(problem, options, frequencies, spec, proven, counters);
    result.best = result.infeasibility->best;
    result.bound = kInfinity;
    result.gap = kInfinity;
    result.network = planned_network(problem, result.best.counts);
    result.check = check_selection(problem, options, result.best.counts);
    result.message = fmt::format("infeasible: {} selection within the limits meets the target{}; best worst |Z|/Z_t "
                                 "{:.3g} (no selection can do better than {:.3g})",
                                 proven ? "no" : "the search found no", margin_phrase(problem),
                                 result.infeasibility->best_ratio, result.infeasibility->ratio_lower_bound);
  } else {
    const std::vector<int>& best = outcome.exact.best.front();
    result.best = selection_totals(problem, best);
    verify(result.best, result.check);
    result.network = planned_network(problem, best);
    result.status = outcome.exact.complete ? PlanStatus::optimal : PlanStatus::feasible;
    result.bound = std::min(outcome.exact.bound, result.best.objective);
    result.gap = result.best.objective > 0.0 ? (result.best.objective - result.bound) / result.best.objective : 0.0;
    if (result.status == PlanStatus::optimal) result.gap = 0.0;
    // The K best: a search of its own (pruning against the K-th best explores far more than
    // proving the optimum), seeded with the answer.
    result.alternatives.push_back(result.best);
    result.alternatives_complete = result.status == PlanStatus::optimal;
    if (options.alternatives > 1) {
      const SelectionModel model(problem, frequencies, limit, guard);
      const BranchAndBoundResult k_best =
          branch_and_bound(model, spec, neighbours(model, spec, best, counters), options.alternatives,
                           options.guide_node_limit, counters, options.progress);
      result.alternatives_complete = k_best.complete && result.status == PlanStatus::optimal;
      for (const std::vector<int>& counts : k_best.best) {
        if (counts == best) continue;
        Selection s = selection_totals(problem, counts);
        const CheckResult check = check_selection(problem, options, s.counts);
        verify(s, check);
        if (holds(check)) result.alternatives.push_back(std::move(s));
      }
    }
    // For the count and area objectives, equal answers are told apart by cost: among the
    // verified alternatives with the answer's objective, the cheapest becomes the answer.
    if (problem.objective != PlanObjective::cost) {
      const auto same = [&](const Selection& a) {
        return std::abs(a.objective - result.best.objective) <= 1e-12 * std::max(1.0, result.best.objective);
      };
      const auto cheapest = std::min_element(result.alternatives.begin(), result.alternatives.end(),
                                             [&](const Selection& a, const Selection& b) {
                                               return same(a) && (!same(b) || a.cost < b.cost);
                                             });
      if (cheapest != result.alternatives.begin() && same(*cheapest) && cheapest->cost < result.best.cost) {
        std::iter_swap(result.alternatives.begin(), cheapest);
        result.best = result.alternatives.front();
        result.network = planned_network(problem, result.best.counts);
        result.check = check_selection(problem, options, result.best.counts);
      }
    }
    result.message = fmt::format("{}: {}, worst |Z|/Z_t {} at {}", to_string(result.status),
                                 objective_text(problem, result.best), ratio_digits(result.best.worst_ratio),
                                 format_value(result.best.worst_frequency, "Hz"));
    if (problem.margin_db > 0.0) result.message += fmt::format(" ({:.3g} dB margin asked)", problem.margin_db);
    if (result.status == PlanStatus::feasible)
      result.message += fmt::format("; within {:.3g} % of the best bound", 100.0 * result.gap);

    // The front: the least objective for each margin below the target.
    FrontPoint answer;
    answer.margin_db = problem.margin_db;
    answer.selection = result.best;
    answer.achieved_margin_db = -20.0 * std::log10(result.best.worst_ratio);
    answer.proven = result.status == PlanStatus::optimal;
    answer.bound = result.bound;
    result.front.push_back(answer);
    // From the largest margin down: each answer also meets every smaller margin, so it
    // seeds the next search's pruning.
    std::vector<double> margins;
    for (double margin : options.front_margins_db)
      if (margin > problem.margin_db) margins.push_back(margin);
    std::sort(margins.begin(), margins.end(), std::greater<>());
    margins.erase(std::unique(margins.begin(), margins.end()), margins.end());
    std::vector<FrontPoint> points;
    for (double margin : margins) {
      FrontPoint point;
      point.margin_db = margin;
      std::vector<std::vector<int>> seeds;
      if (!points.empty() && points.back().selection) seeds.push_back(points.back().selection->counts);
      std::vector<double> point_frequencies = frequencies;
      std::vector<double> point_added;
      const VerifiedSearch o = search_verified(problem, options, spec, std::pow(10.0, -margin / 20.0),
                                               options.guide_node_limit, point_frequencies, point_added, counters, seeds);
      point.proven = o.outcome.exact.complete;
      point.bound = o.outcome.exact.bound;
      if (o.verified) {
        Selection s = selection_totals(problem, o.outcome.exact.best.front());
        verify(s, o.check);
        point.achieved_margin_db = -20.0 * std::log10(s.worst_ratio);
        point.selection = std::move(s);
      }
      points.push_back(std::move(point));
    }
    result.front.insert(result.front.end(), points.rbegin(), points.rend());
  }
  result.stats.nodes = counters.nodes;
  result.stats.moves = counters.moves;
  return result;
}

}  // namespace quietrail
