// SPDX-License-Identifier: MIT
#include "quietrail/analysis/sensitivity.hpp"

#include <algorithm>
#include <cmath>
#include <optional>
#include <variant>

#include <fmt/core.h>

#include "quietrail/error.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

const Capacitor* capacitor_of(const Network& network, BranchId id) {
  if (id < 0 || static_cast<std::size_t>(id) >= network.branch_count()) return nullptr;
  return std::get_if<Capacitor>(&network.branches()[static_cast<std::size_t>(id)].part.element);
}

// A branch name not yet in the network.
std::string fresh_name(const Network& network, const std::string& wanted) {
  std::string name = wanted;
  for (int k = 2; network.find_branch(name); ++k) name = wanted + "_" + std::to_string(k);
  return name;
}

// Rebuilds `network` with branch `id` replaced by `part` (or left out when `part` is empty),
// keeping every other branch and the node names.
Network with_branch(const Network& network, BranchId id, const std::optional<MountedPart>& part) {
  Network out(network.node_name(Network::kGround));
  for (std::size_t n = 1; n < network.node_count(); ++n) out.add_node(network.node_names()[n]);
  for (std::size_t b = 0; b < network.branch_count(); ++b) {
    const NetworkBranch& branch = network.branches()[b];
    if (static_cast<BranchId>(b) != id) {
      out.add_branch(branch.name, branch.from, branch.to, branch.part);
    } else if (part) {
      out.add_branch(branch.name, branch.from, branch.to, *part);
    }
  }
  return out;
}

}  // namespace

void SensitivityOptions::validate() const {
  require_input(std::isfinite(neighbourhood) && neighbourhood > 1.0, {"", "neighbourhood"}, "a factor > 1",
                fmt::format("{}", neighbourhood));
  require_input(mounting_factor > 0.0 && mounting_factor < 1.0, {"", "mounting_factor"}, "a factor in (0, 1)",
                fmt::format("{}", mounting_factor));
}

