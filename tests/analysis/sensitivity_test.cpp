// SPDX-License-Identifier: MIT
// rank_changes against the closed form for the anti-resonance of two parallel branches
// (REFERENCES §3): after "one more" copy of a part, the pair's new peak sits where the
// closed form with that branch's N copies (C*N, L/N, R/N) puts it.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <complex>
#include <string>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/sensitivity.hpp"
#include "quietrail/network/network.hpp"
#include "support/input_error.hpp"

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;
using quietrail::Capacitor;
using quietrail::CheckOptions;
using quietrail::MountedPart;
using quietrail::Network;
using quietrail::TargetImpedance;
using quietrail::WhatIf;

namespace {

constexpr double kPi = 3.14159265358979323846;

// REFERENCES §3 worked example: C1 = 10 uF, L1 = 1 nH, R1 = 5 mohm; C2 = 100 nF, L2 = 1 nH,
// R2 = 5 mohm (invented values, the reference's own).
struct Branch {
  double c, l, r;
};
constexpr Branch kLarge{10e-6, 1e-9, 5e-3};
constexpr Branch kSmall{100e-9, 1e-9, 5e-3};

// N copies in parallel: C*N, L/N, R/N (REFERENCES §2).
Branch copies(Branch b, int n) { return {b.c * n, b.l / n, b.r / n}; }

// Closed form (REFERENCES §3): f_ar = 1 / (2 pi sqrt((L1 + L2) Cs)), and the exact |Z| there,
// |X^2 + R1 R2 + j X (R2 - R1)| / (R1 + R2) with X the first branch's reactance at f_ar.
struct AntiResonance {
  double frequency, magnitude, x_over_r;
};
AntiResonance closed_form(Branch a, Branch b) {
  const double cs = a.c * b.c / (a.c + b.c);
  const double f = 1.0 / (2.0 * kPi * std::sqrt((a.l + b.l) * cs));
  const double w = 2.0 * kPi * f;
  const double x = w * a.l - 1.0 / (w * a.c);
  const std::complex<double> numerator(x * x + a.r * b.r, x * (b.r - a.r));
  return {f, std::abs(numerator) / (a.r + b.r), std::abs(x) / (a.r + b.r)};
}

Network pair() {
  Network net;
  const auto rail = net.add_node("rail");
  net.add_branch("c10u", rail, Network::kGround,
                 MountedPart{Capacitor{.capacitance = kLarge.c, .esr = kLarge.r, .esl = kLarge.l}});
  net.add_branch("c100n", rail, Network::kGround,
                 MountedPart{Capacitor{.capacitance = kSmall.c, .esr = kSmall.r, .esl = kSmall.l}});
  return net;
}

CheckOptions band() {
  CheckOptions options;
  options.grid = {.start = 1e5, .stop = 1e8, .points_per_decade = 50};
  return options;
}

// The pair checked against a flat 0.1 ohm target, and its ranking.
quietrail::Sensitivity ranked_pair() {
  const Network net = pair();
  const auto port = *net.find_node("rail");
  const TargetImpedance target = TargetImpedance::flat(0.1);
  const auto base = quietrail::run_check(net, port, target, band());
  quietrail::SensitivityOptions options;
  options.check = band();
  return quietrail::rank_changes(net, port, target, base, options);
}

const WhatIf& find(const quietrail::Sensitivity& s, const std::string& change) {
  const auto it = std::find_if(s.changes.begin(), s.changes.end(), [&](const WhatIf& w) { return w.change == change; });
  REQUIRE(it != s.changes.end());
  return *it;
}

}  // namespace

