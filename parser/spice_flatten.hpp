#pragma once
// Turns a SpiceDeck into the flattened Netlist: checks the expanded size bottom-up first, then
// expands every subcircuit instance with its own parameter scope.
#include "parser/diagnostics.hpp"
#include "parser/limits.hpp"
#include "parser/netlist.hpp"
#include "parser/spice_deck.hpp"
#include "parser/spice_scope.hpp"

namespace mainscheck::parser {

/// Builds element templates, refuses decks that would exceed the limits, then flattens into `nl`.
void flatten_deck(SpiceDeck& deck, Netlist& nl, ParamEvaluator& ev, DiagnosticSink& diags, const ReadLimits& limits);

}  // namespace mainscheck::parser
