#include "parser/spice_number.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>

namespace mainscheck::parser {
namespace {

struct NumberCase {
  const char* token;
  double value;
};

// reference: ngspice-39 run on 2026-12-01, deck tests/data/expr/numbers.cir (`ngspice -b numbers.cir`,
// `set numdgt=15`, `print @rN[resistance]` after `op`). ngspice prints 16 significant digits, so
// values agree to 1e-15 relative; `10uF` printed as 9.999999999999999e-06 (ngspice multiplies
// 10 * 1e-6), we give the correctly rounded 1e-5.
constexpr NumberCase kNgspiceTable[] = {
    {"4.7k", 4.7e3},      {"+3.9k", 3.9e3},     {".5", 0.5},         {"5.", 5.0},
    {"1.5E-3", 1.5e-3},   {"2.5e+2", 250.0},    {"10uF", 1e-5},      {"1kohm", 1e3},
    {"2.2megohm", 2.2e6}, {"1Mega", 1e6},       {"12V", 12.0},       {"10ohm", 10.0},
    {"1H", 1.0},          {"100nF", 1e-7},      {"100M", 0.1},       {"1MOhm", 1e-3},
    {"10F", 1e-14},       {"1milli", 25.4e-6},  {"1e3k", 1e6},       {"1e3m", 1.0},
    {"1.0e4k", 1e7},      {"4.7E-9", 4.7e-9},   {"1a", 1.0},         {"1x", 1.0},
    {"2k2", 2e3},         {"4u7", 4e-6},        {"1k2x3", 1e3},      {"1T", 1e12},
    {"1G", 1e9},          {"3p", 3e-12},        {"1mil", 25.4e-6},   {"2.2\xC2\xB5", 2.2e-6},
    {"-2.2k", -2.2e3},
};

TEST(SpiceNumber, MatchesNgspiceTable) {
  for (const auto& c : kNgspiceTable) {
    SCOPED_TRACE(c.token);
    const SpiceNumber n = parse_spice_number(c.token);
    ASSERT_TRUE(n.value.has_value()) << n.error;
    EXPECT_NEAR(*n.value, c.value, std::abs(c.value) * 1e-15);
    EXPECT_EQ(n.length, std::string(c.token).size());
    EXPECT_TRUE(n.error.empty());
  }
}

TEST(SpiceNumber, SuffixesAreExactDecimalScaling) {
  // Folding the suffix into the exponent gives the double nearest the decimal value.
  EXPECT_EQ(*parse_spice_number("2.2meg").value, 2.2e6);
  EXPECT_EQ(*parse_spice_number("4.7u").value, 4.7e-6);
  EXPECT_EQ(*parse_spice_number("10uF").value, 1e-5);
  EXPECT_EQ(*parse_spice_number("330n").value, 330e-9);
  EXPECT_EQ(*parse_spice_number("1e3k").value, 1e6);
}

TEST(SpiceNumber, ReportsSuffixAndIgnoredLetters) {
  const SpiceNumber m = parse_spice_number("1MOhm");
  EXPECT_EQ(m.suffix, "m");
  EXPECT_EQ(m.ignored, "Ohm");
  EXPECT_EQ(parse_spice_number("1MEG").suffix, "meg");
  EXPECT_EQ(parse_spice_number("1milli").suffix, "mil");
  EXPECT_EQ(parse_spice_number("1milli").ignored, "li");
  EXPECT_EQ(parse_spice_number("2.2\xC2\xB5" "F").suffix, "u");
  EXPECT_EQ(parse_spice_number("12V").suffix, "");
  EXPECT_EQ(parse_spice_number("12V").ignored, "V");
  EXPECT_EQ(parse_spice_number("10f").suffix, "f");
  EXPECT_EQ(parse_spice_number("1T").suffix, "t");
}

TEST(SpiceNumber, SuffixesAreCaseInsensitive) {
  for (const char* t : {"1meg", "1MEG", "1Meg", "1mEg"}) EXPECT_EQ(*parse_spice_number(t).value, 1e6) << t;
  for (const char* t : {"1k", "1K"}) EXPECT_EQ(*parse_spice_number(t).value, 1e3) << t;
  for (const char* t : {"1m", "1M"}) EXPECT_EQ(*parse_spice_number(t).value, 1e-3) << t;
  for (const char* t : {"1mil", "1MIL"}) EXPECT_EQ(*parse_spice_number(t).value, 25.4e-6) << t;
}

TEST(SpiceNumber, PlainLettersGiveNoWarning) {
  for (const char* t : {"12V", "10ohm", "1H", "100nF", "1kohm", "2.2megohm", "1Mega", "4.7k"}) {
    EXPECT_TRUE(parse_spice_number(t).warning.empty()) << t;
  }
}

TEST(SpiceNumber, AttoAndXAreNotSuffixes) {
  // ngspice-39 (numbers.cir R23, R24): 1a = 1, 1x = 1.
  const SpiceNumber a = parse_spice_number("1a");
  EXPECT_EQ(*a.value, 1.0);
  EXPECT_EQ(a.warning, "'1a' read as 1: 'a' is not a SPICE scale suffix and is ignored");
  const SpiceNumber x = parse_spice_number("1X");
  EXPECT_EQ(*x.value, 1.0);
  EXPECT_EQ(x.warning, "'1X' read as 1: 'X' is not a SPICE scale suffix and is ignored");
}

TEST(SpiceNumber, RkmNotationReadAsSpiceDoesWithWarning) {
  const SpiceNumber a = parse_spice_number("2k2");
  EXPECT_EQ(*a.value, 2000.0);
  EXPECT_EQ(a.warning,
            "'2k2' read as 2k = 2000 (SPICE ignores what follows the scale suffix); write 2.2k if that was meant");
  const SpiceNumber b = parse_spice_number("4u7");
  EXPECT_EQ(*b.value, 4e-6);
  EXPECT_EQ(b.warning,
            "'4u7' read as 4u = 4e-06 (SPICE ignores what follows the scale suffix); write 4.7u if that was meant");
  const SpiceNumber c = parse_spice_number("1k2x3");
  EXPECT_EQ(*c.value, 1000.0);
  EXPECT_EQ(c.warning, "'1k2x3' read as 1k = 1000 (SPICE ignores what follows the scale suffix)");
  const SpiceNumber d = parse_spice_number("2R5");
  EXPECT_EQ(*d.value, 2.0);
  EXPECT_EQ(d.warning, "'2R5' read as 2 = 2 (SPICE ignores what follows the scale suffix); write 2.5 if that was meant");
}

TEST(SpiceNumber, MalformedNumbersAreErrors) {
  // Deliberate difference: ngspice-39 reads `1..5` as 1 and `1.2.3` as 1.2 (numbers.cir R32, R35).
  for (const char* t : {"1..5", "1.2.3", "1e", "1e+", "1e-", "1E", "1ex", "1e3.5", "1k.5"}) {
    const SpiceNumber n = parse_spice_number(t);
    EXPECT_FALSE(n.value.has_value()) << t;
    EXPECT_FALSE(n.error.empty()) << t;
  }
  EXPECT_EQ(parse_spice_number("1..5").error, "malformed number '1..5': unexpected second '.'");
  EXPECT_EQ(parse_spice_number("1e+").error, "malformed number '1e+': exponent has no digits");
}

TEST(SpiceNumber, NonFiniteValuesAreRefused) {
  for (const char* t : {"1e999", "1e308k", "-1e400", "1e99999999999999999999"}) {
    const SpiceNumber n = parse_spice_number(t);
    EXPECT_FALSE(n.value.has_value()) << t;
    EXPECT_NE(n.error.find("too large"), std::string::npos) << t;
  }
  for (const char* t : {"nan", "inf", "NaN", "-inf", "infinity"}) {
    EXPECT_FALSE(parse_spice_number(t).value.has_value()) << t;
  }
  const SpiceNumber tiny = parse_spice_number("1e-999");
  ASSERT_TRUE(tiny.value.has_value());
  EXPECT_EQ(*tiny.value, 0.0);
  EXPECT_FALSE(tiny.warning.empty());
  EXPECT_EQ(*parse_spice_number("0e999").value, 0.0);
  EXPECT_EQ(*parse_spice_number("1.7e308").value, 1.7e308);
}

TEST(SpiceNumber, NotNumbers) {
  for (const char* t : {"O.47u", "k10", "abc", "", "+", "-", ".", "+.", "-x", "{1}", "'1'"}) {
    EXPECT_FALSE(looks_numeric(t)) << t;
    const SpiceNumber n = parse_spice_number(t);
    EXPECT_FALSE(n.value.has_value()) << t;
    EXPECT_EQ(n.length, 0u) << t;
  }
  for (const char* t : {"1", ".5", "+3", "-.5", "+.5", "1..5", "0"}) EXPECT_TRUE(looks_numeric(t)) << t;
}

TEST(SpiceNumber, LengthStopsAtOperators) {
  // Inside expressions the token is followed by operators; the letters run stops there.
  EXPECT_EQ(parse_spice_number("2k*3").length, 2u);
  EXPECT_EQ(parse_spice_number("470k)").length, 4u);
  EXPECT_EQ(parse_spice_number("1e3+2").length, 3u);
  EXPECT_EQ(parse_spice_number("10uF,").length, 4u);
  EXPECT_EQ(parse_spice_number("6k$x").length, 2u);
}

TEST(SpiceAttribute, NumberThenOnlyTheUnitOfTheAttribute) {
  // Ratings in annotations and on element lines (docs/attributes.md): SPICE numbers and suffixes,
  // then nothing but the attribute's unit, in any case as SPICE is case-insensitive.
  const auto value = [](std::string_view text, AttrUnit unit) {
    const AttributeReading r = parse_spice_attribute(text, unit);
    EXPECT_TRUE(r.value) << text << ": " << r.error;
    return r.value.value_or(-1);
  };
  EXPECT_EQ(value("250", AttrUnit::volt), 250.0);
  EXPECT_EQ(value("250V", AttrUnit::volt), 250.0);
  EXPECT_EQ(value("250v", AttrUnit::volt), 250.0);
  EXPECT_EQ(value("1.5mA", AttrUnit::ampere), 1.5e-3);
  EXPECT_EQ(value("2A", AttrUnit::ampere), 2.0);
  EXPECT_EQ(value("3.2mm", AttrUnit::metre), 3.2e-3);
  EXPECT_EQ(value("1kohm", AttrUnit::ohm), 1e3);
  EXPECT_EQ(value("10\xCE\xA9", AttrUnit::ohm), 10.0);
  EXPECT_EQ(value("0.5A2s", AttrUnit::a2s), 0.5);
  EXPECT_EQ(value("90deg", AttrUnit::degree), 90.0);
  // Bills of materials: exact fractions, with or without the unit.
  EXPECT_EQ(value("1/4W", AttrUnit::watt), 0.25);
  EXPECT_EQ(value("1/8W", AttrUnit::watt), 0.125);
  EXPECT_EQ(value("1/2w", AttrUnit::watt), 0.5);
  EXPECT_EQ(value("1/4", AttrUnit::watt), 0.25);
}

TEST(SpiceAttribute, TrailingTextIsAnErrorNotIgnored) {
  const auto error = [](std::string_view text, AttrUnit unit) {
    const AttributeReading r = parse_spice_attribute(text, unit);
    EXPECT_FALSE(r.value) << text;
    return r.error + " @" + std::to_string(r.error_offset);
  };
  EXPECT_EQ(error("1/4X", AttrUnit::watt),
            "unexpected 'X' after the number 1/4; only the unit W may follow it @3");
  EXPECT_EQ(error("1/4mW", AttrUnit::watt),
            "unexpected 'mW' after the number 1/4; only the unit W may follow it @3");
  EXPECT_EQ(error("0.25Wx", AttrUnit::watt),
            "unexpected 'Wx' after the number 0.25; only the unit W may follow it @4");
  EXPECT_EQ(error("250A", AttrUnit::volt),
            "unexpected 'A' after the number 250; only the unit V may follow it @3");
  EXPECT_EQ(error("2k2", AttrUnit::volt),
            "unexpected '2' after the number 2k; only the unit V may follow it @2");
  EXPECT_EQ(error("1.5/2", AttrUnit::watt),
            "unexpected '/2' after the number 1.5; only the unit W may follow it @3");
  EXPECT_EQ(error("1/0W", AttrUnit::watt), "fraction '1/0' divides by zero @0");
  EXPECT_EQ(error("nan", AttrUnit::volt), "'nan' is not a number @0");
  EXPECT_EQ(error("1e999", AttrUnit::volt), "number '1e999' is too large for a double @0");
}

}  // namespace
}  // namespace mainscheck::parser
