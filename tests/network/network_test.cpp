// SPDX-License-Identifier: MIT
// Network construction: names, ids, and input errors that name the offending node/branch.
// Behaviour tests of the documented contract in network/network.hpp (derived by inspection:
// no physical values are involved).
#include <catch2/catch.hpp>

#include "quietrail/error.hpp"
#include "quietrail/network/network.hpp"

using namespace quietrail;
using Catch::Contains;

namespace {
MountedPart ceramic() { return MountedPart{Capacitor{1e-7, 0.02, 0.5e-9}}; }
}  // namespace

TEST_CASE("ground is node 0 and named nodes get ids in order", "[network]") {
  Network net("ground");
  CHECK(net.node_name(Network::kGround) == "ground");
  CHECK(net.add_node("vdd") == 1);
  CHECK(net.node_or_add("sub") == 2);
  CHECK(net.node_or_add("vdd") == 1);
  CHECK(net.find_node("sub") == 2);
  CHECK_FALSE(net.find_node("nowhere").has_value());
  CHECK(net.node_count() == 3);
}

TEST_CASE("branches keep their parts, ends and counts", "[network]") {
  Network net;
  const NodeId vdd = net.add_node("vdd");
  MountedPart part = ceramic();
  part.count = 3;
  const BranchId c1 = net.add_branch("C1", vdd, Network::kGround, part);
  const BranchId c2 = net.add_branch("C2", "vdd", "gnd", ceramic());
  CHECK(net.branch_count() == 2);
  CHECK(net.branches()[c1].from == vdd);
  CHECK(net.branches()[c2].to == Network::kGround);
  CHECK(net.counts() == std::vector<int>{3, 1});
  net.set_count(c2, 5);
  CHECK(net.counts() == std::vector<int>{3, 5});
  CHECK(net.find_branch("C2") == c2);
}

TEST_CASE("a node name used twice is rejected by name", "[network]") {
  Network net;
  net.add_node("vdd_core");
  CHECK_THROWS_AS(net.add_node("vdd_core"), InputError);
  CHECK_THROWS_WITH(net.add_node("vdd_core"), Contains("vdd_core") && Contains("twice"));
  CHECK_THROWS_WITH(net.add_node("gnd"), Contains("gnd"));  // the ground name is taken too
  CHECK_THROWS_AS(net.add_node(""), InputError);
}

TEST_CASE("a branch name used twice is rejected by name", "[network]") {
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("C_bulk", vdd, Network::kGround, ceramic());
  CHECK_THROWS_AS(net.add_branch("C_bulk", vdd, Network::kGround, ceramic()), InputError);
  CHECK_THROWS_WITH(net.add_branch("C_bulk", vdd, Network::kGround, ceramic(), "board.json"),
                    Contains("board.json") && Contains("C_bulk") && Contains("twice"));
}

TEST_CASE("a branch to an unknown node is rejected naming node and branch", "[network]") {
  Network net;
  net.add_node("vdd");
  CHECK_THROWS_AS(net.add_branch("C7", "vdd", "vdd_io", ceramic()), InputError);
  CHECK_THROWS_WITH(net.add_branch("C7", "vdd", "vdd_io", ceramic()), Contains("vdd_io") && Contains("C7"));
  CHECK_THROWS_WITH(net.add_branch("C8", 1, 42, ceramic()), Contains("C8") && Contains("42"));
}

TEST_CASE("a branch with both ends on one node is rejected", "[network]") {
  Network net;
  net.add_node("vdd");
  CHECK_THROWS_WITH(net.add_branch("C3", "vdd", "vdd", ceramic()), Contains("C3") && Contains("vdd"));
}

TEST_CASE("an invalid part is rejected with the branch's field path", "[network]") {
  Network net;
  net.add_node("vdd");
  MountedPart bad = ceramic();
  std::get<Capacitor>(bad.element).esr = -1.0;
  CHECK_THROWS_WITH(net.add_branch("C9", "vdd", "gnd", bad, "rail.json"),
                    Contains("rail.json") && Contains("/branches/C9/esr"));
}

TEST_CASE("a count below one is rejected naming the branch", "[network]") {
  Network net;
  net.add_node("vdd");
  const BranchId c = net.add_branch("C4", "vdd", "gnd", ceramic());
  CHECK_THROWS_WITH(net.set_count(c, 0), Contains("C4") && Contains("count"));
}
