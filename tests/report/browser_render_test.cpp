// SPDX-License-Identifier: MIT
// A real browser renders an HTML report with a plot: headless Chromium takes a screenshot and
// dumps the DOM; the test decodes the PNG and finds the plot, its curve and its markers. The
// second case does the same for the page `quietrail plan` writes, with its front plot.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "quietrail/report/html_report.hpp"
#include "quietrail/report/svg_plot.hpp"
#include "support/cli_runner.hpp"
#include "support/ngspice.hpp"  // find_on_path
#include "support/png_reader.hpp"
#include "support/temp_dir.hpp"
#include "support/xml_check.hpp"

using quietrail::HtmlReport;
using quietrail::PlotLayout;
using quietrail::PlotMarker;
using quietrail::PlotOptions;
using quietrail::PlotSeries;
using quietrail::test::png_size;
using quietrail::test::read_png;
using quietrail::test::RgbImage;
using quietrail::test::TempDir;

namespace {

constexpr const char* kChromiumMissing =
    "chromium not found on PATH: run scripts/install-deps.sh (installs the Debian package chromium)";
constexpr int kWindowWidth = 1200;
constexpr int kWindowHeight = 1600;
constexpr double kPi = 3.14159265358979323846;

// Colours the plot draws with (src/report/svg_plot.cpp): the plot area's fill, the total
// curve and a violation marker. Used to find them in the screenshot.
constexpr std::uint32_t kPlotFill = 0xFCFBF8;
constexpr std::uint32_t kTotalCurve = 0x1D3A5F;
constexpr std::uint32_t kViolation = 0xB3202F;

// The sample: one capacitor as a series RLC, |Z| = sqrt(R^2 + (wL - 1/(wC))^2), whose minimum
// is R at the self-resonant frequency 1 / (2 pi sqrt(L C)) (any circuits text, e.g.
// Nilsson & Riedel, "Electric Circuits", series resonance).
constexpr double kC = 10e-6;
constexpr double kEsr = 5e-3;
constexpr double kEsl = 1e-9;

double series_rlc(double f) {
  const double w = 2.0 * kPi * f;
  const double x = w * kEsl - 1.0 / (w * kC);
  return std::sqrt(kEsr * kEsr + x * x);
}

struct Sample {
  std::string html;
  PlotLayout layout;
  double srf = 0.0;
};

Sample sample_report() {
  std::vector<double> f;
  std::vector<double> z;
  std::vector<double> target;
  for (int i = 0; i <= 240; ++i) {
    f.push_back(std::pow(10.0, 3.0 + i / 40.0));
    z.push_back(series_rlc(f.back()));
    target.push_back(f.back() <= 1e8 ? 0.02 : std::nan(""));  // band of interest up to 100 MHz
  }
  Sample s;
  s.srf = 1.0 / (2.0 * kPi * std::sqrt(kEsl * kC));
  const std::vector<PlotSeries> series{{"target 20 mohm", f, target, PlotSeries::Style::target_mask},
                                       {"C1 10 uF alone", f, z, PlotSeries::Style::branch},
                                       {"rail", f, z, PlotSeries::Style::total}};
  const std::vector<PlotMarker> markers{{s.srf, kEsr, "SRF", false}, {1e8, series_rlc(1e8), "band edge", true}};
  PlotOptions options;
  options.title = "Series RLC, 10 uF / 5 mohm / 1 nH";
  s.layout = quietrail::plot_layout(series, markers, options);

  HtmlReport report("Browser render check <sample>");
  report.add_verdict(false, "Target exceeded at both ends of the band");
  report.add_key_values({{"Capacitance", "10 uF"}, {"ESR", "5 m\xCE\xA9"}, {"ESL", "1 nH"}});
  report.add_heading("Impedance");
  report.add_svg(quietrail::render_svg_loglog(series, markers, options), "Shaded: above the target.");
  report.add_table({"Part", "Count"}, {{"C1", "1"}}, {}, {HtmlReport::Align::left, HtmlReport::Align::right});
  report.add_caution("Planning estimate: confirm on hardware.");
  s.html = report.render();
  return s;
}

// Runs chromium headless on `page` with a fresh profile; `action` is --screenshot=... or
// --dump-dom. Output and errors go to `log`. Returns the exit status.
int run_chromium(const std::filesystem::path& chromium, const TempDir& dir, const std::string& profile,
                 const std::string& action, const std::filesystem::path& page, const std::filesystem::path& log,
                 int window_height = kWindowHeight) {
  // Single quotes cover the temp paths (no quotes in them). --no-sandbox: needed when run as
  // root (CI containers); the page is our own file. The networking switches keep a test run
  // from reaching out anywhere.
  const std::string command =
      "timeout 60 '" + chromium.string() + "' --headless --no-sandbox --disable-gpu --disable-background-networking "
      "--disable-component-update --disable-sync --no-first-run --hide-scrollbars --force-device-scale-factor=1 "
      "--user-data-dir='" + (dir / profile).string() + "' --window-size=" + std::to_string(kWindowWidth) + "," +
      std::to_string(window_height) + " " + action + " 'file://" + page.string() + "' > '" + log.string() +
      "' 2>&1";
  return std::system(command.c_str());
}

struct Box {
  int left = 1 << 30;
  int top = 1 << 30;
  int right = -1;
  int bottom = -1;
  int width() const { return right - left + 1; }
  int height() const { return bottom - top + 1; }
};

}  // namespace

