// SPDX-License-Identifier: MIT
// Connectivity checks with Boost.Graph: connected components for reachability from the
// port, degree peeling for dangling branches. Boost stays inside this file.
#include "quietrail/network/topology.hpp"

#include <string_view>
#include <variant>
#include <vector>

#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/connected_components.hpp>
#include <boost/range/iterator_range.hpp>

#include "quietrail/error.hpp"
#include "detail/overloaded.hpp"
#include "detail/checks.hpp"

namespace quietrail {
namespace {

// A multigraph: parallel branches are parallel edges, so a node's degree counts branches.
// Each edge carries the index of its branch.
using Graph = boost::adjacency_list<boost::vecS, boost::vecS, boost::undirectedS, boost::no_property,
                                    std::size_t>;



std::string join(const std::vector<std::string>& items) {
  std::string out;
  for (const auto& item : items) {
    if (!out.empty()) out += "; ";
    out += item;
  }
  return out;
}

}  // namespace

bool is_ideal_short(const MountedPart& part) {
  if (part.mounting_inductance > 0.0) return false;
  return std::visit(detail::Overloaded{
                        [](const Resistor& r) { return r.resistance == 0.0 && r.series_inductance == 0.0; },
                        [](const Regulator& r) { return r.resistance == 0.0 && r.inductance == 0.0; },
                        [](const Capacitor&) { return false; },
                        [](const Inductor&) { return false; },
                        [](const PlanePair&) { return false; },
                    },
                    part.element);
}

bool is_all_parallel(const Network& network, NodeId port) {
  if (network.branches().empty() || port == Network::kGround) return false;
  for (const auto& b : network.branches()) {
    const bool forward = b.from == port && b.to == Network::kGround;
    const bool backward = b.to == port && b.from == Network::kGround;
    if (!forward && !backward) return false;
  }
  return true;
}

void check_topology(const Network& network, NodeId port, const std::string& file) {
  const InputLocation where{file, "/branches"};
  require_input(network.has_node(port), where, "a port that is a node of the network",
                "node id " + std::to_string(port));
  const std::string port_name = detail::quoted(network.node_name(port));
  require_input(port != Network::kGround, where, "a port other than the ground node",
                "port " + port_name);

  const auto& branches = network.branches();
  const std::size_t n = network.node_count();
  Graph graph(n);
  for (std::size_t k = 0; k < branches.size(); ++k)
    boost::add_edge(static_cast<std::size_t>(branches[k].from), static_cast<std::size_t>(branches[k].to), k,
                    graph);

  std::vector<std::string> problems;

  // Floating nodes: declared but never used by a branch.
  for (std::size_t v = 0; v < n; ++v)
    if (boost::degree(v, graph) == 0)
      problems.push_back("node " + detail::quoted(network.node_names()[v]) + " is floating (no branches)");

  // Reachability from the port.
  std::vector<int> component(n);
  boost::connected_components(graph, component.data());
  const int port_component = component[static_cast<std::size_t>(port)];
  if (component[Network::kGround] != port_component && boost::degree(0, graph) > 0)
    problems.push_back("ground " + detail::quoted(network.node_name(Network::kGround)) +
                       " is not connected to port " + port_name);
  std::vector<bool> reported(branches.size(), false);
  for (std::size_t k = 0; k < branches.size(); ++k) {
    const auto& b = branches[k];
    if (component[static_cast<std::size_t>(b.from)] != port_component) {
      problems.push_back("branch " + detail::quoted(b.name) + " (" + detail::quoted(network.node_name(b.from)) + " to " +
                         detail::quoted(network.node_name(b.to)) + ") is not connected to port " + port_name);
      reported[k] = true;
    }
  }

  // Dangling branches: peel nodes of degree one (other than the port and ground) until
  // none is left, so a whole chain hanging off the network is reported, not just its tip.
  std::vector<std::size_t> degree(n);
  for (std::size_t v = 0; v < n; ++v) degree[v] = boost::degree(v, graph);
  std::vector<bool> peeled(branches.size(), false);
  std::vector<std::size_t> queue;
  auto terminal = [&](std::size_t v) { return v == static_cast<std::size_t>(port) || v == Network::kGround; };
  for (std::size_t v = 0; v < n; ++v)
    if (degree[v] == 1 && !terminal(v)) queue.push_back(v);
  while (!queue.empty()) {
    const std::size_t v = queue.back();
    queue.pop_back();
    if (degree[v] != 1) continue;
    for (const auto edge : boost::make_iterator_range(boost::out_edges(v, graph))) {
      const std::size_t k = graph[edge];
      if (peeled[k]) continue;
      const std::size_t u = boost::target(edge, graph);
      peeled[k] = true;
      degree[v] -= 1;
      degree[u] -= 1;
      if (!reported[k])
        problems.push_back("branch " + detail::quoted(branches[k].name) + " dangles: node " +
                           detail::quoted(network.node_names()[v]) + " has no other branch, so it carries no current");
      if (degree[u] == 1 && !terminal(u)) queue.push_back(u);
      break;
    }
  }

  for (const auto& b : branches)
    if (is_ideal_short(b.part))
      problems.push_back("branch " + detail::quoted(b.name) +
                         " is an ideal short (zero impedance at every frequency); merge its two nodes instead");

  require_input(problems.empty(), where, "a network connected from port " + port_name + " to ground " +
                                             detail::quoted(network.node_name(Network::kGround)),
                join(problems));
}

}  // namespace quietrail
