// SPDX-License-Identifier: MIT
// Peak attribution: split the port's admittance into inductive and capacitive sides,
// fit each side by a series LC, and phrase what forms the peak (see attribution.hpp).
#include "quietrail/analysis/attribution.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <tuple>
#include <variant>

#include "detail/checks.hpp"
#include "detail/overloaded.hpp"
#include "quietrail/error.hpp"
#include "quietrail/models/part_response.hpp"
#include "quietrail/network/topology.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kInf = std::numeric_limits<double>::infinity();
// A fitted L or 1/(omega^2 C) below this fraction of the other term is numerical noise of
// the central difference (a pure inductor or pure capacitor side).
constexpr double kFitNoise = 1e-7;
// The remainder Y_port - sum Y_k of a network smaller than this fraction of the branch sum
// is rounding, not a contributor.
constexpr double kRestNoise = 1e-9;

struct Member {
  BranchId branch = kRestOfNetwork;
  std::string name;
  std::function<Complex(double)> admittance;  // siemens at a frequency
};

// A series R-L-C loop is critically damped at R = 2 sqrt(L/C), i.e. Q = Z0 / R = 0.5.
constexpr double kCriticalQ = 0.5;

std::string hz(double f) { return format_value(f, "Hz"); }

std::string fixed2(double v) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.2g", v);
  return buffer;
}

// The mounted SRF of a branch's part (one copy), when it has one.
std::optional<double> mounted_srf(const MountedPart& part) {
  return std::visit(
      detail::Overloaded{
          [&](const Capacitor& c) { return self_resonant_frequency(c, part.mounting_inductance); },
          [&](const PlanePair& p) -> std::optional<double> {
            const double l = p.spreading_inductance + part.mounting_inductance;
            if (l <= 0.0) return std::nullopt;
            return 1.0 / (kTwoPi * std::sqrt(l * p.capacitance()));
          },
          [&](const Inductor& i) { return self_resonant_frequency(i); },
          [](const auto&) -> std::optional<double> { return std::nullopt; },
      },
      part.element);
}

// Mounted inductance of one copy of a capacitor, H (0 for any other element: a plane or a
// bead is no template for a part to add).
double mounted_inductance(const MountedPart& part) {
  if (const auto* c = std::get_if<Capacitor>(&part.element)) return c->esl + part.mounting_inductance;
  return 0.0;
}

std::string copies(const NetworkBranch& b) {
  return b.part.count > 1 ? std::to_string(b.part.count) + " x " + b.name : b.name;
}

// The phrase for one contributor on its side.
std::string role_of(const Network& network, const PeakContributor& c, bool inductive, const std::string& behind) {
  if (c.branch == kRestOfNetwork)
    return inductive ? "the inductive network behind " + behind : "the capacitive network behind " + behind;
  const NetworkBranch& b = network.branches()[static_cast<std::size_t>(c.branch)];
  const std::string who = copies(b);
  const auto srf = mounted_srf(b.part);
  const std::string srf_text = srf ? " its SRF of " + hz(*srf) : std::string();
  return std::visit(
      detail::Overloaded{
          [&](const Capacitor&) {
            if (inductive) return "the inductive tail of " + who + (srf ? " (above" + srf_text + ")" : "");
            return "the capacitive side of " + who + (srf ? " (below" + srf_text + ")" : "");
          },
          [&](const PlanePair&) {
            if (inductive) return "the spreading inductance of " + who + (srf ? " (above" + srf_text + ")" : "");
            return "the plane capacitance of " + who;
          },
          [&](const Inductor&) {
            if (inductive) return "the inductance of " + who;
            return "the interwinding capacitance of " + who + (srf ? " (above" + srf_text + ")" : "");
          },
          [&](const Regulator&) { return "the regulator's output inductance (" + who + ")"; },
          [&](const Resistor&) {
            return (inductive ? "the series inductance of " : "the capacitance seen through ") + who;
          },
      },
      b.part.element);
}

std::string join(const std::vector<PeakContributor>& side) {
  std::string out;
  for (std::size_t i = 0; i < side.size(); ++i) {
    if (i > 0) out += i + 1 == side.size() ? " and " : ", ";
    out += side[i].role;
  }
  return out;
}

