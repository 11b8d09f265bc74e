// SPDX-License-Identifier: MIT
// Option parsing and report printing shared by the calc sub-commands.
#include "cli/calc_support.hpp"
#include "cli/terminal.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>

#include <CLI/CLI.hpp>
#include <fmt/core.h>

#include "cli/exit_code.hpp"
#include "quietrail/error.hpp"
#include "quietrail/units.hpp"

namespace quietrail::cli::calc {
namespace {

constexpr double kInch = 0.0254;  // m, exact by definition
constexpr double kMil = 25.4e-6;  // m

InputLocation at(const Arg& arg) { return {"command line", arg.name}; }

std::string lower(std::string_view text) {
  std::string out(text);
  std::transform(out.begin(), out.end(), out.begin(),
                 [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return out;
}

// "0.063in" / "4 mil" -> the number and the imperial scale; std::nullopt for SI text.
std::optional<std::pair<std::string, double>> imperial(std::string_view text) {
  const std::string t = lower(text);
  for (const auto& [suffix, scale] :
       {std::pair<std::string_view, double>{"mils", kMil}, {"mil", kMil}, {"inch", kInch}, {"in", kInch}}) {
    if (t.size() > suffix.size() && t.compare(t.size() - suffix.size(), suffix.size(), suffix) == 0)
      return std::make_pair(std::string(text.substr(0, text.size() - suffix.size())), scale);
  }
  return std::nullopt;
}

// Engineering notation for physical quantities; pure numbers keep their plain form
// ("3.536", not "3.536 " with a prefix), fractions read as percentages.
std::string format_quantity(double si, const std::string& unit) {
  if (unit.empty()) return fmt::format("{:.4g}", si);
  if (unit == "%") return fmt::format("{:.4g} %", 100.0 * si);
  // A prefix would scale the metre before squaring ("51.61 mm^2" is not 0.05161 m^2).
  if (unit == "m^2") return fmt::format("{:.4g} m^2", si);
  return format_value(si, unit);
}

std::string json_unit(const std::string& unit) { return unit == "%" ? std::string() : unit; }

std::string label_line(const std::string& label, const std::string& text, std::size_t width) {
  return fmt::format("  {:<{}}{}", label, width, text);
}

}  // namespace

bool Arg::given() const { return option != nullptr && option->count() > 0; }

CLI::Option* add_arg(CLI::App& app, Arg& arg, const std::string& names, const std::string& help) {
  arg.name = names.substr(0, names.find(','));
  arg.option = app.add_option(names, arg.text, help)->type_name("VALUE");
  return arg.option;
}

double value(const Arg& arg, std::string_view unit) { return parse_value(arg.text, unit, at(arg)); }

std::optional<double> maybe_value(const Arg& arg, std::string_view unit) {
  if (!arg.given()) return std::nullopt;
  return value(arg, unit);
}

double length(const Arg& arg) {
  if (const auto split = imperial(arg.text)) {
    try {
      return parse_value(split->first, "", at(arg)) * split->second;
    } catch (const InputError&) {
      throw InputError(at(arg), "a length such as 1.6mm, 62mil or 0.063in", "'" + arg.text + "'");
    }
  }
  try {
    return parse_value(arg.text, "m", at(arg));
  } catch (const InputError& e) {
    throw InputError(at(arg), e.expected() + " (or in inches and mils: 0.063in, 62mil)", e.found());
  }
}

std::optional<double> maybe_length(const Arg& arg) {
  if (!arg.given()) return std::nullopt;
  return length(arg);
}

double fraction(const Arg& arg) {
  std::string_view text = arg.text;
  while (!text.empty() && text.back() == ' ') text.remove_suffix(1);
  const bool percent = !text.empty() && text.back() == '%';
  if (percent) text.remove_suffix(1);
  double v = 0.0;
  try {
    v = parse_value(text, "", at(arg));
  } catch (const InputError&) {
    throw InputError(at(arg), "a fraction such as 0.05 or a percentage such as 5%", "'" + arg.text + "'");
  }
  if (percent) return v / 100.0;
  if (v > 1.0) reject(arg, "a fraction in (0, 1] or a percentage such as 5%", "'" + arg.text + "'");
  return v;
}

int whole_number(const Arg& arg) {
  const std::string& t = arg.text;
  // AWG writes the coarse sizes as 0, 00, 000, 0000 or 1/0 ... 4/0 (gauge 1 - k).
  if (t.size() >= 2 && t.find_first_not_of('0') == std::string::npos) return 1 - static_cast<int>(t.size());
  if (t.size() == 3 && t[1] == '/' && t[2] == '0' && t[0] >= '1' && t[0] <= '4') return 1 - (t[0] - '0');
  int v = 0;
  const auto [end, error] = std::from_chars(t.data(), t.data() + t.size(), v);
  if (error != std::errc() || end != t.data() + t.size() || t.empty())
    reject(arg, "a whole number", "'" + t + "'");
  return v;
}

void reject(const Arg& arg, const std::string& expected, const std::string& found) {
  throw InputError(at(arg), expected, found);
}

void with_option_names(const std::function<void()>& compute) {
  try {
    compute();
  } catch (const InputError& e) {
    std::string field = e.where().field;
    if (field.empty()) throw InputError({"command line", ""}, e.expected(), e.found());
    field = field.substr(field.rfind('/') + 1);
    std::replace(field.begin(), field.end(), '_', '-');
    throw InputError({"command line", "--" + field}, e.expected(), e.found());
  }
}

Report::Report(std::string calculator) : calculator_(std::move(calculator)) {
  json_ = {{"calculator", calculator_},
           {"inputs", nlohmann::json::object()},
           {"results", nlohmann::json::object()},
           {"units", nlohmann::json::object()},
           {"notes", nlohmann::json::array()},
           {"caution", kCaution}};
}

void Report::input(const std::string& key, const std::string& label, double si, const std::string& unit) {
  inputs_.push_back({label, format_quantity(si, unit)});
  json_["inputs"][key] = si;
  json_["units"][key] = json_unit(unit);
}

void Report::input_text(const std::string& key, const std::string& label, const std::string& text) {
  inputs_.push_back({label, text});
  json_["inputs"][key] = text;
}

void Report::result(const std::string& key, const std::string& label, double si, const std::string& unit,
                    const std::string& aside) {
  results_.push_back({label, format_quantity(si, unit) + (aside.empty() ? "" : "  (" + aside + ")")});
  json_["results"][key] = si;  // non-finite values become null in JSON
  json_["units"][key] = json_unit(unit);
}

void Report::result_count(const std::string& key, const std::string& label, int count) {
  results_.push_back({label, std::to_string(count)});
  json_["results"][key] = count;
}

void Report::result_text(const std::string& key, const std::string& label, const std::string& text) {
  results_.push_back({label, text});
  json_["results"][key] = text;
}

void Report::note(const std::string& text) {
  notes_.push_back(text);
  json_["notes"].push_back(text);
}

void Report::table(const std::string& key, std::vector<std::string> lines, nlohmann::json json) {
  table_ = std::move(lines);
  json_["results"][key] = std::move(json);
}

void Report::print(bool as_json) const {
  if (as_json) {
    fmt::print("{}\n", json_.dump(2));
    return;
  }
  std::size_t width = 0;
  for (const auto* rows : {&inputs_, &results_})
    for (const Row& row : *rows) width = std::max(width, row.label.size());
  width += 3;
  fmt::print("{}\n", calculator_);
  if (!inputs_.empty()) {
    fmt::print(" inputs\n");
    for (const Row& row : inputs_) fmt::print("{}\n", label_line(row.label, row.text, width));
  }
  fmt::print(" results\n");
  for (const Row& row : results_) fmt::print("{}\n", label_line(row.label, row.text, width));
  for (const std::string& line : table_) fmt::print("  {}\n", line);
  for (const std::string& n : notes_) fmt::print("note: {}\n", n);
  fmt::print("{}\n", kCaution);
}

Subcommand add_subcommand(CLI::App& calc, const std::string& name, const std::string& description,
                          const std::string& example) {
  Subcommand sub;
  sub.app = calc.add_subcommand(name, description);
  sub.app->add_flag("--json", *sub.json, "print one JSON object (SI units) instead of text");
  sub.app->footer("Numbers take engineering notation: 100n, 4u7, 0.5nH, 10MHz, 20mohm.\nExample:\n  " +
                  example + "\nResults are planning estimates; confirm them on hardware.");
  return sub;
}

void on_run(const Subcommand& sub, Action& action, std::function<void(bool as_json)> body) {
  auto json = sub.json;
  sub.app->callback([&action, json, body = std::move(body)] {
    action = [json, body] {
      body(*json);
      return static_cast<int>(kExitOk);
    };
  });
}

}  // namespace quietrail::cli::calc
