// Checklist section A (lines, comments, continuation) of shared/reference/spice-syntax.md.
#include <gtest/gtest.h>

#include "tests/parser/spice_test_util.hpp"

namespace mainscheck::parser {
namespace {

using testing::SpiceRead;

TEST(SpiceLines, TitleLineIsNeverAPart) {  // item 1
  SpiceRead r;
  r.read("R1 a b 1k\nR2 a b 2k\n");
  EXPECT_EQ(r.nl.title, "R1 a b 1k");
  EXPECT_EQ(r.nl.parts.size(), 1u);
  EXPECT_EQ(r.nl.parts[0].ref, "R2");
}

TEST(SpiceLines, DotTitleReplacesTitle) {  // item 2
  SpiceRead r;
  r.read("first\n.title 65 W adapter\nR1 a 0 1\n");
  EXPECT_EQ(r.nl.title, "65 W adapter");
}

TEST(SpiceLines, CommentForms) {  // items 3, 5, 6, 7
  SpiceRead r;
  r.read("t\n   * bleeder values\n; whole line\nR1 a b 1k;fuse\nR2 a b 2k $bleeder\nR3 a b 6k$x\n"
         "C1 a b 330n // X2 cap\n$ dollar line\n");
  EXPECT_DOUBLE_EQ(*r.part("R1").value, 1e3);
  EXPECT_DOUBLE_EQ(*r.part("R2").value, 2e3);
  EXPECT_DOUBLE_EQ(*r.part("R3").value, 6e3);
  EXPECT_DOUBLE_EQ(*r.part("C1").value, 330e-9);
  EXPECT_EQ(r.nl.parts.size(), 4u);
}

TEST(SpiceLines, ContinuationSkipsCommentsAndBlanks) {  // item 9
  SpiceRead r;
  r.read("t\nLB hv sw\n* note\n\n   + 470u\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_DOUBLE_EQ(*r.part("LB").value, 470e-6);
}

TEST(SpiceLines, ContinuationWithoutStatementIsAnError) {  // items 10, 106
  SpiceRead r;
  r.read("title\n+ 1k\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:1: error: continuation line '+' has no statement to continue\n"
            "  + 1k\n"
            "  ^\n");
}

TEST(SpiceLines, ErrorInContinuedStatementPointsAtPhysicalLine) {  // item 11
  SpiceRead r;
  r.read("t\nR1 a b\n* c\n+ 1..5\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:4:3: error: malformed number '1..5': unexpected second '.' for resistor R1\n"
            "  + 1..5\n"
            "    ^\n");
}

TEST(SpiceLines, CaseInsensitive) {  // item 12
  SpiceRead r;
  r.read("t\n.PARAM RLOAD=2k\nrx A b {rload}\n.SubCkt s1 p q\nR1 p q 1\n.ENDS S1\nX1 a B S1\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_DOUBLE_EQ(*r.part("RX").value, 2e3);
  EXPECT_EQ(r.part("x1.r1").nets, r.part("rx").nets);
}

TEST(SpiceLines, CrlfBomAndNoFinalNewline) {  // item 14
  SpiceRead r;
  r.read("\xEF\xBB\xBFtitle\r\nR1 a b 1k\r\nR2 a b 2k");
  EXPECT_EQ(r.nl.title, "title");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_EQ(r.nl.parts.size(), 2u);
}

TEST(SpiceLines, EndStopsReadingWithWarning) {  // item 15
  SpiceRead r;
  r.read("t\nR1 a b 1k\n.end\n* fine\nR2 a b 1k\n");
  EXPECT_EQ(r.nl.parts.size(), 1u);
  EXPECT_EQ(r.rendered(),
            "deck.cir:5:1: warning: text after '.end' is ignored (ngspice would read it)\n"
            "  R2 a b 1k\n"
            "  ^\n");
}

TEST(SpiceLines, ControlBlocksAreSkipped) {  // item 87
  SpiceRead r;
  r.read("t\n.control\nR97 a b 12\nlet r1 = 5\nrun\n.endc\nR1 a b 1\n.control\nquit\n.endc\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_EQ(r.nl.parts.size(), 1u);
}

TEST(SpiceLines, UnterminatedControlIsAnError) {  // item 87
  SpiceRead r;
  r.read("t\nR1 a b 1\n.control\nrun\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:3:1: error: '.control' block is not closed with '.endc'\n"
            "  .control\n"
            "  ^\n");
}

TEST(SpiceLines, LineLengthLimit) {
  SpiceRead r;
  r.options.limits.max_line_bytes = 20;
  r.read("t\nR1 a b 1k\nR2 aaaaaaaaaaaa bbbbbbbbbbbbbb 1k\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:3:1: error: line is 33 bytes long, more than the limit of 20 bytes (--max-line-length)\n"
            "  R2 aaaaaaaaaaaa bbbbbbbbbbbbbb 1k\n"
            "  ^\n");
}

TEST(SpiceLines, AnalysisLinesSkippedUnknownDotWarns) {  // items 88, 91
  SpiceRead r;
  r.read("t\n.tran 1u 10m\n+ 0 1u\n.options reltol=1e-4\n.foo bar\nR1 a 0 1\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:5:1: warning: unknown dot-command '.foo' ignored\n"
            "  .foo bar\n"
            "  ^\n");
}

}  // namespace
}  // namespace mainscheck::parser

// Bytes no statement can hold (docs/robustness.md "Bytes and encodings"): located errors in
// statements, accepted in the title and in comments; UTF-8 well-formedness per RFC 3629.
namespace mainscheck::parser {
namespace {

using testing::SpiceRead;
using namespace std::string_literals;

TEST(SpiceLinesBytes, NulByteAnywhereIsAnError) {
  SpiceRead r;
  r.read("t\nR1 a 0 1k\n* note \0 here\nR2 a 0 2k\n"s);
  EXPECT_EQ(r.rendered(),
            "deck.cir:3:8: error: NUL byte in the netlist (binary or corrupted file?)\n"
            "  * note ? here\n"
            "         ^\n");
  EXPECT_EQ(r.nl.parts.size(), 2u);
}

TEST(SpiceLinesBytes, ControlCharacterInAStatementIsAnErrorAndTheStatementIsDropped) {
  SpiceRead r;
  r.read("t\nR1 a 0 1k\x07\nR2 a 0 2k\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:10: error: control character 0x07 in a statement\n"
            "  R1 a 0 1k?\n"
            "           ^\n");
  EXPECT_EQ(r.nl.parts.size(), 1u);
}

TEST(SpiceLinesBytes, BlanksAndFormFeedAreNotControlErrors) {
  SpiceRead r;
  r.read("t\nR1\ta\t0 1k\f\nR2 a 0 2k\v\r\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_EQ(r.nl.parts.size(), 2u);
}

TEST(SpiceLinesBytes, MalformedUtf8InStatementsIsLocated) {
  // Each sequence is malformed by RFC 3629 section 4 / Unicode Table 3-7: a stray continuation
  // byte, an overlong '/', a surrogate, a code point above U+10FFFF, a truncated sequence, 0xFF.
  for (const std::string bad : {"\x80", "\xC0\xAF", "\xED\xA0\x80", "\xF4\x90\x80\x80", "\xE2\x82", "\xFF"}) {
    SpiceRead r;
    r.read("t\nR1 n" + bad + " 0 1k\nR2 a 0 2k\n");
    ASSERT_EQ(r.diags.error_count(), 1u) << r.rendered();
    EXPECT_EQ(r.rendered().rfind("deck.cir:2:5: error: byte 0x", 0), 0u) << r.rendered();
    EXPECT_NE(r.rendered().find("is not valid UTF-8"), std::string::npos) << r.rendered();
    EXPECT_EQ(r.nl.parts.size(), 1u);
  }
}

TEST(SpiceLinesBytes, WellFormedUtf8IsAccepted) {
  // Two-, three- and four-byte forms at the edges of their ranges (U+0080, U+07FF, U+0800, U+FFFD,
  // U+10000, U+10FFFF) and the micro sign as a suffix.
  SpiceRead r;
  r.read("t\nR1 n\xC2\x80 n\xDF\xBF 1k\nR2 n\xE0\xA0\x80 n\xEF\xBF\xBD 1k\nR3 n\xF0\x90\x80\x80 n\xF4\x8F\xBF\xBF 1k\n"
         "C1 a 0 2.2\xC2\xB5\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_EQ(r.nl.parts.size(), 4u);
  EXPECT_DOUBLE_EQ(*r.part("C1").value, 2.2e-6);
}

TEST(SpiceLinesBytes, Latin1InTitleAndCommentsIsAccepted) {
  SpiceRead r;
  r.read("Caf\xE9 lamp\n* r\xE9sistance\nR1 a 0 1k ; \xB5\nR2 a 0 2k $ \xFF\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_EQ(r.nl.parts.size(), 2u);
}

TEST(SpiceLinesBytes, MalformedUtf8InAnAnnotationIsAnError) {
  SpiceRead r;
  r.read("t\n*@part R1 v_rated=400\xFF\nR1 a 0 1k\n");
  EXPECT_EQ(r.diags.error_count(), 1u) << r.rendered();
  EXPECT_EQ(r.rendered().rfind("deck.cir:2:22: error: byte 0xff is not valid UTF-8", 0), 0u) << r.rendered();
}

}  // namespace
}  // namespace mainscheck::parser
