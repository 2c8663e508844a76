// libFuzzer entry for the whole check on a small deck: read, recognise, plan corners, solve with
// tight solver limits (so every input finishes in bounded time), apply the rules and render the
// report with every writer. The input is written to a private temporary directory first because
// the pipeline reads from disk; include confinement keeps `.include` inside that directory.
#include <stdlib.h>
#include <unistd.h>

#include <spdlog/spdlog.h>

#include <cstddef>
#include <cstdint>
#include <fstream>
#include <string>

#include "cli/check_pipeline.hpp"
#include "fuzz/fuzz_support.hpp"
#include "report/json_writer.hpp"
#include "report/junit_writer.hpp"
#include "report/markdown_writer.hpp"
#include "report/sarif_writer.hpp"
#include "report/text_writer.hpp"

namespace {

/// The private directory inputs are written to, made once per process.
const std::string& work_dir() {
  static const std::string dir = [] {
    char tmpl[] = "/tmp/mainscheck-fuzz-XXXXXX";
    const char* made = ::mkdtemp(tmpl);
    if (made == nullptr) __builtin_trap();
    return std::string(made);
  }();
  return dir;
}

mainscheck::cli::CheckSettings fuzz_settings() {
  mainscheck::cli::CheckSettings s;
  auto& lim = s.input.read.limits;
  lim.max_parts = 2000;
  lim.max_subckt_depth = 16;
  lim.max_included_files = 8;
  lim.max_expression_depth = 64;
  auto& so = s.stress.solver;
  so.steps_per_period = 64;
  so.max_newton_iterations = 30;
  so.max_step_halvings = 4;
  so.warmup_periods = 1;
  so.max_shooting_iterations = 4;
  so.max_total_steps = 4000;
  so.inrush_steps_per_half_period = 64;
  return s;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  using namespace mainscheck;
  // The first byte picks the file name, so both readers (chosen by content) and extension-based
  // paths are reached.
  const std::string path = work_dir() + (size > 0 && (data[0] & 1) ? "/board.xml" : "/deck.cir");
  {
    std::ofstream f(path, std::ios::binary | std::ios::trunc);
    f.write(reinterpret_cast<const char*>(data), static_cast<std::streamsize>(size));
  }
  static const cli::CheckSettings settings = [] {
    spdlog::set_level(spdlog::level::off);  // progress lines would only slow every execution
    return fuzz_settings();
  }();
  cli::CheckRun run;
  cli::run_check(path, settings, run);
  fuzz::check_diagnostics(run.in.diagnostics, run.in.sources);
  const report::CheckReport& r = run.report;
  // Never a silent pass: an input error is always a status, and a status always has a reason.
  fuzz::require(!run.in.diagnostics.has_errors() || r.status == report::CheckStatus::input_error);
  fuzz::require(r.status == report::CheckStatus::complete || !r.failure.empty());
  const int code = cli::exit_code_for(r, "error");
  fuzz::require(code >= 0 && code <= 3);
  fuzz::require(!report::check_to_text(r).empty());
  fuzz::require(!report::check_to_json(r).empty());
  fuzz::require(!report::check_to_markdown(r).empty());
  fuzz::require(!report::checks_to_sarif({&r}).empty());
  fuzz::require(!report::checks_to_junit({&r}).empty());
  ::unlink(path.c_str());
  return 0;
}
