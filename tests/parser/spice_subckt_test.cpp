// Checklist sections F, G, I, J (subcircuits, parameters, .global, nets) of
// shared/reference/spice-syntax.md.
#include <gtest/gtest.h>

#include "tests/parser/spice_test_util.hpp"

namespace mainscheck::parser {
namespace {

using testing::SpiceRead;

TEST(SpiceSubckt, FlattensNestedInstances) {  // items 57, 60, 61, 96
  SpiceRead r;
  r.read("t\nXIN l n filt\n.subckt filt a b\nXflt a b flt2\n.ends filt\n"
         ".subckt flt2 p q\nRd p mid 10\nCd mid q 1u\nXdamp mid q damp\n.ends\n"
         ".subckt damp x y\nRd x y 1k\n.ends\n");
  EXPECT_EQ(r.rendered(), "");
  ASSERT_EQ(r.nl.parts.size(), 3u);
  EXPECT_EQ(r.nl.parts[0].ref, "XIN.Xflt.Rd");
  EXPECT_EQ(r.net_of("XIN.Xflt.Rd", 0), "l");
  EXPECT_EQ(r.net_of("XIN.Xflt.Rd", 1), "xin.xflt.mid");
  EXPECT_EQ(r.net_of("XIN.Xflt.Cd", 1), "n");
  EXPECT_EQ(r.net_of("XIN.Xflt.Xdamp.Rd", 0), "xin.xflt.mid");
  EXPECT_EQ(r.part("XIN.Xflt.Xdamp.Rd").instance_path.size(), 3u);
}

TEST(SpiceSubckt, GroundAndGlobalsAreNotPrefixed) {  // items 60, 89, 93
  SpiceRead r;
  r.read("t\n.global vaux\nX1 a s\n.subckt s p\nRv mid vaux 100k\nRg mid GND 1\nR0 p 0 1\n.ends\n");
  EXPECT_EQ(r.net_of("X1.Rv", 1), "vaux");
  EXPECT_EQ(r.part("X1.Rg").nets[1], kGroundNet);
  EXPECT_EQ(r.part("X1.R0").nets[1], kGroundNet);
  EXPECT_EQ(r.net_of("X1.R0", 0), "a");
}

TEST(SpiceSubckt, ParamsDefaultsOverridesAndScopes) {  // items 58, 59, 63
  SpiceRead r;
  r.read("t\n.param rsn=47 csn=10n rload=1k\n"
         ".subckt snub a b params: r={rsn} c={csn}\nR1 a m {r}\nC1 m b {c}\n.ends\n"
         ".subckt divider top bot ratio=100 rtot=1MEG\n.param rloc={rload/2}\nR1 top mid {rtot/ratio}\nR2 mid bot {rloc}\n.ends\n"
         "XS1 p1 p2 snub\nXS2 p2 p3 snub r=100\nXS3 p3 0 snub params: c=22n\nXS4 p1 0 snub r={rsn*2}\n"
         ".param rload=10\nXD a 0 divider ratio=10\n");
  EXPECT_EQ(r.diags.error_count(), 0u) << r.rendered();
  EXPECT_DOUBLE_EQ(*r.part("XS1.R1").value, 47.0);
  EXPECT_DOUBLE_EQ(*r.part("XS2.R1").value, 100.0);
  EXPECT_DOUBLE_EQ(*r.part("XS3.C1").value, 22e-9);
  EXPECT_DOUBLE_EQ(*r.part("XS4.R1").value, 94.0);
  EXPECT_DOUBLE_EQ(*r.part("XD.R1").value, 1e5);
  EXPECT_DOUBLE_EQ(*r.part("XD.R2").value, 5.0);  // last .param rload=10 wins everywhere (item 74)
  EXPECT_NE(r.rendered().find("deck.cir:16:8: warning: parameter 'rload' redefined; the last definition is used "
                              "everywhere, like ngspice"),
            std::string::npos);
}

TEST(SpiceSubckt, OverrideEvaluatedInCallerScope) {  // item 59
  SpiceRead r;
  r.read("t\n.param k=2\n.subckt inner a params: v=1\nR1 a 0 {v}\n.ends\n"
         ".subckt outer a params: k=5\nXI a inner v={k}\n.ends\nXO n outer\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_DOUBLE_EQ(*r.part("XO.XI.R1").value, 5.0);
}

TEST(SpiceSubckt, UndeclaredOverridePinMismatchUnknown) {  // items 59, 64, 65
  SpiceRead r;
  r.read("t\n.subckt s a b params: r=1\nR1 a b {r}\n.ends\nX1 p q s q=3\nX2 p s\nX3 p q nosuch\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:5:10: error: subcircuit 's' has no parameter 'q' (instance X1)\n"
            "  X1 p q s q=3\n"
            "           ^\n"
            "deck.cir:6:1: error: instance X2 connects 1 nodes but subcircuit 's' has 2 pins (a b)\n"
            "  X2 p s\n"
            "  ^\n"
            "deck.cir:2:9: note: 's' is defined here\n"
            "  .subckt s a b params: r=1\n"
            "          ^\n"
            "deck.cir:7:8: error: unknown subcircuit 'nosuch' in instance X3\n"
            "  X3 p q nosuch\n"
            "         ^\n");
}

TEST(SpiceSubckt, RecursionIsAnError) {  // item 66
  SpiceRead r;
  r.read("t\nX1 a A\n.subckt A p\nX2 p B\n.ends\n.subckt B p\nXback p A\n.ends\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:7:1: error: recursive subcircuit: instance Xback closes the cycle A -> B -> A\n"
            "  Xback p A\n"
            "  ^\n");
}

TEST(SpiceSubckt, StructureErrors) {  // items 57, 66, 98
  SpiceRead r;
  r.read("t\n.ends\n.subckt a p\n.ends b\n.subckt a p\n.ends\n.subckt open p\nR1 p 0 1\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:1: error: '.ends' without an open '.subckt'\n"
            "  .ends\n"
            "  ^\n"
            "deck.cir:4:7: error: '.ends b' does not match the open '.subckt a'\n"
            "  .ends b\n"
            "        ^\n"
            "deck.cir:3:9: note: '.subckt a' opened here\n"
            "  .subckt a p\n"
            "          ^\n"
            "deck.cir:5:9: error: subcircuit 'a' is already defined in this scope\n"
            "  .subckt a p\n"
            "          ^\n"
            "deck.cir:3:9: note: first definition of 'a' is here\n"
            "  .subckt a p\n"
            "          ^\n"
            "deck.cir:7:9: error: '.subckt open' is not closed with '.ends'\n"
            "  .subckt open p\n"
            "          ^\n");
}

TEST(SpiceSubckt, LocalModelShadowsGlobal) {  // item 54
  SpiceRead r;
  r.read("t\n.model DX D(BV=100)\nD1 a b DX\nX1 a b s\n.subckt s p q\nD1 p q DX\n.model DX D(BV=400)\n.ends\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_DOUBLE_EQ(*r.nl.models.at(*r.part("D1").model_id).params.at("bv").value, 100.0);
  const Model& local = r.nl.models.at(*r.part("X1.D1").model_id);
  EXPECT_DOUBLE_EQ(*local.params.at("bv").value, 400.0);
  EXPECT_EQ(local.scope, "s");
}

TEST(SpiceSubckt, NestedDefinitionVisibleInsideOnly) {  // item 62
  SpiceRead r;
  r.read("t\nX9 a outer\n.subckt outer p\n.subckt inner q\nR1 q 0 1\n.ends inner\nX1 p inner\n.ends outer\n"
         "X2 a inner\n");
  EXPECT_EQ(r.part("X9.X1.R1").nets[0], r.nl.find_net("a").value());
  EXPECT_NE(r.rendered().find("deck.cir:9:6: error: unknown subcircuit 'inner' in instance X2"), std::string::npos);
}

TEST(SpiceParams, ExpressionsOrderAndForms) {  // items 41, 67, 68, 74
  SpiceRead r;
  r.read("t\nR1 a b {rr*2}\nRq c n '2*rz+1'\n.param rr=1k rz = 2\n.param c=rr*rz+1\n.param d = rr * 3\n"
         "R2 a b {c}\nR3 a b {d}\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_DOUBLE_EQ(*r.part("R1").value, 2e3);
  EXPECT_DOUBLE_EQ(*r.part("Rq").value, 5.0);
  EXPECT_DOUBLE_EQ(*r.part("R2").value, 2001.0);
  EXPECT_DOUBLE_EQ(*r.part("R3").value, 3000.0);
}

TEST(SpiceParams, CycleUndefinedUnbalanced) {  // items 75, 76, 77
  SpiceRead r;
  r.read("t\n.param a={b} b={a}\nR1 x y {nope*2}\nR2 x y {1+2\nR3 x y {pi}\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:14: error: circular parameter definition: a -> b -> a\n"
            "  .param a={b} b={a}\n"
            "               ^\n"
            "deck.cir:3:9: error: undefined parameter 'nope' in resistor R1\n"
            "  R1 x y {nope*2}\n"
            "          ^\n"
            "deck.cir:4:8: error: unbalanced '{': no closing '}' on this line\n"
            "  R2 x y {1+2\n"
            "         ^\n"
            "deck.cir:5:9: error: undefined parameter 'pi' in resistor R3\n"
            "  R3 x y {pi}\n"
            "          ^\n");
}

TEST(SpiceNets, ExporterNamesAndWarnings) {  // items 45, 92-95
  SpiceRead r;
  r.read("t\nR1 /AC_L N$12 1\nR2 vbus+ vbus- 1\nR3 Net-_C2-Pad1_ 01 1\nR4 1 00 1\nR5 a.b x 1\nR6 q q 1\n");
  EXPECT_EQ(r.net_of("R1", 1), "N$12");
  EXPECT_EQ(r.net_of("R2", 0), "vbus+");
  EXPECT_NE(r.part("R3").nets[1], r.part("R4").nets[0]);
  EXPECT_NE(r.part("R4").nets[1], kGroundNet);
  const std::string out = r.rendered();
  EXPECT_NE(out.find("deck.cir:5:6: warning: node '00' is not ground"), std::string::npos);
  EXPECT_NE(out.find("deck.cir:6:4: warning: node name 'a.b' contains '.'"), std::string::npos);
  EXPECT_NE(out.find("deck.cir:7:1: warning: resistor R6 connects both pins to net 'q'"), std::string::npos);
  EXPECT_EQ(r.diags.error_count(), 0u);
}

}  // namespace
}  // namespace mainscheck::parser
