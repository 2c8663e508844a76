// Every diagnostic of the XML reader, pinned as rendered text with its caret line (the style of
// Ninja's manifest_parser_test.cc ParserTest.Errors). The inputs are whole files.
#include <gtest/gtest.h>

#include "tests/parser/xml_test_util.hpp"

namespace mainscheck::parser {
namespace {

using xml_test::read_xml;
using xml_test::XmlRead;

struct ErrorCase {
  const char* name;
  const char* input;
  const char* expected;
};

// clang-format off
const ErrorCase kCases[] = {
    {"malformed",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k" nets="a b">
</netlist>
)x",
     R"x(t.xml:3:3: error: malformed XML: end tag </netlist> does not match the open element
  </netlist>
    ^
)x"},
    {"unclosed",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k" nets="a b"/>
)x",
     R"x(t.xml:2:55: error: malformed XML: the file ends before every element is closed
  <part ref="R1" kind="resistor" value="1k" nets="a b"/>
                                                        ^
)x"},
    {"entity",
     R"x(<?xml version="1.0"?>
<!DOCTYPE netlist [ <!ENTITY lol "lol"> ]>
<netlist version="1"/>
)x",
     R"x(t.xml:2:11: error: document type declaration with entity declarations is refused: entities can expand without bound and are not part of the netlist format
  <!DOCTYPE netlist [ <!ENTITY lol "lol"> ]>
            ^
)x"},
    {"doctype",
     R"x(<!DOCTYPE netlist>
<netlist version="1"/>
)x",
     R"x(t.xml:1:11: warning: document type declaration ignored; the format is defined by its XSD
  <!DOCTYPE netlist>
            ^
)x"},
    {"latin1",
     R"x(<?xml version="1.0" encoding="ISO-8859-1"?>
<netlist version="1"/>
)x",
     R"x(t.xml:1:3: error: encoding 'ISO-8859-1' is not read; XML netlists must be UTF-8
  <?xml version="1.0" encoding="ISO-8859-1"?>
    ^
)x"},
    {"root",
     R"x(<design version="1"/>
)x",
     R"x(t.xml:1:1: error: root element is <design>; an XML netlist starts with <netlist>
  <design version="1"/>
  ^
)x"},
    {"tworoots",
     R"x(<netlist version="1"/>
<netlist version="1"/>
)x",
     R"x(t.xml:2:1: error: second root element <netlist>; an XML netlist has one <netlist> element
  <netlist version="1"/>
  ^
)x"},
    {"version",
     R"x(<netlist version="2"/>
)x",
     R"x(t.xml:1:19: error: netlist format version '2' is not supported; this reader reads version 1
  <netlist version="2"/>
                    ^
)x"},
    {"noversion",
     R"x(<netlist/>
)x",
     R"x(t.xml:1:1: error: <netlist> has no 'version' attribute
  <netlist/>
  ^
)x"},
    {"unknown-element",
     R"x(<netlist version="1">
<prat ref="R1"/>
</netlist>
)x",
     R"x(t.xml:2:1: error: unknown element <prat> in <netlist>; it takes <supply>, <model>, <block>, <part>, <instance>, <net>
  <prat ref="R1"/>
  ^
)x"},
    {"unknown-attr",
     R"x(<netlist version="1" titel="x"/>
)x",
     R"x(t.xml:1:22: error: unknown attribute 'titel' on <netlist>; it takes version, title
  <netlist version="1" titel="x"/>
                       ^
)x"},
    {"text",
     R"x(<netlist version="1">
  stray
</netlist>
)x",
     R"x(t.xml:2:3: error: text inside <netlist>; the format keeps everything in attributes
    stray
    ^
)x"},
    {"dup-attr",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k" V_rated="200V" v_rated="100V" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:58: error: attribute 'v_rated' repeats 'V_rated' on <part> (attribute names are case-insensitive)
  <part ref="R1" kind="resistor" value="1k" V_rated="200V" v_rated="100V" nets="a b"/>
                                                           ^
t.xml:2:43: note: first given here
  <part ref="R1" kind="resistor" value="1k" V_rated="200V" v_rated="100V" nets="a b"/>
                                            ^
)x"},
    {"dup-ref",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k" nets="a b"/>
<part ref="r1" kind="resistor" value="2k" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:3:1: error: ref 'r1' is used twice (refs are case-insensitive)
  <part ref="r1" kind="resistor" value="2k" nets="a b"/>
  ^
t.xml:2:1: note: first used here
  <part ref="R1" kind="resistor" value="1k" nets="a b"/>
  ^
)x"},
    {"no-ref",
     R"x(<netlist version="1">
<part kind="resistor" value="1k" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:1: error: <part> has no 'ref' attribute
  <part kind="resistor" value="1k" nets="a b"/>
  ^
)x"},
    {"dot-ref",
     R"x(<netlist version="1">
<part ref="X1.R1" kind="resistor" value="1k" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:14: error: ref 'X1.R1' contains '.', which separates hierarchy levels in flattened refs
  <part ref="X1.R1" kind="resistor" value="1k" nets="a b"/>
               ^
)x"},
    {"bad-kind",
     R"x(<netlist version="1">
<part ref="R1" kind="resistr" value="1k" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:22: error: unknown part kind 'resistr' for R1; did you mean 'resistor'?
  <part ref="R1" kind="resistr" value="1k" nets="a b"/>
                       ^
)x"},
    {"no-value",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:1: error: resistor R1 has no 'value' attribute
  <part ref="R1" kind="resistor" nets="a b"/>
  ^
)x"},
    {"rkm",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="2k2" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:41: error: invalid value '2k2' for value of resistor R1: digits after the prefix 'k'; write 2.2k
  <part ref="R1" kind="resistor" value="2k2" nets="a b"/>
                                          ^
)x"},
    {"meg",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1MEG" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:40: error: invalid value '1MEG' for value of resistor R1: unknown prefix or unit 'MEG'; MEG is SPICE notation, write M for mega
  <part ref="R1" kind="resistor" value="1MEG" nets="a b"/>
                                         ^
)x"},
    {"unit-mismatch",
     R"x(<netlist version="1">
<part ref="C1" kind="capacitor" value="10uH" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:43: error: invalid value '10uH' for value of capacitor C1: unit 'H' does not fit; expected a value in F
  <part ref="C1" kind="capacitor" value="10uH" nets="a b"/>
                                            ^
)x"},
    {"rating-unit",
     R"x(<netlist version="1">
<part ref="F1" kind="fuse" i_rated="250V" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:40: error: invalid value '250V' for i_rated of fuse F1: unit 'V' does not fit; expected a value in A
  <part ref="F1" kind="fuse" i_rated="250V" nets="a b"/>
                                         ^
)x"},
    {"exp-prefix",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1e3k" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:42: error: invalid value '1e3k' for value of resistor R1: an exponent and a prefix together; write one of them
  <part ref="R1" kind="resistor" value="1e3k" nets="a b"/>
                                           ^
)x"},
    {"comma",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="4,7k" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:40: error: invalid value '4,7k' for value of resistor R1: ',' is not a decimal separator; write '.'
  <part ref="R1" kind="resistor" value="4,7k" nets="a b"/>
                                         ^
)x"},
    {"diode-value",
     R"x(<netlist version="1">
<part ref="D1" kind="diode" value="1N4007" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:29: error: diode D1 takes no value; give it as v_rated="..."
  <part ref="D1" kind="diode" value="1N4007" nets="a b"/>
                              ^
)x"},
    {"pins-count",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k" nets="a"/>
</netlist>
)x",
     R"x(t.xml:2:49: error: resistor R1 has 1 pin; it needs 2
  <part ref="R1" kind="resistor" value="1k" nets="a"/>
                                                  ^
)x"},
    {"pin-name",
     R"x(<netlist version="1">
<part ref="D1" kind="diode"><pin name="anode" net="a"/><pin name="kathode" net="b"/></part>
</netlist>
)x",
     R"x(t.xml:2:67: error: diode D1 has no pin 'kathode'; its pins are anode, cathode
  <part ref="D1" kind="diode"><pin name="anode" net="a"/><pin name="kathode" net="b"/></part>
                                                                    ^