// Series LC fit of a side (see the header): returns {L, C} with C = inf for no capacitance.
// `lossless` drops each member's resistance (X_k = Im Z_k) and combines the members as pure
// reactances, X = 1 / sum(1 / X_k): the fallback when the exact reactance Im(1 / sum Y)
// gives an unphysical fit. A lossless reactance obeys dX/domega >= |X|/omega (Foster 1924),
// so this fit always has L >= 0 and C > 0.
std::pair<double, double> series_lc_fit(const std::vector<const Member*>& members, double f, double h,
                                        bool lossless) {
  auto reactance = [&](double at) {
    if (lossless) {
      double susceptance = 0.0;  // sum of 1 / X_k
      for (const Member* m : members) susceptance += 1.0 / (1.0 / m->admittance(at)).imag();
      return 1.0 / susceptance;
    }
    Complex y(0.0, 0.0);
    for (const Member* m : members) y += m->admittance(at);
    return (1.0 / y).imag();
  };
  const double w = omega(f);
  const double x = reactance(f);
  const double slope = (reactance(f * (1.0 + h)) - reactance(f * (1.0 - h))) / (2.0 * h * w);
  double l = 0.5 * (x / w + slope);
  double inv_c = 0.5 * (slope - x / w);  // 1 / (omega^2 C), H
  if (std::abs(l) <= kFitNoise * std::abs(inv_c)) l = 0.0;
  if (std::abs(inv_c) <= kFitNoise * std::abs(l)) inv_c = 0.0;
  const double c = inv_c > 0.0 ? 1.0 / (w * w * inv_c) : (inv_c == 0.0 ? kInf : kNaN);
  return {l, c};
}

Complex side_impedance(const std::vector<const Member*>& members, double f) {
  Complex y(0.0, 0.0);
  for (const Member* m : members) y += m->admittance(f);
  return 1.0 / y;
}

}  // namespace

void AttributionOptions::validate(const std::string& file, const std::string& field) const {
  const std::string at = field.empty() ? "" : field + "/";
  require_input(std::isfinite(dominant_share) && dominant_share > 0.0 && dominant_share <= 1.0,
                {file, at + "dominant_share"}, "a fraction in (0, 1]", detail::describe_number(dominant_share, ""));
  require_input(std::isfinite(derivative_step) && derivative_step >= 1e-7 && derivative_step <= 1e-2,
                {file, at + "derivative_step"}, "a relative step in [1e-7, 1e-2]",
                detail::describe_number(derivative_step, ""));
}

