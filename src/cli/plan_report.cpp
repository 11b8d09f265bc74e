// SPDX-License-Identifier: MIT
// Rendering a finished plan for people and scripts: the planned project and BOM CSV, the plan
// JSON, the front plot, the HTML page and the terminal summary. The numbers come from
// run_plan, the project and the check of the planned design; nothing is computed twice.
#include "cli/plan_report.hpp"
#include "cli/ratio_text.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdlib>
#include <optional>
#include <string_view>
#include <system_error>
#include <variant>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "cli/terminal.hpp"
#include "quietrail/error.hpp"
#include "quietrail/report/escape.hpp"
#include "quietrail/report/html_report.hpp"
#include "quietrail/report/svg_plot.hpp"
#include "quietrail/units.hpp"

namespace quietrail::cli {
namespace {

namespace fs = std::filesystem;
// Ordered, so the JSON reads in the order it is built and a project keeps its key order.
using Json = nlohmann::ordered_json;

Json number(double value) { return std::isfinite(value) ? Json(value) : Json(nullptr); }

std::string mm2_text(double area) { return fmt::format("{:.4g} mm^2", area * 1e6); }

// "100 nF" -> "100nF": the CSV reader's value tokens carry no space.
std::string compact(std::string text) {
  text.erase(std::remove(text.begin(), text.end(), ' '), text.end());
  return text;
}

// An objective value in its own unit: relative cost, parts, or mm^2.
std::string objective_text(PlanObjective objective, double value) {
  if (!std::isfinite(value)) return "-";
  switch (objective) {
    case PlanObjective::cost: return fmt::format("{:.4g}", value);
    case PlanObjective::count: return fmt::format("{:.0f}", value);
    case PlanObjective::area: return mm2_text(value);
  }
  return {};
}

// The objective as a plot abscissa: area in mm^2 so the axis needs no prefix on m^2.
double objective_axis(PlanObjective objective, double value) {
  return objective == PlanObjective::area ? value * 1e6 : value;
}

std::string objective_axis_label(PlanObjective objective) {
  switch (objective) {
    case PlanObjective::cost: return "Relative cost";
    case PlanObjective::count: return "Parts placed";
    case PlanObjective::area: return "Footprint area (mm\xC2\xB2)";  // U+00B2: the SVG is UTF-8
  }
  return {};
}

std::optional<double> effective_capacitance(const PlanCandidate& c) {
  if (const auto* cap = std::get_if<Capacitor>(&c.part.element)) return cap->capacitance;
  return std::nullopt;
}

const PlanCandidateFacts* facts_of(const PlanRun& run, std::size_t k) {
  const auto& plan = run.project.plan;
  if (!plan || k >= plan->candidate_facts.size()) return nullptr;
  return &plan->candidate_facts[k];
}

std::string mounting_source(const PlanRun& run, std::size_t k) {
  const PlanCandidateFacts* f = facts_of(run, k);
  return f ? f->mounting_source : std::string();
}

// The candidates a selection places (count > 0), as indices.
std::vector<std::size_t> chosen(const Selection& s) {
  std::vector<std::size_t> out;
  for (std::size_t k = 0; k < s.counts.size(); ++k)
    if (s.counts[k] > 0) out.push_back(k);
  return out;
}

// A path that names `target` from inside `directory`: relative where one exists.
std::string path_from(const fs::path& directory, const std::string& target) {
  // Both absolute first: weakly_canonical keeps a path relative when no part of it exists
  // yet (a new output directory), and a relative base gives no relative path.
  std::error_code error;
  const fs::path absolute = fs::absolute(target, error).lexically_normal();
  if (error) return target;
  const fs::path base = fs::absolute(directory, error);
  if (error) return absolute.generic_string();
  const fs::path relative = fs::relative(absolute, base, error);
  if (!error && !relative.empty()) return relative.generic_string();
  return absolute.generic_string();
}

// The mounting inductance of one copy, or where it went when the part's ESL includes it.
std::string mounting_text(const PlanRun& run, std::size_t k) {
  const double l = run.problem.candidates[k].part.mounting_inductance;
  if (l == 0.0 && mounting_source(run, k).find("ESL") != std::string::npos) return "in ESL";
  return format_value(l, "H", 3);
}

// The result's message without its leading "<status>: ", which the status heading says.
std::string message_after_status(const PlanResult& r) {
  const std::string prefix = std::string(to_string(r.status)) + ": ";
  return r.message.rfind(prefix, 0) == 0 ? r.message.substr(prefix.size()) : r.message;
}

const char* status_heading(PlanStatus status) {
  switch (status) {
    case PlanStatus::optimal: return "OPTIMAL";
    case PlanStatus::feasible: return "FEASIBLE";
    case PlanStatus::infeasible: return "INFEASIBLE";
  }
  return "";
}

std::string worst_text(const Selection& s) {
  return fmt::format("worst |Z|/Z_target {} ({}) at {}{}", ratio_text(s.worst_ratio), db_text(s.worst_ratio),
                     format_value(s.worst_frequency, "Hz", 4), s.verified ? " (refined peaks, verified)" : "");
}

// The objective as a noun for headings and plot titles ("Cost against margin").
std::string objective_noun(PlanObjective objective) {
  switch (objective) {
    case PlanObjective::cost: return "cost";
    case PlanObjective::count: return "parts";
    case PlanObjective::area: return "area";
  }
  return {};
}

std::string front_heading(PlanObjective objective) {
  std::string text = objective_noun(objective) + " against margin";
  text[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(text[0])));
  return text;
}

std::string bound_text(const PlanRun& run) {
  const PlanResult& r = run.result;
  if (r.status == PlanStatus::infeasible) return "no selection within the limits meets the target";
  if (r.status == PlanStatus::optimal) {
    switch (run.problem.objective) {
      case PlanObjective::cost: return "proven optimal: no selection within the limits costs less";
      case PlanObjective::count: return "proven optimal: no selection within the limits has fewer parts";
      case PlanObjective::area: return "proven optimal: no selection within the limits takes less area";
    }
  }
  return fmt::format("search stopped at its node limit; best bound {}, gap {:.3g} %",
                     objective_text(run.problem.objective, r.bound), 100.0 * r.gap);
}

Json selection_summary_json(const PlanProblem& problem, const Selection& s) {
  Json counts = Json::object();
  for (const std::size_t k : chosen(s)) counts[problem.candidates[k].name] = s.counts[k];
  return Json{{"counts", counts},
              {"objective", number(s.objective)},
              {"cost", number(s.cost)},
              {"count", s.count},
              {"area_m2", number(s.area)},
              {"worst_ratio", number(s.worst_ratio)},
              {"worst_ratio_db", s.worst_ratio > 0.0 ? number(db(s.worst_ratio)) : Json(nullptr)},
              {"worst_frequency_hz", number(s.worst_frequency)},
              {"verified", s.verified}};
}

// Rows of the front that found a selection, in the order searched (margin asked).
std::vector<const FrontPoint*> found_front(const PlanResult& r) {
  std::vector<const FrontPoint*> out;
  for (const auto& point : r.front)
    if (point.selection) out.push_back(&point);
  return out;
}

// "dB of margin per unit of objective" from the previous found point, "-" for the first.
std::vector<std::string> margin_rates(const PlanRun& run, const std::vector<const FrontPoint*>& points) {
  std::vector<std::string> out;
  for (std::size_t i = 0; i < points.size(); ++i) {
    if (i == 0) {
      out.emplace_back("-");
      continue;
    }
    const double dx = objective_axis(run.problem.objective, points[i]->selection->objective) -
                      objective_axis(run.problem.objective, points[i - 1]->selection->objective);
    const double dy = points[i]->achieved_margin_db - points[i - 1]->achieved_margin_db;
    out.push_back(dx != 0.0 && std::isfinite(dx) ? fmt::format("{:.3g}", dy / dx) : std::string("-"));
  }
  return out;
}

// What an alternative changes against the chosen parts: "+1 x a, -1 x b" (`times` and
// `minus` let the HTML use the proper signs; part ids hold an "x" of their own).
std::string change_text(const PlanProblem& problem, const Selection& chosen_parts, const Selection& s,
                        std::string_view times, std::string_view minus) {
  std::string out;
  for (std::size_t k = 0; k < problem.candidates.size(); ++k) {
    const int from = k < chosen_parts.counts.size() ? chosen_parts.counts[k] : 0;
    const int to = k < s.counts.size() ? s.counts[k] : 0;
    if (from == to) continue;
    out.append(out.empty() ? "" : ", ")
        .append(to > from ? std::string_view("+") : minus)
        .append(std::to_string(std::abs(to - from)))
        .append(times)
        .append(problem.candidates[k].name);
  }
  return out.empty() ? std::string("the chosen parts") : out;
}

// ---------------------------------------------------------------- HTML cells
// The page is UTF-8 and read in a browser: a no-break space keeps "4.85 mΩ" on one line in
// narrow table columns, ohm is written Ω and micro µ (as on the plot axes), area in mm².
constexpr std::string_view kNoBreakSpace = "\xC2\xA0";
constexpr std::string_view kTimes = " \xC3\x97 ";  // U+00D7 multiplication sign
constexpr std::string_view kMinus = "\xE2\x88\x92";  // U+2212 minus sign

std::string html_value(double value, std::string_view unit, int digits) {
  std::string text = format_value(value, unit, digits);
  const std::size_t space = text.find(' ');
  if (space == std::string::npos) return text;
  std::string symbol = text.substr(space + 1);  // prefix and unit, e.g. "uF", "mohm"
  if (symbol.size() == unit.size() + 1 && symbol[0] == 'u') symbol.replace(0, 1, "\xC2\xB5");  // U+00B5
  if (unit == "ohm" && symbol.ends_with("ohm")) symbol.replace(symbol.size() - 3, 3, "\xCE\xA9");  // U+03A9
  return text.substr(0, space).append(kNoBreakSpace).append(symbol);
}

std::string html_optional(const std::optional<double>& value, std::string_view unit, int digits) {
  return value && std::isfinite(*value) ? html_value(*value, unit, digits) : std::string("-");
}

std::string html_area(double area) {
  return fmt::format("{:.4g}", area * 1e6).append(kNoBreakSpace).append("mm\xC2\xB2");  // U+00B2
}

// A selection's three measures with the objective's first, so each table leads with what
// was minimised: headers, then the cells of one selection.
std::vector<std::string> measure_headers(PlanObjective objective) {
  switch (objective) {
    case PlanObjective::cost: return {"Cost", "Parts", "Area"};
    case PlanObjective::count: return {"Parts", "Cost", "Area"};
    case PlanObjective::area: return {"Area", "Cost", "Parts"};
  }
  return {};
}

std::vector<std::string> measure_cells(PlanObjective objective, double cost, int count, double area) {
  const std::string c = fmt::format("{:.4g}", cost);
  const std::string n = std::to_string(count);
  const std::string a = html_area(area);
  switch (objective) {
    case PlanObjective::cost: return {c, n, a};
    case PlanObjective::count: return {n, c, a};
    case PlanObjective::area: return {a, c, n};
  }
  return {};
}

std::string objective_goal(PlanObjective objective) {
  switch (objective) {
    case PlanObjective::cost: return "least relative cost";
    case PlanObjective::count: return "fewest parts";
    case PlanObjective::area: return "least footprint area";
  }
  return {};
}

std::string margin_gain_header(PlanObjective objective) {
  switch (objective) {
    case PlanObjective::cost: return "Margin gained per unit of cost";
    case PlanObjective::count: return "Margin gained per part";
    case PlanObjective::area: return "Margin gained per mm\xC2\xB2";
  }
  return {};
}

// True when some candidate's name differs from its library id (a "<id>_plan" rename), so
// the tables need both columns.
bool names_differ(const PlanProblem& problem) {
  return std::any_of(problem.candidates.begin(), problem.candidates.end(),
                     [](const PlanCandidate& c) { return c.name != c.library_id && !c.library_id.empty(); });
}

// mounting_text for the page: the value in the HTML's form, or "in ESL".
std::string mounting_html(const PlanRun& run, std::size_t k) {
  const std::string text = mounting_text(run, k);
  return text == "in ESL" ? text : html_value(run.problem.candidates[k].part.mounting_inductance, "H", 3);
}

std::string part_text(const PlanCandidate& c) { return c.library_id.empty() ? c.name : c.library_id; }

}  // namespace

