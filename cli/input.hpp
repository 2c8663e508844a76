#pragma once
// Reading the netlist named on the command line (a path or `-` for stdin) with the shared options.
#include <CLI/CLI.hpp>

#include <iosfwd>
#include <string>

#include "parser/diagnostics.hpp"
#include "parser/file_reader.hpp"
#include "parser/limits.hpp"
#include "parser/netlist.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::cli {

/// Options every command that reads a netlist accepts: limits and include confinement.
struct InputOptions {
  parser::ReadOptions read;
};

/// Registers --include-path and the --max-* limit options on a subcommand.
void add_input_options(CLI::App& cmd, InputOptions& opts);

/// A netlist read from disk or stdin, with everything needed to print its diagnostics.
struct LoadedNetlist {
  parser::SourceManager sources;
  parser::DiagnosticSink diagnostics;
  parser::Netlist netlist;
};

/// Reads `path` (or stdin for "-"); problems end up in the returned diagnostics.
void load_netlist(const std::string& path, const InputOptions& opts, LoadedNetlist& out);

/// True when coloured output suits `stream_fd` (a terminal and NO_COLOR unset).
bool use_color(int stream_fd);

/// Prints every diagnostic to `err`, compiler style; returns true when any is an error.
bool print_diagnostics(const LoadedNetlist& in, std::ostream& err);

}  // namespace mainscheck::cli
