#pragma once
// The mainscheck command line: subcommands, global options, exit codes.

namespace mainscheck::cli {

/// Runs the command line; returns the process exit code (cli/exit_codes.hpp).
int run(int argc, char** argv);

}  // namespace mainscheck::cli
