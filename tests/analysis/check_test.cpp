// SPDX-License-Identifier: MIT
// The check job on small networks with closed-form answers (REFERENCES sections 2 and 3),
// through both the parallel fast path and the nodal solver.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>

#include "quietrail/analysis/check.hpp"
#include "quietrail/error.hpp"
#include "quietrail/network/network.hpp"
#include "support/input_error.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::StartsWith;
using Catch::Matchers::WithinRel;
using quietrail::BranchInfo;
using quietrail::Capacitor;
using quietrail::CheckOptions;
using quietrail::CheckStatus;
using quietrail::Complex;
using quietrail::MountedPart;
using quietrail::Network;
using quietrail::NodeId;
using quietrail::TargetImpedance;

using quietrail::test::input_error_of;

namespace {

constexpr double kTwoPi = 2.0 * 3.14159265358979323846;
constexpr double kPrinted = 1e-3;  // REFERENCES values printed to 4-5 significant figures
constexpr double kRefined = 1e-6;  // band edges and refined maxima against closed forms

Complex series_rlc(double f, double c, double l, double r) {
  const double w = kTwoPi * f;
  return {r, w * l - 1.0 / (w * c)};
}

// REFERENCES section 3 example, either as two port-ground branches (parallel fast path) or
// with the bulk's 1 nH as a separate branch below it (same circuit, nodal solver).
Network two_branch_network(bool nodal, NodeId& port) {
  Network net;
  port = net.add_node("vdd");
  if (nodal) {
    const NodeId mid = net.add_node("mid");
    net.add_branch("bulk", port, mid, MountedPart{Capacitor{.capacitance = 10e-6, .esr = 5e-3}});
    net.add_branch("bulk_loop", mid, Network::kGround,
                   MountedPart{quietrail::Resistor{.resistance = 0.0, .series_inductance = 1e-9}});
  } else {
    net.add_branch("bulk", port, Network::kGround,
                   MountedPart{Capacitor{.capacitance = 10e-6, .esr = 5e-3, .esl = 1e-9}});
  }
  net.add_branch("mlcc", port, Network::kGround, MountedPart{Capacitor{.capacitance = 100e-9, .esr = 5e-3, .esl = 1e-9}});
  return net;
}

Complex two_branch(double f) {
  const Complex z1 = series_rlc(f, 10e-6, 1e-9, 5e-3);
  const Complex z2 = series_rlc(f, 100e-9, 1e-9, 5e-3);
  return z1 * z2 / (z1 + z2);
}


}  // namespace

TEST_CASE("a check fails on the refined anti-resonance that a coarse grid underestimates", "[analysis]") {
  const bool nodal = GENERATE(false, true);
  CAPTURE(nodal);
  NodeId port = 0;
  const Network net = two_branch_network(nodal, port);
  CheckOptions options;
  // 1..50 MHz at 10/decade: samples at 10 and 12.59 MHz around the peak; |Z| stays under
  // 0.3 ohm at the band edges (15.8 mohm at 1 MHz, 0.15 ohm at 50 MHz).
  options.grid = {.start = 1e6, .stop = 50e6, .points_per_decade = 10};
  const auto r = quietrail::run_check(net, port, TargetImpedance::flat(0.3), options);
  CHECK(r.all_parallel == !nodal);
  CHECK(r.status == CheckStatus::fail);
  // REFERENCES section 3: swept maximum 0.48889 ohm at 11.282 MHz.
  CHECK_THAT(r.worst_ratio, WithinRel(0.48889 / 0.3, kPrinted));
  CHECK_THAT(r.worst_frequency, WithinRel(11.282e6, kPrinted));
  CHECK_THAT(r.worst_ratio_db, WithinRel(20.0 * std::log10(0.48889 / 0.3), kPrinted));
  CHECK_THAT(r.worst_magnitude, WithinRel(std::abs(two_branch(r.worst_frequency)), 1e-9));
  // The raw grid never reaches the target (0.162 ohm at 10 MHz is its highest sample
  // near the peak): only refinement finds the failure.
  for (Eigen::Index i = 0; i < r.impedance.size(); ++i) CHECK(std::abs(r.impedance[i]) < 0.3);
  // One band, its edges where the closed form crosses 0.3 ohm.
  REQUIRE(r.exceeded.size() == 1);
  CHECK_THAT(std::abs(two_branch(r.exceeded[0].start)), WithinRel(0.3, kRefined));
  CHECK_THAT(std::abs(two_branch(r.exceeded[0].stop)), WithinRel(0.3, kRefined));
  CHECK(r.exceeded[0].start < 11.282e6);
  CHECK(r.exceeded[0].stop > 11.282e6);
  // The peak table holds the anti-resonance, attributed to the two parts.
  const quietrail::Peak* peak = nullptr;
  std::size_t index = 0;
  for (std::size_t i = 0; i < r.peaks.size(); ++i)
    if (r.peaks[i].frequency > 10e6 && r.peaks[i].frequency < 12.6e6) {
      peak = &r.peaks[i];
      index = i;
    }
  REQUIRE(peak != nullptr);
  REQUIRE(r.attributions.size() == r.peaks.size());
  CHECK_THAT(peak->magnitude, WithinRel(0.48889, kPrinted));
  const auto& a = r.attributions[index];
  CHECK(a.status == quietrail::AttributionStatus::resonance);
  // Loop L1 + L2 = 2 nH and Cs = 99.01 nF (REFERENCES section 3).
  CHECK_THAT(a.loop_inductance, WithinRel(2e-9, kRefined));
  CHECK_THAT(a.loop_capacitance, WithinRel(10e-6 * 100e-9 / 10.1e-6, kRefined));
  CHECK_THAT(a.explanation, Contains("mlcc"));
  CHECK_THAT(r.message, Contains("exceeds the target"));
  CHECK_THAT(r.brief(), StartsWith("fail"));
  CHECK(r.evaluations_used > 0);
  // 16.99 steps: 17 intervals, 18 points (the rule in frequency_grid.hpp).
  CHECK(r.grid_points_requested == 18);
}