// ---------------------------------------------------------------- planned project and BOM

std::string planned_project_json(std::string_view input_text, const Project& project, const PlanProblem& problem,
                                 const std::vector<int>& counts, const fs::path& directory) {
  QUIETRAIL_ASSERT(counts.size() == problem.candidates.size());
  // The reader has accepted this text already (no duplicate keys, valid JSON).
  Json doc = Json::parse(input_text);
  Json bom = doc.contains("bom") ? doc["bom"] : Json::array();
  for (std::size_t k = 0; k < counts.size(); ++k) {
    if (counts[k] <= 0) continue;
    const PlanCandidate& c = problem.candidates[k];
    QUIETRAIL_ASSERT(!c.library_id.empty());  // the project reader takes candidates from libraries only
    bom.push_back(Json{{"part", c.library_id}, {"count", counts[k]}});
  }
  doc["bom"] = std::move(bom);
  if (doc.contains("libraries")) {
    Json libraries = Json::array();
    for (const auto& library : project.libraries) libraries.push_back(path_from(directory, library));
    doc["libraries"] = std::move(libraries);
  }
  if (doc.contains("bom_csv")) doc["bom_csv"] = path_from(directory, project.bom_csv);
  return doc.dump(2) + "\n";
}

std::string planned_bom_csv(const PlanRun& run) {
  const PlanProblem& problem = run.problem;
  std::string out = "Qty,Value,Package,Dielectric,Voltage,Library ID\n";
  for (const std::size_t k : chosen(run.result.best)) {
    const PlanCandidate& c = problem.candidates[k];
    const PlanCandidateFacts* f = facts_of(run, k);
    const std::string value = c.nominal_capacitance > 0.0 ? compact(format_value(c.nominal_capacitance, "F", 3)) : "";
    const std::string package = f ? f->package : std::string();
    const std::string dielectric = f && f->dielectric != Dielectric::none ? std::string(to_string(f->dielectric)) : "";
    const std::string voltage = f && f->rated_voltage > 0.0 ? compact(format_value(f->rated_voltage, "V", 3)) : "";
    out += fmt::format("{},{},{},{},{},{}\n", run.result.best.counts[k], escape_csv_cell(value),
                       escape_csv_cell(package), escape_csv_cell(dielectric), escape_csv_cell(voltage),
                       escape_csv_cell(c.library_id));
  }
  return out;
}