TEST_CASE("one more copy moves the anti-resonance where the two-branch closed form puts it", "[analysis][sensitivity]") {
  const quietrail::Sensitivity s = ranked_pair();

  // The base peak: REFERENCES §3 swept maximum 0.48889 ohm at 11.282 MHz.
  CHECK_THAT(s.peak_ratio, WithinRel(0.48889 / 0.1, 1e-4));
  CHECK_THAT(s.peak_frequency, WithinRel(11.282e6, 1e-3));

  for (const auto& [name, large_n, small_n] : {std::tuple{"one more c100n (2 copies)", 1, 2},
                                               std::tuple{"one more c10u (2 copies)", 2, 1}}) {
    CAPTURE(name);
    const WhatIf& w = find(s, name);
    const AntiResonance expected = closed_form(copies(kLarge, large_n), copies(kSmall, small_n));
    // The closed form's exact |Z(f_ar)| is within 1 % of the swept maximum when X/(R1+R2) >= 5,
    // and the maximum sits within about 0.25 % of f_ar (REFERENCES §3 tolerances).
    REQUIRE(expected.x_over_r >= 5.0);
    CHECK_THAT(w.peak_ratio, WithinRel(expected.magnitude / 0.1, 0.01));
    CHECK_THAT(w.peak_frequency, WithinRel(expected.frequency, 0.005));
  }
}

TEST_CASE("removing the only copy of a part leaves no anti-resonance near the peak", "[analysis][sensitivity]") {
  const quietrail::Sensitivity s = ranked_pair();
  // Without the 100 nF part the 10 uF part alone is a series R-L-C: no parallel resonance, and
  // near 11 MHz its |Z| is about omega*L - 1/(omega*C) (REFERENCES §2), far below 0.49 ohm.
  const WhatIf& w = find(s, "without c100n");
  const double f = w.peak_frequency;
  const double w0 = 2.0 * kPi * f;
  const double series = std::abs(std::complex<double>(kLarge.r, w0 * kLarge.l - 1.0 / (w0 * kLarge.c)));
  CHECK_THAT(w.peak_ratio, WithinRel(series / 0.1, 1e-6));
  // The ranking is by the new peak height, lowest first (the ordering rank_changes documents).
  CHECK(std::is_sorted(s.changes.begin(), s.changes.end(),
                       [](const WhatIf& a, const WhatIf& b) { return a.peak_ratio < b.peak_ratio; }));
}

TEST_CASE("a damping part with the loop's characteristic impedance flattens the peak", "[analysis][sensitivity]") {
  const quietrail::Sensitivity s = ranked_pair();
  const auto damping = std::find_if(s.changes.begin(), s.changes.end(), [](const WhatIf& w) { return w.kind == "damping"; });
  REQUIRE(damping != s.changes.end());
  // Z0 = sqrt(L_loop / C_loop) of the pair: sqrt(2 nH / 99.01 nF) = 0.142 ohm (REFERENCES §3
  // values). A resistive branch of about Z0 in parallel bounds the peak to well below Z0
  // itself (it cannot exceed the damper's own |Z| ~ Z0 at f_ar), against 0.489 ohm undamped.
  const double z0 = std::sqrt(2e-9 / (kLarge.c * kSmall.c / (kLarge.c + kSmall.c)));
  CHECK(damping->peak_ratio < z0 / 0.1);
  CHECK(damping->peak_ratio < s.peak_ratio / 3.0);
}

TEST_CASE("sensitivity options are checked", "[analysis][sensitivity]") {
  const Network net = pair();
  const auto port = *net.find_node("rail");
  const auto base = quietrail::run_check(net, port, TargetImpedance::flat(0.1), band());
  quietrail::SensitivityOptions options;
  options.neighbourhood = 1.0;
  CHECK_THAT(quietrail::test::input_error_of([&] { (void)quietrail::rank_changes(net, port, TargetImpedance::flat(0.1), base, options); }),
             Contains("neighbourhood"));
  options = {};
  options.mounting_factor = 1.0;
  CHECK_THAT(quietrail::test::input_error_of([&] { (void)quietrail::rank_changes(net, port, TargetImpedance::flat(0.1), base, options); }),
             Contains("mounting_factor"));
}
