#include "report/sarif_writer.hpp"

#include "report/fingerprint.hpp"
#include "report/json_common.hpp"
#include "report/tool_info.hpp"
#include "rules/registry.hpp"
#include "rules/rule_docs.hpp"

namespace mainscheck::report {

namespace {

const char* sarif_level(rules::Severity s) {
  switch (s) {
    case rules::Severity::error: return "error";
    case rules::Severity::warning: return "warning";
    case rules::Severity::note: return "note";
  }
  return "none";
}

std::string_view doc_page(const std::string& id) {
  for (const auto& d : rules::rule_docs()) {
    if (d.id == id) return d.markdown;
  }
  return {};
}

Json rule_descriptors() {
  Json arr = Json::array();
  for (const auto& r : rules::all_rules()) {
    const auto& i = r->info();
    Json j;
    j["id"] = i.id;
    j["shortDescription"] = Json{{"text", i.summary}};
    j["fullDescription"] = Json{{"text", i.summary + " (basis: " + i.basis + ")"}};
    const std::string_view page = doc_page(i.id);
    j["help"] = Json{{"text", page.empty() ? i.summary : std::string(page)}, {"markdown", std::string(page)}};
    j["helpUri"] = rule_doc_uri(i.id);
    j["defaultConfiguration"] = Json{{"level", sarif_level(i.default_severity)}};
    j["properties"] = Json{{"basis", i.basis}};
    arr.push_back(std::move(j));
  }
  return arr;
}

Json result_json(const CheckReport& r, const rules::Finding& f, const std::map<std::string, std::size_t>& index) {
  Json j;
  j["ruleId"] = f.rule_id;
  if (auto it = index.find(f.rule_id); it != index.end()) j["ruleIndex"] = it->second;
  j["level"] = sarif_level(f.severity);
  j["message"] = Json{{"text", f.message}};
  Json loc;
  std::string uri = r.file;
  Json region = Json::object();
  if (f.loc.valid() && r.sources != nullptr) {
    uri = r.sources->name(f.loc.file);
    const parser::LineCol lc = r.sources->line_col(f.loc);
    region = Json{{"startLine", lc.line}, {"startColumn", lc.column}};
  }
  Json phys{{"artifactLocation", Json{{"uri", uri}}}};
  if (!region.empty()) phys["region"] = region;
  loc["physicalLocation"] = std::move(phys);
  if (!f.parts.empty()) {
    Json logical = Json::array();
    for (const auto& p : f.parts) logical.push_back(Json{{"name", p}, {"kind", "member"}});
    loc["logicalLocations"] = std::move(logical);
  }
  j["locations"] = Json::array({std::move(loc)});
  // Notes placed elsewhere than the finding (each further part of a merged finding, each unrecognised
  // part) become related locations, so every part a finding names can be found.
  if (r.sources != nullptr) {
    Json related = Json::array();
    for (const auto& n : f.notes) {
      if (!n.loc.valid() || (n.loc.file == f.loc.file && n.loc.offset == f.loc.offset)) continue;
      const parser::LineCol lc = r.sources->line_col(n.loc);
      related.push_back(Json{{"id", related.size()},
                             {"message", Json{{"text", n.message}}},
                             {"physicalLocation", Json{{"artifactLocation", Json{{"uri", r.sources->name(n.loc.file)}}},
                                                       {"region", Json{{"startLine", lc.line}, {"startColumn", lc.column}}}}}});
    }
    if (!related.empty()) j["relatedLocations"] = std::move(related);
  }
  if (f.waived_by) {
    j["suppressions"] = Json::array({Json{{"kind", "external"}, {"status", "accepted"}, {"justification", *f.waived_by}}});
  }
  j["partialFingerprints"] = Json{{"mainscheckFinding/v1", finding_fingerprint(f)}};
  Json props;
  if (!f.block.empty()) props["block"] = f.block;
  if (f.measurement) {
    const auto& m = *f.measurement;
    props["measured"] = Json{{"quantity", m.quantity}, {"value", number_json(m.value)}, {"limit", number_json(m.limit)},
                             {"unit", m.unit}, {"margin", number_json(m.margin())}, {"corner", m.corner}};
  }
  props["basis"] = f.basis;
  j["properties"] = std::move(props);
  return j;
}

}  // namespace

std::string checks_to_sarif(const std::vector<const CheckReport*>& reports) {
  std::map<std::string, std::size_t> index;
  for (const auto& r : rules::all_rules()) index.emplace(r->info().id, index.size());
  Json driver;
  driver["name"] = "mainscheck";
  driver["version"] = std::string(tool_version());
  driver["informationUri"] = doc_uri("README.md");
  driver["rules"] = rule_descriptors();
  Json results = Json::array();
  Json notifications = Json::array();
  bool all_complete = true;
  for (const CheckReport* r : reports) {
    for (const auto& f : r->findings) results.push_back(result_json(*r, f, index));
    if (r->status != CheckStatus::complete) {
      all_complete = false;
      notifications.push_back(
          Json{{"level", "error"},
               {"message", Json{{"text", r->file + ": check incomplete: " + r->failure}}},
               {"locations", Json::array({Json{{"physicalLocation", Json{{"artifactLocation", Json{{"uri", r->file}}}}}}})}});
    }
  }
  Json invocation{{"executionSuccessful", all_complete}};
  if (!notifications.empty()) invocation["toolExecutionNotifications"] = std::move(notifications);
  Json run;
  run["tool"] = Json{{"driver", std::move(driver)}};
  run["invocations"] = Json::array({std::move(invocation)});
  run["results"] = std::move(results);
  run["properties"] = Json{{"caution", kSafetyCaution}};
  Json log;
  log["$schema"] = "https://json.schemastore.org/sarif-2.1.0.json";
  log["version"] = "2.1.0";
  log["runs"] = Json::array({std::move(run)});
  return dump_json(log);
}

}  // namespace mainscheck::report
