// SPDX-License-Identifier: MIT
// SelectionModel against hand-written series/parallel reductions (port at the board node,
// and a die behind a package), its feasible disc, its floor; SplitMix64 against its
// published definition.
#include <catch2/catch.hpp>

#include <cmath>
#include <cstdint>
#include <limits>
#include <numbers>
#include <vector>

#include "quietrail/analysis/target.hpp"
#include "quietrail/network/network.hpp"
#include "quietrail/plan/plan.hpp"
#include "quietrail/plan/search.hpp"

using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;
using quietrail::Capacitor;
using quietrail::Complex;
using quietrail::AdmittanceVector;
using quietrail::MountedPart;
using quietrail::Network;
using quietrail::NodeId;
using quietrail::PlanCandidate;
using quietrail::PlanProblem;
using quietrail::Regulator;
using quietrail::Resistor;
using quietrail::SelectionModel;
using quietrail::SplitMix64;
using quietrail::TargetImpedance;

namespace {

// Closed form against the code's evaluation of the same formula: REFERENCES "general
// tolerance guidance", 1e-9 relative.
constexpr double kClosedForm = 1e-9;

constexpr double kTwoPi = 2.0 * std::numbers::pi;

// Invented demo values (typical of a core rail, as in tests/io/spice_netlist_test.cpp).
constexpr double kRegR = 1e-3, kRegL = 20e-9;                  // regulator R + jwL
constexpr double kPkgR = 0.4e-3, kPkgL = 50e-12;               // package path
constexpr double kDieC = 250e-9, kDieEsr = 1.5e-3;             // on-die capacitance
constexpr double kTarget = 20e-3;                              // flat target, ohm
struct Part {
  double c, esr, esl, mount;
};
constexpr Part kBig{10e-6, 5e-3, 0.5e-9, 0.45e-9};     // 10 uF 0603
constexpr Part kSmall{100e-9, 30e-3, 0.4e-9, 0.3e-9};  // 100 nF 0402

// Hand formulas (any circuits text): series R-L(-C) and two impedances in parallel.
Complex series_rl(double f, double r, double l) { return {r, kTwoPi * f * l}; }
Complex series_rlc(double f, double r, double l, double c) {
  const double w = kTwoPi * f;
  return {r, w * l - 1.0 / (w * c)};
}
Complex parallel(Complex a, Complex b) { return a * b / (a + b); }
Complex part_z(double f, const Part& p) { return series_rlc(f, p.esr, p.esl + p.mount, p.c); }

PlanCandidate candidate(const char* name, const Part& p, double cost) {
  PlanCandidate c;
  c.name = name;
  c.part = MountedPart{Capacitor{.capacitance = p.c, .esr = p.esr, .esl = p.esl}, p.mount};
  c.cost = cost;
  c.max_count = 10;
  return c;
}

// Regulator alone at the board; the target applies at the board.
PlanProblem board_problem() {
  PlanProblem problem;
  problem.board = problem.network.add_node("board");
  problem.port = problem.board;
  problem.network.add_branch("VRM", problem.board, Network::kGround,
                             MountedPart{Regulator{.resistance = kRegR, .inductance = kRegL}});
  problem.target = TargetImpedance::flat(kTarget);
  problem.band = {.start = 1e5, .stop = 1e8, .points_per_decade = 10};
  problem.candidates = {candidate("C_BIG", kBig, 2.0), candidate("C_SMALL", kSmall, 1.0)};
  return problem;
}

// board --(VRM)-- gnd, board --(R_p + jwL_p)-- die --(C_die)-- gnd; the target applies at
// the die.
PlanProblem die_problem() {
  PlanProblem problem = board_problem();
  const NodeId die = problem.network.add_node("die");
  problem.network.add_branch("PKG", problem.board, die, MountedPart{Resistor{.resistance = kPkgR, .series_inductance = kPkgL}});
  problem.network.add_branch("C_DIE", die, Network::kGround,
                             MountedPart{Capacitor{.capacitance = kDieC, .esr = kDieEsr}});
  problem.port = die;
  return problem;
}

const std::vector<double> kFrequencies{1e5, 1e6, 3.3e6, 1e7, 45e6, 1e8};

void check_complex(Complex ours, Complex expected, double rel) {
  CHECK_THAT(ours.real(), WithinAbs(expected.real(), rel * std::abs(expected)));
  CHECK_THAT(ours.imag(), WithinAbs(expected.imag(), rel * std::abs(expected)));
}

}  // namespace

