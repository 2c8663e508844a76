#include "analysis/part_info.hpp"

#include <fstream>
#include <sstream>

#include <gtest/gtest.h>

#include "analysis/recognition_support.hpp"

namespace mainscheck::analysis {
namespace {

using testing::Deck;

const PartInfo& info_of(const PartInfoTable& t, const parser::Netlist& nl, const char* ref) {
  return t[*nl.find_part_index(ref)];
}

TEST(PartInfo, PrioritySourcesAndNotes) {
  Deck d(R"(priorities
*@part RX1 type=fuse i_rated=2 v_rated_ac=250 i2t_melt=1.5
RX1 L A 0.1 i_rated=3.15
*@model DHV v_rated=800
D1 A B DHV
.model DHV D(IS=1n BV=1000)
D2 B C DZ12
.model DZ12 D(BV=12)
C1 L N 100n
*@part C1 class=x2 v_rated_ac=275 tol=10%
.end
)");
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  const PartInfoTable t(d.nl, nullptr, d.diags);
  const PartInfo& f = info_of(t, d.nl, "RX1");
  EXPECT_EQ(f.type, FrontEndType::fuse);
  EXPECT_EQ(f.type_source, InfoSource::annotation);
  // The element line's i_rated=3.15 outranks the annotation's 2.
  EXPECT_EQ(f.number("i_rated"), 3.15);
  EXPECT_EQ(f.find("i_rated")->source, InfoSource::element_param);
  EXPECT_EQ(f.number("v_rated_ac"), 250.0);
  EXPECT_EQ(f.find("i2t_melt")->source, InfoSource::annotation);

  // The *@model annotation outranks the model card's BV.
  const PartInfo& d1 = info_of(t, d.nl, "D1");
  EXPECT_EQ(d1.type, FrontEndType::diode);
  EXPECT_EQ(d1.number("v_rated"), 800.0);
  EXPECT_EQ(d1.find("v_rated")->source, InfoSource::annotation);

  // BV is a breakdown rating, not a type (issue 15 item 4): D2 stays a diode, a breakdown candidate.
  const PartInfo& d2 = info_of(t, d.nl, "D2");
  EXPECT_EQ(d2.type, FrontEndType::diode);
  EXPECT_EQ(d2.type_source, InfoSource::netlist_kind);
  EXPECT_FALSE(d2.number("v_zener"));
  EXPECT_EQ(breakdown_candidate_V(d2), 12.0);
  EXPECT_EQ(zener_voltage_V(d2), 12.0);
  EXPECT_EQ(d2.find("v_rated")->note, "reverse rating read from BV=12 V of diode model DZ12");

  const PartInfo& c1 = info_of(t, d.nl, "C1");
  EXPECT_EQ(c1.type, FrontEndType::capacitor);
  EXPECT_EQ(c1.text("class"), "X2");
  EXPECT_NEAR(*c1.number("tol"), 0.10, 1e-12);
}

TEST(PartInfo, LowBvDiodeIsARectifierUnlessTypedZener) {  // issue 15 item 4
  Deck d(R"(breakdown ratings
D1 A B D40
D2 B C D40
*@part D2 type=zener
DZ3 C D D40
D4 D E D60
.model D40 D(IS=1n BV=40)
.model D60 D(IS=1n BV=60)
.end
)");
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  const PartInfoTable t(d.nl, nullptr, d.diags);
  // A 40 V rectifier: a diode with a 40 V reverse rating, nothing assumed.
  EXPECT_EQ(info_of(t, d.nl, "D1").type, FrontEndType::diode);
  EXPECT_EQ(info_of(t, d.nl, "D1").number("v_rated"), 40.0);
  EXPECT_EQ(breakdown_candidate_V(info_of(t, d.nl, "D1")), 40.0);
  // Typed by annotation or by the DZ designator convention: zeners.
  EXPECT_EQ(info_of(t, d.nl, "D2").type, FrontEndType::zener);
  EXPECT_FALSE(breakdown_candidate_V(info_of(t, d.nl, "D2")));
  EXPECT_EQ(info_of(t, d.nl, "DZ3").type, FrontEndType::zener);
  EXPECT_EQ(info_of(t, d.nl, "DZ3").type_source, InfoSource::designator);
  // Boundary: from 50 V up a diode is never a breakdown candidate.
  EXPECT_FALSE(breakdown_candidate_V(info_of(t, d.nl, "D4")));
}

TEST(PartInfo, SpiceNumbersInAnnotations) {
  Deck d("numbers\n*@part R1 p_rated=500m pad_gap=3.2mm e_pulse=1.5 tol=+80/-20\nR1 a b 1k\n.end\n");
  const PartInfoTable t(d.nl, nullptr, d.diags);
  const PartInfo& r = info_of(t, d.nl, "R1");
  EXPECT_NEAR(*r.number("p_rated"), 0.5, 1e-12);
  EXPECT_NEAR(*r.number("pad_gap"), 3.2e-3, 1e-15);
  EXPECT_EQ(r.number("e_pulse"), 1.5);
  EXPECT_FALSE(r.number("tol"));  // asymmetric: text only
  EXPECT_EQ(r.text("tol"), "+80/-20");
  EXPECT_EQ(d.diags.warning_count(), 0u) << d.rendered();
}

TEST(PartInfo, WarningsAreLocated) {
  Deck d(
      "bad\n*@part R1 colour=red class=Z9 pad_gap=3\nR1 a b 1k\n*@part R9 type=fuse\n*@part R1 "
      "type=gizmo\n.end\n");
  const PartInfoTable t(d.nl, nullptr, d.diags);
  std::vector<std::string> msgs;
  for (const auto& diag : d.diags.diagnostics()) {
    EXPECT_EQ(diag.severity, parser::Severity::warning);
    EXPECT_TRUE(diag.loc.valid());
    msgs.push_back(diag.message);
  }
  // Annotation keys arrive sorted (std::map): class, colour, pad_gap. A value that is not a number
  // is an error (PartInfo.RatingsThatWouldPassAnyStressAreLocatedErrors).
  const std::vector<std::string> want{
      "annotation names no part 'R9'",    "capacitor class 'Z9' on R1 is not one of X1 X2 X3 Y1 Y2 Y3 Y4",
      "unknown attribute 'colour' on R1", "pad_gap=3 m on R1 looks like millimetres; write 3mm",
      "unknown part type 'gizmo' on R1",
  };
  EXPECT_EQ(msgs, want) << d.rendered();
}

TEST(PartInfo, RatingsThatWouldPassAnyStressAreLocatedErrors) {  // issue 15 item 1
  // Zero, negative and non-numeric ratings from every source: annotation, element parameter,
  // *@model annotation and the .model card's BV. Each is an error at the value, never "unknown".
  Deck d(R"(ratings
*@part C1 v_rated=0
C1 a 0 10u
R1 a b 1k p_rated=0
*@part RF1 type=fuse i_rated=-2 v_rated_ac=0
RF1 b c 0.1
D1 c 0 DX v_rated=0
D2 c 0 DZ
.model DX D(IS=1n)
.model DZ D(IS=1n BV=0)
*@model DX i_surge=nan
.end
)");
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  const PartInfoTable t(d.nl, nullptr, d.diags);
  EXPECT_EQ(
      d.rendered(),
      "deck.cir:2:19: error: v_rated=0 V on C1 must be a finite number greater than zero\n"
      "  *@part C1 v_rated=0\n"
      "                    ^\n"
      "deck.cir:4:19: error: p_rated=0 W on R1 must be a finite number greater than zero\n"
      "  R1 a b 1k p_rated=0\n"
      "                    ^\n"
      "deck.cir:5:30: error: i_rated=-2 A on RF1 must be a finite number greater than zero\n"
      "  *@part RF1 type=fuse i_rated=-2 v_rated_ac=0\n"
      "                               ^\n"
      "deck.cir:5:44: error: v_rated_ac=0 V on RF1 must be a finite number greater than zero\n"
      "  *@part RF1 type=fuse i_rated=-2 v_rated_ac=0\n"
      "                                             ^\n"
      "deck.cir:7:19: error: v_rated=0 V on D1 must be a finite number greater than zero\n"
      "  D1 c 0 DX v_rated=0\n"
      "                    ^\n"
      "deck.cir:11:20: error: invalid value 'nan' for i_surge of D1: 'nan' is not a number\n"
      "  *@model DX i_surge=nan\n"
      "                     ^\n"
      "deck.cir:10:22: error: v_rated=0 V on D2 must be a finite number greater than zero (reverse rating "
      "read from BV=0 V of diode model DZ)\n"
      "  .model DZ D(IS=1n BV=0)\n"
      "                       ^\n");
  EXPECT_FALSE(info_of(t, d.nl, "C1").number("v_rated"));
  EXPECT_EQ(info_of(t, d.nl, "D2").type, FrontEndType::diode);  // BV=0 is not taken for a zener
}

TEST(PartInfo, LibraryRatingOfZeroIsAnErrorAtTheValue) {
  Deck d("lib\n*@part R1 part=T1A\nR1 a b 0.1\n.end\n");
  parser::PartsLibrary lib;
  parser::read_parts_library_text("parts.xml",
                                  "<mainscheck-parts version=\"1\">\n  <part name=\"T1A\" type=\"fuse\" "
                                  "i_rated=\"0A\" v_rated_ac=\"250V\"/>\n</mainscheck-parts>\n",
                                  d.sm, d.diags, lib);
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  const PartInfoTable t(d.nl, &lib, d.diags);
  EXPECT_EQ(d.rendered(),
            "parts.xml:2:41: error: i_rated=0 A on R1 must be a finite number greater than zero (from "
            "parts-library "
            "entry T1A)\n"
            "    <part name=\"T1A\" type=\"fuse\" i_rated=\"0A\" v_rated_ac=\"250V\"/>\n"
            "                                          ^\n");
}

TEST(PartInfo, BillOfMaterialsFractionsAreReadExactly) {  // issue 15 item 3
  Deck d(
      "bom\n*@part R1 p_rated=1/4W\nR1 a b 1k\nR2 a b 1k p_rated=1/8W\nR3 a b 1k p_rated={1/2}\n"
      "*@part R4 p_rated=1/4X\nR4 a b 1k\n.end\n");
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  const PartInfoTable t(d.nl, nullptr, d.diags);
  EXPECT_EQ(info_of(t, d.nl, "R1").number("p_rated"), 0.25);
  EXPECT_EQ(info_of(t, d.nl, "R2").number("p_rated"), 0.125);
  EXPECT_EQ(info_of(t, d.nl, "R3").number("p_rated"), 0.5);
  // Text after the number is an error, no longer a warning with the rest ignored (1/4X was 1 W).
  EXPECT_FALSE(info_of(t, d.nl, "R4").number("p_rated"));
  EXPECT_EQ(d.rendered(),
            "deck.cir:6:22: error: invalid value '1/4X' for p_rated of R4: unexpected 'X' after the number "
            "1/4; only "
            "the unit W may follow it\n"
            "  *@part R4 p_rated=1/4X\n"
            "                       ^\n");
  EXPECT_EQ(d.diags.warning_count(), 0u);
}

TEST(PartInfo, DesignatorAssumptions) {
  Deck d(R"(designators
RNTC1 a b 5
RF1 a b 10k
DZ3 b 0 DX
D4 b 0 DX
.model DX D(IS=1n)
L1 a c 1m
L2 d e 1m
K1 L1 L2 0.99
.end
)");
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  const PartInfoTable t(d.nl, nullptr, d.diags);
  EXPECT_EQ(info_of(t, d.nl, "RNTC1").type, FrontEndType::ntc);
  EXPECT_EQ(info_of(t, d.nl, "RNTC1").type_source, InfoSource::designator);
  EXPECT_EQ(info_of(t, d.nl, "RNTC1").type_note, "assumed ntc from the reference designator RNTC1");
  EXPECT_EQ(info_of(t, d.nl, "RF1").type, FrontEndType::resistor);  // not a fuse: RF is a feedback resistor too
  EXPECT_EQ(info_of(t, d.nl, "DZ3").type, FrontEndType::zener);
  EXPECT_EQ(info_of(t, d.nl, "D4").type, FrontEndType::diode);
  EXPECT_EQ(info_of(t, d.nl, "D4").type_source, InfoSource::netlist_kind);
}

TEST(PartInfo, DesignatorForPartsWithoutLetter) {
  parser::Netlist nl;
  for (const char* ref : {"F1", "XF2", "RV1", "MOV3", "TRIAC1", "BR1", "T1", "FAN1"}) {
    parser::Part p;
    p.ref = ref;
    p.kind = parser::PartKind::other;
    p.nets = {nl.intern_net("a"), nl.intern_net("b")};
    nl.add_part(std::move(p));
  }
  parser::DiagnosticSink diags;
  const PartInfoTable t(nl, nullptr, diags);
  EXPECT_EQ(t.type(0), FrontEndType::fuse);
  EXPECT_EQ(t.type(1), FrontEndType::fuse);
  EXPECT_EQ(t.type(2), FrontEndType::varistor);
  EXPECT_EQ(t.type(3), FrontEndType::varistor);
  EXPECT_EQ(t.type(4), FrontEndType::triac);
  EXPECT_EQ(t.type(5), FrontEndType::bridge);
  EXPECT_EQ(t.type(6), FrontEndType::unknown);  // T is a SPICE transmission line, never assumed a transformer
  EXPECT_EQ(t.type(7), FrontEndType::unknown);  // F followed by a letter is not the fuse prefix
  EXPECT_EQ(t[0].type_note, "assumed fuse from the reference designator prefix F of F1");
}

TEST(PartInfo, LibraryByModelAndPartKey) {
  Deck d("lib\nD1 a b D1N4007\n.model D1N4007 D(BV=1000)\n*@part R1 part=HL-FUSE-T1A\nR1 c d 0.1\n.end\n");
  parser::PartsLibrary lib;
  parser::LibraryPart fuse{"HL-FUSE-T1A", "fuse", {{"i_rated", {"1A", 1.0, {}}}}, {}};
  parser::LibraryPart diode{"d1n4007", "", {{"v_rated", {"1000V", 1000.0, {}}}, {"i_surge", {"30A", 30.0, {}}}}, {}};
  lib.add(fuse);
  lib.add(diode);
  const PartInfoTable t(d.nl, &lib, d.diags);
  const PartInfo& r1 = info_of(t, d.nl, "R1");
  EXPECT_EQ(r1.type, FrontEndType::fuse);
  EXPECT_EQ(r1.type_source, InfoSource::parts_library);
  EXPECT_EQ(r1.number("i_rated"), 1.0);
  const PartInfo& d1 = info_of(t, d.nl, "D1");
  EXPECT_EQ(d1.number("i_surge"), 30.0);
  EXPECT_EQ(d1.find("v_rated")->source, InfoSource::parts_library);  // library outranks the model card
  EXPECT_EQ(d1.find("v_rated")->note, "from parts-library entry d1n4007");
}

TEST(PartInfo, EveryAttributeIsDocumented) {
  std::ifstream in(MAINSCHECK_SOURCE_DIR "/docs/attributes.md");
  ASSERT_TRUE(in);
  std::stringstream ss;
  ss << in.rdbuf();
  const std::string doc = ss.str();
  std::string prev;
  for (const auto& spec : parser::kPartAttributes) {
    EXPECT_NE(doc.find("| `" + std::string(spec.key) + "` |"), std::string::npos) << spec.key;
    EXPECT_LT(prev, std::string(spec.key)) << "kPartAttributes must stay sorted";
    prev = spec.key;
  }
}

TEST(PartInfo, TypeNamesRoundTrip) {
  for (int i = 0; i <= static_cast<int>(FrontEndType::other); ++i) {
    const auto t = static_cast<FrontEndType>(i);
    EXPECT_EQ(parse_front_end_type(front_end_type_name(t)), t) << front_end_type_name(t);
  }
  EXPECT_EQ(parse_front_end_type("MOV"), FrontEndType::varistor);
  EXPECT_EQ(parse_front_end_type("fusible_resistor"), FrontEndType::fusible_resistor);
  EXPECT_FALSE(parse_front_end_type("gizmo"));
}

}  // namespace
}  // namespace mainscheck::analysis
