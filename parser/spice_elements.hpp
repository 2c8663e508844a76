#pragma once
// Interpretation of SPICE element lines: pin counts, value, model, parameters and source
// specifications per element letter, done once per subcircuit definition.
#include "parser/diagnostics.hpp"
#include "parser/spice_deck.hpp"

namespace mainscheck::parser {

/// Fills `def.templates` from `def.elements`; structural errors are reported here, once. Afterwards
/// each element keeps only its head item (the templates hold what later stages need).
void build_templates(SpiceDeck& deck, SubcktDef& def, DiagnosticSink& diags);

}  // namespace mainscheck::parser
