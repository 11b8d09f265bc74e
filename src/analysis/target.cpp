// SPDX-License-Identifier: MIT
// Rail spec and target impedance forms (see target.hpp). The flat value comes from
// calc/target_impedance.cpp so the formula lives in one place.
#include "quietrail/analysis/target.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "detail/checks.hpp"
#include "quietrail/calc/target_impedance.hpp"
#include "quietrail/error.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

// Segment edges that went through unit parsing ("100MHz" vs 1e8) may differ in the last
// bits; edges this close count as shared (common practice for float comparison).
constexpr double kEdgeTolerance = 1e-9;
// Absolute zero in degrees C (SI brochure, 9th ed. 2019).
constexpr double kAbsoluteZeroC = -273.15;

TargetImpedanceOptions to_options(const RailSpec& rail) {
  return {.voltage = rail.voltage,
          .ripple = rail.ripple,
          .current_step = rail.current_step,
          .max_current = rail.max_current,
          .step_fraction = rail.step_fraction,
          .rise_time = rail.rise_time};
}

// log-log straight line through (fa, za) and (fb, zb), evaluated at f.
double log_log(double fa, double za, double fb, double zb, double f) {
  if (za == zb) return za;
  const double t = std::log(f / fa) / std::log(fb / fa);
  return za * std::exp(t * std::log(zb / za));
}

double segment_value(const TargetSegment& s, double f) {
  return log_log(s.start, s.impedance_at_start, s.stop, s.impedance_at_stop, f);
}

bool same_edge(double a, double b) { return std::abs(a - b) <= kEdgeTolerance * std::max(a, b); }

std::string ohms(double z) { return format_value(z, "ohm"); }
std::string hertz(double f) { return format_value(f, "Hz"); }

}  // namespace

void RailSpec::validate(const std::string& file, const std::string& field) const {
  detail::require_positive(max_current, file, field + "/max_current", "A");
  to_options(*this).validate(file, field);
  require_input(std::isfinite(temperature_c) && temperature_c > kAbsoluteZeroC, {file, field + "/temperature_c"},
                "a finite temperature above -273.15 C", detail::describe_number(temperature_c, "C"));
}

double RailSpec::step() const {
  validate();
  return ::quietrail::target_impedance(to_options(*this)).current_step;
}

double RailSpec::target_impedance() const {
  validate();
  return ::quietrail::target_impedance(to_options(*this)).impedance;
}

std::optional<double> RailSpec::band_stop_from_rise_time() const {
  validate();
  return ::quietrail::target_impedance(to_options(*this)).knee_frequency;
}

TargetSegment TargetSegment::flat(double start, double stop, double impedance) {
  return {start, stop, impedance, impedance};
}

TargetSegment TargetSegment::sloped(double start, double stop, double impedance_at_start,
                                    double db_per_decade) {
  // 20 log10 Z rises db_per_decade per decade: Z_b = Z_a * (f_b/f_a)^(slope/20).
  return {start, stop, impedance_at_start,
          impedance_at_start * std::pow(stop / start, db_per_decade / 20.0)};
}

std::string to_string(TargetForm form) {
  switch (form) {
    case TargetForm::flat: return "flat";
    case TargetForm::segments: return "segments";
    case TargetForm::table: return "table";
  }
  QUIETRAIL_ASSERT(false);
  return {};
}

TargetImpedance TargetImpedance::flat(double impedance, const std::string& file, const std::string& field) {
  detail::require_positive(impedance, file, field, "ohm");
  TargetImpedance t;
  t.form_ = TargetForm::flat;
  t.flat_ = impedance;
  return t;
}

TargetImpedance TargetImpedance::from_rail(const RailSpec& rail, const std::string& file,
                                           const std::string& field) {
  rail.validate(file, field);
  return flat(rail.target_impedance(), file, field);
}

