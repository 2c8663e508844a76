#include "cli/baseline.hpp"

#include <fstream>
#include <nlohmann/json.hpp>

#include "report/fingerprint.hpp"

namespace mainscheck::cli {

namespace {

void collect(const nlohmann::json& report, std::set<std::string>& out) {
  if (!report.contains("findings") || !report["findings"].is_array()) return;
  for (const auto& f : report["findings"]) {
    if (f.contains("fingerprint") && f["fingerprint"].is_string()) out.insert(f["fingerprint"].get<std::string>());
  }
}

}  // namespace

std::set<std::string> read_baseline_fingerprints(const std::string& path, parser::DiagnosticSink& diags) {
  std::set<std::string> out;
  std::ifstream in(path, std::ios::binary);
  if (!in) {
    diags.error({}, "cannot read baseline '" + path + "'");
    return out;
  }
  const nlohmann::json doc = nlohmann::json::parse(in, nullptr, false);
  if (doc.is_discarded() || !doc.is_object() || !doc.contains("schema")) {
    diags.error({}, "baseline '" + path + "' is not a mainscheck JSON report (check --format json)");
    return out;
  }
  if (doc.contains("reports") && doc["reports"].is_array()) {
    for (const auto& r : doc["reports"]) collect(r, out);
  } else {
    collect(doc, out);
  }
  return out;
}

std::size_t drop_baseline_findings(const std::set<std::string>& baseline, std::vector<rules::Finding>& findings) {
  const std::size_t before = findings.size();
  std::erase_if(findings, [&](const rules::Finding& f) { return baseline.count(report::finding_fingerprint(f)) != 0; });
  return before - findings.size();
}

}  // namespace mainscheck::cli
