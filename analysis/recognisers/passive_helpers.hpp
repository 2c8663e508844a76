#pragma once
// Small queries shared by the passive-network, phase-control, transformer and multiplier
// recognisers: which side of an AC source a net is on, what type a part is, diode orientation.
#include <cstddef>
#include <optional>
#include <utility>
#include <vector>

#include "analysis/block.hpp"
#include "analysis/recogniser.hpp"
#include "parser/netlist.hpp"

namespace mainscheck::analysis::topology {

/// Which side of AC source `source` a net lies on.
enum class Side { none, hot, ret };

/// The side of `source` that `net` is on (hot side wins when a net is on both).
Side side_of(const RecognitionContext& ctx, parser::NetId net, std::size_t source);
/// The opposite side (hot ↔ ret); `none` stays `none`.
Side opposite(Side s);
/// The AC source whose hot or return side `net` lies on, with that side; nullopt when none.
std::optional<std::pair<std::size_t, Side>> source_side(const RecognitionContext& ctx, parser::NetId net);

/// True for a part the recognisers treat as a plain resistor (resistor, fusible resistor).
bool is_resistor(const RecognitionContext& ctx, std::size_t part);
/// True for a capacitor of any class.
bool is_capacitor(const RecognitionContext& ctx, std::size_t part);
/// True for a rectifying diode (not a zener, TVS or LED).
bool is_rectifier_diode(const RecognitionContext& ctx, std::size_t part);
/// True for a zener or TVS diode (a shunt voltage clamp), or an untyped diode with a low model BV
/// (analysis::breakdown_candidate_V) that may act as one.
bool is_zener(const RecognitionContext& ctx, std::size_t part);
/// True for a switch, relay contact or link.
bool is_switch(const RecognitionContext& ctx, std::size_t part);

/// Anode and cathode nets of a two-terminal diode-like part (SPICE pin order: anode first).
struct DiodeNets {
  parser::NetId anode = parser::kGroundNet;
  parser::NetId cathode = parser::kGroundNet;
};
std::optional<DiodeNets> diode_nets(const RecognitionContext& ctx, std::size_t part);

/// The principal value of a part in SI units, if it has one.
std::optional<double> value_of(const RecognitionContext& ctx, std::size_t part);
/// True when two values agree within `rel_tol` (relative to the larger).
bool values_equal(double a, double b, double rel_tol);

/// Rectifier diodes from `anode` to `cathode`, ascending.
std::vector<std::size_t> diodes_between(const RecognitionContext& ctx, parser::NetId anode, parser::NetId cathode);
/// Capacitors between two nets (either order), ascending.
std::vector<std::size_t> capacitors_between(const RecognitionContext& ctx, parser::NetId a, parser::NetId b);

/// Every maximal series chain of two-terminal parts accepted by `keep`, each part in exactly one
/// chain; chains never pass through an AC source's own hot or return net. Ordered by first part.
std::vector<SeriesChain> all_chains(const RecognitionContext& ctx, const PartFilter& keep);

/// Parts on `net` that are not in `claimed`, ascending.
std::vector<std::size_t> other_parts_on(const RecognitionContext& ctx, parser::NetId net,
                                        const std::vector<std::size_t>& claimed);

/// Fills Block::member_locs from the parts' locations (one per member, in parts() order).
void fill_member_locs(const RecognitionContext& ctx, Block& block);

/// True when every part of `b` is also a part of `a`.
bool covers(const Block& a, const Block& b);

}  // namespace mainscheck::analysis::topology
