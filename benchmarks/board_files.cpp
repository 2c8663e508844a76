#include "benchmarks/board_files.hpp"

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <stdexcept>
#include <vector>

namespace mainscheck::bench {

std::string board_file(std::size_t parts, tools::BoardFormat format) {
  namespace fs = std::filesystem;
  const fs::path dir(MAINSCHECK_BENCH_BOARDS_DIR);
  fs::create_directories(dir);
  const fs::path path =
      dir / ("board-" + std::to_string(parts) + (format == tools::BoardFormat::xml ? ".xml" : ".cir"));
  if (!fs::exists(path) || fs::file_size(path) == 0) {
    const fs::path tmp = path.string() + ".tmp";
    {
      std::ofstream out(tmp, std::ios::binary);
      tools::write_board(tools::BoardSpec{parts, 1}, format, out);
      if (!out.flush()) throw std::runtime_error("cannot write " + tmp.string());
    }
    fs::rename(tmp, path);
  }
  return path.string();
}

std::size_t file_bytes(const std::string& path) { return static_cast<std::size_t>(std::filesystem::file_size(path)); }

std::size_t count_lines(const std::string& path) {
  std::FILE* f = std::fopen(path.c_str(), "rb");
  if (!f) throw std::runtime_error("cannot read " + path);
  std::vector<char> buf(1 << 16);
  std::size_t lines = 0;
  for (std::size_t n; (n = std::fread(buf.data(), 1, buf.size(), f)) > 0;)
    lines += static_cast<std::size_t>(std::count(buf.data(), buf.data() + n, '\n'));
  std::fclose(f);
  return lines;
}

double line_count_floor_s(const std::string& path) {
  static std::map<std::string, double> cache;
  if (auto it = cache.find(path); it != cache.end()) return it->second;
  double best = 1e300;
  for (int i = 0; i < 3; ++i) {
    std::size_t lines = 0;
    best = std::min(best, seconds_of([&] { lines = count_lines(path); }));
    if (lines == 0) throw std::runtime_error("empty board " + path);
  }
  return cache[path] = best;
}

}  // namespace mainscheck::bench
