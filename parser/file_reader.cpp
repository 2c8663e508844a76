#include "parser/file_reader.hpp"

#include <fcntl.h>
#include <poll.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdint>
#include <cstring>
#include <filesystem>

namespace mainscheck::parser {

namespace fs = std::filesystem;

namespace {

std::string not_regular(mode_t mode) {
  const char* what = S_ISDIR(mode)    ? "a directory"
                     : S_ISFIFO(mode) ? "a FIFO"
                     : S_ISCHR(mode)  ? "a character device"
                     : S_ISBLK(mode)  ? "a block device"
                     : S_ISSOCK(mode) ? "a socket"
                                      : "a special file";
  return std::string("is ") + what + ", not a regular file";
}

std::string too_large(std::string_view what, std::size_t max_bytes) {
  return std::string(what) + " is larger than the limit of " + std::to_string(max_bytes) +
         " bytes (--max-file-size)";
}

}  // namespace

FileReadResult read_bounded(int fd, std::size_t max_bytes, std::string_view what,
                            std::size_t expected_bytes) {
  FileReadResult r;
  r.contents.reserve(std::min(expected_bytes, max_bytes) + 1);
  constexpr std::size_t kChunkBytes = 64 * 1024;
  // Stops one byte past the limit, so a stream that never ends costs at most the limit in memory.
  for (;;) {
    const std::size_t room = max_bytes - std::min(max_bytes, r.contents.size()) + 1;
    const std::size_t old = r.contents.size();
    r.contents.resize(old + std::min(kChunkBytes, room));
    const ssize_t n = ::read(fd, r.contents.data() + old, r.contents.size() - old);
    if (n < 0) {
      r.contents.resize(old);
      if (errno == EINTR) continue;
      if (errno == EAGAIN || errno == EWOULDBLOCK) {
        pollfd p{fd, POLLIN, 0};
        ::poll(&p, 1, -1);
        continue;
      }
      r.error = std::strerror(errno);
      r.contents.clear();
      return r;
    }
    r.contents.resize(old + static_cast<std::size_t>(n));
    if (n == 0) break;
    if (r.contents.size() > max_bytes) {
      r.contents.clear();
      r.contents.shrink_to_fit();
      r.error = too_large(what, max_bytes);
      return r;
    }
  }
  r.ok = true;
  return r;
}

std::string resolve_relative(const std::string& including_file, const std::string& relative) {
  fs::path rel(relative);
  if (rel.is_absolute()) return rel.lexically_normal().string();
  fs::path base = fs::path(including_file).parent_path();
  return (base / rel).lexically_normal().string();
}

FileReadResult DiskFileReader::read(const std::string& path, std::size_t max_bytes) {
  FileReadResult r;
  // Only regular files are netlists. Deciding before opening keeps a FIFO from blocking the open and
  // a device from being opened at all; the descriptor is checked again in case the path changed.
  struct stat st {};
  if (::stat(path.c_str(), &st) != 0) {
    r.error = std::strerror(errno);
    return r;
  }
  if (!S_ISREG(st.st_mode)) {
    r.error = not_regular(st.st_mode);
    return r;
  }
  const int fd = ::open(path.c_str(), O_RDONLY | O_NONBLOCK | O_NOCTTY | O_CLOEXEC);
  if (fd < 0) {
    r.error = std::strerror(errno);
    return r;
  }
  if (::fstat(fd, &st) != 0 || !S_ISREG(st.st_mode)) {
    r.error = not_regular(st.st_mode);
    ::close(fd);
    return r;
  }
  if (static_cast<std::uintmax_t>(st.st_size) > max_bytes) {
    r.error = "file is " + std::to_string(st.st_size) + " bytes, larger than the limit of " +
              std::to_string(max_bytes) + " bytes (--max-file-size)";
    ::close(fd);
    return r;
  }
  r = read_bounded(fd, max_bytes, "file", static_cast<std::size_t>(st.st_size));
  ::close(fd);
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
    r.error = too_large("file", max_bytes);
    return r;
  }
  r.ok = true;
  r.contents = it->second;
  return r;
}

std::string MemoryFileReader::canonical(const std::string& path) {
  return fs::path(path).lexically_normal().string();
}

}  // namespace mainscheck::parser
