// "Never a silent pass" (docs/robustness.md): input the checker does not fully understand gives a
// located diagnostic and a result that is not clean. Each case edits one line of the night-light
// example (examples/nightlight-half-wave.cir, clean with exit 0 as committed) and runs `check`.
#include <gtest/gtest.h>

#include <cctype>
#include <string>
#include <vector>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

namespace fs = std::filesystem;

/// The example with the line starting `old_line` replaced by `new_line`, written to `dir/name`.
void write_variant(const fs::path& dir, const std::string& name, const std::string& old_line,
                   const std::string& new_line) {
  std::string text = slurp(fs::path(MAINSCHECK_SOURCE_DIR) / "examples" / "nightlight-half-wave.cir");
  const std::size_t at = text.find("\n" + old_line);
  ASSERT_NE(at, std::string::npos) << old_line;
  const std::size_t end = text.find('\n', at + 1);
  text.replace(at + 1, end - at - 1, new_line);
  write_file(dir / name, text);
}

ProcessResult check_in(const fs::path& dir, std::vector<std::string> args) {
  std::vector<std::string> argv{MAINSCHECK_BINARY, "-q", "check"};
  argv.insert(argv.end(), args.begin(), args.end());
  ProcessOptions opt;
  opt.working_dir = dir.string();
  opt.timeout = std::chrono::seconds(120);
  opt.env = {{"NO_COLOR", "1"}, {"SOURCE_DATE_EPOCH", kFixedEpoch}};
  return run_process(argv, opt);
}

bool has(const std::string& s, const std::string& what) { return s.find(what) != std::string::npos; }

TEST(NeverSilent, TheUneditedExampleIsClean) {
  TempDir tmp("silent");
  write_variant(tmp.path(), "deck.cir", "RB1 ", "RB1 DC N 470k v_rated=500 p_rated=1");
  const ProcessResult r = check_in(tmp.path(), {"deck.cir"});
  EXPECT_EQ(r.exit_code, 0) << r.out << r.err;
}

