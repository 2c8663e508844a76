#pragma once
// Test helpers for recognition: read a SPICE deck from a string and run recognise() on it.
#include <string>
#include <vector>

#include "analysis/recognition.hpp"
#include "parser/diagnostics.hpp"
#include "parser/file_reader.hpp"
#include "parser/readers.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::analysis::testing {

/// A deck read from memory, with its diagnostics and (after run()) the recognition result.
struct Deck {
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  parser::Netlist nl;
  RecognitionResult result;

  explicit Deck(std::string text, std::string name = "deck.cir") {
    parser::MemoryFileReader files;
    parser::ReadOptions options;
    options.confine_includes = false;
    nl = parser::read_spice_text(name, std::move(text), files, sm, diags, options);
  }
  /// Runs recognition with the given options and library.
  const RecognitionResult& run(const SupplyOptions& options = {}, const parser::PartsLibrary* lib = nullptr) {
    result = recognise(nl, options, lib, diags);
    return result;
  }
  /// All diagnostics rendered, for failure messages.
  std::string rendered() const {
    std::string out;
    for (const auto& d : diags.diagnostics()) out += parser::render_diagnostic(d, sm);
    return out;
  }
  /// Blocks of one kind, in id order.
  std::vector<const Block*> blocks(const std::string& kind) const {
    std::vector<const Block*> out;
    for (const auto& b : result.blocks)
      if (b.kind == kind) out.push_back(&b);
    return out;
  }
  /// Refs of a block's parts in one role, sorted as the role list is (device order).
  std::vector<std::string> refs(const Block& b, const std::string& role) const {
    std::vector<std::string> out;
    auto it = b.roles.find(role);
    if (it == b.roles.end()) return out;
    for (std::size_t p : it->second) out.push_back(result.devices.parts[p].ref);
    return out;
  }
  /// Name of a net of the device view.
  std::string net(parser::NetId id) const { return result.devices.net(id).name; }
};

}  // namespace mainscheck::analysis::testing

namespace mainscheck::analysis::testing {

/// One recogniser run on a deck through a RecognitionSession, with extra AC sources added by hand
/// (a centre-tapped secondary without depending on the transformer recogniser).
struct SingleRun {
  Deck& deck;
  RecognitionSession session;
  std::vector<Block> blocks;

  explicit SingleRun(Deck& d, const SupplyOptions& options = {}) : deck(d), session(d.nl, options, nullptr, d.diags) {}
  /// Adds a secondary winding a–b with centre tap `ct` (net names) as an AC source.
  void add_secondary(const char* a, const char* b, const char* ct, double ratio) {
    const auto& nl = session.devices();
    AcSource s;
    s.hot = *nl.find_net(a);
    s.ret = *nl.find_net(b);
    if (ct) s.centre_tap = *nl.find_net(ct);
    s.v_ratio = ratio;
    s.origin = "test";
    session.add_ac_source(s);
  }
  const std::vector<Block>& run(const Recogniser& r) {
    const std::vector<Block> none;
    r.recognise(session.context(none), blocks);
    return blocks;
  }
  std::vector<std::string> refs(const Block& b, const std::string& role) const {
    std::vector<std::string> out;
    auto it = b.roles.find(role);
    if (it == b.roles.end()) return out;
    for (std::size_t p : it->second) out.push_back(session.devices().parts[p].ref);
    return out;
  }
  std::string net(parser::NetId id) const { return session.devices().net(id).name; }
};

}  // namespace mainscheck::analysis::testing

namespace mainscheck::analysis::testing {

// A 20k-part board: a mains entry (fuse, X capacitor, bridge with reservoir) and a half-wave
// auxiliary supply buried among low-voltage RC networks and decoy diode strings on DC rails.
/// A board of 4*cells + 11 parts (plus decoys) with three front-end blocks buried in it.
inline std::string board_deck(int cells) {
  std::string s = "board\nV1 L N SIN(0 325 50)\n";
  s += "*@part RF1 type=fuse i_rated=3.15\nRF1 L LF 0.05\nCX1 LF N 220n\n";
  for (int i = 0; i < cells; ++i) {
    const std::string k = std::to_string(i);
    // An RC ladder cell hanging off the DC bus and ground.
    s += "RA" + k + " BUS n" + k + " 10k\n";
    s += "CA" + k + " n" + k + " 0 100n\n";
    s += "RB" + k + " n" + k + " m" + k + " 1k\n";
    s += "CB" + k + " m" + k + " 0 10n\n";
    if (i == cells / 2) {
      s += "D1 LF P DX\nD2 N P DX\nD3 M LF DX\nD4 M N DX\nC1 P M 220u\nR1 P M 330k\n";
      s += "DAUX LF AUX DX\nCAUX AUX N 47u\n";
    }
    if (i % 1000 == 7) {
      // Two diode strings in parallel on DC nets: the bridge shape with undriven midpoints.
      s += "DS1_" + k + " m" + k + " x" + k + " DX\nDS2_" + k + " x" + k + " BUS DX\n";
      s += "DS3_" + k + " m" + k + " y" + k + " DX\nDS4_" + k + " y" + k + " BUS DX\n";
    }
  }
  s += ".model DX D(BV=1000)\n.end\n";
  return s;
}

}  // namespace mainscheck::analysis::testing
