// SPDX-License-Identifier: MIT
// quietrail command-line entry: parse, run the chosen command, map failures to
// exit codes (InputError -> 2, anything else -> 3).
#include <cstdio>
#include <exception>

#include <CLI/CLI.hpp>
#include <fmt/core.h>

#include "cli/commands.hpp"
#include "cli/exit_code.hpp"
#include "quietrail/error.hpp"

int main(int argc, char** argv) {
  using namespace quietrail::cli;
  CLI::App app{
      "quietrail: plan, check and compare bypass/decoupling networks against a target impedance.\n"
      "Planning estimates only: confirm on hardware and follow the part makers' data."};
  app.require_subcommand(1);
  app.set_version_flag("--version", "quietrail 0.1.0");
  Action action;
  register_plan(app, action);
  register_calc(app, action);
  register_sweep(app, action);
  register_check(app, action);
  register_compare(app, action);
  register_yield(app, action);
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? kExitOk : kExitBadInput;
  }
  try {
    return action ? action() : kExitOk;
  } catch (const quietrail::InputError& e) {
    fmt::print(stderr, "quietrail: error: {}\n", e.what());
    return kExitBadInput;
  } catch (const std::exception& e) {
    fmt::print(stderr, "quietrail: internal error: {}\nPlease report this with the input that caused it.\n",
               e.what());
    return kExitInternalError;
  }
}
