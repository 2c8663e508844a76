#include "rules/safety/varistor.hpp"

#include <fmt/format.h>

#include <algorithm>

#include "rules/rating_support.hpp"
#include "rules/safety/accessible_nets.hpp"
#include "rules/safety/mains_topology.hpp"

namespace mainscheck::rules {

namespace {

bool touches(const parser::Part& p, parser::NetId net) {
  return std::find(p.nets.begin(), p.nets.end(), net) != p.nets.end();
}

class Varistor final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "varistor",
        "mains varistors after the fuse, not to accessible parts, with thermal protection",
        Severity::error,
        "placement after the fuse, which must clear a shorted varistor, and thermal protection against "
        "end-of-life overheating (manufacturer guidance, common practice; the placement from memory); not "
        "between mains and accessible parts (IEC 60065 14.12); mains-to-earth varistors normally in series "
        "with a GDT (IEC TC108 position for IEC 60950-1 / IEC 62368-1, varistors to IEC 61051-2)",
        {},
        {{analysis::FrontEndType::varistor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView&, FindingSink& out) const override {
    const auto& sup = in.recognition.supply;
    const auto& parts = in.devices().parts;
    std::optional<UnfusedStretch> line;
    if (sup.line) line = unfused_stretch(in, *sup.line);
    const auto accessible = accessible_nets(in);
    for (std::size_t i = 0; i < parts.size(); ++i) {
      if (in.info(i).type != analysis::FrontEndType::varistor) continue;
      const std::string& ref = ref_of(in, i);
      const bool ahead = line && std::any_of(line->nets.begin(), line->nets.end(),
                                             [&](parser::NetId n) { return touches(parts[i], n); });
      if (ahead && !line->fuses.empty()) {
        out.add(part_finding(in, info(), i, info().default_severity,
                             fmt::format("{} sits ahead of fuse {}: a varistor failing short would not be cleared",
                                         ref, ref_of(in, line->fuses.front()))));
      } else if (line && line->fuses.empty()) {
        out.add(part_finding(in, info(), i, info().default_severity,
                             fmt::format("no fuse in the line conductor clears {} when it fails short", ref)));
      }
      for (parser::NetId n : accessible) {
        if (!touches(parts[i], n)) continue;
        out.add(part_finding(in, info(), i, info().default_severity,
                             fmt::format("{} joins the mains to accessible net {}; a varistor is not allowed there "
                                         "(IEC 60065 14.12)",
                                         ref, in.devices().nets().at(n).name)));
      }
      if (sup.earth && touches(parts[i], *sup.earth)) {
        Finding f = part_finding(in, info(), i, Severity::warning,
                                 fmt::format("{} connects the mains to protective earth; use a gas discharge tube in "
                                             "series and a higher varistor voltage than line to neutral",
                                             ref));
        f.notes.push_back({f.loc, "earth faults raise the line-to-earth voltage; remove it for hi-pot tests "
                                  "(IEC TC108 position; manufacturer guidance, common practice)"});
        out.add(std::move(f));
      }
      Finding note = part_finding(in, info(), i, Severity::note,
                                  fmt::format("{}: use a thermally protected varistor or a thermal fuse in thermal "
                                              "contact, and check that the fuse clears a shorted varistor",
                                              ref));
      note.subject = ref + "/thermal";
      out.add(std::move(note));
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_varistor_rule() { return std::make_unique<Varistor>(); }

}  // namespace mainscheck::rules
