// SPDX-License-Identifier: MIT
#include "quietrail/calc/plane.hpp"

#include <algorithm>
#include <cmath>

#include "detail/checks.hpp"
#include "quietrail/types.hpp"

namespace quietrail {
namespace {

constexpr int kMaxModes = 1000;

void check_permittivity(double er, const std::string& file, const std::string& field) {
  require_input(std::isfinite(er) && er >= 1.0, {file, field}, "a relative permittivity >= 1",
                detail::describe_number(er, ""));
}

}  // namespace

double plane_capacitance(double area, double separation, double relative_permittivity) {
  detail::require_positive(area, "", "/area", "m^2");
  detail::require_positive(separation, "", "/separation", "m");
  check_permittivity(relative_permittivity, "", "/relative_permittivity");
  return kEps0 * relative_permittivity * area / separation;
}

double plane_sheet_inductance(double separation) {
  detail::require_positive(separation, "", "/separation", "m");
  return kMu0 * separation;
}

void PlanePairOptions::validate(const std::string& file, const std::string& path) const {
  detail::require_positive(length, file, path + "/length", "m");
  detail::require_positive(width, file, path + "/width", "m");
  detail::require_positive(separation, file, path + "/separation", "m");
  check_permittivity(relative_permittivity, file, path + "/relative_permittivity");
}

PlanePairResult plane_pair(const PlanePairOptions& options) {
  options.validate();
  PlanePairResult result;
  result.area = options.length * options.width;
  result.capacitance = plane_capacitance(result.area, options.separation, options.relative_permittivity);
  result.capacitance_per_area = kEps0 * options.relative_permittivity / options.separation;
  result.sheet_inductance = plane_sheet_inductance(options.separation);
  return result;
}

void CavityOptions::validate(const std::string& file, const std::string& path) const {
  detail::require_positive(length, file, path + "/length", "m");
  detail::require_positive(width, file, path + "/width", "m");
  check_permittivity(relative_permittivity, file, path + "/relative_permittivity");
  detail::require_positive_or_infinite(max_frequency, file, path + "/max_frequency", "Hz");
  require_input(count >= 1 && count <= kMaxModes, {file, path + "/count"},
                "a mode count from 1 to " + std::to_string(kMaxModes), std::to_string(count));
}

std::vector<CavityMode> cavity_modes(const CavityOptions& options) {
  options.validate();
  const double half_velocity = kSpeedOfLight / (2.0 * std::sqrt(options.relative_permittivity));
  const auto f = [&](int m, int n) {
    return half_velocity * std::hypot(m / options.length, n / options.width);
  };
  // The `count` lowest modes include (1,0) ... (count,0), so none lies above f(count, 0);
  // likewise for the other side. Indices past that bound cannot be among the answers.
  const double limit = std::min({options.max_frequency, f(options.count, 0), f(0, options.count)});
  std::vector<CavityMode> modes;
  for (int m = 0; m <= options.count; ++m) {
    for (int n = 0; n <= options.count; ++n) {
      if (m == 0 && n == 0) continue;
      const double fmn = f(m, n);
      if (fmn <= limit) modes.push_back({m, n, fmn});
    }
  }
  std::sort(modes.begin(), modes.end(), [](const CavityMode& a, const CavityMode& b) {
    if (a.frequency != b.frequency) return a.frequency < b.frequency;
    return a.m != b.m ? a.m < b.m : a.n < b.n;
  });
  if (modes.size() > static_cast<std::size_t>(options.count))
    modes.resize(static_cast<std::size_t>(options.count));
  return modes;
}

}  // namespace quietrail
