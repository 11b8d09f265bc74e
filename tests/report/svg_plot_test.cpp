// SPDX-License-Identifier: MIT
// Log-log SVG plots: well-formed XML, decade grid lines where log10 puts them, points at the
// pixel given by the log axis transform, gaps for unusable values, escaping, determinism.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>
#include <string>
#include <vector>

#include "quietrail/error.hpp"
#include "quietrail/report/svg_plot.hpp"
#include "support/xml_check.hpp"

using quietrail::InputError;
using quietrail::PlotLayout;
using quietrail::PlotMarker;
using quietrail::PlotOptions;
using quietrail::PlotSeries;
using quietrail::plot_layout;
using quietrail::render_svg_loglog;
using quietrail::test::parse_xml;
using quietrail::test::points_of;
using quietrail::test::XmlElement;
using Style = PlotSeries::Style;

namespace {

// Coordinates are written with two decimals, so they are within half a hundredth of a pixel.
constexpr double kPixelTolerance = 0.0051;
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Frequencies from 10^lo to 10^hi Hz, `per_decade` points per decade, log spaced.
std::vector<double> log_grid(double lo, double hi, int per_decade) {
  std::vector<double> f;
  const int n = static_cast<int>(std::lround((hi - lo) * per_decade));
  for (int i = 0; i <= n; ++i) f.push_back(std::pow(10.0, lo + (hi - lo) * i / n));
  return f;
}

std::vector<const XmlElement*> with_class(const XmlElement& root, const std::string& element, const std::string& cls) {
  std::vector<const XmlElement*> out;
  for (const auto* e : root.all(element))
    if (e->attribute("class") == cls) out.push_back(e);
  return out;
}

double attr(const XmlElement* e, const char* name) { return std::stod(e->attribute(name)); }


// Pixel column of x on a log axis, closed form (the textbook log mapping).
double expected_px(double x, double x_min, double x_max, double left, double width) {
  return left + width * (std::log10(x) - std::log10(x_min)) / (std::log10(x_max) - std::log10(x_min));
}
double expected_py(double y, double y_min, double y_max, double top, double height) {
  return top + height * (std::log10(y_max) - std::log10(y)) / (std::log10(y_max) - std::log10(y_min));
}

}  // namespace

TEST_CASE("the XML checker used by these tests rejects broken documents", "[report]") {
  // XML 1.0 (5th ed.) well-formedness constraints: element type match (3), no '<' in
  // attribute values (3.1), unique attributes (3.1), predefined entities only (4.6).
  CHECK_NOTHROW(parse_xml("<a x=\"1\"><b/>t &amp; &lt; &#38;</a>"));
  CHECK_THROWS(parse_xml("<a><b></a></b>"));
  CHECK_THROWS(parse_xml("<a x=\"<\"/>"));
  CHECK_THROWS(parse_xml("<a x=\"1\" x=\"2\"/>"));
  CHECK_THROWS(parse_xml("<a>fish & chips</a>"));
  CHECK_THROWS(parse_xml("<a>&nbsp;</a>"));
  CHECK_THROWS(parse_xml("<a></a><b></b>"));
  CHECK_THROWS(parse_xml("<a>"));
  CHECK_THROWS(parse_xml("<a x=1/>"));
}

TEST_CASE("the plot is a well-formed standalone SVG document", "[report]") {
  const auto f = log_grid(3, 9, 20);
  std::vector<double> z;
  for (const double x : f) z.push_back(0.01 * std::sqrt(x / 1e6) + 0.001);
  const std::string svg = render_svg_loglog({{"rail", f, z, Style::total}}, {{1e6, 0.011, "peak", false}}, {});
  const auto root = parse_xml(svg);
  // SVG 1.1 (W3C 2011), section 5.1.1: the root is <svg> in the SVG namespace.
  CHECK(root->name == "svg");
  CHECK(root->attribute("xmlns") == "http://www.w3.org/2000/svg");
  CHECK(root->attribute("viewBox") == "0 0 960 600");
  CHECK(root->all("polyline").size() == 1);
  // No scripts, no external references.
  CHECK(root->all("script").empty());
  CHECK(svg.find("href") == std::string::npos);
  CHECK(svg.find("http", svg.find("svg\"") + 1) == std::string::npos);
}

