// SPDX-License-Identifier: MIT
// Each command lives in its own file and registers itself on the top-level app.
// A command's callback returns its exit code through `CommandResult`.
#pragma once

#include <functional>

namespace CLI {
class App;
}

namespace quietrail::cli {

/// The selected command stores the action to run after parsing; main() runs it and
/// returns its exit code. Keeping parsing and running apart lets main() map every
/// exception to an exit code in one place.
using Action = std::function<int()>;

void register_plan(CLI::App& app, Action& action);
void register_calc(CLI::App& app, Action& action);
void register_sweep(CLI::App& app, Action& action);
void register_check(CLI::App& app, Action& action);
void register_compare(CLI::App& app, Action& action);
void register_yield(CLI::App& app, Action& action);

}  // namespace quietrail::cli
