// SPDX-License-Identifier: MIT
// placeholder: replaced by the sweep command
#include <CLI/CLI.hpp>
#include "cli/commands.hpp"
namespace quietrail::cli {
void register_sweep(CLI::App& app, Action& action) { (void)app; (void)action; }
}  // namespace quietrail::cli
