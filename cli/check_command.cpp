#include <spdlog/spdlog.h>

#include <iostream>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "cli/input.hpp"

namespace mainscheck::cli {

namespace {

/// Options of `check`; the later pipeline stages read them, scripts may pass them from the start.
struct CheckArgs {
  std::vector<std::string> files;
  std::string format = "text";
  std::vector<std::string> outputs;
  std::string fail_on = "error";
  std::string corners = "worst";
  std::string supply;
  std::string tolerance;
  std::string line_net, neutral_net, earth_net;
  std::string parts_file;
  std::string policy_file;
  InputOptions input;
};

}  // namespace

CommandRunner add_check_command(CLI::App& app) {
  auto a = std::make_shared<CheckArgs>();
  CLI::App* cmd = app.add_subcommand("check", "recognise the front-end blocks, compute stresses and apply the rules");
  cmd->add_option("files", a->files, "netlists (SPICE-style or XML), or - for standard input")->required();
  cmd->add_option("--format", a->format, "report format on stdout")
      ->check(CLI::IsMember({"text", "json"}))
      ->capture_default_str();
  cmd->add_option("--output", a->outputs, "write FORMAT=FILE as well (repeatable)");
  cmd->add_option("--fail-on", a->fail_on, "lowest severity that makes the exit code 1")
      ->check(CLI::IsMember({"error", "warning", "note", "never"}))
      ->capture_default_str();
  cmd->add_option("--corners", a->corners, "supply corners: worst (nominal, low and high line) or nominal")
      ->check(CLI::IsMember({"worst", "nominal"}))
      ->capture_default_str();
  cmd->add_option("--supply", a->supply, "mains supply, e.g. 230V/50Hz or 85-264V/47-63Hz");
  cmd->add_option("--tolerance", a->tolerance, "supply voltage tolerance in percent, e.g. +10/-15");
  cmd->add_option("--line", a->line_net, "net carrying the line conductor");
  cmd->add_option("--neutral", a->neutral_net, "net carrying the neutral conductor");
  cmd->add_option("--earth", a->earth_net, "net carrying protective earth");
  cmd->add_option("--parts", a->parts_file, "parts library (XML) with roles and ratings");
  cmd->add_option("--policy", a->policy_file, "policy file (XML) with derating, severities and insulation settings");
  add_input_options(*cmd, a->input);
  return [a]() {
    int worst = kExitClean;
    for (const auto& file : a->files) {
      LoadedNetlist in;
      load_netlist(file, a->input, in);
      if (print_diagnostics(in, std::cerr)) {
        worst = std::max(worst, kExitInputError);
        continue;
      }
      // Never a clean result for what was not checked.
      std::cerr << file << ": error: read " << in.netlist.parts.size()
                << " parts, but block recognition and the rules are not available in this build; nothing was "
                   "checked\n";
      worst = std::max(worst, kExitAnalysisFailure);
    }
    return worst;
  };
}

}  // namespace mainscheck::cli
