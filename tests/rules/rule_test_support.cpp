#include "rule_test_support.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <iterator>

#include "analysis/stress_engine.hpp"
#include "analysis/supply.hpp"
#include "parser/file_reader.hpp"
#include "parser/readers.hpp"
#include "rules/engine.hpp"

namespace mainscheck::rules::testing {

RuleBench::RuleBench(std::string deck) {
  parser::MemoryFileReader files;
  parser::ReadOptions options;
  options.confine_includes = false;
  nl = parser::read_spice_text("deck.cir", std::move(deck), files, sm, diags, options);
  build_mains_source();
  rec = analysis::recognise(nl, {}, nullptr, diags);
  analysis::SupplyRating r;
  if (rec.supply.mains) {
    r.v_nominal_V = rec.supply.mains->v_nominal_V;
    r.v_min_V = rec.supply.mains->v_min_V;
    r.v_max_V = rec.supply.mains->v_max_V;
    r.f_nominal_Hz = rec.supply.mains->f_nominal_Hz;
    r.f_min_Hz = rec.supply.mains->f_min_Hz;
    r.f_max_Hz = rec.supply.mains->f_max_Hz;
  }
  plan = analysis::plan_corners(r, analysis::CornerOptions{});
}

void RuleBench::build_mains_source() {
  // The mains source is built here from the deck's `*@supply` annotation (nominal r.m.s. and frequency)
  // rather than taken from the reader's SIN() parse, so the end-to-end cases depend only on the
  // solver and the rules.
  double v_rms = 0, f_Hz = 0;
  for (const auto& a : nl.annotations) {
    if (a.target_kind != "supply") continue;
    auto m = a.attrs.find("mains");
    if (m == a.attrs.end()) continue;
    if (auto spec = analysis::parse_mains_spec(m->second).spec) {
      v_rms = spec->v_nominal_V.value_or(0);
      f_Hz = spec->f_nominal_Hz.value_or(0);
    }
  }
  if (v_rms <= 0 || f_Hz <= 0) return;
  for (auto& p : nl.parts) {
    if (p.kind != parser::PartKind::vsource || !p.source || !p.source->waveform) continue;
    p.source->waveform->kind = "sin";
    p.source->waveform->args = {0.0, std::sqrt(2.0) * v_rms, f_Hz};
  }
}

std::size_t RuleBench::part(const std::string& ref) const {
  auto i = rec.devices.find_part_index(ref);
  EXPECT_TRUE(i.has_value()) << "no part " << ref << "\n" << rendered();
  return i.value_or(0);
}

void RuleBench::ensure_blocks() {
  if (stress.blocks.size() == rec.blocks.size()) return;
  stress.blocks.clear();
  for (std::size_t b = 0; b < rec.blocks.size(); ++b) stress.blocks.push_back(analysis::BlockStress{b, true, "", {}, {}});
}

void RuleBench::set(const std::string& ref, analysis::Quantity q, double value, const std::string& corner) {
  ensure_blocks();
  const std::size_t p = part(ref);
  auto it = std::find_if(stress.parts.begin(), stress.parts.end(), [&](const auto& s) { return s.part == p; });
  if (it == stress.parts.end()) {
    stress.parts.push_back(analysis::PartStress{p, {}});
    std::sort(stress.parts.begin(), stress.parts.end(), [](const auto& a, const auto& b) { return a.part < b.part; });
    it = std::find_if(stress.parts.begin(), stress.parts.end(), [&](const auto& s) { return s.part == p; });
  }
  it->values[q] = analysis::StressValue{value, corner, "solver", {}};
}

void RuleBench::set_inrush(const std::string& ref, double i_peak_A, double i2t_A2s, const std::string& corner) {
  ensure_blocks();
  if (!stress.inrush) stress.inrush = analysis::InrushStress{0, 0, corner, "", {}, {}};
  stress.inrush->per_part[part(ref)] = {i_peak_A, i2t_A2s};
  stress.inrush->i_peak_A = std::max(stress.inrush->i_peak_A, i_peak_A);
}

void RuleBench::solve() { stress = analysis::compute_stresses(rec, plan); }

void RuleBench::option(const std::string& key, const std::string& value) { policy.options[key] = {value, {}}; }

std::vector<Finding> RuleBench::run(const std::string& rule_id) const {
  CheckInput in{nl, rec, stress, &plan, &sm};
  std::vector<Finding> out;
  for (auto& f : run_rules(in, policy))
    if (f.rule_id == rule_id) out.push_back(std::move(f));
  return out;
}

std::vector<RatingCheck> RuleBench::ratings(const std::string& rule_id) const {
  CheckInput in{nl, rec, stress, &plan, &sm};
  std::vector<RatingCheck> out;
  for (auto& c : run_rule_set(in, policy).ratings)
    if (c.rule_id == rule_id) out.push_back(std::move(c));
  return out;
}

std::string RuleBench::rendered() const {
  std::string out;
  for (const auto& d : diags.diagnostics()) out += parser::render_diagnostic(d, sm);
  return out;
}

std::string triac_deck(const std::string& triac_attrs, const std::string& r_load) {
  return "triac dimmer\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=0\n"
         "VMAINS L 0 SIN(0 325.27 50)\n"
         "*@part RLOAD type=lamp p_rated=100 v_rated=230\n"
         "RLOAD L MT2 " + r_load + "\n"
         "*@part RPOT p_rated=0.25 v_rated=500\n"
         "RPOT MT2 T1 150k\n"
         "*@part RT1 p_rated=0.25 v_rated=500\n"
         "RT1 T1 TIM 3.3k\n"
         "*@part CT1 v_rated_ac=250 class=X2\n"
         "CT1 TIM 0 100n\n"
         "*@part XD1 type=diac\n"
         "XD1 TIM G DIAC_HL\n"
         "*@part XT1 type=triac " + triac_attrs + "\n"
         "XT1 MT2 G 0 TRIAC_HL\n"
         ".subckt TRIAC_HL MT2 G MT1\n"
         "RMG MT2 G 10Meg\n"
         "RGK G MT1 100\n"
         "S1 MT2 MT1 G MT1 STRIAC\n"
         ".model STRIAC SW(VT=1 VH=0.5 RON=0.5 ROFF=1e7)\n"
         ".ends TRIAC_HL\n"
         ".subckt DIAC_HL A B\n"
         "S1 A B A B SDIAC\n"
         ".model SDIAC SW(VT=32 VH=24 RON=20 ROFF=1e9)\n"
         ".ends DIAC_HL\n"
         ".end\n";
}

Finding only(const std::vector<Finding>& findings) {
  EXPECT_EQ(findings.size(), 1u);
  if (findings.size() > 1)
    for (const auto& f : findings) ADD_FAILURE() << "finding: " << f.message;
  if (findings.empty()) return Finding{};
  return findings.front();
}

std::string transformer_supply_deck(const std::string& title, const std::string& extra, const std::string& ls,
                                    const std::string& r_load) {
  return title + "\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RF1 type=fuse i_rated=0.5\n"
         "RF1 L LF 0.2\n"
         "LP1 LF N 4\n"
         "LS1 SA SB " + ls + "\n"
         "K1 LP1 LS1 0.998\n"
         "RLA SA SB " + r_load + "\n"
         "RREF SB 0 1meg\n"
         "RNREF N 0 1G\n" + extra + ".end\n";
}

std::string heater_only_deck() {
  return "heater only\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RF1 type=fuse i_rated=10\n"
         "RF1 L LF 0.05\n"
         "*@part RH type=heater p_rated=2000\n"
         "RH LF N 26.5\n"
         ".end\n";
}

std::vector<Finding> of_severity(const std::vector<Finding>& findings, Severity s) {
  std::vector<Finding> out;
  std::copy_if(findings.begin(), findings.end(), std::back_inserter(out), [s](const Finding& f) { return f.severity == s; });
  return out;
}

std::vector<Finding> without_notes(const std::vector<Finding>& findings) {
  std::vector<Finding> out;
  std::copy_if(findings.begin(), findings.end(), std::back_inserter(out),
               [](const Finding& f) { return f.severity != Severity::note; });
  return out;
}

std::optional<Finding> with_subject(const std::vector<Finding>& findings, const std::string& subject) {
  for (const auto& f : findings)
    if (f.subject == subject) return f;
  return std::nullopt;
}

}  // namespace mainscheck::rules::testing
