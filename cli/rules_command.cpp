#include <fmt/format.h>

#include <iostream>
#include <nlohmann/json.hpp>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "report/json_common.hpp"
#include "rules/options_view.hpp"
#include "rules/registry.hpp"
#include "rules/rule_docs.hpp"

namespace mainscheck::cli {

CommandRunner add_rules_command(CLI::App& app) {
  auto format = std::make_shared<std::string>("text");
  CLI::App* cmd = app.add_subcommand("rules", "list the rules with their default severity and basis");
  cmd->footer(exit_codes_footer({{kExitClean, "listed"}, {kExitInputError, "usage error"}}));
  cmd->add_option("--format", *format, "output format")->check(CLI::IsMember({"text", "json"}))->capture_default_str();
  return [format]() {
    if (*format == "json") {
      nlohmann::ordered_json arr = nlohmann::ordered_json::array();
      for (const auto& r : rules::all_rules()) {
        const auto& i = r->info();
        nlohmann::ordered_json opts = nlohmann::ordered_json::array();
        for (const auto& o : i.options) {
          opts.push_back({{"name", o.name},
                          {"default", o.is_text() ? nlohmann::ordered_json(o.default_text)
                                                  : nlohmann::ordered_json(o.default_value)},
                          {"unit", o.unit},
                          {"summary", o.summary}});
        }
        arr.push_back({{"id", i.id},
                       {"severity", parser::severity_name(i.default_severity)},
                       {"summary", i.summary},
                       {"basis", i.basis},
                       {"options", std::move(opts)}});
      }
      std::cout << report::dump_json(arr);
      return kExitClean;
    }
    for (const auto& r : rules::all_rules()) {
      const auto& i = r->info();
      std::cout << fmt::format("{:<34} {:<8} {}\n", i.id, parser::severity_name(i.default_severity), i.summary);
    }
    std::cout << fmt::format("{} rules; `mainscheck explain RULE` prints a rule's page\n", rules::all_rules().size());
    return kExitClean;
  };
}

CommandRunner add_explain_command(CLI::App& app) {
  auto id = std::make_shared<std::string>();
  CLI::App* cmd = app.add_subcommand("explain", "print a rule's documentation page");
  cmd->footer(exit_codes_footer({{kExitClean, "printed"}, {kExitInputError, "usage error or unknown rule id"}}));
  cmd->add_option("rule", *id, "rule id, e.g. voltage-rating.diode")->required();
  return [id]() {
    std::vector<std::string> ids;
    for (const auto& doc : rules::rule_docs()) {
      if (doc.id == *id) {
        std::cout << doc.markdown;
        return kExitClean;
      }
      ids.emplace_back(doc.id);
    }
    const std::string near = rules::nearest_name(*id, ids);
    std::cerr << "mainscheck: error: unknown rule '" << *id << "'"
              << (near.empty() ? std::string("; `mainscheck rules` lists the rule ids")
                               : "; did you mean '" + near + "'?")
              << "\n";
    return kExitInputError;
  };
}

}  // namespace mainscheck::cli
