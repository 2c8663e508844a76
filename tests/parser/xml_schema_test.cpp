// Every example and every valid test netlist must pass both the XSD (docs/schema/) and the reader,
// so the schema, the docs' examples and the reader cannot drift apart. xmllint comes from Debian's
// libxml2-utils.
#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "tests/parser/xml_test_util.hpp"

namespace mainscheck::parser {
namespace {

namespace fs = std::filesystem;

const fs::path kRoot = MAINSCHECK_SOURCE_DIR;

std::vector<fs::path> valid_files() {
  std::vector<fs::path> out;
  for (const fs::path& dir : {kRoot / "examples", kRoot / "tests/data/xml/valid"}) {
    if (!fs::is_directory(dir)) continue;
    for (const auto& e : fs::directory_iterator(dir)) {
      // examples/ also holds parts libraries (mainscheck-parts.xsd); only netlists belong here.
      if (e.path().extension() != ".xml") continue;
      std::ifstream in(e.path(), std::ios::binary);
      std::stringstream ss;
      ss << in.rdbuf();
      if (ss.str().find("<netlist") != std::string::npos) out.push_back(e.path());
    }
  }
  std::sort(out.begin(), out.end());
  return out;
}

bool have_xmllint() { return std::system("xmllint --version >/dev/null 2>&1") == 0; }

// Runs xmllint on one file; returns its exit status and combined output.
std::pair<int, std::string> xmllint(const fs::path& file) {
  const std::string cmd = "xmllint --noout --schema '" + (kRoot / "docs/schema/mainscheck-netlist.xsd").string() +
                          "' '" + file.string() + "' 2>&1";
  std::string out;
  FILE* p = popen(cmd.c_str(), "r");
  if (p == nullptr) return {-1, "popen failed"};
  std::array<char, 512> buf{};
  while (std::fgets(buf.data(), buf.size(), p) != nullptr) out += buf.data();
  return {pclose(p), out};
}

TEST(XmlSchema, ExamplesExist) {
  // The examples directory holds at least the three workshop netlists described in docs/xml-format.md.
  std::size_t examples = 0;
  for (const auto& f : valid_files()) examples += f.parent_path().filename() == "examples" ? 1 : 0;
  EXPECT_GE(examples, 3u);
}

TEST(XmlSchema, ValidFilesPassTheXsd) {
  if (!have_xmllint()) GTEST_SKIP() << "xmllint not found (Debian package libxml2-utils); schema not checked";
  for (const auto& f : valid_files()) {
    const auto [status, out] = xmllint(f);
    EXPECT_EQ(status, 0) << f << "\n" << out;
  }
}

TEST(XmlSchema, ValidFilesReadWithoutDiagnostics) {
  for (const auto& f : valid_files()) {
    std::ifstream in(f, std::ios::binary);
    std::stringstream ss;
    ss << in.rdbuf();
    xml_test::XmlRead r;
    r.nl = read_xml_text(f.filename().string(), ss.str(), r.sm, r.diags);
    EXPECT_EQ(r.rendered(), "") << f;
    EXPECT_FALSE(r.nl.parts.empty()) << f;
  }
}

TEST(XmlSchema, XsdRejectsWhatTheReaderRejects) {
  if (!have_xmllint()) GTEST_SKIP() << "xmllint not found (Debian package libxml2-utils); schema not checked";
  const fs::path dir = kRoot / "tests/data/xml/invalid";
  std::size_t n = 0;
  for (const auto& e : fs::directory_iterator(dir)) {
    if (e.path().extension() != ".xml") continue;
    ++n;
    EXPECT_NE(xmllint(e.path()).first, 0) << e.path() << " passes the XSD";
    std::ifstream in(e.path(), std::ios::binary);
    std::stringstream ss;
    ss << in.rdbuf();
    xml_test::XmlRead r;
    r.nl = read_xml_text(e.path().filename().string(), ss.str(), r.sm, r.diags);
    EXPECT_TRUE(r.diags.has_errors()) << e.path() << " is read without error";
  }
  EXPECT_GE(n, 4u);
}

}  // namespace
}  // namespace mainscheck::parser
