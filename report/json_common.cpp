#include "report/json_common.hpp"

#include <cmath>

namespace mainscheck::report {

Json location_json(parser::SourceLoc loc, const parser::SourceManager& sm) {
  if (!loc.valid()) return nullptr;
  const parser::LineCol lc = sm.line_col(loc);
  Json j;
  j["file"] = sm.name(loc.file);
  j["line"] = lc.line;
  j["column"] = lc.column;
  return j;
}

Json diagnostics_json(const parser::DiagnosticSink& diags, const parser::SourceManager& sm) {
  Json arr = Json::array();
  for (const auto& d : diags.diagnostics()) {
    Json j;
    j["severity"] = parser::severity_name(d.severity);
    j["location"] = location_json(d.loc, sm);
    j["message"] = d.message;
    Json notes = Json::array();
    for (const auto& n : d.notes) notes.push_back(Json{{"location", location_json(n.loc, sm)}, {"message", n.message}});
    j["notes"] = std::move(notes);
    arr.push_back(std::move(j));
  }
  return arr;
}

Json number_json(double v) {
  if (!std::isfinite(v)) return nullptr;
  return v;
}

std::string dump_json(const Json& doc) {
  return doc.dump(2, ' ', false, nlohmann::json::error_handler_t::replace) + "\n";
}

}  // namespace mainscheck::report