// ---------------------------------------------------------------- JSON

std::string plan_json(const PlanRun& run) {
  const PlanProblem& problem = run.problem;
  const PlanResult& r = run.result;
  const Selection& best = r.best;

  Json parts = Json::array();
  for (const std::size_t k : chosen(best)) {
    const PlanCandidate& c = problem.candidates[k];
    const int n = best.counts[k];
    parts.push_back(Json{{"name", c.name},
                         {"library_id", c.library_id},
                         {"description", c.description},
                         {"count", n},
                         {"cost_each", number(c.cost)},
                         {"cost_total", number(c.cost * n)},
                         {"area_each_m2", number(c.area)},
                         {"area_total_m2", number(c.area * n)},
                         {"mounting_inductance_h", number(c.part.mounting_inductance)},
                         {"mounting_source", mounting_source(run, k)},
                         {"nominal_capacitance_f", c.nominal_capacitance > 0.0 ? number(c.nominal_capacitance) : Json(nullptr)},
                         {"effective_capacitance_f",
                          effective_capacitance(c) ? number(*effective_capacitance(c)) : Json(nullptr)}});
  }

  Json alternatives = Json::array();
  for (const auto& s : r.alternatives) alternatives.push_back(selection_summary_json(problem, s));

  Json front = Json::array();
  for (const auto& point : r.front) {
    const Selection* s = point.selection ? &*point.selection : nullptr;
    front.push_back(Json{{"margin_db", number(point.margin_db)},
                         {"found", s != nullptr},
                         {"achieved_margin_db", s ? number(point.achieved_margin_db) : Json(nullptr)},
                         {"objective", s ? number(s->objective) : Json(nullptr)},
                         {"cost", s ? number(s->cost) : Json(nullptr)},
                         {"count", s ? Json(s->count) : Json(nullptr)},
                         {"area_m2", s ? number(s->area) : Json(nullptr)},
                         {"worst_ratio", s ? number(s->worst_ratio) : Json(nullptr)},
                         {"counts", s ? selection_summary_json(problem, *s)["counts"] : Json(nullptr)},
                         {"proven", point.proven},
                         {"bound", number(point.bound)}});
  }

  Json infeasibility = nullptr;
  if (r.infeasibility) {
    const Infeasibility& inf = *r.infeasibility;
    Json bands = Json::array();
    for (const auto& b : inf.bands)
      bands.push_back(Json{{"start_hz", number(b.start)},
                           {"stop_hz", number(b.stop)},
                           {"floor_ratio", number(b.floor_ratio)},
                           {"frequency_hz", number(b.frequency)},
                           {"limit", b.limit},
                           {"reason", b.reason}});
    infeasibility = Json{{"best_ratio", number(inf.best_ratio)},
                         {"ratio_lower_bound", number(inf.ratio_lower_bound)},
                         {"proven", inf.proven},
                         {"bands", bands}};
  }

  Json candidates = Json::array();
  for (std::size_t k = 0; k < problem.candidates.size(); ++k) {
    const PlanCandidate& c = problem.candidates[k];
    const PlanCandidateFacts* f = facts_of(run, k);
    candidates.push_back(Json{
        {"name", c.name},
        {"library_id", c.library_id},
        {"description", c.description},
        {"source", f ? f->source : std::string()},
        {"family", f ? f->family : std::string()},
        {"package", f ? f->package : std::string()},
        {"dielectric", f && f->dielectric != Dielectric::none ? Json(std::string(to_string(f->dielectric))) : Json(nullptr)},
        {"rated_voltage_v", f && f->rated_voltage > 0.0 ? number(f->rated_voltage) : Json(nullptr)},
        {"max_count", c.max_count},
        {"cost_each", number(c.cost)},
        {"area_each_m2", number(c.area)},
        {"nominal_capacitance_f", c.nominal_capacitance > 0.0 ? number(c.nominal_capacitance) : Json(nullptr)},
        {"effective_capacitance_f", effective_capacitance(c) ? number(*effective_capacitance(c)) : Json(nullptr)},
        {"mounting_inductance_h", number(c.part.mounting_inductance)},
        {"mounting_source", mounting_source(run, k)}});
  }

  const PlanSection* section = run.project.plan ? &*run.project.plan : nullptr;
  const PlanStats& st = r.stats;
  const Json report{
      {"project", run.project.name},
      {"description", run.project.description},
      {"file", run.input.string()},
      {"status", to_string(r.status)},
      {"message", r.message},
      {"objective", to_string(problem.objective)},
      {"impedance_margin_db", problem.margin_db},
      {"seed", run.options.seed},
      {"options",
       {{"alternatives", run.options.alternatives},
        {"node_limit", run.options.node_limit},
        {"heuristic_rounds", run.options.heuristic_rounds},
        {"front_margins_db", run.options.front_margins_db},
        {"guide_node_limit", run.options.guide_node_limit},
        {"max_rounds", run.options.max_rounds}}},
      {"limits",
       {{"max_total", problem.limits.max_total ? Json(*problem.limits.max_total) : Json(nullptr)},
        {"max_area_m2", problem.limits.max_area ? number(*problem.limits.max_area) : Json(nullptr)}}},
      {"best",
       {{"parts", parts},
        {"objective", number(best.objective)},
        {"worst_ratio", number(best.worst_ratio)},
        {"worst_ratio_db", best.worst_ratio > 0.0 ? number(db(best.worst_ratio)) : Json(nullptr)},
        {"worst_frequency_hz", number(best.worst_frequency)},
        {"verified", best.verified},
        {"totals",
         {{"cost", number(best.cost)},
          {"area_m2", number(best.area)},
          {"count", best.count},
          {"fixed_cost", number(problem.fixed_cost)},
          {"fixed_area_m2", number(problem.fixed_area)},
          {"fixed_count", problem.fixed_count},
          {"cost_with_fixed", number(best.cost + problem.fixed_cost)},
          {"area_with_fixed_m2", number(best.area + problem.fixed_area)},
          {"count_with_fixed", best.count + problem.fixed_count}}}}},
      {"bound", number(r.bound)},
      {"gap", number(r.gap)},
      {"alternatives", alternatives},
      {"front", front},
      {"infeasibility", infeasibility},
      {"added_frequencies_hz", r.added_frequencies},
      {"stats",
       {{"nodes", st.nodes},
        {"moves", st.moves},
        {"rounds", st.rounds},
        {"frequencies", st.frequencies},
        {"candidates", st.candidates}}},
      {"candidates", candidates},
      {"notes", section ? section->notes : std::vector<std::string>{}},
      {"warnings", section ? section->warnings : std::vector<std::string>{}},
      {"files",
       {{"planned_project", run.files.planned_project.string()},
        {"planned_bom_csv", run.files.planned_bom.string()},
        {"plan_json", run.files.plan_json.string()},
        {"front_svg", r.status == PlanStatus::infeasible ? Json(nullptr) : Json(run.files.front_svg.string())},
        {"impedance_svg", run.files.impedance_svg.string()},
        {"curves_csv", run.files.curves_csv.string()},
        {"html", run.files.html.string()}}},
      {"caution", kCaution},
      {"check", Json::parse(check_json(run.planned))}};
  return report.dump(2) + "\n";
}

