#pragma once
// Shared fixture of the SPICE reader tests: in-memory files, one read, rendered diagnostics.
#include <string>

#include "parser/diagnostics.hpp"
#include "parser/file_reader.hpp"
#include "parser/readers.hpp"

namespace mainscheck::parser::testing {

/// Reads a deck from memory and keeps everything needed to inspect the result.
struct SpiceRead {
  MemoryFileReader files;
  SourceManager sm;
  DiagnosticSink diags;
  ReadOptions options;
  Netlist nl;

  SpiceRead() { options.confine_includes = false; }

  /// Reads `text` as the top file "deck.cir" (includes resolve against the files added).
  const Netlist& read(std::string text, std::string name = "deck.cir") {
    nl = read_spice_text(name, std::move(text), files, sm, diags, options);
    return nl;
  }
  /// All diagnostics rendered as the CLI prints them, without colour.
  std::string rendered() const {
    std::string out;
    for (const auto& d : diags.diagnostics()) out += render_diagnostic(d, sm);
    return out;
  }
  const Part& part(std::string_view ref) const {
    const Part* p = nl.find_part(ref);
    if (!p) throw std::runtime_error("no part " + std::string(ref));
    return *p;
  }
  std::string net_of(std::string_view ref, std::size_t pin) const { return nl.net(part(ref).nets.at(pin)).name; }
};

}  // namespace mainscheck::parser::testing