TEST_CASE("decade grid lines sit exactly at the decades inside the range", "[report]") {
  // Data from 2 kHz to 300 MHz: decades 10^k for k = ceil(log10 2e3) = 4 to
  // floor(log10 3e8) = 8 (closed form), five lines. y pinned to 1 mohm..10 ohm: k = -3..1.
  const std::vector<double> f{2e3, 1e5, 3e8};
  const std::vector<double> z{0.5, 0.02, 3.0};
  PlotOptions options;
  options.y_min = 1e-3;
  options.y_max = 10.0;
  const std::vector<PlotSeries> series{{"rail", f, z, Style::total}};
  const PlotLayout layout = plot_layout(series, {}, options);
  CHECK(layout.x_min == 2e3);
  CHECK(layout.x_max == 3e8);
  const auto root = parse_xml(render_svg_loglog(series, {}, options));

  const auto x_lines = with_class(*root, "line", "grid-major-x");
  REQUIRE(x_lines.size() == 5);
  for (std::size_t i = 0; i < x_lines.size(); ++i) {
    const double decade = std::pow(10.0, 4 + static_cast<int>(i));
    CHECK_THAT(attr(x_lines[i], "x1"),
               Catch::Matchers::WithinAbs(expected_px(decade, 2e3, 3e8, layout.left, layout.width), kPixelTolerance));
    CHECK(attr(x_lines[i], "x1") == attr(x_lines[i], "x2"));
  }
  const auto y_lines = with_class(*root, "line", "grid-major-y");
  REQUIRE(y_lines.size() == 5);
  for (std::size_t i = 0; i < y_lines.size(); ++i) {
    const double decade = std::pow(10.0, -3 + static_cast<int>(i));
    CHECK_THAT(attr(y_lines[i], "y1"),
               Catch::Matchers::WithinAbs(expected_py(decade, 1e-3, 10.0, layout.top, layout.height), kPixelTolerance));
  }
  // Minor lines at m * 10^k, m = 2..9, strictly inside 2e3..3e8: 3..9e3 (7), four full
  // decades 1e4..1e7 (32) and 2e8 (1) = 40; y: 4 full decades = 32.
  CHECK(with_class(*root, "line", "grid-minor-x").size() == 40);
  CHECK(with_class(*root, "line", "grid-minor-y").size() == 32);
}

TEST_CASE("tick labels use engineering units with the ohm sign", "[report]") {
  // SI prefixes (BIPM SI brochure, 9th ed., table 7): 1e3 k, 1e6 M, 1e9 G, 1e-3 m.
  // x: six decades in 840 px (140 px each) carry decade labels only; y: three decades in
  // 524 px are long enough (>= 90 px, svg_plot.hpp) for 2 and 5 times each decade too.
  PlotOptions options;
  options.x_min = 1e3;
  options.x_max = 1e9;
  options.y_min = 1e-3;
  options.y_max = 1.0;
  const auto root = parse_xml(render_svg_loglog({}, {}, options));
  std::vector<std::string> x_ticks;
  for (const auto* e : with_class(*root, "text", "tick-x")) x_ticks.push_back(e->text);
  std::vector<std::string> y_ticks;
  for (const auto* e : with_class(*root, "text", "tick-y")) y_ticks.push_back(e->text);
  CHECK(x_ticks == std::vector<std::string>{"1 kHz", "10 kHz", "100 kHz", "1 MHz", "10 MHz", "100 MHz", "1 GHz"});
  CHECK(y_ticks == std::vector<std::string>{"1 m\xCE\xA9", "2 m\xCE\xA9", "5 m\xCE\xA9", "10 m\xCE\xA9",
                                            "20 m\xCE\xA9", "50 m\xCE\xA9", "100 m\xCE\xA9", "200 m\xCE\xA9",
                                            "500 m\xCE\xA9", "1 \xCE\xA9"});
}

TEST_CASE("micro is written with the micro sign on the axes", "[report]") {
  // BIPM SI brochure, table 7: the prefix micro is the Greek letter mu (U+00B5 in text).
  PlotOptions options;
  options.x_min = 1e3;
  options.x_max = 1e9;
  options.y_min = 1e-4;
  options.y_max = 1e-2;
  const auto root = parse_xml(render_svg_loglog({}, {}, options));
  const auto ticks = with_class(*root, "text", "tick-y");
  REQUIRE(!ticks.empty());
  CHECK(ticks.front()->text == "100 \xC2\xB5\xCE\xA9");
}

