// SPDX-License-Identifier: MIT
// The rail specification and the target impedance a check compares |Z(f)| against:
// flat (from the rail or one value), piecewise segments, or a log-log table.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "quietrail/types.hpp"

namespace quietrail {

/// A power rail as the check job sees it. SI units; the temperature is in degrees Celsius
/// because that is how derating tables are written.
///
/// Example: RailSpec{.voltage = 1.0, .ripple = 0.05, .max_current = 10.0}.target_impedance()
/// is 10 mohm (the step defaults to 50 % of 10 A).
struct RailSpec {
  /// Nominal rail voltage, V. > 0.
  double voltage = 0.0;
  /// Allowed ripple as a fraction of the voltage, in (0, 1] (0.05 = 5 %).
  double ripple = 0.0;
  /// Maximum load current I_max, A. > 0.
  double max_current = 0.0;
  /// Transient current step dI, A. > 0 and <= max_current. When absent the step is
  /// step_fraction * max_current.
  std::optional<double> current_step{};
  /// Fraction of I_max taken as the step when no step is given, in (0, 1]. Default 0.5:
  /// the assumption of Smith, Anderson, Forehand, Pelc & Roy, IEEE Trans. Adv. Packaging
  /// 22(3), 1999 (from memory).
  double step_fraction = 0.5;
  /// 10-90 % rise time of the load current, s. > 0. Gives the upper band edge.
  std::optional<double> rise_time{};
  /// Operating temperature, degrees C. Finite and above -273.15. Used by derating, not here.
  double temperature_c = 25.0;

  /// Throws InputError naming `field` + "/voltage", "/ripple", "/max_current",
  /// "/current_step", "/step_fraction", "/rise_time" or "/temperature_c" in `file`.
  void validate(const std::string& file = {}, const std::string& field = {}) const;
  /// The current step dI, A: current_step when given, else step_fraction * max_current.
  /// Validates first.
  double step() const;
  /// Flat target impedance Z_t = V * r / dI, ohm (Smith et al. 1999). Computed by
  /// calc/target_impedance.hpp. Validates first.
  double target_impedance() const;
  /// Upper band edge 0.35 / t_r, Hz, when a rise time is given (common practice; Johnson &
  /// Graham 1993). Validates first.
  std::optional<double> band_stop_from_rise_time() const;
};

/// One piece of a piecewise target: from `start` to `stop` (Hz) the target runs log-log
/// linearly from `impedance_at_start` to `impedance_at_stop` (ohm); equal values make it flat.
///   log Z(f) = log Z_a + (log Z_b - log Z_a) * (log f - log f_a) / (log f_b - log f_a)
struct TargetSegment {
  /// Lower edge, Hz. > 0.
  double start = 0.0;
  /// Upper edge, Hz. > start.
  double stop = 0.0;
  /// Target at `start`, ohm. > 0.
  double impedance_at_start = 0.0;
  /// Target at `stop`, ohm. > 0.
  double impedance_at_stop = 0.0;

  /// A flat segment of `impedance` ohm.
  static TargetSegment flat(double start, double stop, double impedance);
  /// A segment that starts at `impedance_at_start` and rises (or falls, when negative) by
  /// `db_per_decade` (20 log10 per decade; +20 dB/dec is proportional to f).
  static TargetSegment sloped(double start, double stop, double impedance_at_start, double db_per_decade);
};

/// One point of a tabulated target.
struct TargetPoint {
  /// Frequency, Hz. > 0.
  double frequency = 0.0;
  /// Target impedance there, ohm. > 0.
  double impedance = 0.0;
};

/// How a target was given.
enum class TargetForm {
  flat,      ///< one value at every frequency
  segments,  ///< contiguous segments, each flat or log-log sloped
  table,     ///< points interpolated log-log, held flat beyond the first and last point
};

/// "flat", "segments" or "table".
std::string to_string(TargetForm form);

/// The target impedance Z_t(f), ohm, in one of three forms (TargetForm). Immutable once
/// built; the factories validate and throw InputError naming `file` and the field path
/// `field` (e.g. "/target/segments/2/stop").
///
/// Example:
///   auto t = TargetImpedance::from_points({{1e6, 1e-3}, {100e6, 100e-3}});
///   t.at(10e6);  // 10 mohm: the log-log midpoint
class TargetImpedance {
 public:
  /// Flat target of `impedance` ohm (> 0, finite).
  static TargetImpedance flat(double impedance, const std::string& file = {}, const std::string& field = {});
  /// Flat target V * r / dI from a rail (validates the rail).
  static TargetImpedance from_rail(const RailSpec& rail, const std::string& file = {},
                                   const std::string& field = {});
  /// Piecewise target. Segments must be in increasing order, each valid (start > 0, stop >
  /// start, impedances > 0, all finite), and contiguous: segment i+1 starts where segment i
  /// stops (relative 1e-9, for values that went through unit parsing). An overlap or a
  /// gap is an error naming both segments and the frequencies involved (field
  /// `field` + "/<i>/start"). At a shared edge with a step the lower value applies (the
  /// stricter one). Beyond the first and last segment the end values are held flat;
  /// cover_band() tells whether a band is covered.
  static TargetImpedance from_segments(std::vector<TargetSegment> segments, const std::string& file = {},
                                       const std::string& field = {});
  /// Tabulated target: at least two points, strictly increasing frequency, impedances > 0,
  /// all finite. Interpolated linearly in (log f, log Z) between points and held flat
  /// (clamped) below the first and above the last point. Errors name `field` + "/<i>".
  static TargetImpedance from_points(std::vector<TargetPoint> points, const std::string& file = {},
                                     const std::string& field = {});

  /// Target impedance at `frequency` (Hz, > 0), ohm.
  double at(double frequency) const;
  /// The target at each of `frequencies`, ohm.
  RealVector on(const std::vector<double>& frequencies) const;
  /// The target over [start, stop] Hz as a polyline in (log f, log Z): straight log-log
  /// lines between consecutive vertices draw it exactly. Vertices: start, every corner
  /// strictly inside, stop; at a step between segments two vertices share the frequency
  /// (the value below, then the value above). For report/ masks.
  std::vector<TargetPoint> outline(double start, double stop) const;
  /// Throws InputError (`file`, `field`) when the segments leave part of [start, stop] Hz
  /// uncovered, naming the uncovered range. Flat and tabulated targets cover every band.
  void cover_band(double start, double stop, const std::string& file = {}, const std::string& field = {}) const;
  /// One line for reports, e.g. "flat 10 mohm", "table of 4 points from 1 MHz (1 mohm) to
  /// 100 MHz (100 mohm), log-log", "2 segments: 10 mohm from 1 kHz to 100 MHz, then 10 mohm
  /// rising to 100 mohm from 100 MHz to 1 GHz".
  std::string describe() const;

  /// How the target was given.
  TargetForm form() const { return form_; }
  /// The flat value, ohm (form() == flat), else the lowest value anywhere.
  double minimum() const;
  /// The segments (form() == segments), else empty.
  const std::vector<TargetSegment>& segments() const { return segments_; }
  /// The table (form() == table), else empty.
  const std::vector<TargetPoint>& points() const { return points_; }

 private:
  TargetImpedance() = default;

  TargetForm form_ = TargetForm::flat;
  double flat_ = 0.0;
  std::vector<TargetSegment> segments_;
  std::vector<TargetPoint> points_;
};

}  // namespace quietrail