TEST_CASE("a single capacitor fails exactly where its |Z| exceeds a flat target", "[analysis]") {
  // Series RLC 100 nF / 0.5 nH / 20 mohm (REFERENCES section 2) against 50 mohm. |Z| = Z_t
  // at wL - 1/(wC) = -+X_t, X_t = sqrt(Z_t^2 - R^2): w = (-+X_t + sqrt(X_t^2 + 4L/C)) / (2L).
  const double c = 100e-9, l = 0.5e-9, r = 20e-3, zt = 50e-3;
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("c1", vdd, Network::kGround, MountedPart{Capacitor{.capacitance = c, .esr = r, .esl = l}});
  const auto result = quietrail::run_check(net, vdd, TargetImpedance::flat(zt));
  const double xt = std::sqrt(zt * zt - r * r);
  const double f_lo = (-xt + std::sqrt(xt * xt + 4.0 * l / c)) / (2.0 * l) / kTwoPi;
  const double f_hi = (xt + std::sqrt(xt * xt + 4.0 * l / c)) / (2.0 * l) / kTwoPi;
  CHECK(result.status == CheckStatus::fail);
  REQUIRE(result.exceeded.size() == 2);
  CHECK(result.exceeded[0].start == 1e3);
  CHECK_THAT(result.exceeded[0].stop, WithinRel(f_lo, kRefined));
  CHECK_THAT(result.exceeded[1].start, WithinRel(f_hi, kRefined));
  CHECK(result.exceeded[1].stop == 1e9);
  // The worst ratio is at 1 kHz, |Z(1 kHz)| / Z_t by the same closed form.
  CHECK_THAT(result.worst_ratio, WithinRel(std::abs(series_rlc(1e3, c, l, r)) / zt, 1e-12));
}

TEST_CASE("a capacitor that stays under the target passes with its margin", "[analysis]") {
  // REFERENCES section 2: |Z(1 MHz)| = 1.5885 ohm, |Z(100 MHz)| = 0.2989 ohm for
  // 100 nF / 0.5 nH / 20 mohm. Over 1..100 MHz the largest |Z| is at 1 MHz.
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("c1", vdd, Network::kGround, MountedPart{Capacitor{.capacitance = 100e-9, .esr = 20e-3, .esl = 0.5e-9}});
  CheckOptions options;
  options.grid = {.start = 1e6, .stop = 100e6, .points_per_decade = 50};
  const auto r = quietrail::run_check(net, vdd, TargetImpedance::flat(2.0), options);
  CHECK(r.status == CheckStatus::pass);
  CHECK(r.exceeded.empty());
  CHECK_THAT(r.worst_ratio, WithinRel(1.5885 / 2.0, kPrinted));
  CHECK(r.worst_frequency == 1e6);
  CHECK(r.worst_ratio_db < 0.0);
  CHECK_THAT(r.message, Contains("meets the target"));
  CHECK_THAT(r.brief(), StartsWith("pass"));
}

