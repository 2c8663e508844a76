#pragma once
// Resource limits for reading untrusted netlists; every one is documented in docs/limits.md
// and can be overridden on the command line.
#include <cstddef>
#include <string>
#include <vector>

namespace mainscheck::parser {

/// Bounds that keep a hostile or broken netlist from exhausting time, memory or the stack.
struct ReadLimits {
  std::size_t max_file_bytes = 256u << 20;     // per file
  std::size_t max_line_bytes = 1u << 20;       // per physical line
  std::size_t max_include_depth = 32;
  std::size_t max_included_files = 1000;
  std::size_t max_subckt_depth = 64;
  std::size_t max_parts = 5'000'000;           // after flattening
  std::size_t max_expression_depth = 256;
  std::size_t max_xml_depth = 256;
  std::size_t max_xml_attributes = 1024;        // on one element
};

/// What a reader needs besides the file: limits and where includes may come from.
struct ReadOptions {
  ReadLimits limits;
  /// Directory trees `.include`/`.lib` may read from besides the top netlist's own directory.
  std::vector<std::string> include_paths;
  /// When false, includes may go anywhere (used by tests of the reader itself).
  bool confine_includes = true;
};

}  // namespace mainscheck::parser
