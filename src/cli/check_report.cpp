// SPDX-License-Identifier: MIT
// Rendering a finished check for people and scripts: JSON, CSV, SVG, HTML and the terminal
// summary. The numbers come from run_check and the project; nothing is computed twice.
#include "cli/check_report.hpp"
#include "cli/ratio_text.hpp"
#include "quietrail/network/nodal_solver.hpp"

#include <cctype>
#include <cmath>
#include <map>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "cli/terminal.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/report/csv_curves.hpp"
#include "quietrail/report/html_report.hpp"
#include "quietrail/report/svg_plot.hpp"
#include "quietrail/units.hpp"

namespace quietrail::cli {
namespace {

// Ordered, so the JSON report reads in the order it is built.
using Json = nlohmann::ordered_json;

Json number(double value) { return std::isfinite(value) ? Json(value) : Json(nullptr); }
Json number(const std::optional<double>& value) { return value ? number(*value) : Json(nullptr); }

std::string value_or_dash(const std::optional<double>& value, const char* unit, int digits = 3) {
  return value && std::isfinite(*value) ? format_value(*value, unit, digits) : std::string("-");
}

std::string q_text(double q) { return std::isfinite(q) ? fmt::format("{:.3g}", q) : std::string("-"); }

std::string band_text(const std::optional<Band>& band) {
  if (!band) return "-";
  if (std::isinf(band->high))
    return band->low > 0.0 ? "above " + format_value(band->low, "Hz", 3) : std::string("everywhere");
  if (band->low <= 0.0) return "DC to " + format_value(band->high, "Hz", 3);
  return format_value(band->low, "Hz", 3) + " to " + format_value(band->high, "Hz", 3);
}

std::string area_text(const std::optional<double>& area) {
  if (!area) return "-";
  return fmt::format("{:.3g} mm^2", *area * 1e6);
}

std::string cost_text(const std::optional<double>& cost) {
  return cost ? fmt::format("{:.3g}", *cost) : std::string("-");
}

std::string view_sentence(const Project& p) {
  if (p.view == LoadView::die)
    return "die: the impedance seen from the die, behind the package's series resistance and inductance";
  return p.load ? "board: the impedance seen at the board node where the capacitors sit (the die view is "
                  "drawn for comparison)"
                : "board: the impedance seen at the board node where the capacitors sit";
}

// The placed part of each branch (BOM lines, feed, supply parts), nullptr for the others.
std::vector<const PlacedPart*> placed_by_branch(const Project& p) {
  std::vector<const PlacedPart*> out(p.network.branch_count(), nullptr);
  for (const auto& part : p.parts) out[static_cast<std::size_t>(part.branch)] = &part;
  return out;
}

std::string role_of(const Project& p, BranchId id) {
  return std::string(to_string(p.roles[static_cast<std::size_t>(id)]));
}

std::string mounting_source(const std::vector<const PlacedPart*>& placed, BranchId id) {
  const PlacedPart* part = placed[static_cast<std::size_t>(id)];
  return part ? part->mounting_source : std::string();
}

std::string esl_text(const PartRow& row) {
  if (!row.esl) return row.mounting_inductance > 0.0 ? "+ " + format_value(row.mounting_inductance, "H", 3) : "-";
  if (row.mounting_inductance <= 0.0) return format_value(*row.esl, "H", 3);
  return format_value(*row.esl, "H", 3) + " + " + format_value(row.mounting_inductance, "H", 3);
}

std::string step_text(const RailSpec& rail) {
  if (rail.current_step) return format_value(*rail.current_step, "A", 3);
  return format_value(rail.step(), "A", 3) + fmt::format(" ({:.3g} % of the maximum)", rail.step_fraction * 100.0);
}

std::string band_line(const Project& p) {
  std::string text = format_value(p.band.start, "Hz", 3) + " to " + format_value(p.band.stop, "Hz", 3);
  if (p.band_stop_from_rise_time) text += " (stop = 0.35 / rise time)";
  return text;
}

// "worst |Z|/Z_target 1.54 (+3.7 dB) at 3.798 MHz, |Z| 1.57 mohm against 1.02 mohm".
std::string worst_text(const CheckResult& r) {
  return fmt::format("worst |Z|/Z_target {} ({}) at {}, |Z| {} against {}", ratio_text(r.worst_ratio),
                     db_text(r.worst_ratio), format_value(r.worst_frequency, "Hz", 4),
                     format_value(r.worst_magnitude, "ohm", 3), format_value(r.worst_target, "ohm", 3));
}

std::string verdict_line(const CheckResult& r) {
  return std::string(r.status == CheckStatus::pass ? "PASS: " : "FAIL: ") + worst_text(r);
}

std::string ripple_display(const Project& p) {
  const std::string percent = fmt::format("{:.3g} %", p.rail.ripple * 100.0);
  const std::string volts = format_value(p.rail.ripple * p.rail.voltage, "V", 3);
  if (p.ripple_text.find('%') != std::string::npos) return percent + " = " + volts;
  return p.ripple_text + " = " + percent + " = " + volts;
}

std::string exceedance_text(const ExceedanceBand& b) {
  return fmt::format("{}{} to {}{}: worst {} ({}) at {}", b.starts_at_band_edge ? "(band start) " : "",
                     format_value(b.start, "Hz", 3), format_value(b.stop, "Hz", 3),
                     b.stops_at_band_edge ? " (band stop)" : "", ratio_text(b.worst_ratio), db_text(b.worst_ratio),
                     format_value(b.worst_frequency, "Hz", 3));
}

std::vector<std::pair<std::string, std::string>> rail_items(const Project& p) {
  const RailSpec& rail = p.rail;
  std::vector<std::pair<std::string, std::string>> items{
      {"Voltage", format_value(rail.voltage, "V", 4)},
      {"Ripple", ripple_display(p)},
      {"Maximum current", format_value(rail.max_current, "A", 3)},
      {"Current step", step_text(rail)},
      {"Rise time", rail.rise_time ? format_value(*rail.rise_time, "s", 3) : std::string("-")},
      {"Band", band_line(p)},
      {"Temperature", fmt::format("{:.4g} C", rail.temperature_c)},
      {"DC voltage on the capacitors", format_value(p.dc_voltage, "V", 4)},
      {"Target", p.target->describe()},
      {"View", view_sentence(p)},
  };
  if (p.load)
    items.emplace_back("Load side", fmt::format("package {} + {}, die {} with {}",
                                                format_value(p.load->package_resistance, "ohm", 3),
                                                format_value(p.load->package_inductance, "H", 3),
                                                format_value(p.load->die_capacitance, "F", 3),
                                                format_value(p.load->die_resistance, "ohm", 3)));
  return items;
}

Json contributors_json(const std::vector<PeakContributor>& side) {
  Json out = Json::array();
  for (const auto& c : side)
    out.push_back(Json{{"name", c.name}, {"branch", c.branch}, {"share", number(c.share)}, {"role", c.role}});
  return out;
}

Json peak_json(const Peak& p) {
  return Json{{"frequency_hz", number(p.frequency)},
              {"magnitude_ohm", number(p.magnitude)},
              {"target_ohm", number(p.target)},
              {"ratio", number(p.ratio)},
              {"ratio_db", p.ratio > 0.0 ? number(db(p.ratio)) : Json(nullptr)},
              {"q", number(p.q)},
              {"at_band_edge", p.at_band_edge},
              {"raw_grid_magnitude_ohm", number(p.raw_grid_magnitude)},
              {"raw_grid_ratio", number(p.raw_grid_ratio)}};
}

// ---------------------------------------------------------------- JSON

Json sensitivity_json(const Sensitivity& s) {
  Json changes = Json::array();
  for (const WhatIf& w : s.changes)
    changes.push_back({{"kind", w.kind},
                       {"change", w.change},
                       {"peak_ratio", number(w.peak_ratio)},
                       {"peak_frequency_hz", number(w.peak_frequency)},
                       {"worst_ratio", number(w.worst_ratio)},
                       {"worst_frequency_hz", number(w.worst_frequency)}});
  return {{"peak_ratio", number(s.peak_ratio)}, {"peak_frequency_hz", number(s.peak_frequency)}, {"changes", changes}};
}

}  // namespace

void check_project(CheckRun& run) {
  const Project& project = run.project;
  run.result = run_check(project.network, project.port, *project.target, project.check_options(), project.branch_info);
  // With a load side, the other view is drawn beside the verdict's view.
  if (project.die) {
    const NodeId other = project.view == LoadView::die ? project.board : *project.die;
    run.other_view = solve_port_impedance(project.network, other, FrequencyGrid(run.result.frequencies));
    run.other_view_name = "|Z| seen from the " + std::string(project.view == LoadView::die ? "board" : "die");
  }
}

Sensitivity check_sensitivity(const Project& project, const CheckResult& result) {
  SensitivityOptions options;
  options.check = project.check_options();
  for (std::size_t b = 0; b < project.roles.size(); ++b)
    if (project.roles[b] == BranchRole::bom) options.changeable.push_back(static_cast<BranchId>(b));
  if (options.changeable.empty()) return {};
  return rank_changes(project.network, project.port, *project.target, result, options);
}

std::string check_json(const CheckRun& run) {
  const Project& p = run.project;
  const CheckResult& r = run.result;
  const auto placed = placed_by_branch(p);

  Json target{{"form", to_string(p.target->form())},
              {"description", p.target->describe()},
              {"minimum_ohm", number(p.target->minimum())}};
  if (p.target->form() == TargetForm::segments) {
    Json segments = Json::array();
    for (const auto& s : p.target->segments())
      segments.push_back(Json{{"start_hz", s.start},
                              {"stop_hz", s.stop},
                              {"impedance_at_start_ohm", s.impedance_at_start},
                              {"impedance_at_stop_ohm", s.impedance_at_stop}});
    target["segments"] = segments;
  } else if (p.target->form() == TargetForm::table) {
    Json points = Json::array();
    for (const auto& pt : p.target->points()) points.push_back(Json{{"frequency_hz", pt.frequency}, {"impedance_ohm", pt.impedance}});
    target["points"] = points;
  }

  Json exceeded = Json::array();
  for (const auto& b : r.exceeded)
    exceeded.push_back(Json{{"start_hz", number(b.start)},
                            {"stop_hz", number(b.stop)},
                            {"worst_ratio", number(b.worst_ratio)},
                            {"worst_ratio_db", b.worst_ratio > 0.0 ? number(db(b.worst_ratio)) : Json(nullptr)},
                            {"worst_frequency_hz", number(b.worst_frequency)},
                            {"starts_at_band_edge", b.starts_at_band_edge},
                            {"stops_at_band_edge", b.stops_at_band_edge}});

  Json peaks = Json::array();
  for (std::size_t i = 0; i < r.peaks.size(); ++i) {
    Json peak = peak_json(r.peaks[i]);
    if (i < r.attributions.size()) {
      const PeakAttribution& a = r.attributions[i];
      peak["formed_by"] = a.explanation;
      peak["remedy"] = a.remedy;
      peak["attribution"] = Json{{"status", a.status == AttributionStatus::resonance ? "resonance" : "one_sided"},
                                 {"all_parallel", a.all_parallel},
                                 {"inductive", contributors_json(a.inductive)},
                                 {"capacitive", contributors_json(a.capacitive)},
                                 {"loop_inductance_h", number(a.loop_inductance)},
                                 {"loop_capacitance_f", number(a.loop_capacitance)},
                                 {"loop_resistance_ohm", number(a.loop_resistance)},
                                 {"characteristic_impedance_ohm", number(a.characteristic_impedance)},
                                 {"loop_frequency_hz", number(a.loop_frequency)},
                                 {"loop_q", number(a.loop_q)},
                                 {"damping_resistance_ohm", number(a.damping_resistance)},
                                 {"srf_fill_capacitance_f", number(a.srf_fill_capacitance)}};
    }
    peaks.push_back(peak);
  }
  Json ratio_peaks = Json::array();
  for (const auto& peak : r.ratio_peaks) ratio_peaks.push_back(peak_json(peak));

  Json parts = Json::array();
  for (const auto& row : r.parts) {
    const PlacedPart* part = placed[static_cast<std::size_t>(row.branch)];
    Json band = nullptr;
    if (row.capacitive_band)
      band = Json{{"low_hz", number(row.capacitive_band->low)}, {"high_hz", number(row.capacitive_band->high)}};
    parts.push_back(Json{{"name", row.name},
                         {"role", role_of(p, row.branch)},
                         {"kind", row.kind},
                         {"library_id", row.library_id},
                         {"description", row.description},
                         {"source", part ? part->source : std::string()},
                         {"package", part ? part->package : std::string()},
                         {"rated_voltage_v", part && part->rated_voltage > 0.0 ? Json(part->rated_voltage) : Json(nullptr)},
                         {"count", row.count},
                         {"nominal_capacitance_f", number(row.nominal_capacitance)},
                         {"effective_capacitance_f", number(row.effective_capacitance)},
                         {"esr_ohm", number(row.esr)},
                         {"esl_h", number(row.esl)},
                         {"mounting_inductance_h", number(row.mounting_inductance)},
                         {"mounting_source", mounting_source(placed, row.branch)},
                         {"srf_mounted_hz", number(row.srf)},
                         {"capacitive_band", band},
                         {"cost_each", number(row.cost_each)},
                         {"cost_total", number(row.cost_total)},
                         {"area_each_m2", number(row.area_each)},
                         {"area_total_m2", number(row.area_total)}});
  }

  const RailSpec& rail = p.rail;
  const Json report{
      {"project", p.name},
      {"description", p.description},
      {"file", run.input.string()},
      {"view", to_string(p.view)},
      {"port", r.port_name},
      {"rail",
       {{"voltage_v", rail.voltage},
        {"ripple_fraction", rail.ripple},
        {"ripple_text", p.ripple_text},
        {"ripple_v", rail.ripple * rail.voltage},
        {"max_current_a", rail.max_current},
        {"current_step_a", rail.step()},
        {"step_fraction", rail.current_step ? Json(nullptr) : Json(rail.step_fraction)},
        {"rise_time_s", number(rail.rise_time)},
        {"temperature_c", rail.temperature_c},
        {"dc_voltage_v", p.dc_voltage}}},
      {"band",
       {{"start_hz", p.band.start},
        {"stop_hz", p.band.stop},
        {"stop_from_rise_time", p.band_stop_from_rise_time},
        {"points_per_decade", p.band.points_per_decade},
        {"grid_points", r.grid_points_requested},
        {"refinement_evaluations", r.evaluations_used}}},
      {"target", target},
      {"verdict",
       {{"status", to_string(r.status)},
        {"pass", r.status == CheckStatus::pass},
        {"message", r.message},
        {"view", to_string(p.view)},
        {"worst_ratio", number(r.worst_ratio)},
        {"worst_ratio_db", r.worst_ratio > 0.0 ? number(db(r.worst_ratio)) : Json(nullptr)},
        {"worst_frequency_hz", number(r.worst_frequency)},
        {"worst_magnitude_ohm", number(r.worst_magnitude)},
        {"worst_target_ohm", number(r.worst_target)}}},
      {"exceeded", exceeded},
      {"peaks", peaks},
      {"ratio_peaks", ratio_peaks},
      {"sensitivity", sensitivity_json(run.sensitivity)},
      {"parts", parts},
      {"totals",
       {{"capacitor_count", r.totals.capacitor_count},
        {"cost", r.totals.cost},
        {"cost_complete", r.totals.cost_complete},
        {"area_m2", r.totals.area},
        {"area_complete", r.totals.area_complete}}},
      {"solver", r.all_parallel ? "parallel" : "nodal"},
      {"libraries", p.libraries},
      {"bom_csv", p.bom_csv.empty() ? Json(nullptr) : Json(p.bom_csv)},
      {"notes", p.notes},
      {"warnings", p.warnings},
      {"files",
       {{"json", run.files.json.string()},
        {"csv", run.files.csv.string()},
        {"svg", run.files.svg.string()},
        {"html", run.files.html.string()}}},
      {"caution", kCaution}};
  return report.dump(2) + "\n";
}

// ---------------------------------------------------------------- CSV

std::string check_csv(const CheckRun& run) {
  const CheckResult& r = run.result;
  const FrequencyGrid grid(r.frequencies);
  RealVector ratio(r.impedance.size());
  for (Eigen::Index i = 0; i < r.impedance.size(); ++i) ratio[i] = std::abs(r.impedance[i]) / r.target[i];
  std::vector<NamedColumn> columns{{"target_ohm", r.target}, {"ratio", ratio}};
  std::vector<NamedCurve> extra;
  if (run.other_view.size() > 0) extra.push_back({run.other_view_name, run.other_view});
  for (std::size_t k = 0; k < r.branch_impedance.size(); ++k)
    extra.push_back({run.project.network.branches()[k].name, r.branch_impedance[k]});
  return format_impedance_csv(grid, r.impedance, extra, columns);
}

// ---------------------------------------------------------------- SVG

std::string check_svg(const CheckRun& run) {
  const Project& p = run.project;
  const CheckResult& r = run.result;
  std::vector<PlotSeries> series;

  PlotSeries mask{.name = "target", .x = {}, .y = {}, .style = PlotSeries::Style::target_mask};
  for (const auto& point : p.target->outline(p.band.start, p.band.stop)) {
    mask.x.push_back(point.frequency);
    mask.y.push_back(point.impedance);
  }
  series.push_back(std::move(mask));

  auto magnitudes = [](const ComplexVector& z) {
    std::vector<double> out(static_cast<std::size_t>(z.size()));
    for (Eigen::Index i = 0; i < z.size(); ++i) out[static_cast<std::size_t>(i)] = std::abs(z[i]);
    return out;
  };
  for (std::size_t k = 0; k < r.branch_impedance.size(); ++k)
    series.push_back(PlotSeries{.name = p.network.branches()[k].name,
                                .x = r.frequencies,
                                .y = magnitudes(r.branch_impedance[k]),
                                .style = PlotSeries::Style::branch});
  if (run.other_view.size() > 0)
    series.push_back(PlotSeries{.name = run.other_view_name, .x = r.frequencies, .y = magnitudes(run.other_view),
                                .style = PlotSeries::Style::secondary});
  series.push_back(PlotSeries{.name = "|Z| seen from the " + std::string(to_string(p.view)),
                              .x = r.frequencies,
                              .y = magnitudes(r.impedance),
                              .style = PlotSeries::Style::total});

  std::vector<PlotMarker> markers;
  for (const auto& peak : r.peaks)
    markers.push_back(PlotMarker{.x = peak.frequency,
                                 .y = peak.magnitude,
                                 .label = format_value(peak.magnitude, "ohm", 3) + " @ " +
                                          format_value(peak.frequency, "Hz", 3),
                                 .violation = peak.ratio > 1.0});

  // The y range follows the total, target and other view; branch curves are clipped
  // (svg_plot.hpp), so the rail stays legible.
  PlotOptions options;
  options.title = p.name + ": |Z| seen from the " + std::string(to_string(p.view)) + " against the target";
  options.id = "check-plot";
  return render_svg_loglog(series, markers, options);
}

// ---------------------------------------------------------------- HTML

std::string check_html(const CheckRun& run, const std::string& svg) {
  const Project& p = run.project;
  const CheckResult& r = run.result;
  const auto placed = placed_by_branch(p);
  using Align = HtmlReport::Align;
  using RowTone = HtmlReport::RowTone;

  HtmlReport page("Check of " + p.name);
  std::string verdict = worst_text(r) + ". Seen from the " + std::string(to_string(p.view)) + ".";
  verdict[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(verdict[0])));
  page.add_verdict(r.status == CheckStatus::pass, verdict);
  if (!p.description.empty()) page.add_paragraph(p.description);