TargetImpedance TargetImpedance::from_segments(std::vector<TargetSegment> segments, const std::string& file,
                                               const std::string& field) {
  require_input(!segments.empty(), {file, field}, "at least one target segment", "none");
  for (std::size_t i = 0; i < segments.size(); ++i) {
    const std::string at = field + "/" + std::to_string(i);
    const TargetSegment& s = segments[i];
    detail::require_positive(s.start, file, at + "/start", "Hz");
    detail::require_positive(s.stop, file, at + "/stop", "Hz");
    require_input(s.stop > s.start, {file, at + "/stop"},
                  "a stop frequency above the segment's start (" + hertz(s.start) + ")", hertz(s.stop));
    detail::require_positive(s.impedance_at_start, file, at + "/impedance_at_start", "ohm");
    detail::require_positive(s.impedance_at_stop, file, at + "/impedance_at_stop", "ohm");
    if (i == 0) continue;
    TargetSegment& before = segments[i - 1];
    const std::string pair = "segment " + std::to_string(i) + " to start where segment " +
                             std::to_string(i - 1) + " stops (" + hertz(before.stop) + ")";
    require_input(!(s.start < before.stop && !same_edge(s.start, before.stop)), {file, at + "/start"},
                  pair + " without overlap",
                  "an overlap from " + hertz(s.start) + " to " + hertz(std::min(before.stop, s.stop)));
    require_input(same_edge(s.start, before.stop), {file, at + "/start"}, pair + " without a gap",
                  "a gap from " + hertz(before.stop) + " to " + hertz(s.start));
    // Shared edges are made exactly equal so at() has one place to switch segments.
    segments[i].start = before.stop;
  }
  TargetImpedance t;
  t.form_ = TargetForm::segments;
  t.segments_ = std::move(segments);
  return t;
}

TargetImpedance TargetImpedance::from_points(std::vector<TargetPoint> points, const std::string& file,
                                             const std::string& field) {
  require_input(points.size() >= 2, {file, field},
                "a table of at least two points (use a flat target for one value)",
                std::to_string(points.size()) + " point" + (points.size() == 1 ? "" : "s"));
  for (std::size_t i = 0; i < points.size(); ++i) {
    const std::string at = field + "/" + std::to_string(i);
    detail::require_positive(points[i].frequency, file, at + "/frequency", "Hz");
    detail::require_positive(points[i].impedance, file, at + "/impedance", "ohm");
    if (i > 0) {
      require_input(points[i].frequency > points[i - 1].frequency, {file, at + "/frequency"},
                    "frequencies in strictly increasing order (previous " + hertz(points[i - 1].frequency) + ")",
                    hertz(points[i].frequency));
    }
  }
  TargetImpedance t;
  t.form_ = TargetForm::table;
  t.points_ = std::move(points);
  return t;
}

double TargetImpedance::at(double frequency) const {
  switch (form_) {
    case TargetForm::flat: return flat_;
    case TargetForm::segments: {
      const auto& s = segments_;
      if (frequency <= s.front().start) return s.front().impedance_at_start;
      if (frequency >= s.back().stop) return s.back().impedance_at_stop;
      // First segment whose stop is >= f; at a shared edge the stricter value applies.
      const auto it = std::lower_bound(s.begin(), s.end(), frequency,
                                       [](const TargetSegment& seg, double f) { return seg.stop < f; });
      const double value = segment_value(*it, frequency);
      if (frequency == it->stop && std::next(it) != s.end())
        return std::min(value, std::next(it)->impedance_at_start);
      return value;
    }
    case TargetForm::table: {
      const auto& p = points_;
      if (frequency <= p.front().frequency) return p.front().impedance;
      if (frequency >= p.back().frequency) return p.back().impedance;
      const auto it = std::upper_bound(p.begin(), p.end(), frequency,
                                       [](double f, const TargetPoint& q) { return f < q.frequency; });
      const auto& b = *it;
      const auto& a = *std::prev(it);
      return log_log(a.frequency, a.impedance, b.frequency, b.impedance, frequency);
    }
  }
  QUIETRAIL_ASSERT(false);
  return 0.0;
}