TEST_CASE("the test PNG reader's checksums and inflate match independent references", "[report]") {
  using quietrail::test::png_detail::crc32;
  using quietrail::test::png_detail::zlib_inflate;
  // CRC-32 check value of "123456789" is 0xCBF43926 (catalogue of CRC algorithms, CRC-32/ISO-HDLC).
  CHECK(crc32("123456789") == 0xCBF43926U);
  auto text = [](const std::vector<std::uint8_t>& v) { return std::string(v.begin(), v.end()); };
  // Streams made by Python's zlib.compress (an independent implementation): a stored block
  // (level 0), a fixed-Huffman block, and a dynamic-Huffman block.
  const std::string stored("\x78\x01\x01\x09\x00\xf6\xff\x71\x75\x69\x65\x74\x72\x61\x69\x6c\x13\x54\x03\xd1", 20);
  CHECK(text(zlib_inflate(stored)) == "quietrail");
  const std::string fixed("\x78\xda\xcb\x48\xcd\xc9\xc9\x57\xc8\x40\x27\x01\x68\x03\x08\xb1", 16);
  CHECK(text(zlib_inflate(fixed)) == "hello hello hello hello");
  const std::string dynamic(
      "\x78\xda\x85\xd2\x41\x0a\x02\x31\x0c\x46\xe1\xab\xf4\x08\x6d\x93\x26\x2d\x5e\xc0\x8d\x87\x18\x66\x44\x06\xc4"
      "\x19\x44\x37\x9e\x5e\x2b\x2e\xa5\x6f\x93\xd5\x83\xf0\xc1\xbf\x9c\xe7\xed\xb9\x5f\xd7\xdb\x25\xcc\xd3\x3e\xcd"
      "\xeb\x63\xbb\x87\x18\xa6\xc7\xe7\x9c\x8e\xaf\x43\x58\xfe\x05\xa9\x07\xe2\x83\x22\xf7\xc2\x75\x50\x48\x2f\xd2"
      "\xe8\x8b\xf6\x42\x47\x5f\x4a\x2f\xea\xe8\x8b\xf5\x22\x8f\xbe\x7c\xb1\xc5\x49\xdb\x94\xb4\x12\x49\x6b\x4e\x5a"
      "\x21\xac\x46\xc2\xba\x13\x36\x09\x61\x4b\x24\x6c\x75\xc2\x66\x21\xac\x45\xd2\x36\x27\xad\x08\x69\x1d\x87\x6c"
      "\x84\x55\x21\x6c\xc5\x1d\x27\x23\x6c\x11\xc2\x36\xdc\x71\x36\xc4\x0a\x69\x53\xc4\x21\x8b\x11\xd7\x71\xc9\x8d"
      "\xb4\x6a\xa4\xad\x38\xe4\xd4\x48\x5b\x8c\xb0\x0d\x87\x9c\x7f\x5f\xde\xa9\xaa\xc5\x94",
      183);
  std::string expected;
  for (int i = 0; i < 40; ++i)
    expected += "decoupling capacitor " + std::to_string(i % 7) + " at " + std::to_string((i * 37) % 101) + " MHz; ";
  CHECK(text(zlib_inflate(dynamic)) == expected);
  // A damaged stream fails its Adler-32 check (RFC 1950 section 2.2).
  std::string damaged = fixed;
  damaged[damaged.size() - 1] = '\x00';
  CHECK_THROWS(zlib_inflate(damaged));
}

