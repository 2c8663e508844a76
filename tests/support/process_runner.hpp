#pragma once
// Runs a child process for tests (the built CLI, ngspice) and captures exit status, stdout and
// stderr, with a wall-clock bound so a hanging child fails the test instead of the whole run.
// POSIX only (fork/exec/poll), header-only so every test suite can include it.
#include <fcntl.h>
#include <poll.h>
#include <signal.h>
#include <sys/resource.h>
#include <sys/types.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <chrono>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace mainscheck::test_support {

/// How to start a child process.
struct ProcessOptions {
  std::string working_dir;                                   // empty: the test's own working directory
  std::chrono::milliseconds timeout{std::chrono::seconds(30)};  // the child is killed after this
  std::string stdin_text;                                    // written to the child's stdin, then closed
  std::vector<std::pair<std::string, std::string>> env;      // added to (or replacing in) the environment
};

/// What a finished child left behind.
struct ProcessResult {
  bool started = false;      // false: fork/exec failed, see `error`
  int exit_code = -1;        // exit status when the child exited normally
  int term_signal = 0;       // signal number when it was killed (including by the timeout)
  bool timed_out = false;
  std::string out;
  std::string err;
  std::chrono::milliseconds elapsed{0};
  long max_rss_kB = 0;       // peak resident set size of the child (wait4 rusage), in kibibytes
  std::chrono::milliseconds cpu{0};  // user + system CPU time of the child; unlike `elapsed`, load-independent
  std::string error;         // why the child could not be started

  /// True when the child exited by itself (not killed, not timed out).
  bool exited() const { return started && !timed_out && term_signal == 0; }
};

namespace detail {

inline void close_fd(int& fd) {
  if (fd >= 0) ::close(fd);
  fd = -1;
}

inline bool make_pipe(int fds[2]) { return ::pipe2(fds, O_CLOEXEC) == 0; }

// Child side after fork: only async-signal-safe calls until exec.
[[noreturn]] inline void exec_child(const std::vector<std::string>& argv, const ProcessOptions& opt, int in_fd,
                                    int out_fd, int err_fd, int status_fd) {
  ::setpgid(0, 0);  // own process group, so a timeout kill reaches grandchildren too
  ::dup2(in_fd, STDIN_FILENO);
  ::dup2(out_fd, STDOUT_FILENO);
  ::dup2(err_fd, STDERR_FILENO);
  int failure = 0;
  if (!opt.working_dir.empty() && ::chdir(opt.working_dir.c_str()) != 0) failure = errno;
  if (failure == 0) {
    for (const auto& [k, v] : opt.env) ::setenv(k.c_str(), v.c_str(), 1);
    std::vector<char*> args;
    args.reserve(argv.size() + 1);
    for (const auto& a : argv) args.push_back(const_cast<char*>(a.c_str()));
    args.push_back(nullptr);
    ::execvp(args[0], args.data());
    failure = errno;
  }
  [[maybe_unused]] ssize_t n = ::write(status_fd, &failure, sizeof failure);
  ::_exit(127);
}

}  // namespace detail

