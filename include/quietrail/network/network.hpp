// SPDX-License-Identifier: MIT
// The rail as a graph: named nodes and branches that each hold a mounted part.
// Index-based API; the topology checks use Boost.Graph inside src/network/.
#pragma once

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
  std::string name;
  NodeId from = 0;
  NodeId to = 0;
  MountedPart part;
};

/// Nodes and branches. Node 0 is ground (the reference); the others are added by name.
class Network {
 public:
  explicit Network(std::string ground_name = "gnd");

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

  const std::vector<std::string>& node_names() const { return node_names_; }
  const std::vector<NetworkBranch>& branches() const { return branches_; }
  std::size_t node_count() const { return node_names_.size(); }
  const std::string& node_name(NodeId id) const { return node_names_.at(static_cast<std::size_t>(id)); }

  /// Mutable access to a branch's count (the optimiser and what-ifs change counts).
  void set_count(BranchId branch, int count);

 private:
  std::vector<std::string> node_names_;
  std::vector<NetworkBranch> branches_;
};

}  // namespace quietrail
