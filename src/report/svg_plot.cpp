// SPDX-License-Identifier: MIT
// Log-log SVG plots (see svg_plot.hpp). Layout first (ranges, plot area, legend rows), then
// the drawing in painter's order: grid, mask, curves, markers, axes, labels, legend.
#include "quietrail/report/svg_plot.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <iterator>
#include <string_view>

#include <fmt/format.h>

#include "detail/checks.hpp"
#include "quietrail/error.hpp"
#include "quietrail/report/escape.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {

using Style = PlotSeries::Style;

// ---------------------------------------------------------------- look
// A calm palette of our own: warm paper, ink-blue total, muted earth tones for branches,
// rust for the target and a deep red for violations.
constexpr const char* kPaper = "#ffffff";
constexpr const char* kPlotFill = "#fcfbf8";
constexpr const char* kGridMinor = "#eeeae3";
constexpr const char* kGridMajor = "#d5cfc4";
constexpr const char* kFrame = "#8c857a";
constexpr const char* kInk = "#34332f";
constexpr const char* kInkMuted = "#66625a";
constexpr const char* kTotal = "#1d3a5f";
constexpr const char* kSecondary = "#3f7f8c";
constexpr const char* kTarget = "#b0532a";
constexpr const char* kMaskFill = "#d98a5f";
constexpr const char* kViolation = "#b3202f";
constexpr std::array<const char*, 8> kBranchColours = {"#8aa399", "#c2a27c", "#9c94b8", "#7e9fb5",
                                                       "#bf8f8a", "#a6a571", "#86b0ae", "#b59bb0"};
constexpr const char* kFont = "sans-serif";

// ---------------------------------------------------------------- geometry (px)
constexpr double kLeftMargin = 86.0;     // y tick labels and the rotated y axis name
constexpr double kRightMargin = 34.0;    // half of the last x tick label
constexpr double kTopWithTitle = 50.0;
constexpr double kTopWithoutTitle = 18.0;
constexpr double kTickLabelBand = 24.0;  // below the plot area
constexpr double kAxisNameBand = 24.0;
constexpr double kLegendRow = 22.0;
constexpr double kBottomPad = 10.0;
constexpr double kLegendSwatch = 26.0;
constexpr double kLegendGap = 22.0;
constexpr double kCharWidth = 6.8;  // mean advance of 12 px sans-serif text, for wrapping
constexpr std::size_t kLegendNameLimit = 48;  // code points shown per legend entry
constexpr double kMinPlotHeight = 120.0;
constexpr double kLegendShare = 0.25;  // of the image height, at most
// Minor grid lines only where a decade spans at least this much (else they crowd into a smear).
constexpr double kMinorLinesMinDecade = 40.0;
constexpr double kLogSlack = 1e-9;  // decades; absorbs log10 rounding at exact decades
// Tick labels: decades closer than the spacing are thinned; 2 and 5 get labels too when a
// decade is long enough to hold three labels without crowding ("200 kHz" is about 50 px).
constexpr double kTickLabelSpacingX = 62.0;
constexpr double kTickLabelSpacingY = 20.0;
constexpr double kTickLabelMinDecadeX = 230.0;
constexpr double kTickLabelMinDecadeY = 90.0;
constexpr const char* kMinorTickStyle = " font-size=\"11\" fill=\"#948e84\"";

bool usable(double x, double y) { return std::isfinite(x) && std::isfinite(y) && x > 0.0 && y > 0.0; }

// Fixed two-decimal C-locale form; "-0.00" folded to "0.00" so output does not depend on
// the sign of a rounding residue.
std::string num(double v) {
  std::string s = fmt::format("{:.2f}", v);
  if (s == "-0.00") s = "0.00";
  return s;
}

std::string display_unit(const std::string& unit) {
  if (unit == "ohm" || unit == "Ohm" || unit == "ohms") return "\xCE\xA9";  // U+03A9
  return unit;
}

// At most `limit` UTF-8 code points, with an ellipsis when cut.
std::string clip_text(const std::string& text, std::size_t limit) {
  std::size_t points = 0;
  for (std::size_t i = 0; i < text.size(); ++i) {
    if ((static_cast<unsigned char>(text[i]) & 0xC0) == 0x80) continue;
    if (points == limit) return text.substr(0, i) + "\xE2\x80\xA6";
    ++points;
  }
  return text;
}

std::size_t code_points(const std::string& text) {
  std::size_t n = 0;
  for (const char c : text)
    if ((static_cast<unsigned char>(c) & 0xC0) != 0x80) ++n;
  return n;
}

// ---------------------------------------------------------------- ranges

struct Extent {
  double low = HUGE_VAL;
  double high = -HUGE_VAL;
  bool empty() const { return !(low <= high); }
  void add(double v) {
    low = std::min(low, v);
    high = std::max(high, v);
  }
};

double decade_below(double v) { return std::pow(10.0, std::floor(std::log10(v) + kLogSlack)); }
double decade_above(double v) { return std::pow(10.0, std::ceil(std::log10(v) - kLogSlack)); }

