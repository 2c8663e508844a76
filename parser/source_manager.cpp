#include "parser/source_manager.hpp"

#include <algorithm>
#include <stdexcept>

namespace mainscheck::parser {

FileId SourceManager::add_file(std::string name, std::string contents, SourceLoc included_from) {
  File f{std::move(name), std::move(contents), included_from, {}};
  f.line_starts.push_back(0);
  for (std::uint32_t i = 0; i < f.contents.size(); ++i) {
    // A lone CR (old Mac) and CRLF both end a line; CRLF counts once.
    const char c = f.contents[i];
    if (c == '\n' || (c == '\r' && (i + 1 >= f.contents.size() || f.contents[i + 1] != '\n'))) {
      if (i + 1 < f.contents.size()) f.line_starts.push_back(i + 1);
    }
  }
  files_.push_back(std::move(f));
  return static_cast<FileId>(files_.size());
}

const SourceManager::File& SourceManager::file(FileId id) const {
  if (id == 0 || id > files_.size()) throw std::out_of_range("invalid FileId");
  return files_[id - 1];
}

LineCol SourceManager::line_col(SourceLoc loc) const {
  if (!loc.valid()) return {};
  const File& f = file(loc.file);
  auto it = std::upper_bound(f.line_starts.begin(), f.line_starts.end(), loc.offset);
  const auto line = static_cast<std::uint32_t>(it - f.line_starts.begin());
  return {line, loc.offset - f.line_starts[line - 1] + 1};
}

std::string_view SourceManager::line_text(SourceLoc loc) const {
  if (!loc.valid()) return {};
  const File& f = file(loc.file);
  const LineCol lc = line_col(loc);
  // The next line's start bounds this one, so quoting many diagnostics on one long line (200 000
  // attributes of one XML element) does not rescan it each time.
  const std::size_t begin = f.line_starts[lc.line - 1];
  std::size_t end = lc.line < f.line_starts.size() ? f.line_starts[lc.line] : f.contents.size();
  if (end > begin && f.contents[end - 1] == '\n') --end;
  if (end > begin && f.contents[end - 1] == '\r') --end;
  return std::string_view(f.contents).substr(begin, end - begin);
}

SourceLoc SourceManager::line_start(FileId id, std::uint32_t line) const {
  const File& f = file(id);
  if (line == 0 || line > f.line_starts.size()) return {id, static_cast<std::uint32_t>(f.contents.size())};
  return {id, f.line_starts[line - 1]};
}

}  // namespace mainscheck::parser
