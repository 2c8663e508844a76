#pragma once
// Topology helpers shared by the rectifier recognisers: diode bridges, how a pair of AC nets is
// fed from an AC source, and the parts across a rectifier's output.
#include <array>
#include <cstddef>
#include <optional>
#include <vector>

#include "analysis/block.hpp"
#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// True for part types that rectify in a rectifier position (diode, zener, led).
bool is_rectifier_diode(FrontEndType t);

/// Anode and cathode nets of a two-terminal rectifying part (pin order anode, cathode).
struct DiodeEnds {
  parser::NetId anode;
  parser::NetId cathode;
};
/// The ends of `part` when it is a two-terminal rectifying part on two different nets.
std::optional<DiodeEnds> diode_ends(const RecognitionContext& ctx, std::size_t part);

/// Four diodes (or one module) in the full-wave bridge topology: ac_a and ac_b each carry one
/// anode and one cathode, pos carries two cathodes, neg two anodes, all four nets distinct.
struct DiodeBridge {
  /// Diodes ac_a→pos, ac_b→pos, neg→ac_a, neg→ac_b; for a module all four are the module part.
  std::array<std::size_t, 4> diodes{};
  std::optional<std::size_t> module;
  parser::NetId ac_a = 0, ac_b = 0, pos = 0, neg = 0;
};

/// Every diode bridge in the device view, ordered by first diode; a diode is used by one bridge at most.
std::vector<DiodeBridge> find_diode_bridges(const RecognitionContext& ctx);

/// How a pair of nets is fed from an AC source.
struct AcFeed {
  std::size_t source = 0;             // index into ctx.ac_sources
  bool direct = false;                // both nets on the source's sides (through series-pass parts only)
  bool reversed = false;              // the first net is on the return side
  std::vector<std::size_t> series;    // passive parts crossed between the source sides and the nets
};

/// Finds the source that drives `a` from one side and `b` from the other, directly or through up
/// to `max_hops` passive two-terminal parts on each net (a series resistor or dropper capacitor);
/// never crosses `exclude` parts.
std::optional<AcFeed> find_ac_feed(const RecognitionContext& ctx, parser::NetId a, parser::NetId b,
                                   const std::vector<std::size_t>& exclude, int max_hops = 2);

/// True when the source feeding `br` has a centre tap and reservoirs join both bridge outputs to it.
bool is_dual_rail_bridge(const RecognitionContext& ctx, const DiodeBridge& br, const AcFeed& feed);

/// True when at least one capacitor sits directly between `a` and `b`.
bool has_capacitor_between(const RecognitionContext& ctx, parser::NetId a, parser::NetId b);

/// Parts directly across a DC output: capacitors as "reservoir", resistors as "bleeder" (at least
/// kBleederMinOhm) or "load" (below). A designer's role= attribute wins.
void add_output_roles(const RecognitionContext& ctx, Block& block, parser::NetId net, parser::NetId ret);
/// The same for a multiplier's output, whose capacitors already have roles: only resistors
/// ("bleeder" or "load") and parts with a role= attribute are added.
void add_output_resistors(const RecognitionContext& ctx, Block& block, parser::NetId net, parser::NetId ret);

/// Resistance from which a resistor across a reservoir counts as a bleeder rather than a load (common practice).
inline constexpr double kBleederMinOhm = 10e3;

/// Capacitors in parallel with a diode (diode snubbers), added as role "diode_snubber".
void add_diode_snubbers(const RecognitionContext& ctx, Block& block, const std::vector<std::size_t>& diodes);

}  // namespace mainscheck::analysis
