#include "rules/safety/touch_current.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <deque>
#include <map>
#include <numbers>
#include <set>

#include "rules/rating_support.hpp"
#include "rules/safety/accessible_nets.hpp"
#include "rules/safety/mains_topology.hpp"

namespace mainscheck::rules {

namespace {

/// Mains sides as seen at the capacitors: the line and neutral nets and everything reached through
/// the series parts of the protection block (fuse, choke, switch).
struct Sides {
  std::set<parser::NetId> line, neutral;
};

Sides mains_sides(const CheckInput& in) {
  Sides s;
  const auto& sup = in.recognition.supply;
  if (sup.line) s.line.insert(*sup.line);
  if (sup.neutral) s.neutral.insert(*sup.neutral);
  const auto& parts = in.devices().parts;
  // Grow each side through two-terminal series parts that do not change the voltage (docs/blocks.md).
  auto passes = [&](std::size_t i) {
    using T = analysis::FrontEndType;
    const T t = in.info(i).type;
    return parts[i].nets.size() == 2 &&
           (t == T::fuse || t == T::fusible_resistor || t == T::ntc || t == T::ptc || t == T::inductor ||
            t == T::common_mode_choke || t == T::switch_);
  };
  for (auto* side : {&s.line, &s.neutral}) {
    std::deque<parser::NetId> todo(side->begin(), side->end());
    while (!todo.empty()) {
      const parser::NetId n = todo.front();
      todo.pop_front();
      for (const std::size_t i : in.graph().parts_on(n)) {
        if (!passes(i)) continue;
        for (const parser::NetId m : parts[i].nets)
          if (side->insert(m).second) todo.push_back(m);
      }
    }
  }
  std::set<parser::NetId> both;
  std::set_intersection(s.line.begin(), s.line.end(), s.neutral.begin(), s.neutral.end(), std::inserter(both, both.end()));
  for (auto n : both) {
    s.line.erase(n);
    s.neutral.erase(n);
  }
  return s;
}

class TouchCurrent final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "touch-current",
        "touch current through capacitors from the mains to protective earth or to an accessible net",
        Severity::error,
        "I = 2πfCV with the capacitors on the live conductor at the highest line voltage and frequency "
        "(capacitor reactance, textbook; derived); limits after IEC 62368-1 table 4 and 5.7",
        {{"limit-class-1", 5e-3, "A",
          "class I (capacitors to protective earth, earth open): ES2 current 5 mA r.m.s., IEC 62368-1 Table 4 "
          "and 5.7 (from memory)"},
         {"limit-accessible", 0.5e-3, "A",
          "accessible net (class II enclosure, unearthed part): ES1 current 0.5 mA r.m.s., IEC 62368-1 Table 4 "
          "(its application to class II enclosures from memory)"},
         {"c-tolerance", 0.2, "",
          "upper capacitance tolerance used when a capacitor states no tol=: +20 % typical ceramic Y "
          "(from memory)"}},
        {{analysis::FrontEndType::capacitor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto worst = worst_supply_for_leakage(in);
    if (!worst) return;
    const Sides sides = mains_sides(in);
    const auto& sup = in.recognition.supply;
    if (sup.earth) check_target(in, opts, *worst, sides, *sup.earth, "protective earth", opts.number("limit-class-1"), out);
    for (parser::NetId net : accessible_nets(in)) {
      if (sup.earth && net == *sup.earth) continue;
      check_target(in, opts, *worst, sides, net, "accessible net " + in.devices().nets().at(net).name,
                   opts.number("limit-accessible"), out);
    }
  }

 private:
  void check_target(const CheckInput& in, const OptionsView& opts, const SupplyWorst& w, const Sides& sides,
                    parser::NetId target, const std::string& what, double limit_A, FindingSink& out) const {
    const auto& parts = in.devices().parts;
    double c_line_F = 0, c_neutral_F = 0;
    std::vector<std::size_t> caps_line, caps_neutral;
    for (std::size_t i = 0; i < parts.size(); ++i) {
      if (in.info(i).type != analysis::FrontEndType::capacitor || parts[i].nets.size() != 2 || !parts[i].value) continue;
      const auto a = parts[i].nets[0], b = parts[i].nets[1];
      const parser::NetId other = a == target ? b : (b == target ? a : target);
      if (other == target) continue;
      const auto tol = in.info(i).number("tol");
      const double c_F = *parts[i].value * (1.0 + (tol ? *tol : opts.number("c-tolerance")));
      if (sides.line.count(other)) {
        c_line_F += c_F;
        caps_line.push_back(i);
      } else if (sides.neutral.count(other)) {
        c_neutral_F += c_F;
        caps_neutral.push_back(i);
      }
    }
    if (caps_line.empty() && caps_neutral.empty()) return;
    // With a non-polarised plug either conductor may be live; the capacitors on the live one carry the
    // current at full line voltage, those on the other conductor sit near zero (safety-data.md 2.6).
    const bool line_worst = c_line_F >= c_neutral_F;
    const double c_F = line_worst ? c_line_F : c_neutral_F;
    const auto& caps = line_worst ? caps_line : caps_neutral;
    const double i_A = 2 * std::numbers::pi * w.f_Hz * c_F * w.v_rms_V;
    // Within the limit the value is still reported, as a note: a reviewer signs the figure, and a
    // silent rule cannot be told from one that found no capacitor.
    const bool above = i_A > limit_A;
    Finding f = part_finding(in, info(), caps.front(), above ? info().default_severity : Severity::note,
                             fmt::format("touch current to {} through {} ({} with tolerance) is {}, {} the limit of {}",
                                         what, fmt::join(refs(in, caps), ", "), format_si(c_F, "F"),
                                         format_si(i_A, "A"), above ? "above" : "within", format_si(limit_A, "A")));
    f.parts = refs(in, caps);
    f.subject = what;
    f.measurement = Measurement{"i_touch", i_A, limit_A, "A", w.corner};
    f.notes.push_back({f.loc, fmt::format("I = 2πfCV at {} and {}", format_si(w.v_rms_V, "V"),
                                          format_si(w.f_Hz, "Hz"))});
    f.notes.push_back({f.loc, "add other leakage (EMI filter modules, transformer inter-winding capacitance); "
                              "the product standard and its IEC 60990 measurement decide"});
    out.add(std::move(f));
  }

  static std::vector<std::string> refs(const CheckInput& in, const std::vector<std::size_t>& parts) {
    std::vector<std::string> r;
    for (auto p : parts) r.push_back(ref_of(in, p));
    return r;
  }
};

}  // namespace

std::unique_ptr<Rule> make_touch_current_rule() { return std::make_unique<TouchCurrent>(); }

}  // namespace mainscheck::rules
