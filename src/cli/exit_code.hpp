// SPDX-License-Identifier: MIT
// Exit statuses of the quietrail command, as documented in the README.
#pragma once

namespace quietrail::cli {

enum ExitCode : int {
  kExitOk = 0,             ///< success, or the rail meets its target
  kExitTargetNotMet = 1,   ///< the analysis ran and the target is not met
  kExitBadInput = 2,       ///< bad input: file, field and expectation are printed
  kExitInternalError = 3,  ///< a bug: please report it
};

}  // namespace quietrail::cli