// Fills in a missing end from the data, keeping min < max.
void settle_range(const std::optional<double>& given_min, const std::optional<double>& given_max, Extent data,
                  bool whole_decades, double& out_min, double& out_max) {
  if (data.empty()) data = {1.0, 10.0};
  double lo = data.low;
  double hi = data.high;
  if (whole_decades) {
    lo = decade_below(lo);
    hi = decade_above(hi);
  }
  if (!(lo < hi)) {
    lo = decade_below(lo);
    hi = lo * 10.0;
  }
  out_min = given_min.value_or(lo);
  out_max = given_max.value_or(hi);
  if (!(out_min < out_max)) {
    if (given_min) out_max = out_min * 10.0;
    else out_min = out_max / 10.0;
  }
}

// ---------------------------------------------------------------- legend

struct LegendEntry {
  enum class Kind { series, peak, violation, more } kind = Kind::series;
  Style style = Style::total;
  std::string colour;
  std::string text;  // clipped, not yet escaped
};

std::string branch_colour(std::size_t branch_index) { return kBranchColours[branch_index % kBranchColours.size()]; }

std::vector<LegendEntry> legend_entries(const std::vector<PlotSeries>& series, const std::vector<PlotMarker>& markers,
                                       const PlotOptions& options) {
  std::vector<LegendEntry> entries;
  // Legend order: what the reader looks for first (total, other views, target), then branches.
  for (const Style style : {Style::total, Style::secondary, Style::target_mask}) {
    for (const auto& s : series) {
      if (s.style != style || s.name.empty()) continue;
      const char* colour = style == Style::total ? kTotal : style == Style::secondary ? kSecondary : kTarget;
      entries.push_back({LegendEntry::Kind::series, style, colour, clip_text(s.name, kLegendNameLimit)});
    }
  }
  std::size_t branch = 0;
  for (const auto& s : series) {
    if (s.style != Style::branch) continue;
    if (!s.name.empty())
      entries.push_back({LegendEntry::Kind::series, Style::branch, branch_colour(branch),
                         clip_text(s.name, kLegendNameLimit)});
    ++branch;
  }
  const bool any_peak = std::any_of(markers.begin(), markers.end(), [](const PlotMarker& m) { return !m.violation; });
  const bool any_violation = std::any_of(markers.begin(), markers.end(), [](const PlotMarker& m) { return m.violation; });
  if (any_peak && !options.marker_legend.empty())
    entries.push_back(
        {LegendEntry::Kind::peak, Style::total, kTotal, clip_text(options.marker_legend, kLegendNameLimit)});
  if (any_violation && !options.violation_legend.empty())
    entries.push_back({LegendEntry::Kind::violation, Style::total, kViolation,
                       clip_text(options.violation_legend, kLegendNameLimit)});
  return entries;
}

double entry_width(const LegendEntry& e) {
  return kLegendSwatch + 6.0 + kCharWidth * static_cast<double>(code_points(e.text)) + kLegendGap;
}

// Entries placed in rows of at most `row_width` px; at most `max_rows` rows, the last
// ending in "+N more" when entries had to be left out.
std::vector<std::vector<LegendEntry>> legend_rows(std::vector<LegendEntry> entries, double row_width,
                                                  std::size_t max_rows) {
  std::vector<std::vector<LegendEntry>> rows;
  double used = 0.0;
  for (std::size_t i = 0; i < entries.size(); ++i) {
    const double w = entry_width(entries[i]);
    if (rows.empty() || (used + w > row_width && !rows.back().empty())) {
      if (rows.size() == max_rows) {
        // Make room for the "+N more" note on the last row.
        auto& last = rows.back();
        std::size_t left_out = entries.size() - i;
        while (last.size() > 1 && used + 90.0 > row_width) {
          used -= entry_width(last.back());
          last.pop_back();
          ++left_out;
        }
        last.push_back({LegendEntry::Kind::more, Style::total, kInkMuted, fmt::format("+{} more", left_out)});
        return rows;
      }
      rows.emplace_back();
      used = 0.0;
    }
    rows.back().push_back(entries[i]);
    used += w;
  }
  return rows;
}

struct Frame {
  PlotLayout layout;
  std::vector<std::vector<LegendEntry>> legend;
};

