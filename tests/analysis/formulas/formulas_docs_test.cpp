// Keeps docs/formulas.md and the ngspice decks in step with the code: every formula header is
// described there, and every deck in tests/data/formulas is both documented and used by a test.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

namespace mainscheck::analysis::formulas {
namespace {

namespace fs = std::filesystem;

std::string slurp(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

const fs::path kRoot{MAINSCHECK_SOURCE_DIR};

TEST(FormulasDocs, EveryHeaderIsDocumented) {
  const std::string doc = slurp(kRoot / "docs/formulas.md");
  ASSERT_FALSE(doc.empty());
  int headers = 0;
  for (const auto& entry : fs::directory_iterator(kRoot / "analysis/formulas")) {
    if (entry.path().extension() != ".hpp") continue;
    ++headers;
    const std::string name = entry.path().filename().string();
    EXPECT_NE(doc.find("`" + name + "`"), std::string::npos)
        << name << " is not described in docs/formulas.md";
  }
  EXPECT_GE(headers, 6);
}

TEST(FormulasDocs, EveryDeckIsDocumentedAndUsed) {
  const std::string doc = slurp(kRoot / "docs/formulas.md");
  std::string tests;
  for (const auto& entry : fs::directory_iterator(kRoot / "tests/analysis/formulas")) {
    if (entry.path().extension() == ".cpp") tests += slurp(entry.path());
  }
  int decks = 0;
  for (const auto& entry : fs::directory_iterator(kRoot / "tests/data/formulas")) {
    if (entry.path().extension() != ".cir") continue;
    ++decks;
    const std::string name = entry.path().filename().string();
    EXPECT_NE(doc.find(name), std::string::npos) << name << " is not named in docs/formulas.md";
    EXPECT_NE(tests.find("deck tests/data/formulas/" + name), std::string::npos)
        << name << " has no test citing it as a reference";
  }
  EXPECT_GE(decks, 9);
}

}  // namespace
}  // namespace mainscheck::analysis::formulas
