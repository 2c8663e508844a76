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
