// Checklist sections B-E (numbers on elements, element lines, sources, models) of
// shared/reference/spice-syntax.md; expected values follow the SPICE3/ngspice rules quoted there.
#include <gtest/gtest.h>

#include "tests/parser/spice_test_util.hpp"

namespace mainscheck::parser {
namespace {

using testing::SpiceRead;

TEST(SpiceElements, PassivesWithParams) {  // items 26-28, 40
  SpiceRead r;
  r.read("t\nR1 L L1 0.15 tc1=0.001\nR2 a b r=1k\nCBULK BUS RTN 47u IC=0\nC2 a b capacitance=2u\nL1 a b L=1m\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_DOUBLE_EQ(*r.part("R1").value, 0.15);
  EXPECT_DOUBLE_EQ(*r.part("R1").params.at("tc1").value, 0.001);
  EXPECT_DOUBLE_EQ(*r.part("R2").value, 1e3);
  EXPECT_DOUBLE_EQ(*r.part("CBULK").value, 47e-6);
  EXPECT_EQ(r.part("CBULK").params.at("ic").text, "0");
  EXPECT_DOUBLE_EQ(*r.part("C2").value, 2e-6);
  EXPECT_DOUBLE_EQ(*r.part("L1").value, 1e-3);
  EXPECT_EQ(r.part("R1").type_name, "resistor");
  EXPECT_EQ(r.net_of("CBULK", 0), "BUS");
}

TEST(SpiceElements, TooFewFieldsPinsTheText) {  // items 43, 101
  SpiceRead r;
  r.read("t\nRbleed bus 470k\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:1: error: too few fields for resistor Rbleed: found 2 (bus 470k), expected 'Rbleed n+ n- value'\n"
            "  Rbleed bus 470k\n"
            "  ^\n");
  EXPECT_EQ(r.nl.parts.size(), 0u);
}

TEST(SpiceElements, MissingValueAndShortDiode) {  // item 43
  SpiceRead r;
  r.read("t\nC1 a b\nD3 a DX\n.model DX D\n");
  EXPECT_EQ(r.diags.error_count(), 2u);
  EXPECT_NE(r.rendered().find("too few fields for capacitor C1: found 2 (a b)"), std::string::npos);
  EXPECT_NE(r.rendered().find("too few fields for diode D3: found 2 (a DX)"), std::string::npos);
}

TEST(SpiceElements, ExtraTokenIsAnError) {  // item 44
  SpiceRead r;
  r.read("t\nR1 a b 1k 2k\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:11: error: unexpected '2k' after the fields of resistor R1\n"
            "  R1 a b 1k 2k\n"
            "            ^\n");
}

TEST(SpiceElements, NonNumericValueIsAnError) {  // items 24, 102
  SpiceRead r;
  r.read("t\nR1 a b O.47u\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:8: error: value 'O.47u' of resistor R1 is not a number, an expression or a defined model name\n"
            "  R1 a b O.47u\n"
            "         ^\n");
}

TEST(SpiceElements, SuspiciousSuffixWarnings) {  // item 20 (SPICE3 suffix table: M = milli, F = femto)
  SpiceRead r;
  r.read("t\nR1 a b 100M\nR2 a b 1MOhm\nC1 a b 10F\nR3 a b 2k2\nR4 a b 10m\n");
  EXPECT_DOUBLE_EQ(*r.part("R1").value, 0.1);
  EXPECT_DOUBLE_EQ(*r.part("R2").value, 1e-3);
  EXPECT_DOUBLE_EQ(*r.part("C1").value, 1e-14);
  EXPECT_DOUBLE_EQ(*r.part("R3").value, 2e3);
  EXPECT_EQ(r.diags.error_count(), 0u);
  EXPECT_EQ(r.diags.warning_count(), 4u);  // R4's lower-case m is a deliberate milliohm
  const std::string out = r.rendered();
  EXPECT_NE(out.find("deck.cir:2:8: warning: resistor R1 value '100M' is read as 0.1 ohm: M means milli in SPICE; "
                     "write 100MEG for megaohm"),
            std::string::npos);
  EXPECT_NE(out.find("deck.cir:4:8: warning: capacitor C1 value '10F' is read as 1e-14 F: F means femto in SPICE; "
                     "write 10 for farad"),
            std::string::npos);
  EXPECT_NE(out.find("deck.cir:5:8: warning: '2k2' read as 2k"), std::string::npos);
}

TEST(SpiceElements, DuplicateNameCaseInsensitive) {  // item 42
  SpiceRead r;
  r.read("t\nR1 a b 1\nr1 a b 2\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:3:1: error: element 'r1' is already defined in this scope\n"
            "  r1 a b 2\n"
            "  ^\n"
            "deck.cir:2:1: note: first definition of 'R1' is here\n"
            "  R1 a b 1\n"
            "  ^\n");
}

TEST(SpiceElements, UnknownLetter) {  // items 39, 107
  SpiceRead r;
  r.read("t\nZ1 a b 1\n#include x\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:1: error: unknown element type 'Z' in 'Z1'\n"
            "  Z1 a b 1\n"
            "  ^\n"
            "deck.cir:3:1: error: unknown element type '#' in '#include'\n"
            "  #include x\n"
            "  ^\n");
}

TEST(SpiceElements, BjtSubstrateDecidedByModel) {  // item 31
  SpiceRead r;
  r.read("t\nQAUX c b e sub QNSW\nQDRV c b e QNSW 2\n.model QNSW NPN(BF=100)\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_EQ(r.part("QAUX").nets.size(), 4u);
  EXPECT_EQ(r.part("QDRV").nets.size(), 3u);
  EXPECT_EQ(r.part("QDRV").params.at("area").text, "2");
  EXPECT_EQ(r.part("QAUX").type_name, "bjt");
}

TEST(SpiceElements, DiodeModelMustExist) {  // items 30, 105
  SpiceRead r;
  r.read("t\nD1 a b DNOPE\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:8: error: diode D1: model 'DNOPE' is not defined\n"
            "  D1 a b DNOPE\n"
            "         ^\n");
}

TEST(SpiceElements, ModelsWithAndWithoutParens) {  // items 53, 55
  SpiceRead r;
  r.read("t\nD1 a b DZ\n.model DZ D (BV=5.1 IBV=1m,\n+ IS=1e-14)\n.model WTRIP CSW IT=20 IH=2\n"
         "V1 c 0 0\nW1 a b V1 WTRIP off\nS1 a b c 0 SW1\n.model SW1 SW(RON=1 ROFF=1MEG VT=1)\n");
  EXPECT_EQ(r.rendered(), "");
  const Part& d = r.part("D1");
  ASSERT_TRUE(d.model_id);
  const Model& m = r.nl.models.at(*d.model_id);
  EXPECT_EQ(m.type, "d");
  EXPECT_DOUBLE_EQ(*m.params.at("bv").value, 5.1);
  EXPECT_DOUBLE_EQ(*m.params.at("ibv").value, 1e-3);
  EXPECT_DOUBLE_EQ(*r.nl.models.at(*r.part("W1").model_id).params.at("it").value, 20.0);
  EXPECT_EQ(r.part("W1").controls, (std::vector<std::string>{"V1"}));
  EXPECT_EQ(r.part("W1").type_name, "cswitch");
  EXPECT_EQ(r.part("S1").nets.size(), 4u);
}

TEST(SpiceElements, ModelParametersMustBeNumbers) {  // issue 15 item 2
  // ngspice-39 refuses IS=nan ("Undefined parameter"); a parameter the solver reads and that we kept
  // as text would have been replaced by its default without a word. Only vendor text tags
  // (LTspice's mfg=, type=) stay text (docs/spice-dialect.md).
  SpiceRead r;
  r.read(
      "t\nD1 a b D1\n.model D1 D(IS=nan N=bogus BV=inf RS={1/0})\n"
      ".model DV D(IS=2n mfg=Vishay type=silicon Iave=1 Vpk=1000)\nD2 a b DV\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:3:16: error: value 'nan' of model D1 parameter 'IS' is not a number or an expression\n"
            "  .model D1 D(IS=nan N=bogus BV=inf RS={1/0})\n"
            "                 ^\n"
            "deck.cir:3:22: error: value 'bogus' of model D1 parameter 'N' is not a number or an expression\n"
            "  .model D1 D(IS=nan N=bogus BV=inf RS={1/0})\n"
            "                       ^\n"
            "deck.cir:3:31: error: value 'inf' of model D1 parameter 'BV' is not a number or an expression\n"
            "  .model D1 D(IS=nan N=bogus BV=inf RS={1/0})\n"
            "                                ^\n"
            "deck.cir:3:40: error: division by zero in 1 / 0 in model D1 parameter 'RS'\n"
            "  .model D1 D(IS=nan N=bogus BV=inf RS={1/0})\n"
            "                                         ^\n");
  const Model& dv = r.nl.models.at(*r.part("D2").model_id);
  EXPECT_EQ(dv.params.at("mfg").text, "Vishay");
  EXPECT_FALSE(dv.params.at("mfg").value);
  EXPECT_FALSE(dv.params.at("type").value);
  EXPECT_EQ(dv.params.at("vpk").value, 1000.0);
}

TEST(SpiceElements, RatingParametersAreReadStrictly) {  // issue 15 item 3
  // SPICE ignores what follows a number; a rating on the element line must not (docs/attributes.md).
  SpiceRead r;
  r.read(
      "t\nR1 a b 1k p_rated=1/4W\nR2 a b 1k p_rated=1/4X\nR3 a b 1k p_rated=abc v_rated=2k2\nR4 a b 1k "
      "tc1=1/4\n");
  EXPECT_EQ(*r.part("R1").params.at("p_rated").value, 0.25);
  EXPECT_EQ(
      r.rendered(),
      "deck.cir:3:22: error: invalid value '1/4X' for p_rated of resistor R2: unexpected 'X' after the "
      "number "
      "1/4; only the unit W may follow it\n"
      "  R2 a b 1k p_rated=1/4X\n"
      "                       ^\n"
      "deck.cir:4:19: error: invalid value 'abc' for p_rated of resistor R3: 'abc' is not a number\n"
      "  R3 a b 1k p_rated=abc v_rated=2k2\n"
      "                    ^\n"
      "deck.cir:4:33: error: invalid value '2k2' for v_rated of resistor R3: unexpected '2' after the number "
      "2k; "
      "only the unit V may follow it\n"
      "  R3 a b 1k p_rated=abc v_rated=2k2\n"
      "                                  ^\n"
      "deck.cir:5:15: warning: '1/4' read as 1 for resistor R4 parameter 'tc1'; SPICE ignores the rest '/4'\n"
      "  R4 a b 1k tc1=1/4\n"
      "                ^\n");
}

TEST(SpiceElements, CouplingResolvesInductors) {  // item 29
  SpiceRead r;
  r.read("t\nL1 a 0 1m\nL2 b 0 1m\nK1 L1 L2 0.98\nK2 L1 L9 0.5\nK3 L1 L2 1.5\n");
  EXPECT_DOUBLE_EQ(*r.part("K1").value, 0.98);
  EXPECT_EQ(r.part("K1").controls, (std::vector<std::string>{"L1", "L2"}));
  EXPECT_TRUE(r.part("K1").nets.empty());
  const std::string out = r.rendered();
  EXPECT_NE(out.find("deck.cir:5:7: error: coupling K2 names inductor 'L9', which is not defined in this scope"),
            std::string::npos);
  EXPECT_NE(out.find("deck.cir:6:10: error: coupling K3 has k = 1.5; |k| must not exceed 1"), std::string::npos);
}

TEST(SpiceElements, ControlledAndOtherElements) {  // item 38
  SpiceRead r;
  r.read("t\nVS a 0 0\nE1 o 0 a 0 10\nG1 o 0 a 0 1m\nF1 o 0 VS 2\nH1 o 0 VS 3\nB1 o 0 V={2*3}\n"
         "J1 d g s JM\n.model JM NJF\nT1 a 0 b 0 Z0=50 TD=1n\nM1 d g s b NM W=1u L=1u\n.model NM NMOS\n"
         "E2 o 0 value={1}\nE3 o 0 POLY(1) a 0 0 1\nA1 a b mod\n");
  EXPECT_EQ(r.part("E1").type_name, "vcvs");
  EXPECT_DOUBLE_EQ(*r.part("G1").value, 1e-3);
  EXPECT_EQ(r.part("F1").controls, (std::vector<std::string>{"VS"}));
  EXPECT_EQ(r.part("H1").type_name, "ccvs");
  EXPECT_EQ(r.part("B1").params.at("v").text, "{2*3}");
  EXPECT_EQ(r.part("J1").nets.size(), 3u);
  EXPECT_EQ(r.part("T1").nets.size(), 4u);
  EXPECT_EQ(r.part("M1").nets.size(), 4u);
  EXPECT_EQ(r.part("E2").nets.size(), 2u);
  const std::string out = r.rendered();
  EXPECT_NE(out.find("deck.cir:14:8: error: vcvs E3: 'POLY' controlled sources are not supported"), std::string::npos);
  EXPECT_NE(out.find("deck.cir:15:1: error: unsupported element type 'A' (XSPICE code model) in 'A1'"),
            std::string::npos);
  EXPECT_EQ(r.diags.error_count(), 2u);
}

TEST(SpiceSources, DcAcAndTransient) {  // items 46-52
  SpiceRead r;
  r.read("t\nV12 aux 0 12\nV5 vcc 0 5V\nVBIAS bias 0 DC 3.3\nV2 x 0 DC=2\nVAC a b DC 0 AC 1 SIN(0, 325, 50)\n"
         "V3 p 0 PULSE(0 12 0 20n 20n 4u\n+ 10u)\nV4 q 0 PWL(0 0 1m 5)\nV6 s 0 SIN 0 325 50\nILOAD aux 0 0.8\n"
         "V7 r 0 AC 1 90\n.param vpk=325\nV8 m 0 SIN(0 {vpk} 50)\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_DOUBLE_EQ(*r.part("V12").value, 12.0);
  EXPECT_DOUBLE_EQ(*r.part("V5").value, 5.0);
  EXPECT_DOUBLE_EQ(*r.part("VBIAS").value, 3.3);
  EXPECT_DOUBLE_EQ(*r.part("V2").value, 2.0);
  const SourceSpec& ac = *r.part("VAC").source;
  EXPECT_DOUBLE_EQ(*ac.dc, 0.0);
  EXPECT_DOUBLE_EQ(*ac.ac_mag, 1.0);
  EXPECT_EQ(ac.waveform->args, (std::vector<double>{0, 325, 50}));
  EXPECT_FALSE(r.part("V3").value);
  EXPECT_EQ(r.part("V3").source->waveform->args.size(), 7u);
  EXPECT_EQ(r.part("V4").source->waveform->kind, "pwl");
  EXPECT_EQ(r.part("V6").source->waveform->args, (std::vector<double>{0, 325, 50}));
  EXPECT_DOUBLE_EQ(*r.part("ILOAD").value, 0.8);
  EXPECT_EQ(r.part("ILOAD").kind, PartKind::isource);
  EXPECT_DOUBLE_EQ(*r.part("V7").source->ac_phase_deg, 90.0);
  EXPECT_EQ(r.part("V8").source->waveform->args, (std::vector<double>{0, 325, 50}));
}

TEST(SpiceSources, BadSpecs) {  // item 50
  SpiceRead r;
  r.read("t\nV1 a 0 PWL(0 0 1m)\nV2 a 0 SIN(0 1\nV3 a 0 DC 1 2\n");
  EXPECT_EQ(r.rendered(),
            "deck.cir:2:8: error: PWL of vsource V1 needs time-value pairs, found 3 values\n"
            "  V1 a 0 PWL(0 0 1m)\n"
            "         ^\n"
            "deck.cir:3:11: error: '(' is not closed with ')'\n"
            "  V2 a 0 SIN(0 1\n"
            "            ^\n"
            "deck.cir:4:13: error: DC value given twice in vsource V3\n"
            "  V3 a 0 DC 1 2\n"
            "              ^\n");
}

}  // namespace
}  // namespace mainscheck::parser