  page.add_heading("Rail");
  page.add_key_values(rail_items(p));

  page.add_heading("Impedance");
  page.add_svg(svg, "Refined peaks are marked; the shaded region lies above the target. Thin lines are single "
                    "branches (all copies).");

  page.add_heading("Where the target is exceeded");
  if (r.exceeded.empty()) {
    page.add_paragraph("Nowhere in the band.");
  } else {
    std::vector<std::vector<std::string>> rows;
    for (const auto& b : r.exceeded)
      rows.push_back({format_value(b.start, "Hz", 3) + (b.starts_at_band_edge ? " (band start)" : ""),
                      format_value(b.stop, "Hz", 3) + (b.stops_at_band_edge ? " (band stop)" : ""),
                      ratio_text(b.worst_ratio), db_text(b.worst_ratio), format_value(b.worst_frequency, "Hz", 3)});
    page.add_table({"From", "To", "Worst ratio", "dB", "At"}, rows, std::vector<RowTone>(rows.size(), RowTone::fail),
                   {Align::right, Align::right, Align::right, Align::right, Align::right});
  }

  page.add_heading("Peaks");
  if (r.peaks.empty()) {
    page.add_paragraph("No maximum of |Z| in the band.");
  } else {
    std::vector<std::vector<std::string>> rows;
    std::vector<RowTone> tones;
    for (std::size_t i = 0; i < r.peaks.size(); ++i) {
      const Peak& k = r.peaks[i];
      const PeakAttribution* a = i < r.attributions.size() ? &r.attributions[i] : nullptr;
      rows.push_back({format_value(k.frequency, "Hz", 4), format_value(k.magnitude, "ohm", 3),
                      format_value(k.target, "ohm", 3), ratio_text(k.ratio), q_text(k.q),
                      a ? a->explanation : std::string("-"), a ? a->remedy : std::string("-")});
      tones.push_back(k.ratio > 1.0 ? RowTone::fail : RowTone::plain);
    }
    page.add_table({"Frequency", "|Z|", "Target", "Ratio", "Q", "Formed by", "What would lower it"}, rows, tones,
                   {Align::right, Align::right, Align::right, Align::right, Align::right, Align::left, Align::left});
  }