Frame make_frame(const std::vector<PlotSeries>& series, const std::vector<PlotMarker>& markers,
                 const PlotOptions& options) {
  options.validate();
  for (const auto& s : series) QUIETRAIL_ASSERT(s.x.size() == s.y.size());

  Extent x_data;
  Extent y_main;
  Extent y_branch;
  for (const auto& s : series) {
    for (std::size_t i = 0; i < s.x.size(); ++i) {
      if (!usable(s.x[i], s.y[i])) continue;
      x_data.add(s.x[i]);
      (s.style == Style::branch ? y_branch : y_main).add(s.y[i]);
    }
  }
  for (const auto& m : markers) {
    if (!usable(m.x, m.y)) continue;
    x_data.add(m.x);
    y_main.add(m.y);
  }

  Frame frame;
  PlotLayout& layout = frame.layout;
  settle_range(options.x_min, options.x_max, x_data, false, layout.x_min, layout.x_max);
  settle_range(options.y_min, options.y_max, y_main.empty() ? y_branch : y_main, true, layout.y_min, layout.y_max);

  const double width = options.width;
  const double height = options.height;
  layout.left = kLeftMargin;
  layout.top = options.title.empty() ? kTopWithoutTitle : kTopWithTitle;
  layout.width = width - kLeftMargin - kRightMargin;

  const double fixed_bottom = kTickLabelBand + kAxisNameBand + kBottomPad;
  // The legend may take a quarter of the image at most, and never squeeze the plot area
  // below its minimum height.
  const double room_for_legend =
      std::min(kLegendShare * height, std::max(0.0, height - layout.top - fixed_bottom - kMinPlotHeight));
  const auto max_rows = static_cast<std::size_t>(std::max(1.0, std::floor(room_for_legend / kLegendRow)));
  frame.legend = legend_rows(legend_entries(series, markers, options), layout.width, max_rows);
  layout.height = height - layout.top - fixed_bottom - kLegendRow * static_cast<double>(frame.legend.size());
  return frame;
}

// ---------------------------------------------------------------- drawing helpers

struct Svg {
  std::string out;
  template <typename... Args>
  void put(fmt::format_string<Args...> format, Args&&... args) {
    fmt::format_to(std::back_inserter(out), format, std::forward<Args>(args)...);
  }
};

// Pieces of a series between gaps, as pixel points.
std::vector<std::vector<std::pair<double, double>>> pieces(const PlotSeries& s, const PlotLayout& layout) {
  std::vector<std::vector<std::pair<double, double>>> out;
  bool open = false;
  for (std::size_t i = 0; i < s.x.size(); ++i) {
    if (!usable(s.x[i], s.y[i])) {
      open = false;
      continue;
    }
    if (!open) out.emplace_back();
    open = true;
    out.back().emplace_back(layout.x_pixel(s.x[i]), layout.y_pixel(s.y[i]));
  }
  return out;
}

std::string point_list(const std::vector<std::pair<double, double>>& points) {
  std::string text;
  for (const auto& [x, y] : points) {
    if (!text.empty()) text += ' ';
    text += num(x);
    text += ',';
    text += num(y);
  }
  return text;
}

// ---------------------------------------------------------------- clipping
// Curves are clipped here rather than with an SVG clip path: the output then needs no ids
// and no url() references, and never carries coordinates far outside the image.

using Point = std::pair<double, double>;

struct Area {
  double x0, y0, x1, y1;
  bool contains(const Point& p) const { return p.first >= x0 && p.first <= x1 && p.second >= y0 && p.second <= y1; }
};

Area area_of(const PlotLayout& layout) {
  return {layout.left, layout.top, layout.left + layout.width, layout.top + layout.height};
}

// Liang-Barsky clipping of segment p->q to the area (Liang & Barsky, "A new concept and
// method for line clipping", ACM Trans. Graphics 3(1), 1984). Returns false when nothing is
// left; otherwise the parameters t0 <= t1 of the visible part.
bool clip_segment(const Point& p, const Point& q, const Area& a, double& t0, double& t1) {
  const double dx = q.first - p.first;
  const double dy = q.second - p.second;
  t0 = 0.0;
  t1 = 1.0;
  const std::array<std::pair<double, double>, 4> edges = {
      std::pair{-dx, p.first - a.x0}, std::pair{dx, a.x1 - p.first}, std::pair{-dy, p.second - a.y0},
      std::pair{dy, a.y1 - p.second}};
  for (const auto& [num_p, num_q] : edges) {
    if (num_p == 0.0) {
      if (num_q < 0.0) return false;  // parallel to this edge and outside it
      continue;
    }
    const double t = num_q / num_p;
    if (num_p < 0.0) t0 = std::max(t0, t);
    else t1 = std::min(t1, t);
    if (t0 > t1) return false;
  }
  return true;
}

Point along(const Point& p, const Point& q, double t) {
  return {p.first + t * (q.first - p.first), p.second + t * (q.second - p.second)};
}

// The visible runs of a polyline inside the area (a run breaks where the line leaves).
std::vector<std::vector<Point>> clip_polyline(const std::vector<Point>& line, const Area& a) {
  std::vector<std::vector<Point>> runs;
  std::vector<Point> run;
  auto flush = [&] {
    if (run.size() >= 2) runs.push_back(run);
    run.clear();
  };
  for (std::size_t i = 0; i + 1 < line.size(); ++i) {
    double t0 = 0.0;
    double t1 = 1.0;
    if (!clip_segment(line[i], line[i + 1], a, t0, t1)) {
      flush();
      continue;
    }
    if (run.empty() || t0 > 0.0) {
      flush();
      run.push_back(t0 > 0.0 ? along(line[i], line[i + 1], t0) : line[i]);
    }
    run.push_back(t1 < 1.0 ? along(line[i], line[i + 1], t1) : line[i + 1]);
    if (t1 < 1.0) flush();
  }
  flush();
  return runs;
}

