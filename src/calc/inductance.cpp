// SPDX-License-Identifier: MIT
#include "quietrail/calc/inductance.hpp"

#include <cmath>

#include "detail/checks.hpp"
#include "quietrail/types.hpp"

namespace quietrail {
namespace {

// mu0 / (2 pi) = 2e-7 H/m, i.e. the "2 nH per cm" of the textbook forms.
constexpr double kMu0Over2Pi = kMu0 / kTwoPi;

// ASTM B258 defines sizes down to 0000 (n = -3); 56 is the finest gauge in common tables.
constexpr int kFinestGauge = 56;
constexpr int kCoarsestGauge = -3;

}  // namespace

double awg_diameter(int gauge) {
  require_input(gauge >= kCoarsestGauge && gauge <= kFinestGauge, {"", "/awg"},
                "a gauge from 0000 (-3) to 56", std::to_string(gauge));
  return 0.127e-3 * std::pow(92.0, (36.0 - gauge) / 39.0);
}

void WireInductanceOptions::validate(const std::string& file, const std::string& path) const {
  detail::require_positive(length, file, path + "/length", "m");
  detail::require_positive(diameter, file, path + "/diameter", "m");
  require_input(length > diameter, {file, path + "/length"},
                "a wire longer than its diameter (the formulas assume length >> radius)",
                detail::describe_number(length, "m"));
}

WireInductanceResult wire_inductance(const WireInductanceOptions& options) {
  options.validate();
  const double l = options.length;
  const double r = options.diameter / 2.0;
  const double log_term = std::log(2.0 * l / r);
  WireInductanceResult result;
  result.low_frequency = kMu0Over2Pi * l * (log_term - 0.75);
  result.high_frequency = kMu0Over2Pi * l * (log_term - 1.0);
  result.exact_low_frequency =
      kMu0Over2Pi * l *
      (std::log((l + std::hypot(l, r)) / r) - std::sqrt(1.0 + (r / l) * (r / l)) + r / l + 0.25);
  return result;
}

void ViaInductanceOptions::validate(const std::string& file, const std::string& path) const {
  detail::require_positive(length, file, path + "/length", "m");
  detail::require_positive(diameter, file, path + "/diameter", "m");
  // ln(4h/d) + 1 turns negative below h = d / (4e): far outside the thin-wire premise.
  require_input(4.0 * length / diameter > std::exp(-1.0), {file, path + "/length"},
                "a via length above diameter / (4e), where the formula stays positive",
                detail::describe_number(length, "m"));
  if (pitch) {
    detail::require_positive(*pitch, file, path + "/pitch", "m");
    require_input(*pitch > diameter, {file, path + "/pitch"},
                  "a via pitch larger than the via diameter (vias would overlap)",
                  detail::describe_number(*pitch, "m"));
  }
}

ViaInductanceResult via_inductance(const ViaInductanceOptions& options) {
  options.validate();
  const double h = options.length;
  ViaInductanceResult result;
  result.single = kMu0Over2Pi * h * (std::log(4.0 * h / options.diameter) + 1.0);
  if (options.pitch) {
    const double s_over_d = *options.pitch / options.diameter;  // s / 2r
    result.pair = kMu0 * h / kPi * std::acosh(s_over_d);
    result.pair_log_form = kMu0 * h / kPi * std::log(2.0 * s_over_d);
  }
  return result;
}

}  // namespace quietrail