t.xml:2:1: error: pin cathode of diode D1 is not connected
  <part ref="D1" kind="diode"><pin name="anode" net="a"/><pin name="kathode" net="b"/></part>
  ^
)x"},
    {"pin-twice",
     R"x(<netlist version="1">
<part ref="D1" kind="diode"><pin name="anode" net="a"/><pin name="a" net="b"/><pin name="cathode" net="c"/></part>
</netlist>
)x",
     R"x(t.xml:2:67: error: pin anode of D1 is connected twice
  <part ref="D1" kind="diode"><pin name="anode" net="a"/><pin name="a" net="b"/><pin name="cathode" net="c"/></part>
                                                                    ^
)x"},
    {"pin-missing",
     R"x(<netlist version="1">
<part ref="Q1" kind="bjt"><pin name="c" net="a"/><pin name="b" net="b"/></part>
</netlist>
)x",
     R"x(t.xml:2:1: error: pin emitter of bjt Q1 is not connected
  <part ref="Q1" kind="bjt"><pin name="c" net="a"/><pin name="b" net="b"/></part>
  ^
)x"},
    {"pin-no-net",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k"><pin name="1"/><pin name="2" net="b"/></part>
</netlist>
)x",
     R"x(t.xml:2:43: error: <pin> of R1 has no 'net' attribute
  <part ref="R1" kind="resistor" value="1k"><pin name="1"/><pin name="2" net="b"/></part>
                                            ^
