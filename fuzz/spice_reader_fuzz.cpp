// libFuzzer entry for the whole SPICE reader (lines, grammar, directives, subcircuits, flattening)
// on a deck held in memory. Includes are served by a MemoryFileReader holding two small library
// files, so `.include`/`.lib` are exercised but can never reach the disk.
#include <cstddef>
#include <cstdint>
#include <string>

#include "fuzz/fuzz_support.hpp"
#include "parser/readers.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  using namespace mainscheck;
  parser::MemoryFileReader files;
  files.add("lib/parts.inc",
            ".subckt snub a b rs=100\nR1 a m {rs}\nC1 m b 10n\n.ends\n.model D1N4007 D(Is=7n Rs=0.04 Bv=1000)\n");
  // Each corner section selects the shared section of its own file, as model libraries do.
  files.add("lib/models.lib",
            ".lib common\n.model DSH D(IS=1n BV=600)\n.endl common\n.lib typ\n.lib 'models.lib' common\n"
            ".param rload=1k\n.endl typ\n.lib worst\n.lib models.lib common\n.param rload=820\n.endl\n");
  parser::ReadOptions options;
  options.confine_includes = true;
  // Tight limits keep each input cheap; the limits themselves are part of what is exercised.
  options.limits.max_parts = 20000;
  options.limits.max_subckt_depth = 16;
  options.limits.max_include_depth = 8;
  options.limits.max_included_files = 16;
  options.limits.max_expression_depth = 64;
  options.limits.max_line_bytes = 1u << 16;
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  const parser::Netlist nl = parser::read_spice_text(
      "deck.cir", std::string(reinterpret_cast<const char*>(data), size), files, sm, diags, options);
  fuzz::check_diagnostics(diags, sm);
  if (!diags.has_errors()) fuzz::check_netlist(nl);
  return 0;
}
