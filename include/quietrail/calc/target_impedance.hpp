// SPDX-License-Identifier: MIT
// Target impedance of a rail from its voltage, ripple budget and load-current step,
// with the frequency band it must hold over and the capacitance that band needs.
#pragma once

#include <optional>
#include <string>

namespace quietrail {

/// A rail specification. The current step is taken from the first of `current_step`,
/// `max_current` or `power` that is given (the last two scaled by `step_fraction`).
struct TargetImpedanceOptions {
  /// Rail voltage, V. > 0.
  double voltage = 0.0;
  /// Allowed ripple as a fraction of the voltage, in (0, 1] (0.05 = 5 %).
  double ripple = 0.0;
  /// Transient current step dI, A. > 0 and, when `max_current` is also given, <= it.
  std::optional<double> current_step{};
  /// Maximum load current I_max, A. > 0. Used when no current step is given.
  std::optional<double> max_current{};
  /// Load power P, W. > 0. Gives I_max = P / V when neither current is given; not
  /// together with `max_current`.
  std::optional<double> power{};
  /// Fraction of I_max taken as the step, in (0, 1]. Default 0.5: the assumption of
  /// Smith et al. 1999 (from memory).
  double step_fraction = 0.5;
  /// 10-90 % rise time of the load current, s. > 0. Gives the upper band edge.
  std::optional<double> rise_time{};
  /// Regulator handoff (lower band edge), Hz. > 0. Gives the capacitance needed there.
  std::optional<double> handoff_frequency{};

  /// Throws InputError naming `path` + "/voltage", "/ripple", "/current_step",
  /// "/max_current", "/power", "/step_fraction", "/rise_time" or "/handoff_frequency".
  void validate(const std::string& file = {}, const std::string& path = {}) const;
};

/// Where the current step of a target-impedance calculation came from.
enum class CurrentStepSource {
  given,        ///< current_step
  max_current,  ///< step_fraction * max_current
  power,        ///< step_fraction * power / voltage
};

/// Target impedance and its band (SI units).
struct TargetImpedanceResult {
  /// Current step used, A.
  double current_step = 0.0;
  /// How the current step was obtained.
  CurrentStepSource current_step_source = CurrentStepSource::given;
  /// Allowed ripple voltage V * r, V.
  double ripple_voltage = 0.0;
  /// Target impedance Z_t = V r / dI, ohm.
  double impedance = 0.0;
  /// Upper band edge 0.35 / t_r, Hz (common practice; Johnson & Graham 1993), when a rise
  /// time is given.
  std::optional<double> knee_frequency{};
  /// Lower reading of the upper edge, 1 / (pi t_r), Hz, when a rise time is given.
  std::optional<double> corner_frequency{};
  /// Capacitance that keeps |Z| <= Z_t down to the handoff frequency,
  /// C >= 1 / (2 pi f_low Z_t), F, when a handoff frequency is given.
  std::optional<double> required_capacitance{};
};

/// Target impedance Z_t = V * r / dI with dI = step_fraction * I_max when no step is
/// given (Smith, Anderson, Forehand, Pelc & Roy, "Power distribution system design
/// methodology and capacitor selection for modern CMOS technology", IEEE Trans. Adv.
/// Packaging 22(3), 1999). Validates first.
/// Example: 1.0 V, 5 %, I_max 10 A -> dI 5 A -> 10 mohm.
TargetImpedanceResult target_impedance(const TargetImpedanceOptions& options);

}  // namespace quietrail
