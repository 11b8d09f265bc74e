// SPDX-License-Identifier: MIT
#include "quietrail/plan/search.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

#include "quietrail/error.hpp"

namespace quietrail {
namespace {

constexpr double kInfinity = std::numeric_limits<double>::infinity();

// Sum over frequencies of log(ratio) where ratio > 1, for total + delta * Y_k (k may be
// `none`): how far a selection is from meeting the target, smooth enough to rank moves.
constexpr std::size_t kNone = static_cast<std::size_t>(-1);

double violation(const SelectionModel& model, const AdmittanceVector& total, std::size_t k = kNone, int delta = 0) {
  double sum = 0.0;
  const double d = static_cast<double>(delta);
  for (std::size_t i = 0; i < total.size(); ++i) {
    const Complex s = k == kNone ? total[i] : total[i] + d * model.unit_admittance(k, i);
    const double r = model.ratio(i, s);
    if (!(r <= 1.0)) sum += std::isfinite(r) ? std::log(r) : 1e3;
  }
  return sum;
}

// Does total + sum of (k, delta) moves meet the target? Stops at the first violation.
struct Move {
  std::size_t k;
  int delta;
};

bool meets_with(const SelectionModel& model, const AdmittanceVector& total, std::initializer_list<Move> moves) {
  for (std::size_t i = 0; i < total.size(); ++i) {
    Complex s = total[i];
    for (const Move& m : moves) s += static_cast<double>(m.delta) * model.unit_admittance(m.k, i);
    if (!(model.ratio(i, s) <= 1.0)) return false;
  }
  return true;
}

int total_count(const std::vector<int>& counts) { return std::accumulate(counts.begin(), counts.end(), 0); }

// Can one more copy of k be placed within the limits?
bool can_add(const SearchSpec& spec, const std::vector<int>& counts, std::size_t k, int copies = 1) {
  if (counts[k] + copies > spec.max_count[k]) return false;
  if (spec.max_total && total_count(counts) + copies > *spec.max_total) return false;
  if (spec.max_area) {
    double area = 0.0;
    for (std::size_t j = 0; j < counts.size(); ++j) area += counts[j] * spec.area[j];
    if (area + copies * spec.area[k] > *spec.max_area * (1.0 + 1e-12)) return false;
  }
  return true;
}

// Adds copies greedily (most violation removed per unit weight) until the target is met
// or no copy helps. `total` follows `counts`.
void repair(const SelectionModel& model, const SearchSpec& spec, std::vector<int>& counts, AdmittanceVector& total,
            SearchCounters& counters) {
  double current = violation(model, total);
  while (current > 0.0) {
    std::size_t best = kNone;
    double best_score = 0.0;
    double best_violation = current;
    for (std::size_t k = 0; k < counts.size(); ++k) {
      if (!can_add(spec, counts, k)) continue;
      ++counters.moves;
      const double v = violation(model, total, k, 1);
      const double score = (current - v) / spec.weight[k];
      if (score > best_score) {
        best = k;
        best_score = score;
        best_violation = v;
      }
    }
    if (best == kNone) return;
    ++counts[best];
    model.add(best, 1, total);
    current = best_violation;
  }
}

// First-improvement descent: drop, swap 1-for-1, 2-for-1 and 1-for-2 while the target
// stays met and the objective falls.
void descend(const SelectionModel& model, const SearchSpec& spec, std::vector<int>& counts, AdmittanceVector& total,
             SearchCounters& counters) {
  const std::size_t n = counts.size();
  const auto lower = [](double a, double b) { return a < b - 1e-12 * std::max(1.0, std::abs(b)); };
  bool improved = true;
  while (improved) {
    improved = false;
    for (std::size_t a = 0; a < n && !improved; ++a) {
      if (counts[a] == 0) continue;
      ++counters.moves;
      if (meets_with(model, total, {{a, -1}})) {
        --counts[a];
        model.add(a, -1, total);
        improved = true;
      }
    }
    for (std::size_t a = 0; a < n && !improved; ++a) {
      if (counts[a] == 0) continue;
      for (std::size_t b = 0; b < n && !improved; ++b) {
        if (b == a) continue;
        // One of a for one of b.
        if (lower(spec.weight[b], spec.weight[a])) {
          --counts[a];
          const bool room = can_add(spec, counts, b);
          ++counts[a];
          if (room) {
            ++counters.moves;
            if (meets_with(model, total, {{a, -1}, {b, 1}})) {
              --counts[a];
              ++counts[b];
              model.add(a, -1, total);
              model.add(b, 1, total);
              improved = true;
              continue;
            }
          }
        }
        // Two of a for one of b.
        if (counts[a] >= 2 && lower(spec.weight[b], 2.0 * spec.weight[a])) {
          counts[a] -= 2;
          const bool room = can_add(spec, counts, b);
          counts[a] += 2;
          if (room) {
            ++counters.moves;
            if (meets_with(model, total, {{a, -2}, {b, 1}})) {
              counts[a] -= 2;
              ++counts[b];
              model.add(a, -2, total);
              model.add(b, 1, total);
              improved = true;
              continue;
            }
          }
        }
        // One of a for two of b.
        if (lower(2.0 * spec.weight[b], spec.weight[a])) {
          --counts[a];
          const bool room = can_add(spec, counts, b, 2);
          ++counts[a];
          if (room) {
            ++counters.moves;
            if (meets_with(model, total, {{a, -1}, {b, 2}})) {
              --counts[a];
              counts[b] += 2;
              model.add(a, -1, total);
              model.add(b, 2, total);
              improved = true;
            }
          }
        }
      }
    }
  }
}


}  // namespace

// ---------------------------------------------------------------- SearchSpec

SearchSpec SearchSpec::from_problem(const PlanProblem& problem) {
  SearchSpec spec;
  for (const PlanCandidate& c : problem.candidates) {
    switch (problem.objective) {
      case PlanObjective::cost: spec.weight.push_back(c.cost); break;
      case PlanObjective::count: spec.weight.push_back(1.0); break;
      case PlanObjective::area: spec.weight.push_back(c.area); break;
    }
    spec.max_count.push_back(c.max_count);
    spec.area.push_back(c.area);
  }
  spec.max_total = problem.limits.max_total;
  if (problem.limits.max_area) spec.max_area = *problem.limits.max_area - problem.fixed_area;
  return spec;
}

double SearchSpec::objective(const std::vector<int>& counts) const {
  QUIETRAIL_ASSERT(counts.size() == weight.size());
  double sum = 0.0;
  for (std::size_t k = 0; k < counts.size(); ++k) sum += counts[k] * weight[k];
  return sum;
}

bool SearchSpec::within_limits(const std::vector<int>& counts) const {
  if (counts.size() != max_count.size()) return false;
  double area_sum = 0.0;
  for (std::size_t k = 0; k < counts.size(); ++k) {
    if (counts[k] < 0 || counts[k] > max_count[k]) return false;
    area_sum += counts[k] * area[k];
  }
  if (max_total && total_count(counts) > *max_total) return false;
  if (max_area && area_sum > *max_area * (1.0 + 1e-12)) return false;
  return true;
}

// ---------------------------------------------------------------- SplitMix64

std::uint64_t SplitMix64::next() {
  std::uint64_t z = (state_ += 0x9e3779b97f4a7c15ULL);
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
  return z ^ (z >> 31);
}

std::uint64_t SplitMix64::below(std::uint64_t n) {
  QUIETRAIL_ASSERT(n >= 1);
  // Reject the top partial block so every residue is equally likely.
  const std::uint64_t limit = std::numeric_limits<std::uint64_t>::max() - std::numeric_limits<std::uint64_t>::max() % n;
  std::uint64_t x = next();
  while (x >= limit) x = next();
  return x % n;
}

// ---------------------------------------------------------------- heuristics

std::vector<int> greedy_construct(const SelectionModel& model, const SearchSpec& spec, SearchCounters& counters) {
  std::vector<int> counts(model.candidate_count(), 0);
  AdmittanceVector total(model.frequency_count(), Complex(0.0, 0.0));
  repair(model, spec, counts, total, counters);
  return counts;
}

std::vector<int> improve_locally(const SelectionModel& model, const SearchSpec& spec, std::vector<int> start,
                                 std::size_t rounds, SplitMix64& random, SearchCounters& counters) {
  AdmittanceVector total = model.admittance(start);
  QUIETRAIL_ASSERT(model.meets(total));
  descend(model, spec, start, total, counters);
  std::vector<int> best = start;
  double best_objective = spec.objective(best);

  for (std::size_t round = 0; round < rounds; ++round) {
    std::vector<int> counts = best;
    AdmittanceVector trial = model.admittance(counts);
    // Drop 1..3 random copies, then repair and descend.
    const int drops = 1 + static_cast<int>(random.below(3));
    for (int d = 0; d < drops; ++d) {
      const int placed = total_count(counts);
      if (placed == 0) break;
      auto pick = static_cast<int>(random.below(static_cast<std::uint64_t>(placed)));
      for (std::size_t k = 0; k < counts.size(); ++k) {
        if (pick < counts[k]) {
          --counts[k];
          model.add(k, -1, trial);
          break;
        }
        pick -= counts[k];
      }
    }
    repair(model, spec, counts, trial, counters);
    if (!model.meets(trial)) continue;
    descend(model, spec, counts, trial, counters);
    const double objective = spec.objective(counts);
    if (objective < best_objective - 1e-12 * std::max(1.0, best_objective) ||
        (objective <= best_objective && counts < best)) {
      best = counts;
      best_objective = objective;
    }
  }
  return best;
}

std::vector<int> greedy_min_ratio(const SelectionModel& model, const SearchSpec& spec, SearchCounters& counters) {
  std::vector<int> counts(model.candidate_count(), 0);
  AdmittanceVector total(model.frequency_count(), Complex(0.0, 0.0));
  // Worst ratio of total + the moves, giving up once it reaches `cutoff`.
  const auto worst_with = [&](std::initializer_list<Move> moves, double cutoff) {
    double worst = 0.0;
    for (std::size_t i = 0; i < total.size() && worst < cutoff; ++i) {
      Complex s = total[i];
      for (const Move& m : moves) s += static_cast<double>(m.delta) * model.unit_admittance(m.k, i);
      const double r = model.ratio(i, s);
      worst = std::isnan(r) ? kInfinity : std::max(worst, r);
    }
    return worst;
  };
  double current = model.worst(total).first;
  // Add the copy that lowers the worst ratio most, while one does.
  while (true) {
    std::size_t best = kNone;
    double best_ratio = current;
    for (std::size_t k = 0; k < counts.size(); ++k) {
      if (!can_add(spec, counts, k)) continue;
      ++counters.moves;
      const double worst = worst_with({{k, 1}}, best_ratio);
      if (worst < best_ratio) {
        best_ratio = worst;
        best = k;
      }
    }
    if (best == kNone) break;
    ++counts[best];
    model.add(best, 1, total);
    current = best_ratio;
  }
  // Then trade one copy for another while that lowers the worst ratio (the limits usually
  // bind by now, so adding alone is stuck).
  bool improved = true;
  while (improved) {
    improved = false;
    for (std::size_t a = 0; a < counts.size() && !improved; ++a) {
      if (counts[a] == 0) continue;
      for (std::size_t b = 0; b < counts.size() && !improved; ++b) {
        if (b == a) continue;
        --counts[a];
        const bool room = can_add(spec, counts, b);
        ++counts[a];
        if (!room) continue;
        ++counters.moves;
        const double worst = worst_with({{a, -1}, {b, 1}}, current);
        if (worst < current * (1.0 - 1e-12)) {
          --counts[a];
          ++counts[b];
          model.add(a, -1, total);
          model.add(b, 1, total);
          current = worst;
          improved = true;
        }
      }
    }
  }
  return counts;
}

// ---------------------------------------------------------------- branch and bound

namespace {

class BranchAndBound {
 public:
  BranchAndBound(const SelectionModel& model, const SearchSpec& spec, std::size_t keep, std::size_t node_limit,
                 SearchCounters& counters, const std::function<void(double, double, std::size_t)>& progress,
                 std::vector<std::size_t> order)
      : model_(model), spec_(spec), keep_(keep), node_limit_(node_limit), counters_(counters), progress_(progress),
        order_(std::move(order)) {
    const std::size_t f = model.frequency_count();
    const std::size_t depth = order_.size();
    reach_.assign((depth + 1) * f, 0.0);
    largest_.assign((depth + 1) * f, 0.0);
    efficiency_.assign((depth + 1) * f, 0.0);
    low_.assign((depth + 1) * f, kInfinity);
    high_.assign((depth + 1) * f, -kInfinity);
    for (std::size_t j = depth; j-- > 0;) {
      const std::size_t k = order_[j];
      for (std::size_t i = 0; i < f; ++i) {
        const double y = std::abs(model.unit_admittance(k, i));
        reach_[j * f + i] = reach_[(j + 1) * f + i] + spec.max_count[k] * y;
        largest_[j * f + i] = std::max(largest_[(j + 1) * f + i], y);
        efficiency_[j * f + i] = std::max(efficiency_[(j + 1) * f + i], y / spec.weight[k]);
        const double angle = std::arg(model.unit_admittance(k, i));
        low_[j * f + i] = std::min(low_[(j + 1) * f + i], angle);
        high_[j * f + i] = std::max(high_[(j + 1) * f + i], angle);
      }
    }
    edges_.resize((depth + 1) * f);
    for (std::size_t x = 0; x < edges_.size(); ++x)
      if (low_[x] <= high_[x]) edges_[x] = {std::polar(1.0, low_[x]), std::polar(1.0, high_[x])};
  }

