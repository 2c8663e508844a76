#pragma once
// Owns every input buffer and turns cheap locations (file id + byte offset) into
// file:line:col late, the way LLVM's SourceMgr does.
#include <cstdint>
#include <deque>
#include <string>
#include <string_view>
#include <vector>

namespace mainscheck::parser {

/// Identifies one buffer held by a SourceManager; 0 means "no file".
using FileId = std::uint32_t;

/// A position in an input buffer: file id and byte offset.
struct SourceLoc {
  FileId file = 0;
  std::uint32_t offset = 0;
  bool valid() const { return file != 0; }
  friend bool operator==(const SourceLoc&, const SourceLoc&) = default;
};

/// A 1-based line and 1-based byte column.
struct LineCol {
  std::uint32_t line = 0;
  std::uint32_t column = 0;
};

/// Holds the netlist files read so far, their names and include chain, and a line-start table each.
class SourceManager {
 public:
  /// Adds a buffer; `included_from` is the location of the directive that pulled it in (invalid for top files).
  FileId add_file(std::string name, std::string contents, SourceLoc included_from = {});

  const std::string& name(FileId id) const { return file(id).name; }
  std::string_view contents(FileId id) const { return file(id).contents; }
  SourceLoc included_from(FileId id) const { return file(id).included_from; }
  std::size_t file_count() const { return files_.size(); }

  /// Location of byte `offset` in file `id`.
  SourceLoc loc(FileId id, std::size_t offset) const { return {id, static_cast<std::uint32_t>(offset)}; }
  /// Line and column of a location (1-based).
  LineCol line_col(SourceLoc loc) const;
  /// The physical line holding `loc`, without its line ending.
  std::string_view line_text(SourceLoc loc) const;
  /// Location of the start of 1-based line `line` in file `id`.
  SourceLoc line_start(FileId id, std::uint32_t line) const;
  /// Number of physical lines in the file.
  std::uint32_t line_count(FileId id) const { return static_cast<std::uint32_t>(file(id).line_starts.size()); }

 private:
  struct File {
    std::string name;
    std::string contents;
    SourceLoc included_from;
    std::vector<std::uint32_t> line_starts;
  };
  const File& file(FileId id) const;
  std::deque<File> files_;  // deque: references stay valid as files are added
};

}  // namespace mainscheck::parser
