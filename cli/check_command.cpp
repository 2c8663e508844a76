#include <unistd.h>

#include <fstream>
#include <iostream>

#include "cli/check_pipeline.hpp"
#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "report/json_writer.hpp"
#include "report/text_writer.hpp"

namespace mainscheck::cli {

namespace {

struct CheckArgs {
  std::vector<std::string> files;
  std::string format = "text";
  std::vector<std::string> outputs;
  std::string fail_on = "error";
  CheckSettings settings;
  std::string supply, tolerance, line, neutral, earth;
};

std::string render(const std::string& format, const report::CheckReport& r, bool color) {
  if (format == "json") return report::check_to_json(r);
  return report::check_to_text(r, report::TextOptions{color});
}

const std::vector<std::string> kFormats{"text", "json"};

}  // namespace

CommandRunner add_check_command(CLI::App& app) {
  auto a = std::make_shared<CheckArgs>();
  CLI::App* cmd = app.add_subcommand("check", "recognise the front-end blocks, compute stresses and apply the rules");
  cmd->add_option("files", a->files, "netlists (SPICE-style or XML), or - for standard input")->required();
  cmd->add_option("--format", a->format, "report format on stdout")->check(CLI::IsMember(kFormats))->capture_default_str();
  cmd->add_option("--output", a->outputs, "also write FORMAT=FILE (repeatable)");
  cmd->add_option("--fail-on", a->fail_on, "lowest severity that makes the exit code 1")
      ->check(CLI::IsMember({"error", "warning", "note", "never"}))
      ->capture_default_str();
  cmd->add_option("--corners", a->settings.corners, "supply corners: worst (nominal, high and low line) or nominal")
      ->check(CLI::IsMember({"worst", "nominal"}))
      ->capture_default_str();
  cmd->add_option("--supply", a->supply, "mains supply, e.g. 230V/50Hz or 85-264V/47-63Hz");
  cmd->add_option("--tolerance", a->tolerance, "supply voltage tolerance in percent, e.g. +10/-15");
  cmd->add_option("--line", a->line, "net carrying the line conductor");
  cmd->add_option("--neutral", a->neutral, "net carrying the neutral conductor");
  cmd->add_option("--earth", a->earth, "net carrying protective earth");
  cmd->add_option("--parts", a->settings.parts_file, "parts library (XML) with roles and ratings");
  cmd->add_option("--policy", a->settings.policy_file, "policy file (XML): derating, severities, insulation settings");
  add_input_options(*cmd, a->settings.input);
  return [a]() {
    auto set = [](const std::string& v, std::optional<std::string>& dst) {
      if (!v.empty()) dst = v;
    };
    set(a->supply, a->settings.supply.supply);
    set(a->line, a->settings.supply.line);
    set(a->neutral, a->settings.supply.neutral);
    set(a->earth, a->settings.supply.earth);
    set(a->tolerance, a->settings.tolerance);
    std::vector<std::pair<std::string, std::string>> outputs;
    for (const auto& o : a->outputs) {
      const auto eq = o.find('=');
      const std::string fmt = o.substr(0, eq);
      if (eq == std::string::npos || eq + 1 == o.size() ||
          std::find(kFormats.begin(), kFormats.end(), fmt) == kFormats.end()) {
        std::cerr << "mainscheck: error: --output takes FORMAT=FILE with FORMAT one of text, json; got '" << o << "'\n";
        return kExitInputError;
      }
      outputs.emplace_back(fmt, o.substr(eq + 1));
    }
    int worst = kExitClean;
    for (const auto& file : a->files) {
      CheckRun run;
      run_check(file, a->settings, run);
      print_diagnostics(run.in, std::cerr);
      std::cout << render(a->format, run.report, a->format == "text" && use_color(STDOUT_FILENO));
      for (const auto& [fmt, path] : outputs) {
        std::ofstream out(path, std::ios::binary);
        out << render(fmt, run.report, false);
        if (!out) {
          std::cerr << "mainscheck: error: cannot write " << path << "\n";
          worst = std::max(worst, kExitInputError);
        }
      }
      worst = std::max(worst, exit_code_for(run.report, a->fail_on));
    }
    return worst;
  };
}

}  // namespace mainscheck::cli
