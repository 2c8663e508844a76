#include "cli/app.hpp"

#include <spdlog/spdlog.h>

#include <iostream>
#include <map>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "cli/logging.hpp"

namespace mainscheck::cli {

namespace {

/// The first argument that is not an option: where a command was expected (no global option takes a value).
std::string first_word(int argc, char** argv) {
  for (int i = 1; i < argc; ++i) {
    const std::string_view a = argv[i];
    if (!a.empty() && a.front() != '-') return std::string(a);
  }
  return "";
}

/// What to say when no command was recognised: the word taken for one, if any, and the commands.
std::string no_command_message(const CLI::App& app, const std::string& given) {
  std::string out = given.empty() ? "mainscheck: error: a command is required\n"
                                  : "mainscheck: error: unknown command '" + given + "'\n";
  out += "commands:\n";
  for (const CLI::App* sub : app.get_subcommands({})) {
    out += "  " + sub->get_name();
    out += std::string(sub->get_name().size() < 10 ? 10 - sub->get_name().size() : 1, ' ');
    out += sub->get_description() + "\n";
  }
  out += "run 'mainscheck COMMAND --help' for a command's options\n";
  return out;
}

}  // namespace

int run(int argc, char** argv) {
  CLI::App app{"mainscheck: design-rule checker for mains power front-end netlists.\n"
               "A review aid only: mains voltages are lethal; final judgement rests with local codes, the "
               "applicable safety standard and a qualified person.",
               "mainscheck"};
  app.set_version_flag("--version", std::string("mainscheck ") + MAINSCHECK_VERSION);
  int verbosity = 0;
  bool quiet = false;
  app.add_flag("-v,--verbose", verbosity, "more log output on stderr (repeat for more)");
  app.add_flag("-q,--quiet", quiet, "only errors on stderr");
  app.require_subcommand(1);
  app.fallthrough();

  std::map<const CLI::App*, CommandRunner> runners;
  auto add = [&](CommandRunner r, const char* name) { runners[app.get_subcommand(name)] = std::move(r); };
  add(add_netlist_command(app), "netlist");
  add(add_check_command(app), "check");
  add(add_rules_command(app), "rules");
  add(add_explain_command(app), "explain");
  add(add_diff_command(app), "diff");

  app.footer(exit_codes_footer({{kExitClean, "completed; nothing at or above --fail-on"},
                                  {kExitFindings, "findings at or above --fail-on (check, diff)"},
                                  {kExitInputError, kExitInputErrorHelp},
                                  {kExitAnalysisFailure, "the analysis could not complete (check)"}}) +
             "Each command's --help lists the codes it returns.");

  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    if (e.get_exit_code() != 0 && app.get_subcommands().empty()) {
      const std::string given = first_word(argc, argv);
      if (!given.empty() || dynamic_cast<const CLI::RequiredError*>(&e) != nullptr) {
        std::cerr << no_command_message(app, given);
        return kExitInputError;
      }
    }
    const int code = app.exit(e);  // prints help/version to stdout, errors to stderr
    return code == 0 ? kExitClean : kExitInputError;
  }
  init_logging(verbosity, quiet);
  for (const auto& [cmd, runner] : runners) {
    if (cmd->parsed()) {
      try {
        return runner();
      } catch (const std::exception& e) {
        // A bug, not an input problem: say so plainly instead of presenting a result.
        spdlog::critical("internal error: {}", e.what());
        return kExitAnalysisFailure;
      }
    }
  }
  return kExitInputError;
}

}  // namespace mainscheck::cli
