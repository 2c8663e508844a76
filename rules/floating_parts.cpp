#include "rules/floating_parts.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <map>
#include <vector>

#include "analysis/disjoint_sets.hpp"
#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using parser::NetId;
using parser::PartKind;

// At most this many refs in a message; the parts list carries all of them.
constexpr std::size_t kMaxNamed = 12;

/// Groups of parts that share no net, coupling or control with a source, ground or a mains conductor.
std::vector<std::vector<std::size_t>> floating_groups(const CheckInput& in) {
  const auto& nl = in.devices();
  analysis::DisjointSets<NetId> sets(nl.nets().size());
  std::vector<bool> anchored_root(nl.nets().size(), false);
  std::vector<NetId> anchors{parser::kGroundNet};
  const auto& supply = in.recognition.supply;
  for (const auto& n : {supply.line, supply.neutral, supply.earth})
    if (n) anchors.push_back(*n);
  // A part joins all its pins; a coupling joins its windings, a controlled source its control.
  auto first_net = [&](std::string_view ref) -> std::optional<NetId> {
    const auto* p = nl.find_part(ref);
    if (!p || p->nets.empty()) return std::nullopt;
    return p->nets.front();
  };
  for (const auto& p : nl.parts) {
    std::vector<NetId> joined = p.nets;
    for (const auto& ctl : p.controls)
      if (const auto n = first_net(ctl)) joined.push_back(*n);
    if (joined.empty()) continue;
    for (NetId n : joined) sets.unite(joined.front(), n);
    if (p.kind == PartKind::vsource || p.kind == PartKind::isource) anchors.push_back(joined.front());
  }
  for (NetId a : anchors) anchored_root[sets.find(a)] = true;
  std::map<NetId, std::vector<std::size_t>> groups;
  for (std::size_t i = 0; i < nl.parts.size(); ++i) {
    const auto& p = nl.parts[i];
    if (p.nets.empty()) continue;  // a coupling, or a reference the skeleton left out
    const NetId root = sets.find(p.nets.front());
    if (!anchored_root[root]) groups[root].push_back(i);
  }
  std::vector<std::vector<std::size_t>> out;
  for (auto& [root, parts] : groups) out.push_back(std::move(parts));
  return out;
}

class FloatingParts final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "floating-parts",
        "parts joined to nothing else of the circuit (no source, no ground, no mains conductor, no "
        "coupling): "
        "the solver sees them at no voltage, so none of their ratings is checked",
        Severity::warning,
        "the checker never presents an unchecked part as a pass (project rule); a part on no closed circuit "
        "is usually a drawing error (a misspelt net name, a pin left unconnected)",
        {}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView&, FindingSink& out) const override {
    for (const auto& group : floating_groups(in)) {
      Finding f;
      f.severity = info().default_severity;
      std::string names;
      for (std::size_t k = 0; k < group.size() && k < kMaxNamed; ++k)
        names += (k ? ", " : "") + ref_of(in, group[k]);
      if (group.size() > kMaxNamed) names += fmt::format(" and {} more", group.size() - kMaxNamed);
      // Seen by net id, not by searching the list: a floating group can hold a million parts.
      std::vector<std::string> nets;
      std::vector<bool> listed(in.devices().nets().size(), false);
      for (std::size_t p : group)
        for (NetId n : in.devices().parts[p].nets) {
          if (listed[n]) continue;
          listed[n] = true;
          nets.push_back(in.devices().net(n).name);
        }
      f.message = fmt::format(
          "{} {} joined to nothing else of the circuit (nets {}: no source, ground, mains "
          "conductor or coupling reaches them): not solved at any voltage, no rating of {} "
          "was checked",
          names, group.size() == 1 ? "is" : "are", fmt::join(nets, ", "), group.size() == 1 ? "it" : "them");
      for (std::size_t p : group) f.parts.push_back(ref_of(in, p));
      f.loc = in.devices().parts[group.front()].loc;
      f.subject = "floating " + f.parts.front();
      f.basis = info().basis;
      f.notes.push_back({f.loc, "check the net names and the pins of these parts against the schematic"});
      out.add(std::move(f));
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_floating_parts_rule() {
  return std::make_unique<FloatingParts>();
}

}  // namespace mainscheck::rules