TEST_CASE("labels of markers at the same spot are placed apart", "[report]") {
  const std::vector<PlotMarker> markers{{1e6, 0.01, "first", false}, {1e6, 0.01, "second", true}};
  const auto root = parse_xml(render_svg_loglog({{"rail", {1e3, 1e9}, {1.0, 0.001}, Style::total}}, markers, {}));
  const auto labels = with_class(*root, "text", "marker-label");
  REQUIRE(labels.size() == 2);
  CHECK(labels[0]->text == "first");
  CHECK(labels[1]->text == "second");
  const bool same_spot = labels[0]->attribute("x") == labels[1]->attribute("x") &&
                         labels[0]->attribute("y") == labels[1]->attribute("y") &&
                         labels[0]->attribute("text-anchor") == labels[1]->attribute("text-anchor");
  CHECK_FALSE(same_spot);
}

TEST_CASE("an axis shorter than two decades also labels 2 and 5 times the decade", "[report]") {
  PlotOptions options;
  options.x_min = 1e6;
  options.x_max = 6e6;
  options.y_min = 1e-3;
  options.y_max = 1.0;
  const auto root = parse_xml(render_svg_loglog({}, {}, options));
  std::vector<std::string> x_ticks;
  for (const auto* e : with_class(*root, "text", "tick-x")) x_ticks.push_back(e->text);
  CHECK(x_ticks == std::vector<std::string>{"1 MHz", "2 MHz", "5 MHz"});
}

TEST_CASE("a unitless axis is labelled with plain numbers, never SI prefixes", "[report]") {
  // A ratio or a count has no unit, so no SI prefix either (prefixes attach to units: BIPM
  // SI brochure, 9th ed., section 3); 0.5 must read "0.5", not "500 m". Tick values on a
  // log axis are n * 10^k (the usual log axis); this one spans well under a decade in
  // 524 px (y) and 840 px (x), so svg_plot.hpp's rule labels 1.2, 1.5 and 2..9 times each
  // decade (9 and 10 stay more than 20 px / 62 px apart) besides the decade.
  PlotOptions options;
  options.x_unit = "";
  options.y_unit = "";
  options.x_min = 60.0;
  options.x_max = 180.0;
  options.y_min = 0.3;
  options.y_max = 1.6;
  const auto root = parse_xml(render_svg_loglog({}, {}, options));
  std::vector<std::string> x_ticks;
  for (const auto* e : with_class(*root, "text", "tick-x")) x_ticks.push_back(e->text);
  std::vector<std::string> y_ticks;
  for (const auto* e : with_class(*root, "text", "tick-y")) y_ticks.push_back(e->text);
  // Values strictly inside (60, 180) and (0.3, 1.6): n * 10^k for n in {1, 1.2, 1.5, 2..9}.
  CHECK(x_ticks == std::vector<std::string>{"70", "80", "90", "100", "120", "150"});
  CHECK(y_ticks == std::vector<std::string>{"0.4", "0.5", "0.6", "0.7", "0.8", "0.9", "1", "1.2", "1.5"});
  // Every label has its grid line: the label's column (text-anchor middle) is a grid line's.
  std::vector<std::string> grid_columns;
  for (const auto* cls : {"grid-major-x", "grid-minor-x"})
    for (const auto* e : with_class(*root, "line", cls)) grid_columns.push_back(e->attribute("x1"));
  for (const auto* e : with_class(*root, "text", "tick-x")) {
    INFO("tick " << e->text << " at x " << e->attribute("x"));
    CHECK(std::find(grid_columns.begin(), grid_columns.end(), e->attribute("x")) != grid_columns.end());
  }
}

