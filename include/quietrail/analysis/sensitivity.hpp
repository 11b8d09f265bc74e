// SPDX-License-Identifier: MIT
// What lowers the worst peak most: a set of small changes to a checked network, each
// computed (the changed network is checked again), ranked by the new height of the peak.
#pragma once

#include <string>
#include <vector>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/target.hpp"
#include "quietrail/network/network.hpp"

namespace quietrail {

/// Options for rank_changes.
struct SensitivityOptions {
  /// The peak's neighbourhood, as a frequency factor either side: a change's new peak is
  /// the largest refined |Z|/Z_t within [f / factor, f * factor] of the worst peak (the same
  /// resonance, moved). > 1. Default 2 (our choice: a change of one part moves an
  /// anti-resonance by far less than an octave).
  double neighbourhood = 2.0;
  /// Factor on a part's mounting inductance for the "lower mounting" change, in (0, 1).
  /// Default 0.5 (our choice: about what a via-in-pad or a second via pair gives).
  double mounting_factor = 0.5;
  /// How the changed networks are checked (band, refinement). branch_curves is ignored.
  CheckOptions check{};
  /// The branches whose count and mounting may change (e.g. the BOM lines, not the on-die
  /// capacitance); empty: every capacitor branch.
  std::vector<BranchId> changeable{};

  /// Throws InputError naming "neighbourhood" or "mounting_factor".
  void validate() const;
};

/// One change and what it does.
struct WhatIf {
  /// "add one", "remove one", "value between", "damping", "lower mounting".
  std::string kind;
  /// One sentence, e.g. "one more c100n (31 copies)".
  std::string change;
  /// The branch changed (for "value between" and "damping": the capacitive side's).
  BranchId branch = 0;
  /// Largest refined |Z|/Z_t near the worst peak after the change, and where, Hz.
  double peak_ratio = 0.0;
  double peak_frequency = 0.0;
  /// Worst refined |Z|/Z_t over the whole band after the change, and where, Hz: a change
  /// can lower this peak and raise another.
  double worst_ratio = 0.0;
  double worst_frequency = 0.0;
};

/// The ranking for the worst peak of a check.
struct Sensitivity {
  /// The worst refined ratio peak of the base check, and its height.
  double peak_frequency = 0.0;
  double peak_ratio = 0.0;
  /// The changes, lowest new peak first (ties by worst ratio, then by kind and change).
  std::vector<WhatIf> changes;
};

/// Ranks small changes by how far they lower the worst peak of `base` (a run_check of
/// `network` at `port` against `target`). The changes, each applied alone:
/// - one copy more of each capacitor branch, and one fewer (the branch removed at 1);
/// - for an anti-resonance whose dominant parts on both sides are capacitors (the
///   attribution of the |Z| peak nearest the worst point): a group of a value between them
///   (geometric mean of C, ESR and ESL per copy, the capacitive side's mounting and count);
///   a damping branch (a capacitor of the capacitive side's total C with ESR equal to the
///   loop's characteristic impedance Z0 = sqrt(L_loop / C_loop), the critically damped
///   value for a series R-L-C loop: any circuits text), and each side's mounting inductance
///   times options.mounting_factor.
/// Every number comes from checking the changed network (run_check), never from a formula.
/// A change that leaves the network unsolvable (a node cut off) is left out.
/// Empty `changes` when the network has no capacitor branch at the port. Throws InputError
/// for bad options.
Sensitivity rank_changes(const Network& network, NodeId port, const TargetImpedance& target,
                         const CheckResult& base, const SensitivityOptions& options = {});

}  // namespace quietrail
