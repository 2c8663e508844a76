#pragma once
// Interpretation of SPICE element lines: pin counts, value, model, parameters and source
// specifications per element letter, done once per subcircuit definition.
#include "parser/diagnostics.hpp"
#include "parser/spice_deck.hpp"

namespace mainscheck::parser {

/// Fills `def.templates` from `def.elements`; structural errors are reported here, once. Call it once
/// per definition: afterwards the elements' items are gone (the templates hold what later stages
/// need, ElementDecl::name_loc the element's location) and `def.element_index` is cleared.
void build_templates(SpiceDeck& deck, SubcktDef& def, DiagnosticSink& diags);

}  // namespace mainscheck::parser
