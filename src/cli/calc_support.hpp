// SPDX-License-Identifier: MIT
// Shared plumbing of the `quietrail calc` sub-commands (calc_*.cpp): option text to SI
// values with errors that name the option, and one report printed as text or JSON.
#pragma once

#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "cli/commands.hpp"

namespace CLI {
class App;
class Option;
}  // namespace CLI

namespace quietrail::cli::calc {

/// One option whose text is parsed after CLI11 is done, so that every bad value becomes
/// an InputError naming the option (exit 2) and engineering notation is accepted.
struct Arg {
  std::string name;  ///< "--capacitance"
  std::string text;  ///< as typed
  CLI::Option* option = nullptr;

  bool given() const;
};

/// Adds `--name` (plus optional ",-x" aliases) to `app`, bound to `arg`.
CLI::Option* add_arg(CLI::App& app, Arg& arg, const std::string& names, const std::string& help);

/// The value of `arg` in SI units of `unit` ("F", "H", "Hz", "ohm", "V", "A", "s", "W", "" ).
double value(const Arg& arg, std::string_view unit);
/// value() when given, else std::nullopt.
std::optional<double> maybe_value(const Arg& arg, std::string_view unit);
/// A length in m: SI with prefixes ("1.6mm", "100u") or inches and mils ("0.063in", "4mil").
double length(const Arg& arg);
/// length() when given, else std::nullopt.
std::optional<double> maybe_length(const Arg& arg);
/// A fraction: "0.05" or a percentage "5%".
double fraction(const Arg& arg);
/// A whole number; for "--awg" also "0", "00", "000", "0000" and "1/0".."4/0".
int whole_number(const Arg& arg);

/// Throws InputError at `arg` (for example "required" or "not together with").
[[noreturn]] void reject(const Arg& arg, const std::string& expected, const std::string& found = {});

/// Runs `compute`, rewriting a library InputError for field "/a_b" as one for option
/// "--a-b" on the command line, so the message names what the user typed.
void with_option_names(const std::function<void()>& compute);

/// A calculator's answer: inputs and results in SI units, notes, optional extra lines.
class Report {
 public:
  explicit Report(std::string calculator);

  /// An input quantity echoed back. `unit` is the SI unit; "" is a pure number and "%"
  /// a fraction shown as a percentage (stored as the fraction in JSON).
  void input(const std::string& key, const std::string& label, double si, const std::string& unit);
  /// An input given as text (a package code, a gauge).
  void input_text(const std::string& key, const std::string& label, const std::string& text);
  /// A result quantity; `aside` is extra text shown only in the text form.
  void result(const std::string& key, const std::string& label, double si, const std::string& unit,
              const std::string& aside = {});
  /// A result that is a count (printed and stored as an integer).
  void result_count(const std::string& key, const std::string& label, int count);
  /// A result given as text (for example where a value came from).
  void result_text(const std::string& key, const std::string& label, const std::string& text);
  /// A line of explanation shown after the results.
  void note(const std::string& text);
  /// A table shown in the text form after the results; `json` is stored under `key`.
  void table(const std::string& key, std::vector<std::string> lines, nlohmann::json json);

  /// Prints to stdout, aligned text or one JSON object.
  void print(bool as_json) const;

 private:
  struct Row {
    std::string label;
    std::string text;
  };
  std::string calculator_;
  std::vector<Row> inputs_;
  std::vector<Row> results_;
  std::vector<std::string> notes_;
  std::vector<std::string> table_;
  nlohmann::json json_;
};

/// Common parts of every sub-command: `--json`, the footer with the example, and the
/// action that runs `body` after parsing.
struct Subcommand {
  CLI::App* app = nullptr;
  std::shared_ptr<bool> json = std::make_shared<bool>(false);
};

/// Creates `calc <name>` with a description, the given example line and the --json flag.
Subcommand add_subcommand(CLI::App& calc, const std::string& name, const std::string& description,
                          const std::string& example);

/// Makes `sub` store in `action` a run of `body` that returns kExitOk.
void on_run(const Subcommand& sub, Action& action, std::function<void(bool as_json)> body);

// Registration of the sub-commands, one per formula family (calc_*.cpp).
void register_resonance(CLI::App& calc, Action& action);
void register_self_resonance(CLI::App& calc, Action& action);
void register_target(CLI::App& calc, Action& action);
void register_wire(CLI::App& calc, Action& action);
void register_via(CLI::App& calc, Action& action);
void register_skin(CLI::App& calc, Action& action);
void register_plane(CLI::App& calc, Action& action);
void register_cavity(CLI::App& calc, Action& action);

}  // namespace quietrail::cli::calc