Sensitivity rank_changes(const Network& network, NodeId port, const TargetImpedance& target, const CheckResult& base,
                         const SensitivityOptions& options) {
  options.validate();
  Sensitivity out;
  // The worst refined ratio peak (a band-edge maximum counts too).
  const auto worst = std::max_element(base.ratio_peaks.begin(), base.ratio_peaks.end(),
                                      [](const Peak& a, const Peak& b) { return a.ratio < b.ratio; });
  out.peak_frequency = worst != base.ratio_peaks.end() ? worst->frequency : base.worst_frequency;
  out.peak_ratio = worst != base.ratio_peaks.end() ? worst->ratio : base.worst_ratio;

  CheckOptions check = options.check;
  check.branch_curves = false;
  const double low = out.peak_frequency / options.neighbourhood;
  const double high = out.peak_frequency * options.neighbourhood;
  const auto changeable = [&](BranchId id) {
    return options.changeable.empty() ||
           std::find(options.changeable.begin(), options.changeable.end(), id) != options.changeable.end();
  };
  const auto evaluate = [&](WhatIf w, const Network& changed) {
    CheckResult r;
    try {
      r = run_check(changed, port, target, check);
    } catch (const InputError&) {
      return;  // e.g. the last copy of a part that held a node to ground
    }
    w.worst_ratio = r.worst_ratio;
    w.worst_frequency = r.worst_frequency;
    w.peak_ratio = 0.0;
    for (const Peak& p : r.ratio_peaks)
      if (p.frequency >= low && p.frequency <= high && p.ratio > w.peak_ratio) {
        w.peak_ratio = p.ratio;
        w.peak_frequency = p.frequency;
      }
    if (w.peak_ratio == 0.0) {  // no maximum left near it: the largest grid sample there
      for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
        const double f = r.frequencies[i];
        const double ratio = std::abs(r.impedance[static_cast<Eigen::Index>(i)]) / r.target[static_cast<Eigen::Index>(i)];
        if (f >= low && f <= high && ratio > w.peak_ratio) {
          w.peak_ratio = ratio;
          w.peak_frequency = f;
        }
      }
    }
    out.changes.push_back(std::move(w));
  };

  // One copy more and one fewer of each capacitor branch.
  for (std::size_t b = 0; b < network.branch_count(); ++b) {
    const NetworkBranch& branch = network.branches()[b];
    const auto id = static_cast<BranchId>(b);
    if (!std::holds_alternative<Capacitor>(branch.part.element) || !changeable(id)) continue;
    MountedPart more = branch.part;
    ++more.count;
    evaluate({.kind = "add one", .change = fmt::format("one more {} ({} copies)", branch.name, more.count), .branch = id},
             with_branch(network, id, more));
    if (branch.part.count > 1) {
      MountedPart fewer = branch.part;
      --fewer.count;
      evaluate({.kind = "remove one", .change = fmt::format("one fewer {} ({} copies)", branch.name, fewer.count),
                .branch = id},
               with_branch(network, id, fewer));
    } else {
      evaluate({.kind = "remove one", .change = fmt::format("without {}", branch.name), .branch = id},
               with_branch(network, id, std::nullopt));
    }
  }

  // The anti-resonance's two sides, from the attribution of the |Z| peak nearest the worst point.
  std::optional<std::size_t> nearest;
  for (std::size_t p = 0; p < base.peaks.size() && p < base.attributions.size(); ++p)
    if (!nearest || std::abs(std::log(base.peaks[p].frequency / out.peak_frequency)) <
                        std::abs(std::log(base.peaks[*nearest].frequency / out.peak_frequency)))
      nearest = p;
  if (nearest && std::abs(std::log(base.peaks[*nearest].frequency / out.peak_frequency)) < std::log(options.neighbourhood)) {
    const PeakAttribution& a = base.attributions[*nearest];
    if (a.status == AttributionStatus::resonance && !a.inductive.empty() && !a.capacitive.empty()) {
      const BranchId ind = a.inductive.front().branch;
      const BranchId cap = a.capacitive.front().branch;
      const Capacitor* ci = capacitor_of(network, ind);
      const Capacitor* cc = capacitor_of(network, cap);
      if (ci && cc && changeable(ind) && changeable(cap)) {
        const NetworkBranch& ib = network.branches()[static_cast<std::size_t>(ind)];
        const NetworkBranch& cb = network.branches()[static_cast<std::size_t>(cap)];
        const NodeId from = cb.from, to = cb.to;
        // A group of a value between the two.
        Capacitor between;
        between.capacitance = std::sqrt(ci->capacitance * cc->capacitance);
        between.esr = std::sqrt(ci->esr * cc->esr);
        between.esl = std::sqrt(ci->esl * cc->esl);
        Network added = network;
        added.add_branch(fresh_name(network, "between"), from, to,
                         MountedPart{between, cb.part.mounting_inductance, cb.part.count});
        evaluate({.kind = "value between",
                  .change = fmt::format("{} x {} between {} and {}", cb.part.count, format_value(between.capacitance, "F"),
                                        ib.name, cb.name),
                  .branch = cap},
                 added);
        // A damping branch.
        if (std::isfinite(a.characteristic_impedance) && a.characteristic_impedance > 0.0) {
          Capacitor damper;
          damper.capacitance = cc->capacitance * cb.part.count;
          damper.esr = a.characteristic_impedance;
          damper.esl = cc->esl;
          Network damped = network;
          damped.add_branch(fresh_name(network, "damper"), from, to,
                            MountedPart{damper, cb.part.mounting_inductance, 1});
          evaluate({.kind = "damping",
                    .change = fmt::format("a damping part of {} with {} ESR beside {}",
                                          format_value(damper.capacitance, "F"), format_value(damper.esr, "ohm"),
                                          cb.name),
                    .branch = cap},
                   damped);
        }
        // Lower mounting on each side.
        for (const auto& [id, side] : {std::pair{ind, "inductive"}, std::pair{cap, "capacitive"}}) {
          const NetworkBranch& br = network.branches()[static_cast<std::size_t>(id)];
          if (!(br.part.mounting_inductance > 0.0)) continue;
          MountedPart lower = br.part;
          lower.mounting_inductance *= options.mounting_factor;
          evaluate({.kind = "lower mounting",
                    .change = fmt::format("{} mounted at {} instead of {} ({} side)", br.name,
                                          format_value(lower.mounting_inductance, "H"),
                                          format_value(br.part.mounting_inductance, "H"), side),
                    .branch = id},
                   with_branch(network, id, lower));
        }
      }
    }
  }

  std::stable_sort(out.changes.begin(), out.changes.end(), [](const WhatIf& x, const WhatIf& y) {
    if (x.peak_ratio != y.peak_ratio) return x.peak_ratio < y.peak_ratio;
    return x.worst_ratio < y.worst_ratio;
  });
  return out;
}

}  // namespace quietrail