// Sutherland-Hodgman clipping of a polygon to the area (Sutherland & Hodgman, "Reentrant
// polygon clipping", Comm. ACM 17(1), 1974); correct for any polygon against a rectangle.
std::vector<Point> clip_polygon(std::vector<Point> polygon, const Area& a) {
  auto against = [&](auto inside, auto cross) {
    std::vector<Point> out;
    const std::size_t n = polygon.size();
    for (std::size_t i = 0; i < n; ++i) {
      const Point& current = polygon[i];
      const Point& previous = polygon[(i + n - 1) % n];
      if (inside(current)) {
        if (!inside(previous)) out.push_back(cross(previous, current));
        out.push_back(current);
      } else if (inside(previous)) {
        out.push_back(cross(previous, current));
      }
    }
    polygon = std::move(out);
  };
  auto at_x = [](double x) {
    return [x](const Point& p, const Point& q) { return along(p, q, (x - p.first) / (q.first - p.first)); };
  };
  auto at_y = [](double y) {
    return [y](const Point& p, const Point& q) { return along(p, q, (y - p.second) / (q.second - p.second)); };
  };
  against([&](const Point& p) { return p.first >= a.x0; }, at_x(a.x0));
  against([&](const Point& p) { return p.first <= a.x1; }, at_x(a.x1));
  against([&](const Point& p) { return p.second >= a.y0; }, at_y(a.y0));
  against([&](const Point& p) { return p.second <= a.y1; }, at_y(a.y1));
  return polygon;
}

void draw_curve(Svg& svg, const PlotSeries& s, const PlotLayout& layout, const std::string& colour, double stroke,
                const char* dash, double opacity) {
  const Area area = area_of(layout);
  for (const auto& piece : pieces(s, layout)) {
    if (piece.size() == 1) {  // a lone point between gaps stays visible as a dot
      if (area.contains(piece[0]))
        svg.put("<circle cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"{}\"/>\n", num(piece[0].first), num(piece[0].second),
                num(stroke), colour);
      continue;
    }
    for (const auto& run : clip_polyline(piece, area))
      svg.put("<polyline fill=\"none\" stroke=\"{}\" stroke-width=\"{}\" stroke-linejoin=\"round\" "
              "stroke-linecap=\"round\"{}{} points=\"{}\"/>\n",
              colour, num(stroke), dash[0] ? fmt::format(" stroke-dasharray=\"{}\"", dash) : std::string(),
              opacity < 1.0 ? fmt::format(" stroke-opacity=\"{}\"", num(opacity)) : std::string(), point_list(run));
  }
}

void draw_mask(Svg& svg, const PlotSeries& s, const PlotLayout& layout) {
  // The forbidden zone: from the target line up past the top edge, then clipped.
  const double above = layout.top - 2.0;
  for (const auto& piece : pieces(s, layout)) {
    if (piece.size() < 2) continue;
    auto points = piece;
    points.emplace_back(piece.back().first, above);
    points.emplace_back(piece.front().first, above);
    const auto clipped = clip_polygon(points, area_of(layout));
    if (clipped.size() < 3) continue;
    svg.put("<polygon fill=\"{}\" fill-opacity=\"0.14\" stroke=\"none\" points=\"{}\"/>\n", kMaskFill,
            point_list(clipped));
  }
}

// Tick values on a log axis: decades (major) and 2..9 times a decade (minor), inside range.
struct Ticks {
  std::vector<double> major;
  std::vector<double> minor;
};

Ticks log_ticks(double lo, double hi) {
  Ticks t;
  const int first = static_cast<int>(std::floor(std::log10(lo) + kLogSlack));
  const int last = static_cast<int>(std::ceil(std::log10(hi) - kLogSlack));
  // Decades on the ends count (they are the frame's edges); minor lines only strictly inside.
  for (int k = first; k <= last; ++k) {
    const double decade = std::pow(10.0, k);
    if (decade >= lo * (1.0 - 1e-9) && decade <= hi * (1.0 + 1e-9)) t.major.push_back(decade);
    for (int m = 2; m <= 9; ++m) {
      const double v = m * decade;
      if (v > lo * (1.0 + 1e-9) && v < hi * (1.0 - 1e-9)) t.minor.push_back(v);
    }
  }
  return t;
}

// Mantissas that may carry a tick label besides the decade itself, sparse and dense. The
// dense set has a label within a factor 1.34 of any value, so even an axis narrower than a
// factor of 2 (which may hold no 2..9 multiple at all) gets labels.
constexpr std::array<double, 2> kMantissas125 = {2.0, 5.0};
constexpr std::array<double, 11> kMantissasDense = {1.2, 1.5, 2.0, 2.5, 3.0, 4.0, 5.0, 6.0, 7.0, 8.0, 9.0};
// The closest pair of labels in the dense set: 9 and 10 times a decade, log10(10/9) decades.
const double kClosestLabelPair = std::log10(10.0 / 9.0);

