#include "rules/safety/capacitor_class.hpp"

#include <algorithm>
#include <fmt/format.h>
#include <map>
#include <set>

#include "rules/rating_support.hpp"
#include "rules/safety/barriers.hpp"
#include "rules/safety/mains_topology.hpp"

namespace mainscheck::rules {

namespace {

/// Where a capacitor sits, and so which subclasses it needs.
enum class Position { across_line, dropper_series, to_earth, barrier };

std::string_view position_text(Position p) {
  switch (p) {
    case Position::across_line: return "across line and neutral";
    case Position::dropper_series: return "in series as the dropper capacitor";
    case Position::to_earth: return "from the mains to protective earth";
    case Position::barrier: return "across the isolation barrier";
  }
  return "";
}

/// Why the class does not fit, or "" when it does (safety-data.md 3.1-3.3, IEC 60384-14).
std::string class_problem(Position p, const std::string& cls, bool ovc3, bool reinforced, double v_high_V) {
  const bool y = cls.size() == 2 && cls[0] == 'Y';
  if (p == Position::across_line || p == Position::dropper_series) {
    // A Y capacitor may replace an X capacitor, never the reverse ([C: S-everycircuit, S-journeyman]).
    if (y) return "";
    if (cls == "X1") return "";
    if (cls == "X2") return ovc3 ? "X2 is for overvoltage category II; category III needs X1 (IEC 60384-14, 2.5 kV vs 4 kV impulse)" : "";
    if (cls == "X3") return "X3 is rated for impulses up to 1.2 kV only, below the 2.5 kV of overvoltage category II (IEC 60384-14)";
    return "";
  }
  if (!y) return fmt::format("class {} is not a Y class; a capacitor {} needs Y (IEC 60384-14)", cls, position_text(p));
  if (p == Position::barrier && reinforced && cls != "Y1")
    return fmt::format("class {} bridges basic insulation only; reinforced insulation needs Y1 (IEC 60384-14)", cls);
  if (cls == "Y4" && v_high_V > 150)
    return fmt::format("Y4 is for rated voltages below 150 V; high line is {} (IEC 60384-14)", format_si(v_high_V, "V"));
  if (cls == "Y3" && v_high_V > 250)
    return fmt::format("Y3 is for rated voltages up to 250 V; high line is {} (IEC 60384-14)", format_si(v_high_V, "V"));
  return "";
}

/// Capacitors that bridge an optocoupler's barrier: one pin on the circuit joined to the mains, the other on
/// the circuit of the optocoupler's other side (neither reached through a Y capacitor or a transformer).
/// `reinforced_at` records the barriers whose part states insulation= (it overrides the rule's option).
void opto_barrier_capacitors(const CheckInput& in, std::map<std::size_t, Position>& where,
                             std::map<std::size_t, bool>& reinforced_at) {
  const auto& supply = in.recognition.supply;
  if (!supply.line || !supply.neutral) return;
  const OptoBarriers optos(in);
  if (optos.all().empty()) return;
  // Every capacitor is a candidate bridge, so none is crossed when finding the two sides (an X2 part across
  // the barrier must not make the isolated side look joined to the mains).
  auto barrier = barrier_parts(in);
  for (std::size_t i = 0; i < barrier.size(); ++i)
    if (in.info(i).type == analysis::FrontEndType::capacitor) barrier[i] = true;
  const auto mains = connected_nets(in, optos, {*supply.line, *supply.neutral}, barrier, supply.earth, true);
  const auto& parts = in.devices().parts;
  for (const auto& o : optos.all()) {
    const auto led = connected_nets(in, optos, {o.led.begin(), o.led.end()}, barrier, supply.earth, true);
    const auto det = connected_nets(in, optos, {o.detector.begin(), o.detector.end()}, barrier, supply.earth, true);
    auto on_mains = [&](const std::set<parser::NetId>& side) {
      return std::any_of(side.begin(), side.end(), [&](parser::NetId n) { return mains.count(n) != 0; });
    };
    const bool led_mains = on_mains(led), det_mains = on_mains(det);
    if (led_mains == det_mains) continue;
    const auto& isolated = led_mains ? det : led;
    for (std::size_t i = 0; i < parts.size(); ++i) {
      if (in.info(i).type != analysis::FrontEndType::capacitor || parts[i].nets.size() != 2) continue;
      const auto a = parts[i].nets[0], c = parts[i].nets[1];
      if (!((mains.count(a) && isolated.count(c)) || (mains.count(c) && isolated.count(a)))) continue;
      where[i] = Position::barrier;
      if (auto g = stated_insulation(in, o.part))
        reinforced_at[i] = *g == safety::InsulationGrade::reinforced;
    }
  }
}

/// The nets on each side of a transformer barrier: primary nets and each isolated secondary's nets.
void barrier_capacitors(const CheckInput& in, std::map<std::size_t, Position>& where) {
  const auto& parts = in.devices().parts;
  for (const auto& b : in.recognition.blocks) {
    if (b.kind != "isolation-transformer") continue;
    std::set<parser::NetId> primary, secondary;
    auto collect = [&](const char* role, std::set<parser::NetId>& into) {
      auto it = b.roles.find(role);
      if (it == b.roles.end()) return;
      for (std::size_t p : it->second) into.insert(parts[p].nets.begin(), parts[p].nets.end());
    };
    collect("primary", primary);
    collect("secondary", secondary);
    // Only the two-terminal capacitors that join a primary net straight to a secondary net; a
    // capacitor through further parts is reported by the isolation rule's path search.
    for (std::size_t i = 0; i < parts.size(); ++i) {
      if (in.info(i).type != analysis::FrontEndType::capacitor || parts[i].nets.size() != 2) continue;
      const auto a = parts[i].nets[0], c = parts[i].nets[1];
      if ((primary.count(a) && secondary.count(c)) || (primary.count(c) && secondary.count(a))) where[i] = Position::barrier;
    }
  }
}

class CapacitorClass final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "capacitor-class",
        "safety subclass (IEC 60384-14) of capacitors across the mains, to earth, across a barrier and as droppers",
        Severity::error,
        "IEC 60384-14 subclasses: X across the line (a Y may replace an X, never the reverse), Y to earth "
        "or across a barrier, Y1 for reinforced insulation, X2 or better for a dropper (the placement rules "
        "are common practice)",
        {{"overvoltage-category", 0, "",
          "overvoltage category of the mains input: II (X2 suffices) or III (X1 needed); IEC 60664-1 "
          "categories, IEC 60384-14 X subclasses",
          "II", {"II", "III"}},
         {"barrier-insulation", 0, "",
          "insulation a capacitor across a transformer or optocoupler barrier bridges: reinforced (Y1) or "
          "basic (any Y); an optocoupler's insulation= attribute overrides it; IEC 60384-14",
          "reinforced", {"reinforced", "basic"}}},
        {{analysis::FrontEndType::capacitor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    std::map<std::size_t, Position> where;
    for (std::size_t p : parts_in_role(in, "protection", "x_capacitor")) where[p] = Position::across_line;
    for (std::size_t p : parts_in_role(in, "capacitive-dropper", "series_capacitor")) where[p] = Position::dropper_series;
    for (std::size_t p : parts_in_role(in, "protection", "y_capacitor")) where[p] = Position::to_earth;
    barrier_capacitors(in, where);
    std::map<std::size_t, bool> reinforced_at;
    opto_barrier_capacitors(in, where, reinforced_at);

    const bool ovc3 = opts.text("overvoltage-category") == "III";
    const bool reinforced = opts.text("barrier-insulation") == "reinforced";
    const auto high = high_line_rms(in);
    const double v_high_V = high ? high->value : 0;
    for (const auto& [part, pos] : where) {
      const auto cls = in.info(part).text("class");
      if (!cls || cls->empty()) {
        Finding f = part_finding(in, info(), part, Severity::warning,
                                 fmt::format("{} sits {} but its safety class is unknown; state class= (IEC 60384-14)",
                                             ref_of(in, part), position_text(pos)));
        f.notes.push_back({f.loc, "an unknown class is not taken as a pass"});
        out.add(std::move(f));
        continue;
      }
      const auto stated = reinforced_at.find(part);
      const std::string problem =
          class_problem(pos, *cls, ovc3, stated != reinforced_at.end() ? stated->second : reinforced, v_high_V);
      if (problem.empty()) continue;
      out.add(part_finding(in, info(), part, info().default_severity,
                           fmt::format("{} ({}) sits {}: {}", ref_of(in, part), *cls, position_text(pos), problem)));
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_capacitor_class_rule() { return std::make_unique<CapacitorClass>(); }

}  // namespace mainscheck::rules
