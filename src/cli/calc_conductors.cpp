// SPDX-License-Identifier: MIT
// calc sub-commands for round conductors: straight-wire inductance, via inductance and
// the skin effect.
#include <memory>

#include <CLI/CLI.hpp>
#include <fmt/core.h>

#include "cli/calc_support.hpp"
#include "quietrail/calc/inductance.hpp"
#include "quietrail/calc/skin_effect.hpp"
#include "quietrail/units.hpp"

namespace quietrail::cli::calc {
namespace {

// Below this r/delta the thin-skin and annulus forms are off by more than a few percent
// (REFERENCES section 5: ~10 % and ~0.5 % at r/delta = 5).
constexpr double kThinSkinRatio = 5.0;

// The diameter from --diameter or --awg (exactly one, unless `optional`); reports it.
std::optional<double> diameter_of(const Arg& diameter, const Arg& awg, bool optional, Report& report) {
  if (diameter.given() && awg.given()) reject(awg, "either --diameter or --awg, not both");
  if (awg.given()) {
    const int gauge = whole_number(awg);
    double d = 0.0;
    with_option_names([&] { d = awg_diameter(gauge); });
    report.input_text("awg", "gauge", fmt::format("{} AWG", awg.text));
    report.input("diameter", "diameter", d, "m");
    return d;
  }
  if (diameter.given()) {
    const double d = length(diameter);
    report.input("diameter", "diameter", d, "m");
    return d;
  }
  if (!optional) reject(diameter, "a diameter (--diameter) or a wire gauge (--awg)");
  return std::nullopt;
}

struct WireArgs {
  Arg length, diameter, awg;
};

void run_wire(const WireArgs& a, bool as_json) {
  Report report("straight round wire inductance (partial, return path not included)");
  const double l = length(a.length);
  report.input("length", "length", l, "m");
  const double d = *diameter_of(a.diameter, a.awg, false, report);
  WireInductanceResult r;
  with_option_names([&] { r = wire_inductance({.length = l, .diameter = d}); });
  const std::string per_mm = format_value(r.low_frequency / (l * 1e3), "H") + "/mm";
  report.result("low_frequency", "low frequency (Rosa)", r.low_frequency, "H", per_mm);
  report.result("high_frequency", "high frequency (surface current)", r.high_frequency, "H");
  report.result("exact_low_frequency", "low frequency, fuller form", r.exact_low_frequency, "H");
  report.note("partial self-inductance: a loop also needs its return path and the mutual term");
  report.print(as_json);
}

struct ViaArgs {
  Arg length, diameter, pitch;
};

void run_via(const ViaArgs& a, bool as_json) {
  const ViaInductanceOptions options{
      .length = length(a.length), .diameter = length(a.diameter), .pitch = maybe_length(a.pitch)};
  ViaInductanceResult r;
  with_option_names([&] { r = via_inductance(options); });
  Report report("via inductance");
  report.input("length", "via length", options.length, "m");
  report.input("diameter", "barrel diameter", options.diameter, "m");
  if (options.pitch) report.input("pitch", "pitch to return via", *options.pitch, "m");
  report.result("single", "single via (partial)", r.single, "H");
  if (r.pair) {
    report.result("pair", "via pair loop, acosh(s/2r)", *r.pair, "H");
    report.result("pair_log_form", "via pair loop, ln(s/r)", *r.pair_log_form, "H");
  }
  report.note("the single-via value ignores the return path (partial inductance)");
  report.print(as_json);
}

struct SkinArgs {
  Arg frequency, diameter, awg, length, resistivity, relative_permeability;
};

void run_skin(const SkinArgs& a, bool as_json) {
  Report report("skin effect");
  const double f = value(a.frequency, "Hz");
  const double rho = maybe_value(a.resistivity, "").value_or(kCopperResistivity);
  const double mur = maybe_value(a.relative_permeability, "").value_or(1.0);
  report.input("frequency", "frequency", f, "Hz");
  report.input("resistivity", "resistivity", rho, "ohm*m");
  if (mur != 1.0) report.input("relative_permeability", "relative permeability", mur, "");
  const std::optional<double> d = diameter_of(a.diameter, a.awg, true, report);
  if (!d) {
    if (a.length.given()) reject(a.length, "a --diameter or --awg as well (the length scales resistances)");
    double delta = 0.0, rs = 0.0;
    with_option_names([&] {
      delta = skin_depth(f, rho, mur);
      rs = surface_resistance(f, rho, mur);
    });
    report.result("skin_depth", "skin depth", delta, "m");
    report.result("surface_resistance", "surface resistance (per square)", rs, "ohm");
    report.print(as_json);
    return;
  }
  const RoundConductorOptions options{.frequency = f,
                                      .diameter = *d,
                                      .length = maybe_length(a.length).value_or(1.0),
                                      .resistivity = rho,
                                      .relative_permeability = mur};
  RoundConductorResult r;
  with_option_names([&] { r = round_conductor(options); });
  report.input("length", "length", options.length, "m");
  report.result("skin_depth", "skin depth", r.skin_depth, "m");
  report.result("surface_resistance", "surface resistance (per square)", r.surface_resistance, "ohm");
  report.result("radius_over_skin_depth", "radius / skin depth", r.radius_over_skin_depth, "");
  report.result("dc_resistance", "DC resistance", r.dc_resistance, "ohm");
  report.result("thin_skin_resistance", "AC resistance, thin-skin form", r.thin_skin_resistance, "ohm");
  report.result("annulus_resistance", "AC resistance, annulus form", r.annulus_resistance, "ohm");
  report.result("exact_resistance", "AC resistance, exact (Bessel)", r.exact_resistance, "ohm");
  report.result("resistance_ratio", "R_ac / R_dc (exact)", r.resistance_ratio, "");
  report.result("internal_inductance", "internal inductance", r.internal_inductance, "H");
  if (r.radius_over_skin_depth < kThinSkinRatio)
    report.note(
        "radius under 5 skin depths: the thin-skin and annulus forms are rough here; use the exact value");
  report.print(as_json);
}

}  // namespace

void register_wire(CLI::App& calc, Action& action) {
  auto args = std::make_shared<WireArgs>();
  const Subcommand sub = add_subcommand(
      calc, "wire",
      "Partial self-inductance of a straight round wire (Rosa / Grover): low-frequency, high-frequency and "
      "fuller forms",
      "quietrail calc wire --length 2in --awg 22");
  add_arg(*sub.app, args->length, "--length,-l", "wire length, m (e.g. 50mm, 2in)")->required();
  add_arg(*sub.app, args->diameter, "--diameter,-d", "wire diameter, m (e.g. 0.644mm, 25mil)");
  add_arg(*sub.app, args->awg, "--awg", "wire gauge instead of a diameter (e.g. 22, 0000, 4/0)");
  on_run(sub, action, [args](bool as_json) { run_wire(*args, as_json); });
}

void register_via(CLI::App& calc, Action& action) {
  auto args = std::make_shared<ViaArgs>();
  const Subcommand sub = add_subcommand(
      calc, "via",
      "Via inductance: a single via (Johnson & Graham) and, with --pitch, the loop of a power/return via "
      "pair",
      "quietrail calc via --length 1.575mm --diameter 0.3mm --pitch 1mm");
  add_arg(*sub.app, args->length, "--length,-l", "via length, m (e.g. 1.6mm, 62mil)")->required();
  add_arg(*sub.app, args->diameter, "--diameter,-d", "barrel diameter, m (e.g. 0.3mm, 12mil)")->required();
  add_arg(*sub.app, args->pitch, "--pitch", "centre spacing to the return via, m (e.g. 1mm)");
  on_run(sub, action, [args](bool as_json) { run_via(*args, as_json); });
}

void register_skin(CLI::App& calc, Action& action) {
  auto args = std::make_shared<SkinArgs>();
  const Subcommand sub = add_subcommand(
      calc, "skin",
      "Skin depth and surface resistance; with a diameter or gauge also the DC and AC resistance of a "
      "round conductor (thin-skin, annulus and exact Bessel forms). Default: annealed copper",
      "quietrail calc skin --frequency 1MHz --awg 22");
  add_arg(*sub.app, args->frequency, "--frequency,-f", "frequency, Hz (e.g. 1MHz)")->required();
  add_arg(*sub.app, args->diameter, "--diameter,-d", "conductor diameter, m (e.g. 0.644mm)");
  add_arg(*sub.app, args->awg, "--awg", "wire gauge instead of a diameter (e.g. 22)");
  add_arg(*sub.app, args->length, "--length,-l", "conductor length, m (default 1 m: per-metre values)");
  add_arg(*sub.app, args->resistivity, "--resistivity",
          "resistivity, ohm*m as a number (default 1.724e-8, annealed copper at 20 C)");
  add_arg(*sub.app, args->relative_permeability, "--relative-permeability",
          "relative permeability of the conductor (default 1)");
  on_run(sub, action, [args](bool as_json) { run_skin(*args, as_json); });
}

}  // namespace quietrail::cli::calc