TEST_CASE("plain tick numbers take a short scientific form beyond 1e-4 to 1e6", "[report]") {
  // x: four decades in 840 px (210 px each, under 230 px) carry decade labels only; y: three
  // decades in 524 px (175 px each, at least 90 px) carry 2 and 5 times each decade too
  // (svg_plot.hpp). 10^6 and beyond are written "1e6"; 10^-4 is still "0.0001".
  PlotOptions options;
  options.x_unit = "";
  options.y_unit = "";
  options.x_min = 1e3;
  options.x_max = 1e7;
  options.y_min = 1e-6;
  options.y_max = 1e-3;
  const auto root = parse_xml(render_svg_loglog({}, {}, options));
  std::vector<std::string> x_ticks;
  for (const auto* e : with_class(*root, "text", "tick-x")) x_ticks.push_back(e->text);
  std::vector<std::string> y_ticks;
  for (const auto* e : with_class(*root, "text", "tick-y")) y_ticks.push_back(e->text);
  CHECK(x_ticks == std::vector<std::string>{"1000", "10000", "100000", "1e6", "1e7"});
  CHECK(y_ticks == std::vector<std::string>{"1e-6", "2e-6", "5e-6", "1e-5", "2e-5", "5e-5", "0.0001", "0.0002",
                                            "0.0005", "0.001"});
}

TEST_CASE("marker legend texts come from the options; the defaults name peaks", "[report]") {
  const std::vector<PlotMarker> markers{{1e5, 0.05, "a", false}, {1e7, 0.2, "b", true}};
  const std::vector<PlotSeries> series{{"rail", {1e3, 1e9}, {0.01, 1.0}, Style::total}};
  auto legend_of = [&](const PlotOptions& options) {
    std::vector<std::string> legend;
    const auto root = parse_xml(render_svg_loglog(series, markers, options));
    for (const auto* e : with_class(*root, "text", "legend")) legend.push_back(e->text);
    return legend;
  };
  CHECK(legend_of({}) == std::vector<std::string>{"rail", "peak", "peak above target"});
  PlotOptions renamed;
  renamed.marker_legend = "selection <found>";
  renamed.violation_legend = "";  // left out of the legend
  CHECK(legend_of(renamed) == std::vector<std::string>{"rail", "selection <found>"});
  // The markers themselves are still drawn, both kinds.
  const auto root = parse_xml(render_svg_loglog(series, markers, renamed));
  CHECK(with_class(*root, "circle", "marker").size() == 1);
  CHECK(with_class(*root, "circle", "marker-violation").size() == 1);
}

TEST_CASE("a point at 1 MHz and 10 mohm lands on the pixel of the log axis transform", "[report]") {
  // Range 1 kHz..1 GHz and 1 mohm..1 ohm: log10(1e6) is half way along x (3 of 6 decades),
  // log10(1e-2) is two thirds down from the top (2 of 3 decades below 1 ohm).
  PlotOptions options;
  options.x_min = 1e3;
  options.x_max = 1e9;
  options.y_min = 1e-3;
  options.y_max = 1.0;
  const std::vector<PlotSeries> series{{"line", {1e6, 1e7}, {1e-2, 1e-1}, Style::total}};
  const std::vector<PlotMarker> markers{{1e6, 1e-2, "here", false}};
  const PlotLayout layout = plot_layout(series, markers, options);
  const double cx = layout.left + layout.width / 2.0;
  const double cy = layout.top + layout.height * 2.0 / 3.0;

  // The plot area lies inside the image.
  CHECK(layout.left > 0.0);
  CHECK(layout.top > 0.0);
  CHECK(layout.left + layout.width <= options.width);
  CHECK(layout.top + layout.height <= options.height);
  CHECK_THAT(layout.x_pixel(1e6), Catch::Matchers::WithinAbs(cx, 1e-9));
  CHECK_THAT(layout.y_pixel(1e-2), Catch::Matchers::WithinAbs(cy, 1e-9));

  const auto root = parse_xml(render_svg_loglog(series, markers, options));
  const auto marks = with_class(*root, "circle", "marker");
  REQUIRE(marks.size() == 1);
  CHECK_THAT(attr(marks[0], "cx"), Catch::Matchers::WithinAbs(cx, kPixelTolerance));
  CHECK_THAT(attr(marks[0], "cy"), Catch::Matchers::WithinAbs(cy, kPixelTolerance));

  // The curve's second point, 10 MHz and 100 mohm: 4 of 6 decades along, 1 of 3 down.
  const auto lines = root->all("polyline");
  REQUIRE(lines.size() == 1);
  const auto pts = points_of(lines[0]);
  REQUIRE(pts.size() == 2);
  CHECK_THAT(pts[0].first, Catch::Matchers::WithinAbs(cx, kPixelTolerance));
  CHECK_THAT(pts[0].second, Catch::Matchers::WithinAbs(cy, kPixelTolerance));
  CHECK_THAT(pts[1].first, Catch::Matchers::WithinAbs(layout.left + layout.width * 4.0 / 6.0, kPixelTolerance));
  CHECK_THAT(pts[1].second, Catch::Matchers::WithinAbs(layout.top + layout.height / 3.0, kPixelTolerance));

}

