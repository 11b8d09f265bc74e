// SPDX-License-Identifier: MIT
// The rail as a graph: named nodes and branches that each hold a mounted part.
// Index-based API; the topology checks use Boost.Graph inside src/network/.
#pragma once

#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "quietrail/models/element.hpp"

namespace quietrail {

using NodeId = int;
using BranchId = int;

/// A branch between two nodes holding a mounted part (element, mounting, count).
struct NetworkBranch {
  /// Unique, non-empty name (used in every message about the branch).
  std::string name;
  /// End nodes; the orientation only fixes the sign of the branch current.
  NodeId from = 0;
  NodeId to = 0;
  /// What the branch holds: element, mounting inductance and count.
  MountedPart part;
};

/// Nodes and branches. Node 0 is ground (the reference); the others are added by name.
/// Node and branch names are unique (case-sensitive) and non-empty. Error messages name
/// a branch by the field "/branches/<name>" and a node by "/nodes/<name>".
///
/// Example:
///   Network net;                                   // node 0 is "gnd"
///   const NodeId rail = net.add_node("vdd");
///   net.add_branch("C1", rail, Network::kGround, MountedPart{Capacitor{.capacitance = 1e-6}});
class Network {
 public:
  /// A network holding only the ground node, named `ground_name` (non-empty; throws
  /// InputError otherwise).
  explicit Network(std::string ground_name = "gnd");

  /// Id of the ground (reference) node.
  static constexpr NodeId kGround = 0;

  /// Adds a node; throws InputError if the name is empty or taken.
  NodeId add_node(std::string name);
  /// Node by name, adding it when absent.
  NodeId node_or_add(std::string name);
  /// Node by name, std::nullopt when absent.
  std::optional<NodeId> find_node(std::string_view name) const;
  /// Adds a branch; throws InputError for unknown node ids, from == to, a taken name, or a
  /// part that fails validation. `file` names the source in error messages.
  BranchId add_branch(std::string name, NodeId from, NodeId to, MountedPart part,
                      const std::string& file = {});
  /// Adds a branch between nodes given by name; throws InputError naming an unknown node
  /// (field "/branches/<name>/from" or ".../to"), then as add_branch above.
  BranchId add_branch(std::string name, std::string_view from, std::string_view to, MountedPart part,
                      const std::string& file = {});
  /// Branch by name, std::nullopt when absent.
  std::optional<BranchId> find_branch(std::string_view name) const;

  /// Node names indexed by NodeId (ground first).
  const std::vector<std::string>& node_names() const { return node_names_; }
  /// Branches indexed by BranchId.
  const std::vector<NetworkBranch>& branches() const { return branches_; }
  /// Nodes, ground included.
  std::size_t node_count() const { return node_names_.size(); }
  /// Branches.
  std::size_t branch_count() const { return branches_.size(); }
  /// Name of node `id`; throws std::out_of_range for an unknown id.
  const std::string& node_name(NodeId id) const { return node_names_.at(static_cast<std::size_t>(id)); }
  /// True when `id` names a node of this network (ground included).
  bool has_node(NodeId id) const { return id >= 0 && static_cast<std::size_t>(id) < node_names_.size(); }

  /// Mutable access to a branch's count (the optimiser and what-ifs change counts).
  /// Throws InputError naming the branch when `count` < 1; an unknown branch id is a bug
  /// (InternalError).
  void set_count(BranchId branch, int count);
  /// The count of every branch, in branch order.
  std::vector<int> counts() const;

 private:
  std::vector<std::string> node_names_;
  std::vector<NetworkBranch> branches_;
  std::map<std::string, NodeId, std::less<>> node_index_;
  std::map<std::string, BranchId, std::less<>> branch_index_;
};

}  // namespace quietrail
