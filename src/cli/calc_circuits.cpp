// SPDX-License-Identifier: MIT
// calc sub-commands for lumped circuits: LC resonance, a part's self-resonance with its
// mounting, and the target impedance of a rail.
#include <memory>

#include <CLI/CLI.hpp>
#include <fmt/core.h>

#include "cli/calc_support.hpp"
#include "quietrail/calc/resonance.hpp"
#include "quietrail/calc/self_resonance.hpp"
#include "quietrail/calc/target_impedance.hpp"
#include "quietrail/units.hpp"

namespace quietrail::cli::calc {
namespace {

struct ResonanceArgs {
  Arg frequency, inductance, capacitance;
};

void run_resonance(const ResonanceArgs& a, bool as_json) {
  const int given = int{a.frequency.given()} + int{a.inductance.given()} + int{a.capacitance.given()};
  if (given != 2) {
    throw InputError({"command line", "--frequency/--inductance/--capacitance"},
                     "exactly two of --frequency, --inductance and --capacitance",
                     std::to_string(given) + " of them");
  }
  const LcResonanceOptions options{.frequency = maybe_value(a.frequency, "Hz"),
                                   .inductance = maybe_value(a.inductance, "H"),
                                   .capacitance = maybe_value(a.capacitance, "F")};
  LcResonanceResult r;
  with_option_names([&] { r = lc_resonance(options); });
  Report report("LC resonance");
  if (options.frequency) report.input("frequency", "frequency", *options.frequency, "Hz");
  if (options.inductance) report.input("inductance", "inductance", *options.inductance, "H");
  if (options.capacitance) report.input("capacitance", "capacitance", *options.capacitance, "F");
  if (!options.frequency) report.result("frequency", "resonant frequency", r.frequency, "Hz");
  if (!options.inductance) report.result("inductance", "inductance", r.inductance, "H");
  if (!options.capacitance) report.result("capacitance", "capacitance", r.capacitance, "F");
  report.result("characteristic_impedance", "characteristic impedance sqrt(L/C)", r.characteristic_impedance,
                "ohm");
  report.print(as_json);
}

struct SelfResonanceArgs {
  Arg capacitance, esr, esl, mounting_inductance, package;
  Arg via_length, via_diameter, via_pitch, trace_length, trace_width, trace_height, vias_per_terminal;
};

std::optional<MountingGeometry> geometry_of(const SelfResonanceArgs& a) {
  const Arg* parts[] = {&a.via_length,  &a.via_diameter, &a.via_pitch,        &a.trace_length,
                        &a.trace_width, &a.trace_height, &a.vias_per_terminal};
  bool any = false;
  for (const Arg* p : parts) any = any || p->given();
  if (!any) return std::nullopt;
  for (const Arg* p : {&a.via_length, &a.via_diameter, &a.via_pitch})
    if (!p->given())
      reject(*p, "a value: a mounting geometry needs --via-length, --via-diameter and --via-pitch");
  MountingGeometry g{.via_length = length(a.via_length),
                     .via_diameter = length(a.via_diameter),
                     .via_pitch = length(a.via_pitch)};
  g.trace_length = maybe_length(a.trace_length).value_or(0.0);
  g.trace_width = maybe_length(a.trace_width).value_or(0.0);
  g.trace_height = maybe_length(a.trace_height).value_or(0.0);
  if (a.vias_per_terminal.given()) g.vias_per_terminal = whole_number(a.vias_per_terminal);
  return g;
}

void run_self_resonance(const SelfResonanceArgs& a, bool as_json) {
  SelfResonanceOptions options;
  options.capacitor.capacitance = value(a.capacitance, "F");
  options.capacitor.esr = maybe_value(a.esr, "ohm").value_or(0.0);
  options.capacitor.esl = maybe_value(a.esl, "H").value_or(0.0);
  options.mounting_inductance = maybe_value(a.mounting_inductance, "H");
  if (a.package.given()) {
    options.package = parse_package(a.package.text);
    if (!options.package)
      reject(a.package, "a package code: 0201, 0402, 0603, 0805, 1206 or 1210", "'" + a.package.text + "'");
  }
  options.geometry = geometry_of(a);
  SelfResonanceResult r;
  with_option_names([&] { r = self_resonance(options); });

  Report report("self-resonance of a mounted capacitor");
  report.input("capacitance", "capacitance", options.capacitor.capacitance, "F");
  report.input("esr", "ESR", options.capacitor.esr, "ohm");
  report.input("esl", "ESL (body)", options.capacitor.esl, "H");
  if (options.package) report.input_text("package", "package", std::string(to_string(*options.package)));
  report.result("mounting_inductance", "mounting inductance", r.mounting_inductance, "H",
                std::string(to_string(r.mounting_source)));
  report.result("total_inductance", "total inductance", r.total_inductance, "H");
  report.result("frequency", "self-resonant frequency", r.frequency, "Hz");
  report.result("impedance_at_resonance", "|Z| at SRF", r.impedance_at_resonance, "ohm");
  report.result("characteristic_reactance", "characteristic reactance", r.characteristic_reactance, "ohm");
  report.result("quality_factor", "resonant Q", r.quality_factor, "");
  if (r.capacitive_band) {
    report.result("capacitive_band_low", "capacitive from", r.capacitive_band->low, "Hz",
                  r.capacitive_band->low == 0.0 ? "DC" : "");
    report.result("capacitive_band_high", "capacitive up to", r.capacitive_band->high, "Hz");
  } else {
    report.result_text("capacitive_band", "capacitive band",
                       "none (ESR exceeds the characteristic reactance)");
  }
  if (r.mounting_source == MountingSource::typical_package)
    report.note("typical mounting for the package (short fan-out, vias at the pads); a planning default");
  report.note("the part acts as a capacitor where its phase is below -45 degrees");
  report.print(as_json);
}

struct TargetArgs {
  Arg voltage, ripple, current_step, max_current, power, step_fraction, rise_time, handoff_frequency;
};

void run_target(const TargetArgs& a, bool as_json) {
  TargetImpedanceOptions options{.voltage = value(a.voltage, "V"), .ripple = fraction(a.ripple)};
  options.current_step = maybe_value(a.current_step, "A");
  options.max_current = maybe_value(a.max_current, "A");
  options.power = maybe_value(a.power, "W");
  if (a.step_fraction.given()) options.step_fraction = fraction(a.step_fraction);
  options.rise_time = maybe_value(a.rise_time, "s");
  options.handoff_frequency = maybe_value(a.handoff_frequency, "Hz");
  TargetImpedanceResult r;
  with_option_names([&] { r = target_impedance(options); });

  Report report("target impedance");
  report.input("voltage", "rail voltage", options.voltage, "V");
  report.input("ripple", "ripple", options.ripple, "%");
  if (options.max_current) report.input("max_current", "maximum current", *options.max_current, "A");
  if (options.power) report.input("power", "load power", *options.power, "W");
  if (r.current_step_source != CurrentStepSource::given)
    report.input("step_fraction", "step fraction", options.step_fraction, "%");
  report.result("ripple_voltage", "ripple voltage", r.ripple_voltage, "V");
  report.result("current_step", "current step", r.current_step, "A",
                r.current_step_source == CurrentStepSource::given
                    ? "given"
                    : fmt::format("{:g} % of the maximum current", 100.0 * options.step_fraction));
  report.result("impedance", "target impedance", r.impedance, "ohm");
  if (r.knee_frequency) {
    report.result("knee_frequency", "band edge 0.35/t_r", *r.knee_frequency, "Hz");
    report.result("corner_frequency", "band edge 1/(pi t_r)", *r.corner_frequency, "Hz");
  }
  if (r.required_capacitance)
    report.result("required_capacitance", "capacitance at handoff", *r.required_capacitance, "F",
                  "1/(2 pi f_low Z_t)");
  report.note("hold |Z| below the target from the regulator handoff up to the band edge");
  report.print(as_json);
}

}  // namespace

void register_resonance(CLI::App& calc, Action& action) {
  auto args = std::make_shared<ResonanceArgs>();
  const Subcommand sub =
      add_subcommand(calc, "resonance",
                     "LC resonance: give exactly two of frequency, inductance, capacitance; get the third",
                     "quietrail calc resonance --frequency 10MHz --capacitance 1p");
  add_arg(*sub.app, args->frequency, "--frequency,-f", "resonant frequency, Hz (e.g. 22.5MHz)");
  add_arg(*sub.app, args->inductance, "--inductance,-L", "inductance, H (e.g. 0.5nH)");
  add_arg(*sub.app, args->capacitance, "--capacitance,-C", "capacitance, F (e.g. 100n)");
  on_run(sub, action, [args](bool as_json) { run_resonance(*args, as_json); });
}

void register_self_resonance(CLI::App& calc, Action& action) {
  auto args = std::make_shared<SelfResonanceArgs>();
  const Subcommand sub = add_subcommand(
      calc, "self-resonance",
      "Self-resonance of a capacitor with its mounting: SRF, |Z| at SRF, characteristic reactance, Q, "
      "capacitive band. Mounting: --mounting-inductance, or --package, or the via geometry options",
      "quietrail calc self-resonance --capacitance 100n --esl 0.3n --esr 20m --package 0402");
  add_arg(*sub.app, args->capacitance, "--capacitance,-C", "capacitance, F")->required();
  add_arg(*sub.app, args->esr, "--esr", "equivalent series resistance, ohm (default 0)");
  add_arg(*sub.app, args->esl, "--esl", "body equivalent series inductance, H (default 0)");
  add_arg(*sub.app, args->mounting_inductance, "--mounting-inductance", "mounting loop inductance, H");
  add_arg(*sub.app, args->package, "--package",
          "typical mounting of a package: 0201 0402 0603 0805 1206 1210");
  add_arg(*sub.app, args->via_length, "--via-length",
          "geometry: via length to the plane pair, m (or in/mil)");
  add_arg(*sub.app, args->via_diameter, "--via-diameter", "geometry: via barrel diameter, m");
  add_arg(*sub.app, args->via_pitch, "--via-pitch", "geometry: power-to-ground via centre spacing, m");
  add_arg(*sub.app, args->trace_length, "--trace-length",
          "geometry: each fan-out trace length, m (default 0)");
  add_arg(*sub.app, args->trace_width, "--trace-width", "geometry: fan-out trace width, m");
  add_arg(*sub.app, args->trace_height, "--trace-height", "geometry: trace height above its plane, m");
  add_arg(*sub.app, args->vias_per_terminal, "--vias-per-terminal",
          "geometry: via pairs in parallel (default 1)");
  on_run(sub, action, [args](bool as_json) { run_self_resonance(*args, as_json); });
}

void register_target(CLI::App& calc, Action& action) {
  auto args = std::make_shared<TargetArgs>();
  const Subcommand sub = add_subcommand(
      calc, "target",
      "Target impedance Z_t = V * ripple / dI, with dI given or a fraction of the maximum current; "
      "optional band edge from the rise time and capacitance at the regulator handoff",
      "quietrail calc target --voltage 1.0 --ripple 5% --max-current 10 --rise-time 1ns --handoff-frequency "
      "50k");
  add_arg(*sub.app, args->voltage, "--voltage,-V", "rail voltage, V")->required();
  add_arg(*sub.app, args->ripple, "--ripple", "allowed ripple, fraction or percent (e.g. 0.05 or 5%)")
      ->required();
  add_arg(*sub.app, args->current_step, "--current-step", "transient current step dI, A");
  add_arg(*sub.app, args->max_current, "--max-current", "maximum load current, A (step = fraction of it)");
  add_arg(*sub.app, args->power, "--power", "load power, W (maximum current = P / V)");
  add_arg(*sub.app, args->step_fraction, "--step-fraction",
          "step as a fraction of the maximum current (default 0.5, the Smith et al. 1999 assumption)");
  add_arg(*sub.app, args->rise_time, "--rise-time", "10-90 % rise time of the load current, s (e.g. 1ns)");
  add_arg(*sub.app, args->handoff_frequency, "--handoff-frequency",
          "regulator handoff frequency, Hz (e.g. 50k)");
  on_run(sub, action, [args](bool as_json) { run_target(*args, as_json); });
}

}  // namespace quietrail::cli::calc