TEST_CASE("curves leaving the axis range are cut where they cross the plot edge", "[report]") {
  // In log-log coordinates the line from (1 kHz, 10 ohm) to (1 GHz, 1 mohm) is straight:
  // log10 y = 1 - 4 (log10 x - 3) / 6. It crosses y = 1 ohm (log10 y = 0) at log10 x = 4.5.
  PlotOptions options;
  options.x_min = 1e3;
  options.x_max = 1e9;
  options.y_min = 1e-3;
  options.y_max = 1.0;
  const std::vector<PlotSeries> series{{"line", {1e3, 1e9}, {10.0, 1e-3}, Style::total}};
  const PlotLayout layout = plot_layout(series, {}, options);
  const auto root = parse_xml(render_svg_loglog(series, {}, options));
  const auto lines = root->all("polyline");
  REQUIRE(lines.size() == 1);
  const auto pts = points_of(lines[0]);
  REQUIRE(pts.size() == 2);
  CHECK_THAT(pts[0].first, Catch::Matchers::WithinAbs(layout.left + layout.width * 1.5 / 6.0, kPixelTolerance));
  CHECK_THAT(pts[0].second, Catch::Matchers::WithinAbs(layout.top, kPixelTolerance));
  CHECK_THAT(pts[1].first, Catch::Matchers::WithinAbs(layout.left + layout.width, kPixelTolerance));
  CHECK_THAT(pts[1].second, Catch::Matchers::WithinAbs(layout.top + layout.height, kPixelTolerance));

  // A curve wholly outside the range draws nothing; one that leaves and comes back is split.
  const std::vector<PlotSeries> away{{"high", {1e3, 1e9}, {10.0, 20.0}, Style::total},
                                     {"dip", {1e3, 1e6, 1e9}, {0.1, 10.0, 0.1}, Style::branch}};
  const auto split = parse_xml(render_svg_loglog(away, {}, options));
  CHECK(split->all("polyline").size() == 2);
  // No ids other than the root's and no references of any kind.
  CHECK(split->all("clipPath").empty());
}

TEST_CASE("non-finite and non-positive values leave gaps, never NaN in the SVG", "[report]") {
  // log10 is undefined for y <= 0 and for NaN; such points split the curve.
  const std::vector<double> f{1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9};
  const std::vector<double> z{0.1, kNaN, 0.01, 0.02, 0.0, -1.0, 0.5};
  const double inf = std::numeric_limits<double>::infinity();
  const std::vector<PlotSeries> series{{"rail", f, z, Style::total},
                                       {"bad x", {kNaN, -1.0, 0.0, inf}, {1.0, 1.0, 1.0, 1.0}, Style::branch}};
  const std::vector<PlotMarker> markers{{kNaN, 0.1, "lost", true}, {1e6, -1.0, "lost", false}};
  const std::string svg = render_svg_loglog(series, markers, {});
  const auto root = parse_xml(svg);
  // Pieces: {1e3} alone (a dot), {1e5, 1e6} (a line), {1e9} alone (a dot).
  CHECK(root->all("polyline").size() == 1);
  std::string lower = svg;
  std::transform(lower.begin(), lower.end(), lower.begin(), [](unsigned char c) { return std::tolower(c); });
  CHECK(lower.find("nan") == std::string::npos);
  CHECK(lower.find("inf") == std::string::npos);
  CHECK(with_class(*root, "circle", "marker").empty());
  CHECK(with_class(*root, "circle", "marker-violation").empty());
}

