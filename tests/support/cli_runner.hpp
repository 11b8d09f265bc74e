// SPDX-License-Identifier: MIT
// Running the built quietrail binary from end-to-end tests (tests/cli/): through the shell
// with stdout and stderr captured, or on a pseudo-terminal to see what a user's terminal gets.
#pragma once

#include <pty.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

#include "support/temp_dir.hpp"

namespace quietrail::test {

/// What a run of the CLI returned and printed.
struct CliRun {
  int exit_code = -1;  ///< the process's exit status; -1 when it did not exit normally
  std::string out;     ///< stdout
  std::string err;     ///< stderr
};

/// `text` in single quotes for /bin/sh, with embedded single quotes escaped.
inline std::string shell_quoted(const std::string& text) {
  std::string out = "'";
  for (const char c : text) {
    if (c == '\'') out += "'\\''";
    else out += c;
  }
  out += "'";
  return out;
}

/// Runs `cli` with `args` through the shell; stdout and stderr go to scratch files in
/// `scratch` (removed again) and are returned.
inline CliRun run_cli(const std::filesystem::path& cli, const std::filesystem::path& scratch,
                      const std::vector<std::string>& args) {
  std::string command = shell_quoted(cli.string());
  // Appended piecewise: GCC 12 warns falsely (-Wrestrict) on "literal" + std::string.
  for (const auto& arg : args) command.append(" ").append(shell_quoted(arg));
  const std::filesystem::path out = scratch / "stdout.txt";
  const std::filesystem::path err = scratch / "stderr.txt";
  command.append(" > ").append(shell_quoted(out.string())).append(" 2> ").append(shell_quoted(err.string()));
  const int status = std::system(command.c_str());
  CliRun run;
  run.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  run.out = read_text(out);
  run.err = read_text(err);
  std::error_code ignored;
  std::filesystem::remove(out, ignored);
  std::filesystem::remove(err, ignored);
  return run;
}

/// Runs `cli` with `args` on a pseudo-terminal (so isatty is true for it) with NO_COLOR set
/// to `no_color` (nullptr: unset). `out` holds everything written to the terminal (stdout
/// and stderr together); `err` stays empty. exit_code is -1 when the fork failed or the
/// child did not exit normally.
inline CliRun run_on_terminal(const std::filesystem::path& cli, const std::vector<std::string>& args,
                              const char* no_color) {
  CliRun run;
  int master = -1;
  const pid_t pid = ::forkpty(&master, nullptr, nullptr, nullptr);
  if (pid < 0) return run;
  if (pid == 0) {
    if (no_color) ::setenv("NO_COLOR", no_color, 1);
    else ::unsetenv("NO_COLOR");
    std::vector<std::string> storage{cli.string()};
    storage.insert(storage.end(), args.begin(), args.end());
    std::vector<char*> argv;
    for (auto& s : storage) argv.push_back(s.data());
    argv.push_back(nullptr);
    ::execv(argv[0], argv.data());
    ::_exit(127);
  }
  char buffer[4096];
  for (;;) {
    const ssize_t n = ::read(master, buffer, sizeof buffer);
    if (n > 0) run.out.append(buffer, static_cast<std::size_t>(n));
    else if (n < 0 && errno == EINTR) continue;
    else break;  // EIO once the child has closed the terminal
  }
  ::close(master);
  int status = 0;
  ::waitpid(pid, &status, 0);
  run.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return run;
}

}  // namespace quietrail::test