RealVector TargetImpedance::on(const std::vector<double>& frequencies) const {
  RealVector out(static_cast<Eigen::Index>(frequencies.size()));
  for (std::size_t i = 0; i < frequencies.size(); ++i) out[static_cast<Eigen::Index>(i)] = at(frequencies[i]);
  return out;
}

std::vector<TargetPoint> TargetImpedance::outline(double start, double stop) const {
  QUIETRAIL_ASSERT(start > 0.0 && stop > start);
  std::vector<TargetPoint> out{{start, at(start)}};
  auto inside = [&](double f) { return f > start && f < stop; };
  if (form_ == TargetForm::segments) {
    for (std::size_t i = 0; i + 1 < segments_.size(); ++i) {
      const double f = segments_[i].stop;
      if (!inside(f)) continue;
      const double below = segments_[i].impedance_at_stop;
      const double above = segments_[i + 1].impedance_at_start;
      out.push_back({f, below});
      if (above != below) out.push_back({f, above});
    }
  } else if (form_ == TargetForm::table) {
    for (const TargetPoint& p : points_)
      if (inside(p.frequency)) out.push_back(p);
  }
  // Held-flat ends of segments or of a table are corners too.
  if (form_ == TargetForm::segments) {
    for (double f : {segments_.front().start, segments_.back().stop})
      if (inside(f)) out.push_back({f, at(f)});
  }
  std::stable_sort(out.begin(), out.end(),
                   [](const TargetPoint& a, const TargetPoint& b) { return a.frequency < b.frequency; });
  out.push_back({stop, at(stop)});
  return out;
}

void TargetImpedance::cover_band(double start, double stop, const std::string& file,
                                 const std::string& field) const {
  if (form_ != TargetForm::segments) return;
  const double first = segments_.front().start;
  const double last = segments_.back().stop;
  require_input(start >= first || same_edge(start, first), {file, field},
                "target segments covering the band from " + hertz(start) + " to " + hertz(stop),
                "no target from " + hertz(start) + " to " + hertz(first));
  require_input(stop <= last || same_edge(stop, last), {file, field},
                "target segments covering the band from " + hertz(start) + " to " + hertz(stop),
                "no target from " + hertz(last) + " to " + hertz(stop));
}

double TargetImpedance::minimum() const {
  switch (form_) {
    case TargetForm::flat: return flat_;
    case TargetForm::segments: {
      double m = std::numeric_limits<double>::infinity();
      for (const auto& s : segments_) m = std::min({m, s.impedance_at_start, s.impedance_at_stop});
      return m;
    }
    case TargetForm::table: {
      double m = std::numeric_limits<double>::infinity();
      for (const auto& p : points_) m = std::min(m, p.impedance);
      return m;
    }
  }
  QUIETRAIL_ASSERT(false);
  return 0.0;
}

std::string TargetImpedance::describe() const {
  switch (form_) {
    case TargetForm::flat: return "flat " + ohms(flat_);
    case TargetForm::segments: {
      std::string out = std::to_string(segments_.size()) + (segments_.size() == 1 ? " segment: " : " segments: ");
      for (std::size_t i = 0; i < segments_.size(); ++i) {
        const TargetSegment& s = segments_[i];
        if (i > 0) out += ", then ";
        if (s.impedance_at_start == s.impedance_at_stop) {
          out += ohms(s.impedance_at_start);
        } else {
          out += ohms(s.impedance_at_start) +
                 (s.impedance_at_stop > s.impedance_at_start ? " rising to " : " falling to ") +
                 ohms(s.impedance_at_stop);
        }
        out += " from " + hertz(s.start) + " to " + hertz(s.stop);
      }
      return out;
    }
    case TargetForm::table: {
      const TargetPoint& a = points_.front();
      const TargetPoint& b = points_.back();
      return "table of " + std::to_string(points_.size()) + " points from " + hertz(a.frequency) + " (" +
             ohms(a.impedance) + ") to " + hertz(b.frequency) + " (" + ohms(b.impedance) + "), log-log";
    }
  }
  QUIETRAIL_ASSERT(false);
  return {};
}

}  // namespace quietrail
