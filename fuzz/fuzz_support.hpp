#pragma once
// Checks shared by the reader fuzz targets: every diagnostic renders, and its location lies inside
// a buffer the SourceManager holds. A broken invariant traps so libFuzzer records the input.
#include <string>

#include "parser/diagnostics.hpp"
#include "parser/netlist.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::fuzz {

/// Traps when `ok` is false (a contract violation, not an input error).
inline void require(bool ok) {
  if (!ok) __builtin_trap();
}

/// Renders every diagnostic and checks that its location and notes point into a known buffer.
inline void check_diagnostics(const parser::DiagnosticSink& diags, const parser::SourceManager& sm) {
  auto check_loc = [&](parser::SourceLoc loc) {
    if (!loc.valid()) return;
    require(loc.file <= sm.file_count());
    require(loc.offset <= sm.contents(loc.file).size());
    const parser::LineCol lc = sm.line_col(loc);
    require(lc.line >= 1 && lc.line <= sm.line_count(loc.file) && lc.column >= 1);
  };
  for (const auto& d : diags.diagnostics()) {
    check_loc(d.loc);
    for (const auto& n : d.notes) check_loc(n.loc);
    require(!d.message.empty());
    const std::string text = parser::render_diagnostic(d, sm);
    require(!text.empty() && text.back() == '\n');
  }
}

/// A netlist read without errors is consistent: every part's nets exist, refs are unique and found.
inline void check_netlist(const parser::Netlist& nl) {
  for (const auto& p : nl.parts) {
    for (parser::NetId n : p.nets) require(n < nl.nets().size());
    require(nl.find_part(p.ref) != nullptr);
  }
}

}  // namespace mainscheck::fuzz