// ---------------------------------------------------------------- front SVG

std::string front_svg(const PlanRun& run) {
  const PlanObjective objective = run.problem.objective;
  std::vector<const FrontPoint*> points = found_front(run.result);
  std::sort(points.begin(), points.end(), [](const FrontPoint* a, const FrontPoint* b) {
    return a->selection->objective < b->selection->objective;
  });

  PlotSeries front{.name = objective_goal(objective) + " for each margin", .x = {}, .y = {},
                   .style = PlotSeries::Style::total};
  std::vector<PlotMarker> markers;
  double x_low = 0.0, x_high = 0.0, y_low = 1.0, y_high = 1.0;
  for (const FrontPoint* p : points) {
    const double x = objective_axis(objective, p->selection->objective);
    const double y = p->selection->worst_ratio;
    front.x.push_back(x);
    front.y.push_back(y);
    markers.push_back(PlotMarker{.x = x,
                                 .y = y,
                                 // The margin achieved: short, so labels clear the line;
                                 // the margin asked is in the table below the plot.
                                 .label = fmt::format("{:.1f} dB", p->achieved_margin_db),
                                 .violation = y > 1.0});
    if (!(x > 0.0) || !std::isfinite(x) || !(y > 0.0) || !std::isfinite(y)) continue;
    x_low = x_low > 0.0 ? std::min(x_low, x) : x;
    x_high = std::max(x_high, x);
    y_low = std::min(y_low, y);
    y_high = std::max(y_high, y);
  }
  PlotOptions options;
  options.title = run.project.name + ": worst |Z|/Z_target against " + objective_noun(objective);
  options.id = "plan-front";
  options.x_label = objective_axis_label(objective);
  options.x_unit = "";
  options.y_label = "worst |Z|/Z_target";
  options.y_unit = "";  // a ratio: plain tick numbers (0.5, 1, 2)
  options.marker_legend = "selection found (its margin in dB)";
  options.violation_legend = "selection above the target";
  // Room around the points, so markers at the ends stay inside; a single point still gets a span.
  if (x_high > 0.0) {
    options.x_min = x_low / 1.25;
    options.x_max = x_high * 1.25;
  }
  options.y_min = y_low / 1.6;
  options.y_max = y_high * 1.6;

  // The target: ratio 1 across the plot, the region above it shaded.
  const double x0 = options.x_min.value_or(1.0), x1 = options.x_max.value_or(10.0);
  PlotSeries target{.name = "target (ratio 1)", .x = {x0, x1}, .y = {1.0, 1.0}, .style = PlotSeries::Style::target_mask};
  return render_svg_loglog({target, front}, markers, options);
}

