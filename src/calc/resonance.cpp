// SPDX-License-Identifier: MIT
#include "quietrail/calc/resonance.hpp"

#include <cmath>

#include "detail/checks.hpp"
#include "quietrail/types.hpp"

namespace quietrail {

double resonant_frequency(double inductance, double capacitance) {
  detail::require_positive(inductance, "", "/inductance", "H");
  detail::require_positive(capacitance, "", "/capacitance", "F");
  return 1.0 / (kTwoPi * std::sqrt(inductance * capacitance));
}

double resonant_inductance(double frequency, double capacitance) {
  detail::require_positive(frequency, "", "/frequency", "Hz");
  detail::require_positive(capacitance, "", "/capacitance", "F");
  const double w = omega(frequency);
  return 1.0 / (w * w * capacitance);
}

double resonant_capacitance(double frequency, double inductance) {
  detail::require_positive(frequency, "", "/frequency", "Hz");
  detail::require_positive(inductance, "", "/inductance", "H");
  const double w = omega(frequency);
  return 1.0 / (w * w * inductance);
}

double characteristic_impedance(double inductance, double capacitance) {
  detail::require_positive(inductance, "", "/inductance", "H");
  detail::require_positive(capacitance, "", "/capacitance", "F");
  return std::sqrt(inductance / capacitance);
}

void LcResonanceOptions::validate(const std::string& file, const std::string& path) const {
  const int given = int{frequency.has_value()} + int{inductance.has_value()} + int{capacitance.has_value()};
  require_input(given == 2, {file, path}, "exactly two of frequency, inductance and capacitance",
                std::to_string(given) + " of them");
  if (frequency) detail::require_positive(*frequency, file, path + "/frequency", "Hz");
  if (inductance) detail::require_positive(*inductance, file, path + "/inductance", "H");
  if (capacitance) detail::require_positive(*capacitance, file, path + "/capacitance", "F");
}

LcResonanceResult lc_resonance(const LcResonanceOptions& options) {
  options.validate();
  LcResonanceResult result;
  if (!options.frequency) {
    result.inductance = *options.inductance;
    result.capacitance = *options.capacitance;
    result.frequency = resonant_frequency(result.inductance, result.capacitance);
  } else if (!options.inductance) {
    result.frequency = *options.frequency;
    result.capacitance = *options.capacitance;
    result.inductance = resonant_inductance(result.frequency, result.capacitance);
  } else {
    result.frequency = *options.frequency;
    result.inductance = *options.inductance;
    result.capacitance = resonant_capacitance(result.frequency, result.inductance);
  }
  // A derived value can leave the double range (e.g. from 1e-300 Hz): that is bad input,
  // blamed on the pair of inputs since the derived quantity was not given.
  const auto in_range = [](double v) { return std::isfinite(v) && v > 0.0; };
  require_input(in_range(result.frequency) && in_range(result.inductance) && in_range(result.capacitance),
                {"", ""}, "inputs whose resonance stays within the range of double precision",
                "an overflow or underflow");
  result.characteristic_impedance = characteristic_impedance(result.inductance, result.capacitance);
  return result;
}

}  // namespace quietrail
