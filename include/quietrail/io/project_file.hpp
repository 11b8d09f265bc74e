// SPDX-License-Identifier: MIT
// The JSON project file of the check and plan jobs: a rail, its target, the regulator, plane,
// load side, BOM and plan constraints, built into a Network ready for run_check and a
// PlanProblem ready for run_plan (plan/plan.hpp). Schema: docs/project_file.md.
#pragma once

#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "quietrail/analysis/check.hpp"
#include "quietrail/analysis/target.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/io/part_library.hpp"
#include "quietrail/models/element.hpp"
#include "quietrail/network/network.hpp"
#include "quietrail/plan/plan.hpp"

namespace quietrail {

/// Where a verdict is taken: at the board node (the capacitors' side of the package) or
/// at the die behind the package's series resistance and inductance.
enum class LoadView { board, die };

/// "board" or "die".
std::string_view to_string(LoadView view);
/// Parses "board" or "die"; std::nullopt otherwise.
std::optional<LoadView> parse_load_view(std::string_view text);

/// The load behind the board node: the package's series path and the on-die capacitance.
///
///   board --[R_pkg + j*omega*L_pkg]-- die --[R_die + 1/(j*omega*C_die)]-- gnd
///
/// A first-order lumped package/die model (as used for the die-side view in Smith et al.
/// 1999 and most PI texts, from memory).
struct LoadSide {
  /// Package series inductance, H. >= 0.
  double package_inductance = 0.0;
  /// Package series resistance, ohm. >= 0; with package_inductance not both 0.
  double package_resistance = 0.0;
  /// On-die decoupling capacitance, F. > 0.
  double die_capacitance = 0.0;
  /// Series resistance of the on-die capacitance, ohm. >= 0.
  double die_resistance = 0.0;
};

/// How a branch of the project's network came about.
enum class BranchRole {
  regulator,  ///< the regulator's output model
  plane,      ///< the plane pair at the board node
  feed,       ///< the series element (e.g. a ferrite bead) from the supply to the board node
  supply,     ///< a part on the supply side of the feed
  bom,        ///< a BOM line at the board node
  package,    ///< the package's series R + L (load side)
  die,        ///< the on-die capacitance (load side)
};

/// "regulator", "plane", "feed", "supply", "bom", "package" or "die".
std::string_view to_string(BranchRole role);

/// One part placed in the network: a BOM line, the feed or a supply-side part.
struct PlacedPart {
  /// Branch name in the network (the line's "name", else derived from the part; unique).
  std::string name;
  /// The branch it became.
  BranchId branch = 0;
  /// Where it was given: a JSON pointer ("/bom/3") or "<csv file>:<line>".
  std::string source;
  /// Library part id; empty for an inline part.
  std::string library_id;
  /// "capacitor", "inductor" or "bead" (library kind; inline parts likewise).
  PartKind kind = PartKind::capacitor;
  /// Description for reports: the library's or one built from the values.
  std::string description;
  /// Package as written ("0402", "7.3x4.3 mm chip"); empty when not known.
  std::string package;
  /// Dielectric; Dielectric::none for inductors, beads and inline parts without one.
  Dielectric dielectric = Dielectric::none;
  /// Rated DC voltage, V; 0 when not known.
  double rated_voltage = 0.0;
  /// Copies in parallel. >= 1.
  int count = 1;
  /// Mounting inductance of one copy, H, and where it came from (e.g. "project mounting
  /// for 0402", "typical for 0402", "line override", "included in the part's ESL").
  double mounting_inductance = 0.0;
  std::string mounting_source;
  /// Capacitance before and after derating, F (capacitors only).
  std::optional<double> nominal_capacitance{};
  std::optional<double> effective_capacitance{};
  /// Model at 0 V and 25 C, and the model placed in the network (derated).
  Element nominal;
  Element effective;
  /// Relative cost and footprint area of one copy (library or inline values), unit and m^2.
  std::optional<double> cost{};
  std::optional<double> area{};
};

/// Facts about one plan candidate that PlanCandidate does not carry, for reports.
struct PlanCandidateFacts {
  /// Where it was chosen: "/plan/candidates/parts/<i>" for a listed part, else
  /// "/plan/candidates" (selected by the filters).
  std::string source;
  /// Library family ("mlcc", "bulk"), package as written, dielectric and rated DC voltage (V).
  std::string family;
  std::string package;
  Dielectric dielectric = Dielectric::none;
  double rated_voltage = 0.0;
  /// Where the mounting inductance came from, as PlacedPart::mounting_source.
  std::string mounting_source;
};

/// The project's `plan` section: what `quietrail plan` may add to the project's network and
/// under which limits. The candidates are built like BOM lines (derated, mounted).
struct PlanSection {
  /// What to minimise ("objective", default cost).
  PlanObjective objective = PlanObjective::cost;
  /// Seed of the search's random perturbations ("seed", default 1, as PlanOptions).
  std::uint64_t seed = 1;
  /// Distinct best selections to report ("alternatives", 1..50, default 5 as PlanOptions).
  std::size_t alternatives = 5;
  /// Branch-and-bound nodes per search ("node_limit", >= 1, default 2,000,000 as PlanOptions).
  std::size_t node_limit = 2'000'000;
  /// A candidate must be rated at least voltage_margin * |dc_voltage| ("voltage_margin",
  /// >= 1, default 1.5: common practice for ceramic and polymer parts on low-voltage rails).
  double voltage_margin = 1.5;
  /// Design margin below the target, dB ("impedance_margin", 0..40, default 0): the plan
  /// holds |Z| <= Z_t * 10^(-margin/20) (PlanProblem::margin_db).
  double margin_db = 0.0;
  /// Most copies of one candidate ("max_per_part", >= 0, default 50: our choice); a listed
  /// part's "max_count" overrides it.
  int max_per_part = 50;
  /// Count and area limits ("max_total", "max_area").
  PlanLimits limits{};
  /// The candidates, in library order, and per candidate (same index) its facts.
  std::vector<PlanCandidate> candidates;
  std::vector<PlanCandidateFacts> candidate_facts;
  /// How the candidates were chosen, one sentence each: the voltage rule, how many library
  /// capacitors passed each filter, the rating dedupe.
  std::vector<std::string> notes;
  /// Cautions about candidates (no mounting inductance known, outside the dielectric's
  /// temperature range), one sentence each.
  std::vector<std::string> warnings;
};

/// A project file after reading, validation and network building.
struct Project {
  /// "name": used in reports and output file names.
  std::string name;
  /// "description", empty when not given.
  std::string description;
  /// The project file as given (for messages and reports).
  std::string file;