t.xml:2:1: error: pin 1 of resistor R1 is not connected
  <part ref="R1" kind="resistor" value="1k"><pin name="1"/><pin name="2" net="b"/></part>
  ^
)x"},
    {"pins-both",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k" nets="a b"><pin net="a"/><pin net="b"/></part>
</netlist>
)x",
     R"x(t.xml:2:43: error: resistor R1 gives both 'nets' and <pin> elements; use one
  <part ref="R1" kind="resistor" value="1k" nets="a b"><pin net="a"/><pin net="b"/></part>
                                            ^
)x"},
    {"pins-mixed",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k"><pin name="1" net="a"/><pin net="b"/></part>
</netlist>
)x",
     R"x(t.xml:2:1: error: resistor R1 mixes named and unnamed pins; name all or none
  <part ref="R1" kind="resistor" value="1k"><pin name="1" net="a"/><pin net="b"/></part>
  ^
)x"},
    {"model-missing",
     R"x(<netlist version="1">
<part ref="D1" kind="diode" model="DX" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:36: error: diode D1 uses model 'DX', which no <model> defines
  <part ref="D1" kind="diode" model="DX" nets="a b"/>
                                     ^
)x"},
    {"model-type",
     R"x(<netlist version="1">
<model name="QN" type="npn"/>
<part ref="D1" kind="diode" model="QN" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:3:36: error: diode D1 uses model 'QN' of type npn; a diode needs type d
  <part ref="D1" kind="diode" model="QN" nets="a b"/>
                                     ^
)x"},
    {"model-dup",
     R"x(<netlist version="1">
<model name="DX" type="d"/>
<model name="dx" type="d"/>
</netlist>
)x",
     R"x(t.xml:3:1: error: model 'dx' is defined twice
  <model name="dx" type="d"/>
  ^
t.xml:2:1: note: first definition here
  <model name="DX" type="d"/>
  ^
)x"},
    {"model-bad-param",
     R"x(<netlist version="1">
<model name="DX" type="d" bv="1kV" is="abc"/>
</netlist>
)x",
     R"x(t.xml:2:40: error: invalid value 'abc' for is of model DX: 'abc' is not a number
  <model name="DX" type="d" bv="1kV" is="abc"/>
                                         ^
)x"},
    {"coupling-missing",
     R"x(<netlist version="1">
<part ref="L1" kind="inductor" value="1m" nets="a 0"/>
<part ref="R2" kind="resistor" value="1" nets="a 0"/>
<part ref="K1" kind="coupling" value="0.9" inductors="L1 L2"/>
<part ref="K2" kind="coupling" value="0.9" inductors="L1 R2"/>
</netlist>
)x",
     R"x(t.xml:4:1: error: K1 names 'L2', which is no part of this scope; it needs an inductor
  <part ref="K1" kind="coupling" value="0.9" inductors="L1 L2"/>
  ^
t.xml:5:1: error: K2 names R2, a resistor; it needs an inductor
  <part ref="K2" kind="coupling" value="0.9" inductors="L1 R2"/>
  ^
