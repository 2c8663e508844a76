#pragma once
// Pieces every JSON writer shares, so locations and diagnostics look the same in each document.
#include <nlohmann/json.hpp>

#include <string>

#include "parser/diagnostics.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::report {

using Json = nlohmann::ordered_json;

/// {"file":..,"line":..,"column":..} or null for an unknown location.
Json location_json(parser::SourceLoc loc, const parser::SourceManager& sm);

/// [{"severity":..,"file":..,"line":..,"column":..,"message":..,"notes":[...]}] in discovery order.
Json diagnostics_json(const parser::DiagnosticSink& diags, const parser::SourceManager& sm);

/// A finite double, or null (JSON has no NaN/Inf).
Json number_json(double v);

/// The document, two-space indented with a final newline; bytes that are not UTF-8 (a hostile
/// netlist's) become U+FFFD instead of aborting the dump.
std::string dump_json(const Json& doc);

}  // namespace mainscheck::report
