#pragma once
// spdlog set-up: logs go to stderr only, never into machine-readable output on stdout.

namespace mainscheck::cli {

/// Log level from -v (repeatable) and --quiet.
void init_logging(int verbosity, bool quiet);

}  // namespace mainscheck::cli
