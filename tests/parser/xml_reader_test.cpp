// What each element of the XML netlist format becomes in the Netlist model (docs/xml-format.md).
#include <gtest/gtest.h>

#include "tests/parser/xml_test_util.hpp"

namespace mainscheck::parser {
namespace {

using xml_test::netlist;
using xml_test::read_xml;
using xml_test::XmlRead;

std::string net_of(const Netlist& nl, const Part& p, std::size_t i) { return nl.net(p.nets.at(i)).name; }

TEST(XmlReader, TitleAndTwoTerminalParts) {
  XmlRead r;
  read_xml(r, "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<netlist version=\"1\" title=\"Kettle base\">\n"
              "<part ref=\"R1\" kind=\"resistor\" value=\"4.7k\" nets=\"a b\"/>\n"
              "<part ref=\"C1\" kind=\"capacitor\" value=\"2200 \xC2\xB5" "F\" nets=\"b 0\"/>\n"
              "<part ref=\"L1\" kind=\"inductor\" value=\"1mH\"><pin net=\"b\"/><pin net=\"GND\"/></part>\n"
              "</netlist>\n");
  ASSERT_EQ(r.rendered(), "");
  EXPECT_EQ(r.nl.title, "Kettle base");
  ASSERT_EQ(r.nl.parts.size(), 3u);
  const Part& r1 = r.nl.parts[0];
  EXPECT_EQ(r1.ref, "R1");
  EXPECT_EQ(r1.kind, PartKind::resistor);
  EXPECT_EQ(r1.type_name, "resistor");
  EXPECT_DOUBLE_EQ(*r1.value, 4700.0);
  EXPECT_EQ(net_of(r.nl, r1, 0), "a");
  EXPECT_EQ(net_of(r.nl, r1, 1), "b");
  EXPECT_EQ(r1.pin_names, (std::vector<std::string>{"1", "2"}));
  EXPECT_EQ(r.sm.line_col(r1.loc).line, 3u);
  EXPECT_EQ(r.sm.line_col(r1.loc).column, 1u);
  EXPECT_DOUBLE_EQ(*r.nl.parts[1].value, 2200e-6);
  EXPECT_EQ(r.nl.parts[1].nets[1], kGroundNet);
  EXPECT_DOUBLE_EQ(*r.nl.parts[2].value, 1e-3);
  EXPECT_EQ(r.nl.parts[2].nets[1], kGroundNet);  // gnd is ground
  EXPECT_EQ(r.nl.find_part("r1"), &r.nl.parts[0]);
}

TEST(XmlReader, RatingsAndFreeAttributesBecomeParams) {
  XmlRead r;
  read_xml(r, netlist("<part ref=\"F1\" kind=\"fuse\" i_rated=\"500mA\" v_rated_ac=\"250V\" i2t_melt=\"0.32A2s\" "
                      "class=\"T\" Pad_Gap=\"3.2mm\" vendor_code=\"HL-77\" hold=\"2\" nets=\"L LF\"/>\n"));
  ASSERT_EQ(r.rendered(), "");
  const Part& f = r.nl.parts.at(0);
  EXPECT_EQ(f.kind, PartKind::other);
  EXPECT_EQ(f.type_name, "fuse");
  EXPECT_FALSE(f.value);
  EXPECT_DOUBLE_EQ(*f.params.at("i_rated").value, 0.5);
  EXPECT_EQ(f.params.at("i_rated").text, "500mA");
  EXPECT_DOUBLE_EQ(*f.params.at("v_rated_ac").value, 250.0);
  EXPECT_DOUBLE_EQ(*f.params.at("i2t_melt").value, 0.32);
  EXPECT_DOUBLE_EQ(*f.params.at("pad_gap").value, 3.2e-3);  // key lower-cased
  EXPECT_EQ(f.params.at("class").text, "T");
  EXPECT_FALSE(f.params.at("class").value);
  EXPECT_EQ(f.params.at("vendor_code").text, "HL-77");
  EXPECT_FALSE(f.params.at("vendor_code").value);
  EXPECT_DOUBLE_EQ(*f.params.at("hold").value, 2.0);
  EXPECT_EQ(r.sm.line_col(f.params.at("i_rated").loc).column, 37u);  // start of the value text
}

TEST(XmlReader, NamedPinsInAnyOrderAndAliases) {
  XmlRead r;
  read_xml(r, netlist("<part ref=\"D1\" kind=\"diode\"><pin name=\"cathode\" net=\"VP\"/><pin name=\"a\" net=\"AC1\"/>"
                      "</part>\n"
                      "<part ref=\"TR1\" kind=\"triac\"><pin name=\"gate\" net=\"g\"/><pin name=\"MT2\" net=\"L\"/>"
                      "<pin name=\"MT1\" net=\"lamp\"/></part>\n"
                      "<part ref=\"Q1\" kind=\"bjt\" nets=\"c b e\"/>\n"
                      "<part ref=\"M1\" kind=\"mosfet\" nets=\"d g s\"/>\n"));
  ASSERT_EQ(r.rendered(), "");
  const Part& d = r.nl.parts[0];
  EXPECT_EQ(d.pin_names, (std::vector<std::string>{"anode", "cathode"}));
  EXPECT_EQ(net_of(r.nl, d, 0), "AC1");
  EXPECT_EQ(net_of(r.nl, d, 1), "VP");
  const Part& t = r.nl.parts[1];
  EXPECT_EQ(t.type_name, "triac");
  EXPECT_EQ(t.pin_names, (std::vector<std::string>{"mt1", "mt2", "gate"}));
  EXPECT_EQ(net_of(r.nl, t, 0), "lamp");
  EXPECT_EQ(r.nl.parts[2].nets.size(), 3u);  // substrate is optional
  const Part& m = r.nl.parts[3];
  ASSERT_EQ(m.nets.size(), 4u);  // bulk tied to source
  EXPECT_EQ(m.nets[3], m.nets[2]);
}

TEST(XmlReader, ZenerIsADiodeWithAType) {
  XmlRead r;
  read_xml(r, netlist("<model name=\"DZ\" type=\"D\" bv=\"12\"/>\n"
                      "<part ref=\"DZ1\" kind=\"zener\" model=\"dz\" v_zener=\"12V\" nets=\"0 aux\"/>\n"));
  ASSERT_EQ(r.rendered(), "");
  const Part& z = r.nl.parts[0];
  EXPECT_EQ(z.kind, PartKind::diode);
  EXPECT_EQ(z.params.at("type").text, "zener");
  EXPECT_EQ(*z.model, "dz");
  EXPECT_EQ(*z.model_id, 0u);
  EXPECT_EQ(r.nl.models[0].type, "d");
  EXPECT_DOUBLE_EQ(*r.nl.models[0].params.at("bv").value, 12.0);
}

TEST(XmlReader, ModelParametersUseSiPrefixes) {
  XmlRead r;
  read_xml(r, netlist("<model name=\"DR\" type=\"d\" IS=\"14.1n\" rs=\"33.9m\" bv=\"1k\" ibv=\"5u\" cjo=\"1M\"/>\n"));
  ASSERT_EQ(r.rendered(), "");
  const Model& m = r.nl.models.at(0);
  EXPECT_DOUBLE_EQ(*m.params.at("is").value, 14.1e-9);
  EXPECT_DOUBLE_EQ(*m.params.at("rs").value, 33.9e-3);
  EXPECT_DOUBLE_EQ(*m.params.at("bv").value, 1000.0);
  EXPECT_DOUBLE_EQ(*m.params.at("cjo").value, 1e6);  // M is mega in XML, unlike SPICE
  EXPECT_EQ(m.scope, "");
}

TEST(XmlReader, SineSourceInSpiceArgumentOrder) {
  XmlRead r;
  read_xml(r, netlist("<part ref=\"VMAINS\" kind=\"vsource\" nets=\"L N\">"
                      "<sin offset=\"0\" amplitude=\"325V\" freq=\"50Hz\" phase=\"90\"/></part>\n"
                      "<part ref=\"I1\" kind=\"isource\" dc=\"20mA\" ac=\"1mA\" ac_phase=\"45\" nets=\"a 0\"/>\n"));
  ASSERT_EQ(r.rendered(), "");
  const Part& v = r.nl.parts[0];
  ASSERT_TRUE(v.source && v.source->waveform);
  EXPECT_EQ(v.source->waveform->kind, "sin");
  // SIN(vo va freq td theta phase), ngspice-39 manual section 4.1.2.
  EXPECT_EQ(v.source->waveform->args, (std::vector<double>{0, 325, 50, 0, 0, 90}));
  EXPECT_FALSE(v.source->dc);
  EXPECT_FALSE(v.value);
  EXPECT_EQ(v.pin_names, (std::vector<std::string>{"p", "n"}));
  const Part& i = r.nl.parts[1];
  EXPECT_DOUBLE_EQ(*i.source->dc, 0.02);
  EXPECT_DOUBLE_EQ(*i.value, 0.02);
  EXPECT_DOUBLE_EQ(*i.source->ac_mag, 1e-3);
  EXPECT_DOUBLE_EQ(*i.source->ac_phase_deg, 45.0);
}

TEST(XmlReader, PulseSource) {
  XmlRead r;
  read_xml(r, netlist("<part ref=\"VG\" kind=\"vsource\" dc=\"0\" nets=\"g 0\"><pulse v1=\"0\" v2=\"12V\" "
                      "delay=\"1ms\" rise=\"20ns\" fall=\"20ns\" width=\"4us\" period=\"10us\"/></part>\n"));
  ASSERT_EQ(r.rendered(), "");
  // PULSE(v1 v2 td tr tf pw per), ngspice-39 manual section 4.1.1.
  EXPECT_EQ(r.nl.parts[0].source->waveform->args, (std::vector<double>{0, 12, 1e-3, 20e-9, 20e-9, 4e-6, 10e-6}));
}

TEST(XmlReader, CouplingAndSwitches) {
  XmlRead r;
  read_xml(r, netlist("<part ref=\"L1\" kind=\"inductor\" value=\"10m\" nets=\"a 0\"/>\n"
                      "<part ref=\"L2\" kind=\"inductor\" value=\"1m\" nets=\"b 0\"/>\n"
                      "<part ref=\"K1\" kind=\"coupling\" value=\"0.98\" inductors=\"L1 l2\"/>\n"
                      "<model name=\"SW1\" type=\"sw\" vt=\"1\"/><model name=\"CS\" type=\"csw\" it=\"1m\"/>\n"
                      "<part ref=\"VS\" kind=\"vsource\" dc=\"0\" nets=\"s 0\"/>\n"
                      "<part ref=\"S1\" kind=\"switch\" model=\"SW1\" nets=\"a b c 0\"/>\n"
                      "<part ref=\"W1\" kind=\"switch\" model=\"CS\" control=\"VS\" nets=\"a b\"/>\n"));
  ASSERT_EQ(r.rendered(), "");
  const Part& k = *r.nl.find_part("K1");
  EXPECT_EQ(k.kind, PartKind::coupling);
  EXPECT_TRUE(k.nets.empty());
  EXPECT_DOUBLE_EQ(*k.value, 0.98);
  EXPECT_EQ(k.controls, (std::vector<std::string>{"L1", "l2"}));
  EXPECT_EQ(r.nl.find_part("S1")->kind, PartKind::vswitch);
  EXPECT_EQ(r.nl.find_part("S1")->nets.size(), 4u);
  EXPECT_EQ(r.nl.find_part("W1")->kind, PartKind::cswitch);
  EXPECT_EQ(r.nl.find_part("W1")->controls, (std::vector<std::string>{"VS"}));
}

TEST(XmlReader, TransformerBecomesWindingsCouplingAndInstance) {
  XmlRead r;
  read_xml(r, netlist("<part ref=\"T1\" kind=\"transformer\" k=\"0.995\" p_rated=\"20W\">\n"
                      "<winding name=\"pri\" start=\"L\" end=\"N\" l=\"12H\" v_rated_ac=\"250V\"/>\n"
                      "<winding name=\"sec\" start=\"S1\" end=\"S2\" l=\"40.8mH\" turns=\"60\"/>\n"
                      "</part>\n"));
  ASSERT_EQ(r.rendered(), "");
  ASSERT_EQ(r.nl.parts.size(), 3u);
  const Part& pri = r.nl.parts[0];
  EXPECT_EQ(pri.ref, "T1.pri");
  EXPECT_EQ(pri.kind, PartKind::inductor);
  EXPECT_DOUBLE_EQ(*pri.value, 12.0);
  EXPECT_EQ(pri.params.at("type").text, "transformer-winding");
  EXPECT_DOUBLE_EQ(*pri.params.at("v_rated_ac").value, 250.0);
  EXPECT_DOUBLE_EQ(*r.nl.parts[1].params.at("turns").value, 60.0);
  const Part& k = r.nl.parts[2];
  EXPECT_EQ(k.ref, "T1.k");
  EXPECT_EQ(k.kind, PartKind::coupling);
  EXPECT_DOUBLE_EQ(*k.value, 0.995);
  EXPECT_EQ(k.controls, (std::vector<std::string>{"T1.pri", "T1.sec"}));
  EXPECT_DOUBLE_EQ(*k.params.at("p_rated").value, 20.0);
  ASSERT_EQ(r.nl.instances.size(), 1u);
  EXPECT_EQ(r.nl.instances[0].ref, "T1");
  EXPECT_EQ(r.nl.instances[0].subckt, "transformer");
  EXPECT_EQ(r.nl.instances[0].port_names,
            (std::vector<std::string>{"pri.start", "pri.end", "sec.start", "sec.end"}));
}

TEST(XmlReader, OtherKindNeedsAType) {
  XmlRead r;
  read_xml(r, netlist("<part ref=\"K5\" kind=\"other\" type=\"relay\" value=\"12V\">"
                      "<pin name=\"coil+\" net=\"a\"/><pin name=\"coil-\" net=\"0\"/></part>\n"
                      "<part ref=\"J1\" kind=\"connector\" nets=\"L N PE\"/>\n"));
  ASSERT_EQ(r.rendered(), "");
  EXPECT_EQ(r.nl.parts[0].type_name, "relay");
  EXPECT_DOUBLE_EQ(*r.nl.parts[0].value, 12.0);
  EXPECT_EQ(r.nl.parts[0].pin_names, (std::vector<std::string>{"coil+", "coil-"}));
  EXPECT_EQ(r.nl.parts[1].pin_names, (std::vector<std::string>{"1", "2", "3"}));
}

TEST(XmlReader, SupplyBecomesAnAnnotation) {
  XmlRead r;
  read_xml(r, netlist("<supply line=\"L\" neutral=\"N\" earth=\"PE\" v_rms=\"230V\" tol=\"+10%/-6%\" f=\"50Hz\"/>\n"
                      "<part ref=\"R1\" kind=\"resistor\" value=\"1M\" nets=\"L N\"/>\n"
                      "<part ref=\"R2\" kind=\"resistor\" value=\"1M\" nets=\"N PE\"/>\n"));
  ASSERT_EQ(r.rendered(), "");
  ASSERT_EQ(r.nl.annotations.size(), 1u);
  const Annotation& a = r.nl.annotations[0];
  EXPECT_EQ(a.target_kind, "supply");
  EXPECT_EQ(a.target, "");
  EXPECT_EQ(a.attrs, (std::map<std::string, std::string>{{"line", "L"},
                                                          {"neutral", "N"},
                                                          {"earth", "PE"},
                                                          {"v_rms", "230"},
                                                          {"tol", "+10%/-6%"},
                                                          {"f", "50"},
                                                          {"mains", "230V+10%-6%/50Hz"}}));
  EXPECT_DOUBLE_EQ(*r.nl.parts[0].value, 1e6);
}

TEST(XmlReader, SupplyRanges) {
  XmlRead r;
  read_xml(r, netlist("<supply line=\"L\" neutral=\"N\" v_min=\"85V\" v_max=\"264V\" f_min=\"47Hz\" f_max=\"63Hz\"/>\n"
                      "<part ref=\"R1\" kind=\"resistor\" value=\"1M\" nets=\"L N\"/>\n"));
  ASSERT_EQ(r.rendered(), "");
  EXPECT_EQ(r.nl.annotations.at(0).attrs.at("mains"), "85-264V/47-63Hz");
}

TEST(XmlReader, NetAnnotation) {
  XmlRead r;
  read_xml(r, netlist("<part ref=\"R1\" kind=\"resistor\" value=\"1k\" nets=\"OUT 0\"/>\n"
                      "<net name=\"out\" accessible=\"true\" Role=\"selv-output\"/>\n"));
  ASSERT_EQ(r.rendered(), "");
  ASSERT_EQ(r.nl.annotations.size(), 1u);
  EXPECT_EQ(r.nl.annotations[0].target_kind, "net");
  EXPECT_EQ(r.nl.annotations[0].target, "OUT");  // the net's display name
  EXPECT_EQ(r.nl.annotations[0].attrs,
            (std::map<std::string, std::string>{{"accessible", "true"}, {"role", "selv-output"}}));
}

TEST(XmlReader, BlocksFlattenLikeSpiceSubcircuits) {
  XmlRead r;
  read_xml(r, netlist("<instance ref=\"X1\" block=\"snubber\" nets=\"L N\"/>\n"
                      "<instance ref=\"X2\" block=\"pair\"><pin name=\"b\" net=\"N\"/><pin name=\"a\" net=\"Q\"/>"
                      "</instance>\n"
                      "<block name=\"snubber\" pins=\"a b\">\n"
                      "  <part ref=\"R1\" kind=\"resistor\" value=\"100\" nets=\"a mid\"/>\n"
                      "  <part ref=\"C1\" kind=\"capacitor\" value=\"100n\" nets=\"mid b\" class=\"X2\"/>\n"
                      "  <net name=\"mid\" note=\"inside\"/>\n"
                      "</block>\n"
                      "<block name=\"pair\" pins=\"a b\">\n"
                      "  <instance ref=\"XS\" block=\"snubber\" nets=\"a b\"/>\n"
                      "  <part ref=\"R9\" kind=\"resistor\" value=\"1k\" nets=\"a 0\"/>\n"
                      "</block>\n"));
  ASSERT_EQ(r.rendered(), "");
  std::vector<std::string> refs;
  for (const auto& p : r.nl.parts) refs.push_back(p.ref);
  EXPECT_EQ(refs, (std::vector<std::string>{"X1.R1", "X1.C1", "X2.XS.R1", "X2.XS.C1", "X2.R9"}));
  const Part& r1 = *r.nl.find_part("x1.r1");
  EXPECT_EQ(net_of(r.nl, r1, 0), "L");
  EXPECT_EQ(net_of(r.nl, r1, 1), "x1.mid");
  EXPECT_EQ(net_of(r.nl, *r.nl.find_part("X2.XS.C1"), 0), "x2.xs.mid");
  EXPECT_EQ(net_of(r.nl, *r.nl.find_part("X2.XS.R1"), 0), "Q");
  ASSERT_EQ(r.nl.find_part("X2.XS.R1")->instance_path.size(), 2u);
  EXPECT_EQ(r.sm.line_col(r.nl.find_part("X2.XS.R1")->instance_path[1]).line, 10u);
  ASSERT_EQ(r.nl.instances.size(), 3u);
  EXPECT_EQ(r.nl.instances[2].ref, "X2.XS");
  EXPECT_EQ(r.nl.instances[0].port_names, (std::vector<std::string>{"a", "b"}));
  ASSERT_EQ(r.nl.annotations.size(), 2u);  // snubber is instantiated twice
  EXPECT_EQ(r.nl.annotations[0].target, "x1.mid");
}

TEST(XmlReader, CommentsPiAndNamespacePlumbingAreIgnored) {
  XmlRead r;
  read_xml(r, "\xEF\xBB\xBF<?xml version=\"1.0\"?>\r\n<!-- a comment -->\r\n"
              "<netlist version=\"1\" xmlns:xsi=\"http://www.w3.org/2001/XMLSchema-instance\" "
              "xsi:noNamespaceSchemaLocation=\"mainscheck-netlist.xsd\">\r\n<?tool hint?>\r\n"
              "<part ref=\"R1\" kind=\"resistor\" value=\"1k\" nets=\"a b\"/>\r\n</netlist>");
  ASSERT_EQ(r.rendered(), "");
  EXPECT_EQ(r.sm.line_col(r.nl.parts.at(0).loc).line, 5u);
}

TEST(XmlReader, DeepNestingWithinTheLimitIsFine) {
  // Unknown elements are errors, so depth is tested through the scan: 256 levels pass it.
  std::string text = "<netlist version=\"1\">";
  for (int i = 0; i < 254; ++i) text += "<x>";
  for (int i = 0; i < 254; ++i) text += "</x>";
  text += "</netlist>";
  XmlRead r;
  read_xml(r, text);
  EXPECT_EQ(r.diags.error_count(), 1u);  // only "unknown element <x>"
  EXPECT_NE(r.rendered().find("unknown element <x> in <netlist>"), std::string::npos);
}

TEST(XmlReader, ReadsThroughTheFileReader) {
  MemoryFileReader files;
  files.add("dir/a.xml", netlist("<part ref=\"R1\" kind=\"resistor\" value=\"1k\" nets=\"a b\"/>\n"));
  SourceManager sm;
  DiagnosticSink diags;
  const Netlist nl = read_xml_file("dir/a.xml", files, sm, diags);
  EXPECT_EQ(diags.error_count(), 0u);
  EXPECT_EQ(nl.parts.size(), 1u);
  EXPECT_EQ(sm.name(nl.top_file), "dir/a.xml");
  const Netlist missing = read_xml_file("dir/none.xml", files, sm, diags);
  ASSERT_EQ(diags.error_count(), 1u);
  EXPECT_EQ(diags.diagnostics()[0].message.rfind("cannot read netlist 'dir/none.xml': ", 0), 0u);
}

}  // namespace
}  // namespace mainscheck::parser