t.xml:3:1: note: R2 is defined here
  <part ref="R2" kind="resistor" value="1" nets="a 0"/>
  ^
)x"},
    {"coupling-range",
     R"x(<netlist version="1">
<part ref="L1" kind="inductor" value="1m" nets="a 0"/>
<part ref="L2" kind="inductor" value="1m" nets="b 0"/>
<part ref="K1" kind="coupling" value="1.5" inductors="L1 L2"/>
</netlist>
)x",
     R"x(t.xml:4:39: error: coupling factor 1.5 of K1 is outside 0 < |k| <= 1
  <part ref="K1" kind="coupling" value="1.5" inductors="L1 L2"/>
                                        ^
)x"},
    {"supply-missing-net",
     R"x(<netlist version="1">
<supply line="L" neutral="N" v_rms="230V" f="50Hz"/>
<part ref="R1" kind="resistor" value="1k" nets="L a"/>
</netlist>
)x",
     R"x(t.xml:2:27: error: <supply> neutral net 'N' is not connected to any part
  <supply line="L" neutral="N" v_rms="230V" f="50Hz"/>
                            ^
)x"},
    {"supply-no-voltage",
     R"x(<netlist version="1">
<supply line="L" neutral="N" f="50Hz"/>
</netlist>
)x",
     R"x(t.xml:2:1: error: <supply> gives no voltage; set v_rms, or v_min and v_max
  <supply line="L" neutral="N" f="50Hz"/>
  ^
)x"},
    {"supply-range",
     R"x(<netlist version="1">
<supply line="L" neutral="N" v_min="264V" v_max="85V" f="50Hz"/>
</netlist>
)x",
     R"x(t.xml:2:30: error: v_min 264 V of <supply> is above v_max 85 V
  <supply line="L" neutral="N" v_min="264V" v_max="85V" f="50Hz"/>
                               ^
)x"},
    {"supply-tol-both",
     R"x(<netlist version="1">
<supply line="L" neutral="N" v_min="207V" v_max="253V" tol="10%" f="50Hz"/>
</netlist>
)x",
     R"x(t.xml:2:56: error: <supply> gives both tol and v_min/v_max; give one of them
  <supply line="L" neutral="N" v_min="207V" v_max="253V" tol="10%" f="50Hz"/>
                                                         ^
)x"},
    {"supply-twice",
     R"x(<netlist version="1">
<supply line="L" neutral="N" v_rms="230V" f="50Hz"/>
<supply line="L" neutral="N" v_rms="120V" f="60Hz"/>
<part ref="R1" kind="resistor" value="1k" nets="L N"/>
</netlist>
)x",
     R"x(t.xml:3:1: error: second <supply> element; a netlist has one
  <supply line="L" neutral="N" v_rms="120V" f="60Hz"/>
  ^
t.xml:2:1: note: first <supply> here
  <supply line="L" neutral="N" v_rms="230V" f="50Hz"/>
  ^
)x"},
    {"supply-unknown",
     R"x(<netlist version="1">
<supply line="L" neutral="N" v_rms="230V" f="50Hz" vmax="253V"/>
</netlist>
)x",
     R"x(t.xml:2:52: error: unknown attribute 'vmax' on <supply>; it takes line, neutral, earth, v_rms, v_min, v_max, tol, f, f_min, f_max, source_impedance
  <supply line="L" neutral="N" v_rms="230V" f="50Hz" vmax="253V"/>
                                                     ^
t.xml:2:15: error: <supply> line net 'L' is not connected to any part
  <supply line="L" neutral="N" v_rms="230V" f="50Hz" vmax="253V"/>
                ^
