#include "cli/app.hpp"

#include <spdlog/spdlog.h>

#include <iostream>
#include <map>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "cli/logging.hpp"

namespace mainscheck::cli {

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

  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
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
