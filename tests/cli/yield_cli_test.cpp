// SPDX-License-Identifier: MIT
// End-to-end `quietrail yield`: the core-rail example (exit 0, every file, the summary
// agrees with the library run on one thread for the same seed), the plot and page (well
// formed, the percentile curves ordered as order statistics must be), bad trial counts
// (exit 2, the field and the cap named, nothing written) and a failed write (no file left).
#include <catch2/catch.hpp>

#include <algorithm>
#include <filesystem>
#include <map>
#include <sstream>
#include <string>
#include <utility>
#include <variant>
#include <vector>

#include <fmt/core.h>
#include <nlohmann/json.hpp>

#include "quietrail/analysis/yield.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/io/project_file.hpp"
#include "support/cli_runner.hpp"
#include "support/temp_dir.hpp"
#include "support/xml_check.hpp"

namespace fs = std::filesystem;
using Catch::Matchers::Contains;
using quietrail::test::read_text;
using quietrail::test::points_of;
using quietrail::test::TempDir;
using quietrail::test::XmlElement;

namespace {

const fs::path kSourceDir = QUIETRAIL_SOURCE_DIR;
const fs::path kCli = QUIETRAIL_CLI_PATH;
const fs::path kCoreRail = kSourceDir / "examples" / "projects" / "core_rail.json";

std::size_t count_lines(const std::string& text) {
  std::size_t lines = 0;
  for (const char c : text) lines += c == '\n' ? 1 : 0;
  return lines;
}


// The stroke colour of each legend entry, by its text: the legend draws each series'
// swatch (a <line>) right before its <text class="legend"> (report/svg_plot.cpp).
std::map<std::string, std::string> legend_colours(const XmlElement& root) {
  std::map<std::string, std::string> out;
  const XmlElement* previous = nullptr;
  for (const auto& child : root.children) {
    if (child->name == "text" && child->attribute("class") == "legend" && previous && previous->name == "line")
      out[child->text] = previous->attribute("stroke");
    previous = child.get();
  }
  return out;
}

// The polylines drawn in `colour`.
std::vector<const XmlElement*> polylines_in(const XmlElement& root, const std::string& colour) {
  std::vector<const XmlElement*> out;
  for (const auto* e : root.all("polyline"))
    if (e->attribute("stroke") == colour) out.push_back(e);
  return out;
}

}  // namespace

TEST_CASE("yield on the core-rail example writes its summary and curves", "[cli][yield]") {
  const TempDir dir("yield-cli");
  const auto run = quietrail::test::run_cli(
      kCli, dir.path(), {"yield", kCoreRail.string(), "--trials", "300", "--seed", "4", "--out", (dir / "out").string()});
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  CHECK_THAT(run.out, Contains("yield "));
  const auto summary = nlohmann::json::parse(read_text(dir / "out" / "core_rail_yield.json"));
  const std::size_t passes = summary.at("passes").get<std::size_t>();
  CHECK(summary.at("trials").get<std::size_t>() == 300);
  CHECK(summary.at("yield").get<double>() == static_cast<double>(passes) / 300.0);
  // The CLI's threads (all cores) and the library on one thread give the same builds
  // (determinism by seed, analysis/yield.hpp).
  const quietrail::Project project = quietrail::read_project_file(kCoreRail);
  const auto library = quietrail::run_yield(quietrail::yield_problem(project),
                                            {.trials = 300, .seed = 4, .threads = 1, .refine_worst = false});
  CHECK(library.passes == passes);
  CHECK(summary.at("worst").at("draw").at("trial").get<std::size_t>() == library.worst_trial);

  // The worst trial saved as a project: `check`'s reader gives the drawn capacitances and
  // the refined worst ratio the yield run reported for that trial.
  const quietrail::Project worst = quietrail::read_project_file(dir / "out" / "core_rail_yield_worst.json");
  const quietrail::CheckResult recheck =
      quietrail::run_check(worst.network, worst.port, *worst.target, worst.check_options());
  CHECK_THAT(recheck.worst_ratio,
             Catch::Matchers::WithinRel(summary.at("worst").at("check").at("worst_ratio").get<double>(), 1e-12));
  for (const auto& part : summary.at("worst").at("draw").at("parts")) {
    const auto branch = worst.network.find_branch(part.at("branch").get<std::string>());
    REQUIRE(branch);
    const auto& c = std::get<quietrail::Capacitor>(worst.network.branches()[static_cast<std::size_t>(*branch)].part.element);
    CHECK(c.capacitance == part.at("capacitance").get<double>());
  }

  // One CSV row per grid point of the project's band, after the header.
  const std::string csv = read_text(dir / "out" / "core_rail_yield_curves.csv");
  CHECK_THAT(csv, Contains("p5_ohm,p50_ohm,p95_ohm"));
  CHECK(count_lines(csv) == quietrail::FrequencyGrid(project.band).size() + 1);
}

