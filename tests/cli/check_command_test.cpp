// Exit codes of `mainscheck check` (cli/exit_codes.hpp, docs/cli.md): 0 clean at the threshold,
// 1 findings at or above --fail-on, 2 usage or input error, 3 analysis failure.
#include <gtest/gtest.h>

#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

int exit_of(const std::vector<std::string>& args) {
  const ProcessResult r = run_mainscheck(args);
  EXPECT_TRUE(r.exited()) << r.error;
  return r.exit_code;
}

// tests/data/cli/clean-heater.cir: 300 V AC, 5 A fuse and a 529 Ω, 1 kW heater. At the 253 V high
// line (230 V + 10 %) the heater draws 253 / 529 = 0.478 A and dissipates 121 W (Ohm's law), far
// inside every rating.
TEST(CheckExitCode, CleanNetlistExitsZero) {
  const ProcessResult r = run_mainscheck({"check", "tests/data/cli/clean-heater.cir"});
  ASSERT_TRUE(r.exited());
  EXPECT_EQ(r.exit_code, 0) << r.out << r.err;
  EXPECT_NE(r.out.find("summary: 0 error(s), 0 warning(s)"), std::string::npos) << r.out;
  EXPECT_EQ(r.out.find("INCOMPLETE"), std::string::npos);
}