TEST_CASE("at the board node the rail is 1 / (1/Z_fixed + S) with Z_fixed the regulator's R + jwL", "[plan]") {
  const PlanProblem problem = board_problem();
  const SelectionModel model(problem, kFrequencies);
  REQUIRE(model.frequency_count() == kFrequencies.size());
  REQUIRE(model.candidate_count() == 2);
  for (std::size_t i = 0; i < kFrequencies.size(); ++i) {
    const double f = kFrequencies[i];
    CAPTURE(f);
    const Complex z_fixed = series_rl(f, kRegR, kRegL);
    // A copy's admittance: 1 / (ESR + jw(ESL + L_mount) + 1/(jwC)) (series RLC, REFERENCES §2).
    check_complex(model.unit_admittance(0, i), 1.0 / part_z(f, kBig), kClosedForm);
    check_complex(model.unit_admittance(1, i), 1.0 / part_z(f, kSmall), kClosedForm);
    // Copies in parallel add admittances (circuit theory).
    for (const Complex s : {Complex(0.0, 0.0), 3.0 / part_z(f, kBig) + 2.0 / part_z(f, kSmall), Complex(50.0, -20.0)}) {
      const Complex expected = 1.0 / (1.0 / z_fixed + s);
      check_complex(model.port_impedance(i, s), expected, kClosedForm);
      CHECK_THAT(model.ratio(i, s), WithinRel(std::abs(expected) / kTarget, kClosedForm));
    }
    check_complex(model.open_impedance(i), z_fixed, kClosedForm);
    // Board shorted: the port is the board itself, so nothing is left (A = 0, search.hpp).
    CHECK(std::abs(model.shorted_impedance(i)) <= 1e-12 * std::abs(z_fixed));
    CHECK_THAT(model.limit(i), WithinRel(kTarget, kClosedForm));
  }
  // admittance() and add(): sums of n_k Y_k (circuit theory).
  const AdmittanceVector total = model.admittance({3, 2});
  AdmittanceVector built = model.admittance({0, 0});
  model.add(0, 3, built);
  model.add(1, 4, built);
  model.add(1, -2, built);
  for (std::size_t i = 0; i < kFrequencies.size(); ++i) {
    const Complex expected = 3.0 / part_z(kFrequencies[i], kBig) + 2.0 / part_z(kFrequencies[i], kSmall);
    check_complex(total[i], expected, kClosedForm);
    check_complex(built[i], expected, kClosedForm);
  }
}

TEST_CASE("worst and meets report the largest hand-computed ratio over the frequencies", "[plan]") {
  const PlanProblem problem = board_problem();
  const SelectionModel model(problem, kFrequencies);
  for (const std::vector<int>& counts : {std::vector<int>{0, 0}, std::vector<int>{3, 2}, std::vector<int>{10, 10}}) {
    double worst = 0.0;
    std::size_t at = 0;
    for (std::size_t i = 0; i < kFrequencies.size(); ++i) {
      const double f = kFrequencies[i];
      const Complex y = 1.0 / series_rl(f, kRegR, kRegL) + static_cast<double>(counts[0]) / part_z(f, kBig) +
                        static_cast<double>(counts[1]) / part_z(f, kSmall);
      const double r = 1.0 / std::abs(y) / kTarget;
      if (r > worst) worst = r, at = i;
    }
    CAPTURE(counts[0], counts[1], worst);
    const auto [ratio, index] = model.worst(model.admittance(counts));
    CHECK_THAT(ratio, WithinRel(worst, kClosedForm));
    CHECK(index == at);
    CHECK(model.meets(model.admittance(counts)) == (worst <= 1.0));
  }
}

