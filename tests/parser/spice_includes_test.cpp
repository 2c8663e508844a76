// Checklist section H (.include, .lib) and the reader's resource limits (parser/limits.hpp).
#include <gtest/gtest.h>

#include <chrono>

#include "tests/parser/spice_test_util.hpp"

namespace mainscheck::parser {
namespace {

using testing::SpiceRead;

TEST(SpiceIncludes, RelativeToIncludingFile) {  // items 79, 80
  SpiceRead r;
  r.files.add("proj/models/frontend.inc", "R1 a b 1k\n.include rc.inc\n.include ../x.inc\n");
  r.files.add("proj/models/rc.inc", "C1 a b 1u\n");
  r.files.add("proj/x.inc", ".model DX D\n");
  r.read("t\n.include \"models/frontend.inc\"\nD1 a b DX\n", "proj/deck.cir");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_EQ(r.nl.parts.size(), 3u);
  EXPECT_EQ(r.sm.name(r.part("C1").loc.file), "proj/models/rc.inc");
}

TEST(SpiceIncludes, MissingFileAndDiagnosticsInIncludedFile) {  // items 80, 81
  SpiceRead r;
  r.files.add("bad.inc", "* first line is not a title\nR1 a b 1..5\n");
  r.read("t\n.include bad.inc\n.inc 'none.inc'\n");
  EXPECT_EQ(r.rendered(),
            "In file included from deck.cir:2:1:\n"
            "bad.inc:2:8: error: malformed number '1..5': unexpected second '.' for resistor R1\n"
            "  R1 a b 1..5\n"
            "         ^\n"
            "deck.cir:3:6: error: cannot read include file 'none.inc' (none.inc): No such file or directory\n"
            "  .inc 'none.inc'\n"
            "       ^\n");
}

TEST(SpiceIncludes, CycleIsAnErrorTwiceIsNot) {  // item 82
  SpiceRead r;
  r.files.add("a.inc", ".include b.inc\n");
  r.files.add("b.inc", ".include a.inc\n");
  r.files.add("m.inc", ".model DX D\n");
  r.read("t\n.include a.inc\n.include m.inc\n.include m.inc\n");
  const std::string out = r.rendered();
  EXPECT_NE(out.find("b.inc:1:10: error: include cycle: a.inc -> b.inc -> a.inc"), std::string::npos) << out;
  EXPECT_NE(out.find("m.inc:1:8: error: model 'DX' is already defined in this scope"), std::string::npos) << out;
  EXPECT_EQ(r.diags.error_count(), 2u) << out;
}

TEST(SpiceIncludes, LibSections) {  // items 83-85
  SpiceRead r;
  r.files.add("lib/parts.lib",
              "* library\nR9 stray 0 1\n.lib diodes\n.model D1N D(BV=1000)\n.lib more.lib extra\n.endl diodes\n"
              ".lib other\nR8 a 0 1\n.endl\n");
  r.files.add("lib/more.lib", ".lib extra\n.model DZ D(BV=5)\n.endl\n");
  r.read("t\n.lib lib/parts.lib diodes\nD1 a b D1N\nD2 a b DZ\n.lib lib/parts.lib nosuch\n.lib lib/parts.lib\n");
  EXPECT_EQ(r.nl.parts.size(), 2u);
  EXPECT_EQ(r.rendered(),
            "deck.cir:5:20: error: library 'lib/parts.lib' has no section 'nosuch'\n"
            "  .lib lib/parts.lib nosuch\n"
            "                     ^\n"
            "deck.cir:6:1: error: missing section name: write '.lib FILE SECTION'\n"
            "  .lib lib/parts.lib\n"
            "  ^\n");
}

TEST(SpiceIncludes, LibSectionSelectsAnotherSectionOfItsOwnFile) {  // issue 14 item 8
  // Model libraries share a section between corners: `typ` pulls `common` from the same file, as
  // ngspice-39 reads it (tests/data/ngspice/lib_self_section.cir). Only the same file and section
  // open twice is a cycle.
  SpiceRead r;
  r.files.add("models.lib",
              ".lib common\n.model DX D(IS=1n)\n.endl common\n"
              ".lib typ\n.lib 'models.lib' common\n.model DY D(IS=2n)\n.endl typ\n"
              ".lib loop\n.lib models.lib loop\n.endl loop\n"
              ".lib ping\n.lib models.lib pong\n.endl ping\n.lib pong\n.lib models.lib PING\n.endl pong\n");
  r.read("t\n.lib models.lib typ\nD1 a b DX\nD2 a b DY\n.lib models.lib loop\n.lib models.lib ping\n");
  EXPECT_EQ(r.nl.parts.size(), 2u);
  EXPECT_EQ(
      r.rendered(),
      "In file included from deck.cir:5:1:\n"
      "models.lib:9:6: error: include cycle: models.lib (section loop) -> models.lib (section loop)\n"
      "  .lib models.lib loop\n"
      "       ^\n"
      "In file included from models.lib:12:1:\n"
      "In file included from deck.cir:6:1:\n"
      "models.lib:15:6: error: include cycle: models.lib (section ping) -> models.lib (section pong) -> "
      "models.lib (section ping)\n"
      "  .lib models.lib PING\n"
      "       ^\n");
}

TEST(SpiceIncludes, UnclosedSection) {  // item 85
  SpiceRead r;
  r.files.add("p.lib", ".lib s\nR1 a 0 1\n");
  r.read("t\n.lib p.lib s\n");
  EXPECT_EQ(r.rendered(),
            "In file included from deck.cir:2:1:\n"
            "p.lib:1:1: error: '.lib' section is not closed with '.endl'\n"
            "  .lib s\n"
            "  ^\n");
}

TEST(SpiceIncludes, ConfinementRefusesOutsideTrees) {
  SpiceRead r;
  r.options.confine_includes = true;
  r.files.add("outside.inc", "R1 a 0 1\n");
  r.files.add("shared/ok.inc", "R2 a 0 1\n");
  r.options.include_paths = {"shared"};
  r.read("t\n.include ../outside.inc\n.include ../shared/ok.inc\n", "proj/deck.cir");
  EXPECT_EQ(r.rendered(),
            "proj/deck.cir:2:10: error: include file '../outside.inc' resolves to 'outside.inc', outside the netlist's "
            "directory and the allowed trees (add one with --include-path)\n"
            "  .include ../outside.inc\n"
            "           ^\n");
  EXPECT_TRUE(r.nl.find_part("R2"));
}

TEST(SpiceIncludes, DepthAndCountLimits) {
  SpiceRead r;
  r.options.limits.max_include_depth = 2;
  r.files.add("1.inc", ".include 2.inc\n");
  r.files.add("2.inc", ".include 3.inc\n");
  r.files.add("3.inc", "R1 a 0 1\n");
  r.read("t\n.include 1.inc\n");
  EXPECT_NE(r.rendered().find("2.inc:1:10: error: includes are nested more than 2 levels deep (--max-include-depth)"),
            std::string::npos);

  SpiceRead c;
  c.options.limits.max_included_files = 2;
  c.files.add("m.inc", "* empty\n");
  c.read("t\n.include m.inc\n.include m.inc\n.include m.inc\n");
  EXPECT_EQ(c.rendered(),
            "deck.cir:4:10: error: more than 2 included files (--max-included-files)\n"
            "  .include m.inc\n"
            "           ^\n");
}

TEST(SpiceLimits, SubcktBombRefusedQuickly) {
  // Ten levels that each instantiate the next one ten times: 10^10 parts if expanded.
  std::string deck = "bomb\nX0 a b0\n";
  for (int i = 0; i < 10; ++i) {
    deck += ".subckt b" + std::to_string(i) + " p\n";
    for (int j = 0; j < 10; ++j) deck += "X" + std::to_string(j) + " p b" + std::to_string(i + 1) + "\n";
    deck += ".ends\n";
  }
  deck += ".subckt b10 p\nR1 p 0 1\n.ends\n";
  SpiceRead r;
  const auto t0 = std::chrono::steady_clock::now();
  r.read(deck);
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  EXPECT_LT(seconds, 0.5);
  EXPECT_TRUE(r.nl.parts.empty());
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:1: error: flattening would create 10000000000 parts, more than the limit of 5000000 "
            "(--max-parts); instance X0 of 'b0' alone expands to 10000000000 parts\n"
            "  X0 a b0\n"
            "  ^\n");
}

TEST(SpiceLimits, SubcktDepthLimit) {
  std::string deck = "deep\nX0 a s0\n";
  for (int i = 0; i < 5; ++i) deck += ".subckt s" + std::to_string(i) + " p\nX1 p s" + std::to_string(i + 1) + "\n.ends\n";
  deck += ".subckt s5 p\nR1 p 0 1\n.ends\n";
  SpiceRead r;
  r.options.limits.max_subckt_depth = 3;
  r.read(deck);
  EXPECT_EQ(r.diags.error_count(), 1u);
  EXPECT_NE(r.rendered().find("error: subcircuit instances are nested more than 3 levels deep (--max-subckt-depth)"),
            std::string::npos);
}

TEST(SpiceLimits, ParameterChainDepth) {
  // q1000=1, q0999={q1000+1}, ... q0960: evaluated in name order, q0960 needs the whole chain at once.
  std::string deck = "chain\n.param q1000=1\n";
  for (int i = 999; i >= 960; --i) deck += ".param q0" + std::to_string(i) + "={q" + (i + 1 == 1000 ? std::string("1000") : "0" + std::to_string(i + 1)) + "+1}\n";
  deck += "R1 a 0 {q0960}\n";
  SpiceRead ok;
  ok.read(deck);
  EXPECT_EQ(ok.rendered(), "");
  EXPECT_DOUBLE_EQ(*ok.part("R1").value, 41.0);
  SpiceRead r;
  r.options.limits.max_expression_depth = 10;
  r.read(deck);
  EXPECT_NE(r.rendered().find("(--max-expression-depth)"), std::string::npos);
  EXPECT_FALSE(r.part("R1").value);
}

}  // namespace
}  // namespace mainscheck::parser
