// SPDX-License-Identifier: MIT
// `quietrail sweep`: read a network file, solve the port impedance over the band, write
// the curve as CSV and print a summary (text or JSON). Schema: docs/network_file.md.
#include <algorithm>
#include <charconv>
#include <cmath>
#include <filesystem>
#include <limits>
#include <memory>
#include <optional>
#include <string>
#include <variant>
#include <vector>

#include <CLI/CLI.hpp>
#include <fmt/core.h>
#include <nlohmann/json.hpp>

#include "cli/commands.hpp"
#include "cli/exit_code.hpp"
#include "cli/file_names.hpp"
#include "cli/terminal.hpp"
#include "quietrail/error.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/io/atomic_file.hpp"
#include "quietrail/io/network_file.hpp"
#include "quietrail/models/part_response.hpp"
#include "quietrail/network/nodal_solver.hpp"
#include "quietrail/network/parallel_solver.hpp"
#include "quietrail/network/topology.hpp"
#include "quietrail/report/csv_curves.hpp"
#include "quietrail/units.hpp"
#include "detail/overloaded.hpp"

namespace quietrail::cli {
namespace {

namespace fs = std::filesystem;
// Ordered, so the JSON report reads in the order it is built.
using Json = nlohmann::ordered_json;

constexpr const char* kCommandLine = "command line";

struct SweepArgs {
  std::string network_file;
  std::string out_dir;
  std::string start;
  std::string stop;
  std::string points_per_decade;
  bool json = false;
};

// ---------------------------------------------------------------- options

int parse_whole_number(const std::string& text, const std::string& option) {
  int value = 0;
  const char* first = text.data() + (text.starts_with('+') ? 1 : 0);
  const auto [end, error] = std::from_chars(first, text.data() + text.size(), value);
  if (text.empty() || error != std::errc() || end != text.data() + text.size())
    throw InputError({kCommandLine, option}, "a whole number such as 50", fmt::format("'{}'", text));
  return value;
}

// The file's sweep with the command-line overrides applied and validated. A failure is
// reported against the options given, since the file's own values were valid.
FrequencyGridOptions sweep_options(const NetworkFile& network, const SweepArgs& args) {
  FrequencyGridOptions sweep = network.sweep;
  std::vector<std::string> given;
  if (!args.start.empty()) {
    sweep.start = parse_value(args.start, "Hz", {kCommandLine, "--start"});
    given.push_back("--start");
  }
  if (!args.stop.empty()) {
    sweep.stop = parse_value(args.stop, "Hz", {kCommandLine, "--stop"});
    given.push_back("--stop");
  }
  if (!args.points_per_decade.empty()) {
    sweep.points_per_decade = parse_whole_number(args.points_per_decade, "--points-per-decade");
    given.push_back("--points-per-decade");
  }
  try {
    sweep.validate();
  } catch (const InputError& e) {
    std::string options;
    for (const auto& option : given) options.append(options.empty() ? "" : ", ").append(option);
    throw InputError({kCommandLine, fmt::format("{} ({})", options, e.where().field)}, e.expected(), e.found());
  }
  return sweep;
}

// ---------------------------------------------------------------- per-branch figures

struct BranchFacts {
  std::string value_text = "-";  // the defining value (C, L or R)
  double value = std::numeric_limits<double>::quiet_NaN();
  std::string value_unit;
  std::optional<double> resistance;         // ESR, DC resistance or R_out, ohm
  std::optional<double> series_inductance;  // ESL, series or spreading L, H
  std::optional<double> srf;                // Hz, with mounting for capacitors and planes
  std::optional<Band> capacitive;           // where the mounted part acts as a capacitor
};


BranchFacts facts_for(const MountedPart& part) {
  BranchFacts f;
  std::visit(detail::Overloaded{
                 [&](const Capacitor& c) {
                   f.value = c.capacitance;
                   f.value_unit = "F";
                   f.resistance = c.esr;
                   f.series_inductance = c.esl;
                   f.srf = self_resonant_frequency(c, part.mounting_inductance);
                   f.capacitive = capacitive_band(part);
                 },
                 [&](const PlanePair& p) {
                   // A lumped plane pair is a series RLC like a capacitor (plane_pair.hpp).
                   f.value = p.capacitance();
                   f.value_unit = "F";
                   f.resistance = p.series_resistance;
                   f.series_inductance = p.spreading_inductance;
                   f.srf = self_resonant_frequency(
                       Capacitor{.capacitance = p.capacitance(), .esr = p.series_resistance,
                                 .esl = p.spreading_inductance},
                       part.mounting_inductance);
                   f.capacitive = capacitive_band(part);
                 },
                 [&](const Inductor& l) {
                   f.value = l.inductance;
                   f.value_unit = "H";
                   f.resistance = l.dc_resistance;
                   f.srf = self_resonant_frequency(l);
                 },
                 [&](const Regulator& r) {
                   f.value = r.inductance;
                   f.value_unit = "H";
                   f.resistance = r.resistance;
                 },
                 [&](const Resistor& r) {
                   f.value = r.resistance;
                   f.value_unit = "ohm";
                   f.series_inductance = r.series_inductance;
                 },
             },
             part.element);
  f.value_text = format_value(f.value, f.value_unit);
  return f;
}

std::string text_or_dash(const std::optional<double>& value, const char* unit) {
  return value ? format_value(*value, unit) : std::string("-");
}

std::string band_text(const std::optional<Band>& band) {
  if (!band) return "-";
  if (std::isinf(band->high))
    return band->low > 0.0 ? fmt::format("above {}", format_value(band->low, "Hz")) : std::string("everywhere");
  if (band->low <= 0.0) return fmt::format("DC to {}", format_value(band->high, "Hz"));
  return fmt::format("{} to {}", format_value(band->low, "Hz"), format_value(band->high, "Hz"));
}

Json json_or_null(const std::optional<double>& value) {
  return value && std::isfinite(*value) ? Json(*value) : Json(nullptr);
}

// ---------------------------------------------------------------- the run

struct Extreme {
  double magnitude = std::numeric_limits<double>::quiet_NaN();
  double frequency = std::numeric_limits<double>::quiet_NaN();
};

struct Outcome {
  std::string solver;  // "parallel" or "nodal"
  std::string solver_text;
  Extreme lowest;
  Extreme highest;
  std::size_t unsolved = 0;  // grid points without a finite impedance
};

Outcome summarise(const FrequencyGrid& grid, const ComplexVector& z) {
  Outcome out;
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const double m = std::abs(z[static_cast<Eigen::Index>(i)]);
    if (!std::isfinite(m)) {
      ++out.unsolved;
      continue;
    }
    if (std::isnan(out.lowest.magnitude) || m < out.lowest.magnitude) out.lowest = {m, grid[i]};
    if (std::isnan(out.highest.magnitude) || m > out.highest.magnitude) out.highest = {m, grid[i]};
  }
  return out;
}

std::string extreme_text(const Extreme& e) {
  if (std::isnan(e.magnitude)) return "n/a";
  return format_value(e.magnitude, "ohm") + " at " + format_value(e.frequency, "Hz");
}

Json extreme_json(const Extreme& e) {
  if (std::isnan(e.magnitude)) return nullptr;
  return Json{{"ohm", e.magnitude}, {"frequency_hz", e.frequency}};
}

void print_text(const NetworkFile& nf, const fs::path& input, const FrequencyGridOptions& sweep,
                const FrequencyGrid& grid, const Outcome& outcome, const std::vector<BranchFacts>& facts,
                const fs::path& csv) {
  const bool colour = colour_enabled(stdout);
  const auto& network = nf.network;
  fmt::print("{}\n", paint(fmt::format("Sweep of {}", nf.name), Tone::heading, colour));
  fmt::print("  File      {}\n", input.string());
  fmt::print("  Port      {} (ground {})\n", network.node_name(nf.port), network.node_name(Network::kGround));
  fmt::print("  Band      {} to {}, {} points ({} per decade)\n", format_value(sweep.start, "Hz"),
             format_value(sweep.stop, "Hz"), grid.size(), sweep.points_per_decade);
  fmt::print("  Solver    {}\n", outcome.solver_text);
  fmt::print("  |Z| min   {}\n", extreme_text(outcome.lowest));
  fmt::print("  |Z| max   {}\n", extreme_text(outcome.highest));
  if (outcome.unsolved > 0)
    fmt::print("  {}\n", paint(fmt::format("{} of {} grid points have no finite impedance (singular there)",
                                           outcome.unsolved, grid.size()),
                               Tone::warning, colour));
  fmt::print("\n{}\n", paint("Branches", Tone::heading, colour));

  using Align = TextTable::Align;
  TextTable table({"Branch", "Kind", "Nodes", "Count", "Value", "R", "L series", "L mount", "SRF mounted",
                   "Capacitive band"},
                  {Align::left, Align::left, Align::left, Align::right, Align::right, Align::right, Align::right,
                   Align::right, Align::right, Align::left});
  for (std::size_t k = 0; k < network.branches().size(); ++k) {
    const auto& b = network.branches()[k];
    const auto& f = facts[k];
    table.add_row({b.name, nf.branch_kinds[k], network.node_name(b.from) + "-" + network.node_name(b.to),
                   std::to_string(b.part.count), f.value_text, text_or_dash(f.resistance, "ohm"),
                   text_or_dash(f.series_inductance, "H"), format_value(b.part.mounting_inductance, "H"),
                   text_or_dash(f.srf, "Hz"), band_text(f.capacitive)});
  }
  fmt::print("{}", table.render(colour));
  fmt::print("  Value is C for capacitors and planes, L for inductors, beads and regulators, R for resistors.\n");
  fmt::print("\nWrote {}\n", csv.string());
  fmt::print("{}\n", paint(kCaution, Tone::warning, colour));
}

void print_json(const NetworkFile& nf, const fs::path& input, const FrequencyGridOptions& sweep,
                const FrequencyGrid& grid, const Outcome& outcome, const std::vector<BranchFacts>& facts,
                const fs::path& csv) {
  const auto& network = nf.network;
  Json branches = Json::array();
  for (std::size_t k = 0; k < network.branches().size(); ++k) {
    const auto& b = network.branches()[k];
    const auto& f = facts[k];
    Json band = nullptr;
    if (f.capacitive) {
      band = Json{{"low_hz", f.capacitive->low},
                  {"high_hz", std::isinf(f.capacitive->high) ? Json(nullptr) : Json(f.capacitive->high)}};
    }
    branches.push_back(Json{{"name", b.name},
                            {"kind", nf.branch_kinds[k]},
                            {"from", network.node_name(b.from)},
                            {"to", network.node_name(b.to)},
                            {"count", b.part.count},
                            {"value", json_or_null(f.value)},
                            {"value_unit", f.value_unit},
                            {"resistance_ohm", json_or_null(f.resistance)},
                            {"series_inductance_h", json_or_null(f.series_inductance)},
                            {"mounting_inductance_h", b.part.mounting_inductance},
                            {"srf_hz", json_or_null(f.srf)},
                            {"capacitive_band", band}});
  }
  const Json report{{"network", nf.name},
                    {"file", input.string()},
                    {"port", network.node_name(nf.port)},
                    {"ground", network.node_name(Network::kGround)},
                    {"band",
                     {{"start_hz", sweep.start},
                      {"stop_hz", sweep.stop},
                      {"points_per_decade", sweep.points_per_decade},
                      {"points", grid.size()}}},
                    {"solver", outcome.solver},
                    {"min_impedance", extreme_json(outcome.lowest)},
                    {"max_impedance", extreme_json(outcome.highest)},
                    {"unsolved_points", outcome.unsolved},
                    {"branches", branches},
                    {"csv", csv.string()},
                    {"caution", kCaution}};
  fmt::print("{}\n", report.dump(2));
}

int run_sweep(const SweepArgs& args) {
  // Everything that can fail on bad input happens before anything is written.
  const fs::path input = args.network_file;
  const NetworkFile nf = read_network_file(input);
  const FrequencyGridOptions sweep = sweep_options(nf, args);
  const FrequencyGrid grid(sweep);

  const fs::path out_dir = args.out_dir.empty() ? fs::path("out") / input.stem() : fs::path(args.out_dir);
  const fs::path csv = out_dir / (file_stem_for(nf.name, input.stem().string()) + "_impedance.csv");
  check_not_an_input(csv, {input});

  Outcome outcome;
  ComplexVector z;
  if (is_all_parallel(nf.network, nf.port)) {
    z = ParallelSolver::for_network(nf.network, nf.port, grid).impedance(nf.network.counts());
    outcome = summarise(grid, z);
    outcome.solver = "parallel";
    outcome.solver_text = fmt::format("parallel fast path (all {} branches join {} to ground)",
                                      nf.network.branches().size(), nf.network.node_name(nf.port));
  } else {
    z = solve_port_impedance(nf.network, nf.port, grid);
    outcome = summarise(grid, z);
    outcome.solver = "nodal";
    outcome.solver_text = fmt::format("nodal analysis ({} nodes, {} branches)", nf.network.node_count(),
                                      nf.network.branches().size());
  }

  std::vector<BranchFacts> facts;
  for (const auto& b : nf.network.branches()) facts.push_back(facts_for(b.part));

  std::error_code error;
  fs::create_directories(out_dir, error);
  if (error)
    throw InputError({out_dir.string(), "--out"}, "an output directory that exists or can be created",
                     error.message());
  write_impedance_csv(csv, grid, z, {}, {input});

  if (args.json) print_json(nf, input, sweep, grid, outcome, facts, csv);
  else print_text(nf, input, sweep, grid, outcome, facts, csv);
  return kExitOk;
}

}  // namespace

void register_sweep(CLI::App& app, Action& action) {
  auto args = std::make_shared<SweepArgs>();
  CLI::App* sub = app.add_subcommand(
      "sweep", "Impedance of a rail network over frequency: writes <out>/<name>_impedance.csv and prints a summary");
  sub->add_option("network", args->network_file, "network file (JSON; see docs/network_file.md)")->required();
  sub->add_option("--out", args->out_dir, "output directory (default: out/<network file stem>)");
  sub->add_option("--start", args->start, "lowest frequency, overrides the file (e.g. 1k)");
  sub->add_option("--stop", args->stop, "highest frequency, overrides the file (e.g. 1G)");
  sub->add_option("--points-per-decade", args->points_per_decade, "grid density, overrides the file (e.g. 50)");
  sub->add_flag("--json", args->json, "print the summary as JSON on stdout");
  sub->footer("Example: quietrail sweep examples/projects/core_rail_network.json --out out/core");
  sub->callback([&action, args] { action = [args] { return run_sweep(*args); }; });
}

}  // namespace quietrail::cli
