// SPDX-License-Identifier: MIT
// Topology checks on a Network before it is solved (Boost.Graph inside).
#pragma once

#include <string>

#include "quietrail/network/network.hpp"

namespace quietrail {

/// Checks that `network` can be solved for the impedance at `port` against ground:
/// every branch lies in the connected component of the port, ground is in it, no node
/// is floating (no branches), no branch dangles (ends in a node of degree one other than
/// the port or ground, so it carries no current; a chain of such branches is reported
/// whole), and no branch is an ideal short (zero impedance at every frequency). Throws
/// one InputError (file `file`, field "/branches") whose message lists every offending
/// node and branch by name; `port` equal to ground or not a node is reported the same way.
void check_topology(const Network& network, NodeId port, const std::string& file = {});

/// True when every branch connects `port` directly to ground, so the parallel fast path
/// (parallel_solver.hpp) applies. False for a network without branches.
bool is_all_parallel(const Network& network, NodeId port);

/// True when the mounted part has zero impedance at every frequency: a resistor or a
/// regulator with zero resistance and zero inductance, mounted with zero inductance.
/// Every other element has a capacitance or inductance > 0 and so a non-zero impedance.
bool is_ideal_short(const MountedPart& part);

}  // namespace quietrail
