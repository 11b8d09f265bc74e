// SPDX-License-Identifier: MIT
#include "quietrail/calc/skin_effect.hpp"

#include <cmath>

#include "detail/checks.hpp"
#include "quietrail/calc/bessel.hpp"

namespace quietrail {
namespace {

void check_material(double frequency, double resistivity, double relative_permeability,
                    const std::string& file, const std::string& path) {
  detail::require_positive(frequency, file, path + "/frequency", "Hz");
  detail::require_positive(resistivity, file, path + "/resistivity", "ohm*m");
  detail::require_positive(relative_permeability, file, path + "/relative_permeability", "");
}

double unchecked_skin_depth(double frequency, double resistivity, double relative_permeability) {
  return std::sqrt(resistivity / (kPi * frequency * kMu0 * relative_permeability));
}

}  // namespace

double skin_depth(double frequency, double resistivity, double relative_permeability) {
  check_material(frequency, resistivity, relative_permeability, "", "");
  return unchecked_skin_depth(frequency, resistivity, relative_permeability);
}

double surface_resistance(double frequency, double resistivity, double relative_permeability) {
  check_material(frequency, resistivity, relative_permeability, "", "");
  return resistivity / unchecked_skin_depth(frequency, resistivity, relative_permeability);
}

Complex round_wire_impedance_ratio(double radius_over_skin_depth) {
  detail::require_positive(radius_over_skin_depth, "", "/radius_over_skin_depth", "");
  const Complex kr = Complex(1.0, -1.0) * radius_over_skin_depth;
  return 0.5 * kr * bessel_j0_over_j1(kr);
}

void RoundConductorOptions::validate(const std::string& file, const std::string& path) const {
  check_material(frequency, resistivity, relative_permeability, file, path);
  detail::require_positive(diameter, file, path + "/diameter", "m");
  detail::require_positive(length, file, path + "/length", "m");
}

RoundConductorResult round_conductor(const RoundConductorOptions& options) {
  options.validate();
  const double rho = options.resistivity;
  const double l = options.length;
  const double r = options.diameter / 2.0;
  const double delta = unchecked_skin_depth(options.frequency, rho, options.relative_permeability);
  RoundConductorResult result;
  result.skin_depth = delta;
  result.surface_resistance = rho / delta;
  result.radius_over_skin_depth = r / delta;
  result.dc_resistance = rho * l / (kPi * r * r);
  result.thin_skin_resistance = rho * l / (kTwoPi * r * delta);
  // Past delta = r the ring 2 r delta - delta^2 would shrink again; the whole section conducts.
  result.annulus_resistance =
      delta >= r ? result.dc_resistance : rho * l / (kPi * (2.0 * r * delta - delta * delta));
  const Complex ratio = round_wire_impedance_ratio(result.radius_over_skin_depth);
  result.resistance_ratio = ratio.real();
  result.exact_resistance = result.dc_resistance * ratio.real();
  result.internal_inductance = result.dc_resistance * ratio.imag() / omega(options.frequency);
  return result;
}

}  // namespace quietrail