TEST_CASE("the limit is the target times target_scale times (1 - guard)", "[plan]") {
  const PlanProblem problem = board_problem();
  const SelectionModel model(problem, kFrequencies, 0.8, 1e-3);
  const Complex s = 2.0 / part_z(1e6, kBig);
  for (std::size_t i = 0; i < kFrequencies.size(); ++i) {
    // Definition in search.hpp; hand arithmetic.
    CHECK_THAT(model.limit(i), WithinRel(kTarget * 0.8 * (1.0 - 1e-3), kClosedForm));
    CHECK_THAT(model.ratio(i, s), WithinRel(std::abs(model.port_impedance(i, s)) / (kTarget * 0.8 * 0.999), kClosedForm));
  }
}

TEST_CASE("at the board node the feasible set is |S + 1/Z_fixed| >= 1/limit", "[plan]") {
  // |1/(Y + S)| <= L  <=>  |S - (-Y)| >= 1/L: the disc of search.hpp in closed form.
  const PlanProblem problem = board_problem();
  const SelectionModel model(problem, kFrequencies, 1.0, 1e-6);
  for (std::size_t i = 0; i < kFrequencies.size(); ++i) {
    const double f = kFrequencies[i];
    CAPTURE(f);
    const Complex y_fixed = 1.0 / series_rl(f, kRegR, kRegL);
    const double limit = kTarget * (1.0 - 1e-6);
    REQUIRE(model.reachable(i));  // A = 0 < limit
    check_complex(model.centre(i), -y_fixed, kClosedForm);
    CHECK_THAT(model.radius(i), WithinRel(1.0 / limit, kClosedForm));
    // Least |Z| with |S| <= reach is 1 / (|Y| + reach), S aligned with Y (triangle
    // inequality, equality when S is a positive multiple of Y).
    for (const double reach : {0.0, 10.0, 1e3})
      CHECK_THAT(model.floor_ratio(i, reach), WithinRel(1.0 / ((std::abs(y_fixed) + reach) * limit), kClosedForm));
  }
}

TEST_CASE("behind a package the port impedance is the Moebius map of the board admittance", "[plan]") {
  const PlanProblem problem = die_problem();
  const SelectionModel model(problem, kFrequencies);
  for (std::size_t i = 0; i < kFrequencies.size(); ++i) {
    const double f = kFrequencies[i];
    CAPTURE(f);
    const Complex z_reg = series_rl(f, kRegR, kRegL);
    const Complex z_pkg = series_rl(f, kPkgR, kPkgL);
    const Complex z_die = Complex(kDieEsr, -1.0 / (kTwoPi * f * kDieC));
    // Direct series/parallel reduction with n copies of one capacitor at the board:
    // Z_die || (Z_pkg + (Z_reg || Z_cap / n)).
    for (const auto& [part, n] : {std::pair{kBig, 1}, std::pair{kBig, 4}, std::pair{kSmall, 7}}) {
      const Complex z_cap = part_z(f, part) / static_cast<double>(n);
      const Complex expected = parallel(z_die, z_pkg + parallel(z_reg, z_cap));
      check_complex(model.port_impedance(i, 1.0 / z_cap), expected, kClosedForm);
    }
    // No candidate: Z_die || (Z_pkg + Z_reg); board shorted: Z_die || Z_pkg.
    const Complex open = parallel(z_die, z_pkg + z_reg);
    const Complex shorted = parallel(z_die, z_pkg);
    check_complex(model.open_impedance(i), open, kClosedForm);
    check_complex(model.shorted_impedance(i), shorted, kClosedForm);
    check_complex(model.port_impedance(i, Complex(0.0, 0.0)), open, kClosedForm);
    // floor_ratio with nothing to add is the open rail's ratio.
    CHECK_THAT(model.floor_ratio(i, 0.0), WithinRel(std::abs(open) / kTarget, kClosedForm));
    // Reachable exactly when the shorted port is below the target (search.hpp).
    CHECK(model.reachable(i) == (std::abs(shorted) < kTarget));
  }
  // The package and die capacitance anti-resonate near 1/(2 pi sqrt(L_p C_die)) = 45.0 MHz
  // (REFERENCES §3 with one branch purely inductive), where the shorted port is about
  // (wL_p)^2 / (R_p + ESR_die) = 0.1 ohm > Z_t: that frequency is out of reach, 1 MHz is not.
  CHECK_FALSE(model.reachable(4));
  CHECK(model.reachable(1));
}