TEST_CASE("the part table carries SRF with mounting, the capacitive band and totals", "[analysis]") {
  // REFERENCES section 2: 100 nF with 0.4 nH body + 0.2 nH mounting -> SRF 20.547 MHz. The
  // capacitive band ends where wL - 1/(wC) = -R: w = (-R + sqrt(R^2 + 4L/C)) / (2L)
  // (part_response.hpp; series RLC closed form).
  const double c = 100e-9, l = 0.6e-9, r = 20e-3;
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("mlcc", vdd, Network::kGround,
                 MountedPart{Capacitor{.capacitance = c, .esr = r, .esl = 0.4e-9}, 0.2e-9, 4});
  net.add_branch("vrm", vdd, Network::kGround, MountedPart{quietrail::Regulator{.resistance = 1e-3, .inductance = 10e-9}});
  const std::vector<BranchInfo> info{
      {.library_id = "mlcc-0402-x7r-100n", .description = "100 nF 0402 X7R", .nominal_capacitance = 100e-9, .cost = 0.02, .area = 0.5e-6},
      {}};
  CheckOptions options;
  options.branch_curves = true;
  const auto result = quietrail::run_check(net, vdd, TargetImpedance::flat(1.0), options, info);
  REQUIRE(result.parts.size() == 2);
  const auto& row = result.parts[0];
  CHECK(row.name == "mlcc");
  CHECK(row.kind == "capacitor");
  CHECK(row.count == 4);
  CHECK(row.library_id == "mlcc-0402-x7r-100n");
  REQUIRE(row.srf.has_value());
  CHECK_THAT(*row.srf, WithinRel(20.547e6, kPrinted));
  REQUIRE(row.capacitive_band.has_value());
  CHECK_THAT(row.capacitive_band->high, WithinRel((-r + std::sqrt(r * r + 4.0 * l / c)) / (2.0 * l) / kTwoPi, 1e-9));
  REQUIRE(row.cost_total.has_value());
  CHECK_THAT(*row.cost_total, WithinRel(0.08, 1e-12));  // 4 x 0.02
  CHECK_THAT(*row.area_total, WithinRel(2e-6, 1e-12));  // 4 x 0.5 mm^2
  CHECK(result.parts[1].kind == "regulator");
  CHECK_FALSE(result.parts[1].srf.has_value());
  CHECK(result.totals.capacitor_count == 4);
  CHECK(result.totals.cost_complete);
  CHECK_THAT(result.totals.cost, WithinRel(0.08, 1e-12));
  // Branch curves: 4 copies of the series RLC in parallel, Z / 4 (REFERENCES section 2).
  REQUIRE(result.branch_impedance.size() == 2);
  const double f = result.frequencies[100];
  CHECK_THAT(std::abs(result.branch_impedance[0][100]), WithinRel(std::abs(series_rlc(f, c, l, r)) / 4.0, 1e-12));
}

TEST_CASE("check rejects bad options, an uncovered band and a mismatched info list", "[analysis]") {
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("c1", vdd, Network::kGround, MountedPart{Capacitor{.capacitance = 1e-6, .esr = 5e-3, .esl = 1e-9}});
  const auto flat = TargetImpedance::flat(10e-3);
  CheckOptions reversed;
  reversed.grid = {.start = 1e6, .stop = 1e3};
  CHECK_THAT(input_error_of([&] { (void)quietrail::run_check(net, vdd, flat, reversed); }), Contains("grid/stop"));
  CheckOptions loose;
  loose.refinement.frequency_tolerance = 0.5;
  CHECK_THAT(input_error_of([&] { (void)quietrail::run_check(net, vdd, flat, loose); }),
             Contains("refinement/frequency_tolerance"));
  const auto partial = TargetImpedance::from_segments({quietrail::TargetSegment::flat(1e4, 1e9, 10e-3)});
  CHECK_THAT(input_error_of([&] { (void)quietrail::run_check(net, vdd, partial); }),
             Contains("target") && Contains("no target from 1 kHz to 10 kHz"));
  CHECK_THAT(input_error_of([&] { (void)quietrail::run_check(net, vdd, flat, {}, std::vector<BranchInfo>(2)); }),
             Contains("info"));
  CHECK_THROWS_AS(quietrail::run_check(net, Network::kGround, flat), quietrail::InputError);
}

TEST_CASE("a constant-resistance network has no peaks and is judged on its flat level", "[analysis]") {
  // REFERENCES section 10: R + sL in parallel with R + 1/(sC), R = sqrt(L/C), is exactly R at
  // every frequency (L = 1 nH, C = 1 uF -> R = 31.62 mohm).
  const double l = 1e-9, c = 1e-6;
  const double r = std::sqrt(l / c);
  Network net;
  const NodeId vdd = net.add_node("vdd");
  net.add_branch("rl", vdd, Network::kGround, MountedPart{quietrail::Resistor{.resistance = r, .series_inductance = l}});
  net.add_branch("rc", vdd, Network::kGround, MountedPart{Capacitor{.capacitance = c, .esr = r}});
  const auto above = quietrail::run_check(net, vdd, TargetImpedance::flat(r * (1.0 + 1e-6)));
  CHECK(above.status == CheckStatus::pass);
  CHECK(above.peaks.empty());  // rounding noise is no peak
  CHECK_THAT(above.worst_ratio, WithinRel(1.0 / (1.0 + 1e-6), 1e-12));
  const auto below = quietrail::run_check(net, vdd, TargetImpedance::flat(r * (1.0 - 1e-6)));
  CHECK(below.status == CheckStatus::fail);
  REQUIRE(below.exceeded.size() == 1);
  CHECK(below.exceeded[0].starts_at_band_edge);
  CHECK(below.exceeded[0].stops_at_band_edge);
}
