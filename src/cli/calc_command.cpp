// SPDX-License-Identifier: MIT
// `quietrail calc`: the small calculators for daily questions. Each formula family has
// its own file (calc_circuits.cpp, calc_conductors.cpp, calc_planes.cpp).
#include <CLI/CLI.hpp>

#include "cli/calc_support.hpp"
#include "cli/commands.hpp"

namespace quietrail::cli {

void register_calc(CLI::App& app, Action& action) {
  CLI::App* calc = app.add_subcommand(
      "calc",
      "Small calculators: LC resonance, part self-resonance, wire/via inductance, skin effect, "
      "plane capacitance, cavity modes, target impedance");
  calc->require_subcommand(1);
  calc::register_resonance(*calc, action);
  calc::register_self_resonance(*calc, action);
  calc::register_wire(*calc, action);
  calc::register_via(*calc, action);
  calc::register_skin(*calc, action);
  calc::register_plane(*calc, action);
  calc::register_cavity(*calc, action);
  calc::register_target(*calc, action);
}

}  // namespace quietrail::cli
