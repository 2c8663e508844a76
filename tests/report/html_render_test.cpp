// The HTML report rendered by a real browser: headless Chromium (Debian package `chromium`) loads
// the page from a file, and the DOM it builds must hold the plots as SVG elements (not text), the
// diagram and the caution; a screenshot must come out. Skipped when Chromium is not installed,
// unless MAINSCHECK_REQUIRE_TOOLS=1 (./setup.sh test), which turns the skip into a failure.
#include <gtest/gtest.h>

#include <cstdlib>
#include <optional>
#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

std::size_t count(const std::string& hay, const std::string& needle) {
  std::size_t n = 0;
  for (std::size_t p = hay.find(needle); p != std::string::npos; p = hay.find(needle, p + needle.size())) ++n;
  return n;
}

/// Chromium from MAINSCHECK_CHROMIUM or the PATH (Debian names it `chromium`).
std::optional<std::string> find_chromium() {
  if (const char* env = std::getenv("MAINSCHECK_CHROMIUM"); env != nullptr && *env != '\0') return std::string(env);
  const char* path = std::getenv("PATH");
  std::string_view rest(path == nullptr ? "" : path);
  while (!rest.empty()) {
    const std::size_t colon = rest.find(':');
    const std::string dir(rest.substr(0, colon));
    rest = colon == std::string_view::npos ? std::string_view{} : rest.substr(colon + 1);
    for (const char* name : {"chromium", "chromium-browser"}) {
      const std::filesystem::path p = std::filesystem::path(dir.empty() ? "." : dir) / name;
      if (::access(p.c_str(), X_OK) == 0) return p.string();
    }
  }
  return std::nullopt;
}

bool tools_required() {
  const char* v = std::getenv("MAINSCHECK_REQUIRE_TOOLS");
  return v != nullptr && std::string(v) == "1";
}

/// Runs headless Chromium with a throwaway profile under `dir` and a wall-clock bound.
ProcessResult run_chromium(const std::string& chromium, const std::filesystem::path& dir,
                           std::vector<std::string> args) {
  std::vector<std::string> argv{chromium,
                                "--headless",
                                "--no-sandbox",
                                "--disable-gpu",
                                "--disable-dev-shm-usage",
                                "--no-first-run",
                                "--disable-extensions",
                                "--user-data-dir=" + (dir / "profile").string()};
  argv.insert(argv.end(), args.begin(), args.end());
  ProcessOptions opt;
  opt.timeout = std::chrono::seconds(90);
  // Keep Chromium's caches and crash reports inside the test's directory.
  opt.env = {{"HOME", dir.string()}, {"XDG_CONFIG_HOME", (dir / "config").string()},
             {"XDG_CACHE_HOME", (dir / "cache").string()}};
  return run_process(argv, opt);
}

class HtmlRender : public ::testing::Test {
 protected:
  void SetUp() override {
    chromium_ = find_chromium();
    if (!chromium_) {
      if (tools_required()) FAIL() << "chromium not found and MAINSCHECK_REQUIRE_TOOLS=1 (Debian package chromium)";
      GTEST_SKIP() << "chromium not found on PATH (Debian package chromium); set MAINSCHECK_CHROMIUM to its path";
    }
    ASSERT_FALSE(dir_.path().empty());
    page_ = dir_.path() / "report.html";
    const ProcessResult r = run_mainscheck(
        {"-q", "check", "examples/bench-supply-bridge.cir", "--format", "html", "--output", "html=" + page_.string()});
    ASSERT_TRUE(r.exited()) << r.err;
    ASSERT_TRUE(std::filesystem::exists(page_));
  }

  std::optional<std::string> chromium_;
  TempDir dir_{"html-render"};
  std::filesystem::path page_;
};

TEST_F(HtmlRender, DomHoldsThePlotsAsSvgElements) {
  const ProcessResult r = run_chromium(*chromium_, dir_.path(), {"--dump-dom", "file://" + page_.string()});
  ASSERT_TRUE(r.exited()) << "chromium did not finish: " << r.error << r.err;
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const std::string& dom = r.out;
  ASSERT_NE(dom.find("<body>"), std::string::npos) << dom.substr(0, 500);
  // The serialised DOM carries the SVG elements the parser built: three plots (bridge diode
  // currents, reservoir voltage, inrush) with six traces, and the block diagram.
  EXPECT_EQ(count(dom, "<svg class=\"plot\""), 3u);
  EXPECT_EQ(count(dom, "<polyline class=\"trace\""), 6u);
  EXPECT_EQ(count(dom, "<svg class=\"diagram\""), 1u);
  EXPECT_NE(dom.find("<p class=\"caution\" role=\"note\">Caution: mains voltages are lethal."), std::string::npos);
  // Text that the page escaped stays text: no element appeared that the writer did not emit.
  EXPECT_EQ(dom.find("<script"), std::string::npos);
}

TEST_F(HtmlRender, ScreenshotIsAPng) {
  const auto shot = dir_.path() / "shot.png";
  const ProcessResult r = run_chromium(*chromium_, dir_.path(),
                                       {"--hide-scrollbars", "--window-size=1200,1600",
                                        "--screenshot=" + shot.string(), "file://" + page_.string()});
  ASSERT_TRUE(r.exited()) << "chromium did not finish: " << r.error << r.err;
  ASSERT_TRUE(std::filesystem::exists(shot)) << r.err;
  const std::string png = slurp(shot);
  ASSERT_GT(png.size(), 60000u);  // a blank 1200×2000 page is about 11 kB
  EXPECT_EQ(png.substr(0, 8), std::string("\x89PNG\r\n\x1a\n", 8));
}

}  // namespace
}  // namespace mainscheck::test_support
