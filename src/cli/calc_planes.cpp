// SPDX-License-Identifier: MIT
// calc sub-commands for plane pairs: capacitance and sheet inductance, cavity modes.
#include <memory>

#include <CLI/CLI.hpp>
#include <fmt/core.h>

#include "cli/calc_support.hpp"
#include "quietrail/calc/plane.hpp"
#include "quietrail/units.hpp"

namespace quietrail::cli::calc {
namespace {

constexpr double kSquareInch = 0.0254 * 0.0254;  // m^2
constexpr double kSquareCm = 1e-4;               // m^2
constexpr int kDefaultModes = 10;
constexpr int kDefaultModesUpToFrequency = 100;  // when a frequency limit is the real bound

struct PlaneArgs {
  Arg length, width, separation, relative_permittivity;
};

void run_plane(const PlaneArgs& a, bool as_json) {
  PlanePairOptions options{
      .length = length(a.length), .width = length(a.width), .separation = length(a.separation)};
  if (a.relative_permittivity.given()) options.relative_permittivity = value(a.relative_permittivity, "");
  PlanePairResult r;
  with_option_names([&] { r = plane_pair(options); });
  Report report("plane pair");
  report.input("length", "length", options.length, "m");
  report.input("width", "width", options.width, "m");
  report.input("separation", "dielectric thickness", options.separation, "m");
  report.input("relative_permittivity", "relative permittivity", options.relative_permittivity, "");
  report.result("area", "area", r.area, "m^2",
                fmt::format("{:.4g} cm^2, {:.4g} in^2", r.area / kSquareCm, r.area / kSquareInch));
  report.result("capacitance", "capacitance", r.capacitance, "F");
  report.result("capacitance_per_area", "capacitance per area", r.capacitance_per_area, "F/m^2",
                format_value(r.capacitance_per_area * kSquareCm, "F") + "/cm^2, " +
                    format_value(r.capacitance_per_area * kSquareInch, "F") + "/in^2");
  report.result("sheet_inductance", "sheet inductance (per square)", r.sheet_inductance, "H");
  report.note("lumped values, valid well below the first cavity resonance (see: quietrail calc cavity)");
  report.print(as_json);
}

struct CavityArgs {
  Arg length, width, relative_permittivity, max_frequency, count;
};

void run_cavity(const CavityArgs& a, bool as_json) {
  CavityOptions options{.length = length(a.length), .width = length(a.width)};
  if (a.relative_permittivity.given()) options.relative_permittivity = value(a.relative_permittivity, "");
  if (a.max_frequency.given()) options.max_frequency = value(a.max_frequency, "Hz");
  options.count = a.count.given() ? whole_number(a.count)
                                  : (a.max_frequency.given() ? kDefaultModesUpToFrequency : kDefaultModes);
  std::vector<CavityMode> modes;
  with_option_names([&] { modes = cavity_modes(options); });
  Report report("plane cavity resonances (open edges)");
  report.input("length", "length (m index)", options.length, "m");
  report.input("width", "width (n index)", options.width, "m");
  report.input("relative_permittivity", "relative permittivity", options.relative_permittivity, "");
  if (a.max_frequency.given()) report.input("max_frequency", "up to", options.max_frequency, "Hz");
  std::vector<std::string> lines{fmt::format("{:<8}{}", "mode", "frequency")};
  nlohmann::json list = nlohmann::json::array();
  for (const CavityMode& m : modes) {
    lines.push_back(
        fmt::format("{:<8}{}", fmt::format("({},{})", m.m, m.n), format_value(m.frequency, "Hz")));
    list.push_back({{"m", m.m}, {"n", m.n}, {"frequency", m.frequency}});
  }
  report.result_count("count", "modes listed", static_cast<int>(modes.size()));
  report.table("modes", std::move(lines), std::move(list));
  report.note(
      "f_mn = c / (2 sqrt(er)) * sqrt((m/a)^2 + (n/b)^2); mode (m,n) has m half-waves along the length");
  report.print(as_json);
}

}  // namespace

void register_plane(CLI::App& calc, Action& action) {
  auto args = std::make_shared<PlaneArgs>();
  const Subcommand sub = add_subcommand(
      calc, "plane", "Plane-pair capacitance eps0 er A / d and sheet inductance mu0 h per square",
      "quietrail calc plane --length 10in --width 8in --separation 4mil --relative-permittivity 4.3");
  add_arg(*sub.app, args->length, "--length,-a", "plane length, m (e.g. 254mm, 10in)")->required();
  add_arg(*sub.app, args->width, "--width,-b", "plane width, m (e.g. 203mm, 8in)")->required();
  add_arg(*sub.app, args->separation, "--separation,-t", "dielectric thickness, m (e.g. 100u, 4mil)")
      ->required();
  add_arg(*sub.app, args->relative_permittivity, "--relative-permittivity,--er",
          "relative permittivity (default 4.3, a mid FR-4 value)");
  on_run(sub, action, [args](bool as_json) { run_plane(*args, as_json); });
}

void register_cavity(CLI::App& calc, Action& action) {
  auto args = std::make_shared<CavityArgs>();
  const Subcommand sub = add_subcommand(
      calc, "cavity",
      "Resonant modes of a rectangular plane pair with open edges, lowest first, up to a count or a "
      "maximum frequency",
      "quietrail calc cavity --length 10in --width 8in --relative-permittivity 4.3 --count 5");
  add_arg(*sub.app, args->length, "--length,-a", "plane length, m (e.g. 10in)")->required();
  add_arg(*sub.app, args->width, "--width,-b", "plane width, m (e.g. 8in)")->required();
  add_arg(*sub.app, args->relative_permittivity, "--relative-permittivity,--er",
          "relative permittivity (default 4.3, a mid FR-4 value)");
  add_arg(*sub.app, args->max_frequency, "--max-frequency",
          "list modes up to this frequency, Hz (e.g. 1GHz)");
  add_arg(*sub.app, args->count, "--count,-n",
          "most modes to list, 1-1000 (default 10, or 100 with --max-frequency)");
  on_run(sub, action, [args](bool as_json) { run_cavity(*args, as_json); });
}

}  // namespace quietrail::cli::calc
