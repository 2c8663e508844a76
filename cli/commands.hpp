#pragma once
// Each subcommand registers its options on the app and returns a callable that runs it.
#include <CLI/CLI.hpp>

#include <functional>

namespace mainscheck::cli {

/// Runs a parsed subcommand and returns its exit code.
using CommandRunner = std::function<int()>;

/// `mainscheck netlist FILE [--format text|json]`: prints the flattened netlist.
CommandRunner add_netlist_command(CLI::App& app);
/// `mainscheck check FILE...`: the full check.
CommandRunner add_check_command(CLI::App& app);
/// `mainscheck rules [--format text|json]`: lists the rules.
CommandRunner add_rules_command(CLI::App& app);
/// `mainscheck explain RULE`: prints the rule's documentation page.
CommandRunner add_explain_command(CLI::App& app);
/// `mainscheck diff OLD.json NEW.json`: new, fixed and unchanged findings by fingerprint.
CommandRunner add_diff_command(CLI::App& app);

}  // namespace mainscheck::cli