namespace {

// Both public forms; `band_edge` marks a maximum on the band edge (see the header).
PeakAttribution attribute(const Network& network, NodeId port, double frequency,
                          const ImpedanceFunction& port_impedance, const AttributionOptions& options,
                          bool band_edge) {
  options.validate();
  require_input(network.has_node(port) && port != Network::kGround, {"", "port"},
                "a node of the network other than ground", std::to_string(port));
  detail::require_positive(frequency, "", "frequency", "Hz");

  PeakAttribution out;
  out.frequency = frequency;
  out.all_parallel = is_all_parallel(network, port);

  // PREAMBLE: the contributors. Branches port-ground, then the remainder of the network.
  std::vector<Member> members;
  std::string behind;
  for (std::size_t k = 0; k < network.branch_count(); ++k) {
    const NetworkBranch& b = network.branches()[k];
    const bool at_port = b.from == port || b.to == port;
    const bool at_ground = b.from == Network::kGround || b.to == Network::kGround;
    if (at_port && at_ground) {
      const MountedPart* part = &b.part;
      members.push_back({static_cast<BranchId>(k), b.name, [part](double f) { return 1.0 / part->impedance(f); }});
    } else if (at_port) {
      behind += (behind.empty() ? "" : ", ") + b.name;
    }
  }
  if (!out.all_parallel) {
    QUIETRAIL_ASSERT(static_cast<bool>(port_impedance));
    const std::vector<Member> direct = members;
    auto rest = [direct, &port_impedance](double f) {
      Complex y = 1.0 / port_impedance(f);
      for (const Member& m : direct) y -= m.admittance(f);
      return y;
    };
    double direct_size = 0.0;
    for (const Member& m : direct) direct_size += std::abs(m.admittance(frequency));
    const Complex y_rest = rest(frequency);
    if (std::abs(y_rest) > kRestNoise * direct_size)
      members.push_back({kRestOfNetwork, "network behind " + behind, rest});
  }

  // PHASE 1: sides and dominant contributors.
  std::vector<const Member*> ind_members;
  std::vector<const Member*> cap_members;
  std::vector<PeakContributor> ind_all;
  std::vector<PeakContributor> cap_all;
  for (const Member& m : members) {
    const Complex y = m.admittance(frequency);
    PeakContributor c{m.branch, m.name, y, 0.0, {}};
    if (y.imag() < 0.0) {
      ind_members.push_back(&m);
      out.inductive_susceptance += -y.imag();
      ind_all.push_back(c);
    } else if (y.imag() > 0.0) {
      cap_members.push_back(&m);
      out.capacitive_susceptance += y.imag();
      cap_all.push_back(c);
    }
  }
  auto dominant = [&](std::vector<PeakContributor> side, double total, bool inductive) {
    std::sort(side.begin(), side.end(), [](const PeakContributor& a, const PeakContributor& b) {
      return std::abs(a.admittance.imag()) > std::abs(b.admittance.imag());
    });
    std::vector<PeakContributor> kept;
    double cumulative = 0.0;
    for (PeakContributor& c : side) {
      c.share = std::abs(c.admittance.imag()) / total;
      c.role = role_of(network, c, inductive, behind);
      kept.push_back(c);
      cumulative += c.share;
      if (cumulative >= options.dominant_share) break;
    }
    return kept;
  };
  out.inductive = dominant(std::move(ind_all), out.inductive_susceptance, true);
  out.capacitive = dominant(std::move(cap_all), out.capacitive_susceptance, false);

  const std::string at = " at " + hz(frequency);
  if (out.inductive.empty() || out.capacitive.empty()) {
    out.status = AttributionStatus::one_sided;
    for (double* v : {&out.inductive_side_inductance, &out.inductive_side_capacitance, &out.capacitive_side_inductance,
                      &out.capacitive_side_capacitance, &out.loop_inductance, &out.loop_capacitance,
                      &out.loop_resistance, &out.characteristic_impedance, &out.loop_frequency, &out.loop_q,
                      &out.damping_resistance, &out.srf_fill_capacitance})
      *v = kNaN;
    if (!out.inductive.empty()) {
      out.explanation = "no anti-resonance" + at + ": the port is inductive there, mostly " + join(out.inductive);
      out.remedy = "lower the mounted inductance of " + out.inductive.front().name +
                   " or add parts whose SRF is near " + hz(frequency);
    } else if (!out.capacitive.empty()) {
      out.explanation = "no anti-resonance" + at + ": the port is capacitive there, mostly " + join(out.capacitive);
      out.remedy = "add capacitance that still acts as a capacitor" + at;
    } else {
      out.explanation = "no anti-resonance" + at + ": the port is resistive there";
      out.remedy = "lower the series resistance of the branches at the port";
    }
    return out;
  }

  // PHASE 2: series LC fit of each side, and the loop they form.
  out.status = AttributionStatus::resonance;
  const double h = options.derivative_step;
  auto physical = [](const std::pair<double, double>& lc) { return lc.first >= 0.0 && lc.second > 0.0; };
  for (auto [members, l, c] : {std::tuple{&ind_members, &out.inductive_side_inductance, &out.inductive_side_capacitance},
                               std::tuple{&cap_members, &out.capacitive_side_inductance,
                                          &out.capacitive_side_capacitance}}) {
    auto fit = series_lc_fit(*members, frequency, h, false);
    if (!physical(fit)) {
      const auto lossless = series_lc_fit(*members, frequency, h, true);
      if (physical(lossless)) fit = lossless;
    }
    std::tie(*l, *c) = fit;
  }
  out.loop_inductance = out.inductive_side_inductance + out.capacitive_side_inductance;
  out.loop_capacitance = 1.0 / (1.0 / out.inductive_side_capacitance + 1.0 / out.capacitive_side_capacitance);
  out.loop_resistance = side_impedance(ind_members, frequency).real() + side_impedance(cap_members, frequency).real();
  out.characteristic_impedance = std::sqrt(out.loop_inductance / out.loop_capacitance);
  out.loop_frequency = 1.0 / (kTwoPi * std::sqrt(out.loop_inductance * out.loop_capacitance));
  out.loop_q = out.characteristic_impedance / out.loop_resistance;
  out.damping_resistance = 2.0 * out.characteristic_impedance;
  out.srf_fill_capacitance = kNaN;
  const PeakContributor& top_cap = out.capacitive.front();
  if (top_cap.branch != kRestOfNetwork) {
    const double l = mounted_inductance(network.branches()[static_cast<std::size_t>(top_cap.branch)].part);
    if (l > 0.0) out.srf_fill_capacitance = 1.0 / (omega(frequency) * omega(frequency) * l);
  }

  // PHASE 3: the sentences. Loop numbers enter the remedy only when the fit is physical.
  out.loop_fit_valid = out.inductive_side_inductance >= 0.0 && out.capacitive_side_inductance >= 0.0 &&
                       out.inductive_side_capacitance > 0.0 && out.capacitive_side_capacitance > 0.0 &&
                       std::isfinite(out.capacitive_side_capacitance) && std::isfinite(out.loop_q);
  out.explanation = join(out.inductive) + " against " + join(out.capacitive);
  if (band_edge) {
    // A band-edge maximum is the slope towards a resonance, not the resonance itself.
    out.explanation += " (a maximum on the band edge";
    if (out.loop_fit_valid) out.explanation += "; their loop resonates at " + hz(out.loop_frequency);
    out.explanation += ")";
  }
  const PeakContributor& top_ind = out.inductive.front();
  std::vector<std::string> remedies;
  if (out.loop_fit_valid && out.loop_q > kCriticalQ) {
    remedies.push_back("damp it: about " + format_value(out.characteristic_impedance, "ohm") +
                       " of ESR in each side (" + format_value(out.damping_resistance, "ohm") +
                       " loop total, now " + format_value(out.loop_resistance, "ohm") + ")");
  } else if (out.loop_fit_valid) {
    remedies.push_back("the loop is already damped (Q " + fixed2(out.loop_q) + "), so lower the level instead");
  }
  // At a band edge the frequency is where the band stops, not a resonance to fill.
  if (band_edge) out.srf_fill_capacitance = kNaN;
  if (std::isfinite(out.srf_fill_capacitance)) {
    remedies.push_back("add about " + format_value(out.srf_fill_capacitance, "F") + " with the mounting of " +
                       top_cap.name + " (SRF near " + hz(frequency) + ")");
  }
  if (top_ind.branch != kRestOfNetwork && out.loop_fit_valid) {
    remedies.push_back("cut the inductance of the inductive side, mostly " + top_ind.name + " (" +
                       format_value(out.inductive_side_inductance, "H") + " of the loop's " +
                       format_value(out.loop_inductance, "H") + ")");
  }
  if (remedies.empty()) remedies.push_back("add capacitance that still acts as a capacitor at " + hz(frequency));
  std::string remedy;
  for (std::size_t i = 0; i < remedies.size(); ++i) remedy += (i == 0 ? "" : "; or ") + remedies[i];
  out.remedy = remedy;
  return out;
}

}  // namespace

PeakAttribution attribute_peak(const Network& network, NodeId port, double frequency,
                               const ImpedanceFunction& port_impedance, const AttributionOptions& options) {
  return attribute(network, port, frequency, port_impedance, options, false);
}

PeakAttribution attribute_peak(const Network& network, NodeId port, const Peak& peak,
                               const ImpedanceFunction& port_impedance, const AttributionOptions& options) {
  return attribute(network, port, peak.frequency, port_impedance, options, peak.at_band_edge);
}

}  // namespace quietrail