// m * 10^k strictly inside (lo, hi) for each mantissa m, ascending per decade.
template <std::size_t N>
std::vector<double> mantissa_ticks(double lo, double hi, const std::array<double, N>& mantissas) {
  std::vector<double> out;
  const int first = static_cast<int>(std::floor(std::log10(lo) + kLogSlack));
  const int last = static_cast<int>(std::ceil(std::log10(hi) - kLogSlack));
  for (int k = first; k <= last; ++k)
    for (const double m : mantissas) {
      const double v = m * std::pow(10.0, k);
      if (v > lo * (1.0 + 1e-9) && v < hi * (1.0 - 1e-9)) out.push_back(v);
    }
  return out;
}

// Labelled tick values (value, is a decade), ascending, by the rule in svg_plot.hpp:
// decades (thinned to every n-th when closer than `spacing` px); 2 and 5 times a decade when
// fewer than two decades show or a decade is at least `minor_from` px long; the dense set
// when its closest pair, 9 and 10, stays `spacing` apart.
std::vector<std::pair<double, bool>> tick_labels(const Ticks& t, double lo, double hi, double decade_px,
                                                 double minor_from, double spacing) {
  std::vector<double> minor;
  if (decade_px * kClosestLabelPair >= spacing) {
    minor = mantissa_ticks(lo, hi, kMantissasDense);
  } else if (t.major.size() < 2 || decade_px >= minor_from) {
    minor = mantissa_ticks(lo, hi, kMantissas125);
  }
  std::vector<std::pair<double, bool>> out;
  const auto step = static_cast<std::size_t>(std::max(1.0, std::ceil(spacing / std::max(decade_px, 1e-9))));
  for (std::size_t i = 0; i < t.major.size(); ++i)
    if (!minor.empty() || i % step == 0) out.emplace_back(t.major[i], true);
  for (const double v : minor) out.emplace_back(v, false);
  std::sort(out.begin(), out.end());
  return out;
}

// A plain number for a unitless axis: three significant digits at most, no SI prefix (a
// ratio of 0.5 must not read "500 m"); scientific, written "1e-6" / "2e6", beyond 1e-4..1e6.
std::string plain_number(double v) {
  if (v == 0.0 || !std::isfinite(v)) return fmt::format("{}", v);
  const int exponent = static_cast<int>(std::floor(std::log10(std::abs(v)) + kLogSlack));
  auto trim = [](std::string text) {
    if (text.find('.') == std::string::npos) return text;
    while (text.back() == '0') text.pop_back();
    if (text.back() == '.') text.pop_back();
    return text;
  };
  if (exponent >= -4 && exponent < 6) return trim(fmt::format("{:.{}f}", v, std::max(0, 2 - exponent)));
  const double mantissa = v / std::pow(10.0, exponent);
  return trim(fmt::format("{:.2f}", mantissa)) + "e" + std::to_string(exponent);
}

// format_value's text with the micro sign for display: "100 uohm" reads "100 µΩ". A
// unitless axis gets plain numbers.
std::string tick_text(double v, const std::string& unit) {
  if (unit.empty()) return plain_number(v);
  std::string text = format_value(v, unit, 3);
  const std::string ascii_micro = " u" + unit;
  if (text.ends_with(ascii_micro))
    text.replace(text.size() - ascii_micro.size(), 2, " \xC2\xB5");  // U+00B5
  return text;
}

struct Box {
  double x0, y0, x1, y1;
  bool overlaps(const Box& o) const { return x0 < o.x1 && o.x0 < x1 && y0 < o.y1 && o.y0 < y1; }
};

struct LabelSpot {
  double x = 0.0;
  double baseline = 0.0;
  bool anchor_end = false;
};

// Where a marker's label goes: the first of above-right, above-left, below-right,
// below-left that stays inside the plot area and clears the labels and markers in
// `taken`; else the first inside the area; else above-right. Greedy, in marker order, so
// the result is deterministic. The chosen box is added to `taken`.
LabelSpot place_label(double px, double py, double text_width, const PlotLayout& layout, std::vector<Box>& taken) {
  constexpr double kGap = 8.0;
  constexpr double kAscent = 11.0;
  constexpr double kDescent = 3.0;
  const std::array<LabelSpot, 4> spots = {LabelSpot{px + kGap, py - 9.0, false}, LabelSpot{px - kGap, py - 9.0, true},
                                          LabelSpot{px + kGap, py + 17.0, false}, LabelSpot{px - kGap, py + 17.0, true}};
  auto box_of = [&](const LabelSpot& s) {
    const double x0 = s.anchor_end ? s.x - text_width : s.x;
    return Box{x0, s.baseline - kAscent, x0 + text_width, s.baseline + kDescent};
  };
  auto inside = [&](const Box& b) {
    return b.x0 >= layout.left && b.x1 <= layout.left + layout.width && b.y0 >= layout.top &&
           b.y1 <= layout.top + layout.height;
  };
  const LabelSpot* choice = nullptr;
  for (const auto& s : spots) {
    const Box b = box_of(s);
    if (!inside(b)) continue;
    if (std::none_of(taken.begin(), taken.end(), [&](const Box& t) { return t.overlaps(b); })) {
      choice = &s;
      break;
    }
    if (choice == nullptr) choice = &s;
  }
  if (choice == nullptr) choice = &spots[0];
  taken.push_back(box_of(*choice));
  return *choice;
}

