#include <fmt/format.h>

#include <fstream>
#include <iostream>
#include <map>
#include <nlohmann/json.hpp>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"

namespace mainscheck::cli {

namespace {

using FindingIndex = std::map<std::string, nlohmann::json>;  // fingerprint → finding (sorted)

bool load(const std::string& path, FindingIndex& out) {
  std::ifstream in(path, std::ios::binary);
  const nlohmann::json doc = in ? nlohmann::json::parse(in, nullptr, false) : nlohmann::json();
  if (doc.is_discarded() || !doc.is_object() || !doc.contains("schema")) {
    std::cerr << "mainscheck: error: '" << path << "' is not a mainscheck JSON report (check --format json)\n";
    return false;
  }
  auto add = [&](const nlohmann::json& report) {
    if (!report.contains("findings")) return;
    for (const auto& f : report["findings"]) {
      if (f.contains("fingerprint")) out[f["fingerprint"].get<std::string>()] = f;
    }
  };
  if (doc.contains("reports")) {
    for (const auto& r : doc["reports"]) add(r);
  } else {
    add(doc);
  }
  return true;
}

int rank(const std::string& severity) { return severity == "error" ? 2 : severity == "warning" ? 1 : 0; }

std::string line(const nlohmann::json& f) {
  std::string where;
  if (f.contains("location") && f["location"].is_object()) {
    where = fmt::format("{}:{}: ", f["location"]["file"].get<std::string>(), f["location"]["line"].get<int>());
  }
  return fmt::format("{}{}: {} [{}]", where, f.value("severity", "?"), f.value("message", ""), f.value("rule", "?"));
}

}  // namespace

CommandRunner add_diff_command(CLI::App& app) {
  struct Args {
    std::string old_file, new_file, fail_on = "error";
  };
  auto a = std::make_shared<Args>();
  CLI::App* cmd = app.add_subcommand("diff", "compare two JSON reports: new, fixed and unchanged findings");
  cmd->footer(exit_codes_footer({{kExitClean, "compared; no new finding at or above --fail-on"},
                                  {kExitFindings, "a new finding at or above --fail-on"},
                                  {kExitInputError, kExitInputErrorHelp}}));
  cmd->add_option("old", a->old_file, "earlier report (check --format json)")->required();
  cmd->add_option("new", a->new_file, "later report")->required();
  cmd->add_option("--fail-on", a->fail_on, "lowest severity of a new finding that makes the exit code 1")
      ->check(CLI::IsMember({"error", "warning", "note", "never"}))
      ->capture_default_str();
  return [a]() {
    FindingIndex before, after;
    if (!load(a->old_file, before) || !load(a->new_file, after)) return kExitInputError;
    std::size_t unchanged = 0;
    bool gate = false;
    std::string added, fixed;
    for (const auto& [fp, f] : after) {
      if (before.count(fp) != 0) {
        ++unchanged;
        continue;
      }
      added += "  + " + line(f) + "\n";
      const bool waived = f.contains("waived") && !f["waived"].is_null();
      if (!waived && a->fail_on != "never" && rank(f.value("severity", "note")) >= rank(a->fail_on)) gate = true;
    }
    for (const auto& [fp, f] : before) {
      if (after.count(fp) == 0) fixed += "  - " + line(f) + "\n";
    }
    std::cout << "new findings:\n" << (added.empty() ? "  none\n" : added);
    std::cout << "gone since the earlier report:\n" << (fixed.empty() ? "  none\n" : fixed);
    std::cout << fmt::format("{} unchanged\n", unchanged);
    return gate ? kExitFindings : kExitClean;
  };
}

}  // namespace mainscheck::cli
