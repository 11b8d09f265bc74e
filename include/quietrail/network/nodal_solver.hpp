// SPDX-License-Identifier: MIT
// Frequency-domain modified nodal analysis of a Network: sparse elimination of the node
// voltages with a fixed ordering, and branch-current MNA rows where that loses a pivot.
#pragma once

#include <cstddef>
#include <utility>
#include <vector>

#include "quietrail/frequency_grid.hpp"
#include "quietrail/network/network.hpp"
#include "quietrail/types.hpp"

namespace quietrail {

/// Impedance seen between `port` and ground at each grid frequency, ohm: inject 1 A at
/// the port, solve the MNA system, read the port voltage. Runs check_topology first
/// (throws InputError for a network that cannot be solved). Same as
/// NodalSolver(network, grid).solve(port).impedance.
ComplexVector solve_port_impedance(const Network& network, NodeId port, const FrequencyGrid& grid);

/// How the nodal system is set up at each frequency.
enum class NodalFormulation {
  /// Node voltages only (admittance stamps), eliminated in a fixed minimum-degree order
  /// with the port last, so Z_port = 1 / (the port's final pivot). A frequency where a
  /// pivot is lost (|pivot| < kPivotRatio * sum of |Y| of the branches at that node, or
  /// not finite, e.g. a branch with zero impedance at exactly that frequency) is solved
  /// again with `branch_currents`.
  automatic,
  /// Every branch gets a current unknown and a branch row (modified nodal analysis with
  /// all branch currents; Ho, Ruehli & Brennan, IEEE Trans. Circuits Syst. 22(6), 1975,
  /// citation from memory), solved by sparse LU with partial pivoting. The row is V_a - V_b - Z*I = 0 when
  /// |Z| <= 1 ohm and Y*(V_a - V_b) - I = 0 otherwise, so both a zero and an infinite
  /// branch impedance stay finite. Slower; used as the fallback and for cross-checks.
  branch_currents,
};

/// Options for NodalSolver.
struct NodalOptions {
  /// Default `automatic`: the fast elimination, with the robust fallback where needed.
  NodalFormulation formulation = NodalFormulation::automatic;
};

/// Impedances at one port, with how many grid points needed the branch-current fallback.
struct NodalResult {
  /// Z(f) at the port, ohm. Infinite at a frequency where the port is an ideal open
  /// circuit (singular system: lossless parallel resonance exactly on a grid point).
  ComplexVector impedance;
  /// Grid points solved with NodalFormulation::branch_currents.
  std::size_t branch_current_points = 0;
};

/// A network precomputed on a grid: every branch admittance Y_k(f) = count / (Z_element(f)
/// + j*2*pi*f*L_mount) is evaluated and stamped into the nodal admittance matrix once,
/// stored contiguously in blocks of kLanes frequencies (real and imaginary parts apart),
/// so each solve only copies and eliminates, kLanes frequencies at a time in vectorisable
/// loops. The solver keeps its own copy of the network.
class NodalSolver {
 public:
  /// Precomputes branch admittances and assembles the nodal matrix on `grid`. Throws
  /// InputError if the network has no branches (the parts were validated by add_branch).
  NodalSolver(const Network& network, const FrequencyGrid& grid, NodalOptions options = {});

  /// Port impedance against ground at every grid frequency. Runs check_topology(port)
  /// first (throws InputError), then plans the elimination for this port (minimum degree,
  /// port last). Cost per frequency: a copy of the assembled matrix and one sparse
  /// elimination whose fill is fixed by the plan. Thread-safe (const, no shared state).
  NodalResult solve(NodeId port) const;

  /// Grid points, as given to the constructor.
  std::size_t frequency_count() const { return frequencies_.size(); }
  /// Branches of the network.
  std::size_t branch_count() const { return network_.branch_count(); }

  /// Pivot threshold of the `automatic` formulation, relative to the sum of |Y| (1-norm of
  /// each complex value) of the branches at the pivot's node: a smaller pivot may have lost
  /// more than log10(1/kPivotRatio) of its 16 digits to cancellation. 1e-6 keeps results
  /// good to about 1e-10 (threshold chosen here, in the spirit of threshold pivoting).
  static constexpr double kPivotRatio = 1e-6;
  /// Frequencies processed together by the elimination (the lanes of one block).
  static constexpr std::size_t kLanes = 8;

 private:
  // 1 / (count copies of the part) at `frequency`: infinite for an exact short, zero for an
  // exact open.
  static Complex branch_admittance(const MountedPart& part, double frequency);

  Network network_;
  NodalOptions options_;
  std::vector<double> frequencies_;
  // The nodal admittance matrix, assembled once, for blocks of kLanes frequencies (the last
  // block padded with copies of the last frequency). Slots: node u's diagonal (u < nodes_),
  // then one off-diagonal per entry of edges_, then a sink for stamps at ground.
  //   stamped_[(block * pattern_slots_ + slot) * 2 * kLanes + lane]          Re, siemens
  //   stamped_[(block * pattern_slots_ + slot) * 2 * kLanes + kLanes + lane] Im
  //   scale_[(block * (nodes_ + 1) + node) * kLanes + lane]  sum of |Re|+|Im| of the
  //                                                            branch admittances at node
  std::size_t nodes_ = 0;
  std::size_t pattern_slots_ = 0;
  std::vector<std::pair<int, int>> edges_;
  std::vector<double> stamped_;
  std::vector<double> scale_;
};

}  // namespace quietrail
