// SPDX-License-Identifier: MIT
// The fast path for the common case: every branch sits between the rail and ground.
#pragma once

#include <vector>

#include "quietrail/frequency_grid.hpp"
#include "quietrail/models/element.hpp"
#include "quietrail/network/network.hpp"
#include "quietrail/types.hpp"

namespace quietrail {

/// Precomputes the admittance of ONE copy of each part (element + mounting) on the grid,
/// once. The rail impedance for any counts is then 1 / sum_k count_k * Y_k(f), and changing
/// one count updates a running admittance in O(frequencies), with no re-solve.
///
/// Y_k(f) = 1 / (Z_element(f) + j*2*pi*f*L_mount) (the part's own `count` is ignored: counts
/// are passed per call). Parallel admittances add (Kirchhoff's current law); N identical
/// copies give N*Y_k, i.e. ESR/N, L/N and N*C for a series RLC (REFERENCES §2).
/// Layout: one contiguous block per part of interleaved (re, im) doubles over frequency,
/// so a count change is one real axpy of length 2 * frequencies.
class ParallelSolver {
 public:
  /// Validates every part (field "/parts/<k>"; throws InputError) and rejects ideal
  /// shorts (topology.hpp is_ideal_short), whose admittance is infinite.
  ParallelSolver(const std::vector<MountedPart>& parts, const FrequencyGrid& grid);

  /// The solver for an all-parallel network at `port`: its branches in order, so
  /// `impedance(network.counts())` is the rail impedance. Throws InputError (field
  /// "/branches") naming the first branch that does not join `port` to ground.
  static ParallelSolver for_network(const Network& network, NodeId port, const FrequencyGrid& grid);

  /// Parts, in the order given.
  std::size_t part_count() const { return parts_; }
  /// Grid points.
  std::size_t frequency_count() const { return frequencies_; }

  /// Total admittance for `counts` (one per part, >= 0), siemens per frequency.
  /// Throws InputError (field "counts") for a wrong length or a negative count.
  ComplexVector admittance(const std::vector<int>& counts) const;
  /// Impedance 1/Y for `counts`, ohm per frequency. With all counts zero the rail is open
  /// and the result is not finite. A part with exactly zero impedance at a grid frequency
  /// (lossless series resonance on a grid point) has infinite admittance there and the
  /// point is not finite either; NodalSolver handles that case. Throws as admittance().
  ComplexVector impedance(const std::vector<int>& counts) const;
  /// Adds delta * Y_part to `total` in place (incremental update for one count change).
  /// `total` must have frequency_count() entries and `part` < part_count() (else InternalError).
  void add_part(std::size_t part, int delta, ComplexVector& total) const;
  /// Admittance of one copy of `part` at grid point `i`, siemens.
  Complex unit_admittance(std::size_t part, std::size_t i) const;

 private:
  void check_counts(const std::vector<int>& counts) const;

  std::size_t parts_ = 0;
  std::size_t frequencies_ = 0;
  // unit_[2 * (part * frequencies_ + i)] = Re Y, [... + 1] = Im Y.
  std::vector<double> unit_;
};

}  // namespace quietrail
