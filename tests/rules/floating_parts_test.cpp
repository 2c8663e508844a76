// floating-parts (rules/floating_parts.cpp): parts joined to nothing else of the circuit.
#include <gtest/gtest.h>

#include "rule_test_support.hpp"
#include "rules/floating_parts.hpp"

namespace mainscheck::rules::testing {
namespace {

// A half-wave supply with two parts drawn on nets that nothing else touches (a misspelt net name):
// R9/C9 between OUTT and NN.
const char* kStrayDeck = R"(bench supply with a stray pair
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
D1 L OUT DR v_rated=1000 i_rated=1
C1 OUT N 10u v_rated=450
R1 OUT N 47k p_rated=2
R9 OUTT NN 1k p_rated=0.25
C9 NN OUTT 100n v_rated=50
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)";

TEST(FloatingParts, PartsOnNetsNothingElseTouchesAreOneWarningPerIsland) {
  RuleBench b(kStrayDeck);
  const Finding& f = only(b.run("floating-parts"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_EQ(f.parts, (std::vector<std::string>{"R9", "C9"}));
  EXPECT_NE(f.message.find("R9, C9 are joined to nothing else of the circuit (nets OUTT, NN"), std::string::npos)
      << f.message;
  EXPECT_NE(f.message.find("no rating of them was checked"), std::string::npos) << f.message;
}

TEST(FloatingParts, ConnectedCircuitIsSilent) {
  RuleBench b(R"(half-wave
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
D1 L OUT DR v_rated=1000 i_rated=1
C1 OUT N 10u v_rated=450
R1 OUT N 47k p_rated=2
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)");
  EXPECT_TRUE(b.run("floating-parts").empty()) << b.rendered();
}

TEST(FloatingParts, SecondaryJoinedOnlyByItsCouplingIsNotFloating) {
  // An isolated secondary with no reference to ground: the K line joins it to the mains side.
  RuleBench b(R"(transformer with floating secondary
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
LP L N 4
LS SA SB 40m
K1 LP LS 0.999
D1 SA OUT DR v_rated=100 i_rated=1
C1 OUT SB 1000u v_rated=35
R1 OUT SB 100 p_rated=5
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)");
  EXPECT_TRUE(b.run("floating-parts").empty()) << b.rendered();
}

TEST(FloatingParts, TwoSeparateIslandsAreTwoFindings) {
  RuleBench b(R"(two strays
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
RL L N 1k p_rated=100
RA A1 A2 10k
RB B1 B2 10k
.end
)");
  const auto findings = b.run("floating-parts");
  ASSERT_EQ(findings.size(), 2u) << b.rendered();
  EXPECT_EQ(findings[0].parts, (std::vector<std::string>{"RA"}));
  EXPECT_EQ(findings[1].parts, (std::vector<std::string>{"RB"}));
}

}  // namespace
}  // namespace mainscheck::rules::testing
