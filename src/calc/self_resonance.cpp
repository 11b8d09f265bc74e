// SPDX-License-Identifier: MIT
#include "quietrail/calc/self_resonance.hpp"

#include <cmath>

#include "detail/checks.hpp"
#include "quietrail/calc/resonance.hpp"
#include "quietrail/models/element.hpp"

namespace quietrail {
namespace {

double mounting_of(const SelfResonanceOptions& options, MountingSource& source) {
  if (options.mounting_inductance) {
    source = MountingSource::given;
    return *options.mounting_inductance;
  }
  if (options.package) {
    source = MountingSource::typical_package;
    return typical_mounting_inductance(*options.package);
  }
  if (options.geometry) {
    source = MountingSource::geometry;
    return options.geometry->inductance();
  }
  source = MountingSource::none;
  return 0.0;
}

}  // namespace

std::string_view to_string(MountingSource source) {
  switch (source) {
    case MountingSource::none:
      return "none";
    case MountingSource::given:
      return "given";
    case MountingSource::typical_package:
      return "typical-package";
    case MountingSource::geometry:
      return "geometry";
  }
  QUIETRAIL_ASSERT(false);
  return {};
}

void SelfResonanceOptions::validate(const std::string& file, const std::string& path) const {
  capacitor.validate(file, path);
  const int sources =
      int{mounting_inductance.has_value()} + int{package.has_value()} + int{geometry.has_value()};
  require_input(sources <= 1, {file, path + "/mounting_inductance"},
                "at most one of a mounting inductance, a package or a mounting geometry",
                std::to_string(sources) + " given");
  if (mounting_inductance)
    detail::require_non_negative(*mounting_inductance, file, path + "/mounting_inductance", "H");
  if (geometry) geometry->validate(file, path + "/geometry");
  MountingSource source{};
  const double total = capacitor.esl + mounting_of(*this, source);
  require_input(total > 0.0, {file, path + "/esl"},
                "ESL plus mounting inductance > 0 H (an ideal capacitor has no self-resonance)",
                detail::describe_number(total, "H"));
}

SelfResonanceResult self_resonance(const SelfResonanceOptions& options) {
  options.validate();
  SelfResonanceResult result;
  result.mounting_inductance = mounting_of(options, result.mounting_source);
  result.total_inductance = options.capacitor.esl + result.mounting_inductance;
  const auto srf = self_resonant_frequency(options.capacitor, result.mounting_inductance);
  QUIETRAIL_ASSERT(srf.has_value());  // validate() demands a non-zero total inductance
  result.frequency = *srf;
  const MountedPart part{options.capacitor, result.mounting_inductance, 1};
  result.impedance_at_resonance = std::abs(part.impedance(result.frequency));
  result.characteristic_reactance =
      characteristic_impedance(result.total_inductance, options.capacitor.capacitance);
  // Q of the inductive (or capacitive) reactance X0 against the ESR at resonance.
  result.quality_factor =
      quality_factor(Complex(options.capacitor.esr_at(result.frequency), result.characteristic_reactance));
  result.capacitive_band = capacitive_band(part);
  return result;
}

}  // namespace quietrail