void draw_legend_swatch(Svg& svg, const LegendEntry& e, double x, double y) {
  const double x2 = x + kLegendSwatch;
  switch (e.kind) {
    case LegendEntry::Kind::peak:
      svg.put("<circle cx=\"{}\" cy=\"{}\" r=\"4.5\" fill=\"#ffffff\" stroke=\"{}\" stroke-width=\"1.6\"/>\n",
              num(x + kLegendSwatch / 2), num(y), kTotal);
      return;
    case LegendEntry::Kind::violation:
      svg.put("<circle cx=\"{}\" cy=\"{}\" r=\"4.5\" fill=\"{}\" stroke=\"#ffffff\" stroke-width=\"1\"/>\n",
              num(x + kLegendSwatch / 2), num(y), kViolation);
      return;
    case LegendEntry::Kind::more: return;
    case LegendEntry::Kind::series: break;
  }
  switch (e.style) {
    case Style::target_mask:
      svg.put("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"8\" fill=\"{}\" fill-opacity=\"0.3\"/>\n", num(x),
              num(y - 8), num(kLegendSwatch), kMaskFill);
      svg.put("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"1.6\" "
              "stroke-dasharray=\"7 4\"/>\n",
              num(x), num(y), num(x2), num(y), kTarget);
      return;
    case Style::total:
      svg.put("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"2.6\" "
              "stroke-linecap=\"round\"/>\n",
              num(x), num(y), num(x2), num(y), kTotal);
      return;
    case Style::secondary:
      svg.put("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"1.8\" "
              "stroke-dasharray=\"6 4\"/>\n",
              num(x), num(y), num(x2), num(y), kSecondary);
      return;
    case Style::branch:
      svg.put("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"1.6\"/>\n", num(x), num(y),
              num(x2), num(y), e.colour);
      return;
  }
}

}  // namespace