  void offer(const std::vector<int>& counts) {
    const double objective = spec_.objective(counts);
    const auto position = std::find_if(best_.begin(), best_.end(), [&](const auto& entry) {
      return objective < entry.first || (objective == entry.first && counts < entry.second);
    });
    for (const auto& entry : best_)
      if (entry.second == counts) return;
    if (best_.size() >= keep_ && position == best_.end()) return;
    best_.insert(position, {objective, counts});
    if (best_.size() > keep_) best_.pop_back();
  }

  BranchAndBoundResult run() {
    const std::size_t f = model_.frequency_count();
    BranchAndBoundResult result;
    for (std::size_t i = 0; i < f; ++i)
      if (!model_.reachable(i)) {  // the load path alone breaks the target: nothing helps
        result.complete = true;
        result.bound = kInfinity;
        return result;
      }
    counts_.assign(model_.candidate_count(), 0);
    AdmittanceVector total(f, Complex(0.0, 0.0));
    priority_.resize(f);
    std::iota(priority_.begin(), priority_.end(), std::size_t{0});
    root_bound_ = node_bound(0, total, 0, 0, 0, kInfinity);
    level_.assign(order_.size(), AdmittanceVector(f));
    ++nodes_;
    ++counters_.nodes;
    if (root_bound_ < threshold()) expand(0, total, 0.0, 0, 0.0, root_bound_);
    for (const auto& entry : best_) result.best.push_back(entry.second);
    result.complete = !aborted_;
    const double best = best_.empty() ? kInfinity : best_.front().first;
    result.bound = aborted_ ? std::min(best, open_bound_) : best;
    return result;
  }

