#include "rules/unrecognised_parts.hpp"

#include <fmt/format.h>

#include <array>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

constexpr std::array<std::string_view, 8> kBlockRules{
    "creepage-clearance",    "discharge.stored-energy", "discharge.x-capacitor", "inrush-limit",
    "isolation",             "series-string",           "stress-unverified",     "surge-current.resistor",
};

// At most this many refs in the message; the parts list carries all of them.
constexpr std::size_t kMaxNamed = 12;

std::string ref_list(const CheckInput& in, const std::vector<std::size_t>& parts) {
  std::string out;
  for (std::size_t i = 0; i < parts.size() && i < kMaxNamed; ++i) out += (i ? ", " : "") + ref_of(in, parts[i]);
  if (parts.size() > kMaxNamed) out += fmt::format(" and {} more", parts.size() - kMaxNamed);
  return out;
}

class UnrecognisedParts final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "unrecognised-parts",
        "mains-connected parts that belong to no recognised front-end block: their per-part ratings are still "
        "checked, but the block rules (bleeders, droppers, multipliers, isolation, creepage pairs, formula "
        "cross-checks) did not run on them",
        Severity::warning,
        "the checker never presents an unchecked part as a pass (project rule): the block rules only check parts "
        "of a recognised block",
        {}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView&, FindingSink& out) const override {
    const auto& rec = in.recognition;
    if (!rec.unrecognised.empty()) {
      Finding f;
      f.severity = Severity::warning;
      f.message = fmt::format("{} mains-connected part{} in no recognised block: {}; the block rules ({}) did not "
                              "run on {}",
                              rec.unrecognised.size(), rec.unrecognised.size() == 1 ? "" : "s",
                              ref_list(in, rec.unrecognised), fmt::join(kBlockRules, ", "),
                              rec.unrecognised.size() == 1 ? "it" : "them");
      for (std::size_t p : rec.unrecognised) {
        f.parts.push_back(ref_of(in, p));
        if (f.parts.size() > 1)
          f.notes.push_back({in.devices().parts.at(p).loc, ref_of(in, p) + " is in no block"});
      }
      f.loc = in.devices().parts.at(rec.unrecognised.front()).loc;
      f.subject = "unrecognised";
      f.basis = info().basis;
      out.add(std::move(f));
    }
    if (!rec.references.empty()) {
      Finding f;
      f.severity = Severity::note;
      f.message = fmt::format("{} taken as simulator reference{} (at least 1 MΩ and the only tie between two parts "
                              "of the circuit): left out when recognising blocks, kept in the solved circuit",
                              ref_list(in, rec.references), rec.references.size() == 1 ? "" : "s");
      for (std::size_t p : rec.references) f.parts.push_back(ref_of(in, p));
      f.loc = in.devices().parts.at(rec.references.front()).loc;
      f.subject = "references";
      f.basis = info().basis;
      out.add(std::move(f));
    }
  }
};

}  // namespace

std::span<const std::string_view> block_rule_ids() { return kBlockRules; }

std::unique_ptr<Rule> make_unrecognised_parts_rule() { return std::make_unique<UnrecognisedParts>(); }

}  // namespace mainscheck::rules
