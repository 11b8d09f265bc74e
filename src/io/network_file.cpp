// SPDX-License-Identifier: MIT
// Reading the JSON network file (schema in docs/network_file.md). nlohmann_json stays
// in src/io/ (shared helpers: json_support.hpp); what leaves is a Network or an InputError.
#include "quietrail/io/network_file.hpp"

#include <cmath>
#include <map>
#include <optional>

#include "io/element_json.hpp"
#include "io/json_support.hpp"
#include "quietrail/error.hpp"
#include "quietrail/models/mounting.hpp"
#include "quietrail/network/topology.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

using detail::child;
using detail::describe;
using detail::join;
using Json = detail::Json;
using Keys = detail::Keys;
using Reader = detail::JsonReader;

// ---------------------------------------------------------------- schema tables

const Keys kTopKeys{"name", "description", "port", "ground", "sweep", "branches"};
const Keys kSweepKeys{"start", "stop", "points_per_decade"};
const Keys kBranchKeys{"name", "kind", "from", "to", "count", "mounting", "note"};

// ---------------------------------------------------------------- sections

FrequencyGridOptions read_sweep(const Reader& in, const Json& root) {
  FrequencyGridOptions sweep;
  const Json* node = Reader::find(root, "sweep");
  if (!node) return sweep;
  const std::string pointer = "/sweep";
  in.require_object(*node, pointer, "the sweep band");
  in.check_keys(*node, pointer, kSweepKeys, "the sweep");
  if (auto v = in.optional_quantity(*node, pointer, "start", "Hz")) sweep.start = *v;
  if (auto v = in.optional_quantity(*node, pointer, "stop", "Hz")) sweep.stop = *v;
  if (auto v = in.optional_integer(*node, pointer, "points_per_decade")) sweep.points_per_decade = *v;
  in.within(pointer, [&] { sweep.validate(); });
  return sweep;
}

// The mounting inductance of one copy, H (0 without a "mounting" object).
double read_mounting(const Reader& in, const Json& branch, const std::string& branch_pointer) {
  const Json* node = Reader::find(branch, "mounting");
  if (!node) return 0.0;
  return detail::read_mounting_inductance(in, *node, child(branch_pointer, "mounting"));
}

void read_branches(const Reader& in, const Json& root, const std::string& port_name, NetworkFile& out) {
  const Json* list = Reader::find(root, "branches");
  if (!list) in.fail("/branches", "a list of branches (a JSON array)", "nothing: the key is missing");
  if (!list->is_array() || list->empty())
    in.fail("/branches", "a non-empty list of branches (a JSON array)", describe(*list));

  std::map<std::string, std::size_t> names;
  for (std::size_t i = 0; i < list->size(); ++i) {
    const Json& b = (*list)[i];
    const std::string p = child("/branches", i);
    in.require_object(b, p, "a branch");
    const std::string kind = in.required_string(b, p, "kind", "a branch kind: " + detail::element_kind_list());
    const Keys* kind_keys = detail::element_keys(kind);
    if (kind_keys == nullptr)
      in.fail(child(p, "kind"), "a branch kind: " + detail::element_kind_list(), "'" + kind + "'");
    Keys allowed = kBranchKeys;
    allowed.insert(allowed.end(), kind_keys->begin(), kind_keys->end());
    in.check_keys(b, p, allowed, "a " + kind + " branch");

    const std::string name = in.required_string(b, p, "name", "a branch name");
    if (const auto first = names.find(name); first != names.end())
      in.fail(child(p, "name"), "a branch name used once", "'" + name + "', also used by /branches/" +
                                                                std::to_string(first->second));
    names.emplace(name, i);

    (void)in.optional_string(b, p, "note", "a note");
    const std::string from = in.optional_string(b, p, "from", "a node name").value_or(port_name);
    const std::string to =
        in.optional_string(b, p, "to", "a node name").value_or(out.network.node_name(Network::kGround));
    if (from == to) in.fail(child(p, "to"), "a node other than \"from\" ('" + from + "')", "'" + to + "'");

    MountedPart part{detail::read_element(in, kind, b, p)};
    part.mounting_inductance = read_mounting(in, b, p);
    if (auto count = in.optional_integer(b, p, "count")) part.count = *count;
    part.validate(in.file(), p);

    const NodeId from_id = out.network.node_or_add(from);
    const NodeId to_id = out.network.node_or_add(to);
    out.network.add_branch(name, from_id, to_id, std::move(part), in.file());
    out.branch_kinds.push_back(kind);
  }
}

NetworkFile read_document(const Reader& in, const Json& root) {
  in.require_object(root, "", "a network description");
  in.check_keys(root, "", kTopKeys, "a network file");

  NetworkFile out;
  out.name = in.required_string(root, "", "name", "the network's name");
  const std::string ground = in.optional_string(root, "", "ground", "the ground node's name").value_or("gnd");
  const std::string port = in.required_string(root, "", "port", "the node where the impedance is seen");
  if (port == ground) in.fail("/port", "a node other than the ground node '" + ground + "'", "'" + port + "'");
  (void)in.optional_string(root, "", "description", "a description");
  out.sweep = read_sweep(in, root);

  out.network = Network(ground);
  read_branches(in, root, port, out);

  const auto port_id = out.network.find_node(port);
  if (!port_id) {
    std::string nodes;
    for (const auto& node : out.network.node_names()) nodes.append(nodes.empty() ? "" : ", ").append(node);
    in.fail("/port", "the name of a node a branch connects to (nodes: " + nodes + ")", "'" + port + "'");
  }
  out.port = *port_id;
  check_topology(out.network, out.port, in.file());
  return out;
}

}  // namespace

NetworkFile parse_network_json(std::string_view text, const std::string& file) {
  const Reader in(file);
  return read_document(in, detail::parse_json_text(text, file));
}

NetworkFile read_network_file(const std::filesystem::path& path) {
  return parse_network_json(detail::read_text_file(path, "a readable network file (JSON)"), path.string());
}

}  // namespace quietrail