// ---------------------------------------------------------------- HTML

std::string plan_html(const PlanRun& run, const std::string& front, const std::string& impedance) {
  const PlanProblem& problem = run.problem;
  const PlanResult& r = run.result;
  const Selection& best = r.best;
  const PlanObjective objective = problem.objective;
  using Align = HtmlReport::Align;
  using RowTone = HtmlReport::RowTone;
  const bool with_names = names_differ(problem);
  const auto measures = measure_headers(objective);

  HtmlReport page("Plan of " + run.project.name);
  std::string verdict = r.message;
  if (!verdict.empty()) verdict[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(verdict[0])));
  page.add_verdict(r.status != PlanStatus::infeasible, verdict + ".");
  page.add_caution(kCaution);
  if (!run.project.description.empty()) page.add_paragraph(run.project.description);

  page.add_heading(r.status == PlanStatus::infeasible ? "Best selection found (does not meet the target)"
                                                      : "Chosen parts");
  if (chosen(best).empty()) {
    page.add_paragraph("No part added: the fixed network alone is the answer.");
  } else {
    // The parts to place, as a BOM reads: what each is and what it costs; where each
    // mounting value came from is in the candidate list below.
    std::vector<std::string> headers{"Part"};
    if (with_names) headers.emplace_back("Name");
    headers.insert(headers.end(), {"Count", "C nominal", "C effective", "Mounting", "Cost each", "Cost", "Area"});
    std::vector<Align> align{Align::left};
    if (with_names) align.push_back(Align::left);
    align.insert(align.end(), 7, Align::right);
    std::vector<std::vector<std::string>> rows;
    for (const std::size_t k : chosen(best)) {
      const PlanCandidate& c = problem.candidates[k];
      const int n = best.counts[k];
      std::vector<std::string> row{part_text(c)};
      if (with_names) row.push_back(c.name);
      row.insert(row.end(), {std::to_string(n),
                             c.nominal_capacitance > 0.0 ? html_value(c.nominal_capacitance, "F", 3) : "-",
                             html_optional(effective_capacitance(c), "F", 3), mounting_html(run, k),
                             fmt::format("{:.4g}", c.cost), fmt::format("{:.4g}", c.cost * n), html_area(c.area * n)});
      rows.push_back(std::move(row));
    }
    std::vector<std::string> total{"Total added"};
    if (with_names) total.emplace_back();
    total.insert(total.end(), {std::to_string(best.count), "", "", "", "", fmt::format("{:.4g}", best.cost),
                               html_area(best.area)});
    rows.push_back(std::move(total));
    page.add_table(headers, rows, {}, align);
    page.add_paragraph(
        "C effective: the capacitance at the rail's DC voltage and temperature (derated). Mounting: the inductance "
        "the mounting adds to each copy, or \"in ESL\" when the part's ESL already includes it. Cost is relative, "
        "in the part library's units; area is the footprint.");
  }
  page.add_heading("Totals");
  {
    std::vector<std::pair<std::string, std::string>> facts{
        {"Objective", r.status == PlanStatus::infeasible
                          ? objective_goal(objective) + ", among selections that meet the target; none does, so "
                                                        "this is the selection found closest to it"
                          : objective_goal(objective) + ": " +
                                (objective == PlanObjective::area ? html_area(best.objective)
                                                                  : objective_text(objective, best.objective))},
        {"Added parts", fmt::format("{} parts, cost {:.4g}, area {}", best.count, best.cost, html_area(best.area))}};
    if (problem.fixed_count > 0) {
      facts.emplace_back("Fixed parts at the board node",
                         fmt::format("{} parts, cost {:.4g}, area {}", problem.fixed_count, problem.fixed_cost,
                                     html_area(problem.fixed_area)));
      facts.emplace_back("With the fixed parts",
                         fmt::format("{} parts, cost {:.4g}, area {}", best.count + problem.fixed_count,
                                     best.cost + problem.fixed_cost, html_area(best.area + problem.fixed_area)));
    }
    facts.emplace_back("Worst |Z|/Z_target",
                       fmt::format("{} ({}) at {}{}", ratio_text(best.worst_ratio), db_text(best.worst_ratio),
                                   html_value(best.worst_frequency, "Hz", 4),
                                   best.verified ? ", on refined peaks (verified)" : ""));
    facts.emplace_back("Search", bound_text(run));
    page.add_key_values(facts);
  }

  if (!r.alternatives.empty()) {
    page.add_heading("Alternatives");
    std::vector<std::string> headers{"#"};
    headers.insert(headers.end(), measures.begin(), measures.end());
    headers.insert(headers.end(), {"Worst ratio", "Change from the chosen parts"});
    std::vector<std::vector<std::string>> rows;
    for (std::size_t i = 0; i < r.alternatives.size(); ++i) {
      const Selection& s = r.alternatives[i];
      std::vector<std::string> row{std::to_string(i + 1)};
      const auto cells = measure_cells(objective, s.cost, s.count, s.area);
      row.insert(row.end(), cells.begin(), cells.end());
      row.insert(row.end(), {ratio_text(s.worst_ratio), change_text(problem, best, s, kTimes, kMinus)});
      rows.push_back(std::move(row));
    }
    page.add_table(headers, rows, {},
                   {Align::right, Align::right, Align::right, Align::right, Align::right, Align::left});
    page.add_paragraph(
        fmt::format("Ranked by {}. {} Each selection's full counts are in the plan JSON.", to_string(objective),
                    r.status == PlanStatus::optimal
                        ? "The search was complete: these are the best distinct selections there are."
                        : "The search stopped at its node limit: better selections may exist."));
  }

  if (r.status != PlanStatus::infeasible) {
    page.add_heading(front_heading(objective));
    if (!front.empty())
      page.add_svg(front, "Each point is the selection of " + objective_goal(objective) +
                              " found for a margin asked below the target, labelled with the margin it achieves; "
                              "the shaded region lies above the target.");
    const auto points = found_front(r);
    const auto rates = margin_rates(run, points);
    std::vector<std::string> headers{"Margin asked", "Achieved"};
    headers.insert(headers.end(), measures.begin(), measures.end());
    headers.insert(headers.end(), {"Worst ratio", margin_gain_header(objective), "Proven"});
    std::vector<std::vector<std::string>> rows;
    std::size_t found = 0;
    for (const auto& point : r.front) {
      std::vector<std::string> row{fmt::format("{:g}{}dB", point.margin_db, kNoBreakSpace)};
      if (!point.selection) {
        row.insert(row.end(), {"none found", "-", "-", "-", "-", "-"});
      } else {
        const Selection& s = *point.selection;
        row.push_back(fmt::format("{:.2f}{}dB", point.achieved_margin_db, kNoBreakSpace));
        const auto cells = measure_cells(objective, s.cost, s.count, s.area);
        row.insert(row.end(), cells.begin(), cells.end());
        const std::string& rate = rates[found++];
        row.push_back(ratio_text(s.worst_ratio));
        row.push_back(rate == "-" ? rate : rate + std::string(kNoBreakSpace) + "dB");
      }
      row.push_back(point.proven ? "yes" : "no");
      rows.push_back(std::move(row));
    }
    page.add_table(headers, rows, {},
                   {Align::right, Align::right, Align::right, Align::right, Align::right, Align::right, Align::right,
                    Align::left});
    page.add_paragraph(margin_gain_header(objective) +
                       ": from the point above to this one; it falls as margin grows dearer. Proven: the search for "
                       "that margin was complete.");
  }

  if (r.infeasibility) {
    const Infeasibility& inf = *r.infeasibility;
    page.add_heading("Why the target cannot be met");
    page.add_paragraph(fmt::format(
        "Best worst |Z|/Z_target found within the limits: {} ({}). No selection within the limits can do better "
        "than {} (a relaxation bound). {}",
        ratio_text(inf.best_ratio), db_text(inf.best_ratio), ratio_text(inf.ratio_lower_bound),
        inf.proven ? "The search was complete: no selection within the limits meets the target."
                   : "The search did not finish, so a selection that meets the target may still exist."));
    if (inf.bands.empty()) {
      page.add_paragraph("No single frequency is out of reach: the parts that hold one frequency spoil another.");
    } else {
      std::vector<std::vector<std::string>> rows;
      for (const auto& b : inf.bands)
        rows.push_back({html_value(b.start, "Hz", 3), html_value(b.stop, "Hz", 3), ratio_text(b.floor_ratio),
                        html_value(b.frequency, "Hz", 3), b.limit, b.reason});
      page.add_table({"From", "To", "Best possible ratio", "At", "Limited by", "Why"}, rows,
                     std::vector<RowTone>(rows.size(), RowTone::fail),
                     {Align::right, Align::right, Align::right, Align::right, Align::left, Align::left});
    }
  }

  page.add_heading("Candidates");
  {
    std::vector<std::string> headers{"Part"};
    if (with_names) headers.emplace_back("Name");
    headers.insert(headers.end(), {"Description", "Chosen", "Cost each", "Area each", "Mounting"});
    std::vector<Align> align{Align::left};
    if (with_names) align.push_back(Align::left);
    align.insert(align.end(), {Align::left, Align::right, Align::right, Align::right, Align::right});
    std::vector<std::vector<std::string>> rows;
    std::vector<RowTone> tones;
    for (std::size_t k = 0; k < problem.candidates.size(); ++k) {
      const PlanCandidate& c = problem.candidates[k];
      const int n = best.counts.size() > k ? best.counts[k] : 0;
      std::vector<std::string> row{part_text(c)};
      if (with_names) row.push_back(c.name);
      row.insert(row.end(), {c.description, fmt::format("{} of {}", n, c.max_count), fmt::format("{:.4g}", c.cost),
                             html_area(c.area), mounting_html(run, k)});
      rows.push_back(std::move(row));
      tones.push_back(n > 0 ? RowTone::pass : RowTone::muted);
    }
    page.add_table(headers, rows, tones, align);
    // Where the mounting values came from, once per source rather than a wide column that
    // would squeeze the part ids (the plan JSON has it per candidate).
    std::vector<std::pair<std::string, int>> sources;
    for (std::size_t k = 0; k < problem.candidates.size(); ++k) {
      const std::string source = mounting_source(run, k);
      if (source.empty()) continue;
      const auto it = std::find_if(sources.begin(), sources.end(), [&](const auto& s) { return s.first == source; });
      if (it == sources.end()) sources.emplace_back(source, 1);
      else ++it->second;
    }
    if (!sources.empty()) {
      std::string text = "Mounting inductance from:";
      for (std::size_t i = 0; i < sources.size(); ++i)
        text += fmt::format("{} {} ({} candidate{})", i == 0 ? "" : ";", sources[i].first, sources[i].second,
                            sources[i].second == 1 ? "" : "s");
      page.add_paragraph(text + ".");
    }
  }
  if (run.project.plan && !run.project.plan->warnings.empty()) {
    page.add_heading("Warnings", 3);
    std::string text;
    for (const auto& w : run.project.plan->warnings) text.append(text.empty() ? "" : "\n").append(w);
    page.add_paragraph(text);
  }

  // The planned design as `quietrail check` sees it (the same run_check, read back from
  // the planned project file).
  const CheckResult& check = run.planned.result;
  page.add_heading("The planned design, checked");
  std::string checked = check.message;
  if (!checked.empty()) checked[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(checked[0])));
  page.add_paragraph(fmt::format("{}. Project file: {} (run `quietrail check` on it to reproduce this).", checked,
                                 run.files.planned_project.string()));
  page.add_svg(impedance, "The planned design: refined peaks are marked; the shaded region lies above the target. "
                          "Thin lines are single branches (all copies).");
  if (!check.exceeded.empty()) {
    std::vector<std::vector<std::string>> rows;
    for (const auto& b : check.exceeded)
      rows.push_back({html_value(b.start, "Hz", 3), html_value(b.stop, "Hz", 3), ratio_text(b.worst_ratio),
                      db_text(b.worst_ratio), html_value(b.worst_frequency, "Hz", 3)});
    page.add_heading("Where the target is exceeded", 3);
    page.add_table({"From", "To", "Worst ratio", "dB", "At"}, rows, std::vector<RowTone>(rows.size(), RowTone::fail),
                   {Align::right, Align::right, Align::right, Align::right, Align::right});
  }
  if (!check.peaks.empty()) {
    page.add_heading("Peaks", 3);
    std::vector<std::vector<std::string>> rows;
    std::vector<RowTone> tones;
    for (std::size_t i = 0; i < check.peaks.size(); ++i) {
      const Peak& k = check.peaks[i];
      const PeakAttribution* a = i < check.attributions.size() ? &check.attributions[i] : nullptr;
      rows.push_back({html_value(k.frequency, "Hz", 4), html_value(k.magnitude, "ohm", 3),
                      html_value(k.target, "ohm", 3), ratio_text(k.ratio), a ? a->explanation : std::string("-")});
      tones.push_back(k.ratio > 1.0 ? RowTone::fail : RowTone::plain);
    }
    page.add_table({"Frequency", "|Z|", "Target", "Ratio", "Formed by"}, rows, tones,
                   {Align::right, Align::right, Align::right, Align::right, Align::left});
  }
  {
    page.add_heading("Parts of the planned design", 3);
    std::vector<std::vector<std::string>> rows;
    std::vector<RowTone> tones;
    for (const auto& row : check.parts) {
      // The part column only when it says more than the name (a library id that differs,
      // or a description such as "plane pair").
      const std::string part = row.library_id.empty() ? row.description : row.library_id;
      rows.push_back({row.name, part == row.name ? std::string() : part, std::to_string(row.count),
                      html_optional(row.effective_capacitance, "F", 3), html_optional(row.esr, "ohm", 3),
                      html_optional(row.esl, "H", 3),
                      row.mounting_inductance > 0.0 ? html_value(row.mounting_inductance, "H", 3) : "-",
                      html_optional(row.srf, "Hz", 3), row.cost_total ? fmt::format("{:.4g}", *row.cost_total) : "-",
                      row.area_total ? html_area(*row.area_total) : "-"});
      tones.push_back(row.kind == "capacitor" ? RowTone::plain : RowTone::muted);
    }
    page.add_table({"Name", "Part", "Count", "C effective", "ESR", "ESL", "Mounting", "SRF mounted", "Cost", "Area"},
                   rows, tones,
                   {Align::left, Align::left, Align::right, Align::right, Align::right, Align::right, Align::right,
                    Align::right, Align::right, Align::right});
  }

  page.add_heading("Notes");
  {
    std::string text = "Project file: " + run.input.string();
    text += fmt::format("\nObjective {}; seed {}; {} alternatives kept; node limit {}.", to_string(objective),
                        run.options.seed, run.options.alternatives, run.options.node_limit);
    text += fmt::format("\nSearch: {} branch-and-bound nodes, {} heuristic moves, {} search-verify rounds, {} "
                        "frequencies, {} candidates.",
                        r.stats.nodes, r.stats.moves, r.stats.rounds, r.stats.frequencies, r.stats.candidates);
    if (!r.added_frequencies.empty()) {
      text += "\nFrequencies added after verification:";
      for (double f : r.added_frequencies) text += " " + html_value(f, "Hz", 4);
    }
    if (run.project.plan)
      for (const auto& n : run.project.plan->notes) text += "\n" + n;
    for (const auto& n : run.project.notes) text += "\n" + n;
    page.add_paragraph(text);
  }
  return page.render();
}

