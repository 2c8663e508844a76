#include "cli/input.hpp"

#include <unistd.h>

#include <cerrno>
#include <cstdlib>
#include <filesystem>
#include <iostream>

#include "parser/readers.hpp"

namespace mainscheck::cli {

namespace {

// A limit is a whole count written in decimal digits, at least 1 and at most `most`: a sign, a
// fraction or a value that does not fit would otherwise wrap round to a huge limit (docs/limits.md).
CLI::Validator count_between(std::size_t least, std::size_t most) {
  return CLI::Validator(
      [least, most](std::string& text) -> std::string {
        errno = 0;
        const bool digits =
            !text.empty() && text.size() <= 20 && text.find_first_not_of("0123456789") == std::string::npos;
        const unsigned long long v = digits ? std::strtoull(text.c_str(), nullptr, 10) : 0;
        if (!digits || errno == ERANGE || v < least || v > most)
          return "must be a whole number from " + std::to_string(least) + " to " + std::to_string(most) +
                 ", not '" + text + "'";
        return {};
      },
      "COUNT", "count");
}

constexpr std::size_t kMostCount = std::size_t{1} << 48;

}  // namespace

void add_input_options(CLI::App& cmd, InputOptions& opts) {
  auto& lim = opts.read.limits;
  const auto count = count_between(1, kMostCount);
  cmd.add_option("--include-path", opts.read.include_paths,
                 "directory tree that .include/.lib may read from besides the netlist's own directory");
  cmd.add_option("--max-file-size", lim.max_file_bytes, "largest input file in bytes")
      ->capture_default_str()
      ->check(count);
  cmd.add_option("--max-line-length", lim.max_line_bytes, "longest physical line in bytes")
      ->capture_default_str()
      ->check(count);
  cmd.add_option("--max-include-depth", lim.max_include_depth, "deepest .include/.lib nesting")
      ->capture_default_str()
      ->check(count);
  cmd.add_option("--max-included-files", lim.max_included_files, "most files read through .include/.lib")
      ->capture_default_str()
      ->check(count);
  cmd.add_option("--max-subckt-depth", lim.max_subckt_depth, "deepest subcircuit instance nesting")
      ->capture_default_str()
      ->check(count);
  cmd.add_option("--max-parts", lim.max_parts, "most parts after flattening")
      ->capture_default_str()
      ->check(count);
  cmd.add_option("--max-expression-depth", lim.max_expression_depth,
                 "deepest expression nesting and longest chain of parameters")
      ->capture_default_str()
      ->check(count);
  cmd.add_option("--max-xml-depth", lim.max_xml_depth, "deepest XML element nesting")
      ->capture_default_str()
      ->check(count);
  cmd.add_option("--max-xml-attributes", lim.max_xml_attributes, "most attributes on one XML element")
      ->capture_default_str()
      ->check(count);
}

namespace {
void reject_empty(LoadedNetlist& out) {
  // A file with nothing to check must never look like a clean board.
  if (!out.diagnostics.has_errors() && out.netlist.parts.empty()) {
    const parser::SourceLoc at =
        out.netlist.top_file != 0 ? out.sources.loc(out.netlist.top_file, 0) : parser::SourceLoc{};
    out.diagnostics.error(at, "the netlist has no parts");
  }
}
}  // namespace

void load_netlist(const std::string& path, const InputOptions& opts, LoadedNetlist& out) {
  parser::DiskFileReader files;
  if (path == "-") {
    // Read in chunks and stop at the limit: a pipe that never ends must not fill the memory.
    parser::FileReadResult in =
        parser::read_bounded(STDIN_FILENO, opts.read.limits.max_file_bytes, "standard input");
    if (!in.ok) {
      out.diagnostics.error({}, in.error);
      return;
    }
    std::string text = std::move(in.contents);
    // Includes from a deck on stdin resolve against the working directory.
    parser::ReadOptions ro = opts.read;
    ro.include_paths.push_back(std::filesystem::current_path().string());
    out.netlist =
        parser::read_netlist_text("<stdin>", std::move(text), files, out.sources, out.diagnostics, ro);
  } else {
    out.netlist = parser::read_netlist_file(path, files, out.sources, out.diagnostics, opts.read);
  }
  reject_empty(out);
}

bool use_color(int stream_fd) {
  const char* no_color = std::getenv("NO_COLOR");
  if (no_color != nullptr && no_color[0] != '\0') return false;
  return isatty(stream_fd) != 0;
}

bool print_diagnostics(const LoadedNetlist& in, std::ostream& err) {
  const bool color = use_color(STDERR_FILENO);
  for (const auto& d : in.diagnostics.diagnostics()) err << parser::render_diagnostic(d, in.sources, color);
  return in.diagnostics.has_errors();
}

}  // namespace mainscheck::cli
