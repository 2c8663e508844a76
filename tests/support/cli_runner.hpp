#pragma once
// Shared helpers for tests that run the built `mainscheck` binary from the repository root, with a
// fixed environment (no colour, a fixed "today") so every output is reproducible.
#include <stdlib.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "support/process_runner.hpp"

namespace mainscheck::test_support {

/// The fixed date every CLI test runs at: 2026-01-01T00:00:00Z (waiver expiry, JUnit timestamps).
inline constexpr const char* kFixedEpoch = "1767225600";

/// Runs `mainscheck ARGS...` in the repository root with NO_COLOR=1 and SOURCE_DATE_EPOCH fixed.
inline ProcessResult run_mainscheck(const std::vector<std::string>& args,
                                    std::vector<std::pair<std::string, std::string>> extra_env = {}) {
  std::vector<std::string> argv{MAINSCHECK_BINARY};
  argv.insert(argv.end(), args.begin(), args.end());
  ProcessOptions opt;
  opt.working_dir = MAINSCHECK_SOURCE_DIR;
  opt.timeout = std::chrono::seconds(120);
  opt.env = {{"NO_COLOR", "1"}, {"SOURCE_DATE_EPOCH", kFixedEpoch}};
  for (auto& e : extra_env) opt.env.push_back(std::move(e));
  return run_process(argv, opt);
}

/// Whole file as bytes; empty when it cannot be read.
inline std::string slurp(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

/// Writes `text` to `p` byte for byte.
inline void write_file(const std::filesystem::path& p, const std::string& text) {
  std::ofstream out(p, std::ios::binary);
  out << text;
}

/// A fresh directory under the system temp dir for one test, removed again by the destructor.
class TempDir {
 public:
  explicit TempDir(const std::string& tag) {
    std::string templ = (std::filesystem::temp_directory_path() / ("mainscheck-" + tag + "-XXXXXX")).string();
    if (::mkdtemp(templ.data()) != nullptr) path_ = templ;
  }
  ~TempDir() {
    std::error_code ec;
    if (!path_.empty()) std::filesystem::remove_all(path_, ec);
  }
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;
  /// The directory (empty when it could not be created).
  const std::filesystem::path& path() const { return path_; }

 private:
  std::filesystem::path path_;
};

/// A python3 on PATH that can `import jsonschema` (a pyenv shim may lack the module while the
/// distribution's python3 later on PATH has it), or nothing.
inline std::optional<std::string> python_with_jsonschema() {
  const char* path = std::getenv("PATH");
  std::string_view rest(path == nullptr ? "" : path);
  while (!rest.empty()) {
    const std::size_t colon = rest.find(':');
    const std::string dir(rest.substr(0, colon));
    rest = colon == std::string_view::npos ? std::string_view{} : rest.substr(colon + 1);
    if (dir.empty()) continue;
    const std::filesystem::path py = std::filesystem::path(dir) / "python3";
    if (::access(py.c_str(), X_OK) != 0) continue;
    const ProcessResult r = run_process({py.string(), "-c", "import jsonschema"});
    if (r.exited() && r.exit_code == 0) return py.string();
  }
  return std::nullopt;
}

}  // namespace mainscheck::test_support