TEST_CASE("headless chromium renders the report with the plot in it", "[report][browser]") {
  const auto chromium = quietrail::test::find_on_path("chromium");
  if (!chromium) FAIL(kChromiumMissing);

  TempDir dir("browser");
  const Sample sample = sample_report();
  const auto page = dir / "report.html";
  quietrail::test::write_text(page, sample.html);

  // ---- the DOM: the SVG element and its parts were parsed as SVG, the text as text.
  const auto dom_file = dir / "dom.html";
  REQUIRE(run_chromium(*chromium, dir, "profile-dom", "--dump-dom", page, dom_file) == 0);
  const std::string dom = quietrail::test::read_text(dom_file);
  INFO(dom.substr(0, 2000));
  CHECK(dom.find("<svg xmlns=\"http://www.w3.org/2000/svg\"") != std::string::npos);
  CHECK(dom.find("<polyline") != std::string::npos);
  CHECK(dom.find("<polygon") != std::string::npos);
  CHECK(dom.find("viewBox=") != std::string::npos);  // camel case kept: parsed in the SVG namespace
  CHECK(dom.find("Browser render check &lt;sample&gt;") != std::string::npos);
  CHECK(dom.find("<sample>") == std::string::npos);

  // ---- the screenshot
  const auto png_file = dir / "report.png";
  const auto log = dir / "screenshot.log";
  const int status = run_chromium(*chromium, dir, "profile-shot", "--screenshot='" + png_file.string() + "'", page, log);
  INFO(quietrail::test::read_text(log));
  REQUIRE(status == 0);
  const std::string png = quietrail::test::read_text(png_file);
  // PNG signature and IHDR (PNG spec, W3C 2003, sections 5.2 and 11.2.2): the window size.
  const auto [width, height] = png_size(png);
  CHECK(width == kWindowWidth);
  CHECK(height == kWindowHeight);
  const RgbImage image = read_png(png);

  // The plot area: the bounding box of its fill colour, which nothing else on the page uses.
  Box area;
  long fill_pixels = 0;
  for (int y = 0; y < image.height; ++y)
    for (int x = 0; x < image.width; ++x)
      if (image.at(x, y) == kPlotFill) {
        ++fill_pixels;
        area = {std::min(area.left, x), std::min(area.top, y), std::max(area.right, x), std::max(area.bottom, y)};
      }
  REQUIRE(fill_pixels > 0);
  // The SVG scales to the page's column; its plot area keeps the designed proportions.
  const double scale = static_cast<double>(area.width()) / sample.layout.width;
  INFO("plot area " << area.left << "," << area.top << " " << area.width() << "x" << area.height() << ", scale "
                    << scale);
  CHECK(scale > 0.5);
  CHECK(scale < 1.5);
  CHECK_THAT(static_cast<double>(area.height()) / sample.layout.height, Catch::Matchers::WithinRel(scale, 0.02));
  // The mask shades everything above 20 mohm up to 100 MHz, so at most the unshaded share
  // of the area can show the bare fill; grid lines, curves and labels take some of that.
  const PlotLayout& layout = sample.layout;
  const double masked_width = (layout.x_pixel(1e8) - layout.left) / layout.width;
  const double below_target = (layout.top + layout.height - layout.y_pixel(0.02)) / layout.height;
  const double unshaded = masked_width * below_target + (1.0 - masked_width);
  const double fill_share = static_cast<double>(fill_pixels) / (static_cast<double>(area.width()) * area.height());
  INFO("unshaded share " << unshaded << ", bare fill share " << fill_share);
  CHECK(fill_share < unshaded);
  CHECK(fill_share > 0.5 * unshaded);

  // The total curve: many pixels of its colour inside the area, lowest at the SRF.
  long curve_pixels = 0;
  long violation_pixels = 0;
  int lowest_y = -1;
  int lowest_x = -1;
  for (int y = area.top; y <= area.bottom; ++y)
    for (int x = area.left; x <= area.right; ++x) {
      const std::uint32_t c = image.at(x, y);
      if (c == kViolation) ++violation_pixels;
      if (c != kTotalCurve) continue;
      ++curve_pixels;
      if (y > lowest_y) {
        lowest_y = y;
        lowest_x = x;
      }
    }
  // The curve crosses the whole width at about 2.6 px: far more than 500 full-colour pixels.
  CHECK(curve_pixels > 500);
  // A violation marker of radius 4.5 px: about 60 px of its colour.
  CHECK(violation_pixels > 20);
  // |Z| is smallest at the SRF (closed form above), so the curve's lowest point sits at its
  // column: plot-area offset (layout.x_pixel - layout.left) times the scale.
  const double srf_column = area.left + (layout.x_pixel(sample.srf) - layout.left) * scale;
  INFO("lowest curve pixel at column " << lowest_x << ", SRF column " << srf_column);
  CHECK_THAT(static_cast<double>(lowest_x), Catch::Matchers::WithinAbs(srf_column, 4.0));
}

