// SPDX-License-Identifier: MIT
// The check job: sweep, refine, compare, attribute, tabulate (see check.hpp).
#include "quietrail/analysis/check.hpp"

#include <cmath>
#include <cstdio>
#include <limits>
#include <memory>
#include <variant>

#include "detail/overloaded.hpp"
#include "quietrail/error.hpp"
#include "quietrail/network/nodal_solver.hpp"
#include "quietrail/network/parallel_solver.hpp"
#include "quietrail/network/topology.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

// Re-throws an InputError from a nested validate() with `prefix` before its field.
template <class F>
void with_prefix(const std::string& prefix, F&& validate) {
  try {
    validate();
  } catch (const InputError& e) {
    InputLocation where = e.where();
    where.field = prefix + where.field;
    throw InputError(where, e.expected(), e.found());
  }
}

std::string fixed(double value, const char* format) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, format, value);
  return buffer;
}

std::string ratio_text(double ratio) {
  if (!std::isfinite(ratio)) return "inf";
  return format_value(ratio, "", 3) + " (" + fixed(20.0 * std::log10(ratio), "%+.2f") + " dB)";
}

PartRow part_row(const Network& network, BranchId id, const BranchInfo* info) {
  const NetworkBranch& b = network.branches()[static_cast<std::size_t>(id)];
  PartRow row;
  row.branch = id;
  row.name = b.name;
  row.kind = std::string(element_kind(b.part.element));
  row.count = b.part.count;
  row.mounting_inductance = b.part.mounting_inductance;
  std::visit(detail::Overloaded{
                 [&](const Capacitor& c) {
                   row.effective_capacitance = c.capacitance;
                   row.esr = c.esr;
                   row.esl = c.esl;
                   row.srf = self_resonant_frequency(c, b.part.mounting_inductance);
                   row.capacitive_band = capacitive_band(b.part);
                 },
                 [&](const PlanePair& p) {
                   row.effective_capacitance = p.capacitance();
                   row.esr = p.series_resistance;
                   row.esl = p.spreading_inductance;
                   const double l = p.spreading_inductance + b.part.mounting_inductance;
                   if (l > 0.0) row.srf = 1.0 / (kTwoPi * std::sqrt(l * p.capacitance()));
                   row.capacitive_band = capacitive_band(b.part);
                 },
                 [&](const Inductor& i) {
                   if (i.parallel_capacitance > 0.0) row.effective_capacitance = i.parallel_capacitance;
                   row.esr = i.dc_resistance;
                   row.esl = i.inductance;
                   row.srf = self_resonant_frequency(i);
                 },
                 [&](const Regulator& r) {
                   row.esr = r.resistance;
                   row.esl = r.inductance;
                 },
                 [&](const Resistor& r) {
                   row.esr = r.resistance;
                   row.esl = r.series_inductance;
                 },
             },
             b.part.element);
  if (info) {
    row.library_id = info->library_id;
    row.description = info->description;
    row.nominal_capacitance = info->nominal_capacitance;
    row.cost_each = info->cost;
    row.area_each = info->area;
    if (info->cost) row.cost_total = *info->cost * row.count;
    if (info->area) row.area_total = *info->area * row.count;
  }
  return row;
}

}  // namespace

void CheckOptions::validate() const {
  with_prefix("grid/", [&] { grid.validate(); });
  refinement.validate({}, "refinement");
  attribution.validate({}, "attribution");
}

std::string to_string(CheckStatus status) {
  switch (status) {
    case CheckStatus::pass: return "pass";
    case CheckStatus::fail: return "fail";
  }
  QUIETRAIL_ASSERT(false);
  return {};
}

std::string CheckResult::brief() const {
  std::string out = to_string(status) + ": worst |Z|/Z_t " + ratio_text(worst_ratio) + " at " +
                    format_value(worst_frequency, "Hz") + "; " + std::to_string(peaks.size()) +
                    (peaks.size() == 1 ? " peak; " : " peaks; ") + std::to_string(exceeded.size()) +
                    (exceeded.size() == 1 ? " band" : " bands") + " above target; " +
                    std::to_string(grid_points_requested) + " grid points + " + std::to_string(evaluations_used) +
                    " evaluations";
  return out;
}

