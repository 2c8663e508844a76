// Hostile and broken XML input: bytes that are not UTF-8, nesting two million deep, limits on
// size, parts and block depth. Each must end in one located error, never a crash.
#include <gtest/gtest.h>

#include "parser/xml_scan.hpp"
#include "tests/parser/xml_test_util.hpp"

namespace mainscheck::parser {
namespace {

using xml_test::netlist;
using xml_test::read_xml;
using xml_test::XmlRead;

TEST(XmlLimits, InvalidUtf8IsLocated) {
  XmlRead r;
  read_xml(r, "<netlist version=\"1\" title=\"caf\xE9\"/>\n");
  EXPECT_EQ(r.rendered(),
            "t.xml:1:32: error: byte 0xe9 is not valid UTF-8; XML netlists must be UTF-8\n"
            "  <netlist version=\"1\" title=\"caf\xE9\"/>\n"
            "                                 ^\n");
}

TEST(XmlLimits, ControlCharacterIsLocated) {
  XmlRead r;
  read_xml(r, "<netlist version=\"1\" title=\"a\x01\"/>\n");
  EXPECT_EQ(r.rendered(),
            "t.xml:1:30: error: character U+0001 is not allowed in XML\n"
            "  <netlist version=\"1\" title=\"a?\"/>\n"
            "                               ^\n");
}

TEST(XmlLimits, Utf16IsRefused) {
  const auto issue = scan_xml_text(std::string_view("\xFF\xFE<\0n\0", 6), 256);
  ASSERT_TRUE(issue);
  EXPECT_EQ(issue->message, "the file starts with a UTF-16 byte-order mark; XML netlists must be UTF-8");
}

TEST(XmlLimits, OverlongAndSurrogateUtf8AreRefused) {
  EXPECT_TRUE(scan_xml_text("<a t=\"\xC0\xAF\"/>", 256));           // overlong '/'
  EXPECT_TRUE(scan_xml_text("<a t=\"\xED\xA0\x80\"/>", 256));       // U+D800 surrogate
  EXPECT_TRUE(scan_xml_text("<a t=\"\xF4\x90\x80\x80\"/>", 256));   // above U+10FFFF
  EXPECT_FALSE(scan_xml_text("<a t=\"\xF0\x9F\x94\x8C\"/>", 256));  // U+1F50C is fine
}

TEST(XmlLimits, TwoMillionNestedElementsGiveOneCleanError) {
  std::string text = "<netlist version=\"1\">\n";
  text.reserve(text.size() + 2'000'000 * 7);
  for (int i = 0; i < 2'000'000; ++i) text += "<b>";
  for (int i = 0; i < 2'000'000; ++i) text += "</b>";
  text += "</netlist>\n";
  XmlRead r;
  read_xml(r, std::move(text));
  ASSERT_EQ(r.diags.diagnostics().size(), 1u);
  const Diagnostic& d = r.diags.diagnostics()[0];
  EXPECT_EQ(d.message, "elements nest deeper than 256 levels (limit max_xml_depth)");
  // <netlist> is level 1, so the 256th <b> is level 257: column 1 + 255 * 3.
  EXPECT_EQ(r.sm.line_col(d.loc).line, 2u);
  EXPECT_EQ(r.sm.line_col(d.loc).column, 766u);
}

TEST(XmlLimits, TwoHundredThousandAttributesGiveOneCleanError) {
  // Issue 15 item 17: every attribute of such an element was checked and reported one by one.
  std::string text = "<netlist version=\"1\">\n<part ref=\"R1\"";
  for (int i = 0; i < 200'000; ++i) text += " a" + std::to_string(i) + "=\"1\"";
  text += "/>\n</netlist>\n";
  XmlRead r;
  read_xml(r, std::move(text));
  ASSERT_EQ(r.diags.diagnostics().size(), 1u);
  const Diagnostic& d = r.diags.diagnostics()[0];
  EXPECT_EQ(d.message, "element has 200001 attributes, more than the limit of 1024 (--max-xml-attributes)");
  EXPECT_EQ(r.sm.line_col(d.loc).line, 2u);
  EXPECT_EQ(r.sm.line_col(d.loc).column, 1u);
}

TEST(XmlLimits, AttributeCountBoundary) {
  const auto element = [](int attributes) {
    std::string e = "<a";
    for (int i = 0; i < attributes; ++i)
      e += " x" + std::to_string(i) + "='a=b'";  // '=' inside values do not count
    return e + "/>";
  };
  EXPECT_FALSE(scan_xml_text(element(1024), 256, 1024));
  const auto over = scan_xml_text(element(1025), 256, 1024);
  ASSERT_TRUE(over);
  EXPECT_EQ(over->message, "element has 1025 attributes, more than the limit of 1024 (--max-xml-attributes)");
  EXPECT_EQ(over->offset, 0u);
}

TEST(XmlLimits, DepthScanIgnoresMarkupInCommentsCdataAndAttributes) {
  const std::string deep_looking =
      "<a><!-- <b><b><b> --><![CDATA[<b><b>]]><c t=\"<b>\" u='>'/><?pi <b>?></a>";
  EXPECT_FALSE(scan_xml_text(deep_looking, 2));
  EXPECT_TRUE(scan_xml_text("<a><b><c/></b></a>", 1));
  EXPECT_FALSE(scan_xml_text("<a><b><c/></b></a>", 2));
}

TEST(XmlLimits, FileSize) {
  ReadOptions o;
  o.limits.max_file_bytes = 10;
  XmlRead r;
  read_xml(r, netlist(""), o);
  ASSERT_EQ(r.diags.error_count(), 1u);
  EXPECT_EQ(r.diags.diagnostics()[0].message,
            "netlist 't.xml' is 33 bytes; the limit is 10 (max_file_bytes)");
}

TEST(XmlLimits, PartCountAfterFlattening) {
  ReadOptions o;
  o.limits.max_parts = 3;
  XmlRead r;
  read_xml(
      r,
      netlist(
          "<block name=\"rr\" pins=\"a\"><part ref=\"R1\" kind=\"resistor\" value=\"1\" nets=\"a 0\"/>"
          "<part ref=\"R2\" kind=\"resistor\" value=\"1\" nets=\"a 0\"/></block>\n"
          "<instance ref=\"X1\" block=\"rr\" nets=\"n\"/>\n<instance ref=\"X2\" block=\"rr\" nets=\"n\"/>\n"),
      o);
  ASSERT_EQ(r.diags.error_count(), 1u);
  EXPECT_EQ(r.diags.diagnostics()[0].message,
            "the netlist has more than 3 parts after flattening (limit max_parts)");
  EXPECT_EQ(r.nl.parts.size(), 3u);
}

TEST(XmlLimits, BlockDepth) {
  ReadOptions o;
  o.limits.max_subckt_depth = 2;
  std::string body;
  for (int i = 0; i < 4; ++i) {
    body += "<block name=\"b" + std::to_string(i) + "\" pins=\"a\">";
    if (i < 3) body += "<instance ref=\"X\" block=\"b" + std::to_string(i + 1) + "\" nets=\"a\"/>";
    body += "<part ref=\"R\" kind=\"resistor\" value=\"1\" nets=\"a 0\"/></block>\n";
  }
  body += "<instance ref=\"X0\" block=\"b0\" nets=\"n\"/>\n";
  XmlRead r;
  read_xml(r, netlist(body), o);
  ASSERT_EQ(r.diags.error_count(), 1u);
  EXPECT_EQ(r.diags.diagnostics()[0].message,
            "instance X nests blocks deeper than 2 levels (limit max_subckt_depth)");
  EXPECT_TRUE(r.nl.find_part("X0.X.R"));
  EXPECT_FALSE(r.nl.find_part("X0.X.X.R"));
}

TEST(XmlLimits, EntityExpansionIsRefusedBeforeUse) {
  XmlRead r;
  read_xml(r,
           "<!DOCTYPE netlist [<!ENTITY a \"aaaaaaaaaa\"><!ENTITY b \"&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;\">]>\n"
           "<netlist version=\"1\" title=\"&b;\"/>\n");
  ASSERT_EQ(r.diags.error_count(), 1u);
  EXPECT_EQ(r.diags.diagnostics()[0].message.rfind(
                "document type declaration with entity declarations is refused", 0),
            0u);
  EXPECT_TRUE(r.nl.parts.empty());
}

}  // namespace
}  // namespace mainscheck::parser