 private:
  double threshold() const { return best_.size() < keep_ ? kInfinity : best_.back().first; }

  // The least magnitude m of added admittance that can bring v = S_a - centre out to
  // radius rho, when every added copy's admittance lies in the sector [low, high] of
  // directions (passive parts: Re Y >= 0, so the sector is at most a half-plane). A sum of
  // such copies stays in the sector with magnitude at most the sum of theirs, and
  // |v + s|^2 = |v|^2 + |s|^2 + 2 |v| |s| cos(phi) is largest for the direction nearest v,
  // phi from v to the sector: m = -|v| cos(phi) + sqrt(rho^2 - |v|^2 sin^2(phi)).
  static double needed(Complex v, double rho, const std::pair<Complex, Complex>& sector) {
    const double length = std::sqrt(std::norm(v));
    if (length >= rho) return 0.0;
    const auto cross = [](Complex a, Complex b) { return a.real() * b.imag() - a.imag() * b.real(); };
    const auto& [low, high] = sector;
    if (length == 0.0 || (cross(low, v) >= 0.0 && cross(v, high) >= 0.0)) return rho - length;
    const Complex unit = v / length;
    const auto dot = [](Complex a, Complex b) { return a.real() * b.real() + a.imag() * b.imag(); };
    const double cos_phi = std::clamp(std::max(dot(low, unit), dot(high, unit)), -1.0, 1.0);
    const double sin2 = 1.0 - cos_phi * cos_phi;
    return -length * cos_phi + std::sqrt(std::max(0.0, rho * rho - length * length * sin2));
  }