namespace {

// ---- the plan report (quietrail plan): its cost-against-margin plot

const std::filesystem::path kCli = QUIETRAIL_CLI_PATH;
const std::filesystem::path kSourceDir = QUIETRAIL_SOURCE_DIR;
// Tall enough for everything above the front plot and the plot itself on the example's page
// (it sits at about 1300..2000 px in a 1200 px wide window).
constexpr int kPlanWindowHeight = 2400;
// The mask's colour over the plot fill: kMaskFill #d98a5f at fill-opacity 0.14 over #fcfbf8
// (src/report/svg_plot.cpp), composited "source over", c = a*over + (1 - a)*under (Porter &
// Duff, "Compositing digital images", SIGGRAPH 1984). Browsers round the result, so a channel
// may differ by one or two.
constexpr std::uint32_t kMaskColour = 0xD98A5F;
constexpr double kMaskOpacity = 0.14;
constexpr int kBlendTolerance = 2;
// Rows without plot colours between two plots: far more than any grid line or curve covers.
constexpr int kPlotGapRows = 40;

int channel(std::uint32_t c, int shift) { return static_cast<int>((c >> shift) & 0xFFU); }

bool near_blend(std::uint32_t c, std::uint32_t over, std::uint32_t under, double alpha) {
  for (const int shift : {16, 8, 0}) {
    const double expected = alpha * channel(over, shift) + (1.0 - alpha) * channel(under, shift);
    if (std::abs(channel(c, shift) - expected) > kBlendTolerance) return false;
  }
  return true;
}

// One axis of the front SVG as its labels state it: label values (parsed as plain numbers)
// at their pixel positions; value_at maps a value to a pixel by log interpolation between the
// outermost labels (the log axis: pixel linear in log10 of the value).
struct LabelledAxis {
  std::vector<std::pair<double, double>> ticks;  // (value, pixel), ascending by value
  double pixel_of(double v) const {
    const auto& [a, pa] = ticks.front();
    const auto& [b, pb] = ticks.back();
    return pa + (pb - pa) * (std::log10(v) - std::log10(a)) / (std::log10(b) - std::log10(a));
  }
};

// The whole text as a number, or NaN when it is not one (e.g. "500 m").
double plain_number(const std::string& text) {
  std::size_t used = 0;
  try {
    const double v = std::stod(text, &used);
    return used == text.size() ? v : std::nan("");
  } catch (const std::exception&) {
    return std::nan("");
  }
}

}  // namespace

