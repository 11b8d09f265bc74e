// SPDX-License-Identifier: MIT
// Peak attribution against the two-branch closed form of REFERENCES section 3 and the
// bead-capacitor resonance of REFERENCES section 11.
#include <catch2/catch.hpp>

#include <cmath>

#include "quietrail/analysis/attribution.hpp"
#include "quietrail/analysis/check.hpp"
#include "quietrail/error.hpp"
#include "quietrail/network/network.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::AttributionStatus;
using quietrail::Capacitor;
using quietrail::MountedPart;
using quietrail::Network;
using quietrail::NodeId;

namespace {

constexpr double kTwoPi = 2.0 * 3.14159265358979323846;
// Central-difference fit (step 1e-4): truncation ~1e-8, so 1e-6 leaves margin.
constexpr double kFit = 1e-6;
constexpr double kPrinted = 1e-3;  // REFERENCES values printed to 4 significant figures

}  // namespace

TEST_CASE("the two-branch anti-resonance is formed by the bulk's inductive tail and the small capacitor",
          "[analysis]") {
  // REFERENCES section 3: 10 uF / 1 nH / 5 mohm against 100 nF / 1 nH / 5 mohm. The loop is
  // L1 + L2 = 2 nH with Cs = C1 C2 / (C1 + C2) = 99.01 nF, f_ar = 11.310 MHz.
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("bulk_10u", vdd, Network::kGround, MountedPart{Capacitor{.capacitance = 10e-6, .esr = 5e-3, .esl = 1e-9}});
  net.add_branch("mlcc_100n", vdd, Network::kGround,
                 MountedPart{Capacitor{.capacitance = 100e-9, .esr = 5e-3, .esl = 0.6e-9}, 0.4e-9});
  const double f_peak = 11.282e6;  // REFERENCES section 3 swept maximum
  const auto a = quietrail::attribute_peak(net, vdd, f_peak, quietrail::port_impedance_function(net, vdd));
  REQUIRE(a.status == AttributionStatus::resonance);
  CHECK(a.all_parallel);
  REQUIRE(a.inductive.size() == 1);
  REQUIRE(a.capacitive.size() == 1);
  CHECK(a.inductive[0].name == "bulk_10u");
  CHECK(a.capacitive[0].name == "mlcc_100n");
  CHECK_THAT(a.explanation, Contains("inductive tail of bulk_10u") && Contains("capacitive side of mlcc_100n"));
  // SRFs in the sentence: 1/(2 pi sqrt(LC)) = 1.592 MHz and 15.92 MHz (REFERENCES section 3).
  CHECK_THAT(a.explanation, Contains("1.592 MHz") && Contains("15.92 MHz"));

  const double cs = 10e-6 * 100e-9 / (10e-6 + 100e-9);
  CHECK_THAT(a.inductive_side_inductance, WithinRel(1e-9, kFit));
  CHECK_THAT(a.inductive_side_capacitance, WithinRel(10e-6, kFit));
  CHECK_THAT(a.capacitive_side_inductance, WithinRel(1e-9, kFit));
  CHECK_THAT(a.capacitive_side_capacitance, WithinRel(100e-9, kFit));
  CHECK_THAT(a.loop_inductance, WithinRel(2e-9, kFit));
  CHECK_THAT(a.loop_capacitance, WithinRel(cs, kFit));
  CHECK_THAT(a.loop_frequency, WithinRel(11.310e6, kPrinted));
  CHECK_THAT(a.loop_resistance, WithinRel(10e-3, kFit));  // R1 + R2
  const double z0 = std::sqrt(2e-9 / cs);
  CHECK_THAT(a.characteristic_impedance, WithinRel(z0, kFit));
  CHECK_THAT(a.loop_q, WithinRel(z0 / 10e-3, kFit));
  // Critical damping of a series RLC loop: R = 2 sqrt(L/C) (any circuits text).
  CHECK_THAT(a.damping_resistance, WithinRel(2.0 * z0, kFit));
  // A capacitor with the small part's 1 nH mounted inductance resonating at f_peak:
  // C = 1 / ((2 pi f)^2 L) (REFERENCES section 2, SRF formula).
  CHECK_THAT(a.srf_fill_capacitance, WithinRel(1.0 / std::pow(kTwoPi * f_peak, 2) / 1e-9, 1e-12));
  CHECK(a.loop_fit_valid);
  CHECK_THAT(a.remedy, Contains("damp it") && Contains("bulk_10u"));

  // The same pair seen as a maximum on a band edge at 8 MHz: the sentence names the loop's
  // own resonance, f_ar = 11.310 MHz (REFERENCES section 3), and offers no part to fill 8 MHz.
  quietrail::Peak edge;
  edge.frequency = 8e6;
  edge.at_band_edge = true;
  const auto e = quietrail::attribute_peak(net, vdd, edge, quietrail::port_impedance_function(net, vdd));
  CHECK_THAT(e.explanation, Contains("band edge") && Contains("resonates at 11.31 MHz"));
  CHECK(std::isnan(e.srf_fill_capacitance));
  CHECK_THAT(e.remedy, !Contains("add about"));
}

