// SPDX-License-Identifier: MIT
// Log-log SVG plots of impedance against frequency: total, per-branch and secondary curves,
// the target drawn as a mask, marked peaks and a legend. Takes plain data (no analysis types).
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace quietrail {

/// One curve of the plot, drawn as a polyline through (x[i], y[i]).
///
/// Points whose x or y is not finite or not > 0 cannot sit on a log axis; they are skipped
/// and break the line into separate pieces (a gap), never written as NaN.
struct PlotSeries {
  /// How the curve is drawn.
  enum class Style {
    total,        ///< the rail's impedance: bold, dark, drawn above everything else
    branch,       ///< one branch or part alone: thin and muted, colours cycle per branch
    target_mask,  ///< the target: a dashed line with the region above it (forbidden) shaded
    secondary,    ///< another view of the rail (e.g. seen from the die): medium, dashed
  };

  /// Legend text; any text (XML-escaped on output). An empty name leaves the series out of
  /// the legend.
  std::string name;
  /// Abscissae, usually frequency in Hz. Same length as `y` (QUIETRAIL_ASSERT).
  std::vector<double> x;
  /// Ordinates, usually |Z| in ohm.
  std::vector<double> y;
  /// Drawing style.
  Style style = Style::total;
};

/// A marked point, e.g. a refined impedance peak: a small circle with a label beside it.
struct PlotMarker {
  /// Position in data units (e.g. Hz, ohm); a marker with a non-finite or non-positive
  /// coordinate, or outside the axis range, is not drawn.
  double x = 0.0;
  double y = 0.0;
  /// Label text; any text (XML-escaped on output). Empty: circle only.
  std::string label;
  /// True when the point breaks the target: drawn filled in the warning colour.
  bool violation = false;
};

/// What the plot shows and how large it is.
struct PlotOptions {
  /// Title above the plot; any text (XML-escaped). Empty: no title line.
  std::string title;
  /// Axis names; the tick labels carry the units.
  std::string x_label = "Frequency";
  std::string y_label = "|Z|";
  /// Units for the tick labels, written with SI prefixes by format_value (units.hpp), e.g.
  /// "1 kHz", "10 MHz". The unit "ohm" is shown as the sign U+03A9 ("10 mΩ"), so "m"
  /// (milli) can never be read as mega. An empty unit marks a unitless axis (a ratio, a
  /// count): its ticks are plain numbers without prefixes ("0.5", "1", "20", "1000"; "1e-6"
  /// and "1e6" beyond 1e-4..1e6), so a ratio of one half never reads "500 m".
  std::string x_unit = "Hz";
  std::string y_unit = "ohm";
  /// Size of the whole image in CSS pixels (viewBox and width/height attributes); 320..8000.
  /// 960 x 600 suits a report page and a 16:10 screen (common practice).
  int width = 960;
  int height = 600;
  /// Axis ranges in data units; both ends > 0 and finite, min < max. When unset, x spans the
  /// finite positive data exactly, and y spans the total, secondary and target curves and the
  /// markers, widened outwards to whole decades. Branch curves do not widen the y range (a
  /// lone small capacitor reaches kilo-ohms at low frequency); they are clipped instead.
  std::optional<double> x_min;
  std::optional<double> x_max;
  std::optional<double> y_min;
  std::optional<double> y_max;
  /// The root <svg> element's id, e.g. for links within a page; the only id in the output
  /// (curves are clipped in code, so there are no clip-path ids or url() references). Give
  /// each plot its own id when several are inlined in one HTML page. Letters, digits, '-'
  /// and '_' only; must start with a letter.
  std::string id = "quietrail-plot";
  /// Legend texts for the two kinds of marker (PlotMarker::violation false / true); any
  /// text (XML-escaped). The defaults name impedance peaks; a plot whose markers are
  /// something else says so here. An empty text leaves that kind out of the legend.
  std::string marker_legend = "peak";
  std::string violation_legend = "peak above target";

  /// Throws InputError (file "plot options", field named) for a size out of range, an axis
  /// end that is not finite or not > 0, min >= max, or an invalid id.
  void validate() const;
};

/// Where the axes landed: the plot area in pixels and the axis ranges in data units.
///
/// Log mapping (the usual log axis): for x in [x_min, x_max],
///   px = left + width * (log10 x - log10 x_min) / (log10 x_max - log10 x_min),
///   py = top + height * (log10 y_max - log10 y) / (log10 y_max - log10 y_min).
struct PlotLayout {
  double left = 0.0;    ///< plot area's left edge, px from the image's left
  double top = 0.0;     ///< plot area's top edge, px from the image's top
  double width = 0.0;   ///< plot area width, px
  double height = 0.0;  ///< plot area height, px
  double x_min = 1.0;   ///< axis ranges, data units
  double x_max = 10.0;
  double y_min = 1.0;
  double y_max = 10.0;

  /// Pixel column of `x` by the log mapping above (any x > 0; outside the range it lies
  /// outside the area).
  double x_pixel(double x) const;
  /// Pixel row of `y` by the log mapping above (row 0 at the top).
  double y_pixel(double y) const;
};

/// The layout render_svg_loglog uses for these inputs: axis ranges (options, or the data
/// rule in PlotOptions) and the plot area left after the title, tick labels and legend.
/// With no usable data the range is 1..10 on both axes. Calls options.validate().
PlotLayout plot_layout(const std::vector<PlotSeries>& series, const std::vector<PlotMarker>& markers,
                       const PlotOptions& options);

/// A standalone SVG 1.1 document (root <svg> with xmlns, no XML declaration, no scripts,
/// no references of any kind): log-log axes with a grid line at every decade in range
/// (10^k for k from ceil(log10 min) to floor(log10 max)) and light lines at 2..9 times each
/// decade, tick labels in engineering units (micro written as U+00B5) or plain numbers for
/// a unitless axis, the target mask, branch curves under secondary curves under the total
/// curve (all clipped to the plot area), markers with labels placed clear of each other
/// where possible, and a legend below the axes.
/// Tick labels: every decade (thinned when decades crowd); 2 and 5 times each decade too
/// when fewer than two decades show or a decade spans at least 230 px on x, 90 px on y;
/// and 1.2, 1.5, 2, 2.5, 3, 4 .. 9 times each decade when even the closest pair (9 and 10)
/// stays a label's spacing apart (62 px on x, 20 px on y: a decade of about 1350 px on x,
/// 440 px on y; at the default size, an axis spanning about a decade or less). A label then
/// lies within a factor 1.34 of any value, so a short axis is never left bare.
/// Coordinates are written with two decimals in C-locale form, so the same input gives the
/// same bytes. Series x/y of different lengths are a bug (QUIETRAIL_ASSERT); bad options
/// throw InputError (PlotOptions::validate).
///
/// Example:
///   PlotSeries z{.name = "rail", .x = f, .y = magnitude, .style = PlotSeries::Style::total};
///   PlotSeries t{.name = "target", .x = f, .y = target, .style = PlotSeries::Style::target_mask};
///   std::string svg = render_svg_loglog({t, z}, {{.x = 2.1e6, .y = 0.012, .label = "12 mΩ"}}, {});
std::string render_svg_loglog(const std::vector<PlotSeries>& series, const std::vector<PlotMarker>& markers,
                              const PlotOptions& options);

}  // namespace quietrail
