#pragma once
// Readers get files through this interface so tests can serve in-memory files and the
// CLI can confine `.include` to allowed directory trees.
#include <map>
#include <string>

namespace mainscheck::parser {

/// Result of reading one file: contents, or an error text ("no such file or directory").
struct FileReadResult {
  bool ok = false;
  std::string contents;
  std::string error;
};

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

/// Reads from the real file system.
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
