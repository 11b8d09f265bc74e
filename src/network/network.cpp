// SPDX-License-Identifier: MIT
// Network construction: name bookkeeping and per-branch validation. Whole-network
// checks (connectivity, dangling branches, shorts) live in topology.cpp.
#include "quietrail/network/network.hpp"

#include <utility>

#include "quietrail/error.hpp"
#include "detail/checks.hpp"

namespace quietrail {
namespace {

std::string branch_field(std::string_view name) { return "/branches/" + std::string(name); }

}  // namespace

Network::Network(std::string ground_name) {
  require_input(!ground_name.empty(), {"", "/nodes/ground"}, "a non-empty name for the ground node",
                "an empty name");
  node_index_.emplace(ground_name, kGround);
  node_names_.push_back(std::move(ground_name));
}

NodeId Network::add_node(std::string name) {
  require_input(!name.empty(), {"", "/nodes"}, "a non-empty node name", "an empty name");
  require_input(!node_index_.contains(name), {"", "/nodes/" + name},
                "node names used once", detail::quoted(name) + " defined twice");
  const auto id = static_cast<NodeId>(node_names_.size());
  node_index_.emplace(name, id);
  node_names_.push_back(std::move(name));
  return id;
}

NodeId Network::node_or_add(std::string name) {
  if (const auto id = find_node(name)) return *id;
  return add_node(std::move(name));
}

std::optional<NodeId> Network::find_node(std::string_view name) const {
  const auto it = node_index_.find(name);
  if (it == node_index_.end()) return std::nullopt;
  return it->second;
}

std::optional<BranchId> Network::find_branch(std::string_view name) const {
  const auto it = branch_index_.find(name);
  if (it == branch_index_.end()) return std::nullopt;
  return it->second;
}

BranchId Network::add_branch(std::string name, NodeId from, NodeId to, MountedPart part,
                             const std::string& file) {
  require_input(!name.empty(), {file, "/branches"}, "a non-empty branch name", "an empty name");
  const std::string field = branch_field(name);
  require_input(!branch_index_.contains(name), {file, field}, "branch names used once",
                detail::quoted(name) + " defined twice");
  require_input(has_node(from), {file, field + "/from"}, "a node of the network",
                "node id " + std::to_string(from));
  require_input(has_node(to), {file, field + "/to"}, "a node of the network",
                "node id " + std::to_string(to));
  require_input(from != to, {file, field}, "a branch between two different nodes",
                "both ends at node " + detail::quoted(node_name(from)));
  part.validate(file, field);
  const auto id = static_cast<BranchId>(branches_.size());
  branch_index_.emplace(name, id);
  branches_.push_back(NetworkBranch{std::move(name), from, to, std::move(part)});
  return id;
}

BranchId Network::add_branch(std::string name, std::string_view from, std::string_view to,
                             MountedPart part, const std::string& file) {
  const std::string field = branch_field(name);
  const auto from_id = find_node(from);
  require_input(from_id.has_value(), {file, field + "/from"}, "the name of a node of the network",
                "unknown node " + detail::quoted(from));
  const auto to_id = find_node(to);
  require_input(to_id.has_value(), {file, field + "/to"}, "the name of a node of the network",
                "unknown node " + detail::quoted(to));
  return add_branch(std::move(name), *from_id, *to_id, std::move(part), file);
}

void Network::set_count(BranchId branch, int count) {
  QUIETRAIL_ASSERT(branch >= 0 && static_cast<std::size_t>(branch) < branches_.size());
  auto& b = branches_[static_cast<std::size_t>(branch)];
  require_input(count >= 1, {"", branch_field(b.name) + "/count"}, "a whole number of parts >= 1",
                std::to_string(count));
  b.part.count = count;
}

std::vector<int> Network::counts() const {
  std::vector<int> out;
  out.reserve(branches_.size());
  for (const auto& b : branches_) out.push_back(b.part.count);
  return out;
}

}  // namespace quietrail
