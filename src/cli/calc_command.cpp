// SPDX-License-Identifier: MIT
// placeholder: replaced by the calc command
#include <CLI/CLI.hpp>
#include "cli/commands.hpp"
namespace quietrail::cli {
void register_calc(CLI::App& app, Action& action) { (void)app; (void)action; }
}  // namespace quietrail::cli
