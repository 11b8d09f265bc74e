// SPDX-License-Identifier: MIT
// Rendering a finished comparison for people and scripts: JSON diff, CSV, SVG, HTML and the
// terminal summary. The numbers come from the two checks and compare_checks.
#include "cli/compare_report.hpp"

#include <cmath>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "cli/ratio_text.hpp"
#include "cli/terminal.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/report/csv_curves.hpp"
#include "quietrail/report/html_report.hpp"
#include "quietrail/report/svg_plot.hpp"
#include "quietrail/units.hpp"

namespace quietrail::cli {
namespace {

using Json = nlohmann::ordered_json;

Json number(double value) { return std::isfinite(value) ? Json(value) : Json(nullptr); }

std::string edit_text(const ProjectEdit& e) {
  switch (e.kind) {
    case EditKind::replace: return fmt::format("replace {} with {}", e.target, e.part_id);
    case EditKind::count: return fmt::format("count of {} to {}", e.target, e.count);
    case EditKind::add: return fmt::format("add {} x {}", e.count, e.part_id);
    case EditKind::remove: return fmt::format("remove {}", e.target);
    case EditKind::mounting: return fmt::format("mounting of {} to {}", e.target, e.mounting_json);
  }
  return {};
}

// Signed percentage change of a ratio of two positive values, "+12.3 %".
std::string shift_text(double ratio) {
  if (!std::isfinite(ratio) || !(ratio > 0.0)) return "-";
  return fmt::format("{:+.3g} %", (ratio - 1.0) * 100.0);
}

std::string cost_delta_text(double value, bool complete) {
  return fmt::format("{:+.3g}{}", value, complete ? "" : " (incomplete)");
}

std::string area_delta_text(double value, bool complete) {
  return fmt::format("{:+.3g} mm^2{}", value * 1e6, complete ? "" : " (incomplete)");
}

std::vector<double> magnitudes(const ComplexVector& z) {
  std::vector<double> out(static_cast<std::size_t>(z.size()));
  for (Eigen::Index i = 0; i < z.size(); ++i) out[static_cast<std::size_t>(i)] = std::abs(z[i]);
  return out;
}

Json peak_json(const Peak& k) {
  return Json{{"frequency_hz", number(k.frequency)}, {"magnitude_ohm", number(k.magnitude)},
              {"target_ohm", number(k.target)},      {"ratio", number(k.ratio)},
              {"q", number(k.q)},                    {"at_band_edge", k.at_band_edge}};
}

Json totals_json(const PartTotals& t) {
  return Json{{"capacitor_count", t.capacitor_count}, {"cost", number(t.cost)}, {"area_m2", number(t.area)},
              {"cost_complete", t.cost_complete}, {"area_complete", t.area_complete}};
}

Json side_json(const CompareSide& s) {
  const CheckResult& r = s.result;
  Json peaks = Json::array();
  for (const auto& k : r.peaks) peaks.push_back(peak_json(k));
  Json parts = Json::array();
  for (const auto& row : r.parts)
    parts.push_back(Json{{"name", row.name}, {"kind", row.kind}, {"count", row.count}, {"library_id", row.library_id}});
  return Json{{"label", s.label},
              {"project", s.project.name},
              {"file", s.input.string()},
              {"target", r.target_description},
              {"verdict", to_string(r.status)},
              {"message", r.message},
              {"worst_ratio", number(r.worst_ratio)},
              {"worst_ratio_db", number(r.worst_ratio_db)},
              {"worst_frequency_hz", number(r.worst_frequency)},
              {"band_hz", Json::array({number(s.project.band.start), number(s.project.band.stop)})},
              {"peaks", peaks},
              {"parts", parts},
              {"totals", totals_json(r.totals)}};
}

std::string verdict_sentence(const CompareRun& run) {
  const CompareResult& d = run.diff;
  return fmt::format("{} {} (worst {} x target, {}) -> {} {} (worst {} x target, {} at {})", run.base.label,
                     to_string(d.base_status), ratio_text(d.base_worst_ratio), db_text(d.base_worst_ratio),
                     run.other.label, to_string(d.other_status), ratio_text(d.other_worst_ratio),
                     db_text(d.other_worst_ratio), format_value(d.other_worst_frequency, "Hz", 4));
}

// Summary rows: what, base, other, change.
std::vector<std::vector<std::string>> summary_rows(const CompareRun& run) {
  const CompareResult& d = run.diff;
  const PartTotals& a = d.base_totals;
  const PartTotals& b = d.other_totals;
  return {
      {"Verdict", to_string(d.base_status), to_string(d.other_status),
       d.base_status == d.other_status ? "same" : "changed"},
      {"Worst |Z|/Z_t", ratio_text(d.base_worst_ratio), ratio_text(d.other_worst_ratio),
       fmt::format("{:+.3g}", d.worst_ratio_delta)},
      {"Worst, dB", db_text(d.base_worst_ratio), db_text(d.other_worst_ratio),
       std::isfinite(d.worst_ratio_db_delta) ? fmt::format("{:+.2f} dB", d.worst_ratio_db_delta) : "-"},
      {"Worst at", format_value(d.base_worst_frequency, "Hz", 4), format_value(d.other_worst_frequency, "Hz", 4), ""},
      {"Capacitors", std::to_string(a.capacitor_count), std::to_string(b.capacitor_count),
       fmt::format("{:+d}", d.totals_delta.capacitor_count)},
      {"Cost", fmt::format("{:.3g}", a.cost), fmt::format("{:.3g}", b.cost),
       cost_delta_text(d.totals_delta.cost, d.totals_delta.cost_complete)},
      {"Area", fmt::format("{:.3g} mm^2", a.area * 1e6), fmt::format("{:.3g} mm^2", b.area * 1e6),
       area_delta_text(d.totals_delta.area, d.totals_delta.area_complete)},
  };
}

// Peak rows: base f, base |Z|, other f, other |Z|, f shift, height change, ratio.
std::vector<std::vector<std::string>> peak_rows(const CompareRun& run) {
  std::vector<std::vector<std::string>> rows;
  for (const auto& m : run.diff.matched)
    rows.push_back({format_value(m.base.frequency, "Hz", 4), format_value(m.base.magnitude, "ohm", 3),
                    format_value(m.other.frequency, "Hz", 4), format_value(m.other.magnitude, "ohm", 3),
                    shift_text(m.frequency_ratio), db_text(m.magnitude_ratio),
                    ratio_text(m.base.ratio) + " -> " + ratio_text(m.other.ratio)});
  for (const auto i : run.diff.only_base) {
    const Peak& k = run.base.result.peaks[i];
    rows.push_back({format_value(k.frequency, "Hz", 4), format_value(k.magnitude, "ohm", 3), "-", "-", "gone", "-",
                    ratio_text(k.ratio) + " -> -"});
  }
  for (const auto j : run.diff.only_other) {
    const Peak& k = run.other.result.peaks[j];
    rows.push_back({"-", "-", format_value(k.frequency, "Hz", 4), format_value(k.magnitude, "ohm", 3), "new", "-",
                    "- -> " + ratio_text(k.ratio)});
  }
  return rows;
}

const std::vector<std::string> kPeakHeaders{"Base f", "Base |Z|", "Other f", "Other |Z|", "f shift", "Height",
                                            "|Z|/Z_t"};

}  // namespace

std::string compare_json(const CompareRun& run) {
  const CompareResult& d = run.diff;
  Json edits = Json::array();
  for (const auto& e : run.edits) {
    Json item{{"kind", std::string(to_string(e.kind))}, {"given_in", e.origin_file}, {"field", e.origin_field}};
    if (!e.target.empty()) item["line"] = e.target;
    if (!e.part_id.empty()) item["part"] = e.part_id;
    if (e.kind == EditKind::count || e.kind == EditKind::add) item["count"] = e.count;
    if (e.kind == EditKind::mounting) item["mounting"] = Json::parse(e.mounting_json);
    edits.push_back(std::move(item));
  }
  Json matched = Json::array();
  for (const auto& m : d.matched)
    matched.push_back(Json{{"base", peak_json(m.base)},
                           {"other", peak_json(m.other)},
                           {"frequency_ratio", number(m.frequency_ratio)},
                           {"magnitude_ratio", number(m.magnitude_ratio)},
                           {"magnitude_change_db", number(db(m.magnitude_ratio))},
                           {"target_ratio_delta", number(m.target_ratio_delta)}});
  Json only_base = Json::array();
  for (const auto i : d.only_base) only_base.push_back(peak_json(run.base.result.peaks[i]));
  Json only_other = Json::array();
  for (const auto j : d.only_other) only_other.push_back(peak_json(run.other.result.peaks[j]));
  Json doc{
      {"tool", "quietrail compare"},
      {"base", side_json(run.base)},
      {"other", side_json(run.other)},
      {"edits", edits},
      {"diff",
       Json{{"verdict_changed", d.base_status != d.other_status},
            {"worst_ratio_delta", number(d.worst_ratio_delta)},
            {"worst_ratio_db_delta", number(d.worst_ratio_db_delta)},
            {"match_factor", d.match_factor},
            {"matched_peaks", matched},
            {"only_in_base", only_base},
            {"only_in_other", only_other},
            {"totals",
             Json{{"capacitor_count", d.totals_delta.capacitor_count},
                  {"cost", number(d.totals_delta.cost)},
                  {"area_m2", number(d.totals_delta.area)},
                  {"cost_complete", d.totals_delta.cost_complete},
                  {"area_complete", d.totals_delta.area_complete}}}}},
      {"files",
       Json{{"json", run.files.json.string()},
            {"csv", run.files.csv.string()},
            {"svg", run.files.svg.string()},
            {"html", run.files.html.string()}}},
  };
  return doc.dump(2) + "\n";
}

std::string compare_csv(const CompareRun& run) {
  const CheckResult& a = run.base.result;
  const CheckResult& b = run.other.result;
  const FrequencyGrid grid(a.frequencies);
  ComplexVector other = b.impedance;
  if (b.frequencies != a.frequencies) {
    // Different bands: the other side's exact impedance on the base grid.
    const ImpedanceFunction z = port_impedance_function(run.other.project.network, run.other.project.port);
    other.resize(static_cast<Eigen::Index>(a.frequencies.size()));
    for (std::size_t i = 0; i < a.frequencies.size(); ++i) other[static_cast<Eigen::Index>(i)] = z(a.frequencies[i]);
  }
  const std::vector<NamedCurve> extra{{run.other.label, other}};
  const std::vector<NamedColumn> columns{{run.base.label + " target_ohm", a.target},
                                         {run.other.label + " target_ohm", run.other.project.target->on(a.frequencies)}};
  return format_impedance_csv(grid, a.impedance, extra, columns);
}

std::string compare_svg(const CompareRun& run) {
  const Project& p = run.other.project;
  std::vector<PlotSeries> series;
  PlotSeries mask{.name = "target", .x = {}, .y = {}, .style = PlotSeries::Style::target_mask};
  const double start = std::min(run.base.project.band.start, p.band.start);
  const double stop = std::max(run.base.project.band.stop, p.band.stop);
  for (const auto& point : p.target->outline(start, stop)) {
    mask.x.push_back(point.frequency);
    mask.y.push_back(point.impedance);
  }
  series.push_back(std::move(mask));
  if (run.base.result.target_description != run.other.result.target_description) {
    PlotSeries base_target{.name = run.base.label + " target", .x = {}, .y = {}, .style = PlotSeries::Style::branch};
    for (const auto& point : run.base.project.target->outline(start, stop)) {
      base_target.x.push_back(point.frequency);
      base_target.y.push_back(point.impedance);
    }
    series.push_back(std::move(base_target));
  }
  series.push_back(PlotSeries{.name = "|Z| " + run.base.label, .x = run.base.result.frequencies,
                              .y = magnitudes(run.base.result.impedance), .style = PlotSeries::Style::secondary});
  series.push_back(PlotSeries{.name = "|Z| " + run.other.label, .x = run.other.result.frequencies,
                              .y = magnitudes(run.other.result.impedance), .style = PlotSeries::Style::total});
  std::vector<PlotMarker> markers;
  for (const auto& k : run.other.result.peaks)
    markers.push_back(PlotMarker{.x = k.frequency, .y = k.magnitude,
                                 .label = format_value(k.magnitude, "ohm", 3) + " @ " + format_value(k.frequency, "Hz", 3),
                                 .violation = k.ratio > 1.0});
  PlotOptions options;
  options.title = fmt::format("{}: {} against {}", run.base.project.name, run.other.label, run.base.label);
  options.id = "quietrail-compare";
  return render_svg_loglog(series, markers, options);
}

std::string compare_html(const CompareRun& run, const std::string& svg) {
  HtmlReport page("Comparison of " + run.base.project.name);
  page.add_verdict(run.diff.other_status == CheckStatus::pass, verdict_sentence(run));
  page.add_key_values({{run.base.label, run.base.input.string() + " (" + run.base.project.name + ")"},
                       {run.other.label, run.edits.empty() ? run.other.input.string() + " (" + run.other.project.name + ")"
                                                           : "the base with the edits below"},
                       {"Target (" + run.other.label + ")", run.other.result.target_description}});
  if (!run.edits.empty()) {
    page.add_heading("Edits");
    std::vector<std::vector<std::string>> rows;
    for (const auto& e : run.edits) rows.push_back({edit_text(e), e.origin_file + " " + e.origin_field});
    page.add_table({"Edit", "Given in"}, rows);
  }
  page.add_svg(svg, "|Z| of both configurations over the target of the " + run.other.label + " one");
  using Align = HtmlReport::Align;
  page.add_heading("Side by side");
  page.add_table({"", run.base.label, run.other.label, "Change"}, summary_rows(run), {},
                 {Align::left, Align::right, Align::right, Align::right});
  page.add_heading("Peaks");
  page.add_paragraph(fmt::format(
      "Peaks of |Z| are matched to the nearest peak of the other side within a factor {:.3g} in frequency "
      "(docs/compare.md). Height is the change of |Z| at the peak.",
      run.diff.match_factor));
  std::vector<HtmlReport::RowTone> tones;
  for (const auto& m : run.diff.matched)
    tones.push_back(m.magnitude_ratio > 1.0 ? HtmlReport::RowTone::warning : HtmlReport::RowTone::plain);
  page.add_table(kPeakHeaders, peak_rows(run), tones,
                 {Align::right, Align::right, Align::right, Align::right, Align::right, Align::right, Align::right});
  page.add_caution(kCaution);
  return page.render();
}

std::string compare_text(const CompareRun& run, bool colour) {
  std::string out;
  auto line = [&](const std::string& text) { out.append(text).append("\n"); };
  line(paint("Comparison of " + run.base.project.name, Tone::heading, colour));
  line(paint(verdict_sentence(run), run.diff.other_status == CheckStatus::pass ? Tone::good : Tone::bad, colour));
  for (const auto& e : run.edits) line("  edit: " + edit_text(e));
  line("");
  using Align = TextTable::Align;
  TextTable summary({"", run.base.label, run.other.label, "Change"}, {Align::left, Align::right, Align::right, Align::right});
  for (auto& row : summary_rows(run)) summary.add_row(std::move(row));
  out += summary.render(colour);
  line("");
  line(paint("Peaks", Tone::heading, colour));
  TextTable peaks(kPeakHeaders, {Align::right, Align::right, Align::right, Align::right, Align::right, Align::right,
                                 Align::right});
  for (auto& row : peak_rows(run)) peaks.add_row(std::move(row));
  if (peaks.row_count() == 0) line("  no maximum of |Z| on either side");
  else out += peaks.render(colour);
  line("");
  line(fmt::format("Reports in {}", run.files.directory.string()));
  line(kCaution);
  return out;
}

}  // namespace quietrail::cli
