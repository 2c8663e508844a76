#pragma once
// Waivers (`--waivers FILE`, docs/waivers.md): a reviewed acceptance of one rule's finding on one
// part or block, with justification, reviewer and an optional expiry date. Waived findings are
// still reported; expired and unused waivers are findings themselves so they cannot pile up.
#include <optional>
#include <string>
#include <vector>

#include "parser/diagnostics.hpp"
#include "parser/file_reader.hpp"
#include "parser/source_manager.hpp"
#include "rules/finding.hpp"

namespace mainscheck::rules {

/// One waiver entry.
struct Waiver {
  std::string rule_id;
  std::string part;     // part ref (case-insensitive), or empty
  std::string block;    // block id or kind, or empty; at least one of part and block is set
  std::string reviewer;
  std::string justification;
  std::optional<std::string> expires;  // YYYY-MM-DD, waiving up to and including that day
  parser::SourceLoc loc;
};

/// Reads a waivers file; malformed entries are located errors.
std::vector<Waiver> read_waivers_file(const std::string& path, parser::FileReader& files, parser::SourceManager& sm,
                                      parser::DiagnosticSink& diags);
std::vector<Waiver> read_waivers_text(const std::string& name, std::string text, parser::SourceManager& sm,
                                      parser::DiagnosticSink& diags);

/// Marks the findings each live waiver matches (by rule, and part ref or block id/kind), and appends
/// `waiver.expired` and `waiver.unused` findings. `today` is YYYY-MM-DD; `block_kinds` maps block id → kind.
void apply_waivers(const std::vector<Waiver>& waivers, const std::string& today,
                   const std::vector<std::pair<std::string, std::string>>& block_kinds, std::vector<Finding>& findings);

/// Today's date as YYYY-MM-DD (UTC), or the date of SOURCE_DATE_EPOCH when it is set.
std::string today_utc();

}  // namespace mainscheck::rules