TEST_CASE("the worst trial of a BOM from CSV and of a supply-side part is saved as a project check re-runs",
          "[cli][yield]") {
  // memory_rail's BOM comes from a CSV file; analog_rail has parts on the supply side of its
  // bead. The saved project must hold every line itself and reproduce the worst trial.
  for (const char* name : {"memory_rail", "analog_rail"}) {
    CAPTURE(name);
    const TempDir dir("yield-csv");
    const fs::path project_file = kCoreRail.parent_path() / (std::string(name) + ".json");
    const auto run = quietrail::test::run_cli(
        kCli, dir.path(), {"yield", project_file.string(), "--trials", "200", "--out", (dir / "out").string()});
    INFO(run.out << run.err);
    REQUIRE(run.exit_code == 0);
    CHECK_THAT(run.out, !Contains("not saved"));
    const auto summary = nlohmann::json::parse(read_text(dir / "out" / (std::string(name) + "_yield.json")));
    const quietrail::Project worst =
        quietrail::read_project_file(dir / "out" / (std::string(name) + "_yield_worst.json"));
    CHECK(worst.bom_csv.empty());
    // Same network, same refined check: the ratio the yield run reported (consistency).
    const quietrail::CheckResult recheck =
        quietrail::run_check(worst.network, worst.port, *worst.target, worst.check_options());
    CHECK_THAT(recheck.worst_ratio,
               Catch::Matchers::WithinRel(summary.at("worst").at("check").at("worst_ratio").get<double>(), 1e-12));
  }
}

TEST_CASE("yield rejects a zero or absurd trial count with exit 2 and writes nothing", "[cli][yield]") {
  const std::string count = GENERATE(std::string("0"), std::string("5000000"));
  const TempDir dir("yield-cli-bad");
  const fs::path out = dir / "out";
  const auto run =
      quietrail::test::run_cli(kCli, dir.path(), {"yield", kCoreRail.string(), "--trials", count, "--out", out.string()});
  CHECK(run.exit_code == 2);
  CHECK_THAT(run.err, Contains("trials"));
  CHECK_THAT(run.err, Contains("1000000"));  // the cap is named
  CHECK_FALSE(fs::exists(out));
}