TEST_CASE("names, labels and titles from input are XML-escaped", "[report]") {
  // XML 1.0 section 2.4: '<' and '&' must be escaped in character data and attributes.
  PlotOptions options;
  options.title = "Rail <b>&</b>";
  options.x_label = "f \"quoted\"";
  const std::vector<PlotSeries> series{{"<script>alert(1)</script> & co", {1e3, 1e6}, {1.0, 0.01}, Style::total},
                                       {"C1 'x' > y", {1e3, 1e6}, {2.0, 0.02}, Style::branch}};
  const std::vector<PlotMarker> markers{{1e5, 0.1, "<peak & more>", true}};
  const std::string svg = render_svg_loglog(series, markers, options);
  CHECK(svg.find("<script") == std::string::npos);
  CHECK(svg.find("<b>") == std::string::npos);
  CHECK(svg.find("&lt;script&gt;alert(1)&lt;/script&gt; &amp; co") != std::string::npos);
  CHECK(svg.find("&lt;peak &amp; more&gt;") != std::string::npos);
  const auto root = parse_xml(svg);
  CHECK(root->all("script").empty());
  CHECK(root->all("title").at(0)->text == "Rail <b>&</b>");
  std::vector<std::string> legend;
  for (const auto* e : with_class(*root, "text", "legend")) legend.push_back(e->text);
  CHECK(legend == std::vector<std::string>{"<script>alert(1)</script> & co", "C1 'x' > y", "peak above target"});
}

TEST_CASE("the same input renders to the same bytes", "[report]") {
  const auto f = log_grid(3, 9, 37);
  std::vector<double> z;
  std::vector<double> t;
  for (const double x : f) {
    z.push_back(std::abs(std::sin(std::log(x))) * 0.05 + 1e-3);
    t.push_back(0.02);
  }
  const std::vector<PlotSeries> series{{"target", f, t, Style::target_mask}, {"rail", f, z, Style::total}};
  const std::vector<PlotMarker> markers{{f[40], z[40], "p", true}};
  PlotOptions options;
  options.title = "repeat";
  const std::string first = render_svg_loglog(series, markers, options);
  CHECK(first == render_svg_loglog(series, markers, options));
  CHECK_NOTHROW(parse_xml(first));
}

TEST_CASE("the target mask shades the region above the target line", "[report]") {
  // A flat target of 10 mohm from 1 kHz to 1 MHz on a 1 mohm..1 ohm axis: the shaded region
  // is the rectangle from the line (log10: one third up from the bottom) to the plot's top
  // edge, between the left edge and the middle (1 MHz is 3 of 6 decades along).
  PlotOptions options;
  options.x_min = 1e3;
  options.x_max = 1e9;
  options.y_min = 1e-3;
  options.y_max = 1.0;
  const std::vector<PlotSeries> series{{"target", {1e3, 1e6}, {1e-2, 1e-2}, Style::target_mask}};
  const PlotLayout layout = plot_layout(series, {}, options);
  const auto root = parse_xml(render_svg_loglog(series, {}, options));
  const auto polygons = root->all("polygon");
  REQUIRE(polygons.size() == 1);
  const double line_y = expected_py(1e-2, 1e-3, 1.0, layout.top, layout.height);
  const double middle = layout.left + layout.width / 2.0;
  std::vector<std::pair<double, double>> expected{
      {layout.left, layout.top}, {layout.left, line_y}, {middle, layout.top}, {middle, line_y}};
  auto pts = points_of(polygons[0]);
  REQUIRE(pts.size() == 4);
  std::sort(pts.begin(), pts.end());
  std::sort(expected.begin(), expected.end());
  for (std::size_t i = 0; i < pts.size(); ++i) {
    CHECK_THAT(pts[i].first, Catch::Matchers::WithinAbs(expected[i].first, kPixelTolerance));
    CHECK_THAT(pts[i].second, Catch::Matchers::WithinAbs(expected[i].second, kPixelTolerance));
  }
  const double opacity = std::stod(polygons[0]->attribute("fill-opacity"));
  CHECK(opacity > 0.0);
  CHECK(opacity < 0.5);
  // The dashed target line is drawn too.
  REQUIRE(root->all("polyline").size() == 1);
  CHECK_FALSE(root->all("polyline")[0]->attribute("stroke-dasharray").empty());
}