  /// The rail (voltage, ripple as a fraction, currents, rise time, temperature).
  RailSpec rail;
  /// The ripple as written ("3%", "25mV", 0.03), for reports.
  std::string ripple_text;
  /// DC voltage across the capacitors, V: "dc_voltage" or the nominal voltage.
  double dc_voltage = 0.0;
  /// The target over the band. Always set by the reader (optional only because a
  /// TargetImpedance has no default).
  std::optional<TargetImpedance> target;
  /// Band and sampling: start (default 1 kHz), stop ("stop", else 0.35 / rise_time),
  /// points_per_decade (default 50). See docs/project_file.md for the sources.
  FrequencyGridOptions band;
  /// True when band.stop came from the rise time (0.35 / t_r, common practice).
  bool band_stop_from_rise_time = false;

  /// The network: regulator, plane, BOM lines at the board node, feed and supply side,
  /// load side. Topology checked.
  Network network;
  /// The board node (where the BOM sits) and, with a load side, the die node.
  NodeId board = 0;
  std::optional<NodeId> die{};
  /// With a feed, the supply node between the regulator and the feed.
  std::optional<NodeId> supply{};
  /// The view the verdict is for, and the node seen (board or die).
  LoadView view = LoadView::board;
  NodeId port = 0;
  /// The load side, when given.
  std::optional<LoadSide> load{};

  /// Per branch, in branch order: its role and the facts run_check needs (BranchInfo).
  std::vector<BranchRole> roles;
  std::vector<BranchInfo> branch_info;
  /// The placed parts: feed and supply parts first, then the BOM lines (`bom`, `bom_csv`,
  /// then `plan.keep`), in file order.
  std::vector<PlacedPart> parts;

  /// The part library files read, resolved paths, in order.
  std::vector<std::string> libraries;
  /// The BOM CSV file when the BOM came from one ("bom_csv"), resolved path.
  std::string bom_csv;
  /// Defaults that were applied and where they come from, one sentence each (for reports).
  std::vector<std::string> notes;
  /// Things the reader could not call errors but a designer should see (e.g. a part whose
  /// rated voltage is below the rail's DC voltage), one sentence each.
  std::vector<std::string> warnings;

  /// The `plan` section, when given.
  std::optional<PlanSection> plan{};

  /// Options for run_check: the band, refinement defaults and per-branch curves on.
  CheckOptions check_options() const;

  /// The planning problem of the `plan` section: this network (regulator, plane, feed,
  /// BOM and kept lines, load side) as the fixed network, the candidates at the board node,
  /// the target at the view's port, the band, the limits and the objective. fixed_cost,
  /// fixed_area and fixed_count sum cost * count, area * count and count over the parts
  /// at the board node (BranchRole::bom: `bom`, `bom_csv`, `plan.keep`); a part without a
  /// cost or area adds 0. Throws InputError (field "/plan") when there is no plan section.
  PlanProblem plan_problem() const;

  /// Options for run_plan from the plan section: seed, alternatives and node_limit; the rest
  /// are PlanOptions defaults. Throws InputError (field "/plan") when there is no plan
  /// section.
  PlanOptions plan_options() const;
};

/// Reads a project file (schema: docs/project_file.md), its part libraries and BOM CSV,
/// and builds the network.
///
/// Every quantity may be a JSON number in SI units or an engineering-notation string read
/// by parse_value ("100n", "10MHz"). Library and CSV paths are relative to the project
/// file's directory. Capacitors enter the network at their effective capacitance at the
/// rail's DC voltage and temperature (io/part_library.hpp effective_part); nominal and
/// effective values are kept side by side in `parts` and `branch_info`.
///
/// Throws InputError naming the file and the JSON pointer of the field (or the CSV file and
/// line): unreadable file; malformed JSON (line and column); a key given twice; an unknown
/// key; a missing or mistyped field; an unknown part id (with the nearest ids); a count
/// below 1; a reversed or empty band; a zero or negative target; a ripple of 0 or over
/// 100 %; a BOM with no parts (allowed with a `plan` section); a die view without a load
/// side; a library or BOM CSV error; in `plan`: an unknown objective, a number out of its
/// range, a filter entry that selects no library capacitor, a listed part that is not a
/// capacitor or fails the voltage rule, no candidate left, every max_count 0, fixed parts
/// already above max_area.
Project read_project_file(const std::filesystem::path& path);

/// As read_project_file, from JSON text in memory. `file` names the source in messages;
/// relative library and CSV paths are resolved against `base_directory`.
Project parse_project_json(std::string_view text, const std::string& file,
                           const std::filesystem::path& base_directory);

}  // namespace quietrail
