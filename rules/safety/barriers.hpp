#pragma once
// Isolation barriers as the safety rules see them: transformer secondaries, Y capacitors and
// optocouplers, and the nets conductively joined to a set of nets without crossing one.
#include <cstddef>
#include <map>
#include <optional>
#include <set>
#include <string>
#include <vector>

#include "parser/netlist.hpp"
#include "rules/check_input.hpp"
#include "rules/safety/insulation_tables.hpp"

namespace mainscheck::rules {

/// One optocoupler (block kind `optocoupler`): the part and the nets of its LED and detector sides.
struct OptoBarrier {
  std::size_t part = 0;
  std::string block;
  std::set<parser::NetId> led;
  std::set<parser::NetId> detector;
};

/// The optocouplers of a design, and how a multi-pin part joins nets.
class OptoBarriers {
 public:
  explicit OptoBarriers(const CheckInput& in);
  /// Every optocoupler, in block order.
  const std::vector<OptoBarrier>& all() const { return list_; }
  /// The nets part `part` joins to `net`: all of its nets, but for an optocoupler only those on the
  /// same side of its barrier as `net`.
  std::vector<parser::NetId> joined(const CheckInput& in, std::size_t part, parser::NetId net) const;
  /// True when the part is a recognised optocoupler.
  bool is_opto(std::size_t part) const { return by_part_.count(part) != 0; }

 private:
  std::vector<OptoBarrier> list_;
  std::map<std::size_t, std::size_t> by_part_;
};

/// True for a capacitor of a Y subclass (class=Y1..Y4).
bool is_y_capacitor(const CheckInput& in, std::size_t part);

/// Parts that are not crossed when looking for the circuit on one side of a barrier: secondary windings
/// and couplings of isolation transformers, and Y-class capacitors (which bridge a barrier by design).
/// Optocouplers are handled by OptoBarriers::joined.
std::vector<bool> barrier_parts(const CheckInput& in);

/// Nets conductively connected to `start` through any part not marked in `barrier` (an optocoupler
/// only joins nets of one side), never expanding through `stop`; with `skip_reference_ground` never through
/// the ground net either when it is not a mains conductor (then it is the simulator's reference).
std::set<parser::NetId> connected_nets(const CheckInput& in, const OptoBarriers& optos,
                                       const std::vector<parser::NetId>& start, const std::vector<bool>& barrier,
                                       std::optional<parser::NetId> stop, bool skip_reference_ground = false);

/// True when the ground net 0 is the line or the neutral conductor.
bool ground_is_mains(const CheckInput& in);

/// True for a part the recognition skeleton left out as a simulator reference (at least 1 MΩ, the
/// only tie between two islands of the circuit).
bool is_reference(const CheckInput& in, std::size_t part);

/// Nets with a galvanic path to line or neutral as the isolation rule sees it: every part is crossed
/// except K couplings, Y1 capacitors, simulator references and optocouplers (which join only the
/// nets of one side); the path never passes through protective earth, nor through the ground net
/// when it is not a mains conductor.
std::set<parser::NetId> galvanic_mains_nets(const CheckInput& in, const OptoBarriers& optos);

/// Insulation grade stated on a part with `insulation=`, when valid.
std::optional<safety::InsulationGrade> stated_insulation(const CheckInput& in, std::size_t part);

/// Reads "functional", "basic", "supplementary" or "reinforced".
std::optional<safety::InsulationGrade> parse_grade(const std::string& text);

}  // namespace mainscheck::rules
