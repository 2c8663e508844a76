#pragma once
// First pass of the SPICE reader: physical lines become logical lines (comments stripped,
// `+` continuations joined, `.control` blocks skipped), each keeping a map back to the file.
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "parser/diagnostics.hpp"
#include "parser/limits.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::parser {

/// A run of logical-line bytes copied from one place in the physical file.
struct LineSegment {
  std::size_t logical_begin = 0;
  std::uint32_t file_offset = 0;
  std::size_t length = 0;
};

/// One statement after continuation joining, or one `*@` annotation comment.
struct LogicalLine {
  FileId file = 0;
  std::string text;
  std::vector<LineSegment> segments;
  bool annotation = false;  // text is what follows `*@`
  /// Location in the physical file of byte `offset` of `text` (end of line maps to its last byte).
  SourceLoc loc(std::size_t offset) const;
};

/// Whether the first physical line is the deck's title (top file) or an ordinary line (includes).
enum class LineMode { top_file, included_file };

/// Result of the pre-pass over one file.
struct FileLines {
  std::vector<LogicalLine> lines;
  std::string title;
  SourceLoc title_loc;
  bool saw_end = false;
};

/// Splits file `id` into logical lines; reports `+` without a statement, over-long lines,
/// unterminated `.control` and text after `.end`.
FileLines split_logical_lines(const SourceManager& sm, FileId id, LineMode mode, const ReadLimits& limits,
                              DiagnosticSink& diags);

}  // namespace mainscheck::parser
