#pragma once
// Test support for the block recognisers: read a SPICE deck from text (or an examples/ file),
// run the whole recognition and look blocks up by kind, roles by part reference.
#include <algorithm>
#include <memory>
#include <string>
#include <string_view>
#include <vector>

#include <gtest/gtest.h>

#include "analysis/recognition.hpp"
#include "parser/file_reader.hpp"
#include "parser/readers.hpp"

namespace mainscheck::testing {

/// A recognised deck with the sinks and buffers it refers to.
struct Deck {
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  parser::MemoryFileReader files;
  parser::Netlist netlist;
  analysis::RecognitionResult result;

  /// Blocks of one kind, in block order.
  std::vector<const analysis::Block*> of_kind(std::string_view kind) const {
    std::vector<const analysis::Block*> out;
    for (const auto& b : result.blocks)
      if (b.kind == kind) out.push_back(&b);
    return out;
  }
  /// Part references playing `role` in `b`, sorted.
  std::vector<std::string> refs(const analysis::Block& b, const std::string& role) const {
    std::vector<std::string> out;
    auto it = b.roles.find(role);
    if (it == b.roles.end()) return out;
    for (std::size_t p : it->second) out.push_back(result.devices.parts[p].ref);
    std::sort(out.begin(), out.end());
    return out;
  }
  /// Role names of `b`, sorted.
  std::vector<std::string> role_names(const analysis::Block& b) const {
    std::vector<std::string> out;
    for (const auto& [role, parts] : b.roles) out.push_back(role);
    return out;
  }
  /// Display name of a net, lower case.
  std::string net(parser::NetId id) const { return parser::to_lower(result.devices.net(id).name); }
  /// Error texts (reader and recognition), for failure messages.
  std::string errors() const {
    std::string out;
    for (const auto& d : diags.diagnostics())
      if (d.severity == parser::Severity::error) out += d.message + "\n";
    return out;
  }
  bool has_errors() const { return !errors().empty(); }
};

/// Reads `text` as a SPICE deck named "test.cir" and recognises it.
inline std::unique_ptr<Deck> recognise_deck(const std::string& text) {
  auto d = std::make_unique<Deck>();
  d->netlist = parser::read_spice_text("test.cir", text, d->files, d->sm, d->diags);
  d->result = analysis::recognise(d->netlist, analysis::SupplyOptions{}, nullptr, d->diags);
  return d;
}

/// Reads and recognises a deck from the repository's examples/ folder.
inline std::unique_ptr<Deck> recognise_example(const std::string& name) {
  auto d = std::make_unique<Deck>();
  parser::DiskFileReader disk;
  d->netlist = parser::read_spice_file(std::string(MAINSCHECK_SOURCE_DIR) + "/examples/" + name, disk, d->sm, d->diags);
  d->result = analysis::recognise(d->netlist, analysis::SupplyOptions{}, nullptr, d->diags);
  return d;
}

using Refs = std::vector<std::string>;

}  // namespace mainscheck::testing
