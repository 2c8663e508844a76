// XML value syntax: SI prefixes the SI way (SI Brochure, 9th edition, table 7), case-sensitive,
// `M` is mega (unlike SPICE, where 1M is 1e-3: spice-syntax checklist item 20).
#include "parser/xml_values.hpp"

#include <gtest/gtest.h>

namespace mainscheck::parser {
namespace {

double value(std::string_view text, XmlUnit unit = XmlUnit::any) {
  const XmlValue v = parse_xml_value(text, unit);
  EXPECT_TRUE(v.value) << text << ": " << v.error;
  return v.value.value_or(-1);
}

std::string error(std::string_view text, XmlUnit unit = XmlUnit::any) {
  const XmlValue v = parse_xml_value(text, unit);
  EXPECT_FALSE(v.value) << text;
  return v.error + " @" + std::to_string(v.error_offset);
}

TEST(XmlValues, PlainNumbers) {
  EXPECT_DOUBLE_EQ(value("230"), 230.0);
  EXPECT_DOUBLE_EQ(value("-1.5"), -1.5);
  EXPECT_DOUBLE_EQ(value("+.5"), 0.5);
  EXPECT_DOUBLE_EQ(value("5."), 5.0);
  EXPECT_DOUBLE_EQ(value("4.7e-6"), 4.7e-6);
  EXPECT_DOUBLE_EQ(value("1E3"), 1000.0);
  EXPECT_DOUBLE_EQ(value("  12 \n"), 12.0);
}

TEST(XmlValues, PrefixesAreSiAndCaseSensitive) {
  EXPECT_DOUBLE_EQ(value("1T"), 1e12);
  EXPECT_DOUBLE_EQ(value("1G"), 1e9);
  EXPECT_DOUBLE_EQ(value("1M"), 1e6);  // mega, not SPICE's milli
  EXPECT_DOUBLE_EQ(value("4.7k"), 4700.0);
  EXPECT_DOUBLE_EQ(value("1m"), 1e-3);
  EXPECT_DOUBLE_EQ(value("2.2u"), 2.2e-6);
  EXPECT_DOUBLE_EQ(value("2.2\xC2\xB5"), 2.2e-6);  // U+00B5 micro sign
  EXPECT_DOUBLE_EQ(value("2.2\xCE\xBC"), 2.2e-6);  // U+03BC Greek mu
  EXPECT_DOUBLE_EQ(value("100n"), 100e-9);
  EXPECT_DOUBLE_EQ(value("10p"), 10e-12);
  EXPECT_DOUBLE_EQ(value("3f"), 3e-15);
  // Correctly rounded like the literal, not 4.7 * 1e-6.
  EXPECT_EQ(value("4.7u"), 4.7e-6);
}

TEST(XmlValues, UnitsMustFit) {
  EXPECT_DOUBLE_EQ(value("10uF", XmlUnit::farad), 10e-6);
  EXPECT_DOUBLE_EQ(value("2200 \xC2\xB5" "F", XmlUnit::farad), 2200e-6);
  EXPECT_DOUBLE_EQ(value("1F", XmlUnit::farad), 1.0);  // F is farad, f is femto
  EXPECT_DOUBLE_EQ(value("1fF", XmlUnit::farad), 1e-15);
  EXPECT_DOUBLE_EQ(value("4.7kOhm", XmlUnit::ohm), 4700.0);
  EXPECT_DOUBLE_EQ(value("1M\xCE\xA9", XmlUnit::ohm), 1e6);
  EXPECT_DOUBLE_EQ(value("1M\xE2\x84\xA6", XmlUnit::ohm), 1e6);
  EXPECT_DOUBLE_EQ(value("50Hz", XmlUnit::hertz), 50.0);
  EXPECT_DOUBLE_EQ(value("10mH", XmlUnit::henry), 10e-3);
  EXPECT_DOUBLE_EQ(value("20ns", XmlUnit::second), 20e-9);
  EXPECT_DOUBLE_EQ(value("3.2mm", XmlUnit::metre), 3.2e-3);
  EXPECT_DOUBLE_EQ(value("3m", XmlUnit::metre), 3.0);   // the unit wins over the prefix
  EXPECT_DOUBLE_EQ(value("3m", XmlUnit::volt), 3e-3);   // unit omitted: milli
  EXPECT_DOUBLE_EQ(value("0.6A2s", XmlUnit::a2s), 0.6);
  EXPECT_DOUBLE_EQ(value("0.6A\xC2\xB2s", XmlUnit::a2s), 0.6);
  EXPECT_DOUBLE_EQ(value("5%", XmlUnit::percent), 0.05);
  EXPECT_DOUBLE_EQ(value("5", XmlUnit::percent), 0.05);  // docs/attributes.md: tol is in percent
  EXPECT_EQ(error("10V", XmlUnit::ampere), "unit 'V' does not fit; expected a value in A @2");
  EXPECT_EQ(error("1Hz", XmlUnit::henry), "unit 'Hz' does not fit; expected a value in H @1");
  EXPECT_EQ(error("5mA", XmlUnit::volt), "unit 'A' does not fit; expected a value in V @2");
  EXPECT_EQ(error("2V", XmlUnit::none), "unit 'V' does not fit; expected a plain number without a unit @1");
}

TEST(XmlValues, SpiceHabitsAreErrorsWithHints) {
  EXPECT_EQ(error("1MEG"), "unknown prefix or unit 'MEG'; MEG is SPICE notation, write M for mega @1");
  EXPECT_EQ(error("1meg"), "unknown prefix or unit 'meg'; MEG is SPICE notation, write M for mega @1");
  EXPECT_EQ(error("4.7K"), "unknown prefix or unit 'K'; write k for kilo @3");
  EXPECT_EQ(error("10UF"), "unknown prefix or unit 'UF'; write u or \xC2\xB5 for micro @2");
  EXPECT_EQ(error("2mil"), "unknown prefix or unit 'mil'; mil is not an SI prefix @1");
  EXPECT_EQ(error("2k2"), "digits after the prefix 'k'; write 2.2k @2");
  EXPECT_EQ(error("4u7F", XmlUnit::farad), "digits after the prefix 'u'; write 4.7uF @2");
  EXPECT_EQ(error("1e3k"), "an exponent and a prefix together; write one of them @3");
  EXPECT_EQ(error("10ohms", XmlUnit::ohm), "unknown prefix or unit 'ohms' @2");
}

TEST(XmlValues, MalformedNumbers) {
  EXPECT_EQ(error(""), "the value is empty @0");
  EXPECT_EQ(error("   "), "the value is empty @3");
  EXPECT_EQ(error("abc"), "'abc' is not a number @0");
  EXPECT_EQ(error("."), "'.' is not a number @0");
  EXPECT_EQ(error("-"), "'-' is not a number @1");
  EXPECT_EQ(error("inf"), "'inf' is not a number @0");
  EXPECT_EQ(error("1e"), "the exponent after 'e' has no digits @1");
  EXPECT_EQ(error("1e+"), "the exponent after 'e' has no digits @1");
  EXPECT_EQ(error("4,7"), "',' is not a decimal separator; write '.' @1");
  EXPECT_EQ(error("1.2.3"), "unknown prefix or unit '.3' @3");
  EXPECT_EQ(error("1e400"), "the number is out of range @0");
  EXPECT_EQ(error("1 2"), "unknown prefix or unit '2' @2");
}

TEST(XmlValues, RatingFractionsAsBillsOfMaterialsWriteThem) {
  const auto value = [](std::string_view text, XmlUnit unit) {
    const XmlValue v = parse_xml_attribute(text, unit);
    EXPECT_TRUE(v.value) << text << ": " << v.error;
    return v.value.value_or(-1);
  };
  EXPECT_EQ(value("1/4W", XmlUnit::watt), 0.25);
  EXPECT_EQ(value(" 1/8 W ", XmlUnit::watt), 0.125);
  EXPECT_EQ(value("1/2", XmlUnit::watt), 0.5);
  EXPECT_EQ(value("0.25W", XmlUnit::watt), 0.25);  // everything else as parse_xml_value
  const auto error = [](std::string_view text, XmlUnit unit) {
    const XmlValue v = parse_xml_attribute(text, unit);
    EXPECT_FALSE(v.value) << text;
    return v.error + " @" + std::to_string(v.error_offset);
  };
  EXPECT_EQ(error("1/4mW", XmlUnit::watt), "a prefix after the fraction '1/4' @3");
  EXPECT_EQ(error("1/4V", XmlUnit::watt), "unit 'V' does not fit; expected a value in W @3");
  EXPECT_EQ(error("1/4Wx", XmlUnit::watt), "unknown prefix or unit 'Wx' @3");
  EXPECT_EQ(error("1/0", XmlUnit::watt), "fraction '1/0' divides by zero @0");
  // Plain values keep the plain reader: a fraction there is not a value.
  EXPECT_FALSE(parse_xml_value("1/4W", XmlUnit::watt).value);
}

TEST(XmlValues, FormatIsShortestRoundTrip) {
  EXPECT_EQ(format_xml_number(230), "230");
  EXPECT_EQ(format_xml_number(0.1), "0.1");
  EXPECT_EQ(format_xml_number(4.7e-6), "4.7e-06");
}

}  // namespace
}  // namespace mainscheck::parser
