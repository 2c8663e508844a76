// The generated boards (tools/board_generator) read without errors in both syntaxes, hold exactly
// the requested parts, the same parts in SPICE and XML, and show the buried front-end blocks.
#include "tools/board_generator/board_generator.hpp"

#include <algorithm>
#include <stdexcept>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "analysis/recognition.hpp"
#include "parser/readers.hpp"

namespace mainscheck::tools {
namespace {

struct ReadBoard {
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  parser::Netlist nl;
  std::string rendered() const {
    std::string out;
    for (const auto& d : diags.diagnostics()) out += parser::render_diagnostic(d, sm);
    return out.substr(0, 3000);
  }
};

void read_board(ReadBoard& b, const BoardSpec& spec, BoardFormat format) {
  const std::string text = board_text(spec, format);
  parser::MemoryFileReader files;
  b.nl = format == BoardFormat::xml ? parser::read_xml_text("board.xml", text, b.sm, b.diags)
                                    : parser::read_spice_text("board.cir", text, files, b.sm, b.diags);
}

std::vector<std::string> lower_refs(const parser::Netlist& nl) {
  std::vector<std::string> out;
  for (const auto& p : nl.parts) out.push_back(parser::to_lower(p.ref));
  std::sort(out.begin(), out.end());
  return out;
}

// "kind: ref ref ..." per block, refs of the device view in block order.
std::vector<std::string> block_summary(const analysis::RecognitionResult& r) {
  std::vector<std::string> out;
  for (const auto& b : r.blocks) {
    std::string s = b.kind + ":";
    for (std::size_t p : b.parts()) s += " " + r.devices.parts[p].ref;
    out.push_back(s);
  }
  return out;
}

bool has_block(const std::vector<std::string>& summary, const std::string& kind, const std::vector<std::string>& refs) {
  return std::any_of(summary.begin(), summary.end(), [&](const std::string& s) {
    if (s.rfind(kind + ":", 0) != 0) return false;
    return std::all_of(refs.begin(), refs.end(), [&](const std::string& r) { return (s + " ").find(" " + r + " ") != std::string::npos; });
  });
}

TEST(BoardGenerator, SameSeedSameBoardOtherSeedOtherValues) {
  const BoardSpec a{1000, 7}, b{1000, 8};
  EXPECT_EQ(board_text(a, BoardFormat::spice), board_text(a, BoardFormat::spice));
  EXPECT_EQ(board_text(a, BoardFormat::xml), board_text(a, BoardFormat::xml));
  EXPECT_NE(board_text(a, BoardFormat::spice), board_text(b, BoardFormat::spice));
}

TEST(BoardGenerator, PartCountIsExactForEachSize) {
  for (std::size_t n : {kMinBoardParts, std::size_t{1000}, std::size_t{1234}, std::size_t{10000}}) {
    BoardSummary s;
    board_text(BoardSpec{n, 1}, BoardFormat::spice, &s);
    EXPECT_EQ(s.parts, n);
  }
  EXPECT_THROW(board_text(BoardSpec{kMinBoardParts - 1, 1}, BoardFormat::spice), std::invalid_argument);
}

TEST(BoardGenerator, ThousandPartBoardReadsAlikeInSpiceAndXml) {
  const BoardSpec spec{1000, 1};
  BoardSummary summary;
  board_text(spec, BoardFormat::spice, &summary);
  ReadBoard spice, xml;
  read_board(spice, spec, BoardFormat::spice);
  read_board(xml, spec, BoardFormat::xml);
  ASSERT_FALSE(spice.diags.has_errors()) << spice.rendered();
  ASSERT_FALSE(xml.diags.has_errors()) << xml.rendered();
  EXPECT_EQ(spice.nl.parts.size(), 1000u);
  EXPECT_EQ(xml.nl.parts.size(), 1000u);
  EXPECT_EQ(lower_refs(spice.nl), lower_refs(xml.nl));
  // The XML reader lists every flattened instance (the SPICE reader keeps no instance list).
  EXPECT_EQ(xml.nl.instances.size(), summary.instances);
  EXPECT_EQ(spice.nl.nets().size(), xml.nl.nets().size());
  // Three levels of hierarchy: analogue module, its quad gate, the gate.
  EXPECT_NE(spice.nl.find_part("XU1001.XC1.XG4.MP"), nullptr);
  EXPECT_NE(xml.nl.find_part("XU1001.XC1.XG4.MP"), nullptr);
}

TEST(BoardGenerator, BuriedFrontEndIsRecognisedInBothSyntaxes) {
  const BoardSpec spec{1000, 1};
  ReadBoard spice, xml;
  read_board(spice, spec, BoardFormat::spice);
  read_board(xml, spec, BoardFormat::xml);
  ASSERT_FALSE(spice.diags.has_errors()) << spice.rendered();
  ASSERT_FALSE(xml.diags.has_errors()) << xml.rendered();
  const auto rs = analysis::recognise(spice.nl, {}, nullptr, spice.diags);
  const auto rx = analysis::recognise(xml.nl, {}, nullptr, xml.diags);
  ASSERT_FALSE(spice.diags.has_errors()) << spice.rendered();
  ASSERT_FALSE(xml.diags.has_errors()) << xml.rendered();
  const auto ss = block_summary(rs);
  const auto sx = block_summary(rx);
  EXPECT_EQ(ss, sx);
  EXPECT_TRUE(has_block(ss, "bridge-rectifier", {"D1", "D2", "D3", "D4", "C1"})) << ::testing::PrintToString(ss);
  EXPECT_TRUE(has_block(ss, "capacitive-dropper", {"CD1"})) << ::testing::PrintToString(ss);
  EXPECT_TRUE(has_block(ss, "protection", {"RF1"})) << ::testing::PrintToString(ss);
  // The ESD diode pairs across the card rails are not rectifiers: nothing on the logic cards is a block.
  for (const auto& s : ss) EXPECT_EQ(s.find("CARD"), std::string::npos) << s;
  EXPECT_EQ(rs.devices.parts.size(), rx.devices.parts.size());
}

}  // namespace
}  // namespace mainscheck::tools
