// SPDX-License-Identifier: MIT
// Topology checks: every problem is reported by name, all in one InputError.
// Expected findings are derived by hand from the connectivity of each small network, per the
// rules documented in network/topology.hpp.
#include <catch2/catch.hpp>

#include "quietrail/error.hpp"
#include "quietrail/network/topology.hpp"

using namespace quietrail;
using Catch::Contains;

namespace {

MountedPart ceramic() { return MountedPart{Capacitor{1e-7, 0.02, 0.5e-9}}; }
MountedPart trace() { return MountedPart{Resistor{1e-3, 0.2e-9}}; }

// vdd with two capacitors to ground, fed from a regulator node through a trace.
Network healthy() {
  Network net;
  net.add_node("vrm");
  net.add_node("vdd");
  net.add_branch("VRM", "vrm", "gnd", MountedPart{Regulator{1e-3, 10e-9}});
  net.add_branch("TRACE", "vrm", "vdd", trace());
  net.add_branch("C1", "vdd", "gnd", ceramic());
  net.add_branch("C2", "vdd", "gnd", ceramic());
  return net;
}

}  // namespace

TEST_CASE("a connected network with no dangling branch passes", "[network]") {
  const Network net = healthy();
  CHECK_NOTHROW(check_topology(net, *net.find_node("vdd")));
  CHECK_NOTHROW(check_topology(net, *net.find_node("vrm")));
}

TEST_CASE("a sub-network not connected to the port is reported by branch and node names", "[network]") {
  Network net = healthy();
  net.add_node("lonely_a");
  net.add_node("lonely_b");
  net.add_branch("R_loop1", "lonely_a", "lonely_b", trace());
  net.add_branch("R_loop2", "lonely_a", "lonely_b", trace());
  const NodeId vdd = *net.find_node("vdd");
  CHECK_THROWS_AS(check_topology(net, vdd), InputError);
  // R_loop1/2 form a loop between two nodes that reach neither the port nor ground.
  CHECK_THROWS_WITH(check_topology(net, vdd, "board.json"),
                    Contains("board.json") && Contains("R_loop1") && Contains("R_loop2") &&
                        Contains("'lonely_a'") && Contains("'lonely_b'") && Contains("not connected to port 'vdd'"));
}

TEST_CASE("a ground not connected to the port is reported", "[network]") {
  Network net;
  net.add_node("a");
  net.add_node("b");
  net.add_branch("R1", "a", "b", trace());
  net.add_branch("R2", "a", "b", trace());
  net.add_node("c");
  net.add_branch("C1", "c", "gnd", ceramic());
  net.add_branch("C2", "c", "gnd", ceramic());
  CHECK_THROWS_WITH(check_topology(net, *net.find_node("a")),
                    Contains("ground 'gnd' is not connected to port 'a'") && Contains("C1") && Contains("C2"));
}

TEST_CASE("a floating node is reported by name", "[network]") {
  Network net = healthy();
  net.add_node("vdd_unused");
  CHECK_THROWS_WITH(check_topology(net, *net.find_node("vdd")),
                    Contains("vdd_unused") && Contains("floating"));
}

TEST_CASE("a dangling branch and a dangling chain are reported by name", "[network]") {
  Network net = healthy();
  net.add_node("stub");
  net.add_branch("C_stub", "vdd", "stub", ceramic());  // ends in a node nothing else uses
  net.add_node("t1");
  net.add_node("t2");
  net.add_branch("T1", "vdd", "t1", trace());  // a two-branch chain hanging off vdd
  net.add_branch("T2", "t1", "t2", trace());
  const NodeId vdd = *net.find_node("vdd");
  CHECK_THROWS_WITH(check_topology(net, vdd),
                    Contains("C_stub") && Contains("'stub'") && Contains("dangles") && Contains("T1") &&
                        Contains("T2"));
}

TEST_CASE("a branch to the port or to ground only does not dangle", "[network]") {
  // The port itself may have degree one: vdd -> C1 -> gnd is the simplest rail.
  Network net;
  net.add_node("vdd");
  net.add_branch("C1", "vdd", "gnd", ceramic());
  CHECK_NOTHROW(check_topology(net, 1));
}

TEST_CASE("ideal shorts are reported by name", "[network]") {
  Network net = healthy();
  net.add_branch("R_zero", "vdd", "gnd", MountedPart{Resistor{0.0, 0.0}});
  net.add_branch("VRM_ideal", "vrm", "gnd", MountedPart{Regulator{0.0, 0.0}});
  const NodeId vdd = *net.find_node("vdd");
  CHECK_THROWS_WITH(check_topology(net, vdd),
                    Contains("R_zero") && Contains("VRM_ideal") && Contains("ideal short"));
}

TEST_CASE("a zero resistor with inductance or mounting is not an ideal short", "[network]") {
  CHECK(is_ideal_short(MountedPart{Resistor{0.0, 0.0}}));
  CHECK(is_ideal_short(MountedPart{Regulator{0.0, 0.0}}));
  CHECK_FALSE(is_ideal_short(MountedPart{Resistor{0.0, 1e-12}}));
  CHECK_FALSE(is_ideal_short(MountedPart{Resistor{0.0, 0.0}, 1e-12}));
  CHECK_FALSE(is_ideal_short(MountedPart{Regulator{1e-6, 0.0}}));
  CHECK_FALSE(is_ideal_short(ceramic()));
}

TEST_CASE("all topology problems arrive in one error", "[network]") {
  Network net = healthy();
  net.add_node("floating_node");
  net.add_node("stub");
  net.add_branch("C_stub", "vdd", "stub", ceramic());
  net.add_branch("R_short", "vdd", "gnd", MountedPart{Resistor{0.0, 0.0}});
  try {
    check_topology(net, *net.find_node("vdd"));
    FAIL("expected InputError");
  } catch (const InputError& e) {
    const std::string message = e.what();
    CHECK_THAT(message, Contains("floating_node") && Contains("C_stub") && Contains("R_short"));
  }
}

TEST_CASE("the port must be a node other than ground", "[network]") {
  const Network net = healthy();
  CHECK_THROWS_WITH(check_topology(net, Network::kGround), Contains("ground") && Contains("port"));
  CHECK_THROWS_WITH(check_topology(net, 17), Contains("17"));
}

TEST_CASE("all-parallel means every branch joins the port to ground", "[network]") {
  Network net;
  net.add_node("vdd");
  net.add_branch("C1", "vdd", "gnd", ceramic());
  net.add_branch("C2", "gnd", "vdd", ceramic());  // either orientation
  CHECK(is_all_parallel(net, 1));
  CHECK_FALSE(is_all_parallel(healthy(), 2));
  CHECK_FALSE(is_all_parallel(Network{}, 1));
}