t.xml:2:27: error: <supply> neutral net 'N' is not connected to any part
  <supply line="L" neutral="N" v_rms="230V" f="50Hz" vmax="253V"/>
                            ^
)x"},
    {"net-nothing",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k" nets="a b"/>
<net name="c" accessible="true"/>
</netlist>
)x",
     R"x(t.xml:3:1: error: <net> names 'c', which no pin connects to
  <net name="c" accessible="true"/>
  ^
)x"},
    {"net-accessible",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k" nets="a b"/>
<net name="a" accessible="yes"/>
</netlist>
)x",
     R"x(t.xml:3:27: error: accessible='yes' on net a must be true or false
  <net name="a" accessible="yes"/>
                            ^
)x"},
    {"block-unknown",
     R"x(<netlist version="1">
<instance ref="X1" block="nothing" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:27: error: instance X1 uses block 'nothing', which no <block> defines
  <instance ref="X1" block="nothing" nets="a b"/>
                            ^
)x"},
    {"block-pins",
     R"x(<netlist version="1">
<block name="rc" pins="a b"><part ref="R1" kind="resistor" value="1k" nets="a b"/></block>
<instance ref="X1" block="rc" nets="a b c"/>
</netlist>
)x",
     R"x(t.xml:3:1: error: instance X1 connects 3 nets; block 'rc' has 2 pins (a b)
  <instance ref="X1" block="rc" nets="a b c"/>
  ^
)x"},
    {"block-recursion",
     R"x(<netlist version="1">
<block name="loop" pins="a"><instance ref="X9" block="loop" nets="a"/></block>
<instance ref="X1" block="loop" nets="n"/>
</netlist>
)x",
     R"x(t.xml:2:29: error: instance X9 of block 'loop' is inside block 'loop' itself; blocks cannot recurse
  <block name="loop" pins="a"><instance ref="X9" block="loop" nets="a"/></block>
                              ^
t.xml:2:1: note: block defined here
  <block name="loop" pins="a"><instance ref="X9" block="loop" nets="a"/></block>
  ^
)x"},
    {"source-missing-arg",
     R"x(<netlist version="1">
<part ref="V1" kind="vsource" nets="L N"><sin offset="0" freq="50Hz"/></part>
</netlist>
)x",
     R"x(t.xml:2:42: error: <sin> of V1 has no 'amplitude' attribute
  <part ref="V1" kind="vsource" nets="L N"><sin offset="0" freq="50Hz"/></part>
                                           ^
)x"},
    {"source-two-waveforms",
     R"x(<netlist version="1">
<part ref="V1" kind="vsource" nets="L N"><sin offset="0" amplitude="325" freq="50Hz"/><sin offset="0" amplitude="325" freq="50Hz"/></part>
</netlist>
)x",
     R"x(t.xml:2:87: error: vsource V1 has a second waveform <sin>; a source takes one
  <part ref="V1" kind="vsource" nets="L N"><sin offset="0" amplitude="325" freq="50Hz"/><sin offset="0" amplitude="325" freq="50Hz"/></part>
                                                                                        ^
)x"},
    {"source-on-resistor",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="1k" dc="5V" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:43: error: only a source takes 'dc'; resistor R1 is not one
  <part ref="R1" kind="resistor" value="1k" dc="5V" nets="a b"/>
                                            ^
)x"},
    {"other-no-type",
     R"x(<netlist version="1">
<part ref="U1" kind="other" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:1: error: part U1 of kind other needs a 'type' attribute saying what it is
  <part ref="U1" kind="other" nets="a b"/>
  ^
)x"},
    {"transformer-one-winding",
     R"x(<netlist version="1">
<part ref="T1" kind="transformer"><winding name="pri" start="L" end="N"/></part>
</netlist>
)x",
     R"x(t.xml:2:1: error: transformer T1 has 1 <winding>; a transformer needs at least two
  <part ref="T1" kind="transformer"><winding name="pri" start="L" end="N"/></part>
  ^
)x"},
    {"escaped-value",
     R"x(<netlist version="1">
<part ref="R1" kind="resistor" value="&amp;2k2" nets="a b"/>
</netlist>
)x",
     R"x(t.xml:2:39: error: invalid value '&2k2' for value of resistor R1: '&2k2' is not a number
  <part ref="R1" kind="resistor" value="&amp;2k2" nets="a b"/>
                                        ^
)x"},
};
// clang-format on

class XmlReaderErrors : public ::testing::TestWithParam<ErrorCase> {};

TEST_P(XmlReaderErrors, RendersExactly) {
  XmlRead r;
  read_xml(r, GetParam().input);
  EXPECT_EQ(r.rendered(), GetParam().expected);
}

INSTANTIATE_TEST_SUITE_P(Cases, XmlReaderErrors, ::testing::ValuesIn(kCases),
                         [](const auto& info) {
                           std::string n = info.param.name;
                           for (char& c : n) c = (c == '-') ? '_' : c;
                           return n;
                         });

}  // namespace
}  // namespace mainscheck::parser
