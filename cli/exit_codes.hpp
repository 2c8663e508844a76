#pragma once
// Exit codes are a contract with users' scripts and CI jobs (docs/cli.md).

namespace mainscheck::cli {

inline constexpr int kExitClean = 0;            ///< completed, nothing at or above --fail-on
inline constexpr int kExitFindings = 1;         ///< findings at or above --fail-on
inline constexpr int kExitInputError = 2;       ///< usage error or unreadable / invalid input
inline constexpr int kExitAnalysisFailure = 3;  ///< analysis could not complete (e.g. non-convergence)

}  // namespace mainscheck::cli
