#include "rules/safety/isolation.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <set>
#include <string_view>

#include "rules/rating_support.hpp"
#include "rules/safety/accessible_nets.hpp"
#include "rules/safety/barriers.hpp"

namespace mainscheck::rules {

namespace {

/// Kinds whose output is always at mains potential (docs/blocks.md).
bool never_isolated(std::string_view kind) {
  return kind == "capacitive-dropper" || kind == "resistive-dropper" || kind == "autotransformer" ||
         kind == "phase-control" || kind == "series-string";
}

/// Kinds that rectify or multiply whatever source feeds them.
bool rectifying(std::string_view kind) {
  return kind.find("rectifier") != std::string_view::npos || kind.find("doubler") != std::string_view::npos ||
         kind == "voltage-quadrupler" || kind == "cockcroft-walton";
}

bool fed_by_mains(const CheckInput& in, const analysis::Block& b) {
  return b.fed_by && *b.fed_by < in.recognition.ac_sources.size() &&
         in.recognition.ac_sources[*b.fed_by].origin == "mains";
}

class Isolation final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "isolation",
        "outputs not isolated from the mains, and accessible or SELV nets with a path to the mains",
        Severity::error,
        "a dropper, autotransformer, direct rectifier or phase control leaves its whole circuit at mains "
        "potential: no SELV claim, double or reinforced insulation from anything accessible "
        "(manufacturer guidance on transformerless supplies, common practice); SELV needs a barrier "
        "(IEC 61140)",
        {}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView&, FindingSink& out) const override {
    const auto connected = galvanic_mains_nets(in, OptoBarriers(in));
    for (const auto& b : in.recognition.blocks) {
      if (!never_isolated(b.kind) && !(rectifying(b.kind) && fed_by_mains(in, b))) continue;
      Finding f;
      f.rule_id = info().id;
      f.severity = Severity::note;
      f.block = b.id;
      f.subject = b.id;
      f.basis = info().basis;
      f.message = fmt::format("output of {} ({}) is not isolated from the mains: the whole circuit is at mains "
                              "potential and needs double or reinforced insulation from anything accessible",
                              b.id, b.kind);
      const auto members = b.parts();
      if (!members.empty()) {
        f.parts = {ref_of(in, members.front())};
        f.loc = in.devices().parts.at(members.front()).loc;
      }
      out.add(std::move(f));
    }
    for (std::size_t r : in.recognition.references) {
      const auto& nets = in.devices().parts.at(r).nets;
      if (nets.size() != 2 || connected.count(nets[0]) == connected.count(nets[1])) continue;
      Finding f;
      f.rule_id = info().id;
      f.severity = Severity::note;
      f.basis = info().basis;
      f.subject = "reference " + ref_of(in, r);
      f.parts = {ref_of(in, r)};
      f.loc = in.devices().parts.at(r).loc;
      f.message = fmt::format("{} joins a circuit to the mains side across its isolation: taken as a simulator "
                              "reference (at least 1 MΩ, the only tie), not as a conductive path; its current is "
                              "judged by energy-source-class",
                              ref_of(in, r));
      f.notes.push_back({f.loc, "in the product a resistor across an isolation barrier must be absent or rated to "
                                "bridge that insulation (IEC 62368-1 5.5.6, resistors bridging insulation; clause "
                                "number from memory)"});
      out.add(std::move(f));
    }
    for (parser::NetId net : accessible_nets(in)) {
      if (!connected.count(net)) continue;
      Finding f;
      f.rule_id = info().id;
      f.severity = info().default_severity;
      f.basis = info().basis;
      const std::string& name = in.devices().nets().at(net).name;
      f.subject = name;
      f.message = fmt::format("net {} is marked user-accessible or SELV but has no isolation barrier from the mains",
                              name);
      for (const auto& a : in.netlist.annotations)
        if (a.target_kind == "net" && a.target == name) f.loc = a.loc;
      f.notes.push_back({f.loc, "a galvanic path through parts joins it to line or neutral; only a transformer, "
                                "an optocoupler, a Y1 capacitor or a simulator reference is taken as a barrier"});
      out.add(std::move(f));
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_isolation_rule() { return std::make_unique<Isolation>(); }

}  // namespace mainscheck::rules