TEST_CASE("automatic y range covers total, target and markers in whole decades, not branches", "[report]") {
  // Main data from 3 mohm to 0.2 ohm: floor(log10 3e-3) = -3, ceil(log10 0.2) = 0.
  const std::vector<double> f{1e3, 1e6, 1e8};
  const std::vector<PlotSeries> series{{"rail", f, {0.2, 0.003, 0.05}, Style::total},
                                       {"target", f, {0.01, 0.01, 0.01}, Style::target_mask},
                                       {"small cap alone", f, {1000.0, 0.01, 0.5}, Style::branch}};
  const PlotLayout layout = plot_layout(series, {{1e7, 0.15, "", false}}, {});
  CHECK_THAT(layout.y_min, Catch::Matchers::WithinRel(1e-3, 1e-12));
  CHECK_THAT(layout.y_max, Catch::Matchers::WithinRel(1.0, 1e-12));
  CHECK(layout.x_min == 1e3);
  CHECK(layout.x_max == 1e8);
}

TEST_CASE("violations are drawn apart from ordinary peaks and the legend names them", "[report]") {
  const std::vector<PlotMarker> markers{{1e5, 0.05, "ok", false}, {1e7, 0.2, "over", true}};
  const auto root = parse_xml(render_svg_loglog({{"rail", {1e3, 1e9}, {0.01, 1.0}, Style::total}}, markers, {}));
  const auto ok = with_class(*root, "circle", "marker");
  const auto bad = with_class(*root, "circle", "marker-violation");
  REQUIRE(ok.size() == 1);
  REQUIRE(bad.size() == 1);
  CHECK(bad[0]->attribute("fill") != ok[0]->attribute("fill"));
  CHECK(bad[0]->attribute("fill") != ok[0]->attribute("stroke"));
  std::vector<std::string> legend;
  for (const auto* e : with_class(*root, "text", "legend")) legend.push_back(e->text);
  CHECK(legend == std::vector<std::string>{"rail", "peak", "peak above target"});
}

TEST_CASE("many branch curves fold the legend into a '+N more' note", "[report]") {
  std::vector<PlotSeries> series;
  for (int i = 0; i < 80; ++i)
    series.push_back({"branch number " + std::to_string(i), {1e3, 1e9}, {1.0, 0.01}, Style::branch});
  const auto root = parse_xml(render_svg_loglog(series, {}, {}));
  const auto legend = with_class(*root, "text", "legend");
  REQUIRE(!legend.empty());
  CHECK(legend.size() < 80);
  const std::string& last = legend.back()->text;
  REQUIRE(last.starts_with("+"));
  // Shown entries plus the number left out account for every branch.
  const int left_out = std::stoi(last.substr(1));
  CHECK(static_cast<std::size_t>(left_out) + legend.size() - 1 == 80);
  // Every curve is still drawn.
  CHECK(root->all("polyline").size() == 80);
}

TEST_CASE("an empty plot still renders axes from 1 to 10", "[report]") {
  const PlotLayout layout = plot_layout({}, {}, {});
  CHECK(layout.x_min == 1.0);
  CHECK(layout.x_max == 10.0);
  CHECK(layout.y_min == 1.0);
  CHECK(layout.y_max == 10.0);
  const auto root = parse_xml(render_svg_loglog({}, {}, {}));
  CHECK(with_class(*root, "line", "grid-major-x").size() == 2);
}

TEST_CASE("bad plot options are input errors naming the field", "[report]") {
  auto message_of = [](const PlotOptions& options) {
    try {
      options.validate();
    } catch (const InputError& e) {
      return std::string(e.what());
    }
    return std::string("no error");
  };
  PlotOptions narrow;
  narrow.width = 10;
  CHECK_THAT(message_of(narrow), Catch::Matchers::Contains("width"));
  PlotOptions reversed;
  reversed.y_min = 1.0;
  reversed.y_max = 0.1;
  CHECK_THAT(message_of(reversed), Catch::Matchers::Contains("y_min"));
  PlotOptions negative;
  negative.x_min = -5.0;
  CHECK_THAT(message_of(negative), Catch::Matchers::Contains("x_min"));
  PlotOptions bad_id;
  bad_id.id = "1 \"x\"";
  CHECK_THAT(message_of(bad_id), Catch::Matchers::Contains("id"));
  CHECK_THROWS_AS(render_svg_loglog({}, {}, narrow), InputError);
  CHECK(message_of(PlotOptions{}) == "no error");
}
