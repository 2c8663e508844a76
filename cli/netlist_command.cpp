#include <iostream>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "cli/input.hpp"
#include "report/netlist_writer.hpp"

namespace mainscheck::cli {

namespace {

struct NetlistArgs {
  std::string file;
  std::string format = "text";
  InputOptions input;
};

}  // namespace

CommandRunner add_netlist_command(CLI::App& app) {
  auto args = std::make_shared<NetlistArgs>();
  CLI::App* cmd = app.add_subcommand("netlist", "read a netlist and print it flattened");
  cmd->footer(exit_codes_footer({{kExitClean, "the netlist was read completely"},
                                  {kExitInputError, std::string_view("usage error, or input with an error: diagnostic "
                                                                     "(the listing is still printed)")}}));
  cmd->add_option("file", args->file, "SPICE-style or XML netlist, or - for standard input")->required();
  cmd->add_option("--format", args->format, "output format")
      ->check(CLI::IsMember({"text", "json"}))
      ->capture_default_str();
  add_input_options(*cmd, args->input);
  return [args]() {
    LoadedNetlist in;
    load_netlist(args->file, args->input, in);
    const bool failed = print_diagnostics(in, std::cerr);
    if (args->format == "json") {
      // JSON always goes out, so scripts can read the diagnostics too; the exit code says whether it is whole.
      std::cout << report::netlist_to_json(in.netlist, in.sources, in.diagnostics);
    } else if (!failed) {
      std::cout << report::netlist_to_text(in.netlist, in.sources);
    }
    return failed ? kExitInputError : kExitClean;
  };
}

}  // namespace mainscheck::cli