void PlotOptions::validate() const {
  const InputLocation at{"plot options", ""};
  auto where = [&](const char* field) { return InputLocation{at.file, field}; };
  require_input(width >= 320 && width <= 8000, where("width"), "a width of 320 to 8000 px", std::to_string(width));
  require_input(height >= 320 && height <= 8000, where("height"), "a height of 320 to 8000 px",
                std::to_string(height));
  auto check_end = [&](const std::optional<double>& v, const char* field) {
    if (v) require_input(std::isfinite(*v) && *v > 0.0, where(field), "a finite axis end > 0", fmt::format("{}", *v));
  };
  check_end(x_min, "x_min");
  check_end(x_max, "x_max");
  check_end(y_min, "y_min");
  check_end(y_max, "y_max");
  if (x_min && x_max)
    require_input(*x_min < *x_max, where("x_min"), "x_min < x_max", fmt::format("{} >= {}", *x_min, *x_max));
  if (y_min && y_max)
    require_input(*y_min < *y_max, where("y_min"), "y_min < y_max", fmt::format("{} >= {}", *y_min, *y_max));
  bool id_ok = !id.empty() && ((id[0] >= 'a' && id[0] <= 'z') || (id[0] >= 'A' && id[0] <= 'Z'));
  for (const char c : id)
    id_ok = id_ok && ((c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '-' || c == '_');
  require_input(id_ok, where("id"), "an id of letters, digits, '-' and '_' starting with a letter",
                detail::quoted(id));
}

double PlotLayout::x_pixel(double x) const {
  return left + width * (std::log10(x) - std::log10(x_min)) / (std::log10(x_max) - std::log10(x_min));
}

double PlotLayout::y_pixel(double y) const {
  return top + height * (std::log10(y_max) - std::log10(y)) / (std::log10(y_max) - std::log10(y_min));
}

PlotLayout plot_layout(const std::vector<PlotSeries>& series, const std::vector<PlotMarker>& markers,
                       const PlotOptions& options) {
  return make_frame(series, markers, options).layout;
}

std::string render_svg_loglog(const std::vector<PlotSeries>& series, const std::vector<PlotMarker>& markers,
                              const PlotOptions& options) {
  const Frame frame = make_frame(series, markers, options);
  const PlotLayout& layout = frame.layout;
  const double right = layout.left + layout.width;
  const double bottom = layout.top + layout.height;
  const std::string x_unit = display_unit(options.x_unit);
  const std::string y_unit = display_unit(options.y_unit);

  Svg svg;
  svg.put("<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" id=\"{0}\" width=\"{1}\" height=\"{2}\" "
          "viewBox=\"0 0 {1} {2}\" role=\"img\" font-family=\"{3}\">\n",
          options.id, options.width, options.height, kFont);
  const std::string accessible_title =
      options.title.empty() ? options.y_label + " against " + options.x_label : options.title;
  svg.put("<title>{}</title>\n", escape_xml(accessible_title));
  svg.put("<rect x=\"0\" y=\"0\" width=\"{}\" height=\"{}\" fill=\"{}\"/>\n", options.width, options.height, kPaper);
  svg.put("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{}\"/>\n", num(layout.left), num(layout.top),
          num(layout.width), num(layout.height), kPlotFill);

  // ---- grid
  const Ticks xt = log_ticks(layout.x_min, layout.x_max);
  const Ticks yt = log_ticks(layout.y_min, layout.y_max);
  const double x_decade_px = layout.width / (std::log10(layout.x_max) - std::log10(layout.x_min));
  const double y_decade_px = layout.height / (std::log10(layout.y_max) - std::log10(layout.y_min));
  const auto x_ticks =
      tick_labels(xt, layout.x_min, layout.x_max, x_decade_px, kTickLabelMinDecadeX, kTickLabelSpacingX);
  const auto y_ticks =
      tick_labels(yt, layout.y_min, layout.y_max, y_decade_px, kTickLabelMinDecadeY, kTickLabelSpacingY);
  // Light lines at 2..9 times each decade, and at the labelled 1.2, 1.5 and 2.5 so that no
  // label floats without its line.
  auto minor_lines = [](const Ticks& t, const std::vector<std::pair<double, bool>>& labelled) {
    std::vector<double> lines = t.minor;
    for (const auto& [v, major] : labelled)
      if (!major && !std::binary_search(t.minor.begin(), t.minor.end(), v, [](double a, double b) {
            return a < b * (1.0 - 1e-9);
          }))
        lines.push_back(v);
    return lines;
  };
  svg.put("<g stroke=\"{}\" stroke-width=\"1\">\n", kGridMinor);
  if (x_decade_px >= kMinorLinesMinDecade)
    for (const double v : minor_lines(xt, x_ticks))
      svg.put("<line class=\"grid-minor-x\" x1=\"{0}\" y1=\"{1}\" x2=\"{0}\" y2=\"{2}\"/>\n", num(layout.x_pixel(v)),
              num(layout.top), num(bottom));
  if (y_decade_px >= kMinorLinesMinDecade)
    for (const double v : minor_lines(yt, y_ticks))
      svg.put("<line class=\"grid-minor-y\" x1=\"{0}\" y1=\"{1}\" x2=\"{2}\" y2=\"{1}\"/>\n", num(layout.left),
              num(layout.y_pixel(v)), num(right));
  svg.put("</g>\n<g stroke=\"{}\" stroke-width=\"1\">\n", kGridMajor);
  for (const double v : xt.major)
    svg.put("<line class=\"grid-major-x\" x1=\"{0}\" y1=\"{1}\" x2=\"{0}\" y2=\"{2}\"/>\n", num(layout.x_pixel(v)),
            num(layout.top), num(bottom));
  for (const double v : yt.major)
    svg.put("<line class=\"grid-major-y\" x1=\"{0}\" y1=\"{1}\" x2=\"{2}\" y2=\"{1}\"/>\n", num(layout.left),
            num(layout.y_pixel(v)), num(right));
  svg.put("</g>\n");

  // ---- data, clipped to the plot area
  svg.put("<g>\n");
  for (const auto& s : series)
    if (s.style == Style::target_mask) draw_mask(svg, s, layout);
  std::size_t branch = 0;
  for (const auto& s : series)
    if (s.style == Style::branch) draw_curve(svg, s, layout, branch_colour(branch++), 1.5, "", 0.95);
  for (const auto& s : series)
    if (s.style == Style::secondary) draw_curve(svg, s, layout, kSecondary, 1.8, "6 4", 1.0);
  for (const auto& s : series)
    if (s.style == Style::target_mask) draw_curve(svg, s, layout, kTarget, 1.6, "7 4", 1.0);
  for (const auto& s : series)
    if (s.style == Style::total) draw_curve(svg, s, layout, kTotal, 2.6, "", 1.0);
  svg.put("</g>\n");

  // ---- markers, then their labels on top (labels may leave the area a little; not clipped)
  struct Placed {
    double px;
    double py;
    const PlotMarker* marker;
  };
  std::vector<Placed> shown;
  const double in_range = 1e-9;
  for (const auto& m : markers) {
    if (!usable(m.x, m.y)) continue;
    if (m.x < layout.x_min * (1 - in_range) || m.x > layout.x_max * (1 + in_range) ||
        m.y < layout.y_min * (1 - in_range) || m.y > layout.y_max * (1 + in_range))
      continue;
    const double px = layout.x_pixel(m.x);
    const double py = layout.y_pixel(m.y);
    shown.push_back({px, py, &m});
    if (m.violation)
      svg.put("<circle class=\"marker-violation\" cx=\"{}\" cy=\"{}\" r=\"4.5\" fill=\"{}\" stroke=\"#ffffff\" "
              "stroke-width=\"1\"/>\n",
              num(px), num(py), kViolation);
    else
      svg.put("<circle class=\"marker\" cx=\"{}\" cy=\"{}\" r=\"4.5\" fill=\"#ffffff\" stroke=\"{}\" "
              "stroke-width=\"1.6\"/>\n",
              num(px), num(py), kTotal);
  }
  std::vector<Box> taken;  // label boxes placed so far, and the marker circles
  for (const auto& p : shown) taken.push_back({p.px - 5.0, p.py - 5.0, p.px + 5.0, p.py + 5.0});
  for (const auto& p : shown) {
    if (p.marker->label.empty()) continue;
    const std::string label = clip_text(p.marker->label, kLegendNameLimit);
    const LabelSpot spot = place_label(p.px, p.py, kCharWidth * static_cast<double>(code_points(label)), layout, taken);
    svg.put("<text class=\"marker-label\" x=\"{}\" y=\"{}\" font-size=\"12\" text-anchor=\"{}\" fill=\"{}\" "
            "stroke=\"#ffffff\" stroke-width=\"3\" stroke-linejoin=\"round\" paint-order=\"stroke\">{}</text>\n",
            num(spot.x), num(spot.baseline), spot.anchor_end ? "end" : "start",
            p.marker->violation ? kViolation : kInk, escape_xml(label));
  }

  // ---- frame and tick labels
  svg.put("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"1\"/>\n",
          num(layout.left), num(layout.top), num(layout.width), num(layout.height), kFrame);
  svg.put("<g font-size=\"12\" fill=\"{}\">\n", kInkMuted);
  for (const auto& [v, major] : x_ticks) {
    svg.put("<line x1=\"{0}\" y1=\"{1}\" x2=\"{0}\" y2=\"{2}\" stroke=\"{3}\"/>\n", num(layout.x_pixel(v)),
            num(bottom), num(bottom + (major ? 4.0 : 3.0)), kFrame);
    svg.put("<text class=\"tick-x\" x=\"{}\" y=\"{}\" text-anchor=\"middle\"{}>{}</text>\n", num(layout.x_pixel(v)),
            num(bottom + 18.0), major ? "" : kMinorTickStyle, escape_xml(tick_text(v, x_unit)));
  }
  for (const auto& [v, major] : y_ticks) {
    svg.put("<line x1=\"{0}\" y1=\"{1}\" x2=\"{2}\" y2=\"{1}\" stroke=\"{3}\"/>\n",
            num(layout.left - (major ? 4.0 : 3.0)), num(layout.y_pixel(v)), num(layout.left), kFrame);
    svg.put("<text class=\"tick-y\" x=\"{}\" y=\"{}\" text-anchor=\"end\"{}>{}</text>\n", num(layout.left - 7.0),
            num(layout.y_pixel(v) + 4.0), major ? "" : kMinorTickStyle, escape_xml(tick_text(v, y_unit)));
  }
  svg.put("</g>\n");

  // ---- axis names and title
  svg.put("<text x=\"{}\" y=\"{}\" font-size=\"13\" text-anchor=\"middle\" fill=\"{}\">{}</text>\n",
          num(layout.left + layout.width / 2), num(bottom + kTickLabelBand + 16.0), kInk, escape_xml(options.x_label));
  svg.put("<text transform=\"translate({} {}) rotate(-90)\" font-size=\"13\" text-anchor=\"middle\" "
          "fill=\"{}\">{}</text>\n",
          num(18.0), num(layout.top + layout.height / 2), kInk, escape_xml(options.y_label));
  if (!options.title.empty())
    svg.put("<text x=\"{}\" y=\"{}\" font-size=\"17\" font-weight=\"600\" fill=\"{}\">{}</text>\n", num(layout.left),
            num(30.0), kInk, escape_xml(options.title));

  // ---- legend
  double y = bottom + kTickLabelBand + kAxisNameBand + kLegendRow / 2 + 2.0;
  for (const auto& row : frame.legend) {
    double x = layout.left;
    for (const auto& e : row) {
      draw_legend_swatch(svg, e, x, y);
      const double text_x = e.kind == LegendEntry::Kind::more ? x : x + kLegendSwatch + 6.0;
      svg.put("<text class=\"legend\" x=\"{}\" y=\"{}\" font-size=\"12\" fill=\"{}\">{}</text>\n", num(text_x),
              num(y + 4.0), e.kind == LegendEntry::Kind::more ? kInkMuted : kInk, escape_xml(e.text));
      x += entry_width(e);
    }
    y += kLegendRow;
  }
  svg.put("</svg>\n");
  return svg.out;
}

}  // namespace quietrail
