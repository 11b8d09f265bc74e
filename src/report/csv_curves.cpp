// SPDX-License-Identifier: MIT
// CSV rendering of impedance curves (see csv_curves.hpp).
#include "quietrail/report/csv_curves.hpp"

#include <cmath>
#include <iterator>

#include <fmt/format.h>

#include "quietrail/error.hpp"
#include "quietrail/io/atomic_file.hpp"
#include "quietrail/report/escape.hpp"

namespace quietrail {
namespace {

constexpr double kDegreesPerRadian = 180.0 / kPi;

void append_columns(std::string& out, Complex z) {
  // fmt's general format never uses the locale unless asked ('L'), so '.' stays '.'.
  fmt::format_to(std::back_inserter(out), ",{:.10g},{:.10g},{:.10g},{:.10g}", std::abs(z),
                 std::atan2(z.imag(), z.real()) * kDegreesPerRadian, z.real(), z.imag());
}

}  // namespace

std::string format_impedance_csv(const FrequencyGrid& grid, const ComplexVector& port,
                                 const std::vector<NamedCurve>& extra, const std::vector<NamedColumn>& columns) {
  QUIETRAIL_ASSERT(static_cast<std::size_t>(port.size()) == grid.size());
  for (const auto& curve : extra) QUIETRAIL_ASSERT(static_cast<std::size_t>(curve.impedance.size()) == grid.size());
  for (const auto& column : columns) QUIETRAIL_ASSERT(static_cast<std::size_t>(column.values.size()) == grid.size());

  std::string out = "frequency_Hz,port_abs_ohm,port_phase_deg,port_re_ohm,port_im_ohm";
  for (const auto& column : columns) out.append(",").append(escape_csv_cell(column.name));
  for (const auto& curve : extra) {
    for (const char* column : {" abs_ohm", " phase_deg", " re_ohm", " im_ohm"})
      out.append(",").append(escape_csv_cell(curve.name + column));
  }
  out += '\n';
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const auto row = static_cast<Eigen::Index>(i);
    fmt::format_to(std::back_inserter(out), "{:.10g}", grid[i]);
    append_columns(out, port[row]);
    for (const auto& column : columns) fmt::format_to(std::back_inserter(out), ",{:.10g}", column.values[row]);
    for (const auto& curve : extra) append_columns(out, curve.impedance[row]);
    out += '\n';
  }
  return out;
}

void write_impedance_csv(const std::filesystem::path& path, const FrequencyGrid& grid, const ComplexVector& port,
                         const std::vector<NamedCurve>& extra, const std::vector<std::filesystem::path>& inputs,
                         const std::vector<NamedColumn>& columns) {
  write_file_atomically(path, format_impedance_csv(grid, port, extra, columns), inputs);
}

}  // namespace quietrail
