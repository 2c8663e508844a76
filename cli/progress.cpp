#include "cli/progress.hpp"

#include <fmt/format.h>

#include <algorithm>

namespace mainscheck::cli {

bool show_progress(bool stderr_is_terminal, bool quiet, std::size_t total, std::chrono::milliseconds elapsed) {
  return stderr_is_terminal && !quiet && total > 1 && elapsed > kProgressDelay;
}

std::string progress_text(std::size_t done, std::size_t total) {
  return fmt::format("checked {}/{} netlists", done, total);
}

void ProgressLine::update(std::size_t done, std::chrono::milliseconds elapsed) {
  if (!show_progress(enabled_, false, total_, elapsed) || done == shown_done_) return;
  const std::string text = progress_text(done, total_);
  // Pad over a longer previous line so no digits are left behind.
  out_ << '\r' << text << std::string(width_ > text.size() ? width_ - text.size() : 0, ' ') << std::flush;
  width_ = std::max(width_, text.size());
  shown_done_ = done;
}

void ProgressLine::finish() {
  if (width_ == 0) return;
  out_ << '\r' << std::string(width_, ' ') << '\r' << std::flush;
  width_ = 0;
}

}  // namespace mainscheck::cli
