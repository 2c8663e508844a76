#pragma once
// One check of one netlist: read, recognise, plan corners, compute stresses, apply the rules, and
// assemble the report. Kept out of the command so batch mode and fuzzing can call it.
#include <memory>
#include <optional>
#include <string>

#include "analysis/corners.hpp"
#include "analysis/recognition.hpp"
#include "analysis/stress.hpp"
#include "analysis/stress_engine.hpp"
#include "analysis/supply.hpp"
#include "cli/input.hpp"
#include "parser/parts_library.hpp"
#include "report/check_report.hpp"
#include "rules/policy.hpp"
#include "rules/waivers.hpp"

namespace mainscheck::cli {

/// Everything `check` was told, independent of the file being checked.
struct CheckSettings {
  InputOptions input;
  analysis::SupplyOptions supply;
  std::string corners = "worst";
  std::optional<std::string> tolerance;  // --tolerance text
  std::optional<analysis::SourceImpedance> source_impedance;  // --source-impedance
  std::string parts_file;
  std::string policy_file;
  std::string waivers_file;
  std::string baseline_file;
  /// Solver limits; the defaults suit real boards, the pipeline fuzz target tightens them.
  analysis::StressOptions stress;
};

/// The state of one check; owns everything the report points into.
struct CheckRun {
  /// After recognition, `in.netlist` is empty: the netlist moved into `recognition` (its input()).
  LoadedNetlist in;
  parser::PartsLibrary library;
  rules::Policy policy;
  std::vector<rules::Waiver> waivers;
  std::optional<analysis::RecognitionResult> recognition;
  analysis::CornerPlan corners;
  std::optional<analysis::StressResult> stress;
  report::CheckReport report;
};

/// Runs the pipeline on `file`; never throws for bad input (it becomes diagnostics and a status).
void run_check(const std::string& file, const CheckSettings& settings, CheckRun& run);

/// Exit code of one report: 2 input error, 3 analysis failure, 1 findings at or above `fail_on`, else 0.
int exit_code_for(const report::CheckReport& r, const std::string& fail_on);

}  // namespace mainscheck::cli
