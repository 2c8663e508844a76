#include "rules/finding_groups.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <cctype>
#include <map>
#include <string>
#include <string_view>

namespace mainscheck::rules {

namespace {

bool ref_char(char c) {
  return std::isalnum(static_cast<unsigned char>(c)) || c == '_' || c == '.';
}

// `text` with every whole-word occurrence of `ref` replaced by a marker ("RLP1" but not "RLP10").
std::string without_ref(std::string_view text, std::string_view ref) {
  std::string out;
  std::size_t from = 0;
  while (true) {
    const std::size_t at = text.find(ref, from);
    if (at == std::string_view::npos || ref.empty()) break;
    const std::size_t end = at + ref.size();
    const bool whole = (at == 0 || !ref_char(text[at - 1])) &&
                       (end == text.size() || !ref_char(text[end]) ||
                        (text[end] == '.' && (end + 1 == text.size() || !ref_char(text[end + 1]))));
    out.append(text.substr(from, at - from));
    out += whole ? std::string("\x1e") : std::string(ref);
    from = end;
  }
  out.append(text.substr(from));
  return out;
}

// Everything that must be equal for two findings to be one, with the part taken out; empty when the
// finding is not about exactly one part (then it is never merged).
std::string group_key(const Finding& f) {
  if (f.parts.size() != 1 || (!f.subject.empty() && f.subject != f.parts.front())) return {};
  const std::string& ref = f.parts.front();
  std::string key = fmt::format("{}\x1f{}\x1f{}\x1f{}\x1f{}\x1f{}", f.rule_id, static_cast<int>(f.severity),
                                f.block, f.waived_by.value_or("-"), f.basis, without_ref(f.message, ref));
  if (f.measurement) {
    const Measurement& m = *f.measurement;
    // Six significant digits (reports show three): equal parts in series differ only by the solver's
    // rounding, parts with another stress differ long before the sixth digit.
    key +=
        fmt::format("\x1f{}\x1f{:.6g}\x1f{:.6g}\x1f{}\x1f{}", m.quantity, m.value, m.limit, m.unit, m.corner);
  }
  for (const auto& n : f.notes) key += "\x1f" + without_ref(n.message, ref);
  return key;
}

}  // namespace

void group_identical_findings(std::vector<Finding>& findings) {
  std::map<std::string, std::size_t> first_of;  // key → index in `kept`
  std::vector<Finding> kept;
  std::vector<std::vector<const Finding*>> merged;  // per kept finding, the ones folded into it
  kept.reserve(findings.size());
  for (Finding& f : findings) {
    const std::string key = group_key(f);
    if (!key.empty()) {
      if (auto it = first_of.find(key); it != first_of.end()) {
        merged[it->second].push_back(&f);
        continue;
      }
      first_of.emplace(key, kept.size());
    }
    kept.push_back(f);
    merged.emplace_back();
  }
  for (std::size_t k = 0; k < kept.size(); ++k) {
    if (merged[k].empty()) continue;
    Finding& g = kept[k];
    std::vector<std::string> others;
    for (const Finding* m : merged[k]) {
      others.push_back(m->parts.front());
      g.parts.push_back(m->parts.front());
      g.notes.push_back({m->loc, fmt::format("{}: the same finding", m->parts.front())});
    }
    g.message += fmt::format("; the same on {}", fmt::join(others, ", "));
  }
  findings = std::move(kept);
}

}  // namespace mainscheck::rules