TEST_CASE("a point on the disc's rim has ratio 1, inside above 1, far outside below 1", "[plan]") {
  const bool die = GENERATE(false, true);
  CAPTURE(die);
  const PlanProblem problem = die ? die_problem() : board_problem();
  const SelectionModel model(problem, kFrequencies, 0.9, 1e-9);
  std::size_t checked = 0;
  for (std::size_t i = 0; i < kFrequencies.size(); ++i) {
    if (!model.reachable(i)) continue;
    ++checked;
    CAPTURE(kFrequencies[i]);
    const Complex centre = model.centre(i);
    const double radius = model.radius(i);
    // |Z_port(S)| = limit on the disc's boundary (a Moebius map sends the circle
    // |Z| = limit to a circle in the S plane; search.hpp).
    for (const double angle : {0.0, 0.7, 1.9, 3.1, 4.4, 5.8}) {
      const Complex on_rim = centre + std::polar(radius, angle);
      CHECK_THAT(model.ratio(i, on_rim), WithinAbs(1.0, 1e-9));
      CHECK(model.ratio(i, centre + std::polar(0.5 * radius, angle)) > 1.0);
      CHECK(model.ratio(i, centre + std::polar(3.0 * radius, angle)) < 1.0);
    }
  }
  CHECK(checked >= 5);
}

TEST_CASE("SplitMix64 reproduces its published definition", "[plan]") {
  // Steele, Lea & Flood, "Fast splittable pseudorandom number generators", OOPSLA 2014:
  // state += 0x9e3779b97f4a7c15; z = state; z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9;
  // z = (z ^ (z >> 27)) * 0x94d049bb133111eb; return z ^ (z >> 31). Written out here
  // independently of src/plan.
  std::uint64_t state = 1234567;
  auto reference_next = [&state]() {
    state += 0x9e3779b97f4a7c15ULL;
    std::uint64_t z = state;
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    return z ^ (z >> 31);
  };
  SplitMix64 random(1234567);
  for (int k = 0; k < 20; ++k) {
    CAPTURE(k);
    CHECK(random.next() == reference_next());
  }
}

TEST_CASE("SplitMix64::below stays in range, is deterministic and spreads evenly", "[plan]") {
  for (const std::uint64_t n : {std::uint64_t{1}, std::uint64_t{2}, std::uint64_t{3}, std::uint64_t{7},
                                std::uint64_t{1000}, (std::uint64_t{1} << 63) + 1,
                                std::numeric_limits<std::uint64_t>::max()}) {
    CAPTURE(n);
    SplitMix64 a(42), b(42);
    for (int k = 0; k < 500; ++k) {
      const std::uint64_t x = a.below(n);
      CHECK(x < n);
      CHECK(b.below(n) == x);
    }
  }
  // Six buckets of 60000 draws: each expected 10000 with a standard deviation of 91; 3 %
  // is more than 3 standard deviations (binomial count, common practice). The seed is
  // fixed, so this cannot flicker.
  SplitMix64 random(7);
  std::vector<int> buckets(6, 0);
  for (int k = 0; k < 60000; ++k) ++buckets[random.below(6)];
  for (const int count : buckets) CHECK(std::abs(count - 10000) < 300);
}
