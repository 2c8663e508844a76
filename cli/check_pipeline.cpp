#include "cli/check_pipeline.hpp"

#include <spdlog/spdlog.h>

#include <set>

#include "cli/exit_codes.hpp"
#include "analysis/stress_engine.hpp"
#include "cli/baseline.hpp"
#include "rules/engine.hpp"
#include "rules/finding_groups.hpp"

namespace mainscheck::cli {

namespace {

void fail(CheckRun& run, report::CheckStatus status, std::string why) {
  run.report.status = status;
  run.report.failure = std::move(why);
}


bool plan(const CheckSettings& settings, CheckRun& run) {
  analysis::CornerOptions co;
  co.mode = analysis::parse_corner_mode(settings.corners).value_or(analysis::CornerMode::worst);
  std::optional<std::string> tol = settings.tolerance ? settings.tolerance : run.policy.supply_tolerance;
  if (tol) {
    analysis::ToleranceParse tp = analysis::parse_tolerance(*tol);
    if (!tp.tolerance) {
      run.in.diagnostics.error(settings.tolerance ? parser::SourceLoc{} : run.policy.supply_loc,
                               "bad supply tolerance '" + *tol + "': " + tp.error);
      return false;
    }
    co.voltage_tolerance = tp.tolerance;
  }
  run.corners = analysis::plan_corners(run.recognition->supply.mains.value_or(analysis::MainsSpec{}), co);
  if (!run.corners.error.empty()) {
    run.in.diagnostics.error(run.recognition->supply.mains_from.loc, run.corners.error);
    return false;
  }
  return true;
}

}  // namespace

void run_check(const std::string& file, const CheckSettings& settings, CheckRun& run) {
  report::CheckReport& rep = run.report;
  rep.file = file;
  rep.sources = &run.in.sources;
  rep.diagnostics = &run.in.diagnostics;
  rep.netlist = &run.in.netlist;
  parser::DiskFileReader files;
  if (!settings.policy_file.empty()) {
    run.policy = rules::read_policy_file(settings.policy_file, files, run.in.sources, run.in.diagnostics);
    rules::validate_policy(run.policy, run.in.diagnostics);
  }
  if (!settings.parts_file.empty()) {
    parser::read_parts_library_file(settings.parts_file, files, run.in.sources, run.in.diagnostics, run.library);
  }
  if (!settings.waivers_file.empty()) {
    run.waivers = rules::read_waivers_file(settings.waivers_file, files, run.in.sources, run.in.diagnostics);
  }
  std::set<std::string> baseline;
  if (!settings.baseline_file.empty()) baseline = read_baseline_fingerprints(settings.baseline_file, run.in.diagnostics);
  if (run.in.diagnostics.has_errors()) return fail(run, report::CheckStatus::input_error, "unreadable settings");
  load_netlist(file, settings.input, run.in);
  if (run.in.diagnostics.has_errors()) return fail(run, report::CheckStatus::input_error, "the netlist has errors");

  spdlog::info("{}: {} parts read, recognising blocks", file, run.in.netlist.parts.size());
  // Ownership passes to recognition, so that a board whose device view is the netlist itself is not
  // held twice; from here on the input netlist is run.recognition->input().
  run.recognition = analysis::recognise(std::move(run.in.netlist), settings.supply,
                                        settings.parts_file.empty() ? nullptr : &run.library, run.in.diagnostics);
  rep.recognition = &*run.recognition;
  rep.netlist = &run.recognition->input();
  if (run.in.diagnostics.has_errors()) {
    return fail(run, report::CheckStatus::input_error, "the supply or part data could not be resolved");
  }
  if (!plan(settings, run)) return fail(run, report::CheckStatus::input_error, "no usable supply corners");
  rep.corners = &run.corners;

  spdlog::info("{}: {} blocks, solving {} corners", file, run.recognition->blocks.size(), run.corners.corners.size());
  analysis::StressOptions stress_options = settings.stress;
  stress_options.source_impedance = analysis::choose_source_impedance(
      settings.source_impedance, *run.recognition, run.corners.corners.size() == 1 && settings.corners == "nominal");
  run.stress = analysis::compute_stresses(*run.recognition, run.corners, stress_options);
  rep.stress = &*run.stress;

  // Rules run even when the solver failed: they report what they could not verify, so the
  // reviewer sees every unverified part; the status still makes the exit code 3.
  rules::CheckInput input{run.recognition->input(), *run.recognition, *run.stress, &run.corners, &run.in.sources};
  rules::RuleResults results = rules::run_rule_set(input, run.policy);
  rep.findings = std::move(results.findings);
  rep.ratings = std::move(results.ratings);
  std::vector<std::pair<std::string, std::string>> kinds;
  for (const auto& b : run.recognition->blocks) kinds.emplace_back(b.id, b.kind);
  rules::apply_waivers(run.waivers, rules::today_utc(), kinds, rep.findings);
  if (!baseline.empty()) rep.baseline_matched = drop_baseline_findings(baseline, rep.findings);
  // After waivers and the baseline, which name single parts: a waived part never merges with an unwaived one.
  rules::group_identical_findings(rep.findings);
  if (!run.stress->failure.empty()) fail(run, report::CheckStatus::analysis_failed, run.stress->failure);
  else if (!run.stress->inrush_failure.empty())
    fail(run, report::CheckStatus::analysis_failed, run.stress->inrush_failure);
}

int exit_code_for(const report::CheckReport& r, const std::string& fail_on) {
  if (r.status == report::CheckStatus::input_error) return kExitInputError;
  if (r.status == report::CheckStatus::analysis_failed) return kExitAnalysisFailure;
  if (fail_on == "never") return kExitClean;
  const rules::Severity threshold = fail_on == "note"      ? rules::Severity::note
                                    : fail_on == "warning" ? rules::Severity::warning
                                                           : rules::Severity::error;
  for (const auto& f : r.findings) {
    if (!f.waived_by && f.severity >= threshold) return kExitFindings;
  }
  return kExitClean;
}

}  // namespace mainscheck::cli
