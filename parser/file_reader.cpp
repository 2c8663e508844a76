#include "parser/file_reader.hpp"

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <iterator>

namespace mainscheck::parser {

namespace fs = std::filesystem;

std::string resolve_relative(const std::string& including_file, const std::string& relative) {
  fs::path rel(relative);
  if (rel.is_absolute()) return rel.lexically_normal().string();
  fs::path base = fs::path(including_file).parent_path();
  return (base / rel).lexically_normal().string();
}

FileReadResult DiskFileReader::read(const std::string& path, std::size_t max_bytes) {
  FileReadResult r;
  std::error_code ec;
  if (fs::is_directory(path, ec)) {
    r.error = "is a directory";
    return r;
  }
  std::ifstream in(path, std::ios::binary);
  if (!in) {
    r.error = std::strerror(errno);
    return r;
  }
  const auto size = fs::file_size(path, ec);
  if (!ec && size > max_bytes) {
    r.error = "file is " + std::to_string(size) + " bytes, larger than the limit of " + std::to_string(max_bytes) +
              " bytes (--max-file-size)";
    return r;
  }
  r.contents.assign(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
  if (r.contents.size() > max_bytes) {
    r.contents.clear();
    r.error = "file is larger than the limit of " + std::to_string(max_bytes) + " bytes (--max-file-size)";
    return r;
  }
  r.ok = true;
  return r;
}

std::string DiskFileReader::canonical(const std::string& path) {
  std::error_code ec;
  fs::path p = fs::weakly_canonical(path, ec);
  return ec ? fs::path(path).lexically_normal().string() : p.string();
}

FileReadResult MemoryFileReader::read(const std::string& path, std::size_t max_bytes) {
  FileReadResult r;
  auto it = files_.find(fs::path(path).lexically_normal().string());
  if (it == files_.end()) {
    r.error = "No such file or directory";
    return r;
  }
  if (it->second.size() > max_bytes) {
    r.error = "file is larger than the limit of " + std::to_string(max_bytes) + " bytes (--max-file-size)";
    return r;
  }
  r.ok = true;
  r.contents = it->second;
  return r;
}

std::string MemoryFileReader::canonical(const std::string& path) { return fs::path(path).lexically_normal().string(); }

}  // namespace mainscheck::parser
