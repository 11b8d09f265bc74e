// SPDX-License-Identifier: MIT
#include "quietrail/models/mounting.hpp"

#include <array>
#include <cmath>

#include "detail/checks.hpp"
#include "quietrail/types.hpp"

namespace quietrail {
namespace {

struct PackageRow {
  Package package;
  std::string_view code;
  double mounting_inductance;  // H, see the header for where these come from
};

constexpr std::array<PackageRow, 6> kPackages{{
    {Package::p0201, "0201", 0.25e-9},
    {Package::p0402, "0402", 0.30e-9},
    {Package::p0603, "0603", 0.45e-9},
    {Package::p0805, "0805", 0.65e-9},
    {Package::p1206, "1206", 0.75e-9},
    {Package::p1210, "1210", 0.80e-9},
}};

}  // namespace

std::string_view to_string(Package package) {
  for (const auto& row : kPackages)
    if (row.package == package) return row.code;
  QUIETRAIL_ASSERT(false);
  return {};
}

std::optional<Package> parse_package(std::string_view text) {
  if (text.substr(0, 5) == "case ") text.remove_prefix(5);
  for (const auto& row : kPackages)
    if (row.code == text) return row.package;
  return std::nullopt;
}

double typical_mounting_inductance(Package package) {
  for (const auto& row : kPackages)
    if (row.package == package) return row.mounting_inductance;
  QUIETRAIL_ASSERT(false);
  return 0.0;
}

double MountingGeometry::inductance() const {
  const double traces =
      trace_length > 0.0 ? kMu0 * trace_height * (2.0 * trace_length) / trace_width : 0.0;
  const double vias = kMu0 * via_length / kPi * std::acosh(via_pitch / via_diameter);
  return traces + vias / vias_per_terminal;
}

void MountingGeometry::validate(const std::string& file, const std::string& field) const {
  detail::require_positive(via_length, file, field + "/via_length", "m");
  detail::require_positive(via_diameter, file, field + "/via_diameter", "m");
  detail::require_positive(via_pitch, file, field + "/via_pitch", "m");
  require_input(via_pitch > via_diameter, {file, field + "/via_pitch"},
                "a via pitch larger than the via diameter (vias would overlap)",
                detail::describe_number(via_pitch, "m"));
  detail::require_non_negative(trace_length, file, field + "/trace_length", "m");
  if (trace_length > 0.0) {
    detail::require_positive(trace_width, file, field + "/trace_width", "m");
    detail::require_positive(trace_height, file, field + "/trace_height", "m");
  }
  require_input(vias_per_terminal >= 1, {file, field + "/vias_per_terminal"}, "an integer >= 1",
                std::to_string(vias_per_terminal));
}

}  // namespace quietrail
