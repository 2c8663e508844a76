#pragma once
// Text and JSON forms of the flattened netlist (`mainscheck netlist`).
#include <string>

#include "parser/diagnostics.hpp"
#include "parser/netlist.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::report {

/// JSON document {"parts":[...],"nets":[...],"diagnostics":[...]} with stable key order, newline-terminated.
std::string netlist_to_json(const parser::Netlist& nl, const parser::SourceManager& sm,
                            const parser::DiagnosticSink& diags);

/// Human-readable listing: one line per part with its location, kind, nets, value and model.
std::string netlist_to_text(const parser::Netlist& nl, const parser::SourceManager& sm);

/// Shortest decimal text that reads back as exactly `v` ("1000", "1e-05", "0.1").
std::string format_number(double v);

}  // namespace mainscheck::report
