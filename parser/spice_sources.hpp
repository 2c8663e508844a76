#pragma once
// Spirit X3 grammar for the specification of an independent source (V, I): DC value, AC
// magnitude and phase, and one transient function (SIN, PULSE, PWL, EXP, SFFM, AM, ...).
#include <cstddef>
#include <string>

#include "parser/diagnostics.hpp"
#include "parser/spice_deck.hpp"

namespace mainscheck::parser {

/// Parses items `first..` of `st` into `t.dc`, `t.ac_*`, `t.wave_*` and `t.params`; reports
/// errors (naming `what`, e.g. "vsource V1") and returns false on any.
bool parse_source_spec(const Statement& st, std::size_t first, const std::string& what, ElementTemplate& t,
                       DiagnosticSink& diags);

}  // namespace mainscheck::parser