/// Runs `argv` (argv[0] looked up in PATH when it has no slash) and waits for it, at most `opt.timeout`.
inline ProcessResult run_process(const std::vector<std::string>& argv, const ProcessOptions& opt = {}) {
  ProcessResult r;
  if (argv.empty()) {
    r.error = "empty command line";
    return r;
  }
  int in[2] = {-1, -1}, out[2] = {-1, -1}, err[2] = {-1, -1}, status[2] = {-1, -1};
  if (!detail::make_pipe(in) || !detail::make_pipe(out) || !detail::make_pipe(err) || !detail::make_pipe(status)) {
    r.error = std::string("pipe: ") + std::strerror(errno);
    for (int* p : {in, out, err, status}) {
      detail::close_fd(p[0]);
      detail::close_fd(p[1]);
    }
    return r;
  }
  const auto t0 = std::chrono::steady_clock::now();
  const pid_t pid = ::fork();
  if (pid < 0) {
    r.error = std::string("fork: ") + std::strerror(errno);
    for (int* p : {in, out, err, status}) {
      detail::close_fd(p[0]);
      detail::close_fd(p[1]);
    }
    return r;
  }
  if (pid == 0) detail::exec_child(argv, opt, in[0], out[1], err[1], status[1]);
  ::setpgid(pid, pid);  // also from the parent, so the group exists before any kill
  detail::close_fd(in[0]);
  detail::close_fd(out[1]);
  detail::close_fd(err[1]);
  detail::close_fd(status[1]);

  int exec_errno = 0;
  if (::read(status[0], &exec_errno, sizeof exec_errno) == static_cast<ssize_t>(sizeof exec_errno)) {
    r.error = "cannot run '" + argv[0] + "': " + std::strerror(exec_errno);
  }
  detail::close_fd(status[0]);

  if (!opt.stdin_text.empty()) ::signal(SIGPIPE, SIG_IGN);  // a child that exits early must not kill the test
  ::fcntl(in[1], F_SETFL, O_NONBLOCK);
  std::size_t written = 0;
  if (opt.stdin_text.empty()) detail::close_fd(in[1]);
  const auto deadline = t0 + opt.timeout;
  char buf[65536];
  while (out[0] >= 0 || err[0] >= 0) {
    const auto now = std::chrono::steady_clock::now();
    if (now >= deadline) {
      r.timed_out = true;
      ::kill(-pid, SIGKILL);
      break;
    }
    pollfd fds[3];
    nfds_t n = 0;
    if (out[0] >= 0) fds[n++] = {out[0], POLLIN, 0};
    if (err[0] >= 0) fds[n++] = {err[0], POLLIN, 0};
    if (in[1] >= 0) fds[n++] = {in[1], POLLOUT, 0};
    const auto wait_ms = std::chrono::duration_cast<std::chrono::milliseconds>(deadline - now).count();
    const int rc = ::poll(fds, n, static_cast<int>(wait_ms) + 1);
    if (rc < 0 && errno == EINTR) continue;
    if (rc < 0) break;
    for (nfds_t i = 0; i < n; ++i) {
      if (fds[i].revents == 0) continue;
      if (fds[i].fd == in[1]) {
        const ssize_t w = ::write(in[1], opt.stdin_text.data() + written, opt.stdin_text.size() - written);
        if (w > 0) written += static_cast<std::size_t>(w);
        if (w < 0 && errno != EAGAIN) written = opt.stdin_text.size();
        if (written >= opt.stdin_text.size()) detail::close_fd(in[1]);
        continue;
      }
      const ssize_t got = ::read(fds[i].fd, buf, sizeof buf);
      if (got > 0) {
        (fds[i].fd == out[0] ? r.out : r.err).append(buf, static_cast<std::size_t>(got));
      } else if (got == 0 || errno != EAGAIN) {
        detail::close_fd(fds[i].fd == out[0] ? out[0] : err[0]);
      }
    }
  }
  detail::close_fd(in[1]);
  detail::close_fd(out[0]);
  detail::close_fd(err[0]);
  int wstatus = 0;
  rusage usage{};
  while (::wait4(pid, &wstatus, 0, &usage) < 0 && errno == EINTR) {
  }
  r.max_rss_kB = usage.ru_maxrss;
  const auto tv_ms = [](const timeval& tv) { return std::chrono::milliseconds(tv.tv_sec * 1000 + tv.tv_usec / 1000); };
  r.cpu = tv_ms(usage.ru_utime) + tv_ms(usage.ru_stime);
  r.elapsed = std::chrono::duration_cast<std::chrono::milliseconds>(std::chrono::steady_clock::now() - t0);
  r.started = r.error.empty();
  if (WIFEXITED(wstatus)) r.exit_code = WEXITSTATUS(wstatus);
  if (WIFSIGNALED(wstatus)) r.term_signal = WTERMSIG(wstatus);
  return r;
}

/// Full path of an executable found in PATH, or nothing.
inline std::optional<std::string> find_program(std::string_view name) {
  const char* path = std::getenv("PATH");
  if (path == nullptr) return std::nullopt;
  std::string_view rest(path);
  while (!rest.empty()) {
    const std::size_t colon = rest.find(':');
    const std::string_view dir = rest.substr(0, colon);
    rest = colon == std::string_view::npos ? std::string_view{} : rest.substr(colon + 1);
    if (dir.empty()) continue;
    const std::filesystem::path candidate = std::filesystem::path(dir) / name;
    if (::access(candidate.c_str(), X_OK) == 0 && !std::filesystem::is_directory(candidate)) return candidate.string();
  }
  return std::nullopt;
}

/// Splits text into lines without their `\n` (and a trailing `\r`).
inline std::vector<std::string> split_lines(std::string_view text) {
  std::vector<std::string> lines;
  std::size_t start = 0;
  while (start < text.size()) {
    std::size_t end = text.find('\n', start);
    if (end == std::string_view::npos) end = text.size();
    std::string_view line = text.substr(start, end - start);
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    lines.emplace_back(line);
    start = end + 1;
  }
  return lines;
}

}  // namespace mainscheck::test_support
