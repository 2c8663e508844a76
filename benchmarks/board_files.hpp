#pragma once
// Generated boards on disk for the scale benchmarks, and the I/O floor they are measured against.
#include <cstddef>
#include <string>

#include "tools/board_generator/board_generator.hpp"

namespace mainscheck::bench {

/// Path of the generated board of `parts` parts (seed 1), written on first use under the build tree.
std::string board_file(std::size_t parts, tools::BoardFormat format);
/// Size of a file in bytes.
std::size_t file_bytes(const std::string& path);
/// Reads the file in 64 KiB blocks and counts '\n': the cost of merely reading it.
std::size_t count_lines(const std::string& path);
/// Best of three count_lines runs on a warm cache, in seconds; cached per path.
double line_count_floor_s(const std::string& path);
/// CPU seconds (user + system, this process) of one call of `f`: the machine is shared, so
/// wall-clock time would count other processes' work.
template <class F>
double seconds_of(F&& f);

}  // namespace mainscheck::bench

#include <ctime>

template <class F>
double mainscheck::bench::seconds_of(F&& f) {
  const auto now = [] {
    timespec ts{};
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &ts);
    return static_cast<double>(ts.tv_sec) + static_cast<double>(ts.tv_nsec) * 1e-9;
  };
  const double t0 = now();
  f();
  return now() - t0;
}