TEST_CASE("yield writes a percentile plot and a page that agree with the summary", "[cli][yield]") {
  const TempDir dir("yield-cli-report");
  const fs::path out = dir / "out";
  const auto run = quietrail::test::run_cli(
      kCli, dir.path(), {"yield", kCoreRail.string(), "--trials", "200", "--seed", "9", "--out", out.string()});
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  const fs::path svg_path = out / "core_rail_yield.svg";
  const fs::path html_path = out / "core_rail_yield.html";
  REQUIRE(fs::exists(svg_path));
  REQUIRE(fs::exists(html_path));
  CHECK_THAT(run.out, Contains(svg_path.string()));  // listed in the summary
  CHECK_THAT(run.out, Contains(html_path.string()));
  const auto summary = nlohmann::json::parse(read_text(out / "core_rail_yield.json"));

  // The SVG is well-formed XML (XML 1.0 rules, tests/support/xml_check.hpp) and names the
  // target and the three default percentiles (YieldOptions::percentiles 5, 50, 95 %).
  const std::string svg = read_text(svg_path);
  const auto root = quietrail::test::parse_xml(svg);
  const auto colours = legend_colours(*root);
  for (const char* name : {"target", "5th percentile", "50th percentile", "95th percentile"}) {
    INFO(name);
    CHECK(colours.count(name) == 1);
  }
  REQUIRE(colours.count("5th percentile") == 1);
  REQUIRE(colours.count("50th percentile") == 1);
  REQUIRE(colours.count("95th percentile") == 1);
  // Three distinct colours, so each curve below is found by its own legend swatch.
  REQUIRE(colours.at("5th percentile") != colours.at("50th percentile"));
  REQUIRE(colours.at("50th percentile") != colours.at("95th percentile"));
  REQUIRE(colours.at("5th percentile") != colours.at("95th percentile"));

  // Order statistics: for any sample, the p-quantile with linear interpolation (Hyndman &
  // Fan 1996, definition 7) is non-decreasing in p, so at every frequency the 50th
  // percentile lies between the 5th and the 95th. On the plot, larger |Z| is higher, i.e.
  // a smaller pixel row (the log mapping of svg_plot.hpp), and the mapping and the
  // two-decimal rounding are both monotone, so the rows keep that order (ties allowed).
  const auto p5 = polylines_in(*root, colours.at("5th percentile"));
  const auto p50 = polylines_in(*root, colours.at("50th percentile"));
  const auto p95 = polylines_in(*root, colours.at("95th percentile"));
  // The y axis spans every curve, so none is clipped into pieces (yield_report.hpp).
  REQUIRE(p5.size() == 1);
  REQUIRE(p50.size() == 1);
  REQUIRE(p95.size() == 1);
  const auto low = points_of(p5[0]);
  const auto mid = points_of(p50[0]);
  const auto high = points_of(p95[0]);
  // One point per grid frequency of the project's band, the same columns for all three.
  const quietrail::Project project = quietrail::read_project_file(kCoreRail);
  REQUIRE(mid.size() == quietrail::FrequencyGrid(project.band).size());
  REQUIRE(low.size() == mid.size());
  REQUIRE(high.size() == mid.size());
  std::size_t out_of_order = 0;
  bool spread_somewhere = false;
  for (std::size_t i = 0; i < mid.size(); ++i) {
    REQUIRE(low[i].first == mid[i].first);
    REQUIRE(high[i].first == mid[i].first);
    if (!(high[i].second <= mid[i].second && mid[i].second <= low[i].second)) ++out_of_order;
    if (low[i].second - high[i].second > 1.0) spread_somewhere = true;  // more than a pixel apart
  }
  CHECK(out_of_order == 0);
  // The tolerances are not zero, so the band has a width somewhere (else the check above
  // would hold trivially).
  CHECK(spread_somewhere);

  // The page: the yield as the JSON has it (one decimal, as `brief` prints it), the
  // passes out of the trials, and the caution (README "Caution", cli::kCaution).
  const std::string html = read_text(html_path);
  const double yield = summary.at("yield").get<double>();
  CHECK_THAT(html, Contains(fmt::format("{:.1f} %", 100.0 * yield)));
  CHECK_THAT(html, Contains(fmt::format("{}/{} trials", summary.at("passes").get<std::size_t>(),
                                        summary.at("trials").get<std::size_t>())));
  CHECK_THAT(html, Contains(fmt::format("{:.1f} %", 100.0 * summary.at("interval").at("low").get<double>())));
  CHECK_THAT(html, Contains(fmt::format("{:.1f} %", 100.0 * summary.at("interval").at("high").get<double>())));
  CHECK_THAT(html, Contains("Planning estimate: confirm on hardware"));
  CHECK_THAT(html, Contains("<svg"));  // the plot is inlined, not linked
  CHECK_THAT(html, Contains("5th percentile"));
  // The worst trial's parts by the names the JSON gives them.
  for (const auto& part : summary.at("worst").at("draw").at("parts"))
    CHECK_THAT(html, Contains(part.at("branch").get<std::string>()));
}

TEST_CASE("yield leaves no file behind when one output cannot be written", "[cli][yield]") {
  // A directory where the page should go: the last file fails, and the ones written before
  // it are removed again (output_files.hpp, all or none).
  const TempDir dir("yield-cli-blocked");
  const fs::path out = dir / "out";
  fs::create_directories(out / "core_rail_yield.html");
  const auto run = quietrail::test::run_cli(
      kCli, dir.path(), {"yield", kCoreRail.string(), "--trials", "20", "--out", out.string()});
  CHECK(run.exit_code != 0);
  for (const char* name : {"core_rail_yield.json", "core_rail_yield_curves.csv", "core_rail_yield_worst.json",
                           "core_rail_yield.svg"}) {
    INFO(name);
    CHECK_FALSE(fs::exists(out / name));
  }
}
