#pragma once
// The batch progress line on stderr: "checked 3/12 netlists", rewritten in place with \r while a
// batch runs, only on a terminal, only after the batch has taken longer than a moment, never with
// --quiet, and cleared again at the end.
#include <chrono>
#include <cstddef>
#include <ostream>
#include <string>

namespace mainscheck::cli {

/// How long a batch runs before the progress line appears (common practice: about half a second,
/// so quick runs stay silent).
inline constexpr std::chrono::milliseconds kProgressDelay{500};

/// True when the progress line should be shown at this moment of a batch of `total` netlists.
bool show_progress(bool stderr_is_terminal, bool quiet, std::size_t total, std::chrono::milliseconds elapsed);

/// The line's text without control characters: "checked 3/12 netlists".
std::string progress_text(std::size_t done, std::size_t total);

/// Writes the progress line to a stream; the caller says how far the batch is and how long it has run.
class ProgressLine {
 public:
  /// `enabled`: the stream is a terminal and --quiet is not set.
  ProgressLine(std::ostream& out, bool enabled, std::size_t total) : out_(out), enabled_(enabled), total_(total) {}
  ProgressLine(const ProgressLine&) = delete;
  ProgressLine& operator=(const ProgressLine&) = delete;
  ~ProgressLine() { finish(); }

  /// Rewrites the line when it is due and `done` changed since the last call.
  void update(std::size_t done, std::chrono::milliseconds elapsed);
  /// Clears the line if one was written (idempotent).
  void finish();

 private:
  std::ostream& out_;
  bool enabled_;
  std::size_t total_;
  std::size_t shown_done_ = static_cast<std::size_t>(-1);
  std::size_t width_ = 0;  // characters of the line on screen
};

}  // namespace mainscheck::cli
