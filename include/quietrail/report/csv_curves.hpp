// SPDX-License-Identifier: MIT
// Impedance curves as CSV: one row per frequency, magnitude, phase and parts, for
// spreadsheets and plotting scripts. Written through io/atomic_file.hpp.
#pragma once

#include <filesystem>
#include <string>
#include <vector>

#include "quietrail/frequency_grid.hpp"
#include "quietrail/types.hpp"

namespace quietrail {

/// An extra impedance curve to write beside the port curve, e.g. one part alone.
struct NamedCurve {
  /// Column label prefix; any text (escaped on output).
  std::string name;
  /// Impedance per grid frequency, ohm. Same length as the grid.
  ComplexVector impedance;
};

/// A real-valued column to write beside the port curve, e.g. the target (ohm) or the
/// ratio |Z|/Z_target.
struct NamedColumn {
  /// Column label, with its unit if it has one (e.g. "target_ohm"); any text (escaped).
  std::string name;
  /// One value per grid point.
  RealVector values;
};

/// CSV text (RFC 4180, LF line ends) with a header row and one row per grid frequency:
///   frequency_Hz, port_abs_ohm, port_phase_deg, port_re_ohm, port_im_ohm,
///   then one column per entry of `columns` under its name,
///   then "<name> abs_ohm", "<name> phase_deg", "<name> re_ohm", "<name> im_ohm" per extra
///   curve, names escaped with escape_csv_cell (report/escape.hpp).
/// |Z| = sqrt(Re^2 + Im^2); phase = atan2(Im, Re) in degrees, in (-180, 180].
/// Numbers are written with 10 significant digits in C-locale form.
/// Every curve and column must have one value per grid point (QUIETRAIL_ASSERT).
std::string format_impedance_csv(const FrequencyGrid& grid, const ComplexVector& port,
                                 const std::vector<NamedCurve>& extra = {},
                                 const std::vector<NamedColumn>& columns = {});

/// Writes format_impedance_csv(...) to `path` all-or-nothing, refusing to overwrite any
/// of `inputs` (write_file_atomically). Throws InputError naming `path` on failure.
void write_impedance_csv(const std::filesystem::path& path, const FrequencyGrid& grid,
                         const ComplexVector& port, const std::vector<NamedCurve>& extra = {},
                         const std::vector<std::filesystem::path>& inputs = {},
                         const std::vector<NamedColumn>& columns = {});

}  // namespace quietrail
