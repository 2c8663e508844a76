// Deterministic mutations of the example netlists (bytes deleted, duplicated, replaced by markup
// characters): whatever the damage, the reader must return, and every diagnostic it gives must
// carry a location inside the file, so a user can always be pointed at the problem.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>

#include "tests/parser/xml_test_util.hpp"

namespace mainscheck::parser {
namespace {

std::string read_file(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

TEST(XmlMutation, EveryDiagnosticIsLocated) {
  const std::filesystem::path dir = std::filesystem::path(MAINSCHECK_SOURCE_DIR) / "examples";
  const std::string original = read_file(dir / "lamp_dimmer.xml");
  ASSERT_FALSE(original.empty());
  std::mt19937 rng(20261201);  // fixed seed: the same mutants every run
  const std::string alphabet = "<>/=\"'&;![]?- \nabc0.%\xC2\xB5\xFF";
  std::size_t with_errors = 0;
  for (int round = 0; round < 400; ++round) {
    std::string text = original;
    const int edits = 1 + static_cast<int>(rng() % 4);
    for (int e = 0; e < edits && !text.empty(); ++e) {
      const std::size_t at = rng() % text.size();
      switch (rng() % 3) {
        case 0: text.erase(at, 1 + rng() % 8); break;
        case 1: text.insert(at, text.substr(at, 1 + rng() % 16)); break;
        default: text[at] = alphabet[rng() % alphabet.size()]; break;
      }
    }
    xml_test::XmlRead r;
    read_xml(r, text);
    for (const auto& d : r.diags.diagnostics()) {
      ASSERT_TRUE(d.loc.valid()) << "round " << round << ": " << d.message;
      ASSERT_LE(d.loc.offset, text.size()) << "round " << round << ": " << d.message;
      EXPECT_FALSE(r.rendered().empty());
    }
    with_errors += r.diags.has_errors() ? 1 : 0;
  }
  // Most random damage is detected; the rest hit comments or free text and are harmless.
  EXPECT_GT(with_errors, 300u);
}

}  // namespace
}  // namespace mainscheck::parser