TEST_CASE("a bead feeding a capacitor resonates with the network behind the bead", "[analysis]") {
  // REFERENCES section 11: L = 1 uH (R_dc 0.1 ohm) feeding C = 10 uF (ESR 5 mohm):
  // f0 = 50.33 kHz, Z0 = 0.3162 ohm. The regulator (1 mohm) sits behind the bead.
  Network net;
  const NodeId in = net.add_node("vin");
  const NodeId out = net.add_node("vout");
  net.add_branch("vrm", in, Network::kGround, MountedPart{quietrail::Regulator{.resistance = 1e-3}});
  net.add_branch("bead", in, out, MountedPart{quietrail::Inductor{.inductance = 1e-6, .dc_resistance = 0.1}});
  net.add_branch("c_out", out, Network::kGround, MountedPart{Capacitor{.capacitance = 10e-6, .esr = 5e-3}});
  const auto a = quietrail::attribute_peak(net, out, 50e3, quietrail::port_impedance_function(net, out));
  REQUIRE(a.status == AttributionStatus::resonance);
  CHECK_FALSE(a.all_parallel);
  REQUIRE(a.inductive.size() == 1);
  CHECK(a.inductive[0].branch == quietrail::kRestOfNetwork);
  CHECK(a.inductive[0].name == "network behind bead");
  CHECK(a.capacitive[0].name == "c_out");
  CHECK_THAT(a.loop_inductance, WithinRel(1e-6, kFit));
  CHECK_THAT(a.loop_capacitance, WithinRel(10e-6, kFit));
  CHECK_THAT(a.loop_frequency, WithinRel(50.33e3, kPrinted));
  CHECK_THAT(a.characteristic_impedance, WithinRel(0.3162, kPrinted));
  // R_loop = R_dc + R_vrm + ESR (series loop of the three, closed form).
  CHECK_THAT(a.loop_resistance, WithinRel(0.106, kFit));
  CHECK_THAT(a.explanation, Contains("network behind bead"));
}

TEST_CASE("a lossy inductive side is fitted as its lossless reactance", "[analysis]") {
  // Regulator (0.2 mohm, 398 pH) in parallel with the inductive tail of a bulk bank (8 x
  // 820 uF, 7 mohm, 3 nH) against 24 x 22 uF: at 375 kHz the two inductive members have
  // resistance comparable to their reactance, so the exact side reactance gives C < 0 and
  // the fit falls back to pure reactances. Closed form of that lossless side (circuit
  // theory): X = 1 / (1/X_r + 1/X_b), X_r = w L_r, X_b = w L_b - 1/(w C_b), and
  // dX/dw = X^2 (1/(w^2 L_r) + (L_b + 1/(w^2 C_b)) / X_b^2); then L = (X/w + X')/2,
  // 1/(w^2 C) = (X' - X/w)/2 (attribution.hpp).
  const double lr = 398e-12, lb = 3e-9 / 8.0, cb = 820e-6 * 8.0;
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("vrm", vdd, Network::kGround, MountedPart{quietrail::Regulator{.resistance = 0.2e-3, .inductance = lr}});
  net.add_branch("bulk", vdd, Network::kGround,
                 MountedPart{Capacitor{.capacitance = 820e-6, .esr = 7e-3, .esl = 3e-9}, 0.0, 8});
  net.add_branch("c22u", vdd, Network::kGround,
                 MountedPart{Capacitor{.capacitance = 18.9e-6, .esr = 3.53e-3, .esl = 0.75e-9}, 0.5e-9, 24});
  const double f = 375e3;
  const auto a = quietrail::attribute_peak(net, vdd, f, quietrail::port_impedance_function(net, vdd));
  REQUIRE(a.status == AttributionStatus::resonance);
  REQUIRE(a.inductive.size() == 2);
  CHECK(a.loop_fit_valid);
  const double w = kTwoPi * f;
  const double xr = w * lr;
  const double xb = w * lb - 1.0 / (w * cb);
  const double x = 1.0 / (1.0 / xr + 1.0 / xb);
  const double slope = x * x * (1.0 / (w * w * lr) + (lb + 1.0 / (w * w * cb)) / (xb * xb));
  CHECK_THAT(a.inductive_side_inductance, WithinRel(0.5 * (x / w + slope), kFit));
  CHECK_THAT(a.inductive_side_capacitance, WithinRel(1.0 / (w * w * 0.5 * (slope - x / w)), kFit));
}

TEST_CASE("a maximum on an inductive slope has no cancelling pair", "[analysis]") {
  // Above both SRFs every branch is inductive (Im Y < 0): nothing resonates there.
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("a", vdd, Network::kGround, MountedPart{Capacitor{.capacitance = 1e-6, .esr = 5e-3, .esl = 1e-9}});
  net.add_branch("b", vdd, Network::kGround, MountedPart{Capacitor{.capacitance = 1e-6, .esr = 5e-3, .esl = 1e-9}});
  const auto a = quietrail::attribute_peak(net, vdd, 1e9, quietrail::port_impedance_function(net, vdd));
  CHECK(a.status == AttributionStatus::one_sided);
  CHECK(a.capacitive.empty());
  CHECK(a.inductive.size() == 2);  // identical halves: each carries 50 % < 80 %
  CHECK(std::isnan(a.loop_q));
  CHECK_THAT(a.explanation, Contains("no anti-resonance") && Contains("inductive"));
}

TEST_CASE("attribution rejects a bad port and bad options", "[analysis]") {
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("a", vdd, Network::kGround, MountedPart{Capacitor{.capacitance = 1e-6}});
  const auto z = quietrail::port_impedance_function(net, vdd);
  CHECK_THROWS_AS(quietrail::attribute_peak(net, Network::kGround, 1e6, z), quietrail::InputError);
  CHECK_THROWS_WITH(quietrail::attribute_peak(net, vdd, 1e6, z, {.dominant_share = 0.0}),
                    Contains("dominant_share"));
  CHECK_THROWS_WITH(quietrail::attribute_peak(net, vdd, 1e6, z, {.derivative_step = 1.0}),
                    Contains("derivative_step"));
}