// ---------------------------------------------------------------- terminal

std::string plan_text(const PlanRun& run, bool colour) {
  const PlanProblem& problem = run.problem;
  const PlanResult& r = run.result;
  const Selection& best = r.best;
  const PlanObjective objective = problem.objective;
  using Align = TextTable::Align;
  std::string out;
  auto line = [&](const std::string& text) { out.append(text).append("\n"); };

  const Tone status_tone = r.status == PlanStatus::optimal    ? Tone::good
                           : r.status == PlanStatus::feasible ? Tone::warning
                                                              : Tone::bad;
  line(paint(fmt::format("Plan of {}", run.project.name), Tone::heading, colour));
  line(paint(std::string(status_heading(r.status)) + ": " + message_after_status(r), status_tone, colour));
  line(fmt::format("  Objective {}, seed {}; {} nodes, {} moves, {} rounds, {} frequencies, {} candidates",
                   to_string(objective), run.options.seed, r.stats.nodes, r.stats.moves, r.stats.rounds,
                   r.stats.frequencies, r.stats.candidates));

  line("");
  line(paint(r.status == PlanStatus::infeasible ? "Best selection found (misses the target)" : "Chosen parts",
             Tone::heading, colour));
  if (chosen(best).empty()) {
    line("  none: the fixed network alone " + std::string(best.worst_ratio <= 1.0 ? "meets" : "is closest to") +
         " the target");
    if (problem.fixed_count > 0)
      line(fmt::format("  fixed parts at the board node: {} parts, cost {:.4g}, area {}", problem.fixed_count,
                       problem.fixed_cost, mm2_text(problem.fixed_area)));
  } else {
    TextTable table({"Name", "Count", "Cost each", "Area each", "Mounting"},
                    {Align::left, Align::right, Align::right, Align::right, Align::right});
    for (const std::size_t k : chosen(best)) {
      const PlanCandidate& c = problem.candidates[k];
      table.add_row({c.name, std::to_string(best.counts[k]), fmt::format("{:.4g}", c.cost), mm2_text(c.area),
                     mounting_text(run, k)});
    }
    table.add_rule();
    table.add_row({"Added", std::to_string(best.count), fmt::format("{:.4g}", best.cost), mm2_text(best.area), ""});
    if (problem.fixed_count > 0)
      table.add_row({"With the fixed parts", std::to_string(best.count + problem.fixed_count),
                     fmt::format("{:.4g}", best.cost + problem.fixed_cost), mm2_text(best.area + problem.fixed_area),
                     ""});
    out += table.render(colour);
  }
  line("  " + paint(worst_text(best), best.worst_ratio <= 1.0 ? Tone::good : Tone::bad, colour));
  line("  " + bound_text(run));

  if (r.alternatives.size() > 1) {
    constexpr std::size_t kShown = 5;  // the top few; the JSON and HTML have them all
    line("");
    line(paint("Alternatives", Tone::heading, colour));
    // Changes against the chosen parts keep the lines short; the reports have full counts.
    TextTable table({"#", "Objective", "Count", "Worst ratio", "Change from the chosen parts"},
                    {Align::right, Align::right, Align::right, Align::right, Align::left});
    for (std::size_t i = 0; i < r.alternatives.size() && i < kShown; ++i) {
      const Selection& s = r.alternatives[i];
      table.add_row({std::to_string(i + 1), objective_text(objective, s.objective), std::to_string(s.count),
                     ratio_text(s.worst_ratio), change_text(problem, best, s, " x ", "-")});
    }
    out += table.render(colour);
    if (r.alternatives.size() > kShown) line(fmt::format("  ... {} more in the reports", r.alternatives.size() - kShown));
  }

  if (!r.front.empty()) {
    line("");
    line(paint(front_heading(objective), Tone::heading, colour));
    TextTable table({"Margin asked", "Achieved", "Objective", "Worst ratio", "Proven"},
                    {Align::right, Align::right, Align::right, Align::right, Align::left});
    for (const auto& point : r.front) {
      if (!point.selection) {
        table.add_row({fmt::format("{:g} dB", point.margin_db), "none found", "-", "-", point.proven ? "yes" : "no"});
        continue;
      }
      table.add_row({fmt::format("{:g} dB", point.margin_db), fmt::format("{:.2f} dB", point.achieved_margin_db),
                     objective_text(objective, point.selection->objective), ratio_text(point.selection->worst_ratio),
                     point.proven ? "yes" : "no"});
    }
    out += table.render(colour);
  }

  if (r.infeasibility) {
    const Infeasibility& inf = *r.infeasibility;
    line("");
    line(paint("Why the target cannot be met", Tone::heading, colour));
    line(fmt::format("  best worst ratio found {}, no selection within the limits below {}{}", ratio_text(inf.best_ratio),
                     ratio_text(inf.ratio_lower_bound), inf.proven ? " (search complete)" : ""));
    if (inf.bands.empty()) line("  no single frequency is out of reach: the parts that hold one frequency spoil another");
    for (const auto& b : inf.bands) {
      line("  " + paint(fmt::format("{} to {}: at best {} ({}, at {})", format_value(b.start, "Hz", 3),
                                    format_value(b.stop, "Hz", 3), ratio_text(b.floor_ratio), b.limit,
                                    format_value(b.frequency, "Hz", 3)),
                        Tone::bad, colour));
      line("     " + b.reason);
    }
  }
  if (run.project.plan)
    for (const auto& w : run.project.plan->warnings) line("  " + paint("warning: " + w, Tone::warning, colour));

  line("");
  line(fmt::format("Planned design, checked: {}", run.planned.result.message));
  line("Wrote " + run.files.html.string());
  for (const auto* path : {&run.files.plan_json, &run.files.planned_project, &run.files.planned_bom,
                           &run.files.impedance_svg, &run.files.curves_csv})
    line("      " + path->string());
  if (r.status != PlanStatus::infeasible) line("      " + run.files.front_svg.string());
  line(paint(kCaution, Tone::warning, colour));
  return out;
}

}  // namespace quietrail::cli
