// SPDX-License-Identifier: MIT
// The JSON network file: a rail's branches, the port where its impedance is seen and
// the sweep band. The schema is documented with a full example in docs/network_file.md.
#pragma once

#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "quietrail/frequency_grid.hpp"
#include "quietrail/network/network.hpp"

namespace quietrail {

/// A network file after reading and validation.
struct NetworkFile {
  /// The network's name ("name"): used in reports and output file names.
  std::string name;
  /// Nodes and branches; every branch validated, the topology checked (check_topology).
  Network network;
  /// The node where the impedance is seen ("port").
  NodeId port = 0;
  /// The sweep band ("sweep"); fields left out keep the FrequencyGridOptions defaults.
  FrequencyGridOptions sweep;
  /// Per branch, in network order, the kind as written: "capacitor", "inductor", "bead",
  /// "resistor", "regulator" or "plane" (a bead and an inductor share one model).
  std::vector<std::string> branch_kinds;
};

/// Reads a network file (schema: docs/network_file.md).
///
/// Every quantity may be a JSON number in SI units or an engineering-notation string
/// read by parse_value with the field's unit ("100n", "4u7", "10MHz"); areas also take
/// "100cm^2" and "2500mm^2". Throws InputError naming the file and, where one applies,
/// the JSON pointer of the field (RFC 6901, e.g. "/branches/3/esr"), what was expected
/// and what was found:
/// - unreadable file; malformed JSON (with line and 1-based byte column);
/// - a key given twice in one object; an unknown key (the message lists the allowed
///   keys); a missing required field; a value of the wrong JSON type;
/// - a value outside its model's domain (the models' validate());
/// - a network that cannot be solved (check_topology) or a port no branch touches.
NetworkFile read_network_file(const std::filesystem::path& path);

/// As read_network_file, from JSON text in memory; `file` names the source in messages.
NetworkFile parse_network_json(std::string_view text, const std::string& file);

}  // namespace quietrail
