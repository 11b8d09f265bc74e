// SPDX-License-Identifier: MIT
#include "quietrail/calc/target_impedance.hpp"

#include <cmath>

#include "detail/checks.hpp"
#include "quietrail/types.hpp"

namespace quietrail {
namespace {

// Rise-time rule: the bandwidth of a 10-90 % edge is about 0.35 / t_r (common practice;
// Johnson & Graham 1993; Bogatin 2009).
constexpr double kKneeFactor = 0.35;

void require_fraction(double v, const std::string& file, const std::string& field) {
  require_input(std::isfinite(v) && v > 0.0 && v <= 1.0, {file, field}, "a fraction in (0, 1]",
                detail::describe_number(v, ""));
}

}  // namespace

void TargetImpedanceOptions::validate(const std::string& file, const std::string& path) const {
  detail::require_positive(voltage, file, path + "/voltage", "V");
  require_fraction(ripple, file, path + "/ripple");
  require_fraction(step_fraction, file, path + "/step_fraction");
  require_input(current_step || max_current || power, {file, path + "/current_step"},
                "a current step, a maximum current or a load power");
  require_input(!(max_current && power), {file, path + "/power"},
                "either a maximum current or a load power, not both");
  if (current_step) detail::require_positive(*current_step, file, path + "/current_step", "A");
  if (max_current) detail::require_positive(*max_current, file, path + "/max_current", "A");
  if (power) detail::require_positive(*power, file, path + "/power", "W");
  if (current_step && max_current) {
    require_input(
        *current_step <= *max_current, {file, path + "/current_step"},
        "a current step no larger than the maximum current " + detail::describe_number(*max_current, "A"),
        detail::describe_number(*current_step, "A"));
  }
  if (rise_time) detail::require_positive(*rise_time, file, path + "/rise_time", "s");
  if (handoff_frequency)
    detail::require_positive(*handoff_frequency, file, path + "/handoff_frequency", "Hz");
}

TargetImpedanceResult target_impedance(const TargetImpedanceOptions& options) {
  options.validate();
  TargetImpedanceResult result;
  if (options.current_step) {
    result.current_step = *options.current_step;
    result.current_step_source = CurrentStepSource::given;
  } else if (options.max_current) {
    result.current_step = options.step_fraction * *options.max_current;
    result.current_step_source = CurrentStepSource::max_current;
  } else {
    result.current_step = options.step_fraction * *options.power / options.voltage;
    result.current_step_source = CurrentStepSource::power;
  }
  result.ripple_voltage = options.voltage * options.ripple;
  result.impedance = result.ripple_voltage / result.current_step;
  require_input(std::isfinite(result.impedance) && result.impedance > 0.0, {"", ""},
                "a rail whose target impedance stays within double precision", "an overflow or underflow");
  if (options.rise_time) {
    result.knee_frequency = kKneeFactor / *options.rise_time;
    result.corner_frequency = 1.0 / (kPi * *options.rise_time);
  }
  if (options.handoff_frequency) {
    result.required_capacitance = 1.0 / (kTwoPi * *options.handoff_frequency * result.impedance);
  }
  return result;
}

}  // namespace quietrail