  if (!run.sensitivity.changes.empty()) {
    page.add_heading("What lowers the worst peak most");
    page.add_paragraph(fmt::format("The worst peak, {} at {}, after each change alone. Every row was computed by "
                                   "checking the changed rail again (refined peaks), lowest peak first; a change "
                                   "can lower this peak and raise another, which the last column shows.",
                                   ratio_text(run.sensitivity.peak_ratio),
                                   format_value(run.sensitivity.peak_frequency, "Hz", 4)));
    std::vector<std::vector<std::string>> rows;
    std::vector<RowTone> tones;
    for (const WhatIf& w : run.sensitivity.changes) {
      rows.push_back({w.change, ratio_text(w.peak_ratio), format_value(w.peak_frequency, "Hz", 4),
                      ratio_text(w.worst_ratio), format_value(w.worst_frequency, "Hz", 4)});
      tones.push_back(w.worst_ratio > 1.0 ? RowTone::fail : RowTone::plain);
    }
    page.add_table({"Change", "Peak after", "At", "Worst in band", "At"}, rows, tones,
                   {Align::left, Align::right, Align::right, Align::right, Align::right});
  }

  page.add_heading("Parts");
  {
    std::vector<std::vector<std::string>> rows;
    std::vector<RowTone> tones;
    for (const auto& row : r.parts) {
      const std::string part = row.library_id.empty() ? row.description : row.library_id;
      rows.push_back({row.name, role_of(p, row.branch), part, std::to_string(row.count),
                      value_or_dash(row.nominal_capacitance, "F"), value_or_dash(row.effective_capacitance, "F"),
                      value_or_dash(row.esr, "ohm"), esl_text(row), value_or_dash(row.srf, "Hz"),
                      band_text(row.capacitive_band), cost_text(row.cost_total), area_text(row.area_total),
                      mounting_source(placed, row.branch)});
      tones.push_back(row.kind == "capacitor" ? RowTone::plain : RowTone::muted);
    }
    rows.push_back({"Total", "", fmt::format("{} capacitors", r.totals.capacitor_count), "", "", "", "", "", "", "",
                    fmt::format("{:.3g}{}", r.totals.cost, r.totals.cost_complete ? "" : " (partial)"),
                    fmt::format("{:.3g} mm^2{}", r.totals.area * 1e6, r.totals.area_complete ? "" : " (partial)"), ""});
    tones.push_back(RowTone::plain);
    page.add_table({"Name", "Role", "Part", "Count", "C nominal", "C effective", "ESR", "ESL + mount",
                    "SRF mounted", "Capacitive band", "Cost", "Area", "Mounting from"},
                   rows, tones,
                   {Align::left, Align::left, Align::left, Align::right, Align::right, Align::right, Align::right,
                    Align::right, Align::right, Align::left, Align::right, Align::right, Align::left});
  }