ImpedanceFunction port_impedance_function(const Network& network, NodeId port) {
  check_topology(network, port);
  if (is_all_parallel(network, port)) {
    std::vector<MountedPart> parts;
    for (const NetworkBranch& b : network.branches()) parts.push_back(b.part);
    // Kirchhoff's current law: parallel admittances add; each part's impedance already
    // divides by its count (element.hpp).
    return [parts = std::move(parts)](double f) {
      Complex y(0.0, 0.0);
      for (const MountedPart& p : parts) {
        const Complex z = p.impedance(f);
        if (z == Complex(0.0, 0.0)) return Complex(0.0, 0.0);  // an exact short at f
        y += 1.0 / z;
      }
      if (y == Complex(0.0, 0.0)) return Complex(kInf, 0.0);  // an exact open at f
      return 1.0 / y;
    };
  }
  auto copy = std::make_shared<const Network>(network);
  return [copy, port](double f) {
    const NodalSolver solver(*copy, FrequencyGrid(std::vector<double>{f}));
    return Complex(solver.solve(port).impedance[0]);
  };
}

CheckResult run_check(const Network& network, NodeId port, const TargetImpedance& target, const CheckOptions& options,
                      const std::vector<BranchInfo>& info) {
  // PREAMBLE: validate everything before any work.
  options.validate();
  target.cover_band(options.grid.start, options.grid.stop, "", "target");
  check_topology(network, port);
  require_input(info.empty() || info.size() == network.branch_count(), {"", "info"},
                "one BranchInfo per branch (" + std::to_string(network.branch_count()) + ")",
                std::to_string(info.size()));

  CheckResult result;
  result.port_name = network.node_name(port);
  result.target_description = target.describe();
  const FrequencyGrid grid(options.grid);
  result.frequencies = grid.frequencies();
  result.grid_points_requested = grid.size();
  result.all_parallel = is_all_parallel(network, port);

  // PHASE 1: the sweep.
  if (result.all_parallel) {
    result.impedance = ParallelSolver::for_network(network, port, grid).impedance(network.counts());
  } else {
    result.impedance = NodalSolver(network, grid).solve(port).impedance;
  }
  result.target = target.on(result.frequencies);

  // PHASE 2: peaks, verdict, bands.
  const ImpedanceFunction exact = port_impedance_function(network, port);
  PeakSearch search = find_peaks(result.frequencies, result.impedance, exact, target, options.refinement);
  result.peaks = std::move(search.impedance_peaks);
  result.ratio_peaks = std::move(search.ratio_peaks);
  result.exceeded = std::move(search.exceeded);
  result.worst_ratio = search.worst_ratio;
  result.worst_frequency = search.worst_frequency;
  result.worst_ratio_db = 20.0 * std::log10(search.worst_ratio);
  result.worst_target = target.at(search.worst_frequency);
  result.worst_magnitude = search.worst_ratio * result.worst_target;
  result.evaluations_used = search.evaluations;
  // NaN never passes: !(x <= 1) is true for NaN.
  result.status = result.worst_ratio <= 1.0 ? CheckStatus::pass : CheckStatus::fail;

  // PHASE 3: attribution of every |Z| peak.
  for (const Peak& p : result.peaks)
    result.attributions.push_back(attribute_peak(network, port, p, exact, options.attribution));

  // PHASE 4: part table, totals, optional branch curves.
  for (std::size_t k = 0; k < network.branch_count(); ++k) {
    PartRow row = part_row(network, static_cast<BranchId>(k), info.empty() ? nullptr : &info[k]);
    const bool capacitor = row.kind == "capacitor";
    if (capacitor) result.totals.capacitor_count += row.count;
    if (row.cost_total) result.totals.cost += *row.cost_total;
    else if (capacitor) result.totals.cost_complete = false;
    if (row.area_total) result.totals.area += *row.area_total;
    else if (capacitor) result.totals.area_complete = false;
    result.parts.push_back(std::move(row));
  }
  if (options.branch_curves) {
    for (const NetworkBranch& b : network.branches()) {
      ComplexVector z(static_cast<Eigen::Index>(grid.size()));
      for (std::size_t i = 0; i < grid.size(); ++i) z[static_cast<Eigen::Index>(i)] = b.part.impedance(grid[i]);
      result.branch_impedance.push_back(std::move(z));
    }
  }

  const std::string where = " at " + format_value(result.worst_frequency, "Hz") + " (|Z| " +
                            format_value(result.worst_magnitude, "ohm") + " against " +
                            format_value(result.worst_target, "ohm") + ")";
  if (result.status == CheckStatus::pass) {
    result.message = "meets the target: worst |Z|/Z_t " + ratio_text(result.worst_ratio) + where;
  } else {
    result.message = "exceeds the target in " + std::to_string(result.exceeded.size()) +
                     (result.exceeded.size() == 1 ? " band" : " bands") + ": worst |Z|/Z_t " +
                     ratio_text(result.worst_ratio) + where;
  }
  return result;
}

}  // namespace quietrail
