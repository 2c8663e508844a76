// Escaping for the HTML and SVG writers (report/markup.*).
#include "report/markup.hpp"

#include <gtest/gtest.h>

namespace mainscheck::report {
namespace {

TEST(EscapeMarkup, EscapesTheFiveSpecialCharacters) {
  EXPECT_EQ(escape_markup("<script>alert('x')</script>"), "&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt;");
  EXPECT_EQ(escape_markup("a & \"b\""), "a &amp; &quot;b&quot;");
  EXPECT_EQ(escape_markup("&amp;"), "&amp;amp;");
  EXPECT_EQ(escape_markup("µF 339 V − Ω"), "µF 339 V − Ω");  // UTF-8 passes through
}

TEST(EscapeMarkup, ReplacesControlCharacters) {
  EXPECT_EQ(escape_markup(std::string("a\x01" "b\tc\nd", 7)), "a&#xFFFD;b\tc\nd");
  EXPECT_EQ(escape_markup(std::string("x\0y", 3)), "x&#xFFFD;y");
}

TEST(MarkupId, KeepsSafeCharactersOnly) {
  EXPECT_EQ(markup_id("B12"), "B12");
  EXPECT_EQ(markup_id("r1-B2"), "r1-B2");
  EXPECT_EQ(markup_id("a\"b <c>"), "a_22b_20_3Cc_3E");
}

}  // namespace
}  // namespace mainscheck::report