  // A frequency that prunes moves halfway to the front of the order the bound scans in:
  // the few frequencies that decide (the anti-resonances) end up first.
  void promote(std::size_t position) const {
    std::swap(priority_[position], priority_[position / 2]);
  }

  // Lower bound on the objective still to add below depth j (+inf when no completion can
  // meet the target). Stops early once the bound exceeds `budget` (the node is pruned
  // anyway), scanning the frequencies that pruned before first.
  double node_bound(std::size_t j, const AdmittanceVector& total, std::size_t k, int copies, int placed,
                    double budget) const {
    const double added = static_cast<double>(copies);
    const std::size_t f = model_.frequency_count();
    const int left = spec_.max_total ? *spec_.max_total - placed : std::numeric_limits<int>::max();
    double bound = 0.0;
    for (std::size_t position = 0; position < f; ++position) {
      const std::size_t i = priority_[position];
      const Complex v = total[i] + added * model_.unit_admittance(k, i) - model_.centre(i);
      const double rho = model_.radius(i);
      if (std::norm(v) >= rho * rho) continue;
      const double deficit = needed(v, rho, edges_[j * f + i]);
      double reach = reach_[j * f + i];
      if (spec_.max_total) reach = std::min(reach, left * largest_[j * f + i]);
      // A relative allowance for rounding keeps the bound admissible.
      if (reach < deficit * (1.0 - 1e-9)) {
        promote(position);
        return kInfinity;
      }
      bound = std::max(bound, deficit / efficiency_[j * f + i] * (1.0 - 1e-9));
      if (bound >= budget) {
        promote(position);
        return bound;
      }
    }
    return bound;
  }