TEST(CheckExitCode, ErrorFindingExitsOne) {
  // A 125 V fuse on 230 V mains: voltage-rating.fuse error (IEC 60038 nominal against the rating).
  const ProcessResult r = run_mainscheck({"check", "tests/data/cli/fuse-underrated.cir"});
  ASSERT_TRUE(r.exited());
  EXPECT_EQ(r.exit_code, 1);
  EXPECT_NE(r.out.find("RF1 circuit voltage 230 V exceeds its 125 V rating"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("[voltage-rating.fuse]"), std::string::npos);
}

TEST(CheckExitCode, FailOnLevelsGateOnlyAtOrAboveTheThreshold) {
  // Only a warning: the indicator resistor runs above its derated power (power-rating.resistor).
  const std::string warn_only = "tests/data/cli/indicator-resistor-warm.cir";
  EXPECT_EQ(exit_of({"check", warn_only}), 0);  // default --fail-on error
  EXPECT_EQ(exit_of({"check", "--fail-on", "error", warn_only}), 0);
  EXPECT_EQ(exit_of({"check", "--fail-on", "warning", warn_only}), 1);
  EXPECT_EQ(exit_of({"check", "--fail-on", "note", warn_only}), 1);
  EXPECT_EQ(exit_of({"check", "--fail-on", "never", warn_only}), 0);
  EXPECT_EQ(exit_of({"check", "--fail-on", "never", "tests/data/cli/fuse-underrated.cir"}), 0);
  EXPECT_EQ(exit_of({"check", "--fail-on", "warning", "tests/data/cli/clean-heater.cir"}), 0);
}

TEST(CheckExitCode, LimitsThatWouldWrapAreUsageErrors) {
  // A negative, zero, fractional or overflowing limit must not wrap round to a huge bound (issue 15).
  const std::string deck = "tests/data/cli/clean-heater.cir";
  for (const char* bad : {"-1", "0", "1.5", "18446744073709551616", "2^64", "1e6", "", "ten", "+5"}) {
    EXPECT_EQ(exit_of({"check", "--max-parts", bad, deck}), 2) << bad;
    EXPECT_EQ(exit_of({"check", "--max-expression-depth", bad, deck}), 2) << bad;
  }
  EXPECT_EQ(exit_of({"check", "--max-xml-attributes", "-1", deck}), 2);
  EXPECT_EQ(exit_of({"check", "--max-subckt-depth", "281474976710657", deck}), 2);  // 2^48 + 1
}

TEST(CheckExitCode, DeepExpressionUnderARaisedLimitIsRead) {
  // Issue 15 item 15: a 100 000-deep expression under --max-expression-depth 1000000 crashed with
  // SIGSEGV. The evaluator no longer recurses, so any limit is safe, also under the sanitizers.
  TempDir dir("deep-expression");
  ASSERT_FALSE(dir.path().empty());
  const auto deep = dir.path() / "deep.cir";
  write_file(deep,
             "deep expression\n*@supply line=L neutral=N mains=230V+-10%/50Hz\nV1 L N SIN(0 325.27 50)\n"
             "*@part RF1 type=fuse i_rated=5 v_rated_ac=300 i2t_melt=50\nRF1 L LF 0.02\n"
             ".param X={" +
                 std::string(100000, '(') + "1" + std::string(100000, ')') +
                 "}\n"
                 "*@part RH1 type=heater p_rated=1000 v_rated=600\nRH1 LF N {X*529}\n.end\n");
  const ProcessResult r = run_mainscheck({"check", "--max-expression-depth", "1000000", deep.string()});
  ASSERT_TRUE(r.exited()) << r.error << " signal " << r.term_signal;
  EXPECT_EQ(r.exit_code, 0) << r.out << r.err.substr(0, 2000);
  // At the default limit the same deck is an input error at the 257th parenthesis, not a crash.
  const ProcessResult refused = run_mainscheck({"check", deep.string()});
  ASSERT_TRUE(refused.exited()) << refused.error;
  EXPECT_EQ(refused.exit_code, 2);
  EXPECT_NE(refused.err.find("deep.cir:6:267: error: expression nests deeper than the limit of 256 levels"),
            std::string::npos)
      << refused.err.substr(0, 2000);
}

TEST(CheckExitCode, UsageAndInputErrorsExitTwo) {
  EXPECT_EQ(exit_of({"check", "--fail-on", "sometimes", "tests/data/cli/clean-heater.cir"}), 2);
  EXPECT_EQ(exit_of({"check", "--format", "pdf", "tests/data/cli/clean-heater.cir"}), 2);
  EXPECT_EQ(exit_of({"check", "--output", "pdf=x.pdf", "tests/data/cli/clean-heater.cir"}), 2);
  EXPECT_EQ(exit_of({"check"}), 2);
  EXPECT_EQ(exit_of({"frobnicate"}), 2);
  const ProcessResult missing = run_mainscheck({"check", "tests/data/cli/no-such-netlist.cir"});
  EXPECT_EQ(missing.exit_code, 2);
  EXPECT_NE(missing.err.find("no-such-netlist.cir"), std::string::npos) << missing.err;
  // A netlist with a syntax error is bad input, and the report must not read as a pass.
  const ProcessResult bad = run_mainscheck({"check", "tests/data/bad/missing_value.cir"});
  EXPECT_EQ(bad.exit_code, 2) << bad.out << bad.err;
  EXPECT_NE(bad.out.find("INCOMPLETE"), std::string::npos) << bad.out;
}

TEST(CheckExitCode, UnmodellablePartExitsThreeEvenWithFailOnNever) {
  // A BJT straight across the mains: the solver has no transistor model, so no stress is known.
  const ProcessResult r = run_mainscheck({"check", "tests/data/cli/bjt-across-mains.cir"});
  ASSERT_TRUE(r.exited());
  EXPECT_EQ(r.exit_code, 3);
  EXPECT_NE(r.out.find("CHECK INCOMPLETE"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("Q1 (transistor) cannot be modelled"), std::string::npos) << r.out;
  // --fail-on never applies to a completed check only; an incomplete one is never a pass.
  EXPECT_EQ(exit_of({"check", "--fail-on", "never", "tests/data/cli/bjt-across-mains.cir"}), 3);
}

TEST(CheckExitCode, BatchExitCodeIsTheWorstOfItsNetlists) {
  EXPECT_EQ(exit_of({"check", "tests/data/cli/clean-heater.cir", "tests/data/cli/fuse-underrated.cir"}), 1);
  EXPECT_EQ(exit_of({"check", "tests/data/cli/fuse-underrated.cir", "tests/data/cli/bjt-across-mains.cir"}),
            3);
}

TEST(CheckOutput, OutputOptionWritesEachFormatToItsFile) {
  TempDir dir("outputs");
  ASSERT_FALSE(dir.path().empty());
  const auto json = dir.path() / "r.json";
  const auto md = dir.path() / "r.md";
  const ProcessResult r =
      run_mainscheck({"-q", "check", "tests/data/cli/fuse-underrated.cir", "--format", "json", "--output",
                      "json=" + json.string(), "--output", "markdown=" + md.string()});
  ASSERT_TRUE(r.exited());
  EXPECT_EQ(r.exit_code, 1);
  EXPECT_EQ(slurp(json), r.out);  // the file holds the same document as stdout
  EXPECT_NE(slurp(md).find("voltage-rating.fuse"), std::string::npos);
}

}  // namespace
}  // namespace mainscheck::test_support
