// libFuzzer entry for the XML netlist reader (pugixml parse, element walk, kinds, values, supply,
// flattening) on a document held in memory.
#include <cstddef>
#include <cstdint>
#include <string>

#include "fuzz/fuzz_support.hpp"
#include "parser/readers.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  using namespace mainscheck;
  parser::ReadOptions options;
  options.limits.max_parts = 20000;
  options.limits.max_xml_depth = 64;
  options.limits.max_xml_attributes = 64;
  options.limits.max_expression_depth = 64;
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  const parser::Netlist nl =
      parser::read_xml_text("board.xml", std::string(reinterpret_cast<const char*>(data), size), sm, diags, options);
  fuzz::check_diagnostics(diags, sm);
  if (!diags.has_errors()) fuzz::check_netlist(nl);
  return 0;
}
