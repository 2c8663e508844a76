#include "rules/waivers.hpp"

#include <fmt/chrono.h>
#include <fmt/format.h>

#include <cstdlib>
#include <ctime>
#include "parser/netlist.hpp"
#include "rules/settings_xml.hpp"

namespace mainscheck::rules {

namespace {

// YYYY-MM-DD naming a day that exists in the proleptic Gregorian calendar (ISO 8601), so that
// 2026-02-30 is refused rather than waiving until some day nobody meant.
bool valid_date(const std::string& d) {
  if (d.size() != 10 || d[4] != '-' || d[7] != '-') return false;
  int fields[3] = {0, 0, 0};
  const std::size_t starts[3] = {0, 5, 8};
  const std::size_t lengths[3] = {4, 2, 2};
  for (int f = 0; f < 3; ++f) {
    for (std::size_t i = starts[f]; i < starts[f] + lengths[f]; ++i) {
      if (d[i] < '0' || d[i] > '9') return false;
      fields[f] = fields[f] * 10 + (d[i] - '0');
    }
  }
  const int year = fields[0], month = fields[1], day = fields[2];
  if (month < 1 || month > 12 || day < 1) return false;
  static constexpr int kDays[12] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  const bool leap = (year % 4 == 0 && year % 100 != 0) || year % 400 == 0;
  return day <= kDays[month - 1] + (month == 2 && leap ? 1 : 0);
}

// The justification is element text laid out for reading in the XML file; reports want it as one
// line, so runs of white space (indentation, line breaks) become one space and the ends are trimmed.
std::string one_line(const std::string& text) {
  std::string out;
  bool pending_space = false;
  for (const char c : text) {
    if (c == ' ' || c == '\t' || c == '\r' || c == '\n') {
      pending_space = !out.empty();
      continue;
    }
    if (pending_space) out += ' ';
    pending_space = false;
    out += c;
  }
  return out;
}

}  // namespace

std::string today_utc() {
  std::time_t t = std::time(nullptr);
  if (const char* epoch = std::getenv("SOURCE_DATE_EPOCH")) t = static_cast<std::time_t>(std::strtoll(epoch, nullptr, 10));
  return fmt::format("{:%Y-%m-%d}", fmt::gmtime(t));
}

std::vector<Waiver> read_waivers_text(const std::string& name, std::string text, parser::SourceManager& sm,
                                      parser::DiagnosticSink& diags) {
  std::vector<Waiver> out;
  pugi::xml_document doc;
  parser::FileId file = 0;
  const pugi::xml_node root =
      load_settings_xml(name, std::move(text), "mainscheck-waivers", "the waivers file", sm, diags, doc, file);
  if (!root) return out;
  for (const auto& n : root.children()) {
    if (n.type() != pugi::node_element) continue;
    const parser::SourceLoc loc = settings_loc(n, file);
    if (std::string(n.name()) != "waiver") {
      diags.error(loc, "unknown element <" + std::string(n.name()) + "> in the waivers file; expected <waiver>");
      continue;
    }
    Waiver w;
    w.loc = loc;
    w.rule_id = n.attribute("rule").as_string();
    w.part = n.attribute("part").as_string();
    w.block = n.attribute("block").as_string();
    w.reviewer = n.attribute("reviewer").as_string();
    w.justification = one_line(n.child_value());
    if (auto e = n.attribute("expires")) w.expires = e.as_string();
    std::string missing;
    if (w.rule_id.empty()) missing += " rule";
    if (w.part.empty() && w.block.empty()) missing += " part-or-block";
    if (w.reviewer.empty()) missing += " reviewer";
    if (w.justification.empty()) missing += " justification-text";
    if (!missing.empty()) {
      diags.error(loc, "waiver is missing:" + missing + " (a waiver names the rule, the part or block, the reviewer "
                       "and the justification)");
      continue;
    }
    if (w.expires && !valid_date(*w.expires)) {
      diags.error(loc, "waiver expiry '" + *w.expires + "' is not a calendar day of the form YYYY-MM-DD");
      continue;
    }
    out.push_back(std::move(w));
  }
  return out;
}

std::vector<Waiver> read_waivers_file(const std::string& path, parser::FileReader& files, parser::SourceManager& sm,
                                      parser::DiagnosticSink& diags) {
  std::string text;
  if (!read_settings_file(path, "waivers", files, diags, text)) return {};
  return read_waivers_text(path, std::move(text), sm, diags);
}

void apply_waivers(const std::vector<Waiver>& waivers, const std::string& today,
                   const std::vector<std::pair<std::string, std::string>>& block_kinds, std::vector<Finding>& findings) {
  auto kind_of = [&](const std::string& id) {
    for (const auto& [b, k] : block_kinds) {
      if (b == id) return k;
    }
    return std::string();
  };
  std::vector<Finding> extra;
  const std::size_t n_original = findings.size();
  for (const Waiver& w : waivers) {
    const bool expired = w.expires && *w.expires < today;  // ISO dates compare as text
    std::size_t matched = 0;
    for (std::size_t i = 0; i < n_original; ++i) {
      Finding& f = findings[i];
      if (f.rule_id != w.rule_id) continue;
      bool part_ok = w.part.empty();
      for (const auto& p : f.parts) part_ok = part_ok || parser::to_lower(p) == parser::to_lower(w.part);
      const bool block_ok = w.block.empty() || w.block == f.block || (!f.block.empty() && w.block == kind_of(f.block));
      if (!part_ok || !block_ok) continue;
      ++matched;
      if (!expired) {
        f.waived_by = fmt::format("{}{}: {}", w.reviewer, w.expires ? ", until " + *w.expires : std::string(),
                                  w.justification);
      }
    }
    const std::string target = w.part.empty() ? "block " + w.block : w.part;
    if (expired) {
      extra.push_back(Finding{"waiver.expired", Severity::warning,
                              fmt::format("waiver for {} on {} expired on {}; {} finding(s) no longer waived",
                                          w.rule_id, target, *w.expires, matched),
                              {}, "", w.loc, {}, std::nullopt, "waivers are reviewed acceptances with an end date",
                              "waiver:" + w.rule_id + ":" + target, std::nullopt});
    } else if (matched == 0) {
      extra.push_back(Finding{"waiver.unused", Severity::warning,
                              fmt::format("waiver for {} on {} matches no finding; remove it or correct it", w.rule_id,
                                          target),
                              {}, "", w.loc, {}, std::nullopt, "stale waivers must not pile up",
                              "waiver:" + w.rule_id + ":" + target, std::nullopt});
    }
  }
  for (auto& f : extra) findings.push_back(std::move(f));
}

}  // namespace mainscheck::rules