  // The last candidate in closed form: |v + n Y| >= rho is a quadratic in n,
  // q(n) = |Y|^2 n^2 + 2 Re(v conj Y) n + |v|^2 - rho^2 >= 0, which forbids only the open
  // interval between its roots. Starting from n = 0, each pass over the frequencies moves n
  // past the interval of any frequency whose q(n) < 0, until a pass moves nothing: n is then
  // the least count allowed everywhere. Each count found is still confirmed with meets()
  // before it is kept, and the search goes on from n + 1 while it could enter the K best.
  void last_level(std::size_t k, const AdmittanceVector& total, double objective, int most) {
    const std::size_t f = total.size();
    const double w = spec_.weight[k];
    AdmittanceVector& leaf = level_.back();
    int n = 0;
    while (n <= most && objective + n * w < threshold()) {
      bool moved = true;
      while (moved && n <= most) {
        moved = false;
        const double x = static_cast<double>(n);
        for (std::size_t position = 0; position < f; ++position) {
          const std::size_t i = priority_[position];
          const Complex y = model_.unit_admittance(k, i);
          const Complex v = total[i] - model_.centre(i);
          const double rho = model_.radius(i);
          const double a = std::norm(y);
          const double b = 2.0 * (v.real() * y.real() + v.imag() * y.imag());
          const double c = std::norm(v) - rho * rho;
          if ((a * x + b) * x + c >= 0.0) continue;
          // n lies between the roots: jump to the first whole count at or above the upper one
          // (shrunk a little so that a count on the edge is tried; meets() decides it).
          const double root = std::sqrt(std::max(0.0, b * b - 4.0 * a * c));
          const double high = a > 0.0 ? (-b + root) / (2.0 * a) : kInfinity;
          const double next = std::ceil(high - 1e-9 * std::max(1.0, std::abs(high)));
          n = next > static_cast<double>(most) ? most + 1 : std::max(n + 1, static_cast<int>(next));
          promote(position);
          moved = true;
          break;
        }
      }
      if (n > most || !(objective + n * w < threshold())) break;
      ++counters_.nodes;
      ++nodes_;
      const double copies = static_cast<double>(n);
      for (std::size_t i = 0; i < f; ++i) leaf[i] = total[i] + copies * model_.unit_admittance(k, i);
      counts_[k] = n;
      if (model_.meets(leaf)) offer(counts_);
      ++n;
    }
    counts_[k] = 0;
  }