TEST(NeverSilent, UnknownElementLetterIsALocatedError) {
  TempDir tmp("silent");
  write_variant(tmp.path(), "deck.cir", "RB1 ", "ZB1 DC N 470k");
  const ProcessResult r = check_in(tmp.path(), {"deck.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_TRUE(has(r.err, "deck.cir:10:1: error: unknown element type 'Z'")) << r.err;
}

TEST(NeverSilent, UnsupportedElementTypeIsALocatedError) {
  TempDir tmp("silent");
  write_variant(tmp.path(), "deck.cir", "RB1 ", "YB1 DC N 470k");
  const ProcessResult r = check_in(tmp.path(), {"deck.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_TRUE(has(r.err, "deck.cir:10:1: error: unsupported element type 'Y'")) << r.err;
}

TEST(NeverSilent, UnresolvedSubcircuitIsALocatedError) {
  TempDir tmp("silent");
  write_variant(tmp.path(), "deck.cir", "RB1 ", "XB1 DC N bleeder");
  const ProcessResult r = check_in(tmp.path(), {"deck.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_TRUE(has(r.err, "deck.cir:10:10: error: unknown subcircuit 'bleeder' in instance XB1")) << r.err;
}

TEST(NeverSilent, UnsupportedSourceFormMakesTheCheckNotVerified) {
  for (const std::string form : {"TRNOISE(1 1n 0 0)", "AM(325 0 50 1 0)"}) {
    TempDir tmp("silent");
    write_variant(tmp.path(), "deck.cir", "VMAINS ", "VMAINS L N " + form);
    const ProcessResult r = check_in(tmp.path(), {"deck.cir"});
    EXPECT_EQ(r.exit_code, 3) << form << "\n" << r.out << r.err;
    const std::string wave = form.substr(0, form.find('('));
    std::string lower;
    for (char c : wave) lower += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    EXPECT_TRUE(has(r.out, "source VMAINS waveform " + lower + " is not supported by the solver")) << r.out;
    // Every block's stresses are reported unverified, each at the block's first part.
    EXPECT_TRUE(has(r.out, "deck.cir:7:1: error: stresses of")) << r.out;
    EXPECT_TRUE(has(r.out, "[stress-unverified]")) << r.out;
  }
}

TEST(NeverSilent, PartWithoutRatingOnTheMainsIsALocatedErrorThatGatesByDefault) {
  TempDir tmp("silent");
  write_variant(tmp.path(), "deck.cir", "*@part C1 ", "* C1 carries no rating in this variant");
  const ProcessResult r = check_in(tmp.path(), {"deck.cir"});
  // An error on the mains side (issue 15 item 5, docs/robustness.md): the default --fail-on error
  // never passes an unchecked front end, and the rule's verdict is not "pass".
  EXPECT_EQ(r.exit_code, 1) << r.out << r.err;
  EXPECT_TRUE(has(r.out, "deck.cir:9:1: error: C1 has no voltage rating (v_rated or v_rated_ac)")) << r.out;
  EXPECT_TRUE(has(r.out, "[rating-unknown]")) << r.out;
  const ProcessResult junit = check_in(tmp.path(), {"--format", "junit", "deck.cir"});
  EXPECT_TRUE(has(junit.out, "rating-unknown")) << junit.out;
}

// Issue 15: a rating of zero, a negative or non-finite one, or one with text after the number is an
// input error at the value (exit 2), from every source, never a pass and never merely "unknown".
TEST(NeverSilent, ARatingThatWouldPassAnyStressIsAnInputError) {
  struct Case {
    std::string old_line, new_line, at, message;
  };
  const std::vector<Case> cases{
      {"*@part C1 ", "*@part C1 v_rated=0", "deck.cir:8:19",
       "v_rated=0 V on C1 must be a finite number greater than zero"},
      {"*@part RS1 ", "*@part RS1 type=fusible-resistor p_rated=0 e_pulse=2", "deck.cir:5:42",
       "p_rated=0 W on RS1 must be a finite number greater than zero"},
      {"*@part RS1 ", "*@part RS1 type=fuse i_rated=0 v_rated_ac=250", "deck.cir:5:30",
       "i_rated=0 A on RS1 must be a finite number greater than zero"},
      {"*@part RS1 ", "*@part RS1 type=fuse i_rated=1 v_rated_ac=0", "deck.cir:5:43",
       "v_rated_ac=0 V on RS1 must be a finite number greater than zero"},
      {"D1 ", "D1 A DC D1N4007 v_rated=0", "deck.cir:7:25",
       "v_rated=0 V on D1 must be a finite number greater than zero"},
      {"*@part C1 ", "*@part C1 v_rated=-400", "deck.cir:8:19",
       "v_rated=-400 V on C1 must be a finite number greater than zero"},
      {"*@part C1 ", "*@part C1 v_rated=inf", "deck.cir:8:19",
       "invalid value 'inf' for v_rated of C1: 'inf' is not a number"},
      {"*@part RS1 ", "*@part RS1 type=fusible-resistor p_rated=1/4X e_pulse=2", "deck.cir:5:45",
       "invalid value '1/4X' for p_rated of RS1: unexpected 'X' after the number 1/4"},
  };
  for (const Case& c : cases) {
    TempDir tmp("silent");
    write_variant(tmp.path(), "deck.cir", c.old_line, c.new_line);
    const ProcessResult r = check_in(tmp.path(), {"deck.cir"});
    EXPECT_EQ(r.exit_code, 2) << c.new_line << "\n" << r.out << r.err;
    EXPECT_TRUE(has(r.err, c.at + ": error: " + c.message)) << c.new_line << "\n" << r.err;
  }
}

TEST(NeverSilent, AFractionalPowerRatingIsReadExactly) {
  // `1/4W` as bills of materials write it was read as 1 W with a "trailing text ignored" warning.
  TempDir tmp("silent");
  write_variant(tmp.path(), "deck.cir", "*@part RLED ", "*@part RLED role=load p_rated=1/4W");
  const ProcessResult r = check_in(tmp.path(), {"deck.cir"});
  EXPECT_EQ(r.exit_code, 1) << r.out << r.err;
  EXPECT_FALSE(has(r.err, "warning")) << r.err;
  EXPECT_TRUE(has(r.out, "deck.cir:12:1: error: RLED dissipation 3.57 W exceeds its 250 mW rating")) << r.out;
}

TEST(NeverSilent, ModelParametersThatAreNotNumbersAreInputErrors) {
  TempDir tmp("silent");
  write_variant(tmp.path(), "deck.cir", ".model D1N4007 ", ".model D1N4007 D(IS=nan N=bogus BV=inf)");
  const ProcessResult r = check_in(tmp.path(), {"deck.cir"});
  EXPECT_EQ(r.exit_code, 2) << r.out << r.err;
  EXPECT_TRUE(
      has(r.err, "deck.cir:13:21: error: value 'nan' of model D1N4007 parameter 'IS' is not a number"))
      << r.err;
  EXPECT_TRUE(
      has(r.err, "deck.cir:13:27: error: value 'bogus' of model D1N4007 parameter 'N' is not a number"))
      << r.err;
  EXPECT_TRUE(
      has(r.err, "deck.cir:13:36: error: value 'inf' of model D1N4007 parameter 'BV' is not a number"))
      << r.err;
}

TEST(NeverSilent, AnXmlRatingOfZeroIsAnInputError) {
  TempDir tmp("silent");
  std::string text = slurp(fs::path(MAINSCHECK_SOURCE_DIR) / "examples" / "bench_supply.xml");
  const std::size_t at = text.find("v_rated=\"35V\"");
  ASSERT_NE(at, std::string::npos);
  text.replace(at, 13, "v_rated=\"0V\"");
  write_file(tmp.path() / "supply.xml", text);
  const ProcessResult r = check_in(tmp.path(), {"supply.xml"});
  EXPECT_EQ(r.exit_code, 2) << r.out << r.err;
  EXPECT_TRUE(
      has(r.err, "supply.xml:36:61: error: v_rated=0 V on C1 must be a finite number greater than zero"))
      << r.err;
}

TEST(NeverSilent, ASolverLimitMakesTheCheckNotVerified) {
  TempDir tmp("silent");
  write_variant(tmp.path(), "deck.cir", "RB1 ", "RB1 DC N 470k");
  const ProcessResult r = check_in(tmp.path(), {"deck.cir", "--max-time-steps", "10"});
  EXPECT_EQ(r.exit_code, 3) << r.out << r.err;
  EXPECT_TRUE(has(r.out, "the step limit of 10 time steps was reached")) << r.out;
  EXPECT_TRUE(has(r.out, "[stress-unverified]")) << r.out;
}

TEST(NeverSilent, ASolverLimitOfZeroIsAUsageError) {
  TempDir tmp("silent");
  write_variant(tmp.path(), "deck.cir", "RB1 ", "RB1 DC N 470k");
  for (const char* option : {"--max-time-steps", "--max-newton-iterations", "--max-shooting-iterations"}) {
    const ProcessResult r = check_in(tmp.path(), {"deck.cir", option, "0"});
    EXPECT_EQ(r.exit_code, 2) << option << r.err;
  }
}

}  // namespace
}  // namespace mainscheck::test_support
