// `*@` annotation comments (docs/spice-dialect.md, "Annotations").
#include <gtest/gtest.h>

#include "tests/parser/spice_test_util.hpp"

namespace mainscheck::parser {
namespace {

using testing::SpiceRead;

TEST(SpiceAnnotations, TopLevelForms) {
  SpiceRead r;
  r.read("t\n*@part F1 type=fuse i_rated=2 V_Rated_AC=250\nRF1 L L1 0.1\n*@net OUT access=user\n"
         "*@supply line=L neutral=N earth=PE v_rms=230 f=50\n* plain comment\n");
  EXPECT_EQ(r.rendered(), "");
  ASSERT_EQ(r.nl.annotations.size(), 3u);
  const Annotation& a = r.nl.annotations[0];
  EXPECT_EQ(a.target_kind, "part");
  EXPECT_EQ(a.target, "F1");
  EXPECT_EQ(a.attrs.at("type"), "fuse");
  EXPECT_EQ(a.attrs.at("v_rated_ac"), "250");
  EXPECT_EQ(format_location(a.loc, r.sm), "deck.cir:2:3");
  EXPECT_EQ(r.nl.annotations[1].target, "OUT");
  const Annotation& s = r.nl.annotations[2];
  EXPECT_EQ(s.target_kind, "supply");
  EXPECT_EQ(s.target, "");
  EXPECT_EQ(s.attrs.at("earth"), "PE");
  EXPECT_EQ(s.attrs.size(), 5u);
}

TEST(SpiceAnnotations, InsideSubcktOnePerInstance) {
  SpiceRead r;
  r.read("t\nX1 in out prot\nX2 in2 out2 prot\n.subckt prot a b\n*@part F1 type=fuse i_rated=1\n"
         "RF1 a m 0.1\n*@net m access=internal\n*@net b access=user\nR2 m b 1\n.ends\n");
  EXPECT_EQ(r.rendered(), "");
  ASSERT_EQ(r.nl.annotations.size(), 6u);
  EXPECT_EQ(r.nl.annotations[0].target, "X1.F1");
  EXPECT_EQ(r.nl.annotations[1].target, "x1.m");
  EXPECT_EQ(r.nl.annotations[2].target, "out");  // a pin takes the caller's net
  EXPECT_EQ(r.nl.annotations[3].target, "X2.F1");
  EXPECT_EQ(r.nl.annotations[5].target, "out2");
}

TEST(SpiceAnnotations, ContinuationNotBrokenByAnnotation) {
  SpiceRead r;
  r.read("t\nR1 a b\n*@part R1 p_rated=0.5\n+ 1k\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_DOUBLE_EQ(*r.part("R1").value, 1e3);
  ASSERT_EQ(r.nl.annotations.size(), 1u);
}

TEST(SpiceAnnotations, MalformedWarns) {
  SpiceRead r;
  r.read("t\n*@part F1 fuse\n*@\n*@net x a={1\nR1 a 0 1\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:11: warning: malformed annotation: expected key=value, found 'fuse'; the annotation is ignored\n"
            "  *@part F1 fuse\n"
            "            ^\n"
            "deck.cir:3:3: warning: malformed annotation ignored: expected '*@kind [target] key=value ...'\n"
            "  *@\n"
            "    ^\n"
            "deck.cir:4:11: warning: malformed annotation ignored: unbalanced '{': no closing '}' on this line\n"
            "  *@net x a={1\n"
            "            ^\n");
  EXPECT_TRUE(r.nl.annotations.empty());
  EXPECT_EQ(r.diags.error_count(), 0u);
}

}  // namespace
}  // namespace mainscheck::parser