  // Expands a node at depth j whose bound `lower` is already known to be below the
  // threshold. Each child's bound is computed from this node's total plus n copies on the
  // fly (stopping at the first frequency that prunes); only a child that survives gets its
  // total written out, so pruned children cost a few frequencies, not all of them.
  void expand(std::size_t j, const AdmittanceVector& total, double objective, int placed, double area, double lower) {
    if (progress_ && nodes_ >= next_progress_) {
      next_progress_ = nodes_ + kProgressEvery;
      progress_(best_.empty() ? kInfinity : best_.front().first, root_bound_, nodes_);
    }
    const std::size_t k = order_[j];
    const double w = spec_.weight[k];
    int most = spec_.max_count[k];
    if (spec_.max_total) most = std::min(most, *spec_.max_total - placed);
    if (spec_.max_area)
      most = std::min(most, static_cast<int>(std::floor((*spec_.max_area - area) / spec_.area[k] * (1.0 + 1e-12))));
    if (j + 1 == order_.size()) {
      last_level(k, total, objective, most);
      return;
    }
    // The child's admittance is rebuilt from this level's total, so no rounding drifts
    // along the tree.
    AdmittanceVector& child_total = level_[j];
    const std::size_t f = total.size();
    for (int n = 0; n <= most; ++n) {
      const double child = objective + n * w;
      if (!(child < threshold())) break;  // every larger n costs more still
      if (!aborted_ && ++nodes_ >= node_limit_) aborted_ = true;
      ++counters_.nodes;
      if (aborted_) {
        // Children n.. are left unexplored: their own bounds enter the bound on what the
        // search did not see.
        open_bound_ = std::min(open_bound_, std::max(lower, child + node_bound(j + 1, total, k, n, placed + n, kInfinity)));
        continue;
      }
      const double child_lower = child + node_bound(j + 1, total, k, n, placed + n, threshold() - child);
      if (!(child_lower < threshold())) continue;
      const double copies = static_cast<double>(n);
      for (std::size_t i = 0; i < f; ++i) child_total[i] = total[i] + copies * model_.unit_admittance(k, i);
      counts_[k] = n;
      expand(j + 1, child_total, child, placed + n, area + n * spec_.area[k], child_lower);
    }
    counts_[k] = 0;
  }

  const SelectionModel& model_;
  const SearchSpec& spec_;
  std::size_t keep_;
  std::size_t node_limit_;
  SearchCounters& counters_;
  const std::function<void(double, double, std::size_t)>& progress_;
  std::vector<std::size_t> order_;
  std::vector<double> reach_, largest_, efficiency_;  // [(depth) * F + i], suffix over order_[j..]
  std::vector<double> low_, high_;                     // sector of the suffix's admittance angles
  std::vector<std::pair<Complex, Complex>> edges_;     // its edges as unit vectors
  std::vector<int> counts_;
  std::vector<AdmittanceVector> level_;  // children's admittance, one buffer per depth
  std::vector<std::pair<double, std::vector<int>>> best_;
  std::size_t nodes_ = 0;
  bool aborted_ = false;
  double open_bound_ = kInfinity;
  double root_bound_ = 0.0;
  static constexpr std::size_t kProgressEvery = 1 << 16;  // nodes between progress calls
  std::size_t next_progress_ = kProgressEvery;
  mutable std::vector<std::size_t> priority_;  // frequency indices, those that prune first
};

}  // namespace

BranchAndBoundResult branch_and_bound(const SelectionModel& model, const SearchSpec& spec,
                                      const std::vector<std::vector<int>>& incumbents, std::size_t keep,
                                      std::size_t node_limit, SearchCounters& counters,
                                      const std::function<void(double, double, std::size_t)>& progress) {
  QUIETRAIL_ASSERT(keep >= 1 && node_limit >= 1);
  QUIETRAIL_ASSERT(spec.weight.size() == model.candidate_count());
  // Only candidates that may be placed take part; the largest capacitance first, so the
  // bulk parts that hold the low band are fixed near the root.
  std::vector<std::size_t> order;
  for (std::size_t k = 0; k < model.candidate_count(); ++k)
    if (spec.max_count[k] > 0) order.push_back(k);
  std::vector<double> capacitance(model.candidate_count(), 0.0);
  // Capacitance is not in the model; its low-frequency admittance ranks the same way.
  for (std::size_t k = 0; k < model.candidate_count(); ++k) capacitance[k] = std::abs(model.unit_admittance(k, 0));
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return capacitance[a] > capacitance[b]; });

  BranchAndBound search(model, spec, keep, node_limit, counters, progress, order);
  for (const auto& counts : incumbents)
    if (spec.within_limits(counts) && model.meets(model.admittance(counts))) search.offer(counts);
  return search.run();
}

}  // namespace quietrail