  if (!p.warnings.empty()) {
    page.add_heading("Warnings");
    std::string text;
    for (const auto& w : p.warnings) text.append(text.empty() ? "" : "\n").append(w);
    page.add_paragraph(text);
  }
  page.add_heading("Notes");
  {
    std::string text = "Project file: " + run.input.string();
    for (const auto& lib : p.libraries) text += "\nPart library: " + lib;
    if (!p.bom_csv.empty()) text += "\nBOM: " + p.bom_csv;
    for (const auto& n : p.notes) text += "\n" + n;
    text += fmt::format("\n{} grid points, {} more exact evaluations to refine peaks.", r.grid_points_requested,
                        r.evaluations_used);
    page.add_paragraph(text);
  }
  page.add_caution(kCaution);
  return page.render();
}

// ---------------------------------------------------------------- terminal

std::string check_text(const CheckRun& run, bool colour) {
  const Project& p = run.project;
  const CheckResult& r = run.result;
  const bool pass = r.status == CheckStatus::pass;
  std::string out;
  auto line = [&](const std::string& text) { out.append(text).append("\n"); };

  line(paint(fmt::format("Check of {}", p.name), Tone::heading, colour));
  line(paint(verdict_line(r), pass ? Tone::good : Tone::bad, colour));
  line("  View      " + view_sentence(p));
  line(fmt::format("  Rail      {}, ripple {}, step {}, target {}", format_value(p.rail.voltage, "V", 4),
                   ripple_display(p), step_text(p.rail), p.target->describe()));
  line("  Band      " + band_line(p) + fmt::format(", {} points + {} refinement evaluations",
                                                   r.grid_points_requested, r.evaluations_used));
  line(fmt::format("  Derating  {} DC, {:.4g} C", format_value(p.dc_voltage, "V", 4), p.rail.temperature_c));

  line("");
  line(paint("Above the target", Tone::heading, colour));
  if (r.exceeded.empty()) line("  nowhere in the band");
  for (const auto& b : r.exceeded) line("  " + paint(exceedance_text(b), Tone::bad, colour));

  line("");
  line(paint("Peaks", Tone::heading, colour));
  if (r.peaks.empty()) {
    line("  no maximum of |Z| in the band");
  } else {
    using Align = TextTable::Align;
    TextTable table({"#", "Frequency", "|Z|", "Target", "Ratio", "dB", "Q"},
                    {Align::right, Align::right, Align::right, Align::right, Align::right, Align::right, Align::right});
    for (std::size_t i = 0; i < r.peaks.size(); ++i) {
      const Peak& k = r.peaks[i];
      table.add_row({std::to_string(i + 1), format_value(k.frequency, "Hz", 4), format_value(k.magnitude, "ohm", 3),
                     format_value(k.target, "ohm", 3), ratio_text(k.ratio), db_text(k.ratio), q_text(k.q)});
    }
    out += table.render(colour);
    for (std::size_t i = 0; i < r.peaks.size() && i < r.attributions.size(); ++i) {
      const PeakAttribution& a = r.attributions[i];
      line(fmt::format("  #{} formed by {}", i + 1, a.explanation));
      line(fmt::format("     to lower it: {}", a.remedy));
    }
  }

  if (!run.sensitivity.changes.empty()) {
    line("");
    line(paint("What lowers the worst peak most", Tone::heading, colour));
    line(fmt::format("  worst peak {} at {}; each change below was checked again", ratio_text(run.sensitivity.peak_ratio),
                     format_value(run.sensitivity.peak_frequency, "Hz", 4)));
    using Align = TextTable::Align;
    TextTable table({"Change", "Peak after", "At", "Worst in band"}, {Align::left, Align::right, Align::right, Align::right});
    const std::size_t shown = std::min<std::size_t>(run.sensitivity.changes.size(), 6);
    for (std::size_t i = 0; i < shown; ++i) {
      const WhatIf& w = run.sensitivity.changes[i];
      table.add_row({w.change, ratio_text(w.peak_ratio), format_value(w.peak_frequency, "Hz", 4),
                     ratio_text(w.worst_ratio)});
    }
    out += table.render(colour);
    if (run.sensitivity.changes.size() > shown)
      line(fmt::format("  ({} more in the JSON and HTML reports)", run.sensitivity.changes.size() - shown));
  }

  line("");
  line(paint("Parts", Tone::heading, colour));
  {
    using Align = TextTable::Align;
    TextTable table({"Name", "Part", "Count", "C nominal", "C effective", "ESR", "ESL + mount", "SRF mounted",
                     "Capacitive band", "Cost", "Area"},
                    {Align::left, Align::left, Align::right, Align::right, Align::right, Align::right, Align::right,
                     Align::right, Align::left, Align::right, Align::right});
    for (const auto& row : r.parts) {
      const std::string part = row.library_id.empty() ? row.description : row.library_id;
      table.add_row({row.name, part, std::to_string(row.count), value_or_dash(row.nominal_capacitance, "F"),
                     value_or_dash(row.effective_capacitance, "F"), value_or_dash(row.esr, "ohm"), esl_text(row),
                     value_or_dash(row.srf, "Hz"), band_text(row.capacitive_band), cost_text(row.cost_total),
                     area_text(row.area_total)});
    }
    table.add_rule();
    table.add_row({"Total", fmt::format("{} capacitors", r.totals.capacitor_count), "", "", "", "", "", "", "",
                   fmt::format("{:.3g}{}", r.totals.cost, r.totals.cost_complete ? "" : "+"),
                   fmt::format("{:.3g} mm^2{}", r.totals.area * 1e6, r.totals.area_complete ? "" : "+")});
    out += table.render(colour);
  }
  for (const auto& w : p.warnings) line("  " + paint("warning: " + w, Tone::warning, colour));

  line("");
  line("Wrote " + run.files.html.string());
  line("      " + run.files.json.string());
  line("      " + run.files.csv.string());
  line("      " + run.files.svg.string());
  line(paint(kCaution, Tone::warning, colour));
  return out;
}

}  // namespace quietrail::cli
