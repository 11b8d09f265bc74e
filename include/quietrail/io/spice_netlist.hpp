// SPDX-License-Identifier: MIT
// SPICE export of a Network: an ngspice deck that sweeps the port impedance with an AC
// analysis, so any general-purpose circuit simulator can check or extend the result.
#pragma once

#include <filesystem>
#include <string>
#include <vector>

#include "quietrail/frequency_grid.hpp"
#include "quietrail/network/network.hpp"

namespace quietrail {

/// What goes into the deck besides the circuit.
struct SpiceNetlistOptions {
  /// Title (the deck's first line, which SPICE always treats as the title). Line breaks
  /// and non-ASCII characters are replaced.
  std::string title = "quietrail network";
  /// The sweep, written as `.ac dec <points_per_decade> <start> <stop>`. ngspice steps by
  /// 10^(1/ppd) from start and ends at stop, which matches FrequencyGrid whenever
  /// ppd * log10(stop/start) is a whole number (e.g. 1 kHz..1 GHz at 50/decade).
  FrequencyGridOptions sweep;
  /// File the control block writes with `wrdata`: one line per frequency with
  /// "frequency Re(V) Im(V)" of the port voltage, which for the 1 A source is Z in ohm.
  /// Relative to ngspice's working directory. Non-empty; no whitespace, quotes or ';'
  /// (ngspice splits command words on them).
  std::string output_file = "port_impedance.txt";

  /// Throws InputError naming the offending field ("title", "output_file", or the
  /// sweep's fields).
  void validate() const;
};

/// A deck and what it could not express.
struct SpiceNetlist {
  /// The deck, ready for `ngspice -b <file>`.
  std::string text;
  /// One line per frequency-dependent term that R/L/C primitives cannot express exactly
  /// (capacitor dissipation factor, skin-effect ESR rise, plane loss tangent). Each was
  /// omitted from the deck (the rest of the branch is kept) and is also written as a
  /// "* WARNING:" comment line in the deck. Empty when the deck is exact.
  std::vector<std::string> warnings;
  /// SPICE name of the port node, e.g. "n1_vdd".
  std::string port_node;
};

/// Writes `network` as a SPICE deck that measures the impedance at `port` against ground.
///
/// Each branch becomes R/L/C primitives in series sections: capacitor ESR - (ESL +
/// mounting) - (C parallel leakage R); inductor DCR - mounting L - (L parallel core-loss R
/// parallel C_p); resistor R - (L + mounting); regulator R - (L + mounting); plane
/// R_s - (L_s + mounting) - C. Zero-valued series terms and infinite parallel resistances are
/// left out. A count N > 1 is folded into the values (R/N, L/N, N*C for every primitive),
/// which is exactly N copies in parallel. SPICE names are generated: user node i becomes
/// "n<i>_<name>", ground "0", branch k's internal nodes "b<k>_<j>" and its primitives
/// "<R|L|C><k>_<name>_<role>", where <name> keeps only [A-Za-z0-9_] (32 characters at most);
/// the original names appear in comment lines. A 1 A AC current source drives the port;
/// `.option noopac` skips the DC operating point (the circuit is linear, and nodes reached
/// only through capacitors would make it singular); `set numdgt=15` makes wrdata print 16
/// significant digits instead of 9 (checked with ngspice 39); `quit 0` ends a batch run
/// with exit status 0. No accuracy options are needed: an AC analysis of a linear circuit
/// is one direct sparse solve per frequency (no iteration tolerances apply), and on the
/// 28-branch test rail ngspice and NodalSolver agree to about 1e-13 in |Z|. Runs
/// check_topology first (throws InputError), and validates `options`.
SpiceNetlist spice_netlist(const Network& network, NodeId port, const SpiceNetlistOptions& options = {});

/// Writes spice_netlist(network, port, options).text to `path` all-or-nothing
/// (write_file_atomically) and returns the warnings. Throws InputError as spice_netlist
/// and for a file that cannot be written.
std::vector<std::string> write_spice_netlist(const std::filesystem::path& path, const Network& network,
                                             NodeId port, const SpiceNetlistOptions& options = {});

}  // namespace quietrail