TEST_CASE("headless chromium renders the plan report with its front plot where the labels put it",
          "[report][browser][plan]") {
  const auto chromium = quietrail::test::find_on_path("chromium");
  if (!chromium) FAIL(kChromiumMissing);
  namespace fs = std::filesystem;
  using Json = nlohmann::json;

  // ---- the example rail, renamed to need escaping, its libraries found from the temp dir.
  TempDir dir("browser-plan");
  Json project = Json::parse(quietrail::test::read_text(kSourceDir / "examples/projects/decade_rail_plan.json"));
  project["name"] = "decade <rail> & plan";
  project["libraries"] = Json::array({(kSourceDir / "part_libraries/mlcc.json").string(),
                                      (kSourceDir / "part_libraries/bulk.json").string()});
  quietrail::test::write_text(dir / "rail.json", project.dump(2));
  const auto run = quietrail::test::run_cli(kCli, dir.path(), {"plan", (dir / "rail.json").string(), "--out",
                                                               (dir / "out").string()});
  INFO(run.out << run.err);
  REQUIRE(run.exit_code == 0);
  auto output = [&](const std::string& suffix) {
    for (const auto& name : quietrail::test::list_names(dir / "out"))
      if (name.ends_with(suffix)) return dir / "out" / name;
    FAIL("no output file ending in " << suffix);
    return fs::path();
  };
  const fs::path page = output("_report.html");
  const Json plan = Json::parse(quietrail::test::read_text(output("_plan.json")));
  REQUIRE(plan["objective"] == "cost");  // the plot's x is then the relative cost itself

  // ---- the front SVG's plot area and its axes as the tick labels state them.
  const auto svg = quietrail::test::parse_xml(quietrail::test::read_text(output("_front.svg")));
  const quietrail::test::XmlElement* area_rect = nullptr;
  for (const auto* e : svg->all("rect"))
    if (e->attribute("fill") == "#fcfbf8" && area_rect == nullptr) area_rect = e;
  REQUIRE(area_rect != nullptr);
  const double rect_x = std::stod(area_rect->attribute("x"));
  const double rect_y = std::stod(area_rect->attribute("y"));
  const double rect_w = std::stod(area_rect->attribute("width"));
  const double rect_h = std::stod(area_rect->attribute("height"));
  std::vector<double> grid_rows;
  for (const auto* e : svg->all("line"))
    if (e->attribute("class") == "grid-major-y" || e->attribute("class") == "grid-minor-y")
      grid_rows.push_back(std::stod(e->attribute("y1")));
  LabelledAxis x_axis;
  LabelledAxis y_axis;
  for (const auto* e : svg->all("text")) {
    const bool is_x = e->attribute("class") == "tick-x";
    if (!is_x && e->attribute("class") != "tick-y") continue;
    // A ratio and a relative cost have no unit: every label is a plain number ("0.5", not "500 m").
    const double value = plain_number(e->text);
    INFO("tick label '" << e->text << "'");
    REQUIRE(std::isfinite(value));
    if (is_x) {
      x_axis.ticks.emplace_back(value, std::stod(e->attribute("x")));  // text-anchor middle: the column
      continue;
    }
    // A y label sits beside its grid line: the nearest one, a few pixels above its baseline.
    const double baseline = std::stod(e->attribute("y"));
    REQUIRE(!grid_rows.empty());
    const double row = *std::min_element(grid_rows.begin(), grid_rows.end(), [&](double a, double b) {
      return std::abs(a - baseline) < std::abs(b - baseline);
    });
    CHECK(std::abs(row - baseline) < 6.0);
    y_axis.ticks.emplace_back(value, row);
  }
  std::sort(x_axis.ticks.begin(), x_axis.ticks.end());
  std::sort(y_axis.ticks.begin(), y_axis.ticks.end());
  REQUIRE(x_axis.ticks.size() >= 2);
  REQUIRE(y_axis.ticks.size() >= 2);

  // ---- the DOM: both plots parsed as SVG, the project's name escaped as text.
  const auto dom_file = dir / "dom.html";
  REQUIRE(run_chromium(*chromium, dir, "profile-dom", "--dump-dom", page, dom_file, kPlanWindowHeight) == 0);
  const std::string dom = quietrail::test::read_text(dom_file);
  CHECK(dom.find("id=\"plan-front\"") != std::string::npos);
  CHECK(dom.find("id=\"check-plot\"") != std::string::npos);
  CHECK(dom.find("viewBox=") != std::string::npos);  // camel case kept: parsed in the SVG namespace
  CHECK(dom.find("Plan of decade &lt;rail&gt; &amp; plan") != std::string::npos);
  CHECK(dom.find("<rail>") == std::string::npos);
  CHECK(dom.find("<script") == std::string::npos);

  // ---- the screenshot
  const auto png_file = dir / "plan.png";
  const auto log = dir / "screenshot.log";
  const int status =
      run_chromium(*chromium, dir, "profile-shot", "--screenshot='" + png_file.string() + "'", page, log,
                   kPlanWindowHeight);
  INFO(quietrail::test::read_text(log));
  REQUIRE(status == 0);
  const std::string png = quietrail::test::read_text(png_file);
  const auto [width, height] = png_size(png);  // PNG spec, W3C 2003, section 11.2.2
  CHECK(width == kWindowWidth);
  CHECK(height == kPlanWindowHeight);
  const RgbImage image = read_png(png);

  // The front plot is the page's first plot: the first band of rows holding the plot fill or
  // the mask over it (the mask spans the whole width above ratio 1, so the fill alone would
  // miss the area's top), ended by a long run of rows without either.
  auto plot_colour = [](std::uint32_t c) {
    return c == kPlotFill || near_blend(c, kMaskColour, kPlotFill, kMaskOpacity);
  };
  Box area;
  int gap = 0;
  for (int y = 0; y < image.height && gap <= kPlotGapRows; ++y) {
    bool any = false;
    for (int x = 0; x < image.width; ++x)
      if (plot_colour(image.at(x, y))) {
        any = true;
        area = {std::min(area.left, x), std::min(area.top, y), std::max(area.right, x), std::max(area.bottom, y)};
      }
    gap = any ? 0 : (area.bottom >= 0 ? gap + 1 : 0);
  }
  REQUIRE(area.bottom >= 0);
  INFO("front plot area " << area.left << "," << area.top << " " << area.width() << "x" << area.height());
  REQUIRE(area.bottom < image.height - 1);  // the whole plot is inside the window
  const double scale = static_cast<double>(area.width()) / rect_w;
  CHECK(scale > 0.5);
  CHECK(scale < 1.5);
  CHECK_THAT(static_cast<double>(area.height()) / rect_h, Catch::Matchers::WithinRel(scale, 0.02));

  // The mask shades everything above ratio 1 across the whole width: the bare fill can only
  // show below that line, the mask only above it (less what grid, curve and labels cover).
  const double below_target = (rect_y + rect_h - y_axis.pixel_of(1.0)) / rect_h;
  long fill_pixels = 0;
  long mask_pixels = 0;
  for (int y = area.top; y <= area.bottom; ++y)
    for (int x = area.left; x <= area.right; ++x) {
      const std::uint32_t c = image.at(x, y);
      if (c == kPlotFill) ++fill_pixels;
      else if (plot_colour(c)) ++mask_pixels;
    }
  const double pixels = static_cast<double>(area.width()) * area.height();
  INFO("share below the target " << below_target << ", fill " << fill_pixels / pixels << ", mask "
                                 << mask_pixels / pixels);
  CHECK(fill_pixels / pixels < below_target);
  CHECK(fill_pixels / pixels > 0.5 * below_target);
  CHECK(mask_pixels / pixels < 1.0 - below_target);
  CHECK(mask_pixels / pixels > 0.5 * (1.0 - below_target));

  // Each front point of the plan JSON (cost, worst ratio), mapped through the labels' own
  // axes, lands on a marker: its white fill at the spot, the total curve's colour next to it.
  int points = 0;
  for (const auto& point : plan["front"]) {
    if (!point["found"].get<bool>()) continue;
    const double cost = point["objective"].get<double>();
    const double ratio = point["worst_ratio"].get<double>();
    if (!(cost > 0.0) || !(ratio > 0.0)) continue;  // no place on a log axis
    ++points;
    const double column = area.left + (x_axis.pixel_of(cost) - rect_x) * scale;
    const double row = area.top + (y_axis.pixel_of(ratio) - rect_y) * scale;
    INFO("front point cost " << cost << ", ratio " << ratio << " expected at " << column << "," << row);
    bool white = false;
    long ink = 0;
    constexpr int kSearch = 7;  // px: the marker's radius (4.5) and the curve beside it
    for (int dy = -kSearch; dy <= kSearch; ++dy)
      for (int dx = -kSearch; dx <= kSearch; ++dx) {
        const int x = static_cast<int>(std::lround(column)) + dx;
        const int y = static_cast<int>(std::lround(row)) + dy;
        if (x < 0 || y < 0 || x >= image.width || y >= image.height) continue;
        if (std::abs(dx) <= 1 && std::abs(dy) <= 1 && image.at(x, y) == 0xFFFFFF) white = true;
        if (image.at(x, y) == kTotalCurve) ++ink;
      }
    CHECK(white);
    CHECK(ink >= 3);
  }
  CHECK(points >= 2);
}
