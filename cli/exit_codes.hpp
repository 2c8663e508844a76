#pragma once
// Exit codes are a contract with users' scripts and CI jobs (docs/cli.md).

#include <fmt/format.h>

#include <initializer_list>
#include <string>
#include <string_view>
#include <utility>

namespace mainscheck::cli {

inline constexpr int kExitClean = 0;            ///< completed, nothing at or above --fail-on
inline constexpr int kExitFindings = 1;         ///< findings at or above --fail-on
inline constexpr int kExitInputError = 2;       ///< usage error or unreadable / invalid input
inline constexpr int kExitAnalysisFailure = 3;  ///< analysis could not complete (e.g. non-convergence)

/// Meaning of 2 for every command that reads files.
inline constexpr std::string_view kExitInputErrorHelp = "usage error, or input that could not be read completely";

/// The "Exit codes:" footer of a command's --help: one line per code the command can return.
inline std::string exit_codes_footer(std::initializer_list<std::pair<int, std::string_view>> codes) {
  std::string out = "Exit codes:\n";
  for (const auto& [code, meaning] : codes) out += fmt::format("  {}  {}\n", code, meaning);
  return out;
}

}  // namespace mainscheck::cli
