#pragma once
// Readers get files through this interface so tests can serve in-memory files and the
// CLI can confine `.include` to allowed directory trees.
#include <map>
#include <string>
#include <string_view>

namespace mainscheck::parser {

/// Result of reading one file: contents, or an error text ("no such file or directory").
struct FileReadResult {
  bool ok = false;
  std::string contents;
  std::string error;
};

/// Reads descriptor `fd` to its end, giving up with an error ("`what` is larger than ...") as soon as
/// more than `max_bytes` arrive; `expected_bytes` (a regular file's size) only sizes the buffer.
FileReadResult read_bounded(int fd, std::size_t max_bytes, std::string_view what,
                            std::size_t expected_bytes = 0);

/// Source of file contents and path arithmetic for includes.
class FileReader {
 public:
  virtual ~FileReader() = default;
  /// Reads a whole file; refuses files larger than `max_bytes`.
  virtual FileReadResult read(const std::string& path, std::size_t max_bytes) = 0;
  /// A canonical spelling of `path` used to detect include cycles (same file, same key).
  virtual std::string canonical(const std::string& path) = 0;
};

/// Joins `relative` onto the directory of `including_file` (absolute `relative` is kept).
std::string resolve_relative(const std::string& including_file, const std::string& relative);

/// Reads from the real file system; only regular files (a FIFO, device, socket or directory is refused
/// without blocking or reading it).
class DiskFileReader : public FileReader {
 public:
  FileReadResult read(const std::string& path, std::size_t max_bytes) override;
  std::string canonical(const std::string& path) override;
};

/// Serves files from a map; for tests.
class MemoryFileReader : public FileReader {
 public:
  void add(std::string path, std::string contents) { files_[std::move(path)] = std::move(contents); }
  FileReadResult read(const std::string& path, std::size_t max_bytes) override;
  std::string canonical(const std::string& path) override;

 private:
  std::map<std::string, std::string> files_;
};

}  // namespace mainscheck::parser
