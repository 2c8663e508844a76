#include "parser/parts_library.hpp"

#include <gtest/gtest.h>

#include "parser/file_reader.hpp"

namespace mainscheck::parser {
namespace {

struct LibraryRead {
  SourceManager sm;
  DiagnosticSink diags;
  PartsLibrary lib;
  explicit LibraryRead(std::string text) { read_parts_library_text("parts.xml", std::move(text), sm, diags, lib); }
  std::string rendered() const {
    std::string out;
    for (const auto& d : diags.diagnostics()) out += render_diagnostic(d, sm);
    return out;
  }
};

TEST(PartsLibrary, ReadsPartsWithXmlValues) {
  LibraryRead r(R"(<?xml version="1.0"?>
<mainscheck-parts version="1">
  <part name="HL-FUSE-T1A" type="fuse" i_rated="1A" v_rated_ac="250V" i2t_melt="1.6A2s"/>
  <part name="HL-MOV-275" type="varistor" v_rated_ac="275" e_pulse="40J" i_surge="2.5kA"/>
  <part name="HL-X2" class="X2" pad_gap="3.2mm" tol="+80/-20"/>
</mainscheck-parts>
)");
  ASSERT_FALSE(r.diags.has_errors()) << r.rendered();
  EXPECT_EQ(r.diags.warning_count(), 0u) << r.rendered();
  ASSERT_EQ(r.lib.parts().size(), 3u);
  const LibraryPart* f = r.lib.find("hl-fuse-t1a");  // case-insensitive
  ASSERT_NE(f, nullptr);
  EXPECT_EQ(f->type, "fuse");
  EXPECT_EQ(f->attrs.at("i_rated").value, 1.0);
  EXPECT_EQ(f->attrs.at("i2t_melt").value, 1.6);
  EXPECT_EQ(r.sm.line_col(f->loc).line, 3u);
  const LibraryPart* m = r.lib.find("HL-MOV-275");
  ASSERT_NE(m, nullptr);
  EXPECT_EQ(m->attrs.at("i_surge").value, 2500.0);
  const LibraryPart* x = r.lib.find("HL-X2");
  EXPECT_NEAR(*x->attrs.at("pad_gap").value, 3.2e-3, 1e-15);
  EXPECT_EQ(x->attrs.at("class").text, "X2");
  EXPECT_FALSE(x->attrs.at("tol").value);  // tolerances stay text for analysis/ to read
}

TEST(PartsLibrary, ProblemsAreLocated) {
  LibraryRead r(R"(<mainscheck-parts>
  <part name="A" colour="red"/>
  <part name="B" v_rated="12A"/>
  <part name="a"/>
  <part type="fuse"/>
</mainscheck-parts>
)");
  std::vector<std::string> msgs;
  for (const auto& d : r.diags.diagnostics()) {
    EXPECT_TRUE(d.loc.valid()) << d.message;
    msgs.push_back(std::string(severity_name(d.severity)) + ": " + d.message);
  }
  ASSERT_EQ(msgs.size(), 4u) << r.rendered();
  EXPECT_EQ(msgs[0], "warning: unknown attribute 'colour' on library part A");
  EXPECT_EQ(msgs[1].rfind("error: invalid value '12A' for v_rated of library part B: ", 0), 0u) << msgs[1];
  EXPECT_EQ(msgs[2], "warning: library part a defined again; the first entry is used");
  EXPECT_EQ(msgs[3].rfind("error: ", 0), 0u) << msgs[3];
  EXPECT_EQ(r.lib.parts().size(), 2u);
}

TEST(PartsLibrary, WrongRootAndMissingFile) {
  LibraryRead r("<parts/>");
  ASSERT_EQ(r.diags.error_count(), 1u);
  EXPECT_EQ(r.diags.diagnostics()[0].message, "parts library root element is <parts>, expected <mainscheck-parts>");
  MemoryFileReader files;
  SourceManager sm;
  DiagnosticSink diags;
  PartsLibrary lib;
  read_parts_library_file("missing.xml", files, sm, diags, lib);
  ASSERT_EQ(diags.error_count(), 1u);
  EXPECT_EQ(diags.diagnostics()[0].message.rfind("cannot read parts library 'missing.xml': ", 0), 0u);
}

TEST(PartsLibrary, ExampleLibraryReads) {
  DiskFileReader files;
  SourceManager sm;
  DiagnosticSink diags;
  PartsLibrary lib;
  read_parts_library_file(MAINSCHECK_SOURCE_DIR "/examples/harrow-lane-parts.xml", files, sm, diags, lib);
  EXPECT_FALSE(diags.has_errors());
  EXPECT_EQ(diags.warning_count(), 0u);
  EXPECT_NE(lib.find("D1N4007"), nullptr);
}

}  // namespace
}  // namespace mainscheck::parser
