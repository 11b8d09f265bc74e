// SPDX-License-Identifier: MIT
// Rendering a finished yield run as a plot and a page (yield_report.hpp). Every number
// comes from run_yield and the problem; nothing is computed twice.
#include "cli/yield_report.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>
#include <utility>
#include <vector>

#include <fmt/format.h>

#include "cli/ratio_text.hpp"
#include "cli/terminal.hpp"
#include "quietrail/report/html_report.hpp"
#include "quietrail/report/svg_plot.hpp"
#include "quietrail/units.hpp"

namespace quietrail::cli {
namespace {

// One decimal, as YieldResult::brief writes it.
std::string percent(double fraction) { return fmt::format("{:.1f} %", 100.0 * fraction); }

std::string yield_text(const YieldResult& r) {
  return fmt::format("{} ({}/{} trials)", percent(r.yield), r.passes, r.trials);
}

std::string interval_text(const YieldResult& r) {
  return fmt::format("{:.3g} % Wilson interval {} to {}", 100.0 * r.confidence, percent(r.interval.low),
                     percent(r.interval.high));
}

std::string branch_name(const YieldProblem& problem, BranchId branch) {
  return problem.network.branches()[static_cast<std::size_t>(branch)].name;
}

std::vector<double> magnitudes(const ComplexVector& z) {
  std::vector<double> out(static_cast<std::size_t>(z.size()));
  for (Eigen::Index i = 0; i < z.size(); ++i) out[static_cast<std::size_t>(i)] = std::abs(z[i]);
  return out;
}

std::vector<double> to_vector(const RealVector& v) { return std::vector<double>(v.data(), v.data() + v.size()); }

std::string refined_text(const std::optional<CheckResult>& check) {
  return check ? ratio_text(check->worst_ratio) : std::string("-");
}

std::string verdict_text(const std::optional<CheckResult>& check) {
  return check ? to_string(check->status) : std::string("-");
}

HtmlReport::RowTone tone_of(const std::optional<CheckResult>& check) {
  if (!check) return HtmlReport::RowTone::muted;
  return check->status == CheckStatus::pass ? HtmlReport::RowTone::pass : HtmlReport::RowTone::fail;
}

std::string operating_point(const TrialDraw& draw) {
  return fmt::format("{} DC, {:.4g} C", format_value(draw.dc_voltage, "V", 4), draw.temperature_c);
}

}  // namespace

std::string percentile_name(double fraction) {
  const double level = 100.0 * fraction;
  const double whole = std::round(level);
  if (std::abs(level - whole) > 1e-9) return fmt::format("{:g}th percentile", level);
  const auto n = static_cast<long long>(whole);
  const char* suffix = "th";
  if (n % 100 < 11 || n % 100 > 13) {
    if (n % 10 == 1) suffix = "st";
    else if (n % 10 == 2) suffix = "nd";
    else if (n % 10 == 3) suffix = "rd";
  }
  return fmt::format("{}{} percentile", n, suffix);
}

std::string yield_svg(const YieldRun& run) {
  const YieldProblem& problem = run.problem;
  const YieldResult& r = run.result;
  std::vector<PlotSeries> series;

  PlotSeries mask{.name = "target", .x = {}, .y = {}, .style = PlotSeries::Style::target_mask};
  for (const auto& point : problem.target->outline(problem.band.start, problem.band.stop)) {
    mask.x.push_back(point.frequency);
    mask.y.push_back(point.impedance);
  }
  series.push_back(std::move(mask));
  // Percentiles and the worst trial as thin curves, each in its own colour; the nominal
  // build is the bold one the eye starts from.
  for (std::size_t k = 0; k < r.percentiles.size() && k < r.percentile_magnitude.size(); ++k)
    series.push_back(PlotSeries{.name = percentile_name(r.percentiles[k]),
                                .x = r.frequencies,
                                .y = to_vector(r.percentile_magnitude[k]),
                                .style = PlotSeries::Style::branch});
  std::vector<PlotMarker> markers;
  if (r.worst_check) {
    const CheckResult& w = *r.worst_check;
    series.push_back(PlotSeries{.name = fmt::format("worst trial ({})", r.worst_trial),
                                .x = w.frequencies,
                                .y = magnitudes(w.impedance),
                                .style = PlotSeries::Style::branch});
    markers.push_back(PlotMarker{.x = w.worst_frequency,
                                 .y = w.worst_magnitude,
                                 .label = fmt::format("worst trial {} @ {}", ratio_text(w.worst_ratio),
                                                      format_value(w.worst_frequency, "Hz", 3)),
                                 .violation = w.worst_ratio > 1.0});
  }
  series.push_back(PlotSeries{.name = "nominal |Z|",
                              .x = r.nominal.frequencies,
                              .y = magnitudes(r.nominal.impedance),
                              .style = PlotSeries::Style::total});

  PlotOptions options;
  options.title = fmt::format("{}: yield {} of {} trials, |Z| percentiles against the target", run.project.name,
                              percent(r.yield), r.trials);
  options.id = "yield-plot";
  options.marker_legend = "worst trial's worst point";
  options.violation_legend = "worst trial's worst point (above target)";
  // The y range spans every curve (thin ones included, unlike the plot's default), widened
  // to whole decades, so the percentile band is never clipped.
  double low = std::numeric_limits<double>::infinity();
  double high = 0.0;
  auto take = [&](double y) {
    if (std::isfinite(y) && y > 0.0) {
      low = std::min(low, y);
      high = std::max(high, y);
    }
  };
  for (const auto& s : series)
    for (const double y : s.y) take(y);
  for (const auto& m : markers) take(m.y);
  if (high > 0.0) {
    options.y_min = std::pow(10.0, std::floor(std::log10(low)));
    options.y_max = std::pow(10.0, std::ceil(std::log10(high)));
    if (!(*options.y_min < *options.y_max)) options.y_max = *options.y_min * 10.0;
  }
  return render_svg_loglog(series, markers, options);
}

std::string yield_html(const YieldRun& run, const std::string& svg) {
  const Project& p = run.project;
  const YieldProblem& problem = run.problem;
  const YieldOptions& o = run.options;
  const YieldResult& r = run.result;
  using Align = HtmlReport::Align;
  using RowTone = HtmlReport::RowTone;

  HtmlReport page("Yield of " + p.name);
  // The yield is a statistic, not a verdict: it goes in plain text, and the banner judges
  // only the nominal build.
  page.add_paragraph(fmt::format("Yield {}: {} of {} simulated builds meet the target at every grid sample "
                                 "({}).",
                                 percent(r.yield), r.passes, r.trials, interval_text(r)));
  page.add_verdict(r.nominal.status == CheckStatus::pass,
                   fmt::format("Nominal build (every part at its nominal, derated value): worst |Z|/Z_target {} "
                               "({}) at {}.",
                               ratio_text(r.nominal.worst_ratio), db_text(r.nominal.worst_ratio),
                               format_value(r.nominal.worst_frequency, "Hz", 4)));
  if (!p.description.empty()) page.add_paragraph(p.description);

  page.add_heading("Run");
  page.add_key_values({
      {"Trials", std::to_string(r.trials)},
      {"Seed", std::to_string(o.seed)},
      {"Yield", yield_text(r) + "; " + interval_text(r)},
      {"Evaluation path", to_string(r.evaluation)},
      {"Verdict basis", "grid samples (docs/yield.md); the nominal build, worst trial and corners are checked "
                        "again with refined peaks"},
      {"Band", format_value(problem.band.start, "Hz", 3) + " to " + format_value(problem.band.stop, "Hz", 3)},
      {"Target", problem.target->describe()},
  });

  page.add_heading("Impedance");
  page.add_svg(svg, "Percentile curves are pointwise order statistics of |Z| over the trials: the 95th percentile "
                    "curve is not any one build. The worst trial's curve is its refined check; the shaded region "
                    "lies above the target.");

  page.add_heading("Corners");
  page.add_paragraph("Every drawn variate at the low or the high end of its range (tolerance, ESR, ESL, DC voltage, "
                     "temperature). The corners need not bracket the trials.");
  {
    std::vector<std::vector<std::string>> rows;
    std::vector<RowTone> tones;
    for (const YieldCorner* c : {&r.low_corner, &r.high_corner}) {
      rows.push_back({c->name, operating_point(c->draw), ratio_text(c->grid_worst_ratio), refined_text(c->check),
                      verdict_text(c->check)});
      tones.push_back(tone_of(c->check));
    }
    page.add_table({"Corner", "Operating point", "Grid |Z|/Z_t", "Refined |Z|/Z_t", "Verdict"}, rows, tones,
                   {Align::left, Align::left, Align::right, Align::right, Align::left});
  }

  page.add_heading("Worst trial");
  {
    const double grid = r.worst_trial < r.trial_worst_ratio.size() ? r.trial_worst_ratio[r.worst_trial]
                                                                    : std::numeric_limits<double>::quiet_NaN();
    std::vector<std::pair<std::string, std::string>> items{
        {"Trial", std::to_string(r.worst_trial)},
        {"Operating point", operating_point(r.worst_draw)},
        {"Grid |Z|/Z_t", ratio_text(grid)},
        {"Refined |Z|/Z_t", refined_text(r.worst_check)},
        {"Verdict (refined)", verdict_text(r.worst_check)},
    };
    if (r.worst_check) items.emplace_back("Worst point", format_value(r.worst_check->worst_frequency, "Hz", 4));
    page.add_key_values(items);
    std::vector<std::vector<std::string>> rows;
    for (const PartDraw& d : r.worst_draw.parts)
      rows.push_back({branch_name(problem, d.branch), format_value(d.capacitance, "F", 4),
                      format_value(d.esr, "ohm", 4), format_value(d.esl, "H", 4)});
    page.add_paragraph("Drawn values per copy, after derating (as in the JSON summary):");
    page.add_table({"Part", "C", "ESR", "ESL (body)"}, rows, {}, {Align::left, Align::right, Align::right, Align::right});
  }

  page.add_heading("What varies");
  {
    std::vector<std::vector<std::string>> rows;
    for (const VariedPart& v : problem.parts)
      rows.push_back({branch_name(problem, v.branch), format_value(v.c_nominal, "F", 4),
                      fmt::format("+/-{:.3g} %", 100.0 * v.c_tolerance),
                      fmt::format("+/-{:.3g} %", 100.0 * v.esr_spread.value_or(o.esr_spread)),
                      fmt::format("+/-{:.3g} %", 100.0 * v.esl_spread.value_or(o.esl_spread))});
    page.add_table({"Part", "C nominal (0 V, 25 C)", "Tolerance", "ESR spread", "ESL spread"}, rows, {},
                   {Align::left, Align::right, Align::right, Align::right, Align::right});
  }
  page.add_paragraph(fmt::format(
      "Each trial draws, uniformly: the DC voltage across the capacitors within {} +/-{:.3g} % (the rail's ripple), "
      "the temperature from {:.4g} C to {:.4g} C, and per BOM line its capacitance within the part's tolerance "
      "(library tolerance letter; inline parts +/-20 %), then derated at that voltage and temperature; ESR within "
      "+/-{:.3g} % and body ESL within +/-{:.3g} % (our choices). All copies of one line share one draw (one reel "
      "lot, the pessimistic reading). Mounting inductance, leakage, dissipation factor, skin corner, regulators, "
      "planes, inductors, beads and the load side do not vary. See docs/yield.md.",
      format_value(problem.dc_voltage, "V", 4), 100.0 * problem.voltage_tolerance, problem.temperature_min_c,
      problem.temperature_max_c, 100.0 * o.esr_spread, 100.0 * o.esl_spread));

  page.add_caution(kCaution);
  return page.render();
}

}  // namespace quietrail::cli
