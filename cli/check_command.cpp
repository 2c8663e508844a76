#include <unistd.h>

#include <atomic>
#include <chrono>
#include <condition_variable>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <mutex>
#include <thread>

#include "cli/check_pipeline.hpp"
#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "cli/progress.hpp"
#include "report/html_writer.hpp"
#include "report/json_common.hpp"
#include "report/json_writer.hpp"
#include "report/junit_writer.hpp"
#include "report/markdown_writer.hpp"
#include "report/sarif_writer.hpp"
#include "report/text_writer.hpp"

namespace mainscheck::cli {

namespace {

struct CheckArgs {
  std::vector<std::string> files;
  std::string format = "text";
  std::vector<std::string> outputs;
  std::string fail_on = "error";
  CheckSettings settings;
  std::string supply, tolerance, line, neutral, earth, source_impedance;
  unsigned jobs = 0;
  bool parts_table = false;
};

using Reports = std::vector<const report::CheckReport*>;

/// One document in `format` for all checked files; SARIF and JUnit combine them natively, the
/// per-file formats concatenate (JSON wraps several reports in a batch object).
std::string render(const std::string& format, const Reports& rs, const report::TextOptions& text) {
  if (format == "sarif") return report::checks_to_sarif(rs);
  if (format == "junit") return report::checks_to_junit(rs);
  if (format == "html") return report::checks_to_html(rs);
  if (format == "json") return report::checks_to_json(rs);
  std::string out;
  for (const auto* r : rs) {
    out += format == "markdown" ? report::check_to_markdown(*r) : report::check_to_text(*r, text);
    if (rs.size() > 1) out += "\n";
  }
  if (format == "text" && rs.size() > 1) out += report::batch_summary_text(rs);
  return out;
}

const std::vector<std::string> kFormats{"text", "json", "sarif", "junit", "markdown", "html"};

/// True for an XML parts library (root <mainscheck-parts>), which sits beside netlists but is not one.
bool is_parts_library(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::string head(512, '\0');
  in.read(head.data(), static_cast<std::streamsize>(head.size()));
  head.resize(static_cast<std::size_t>(in.gcount()));
  return head.find("<mainscheck-parts") != std::string::npos;
}

/// Expands directories into the netlists under them (sorted, so the order is deterministic).
std::vector<std::string> expand_inputs(const std::vector<std::string>& inputs) {
  std::vector<std::string> files;
  for (const auto& in : inputs) {
    std::error_code ec;
    if (in != "-" && std::filesystem::is_directory(in, ec)) {
      std::vector<std::string> found;
      for (const auto& e : std::filesystem::recursive_directory_iterator(in, ec)) {
        const std::string ext = parser::to_lower(e.path().extension().string());
        if (e.is_regular_file() && (ext == ".cir" || ext == ".sp" || ext == ".spi" || ext == ".net" ||
                                    (ext == ".xml" && !is_parts_library(e.path()))))
          found.push_back(e.path().string());
      }
      std::sort(found.begin(), found.end());
      files.insert(files.end(), found.begin(), found.end());
    } else {
      files.push_back(in);
    }
  }
  return files;
}

}  // namespace

CommandRunner add_check_command(CLI::App& app) {
  auto a = std::make_shared<CheckArgs>();
  CLI::App* cmd = app.add_subcommand("check", "recognise the front-end blocks, compute stresses and apply the rules");
  cmd->footer(exit_codes_footer({{kExitClean, "completed; no finding at or above --fail-on"},
                                  {kExitFindings, "findings at or above --fail-on"},
                                  {kExitInputError, kExitInputErrorHelp},
                                  {kExitAnalysisFailure, "the analysis could not complete (e.g. the solver did not "
                                                         "converge); nothing is presented as a pass"}}));
  cmd->add_option("files", a->files, "netlists (SPICE-style or XML), or - for standard input")->required();
  cmd->add_option("--format", a->format, "report format on stdout")->check(CLI::IsMember(kFormats))->capture_default_str();
  // One FILE per --output, so netlists after it stay positional arguments.
  cmd->add_option("--output", a->outputs, "also write FORMAT=FILE (repeatable)")->allow_extra_args(false);
  cmd->add_option("--fail-on", a->fail_on, "lowest severity that makes the exit code 1")
      ->check(CLI::IsMember({"error", "warning", "note", "never"}))
      ->capture_default_str();
  cmd->add_option("--corners", a->settings.corners, "supply corners: worst (nominal, high and low line) or nominal")
      ->check(CLI::IsMember({"worst", "nominal"}))
      ->capture_default_str();
  cmd->add_option("--supply", a->supply, "mains supply, e.g. 230V/50Hz or 85-264V/47-63Hz");
  cmd->add_option("--source-impedance", a->source_impedance,
                  "mains source impedance R,L in ohms and henries (e.g. 0.4,0.8m) or none; default: the IEC 60725 "
                  "reference impedance (none with --corners nominal), unless the netlist states or draws one")
      ->check(CLI::Validator(
          [](std::string& text) {
            const auto z = analysis::parse_source_impedance(text);
            return z.value ? std::string() : z.error;
          },
          "R,L|none"));
  cmd->add_option("--tolerance", a->tolerance, "supply voltage tolerance in percent, e.g. +10/-15");
  cmd->add_option("--line", a->line, "net carrying the line conductor");
  cmd->add_option("--neutral", a->neutral, "net carrying the neutral conductor");
  cmd->add_option("--earth", a->earth, "net carrying protective earth");
  cmd->add_option("--parts", a->settings.parts_file, "parts library (XML) with roles and ratings");
  cmd->add_option("--policy", a->settings.policy_file, "policy file (XML): derating, severities, insulation settings");
  cmd->add_option("--waivers", a->settings.waivers_file, "waivers file (XML): reviewed acceptances of findings");
  cmd->add_option("--baseline", a->settings.baseline_file, "earlier JSON report: show only findings new since then");
  cmd->add_flag("--parts-table", a->parts_table,
               "text report: add the per-part rating table (rating, source, derated limit, worst stress, margin, "
               "verdict); the other formats always carry it");
  cmd->add_option("-j,--jobs", a->jobs, "netlists checked in parallel (default: all cores)");
  // Solver bounds (docs/limits.md): running into one makes the check "not verified", never a pass.
  auto& solver = a->settings.stress.solver;
  cmd->add_option("--max-time-steps", solver.max_total_steps, "most solver time steps per supply corner")
      ->check(CLI::Range(1L, 1'000'000'000L))
      ->capture_default_str();
  cmd->add_option("--max-newton-iterations", solver.max_newton_iterations, "most Newton iterations per time step")
      ->check(CLI::Range(1, 10'000))
      ->capture_default_str();
  cmd->add_option("--max-shooting-iterations", solver.max_shooting_iterations,
                  "most shooting iterations towards the periodic steady state")
      ->check(CLI::Range(1, 10'000))
      ->capture_default_str();
  add_input_options(*cmd, a->settings.input);
  const CLI::Option* quiet = app.get_option("--quiet");
  return [a, quiet]() {
    auto set = [](const std::string& v, std::optional<std::string>& dst) {
      if (!v.empty()) dst = v;
    };
    set(a->supply, a->settings.supply.supply);
    set(a->line, a->settings.supply.line);
    set(a->neutral, a->settings.supply.neutral);
    set(a->earth, a->settings.supply.earth);
    set(a->tolerance, a->settings.tolerance);
    if (!a->source_impedance.empty()) a->settings.source_impedance = analysis::parse_source_impedance(a->source_impedance).value;
    std::vector<std::pair<std::string, std::string>> outputs;
    for (const auto& o : a->outputs) {
      const auto eq = o.find('=');
      const std::string fmt = o.substr(0, eq);
      if (eq == std::string::npos || eq + 1 == o.size() ||
          std::find(kFormats.begin(), kFormats.end(), fmt) == kFormats.end()) {
        std::cerr << "mainscheck: error: --output takes FORMAT=FILE with FORMAT one of text, json, sarif, junit, markdown, html; got '" << o << "'\n";
        return kExitInputError;
      }
      outputs.emplace_back(fmt, o.substr(eq + 1));
    }
    const std::vector<std::string> files = expand_inputs(a->files);
    // SOURCE_DATE_EPOCH asks for reproducible output (reproducible-builds.org): times are left out.
    const char* epoch = std::getenv("SOURCE_DATE_EPOCH");
    const bool timed = epoch == nullptr || *epoch == '\0';
    std::vector<std::unique_ptr<CheckRun>> runs(files.size());
    // A pool of workers takes the next file; results land in input order, so output is deterministic.
    std::atomic<std::size_t> next{0};
    const unsigned n_threads =
        std::max(1u, std::min<unsigned>(a->jobs ? a->jobs : std::thread::hardware_concurrency(), files.size()));
    {
      std::mutex m;
      std::condition_variable finished_one;
      std::size_t done = 0;
      std::vector<std::jthread> pool;
      for (unsigned t = 0; t < n_threads; ++t) {
        pool.emplace_back([&] {
          for (std::size_t i = next++; i < files.size(); i = next++) {
            runs[i] = std::make_unique<CheckRun>();
            const auto started = std::chrono::steady_clock::now();
            run_check(files[i], a->settings, *runs[i]);
            if (timed)
              runs[i]->report.elapsed_s =
                  std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
            std::lock_guard lock(m);
            ++done;
            finished_one.notify_all();
          }
        });
      }
      // The main thread only draws the progress line; the workers' results stay in input order.
      ProgressLine progress(std::cerr, ::isatty(STDERR_FILENO) != 0 && quiet->count() == 0, files.size());
      const auto start = std::chrono::steady_clock::now();
      std::unique_lock lock(m);
      while (done < files.size()) {
        finished_one.wait_for(lock, std::chrono::milliseconds(100));
        const auto elapsed = std::chrono::steady_clock::now() - start;
        progress.update(done, std::chrono::duration_cast<std::chrono::milliseconds>(elapsed));
      }
      progress.finish();
    }
    int worst = kExitClean;
    Reports reports;
    for (const auto& run : runs) {
      print_diagnostics(run->in, std::cerr);
      reports.push_back(&run->report);
      worst = std::max(worst, exit_code_for(run->report, a->fail_on));
    }
    const report::TextOptions text{a->format == "text" && use_color(STDOUT_FILENO), a->parts_table};
    std::cout << render(a->format, reports, text);
    for (const auto& [fmt, path] : outputs) {
      std::ofstream out(path, std::ios::binary);
      out << render(fmt, reports, report::TextOptions{false, a->parts_table});
      if (!out) {
        std::cerr << "mainscheck: error: cannot write " << path << "\n";
        worst = std::max(worst, kExitInputError);
      }
    }
    return worst;
  };
}

}  // namespace mainscheck::cli
