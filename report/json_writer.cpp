#include "report/json_writer.hpp"

#include "report/batch_summary.hpp"
#include "report/fingerprint.hpp"
#include "report/rating_table.hpp"

namespace mainscheck::report {

namespace {

using analysis::Quantity;

Json opt_number(const std::optional<double>& v) { return v ? number_json(*v) : Json(nullptr); }

Json stress_value(const std::optional<analysis::StressValue>& v) { return v ? number_json(v->value) : Json(nullptr); }

Json supply_json(const CheckReport& r) {
  const auto& rec = *r.recognition;
  const auto& s = rec.supply;
  auto net = [&](const std::optional<parser::NetId>& n) { return n ? Json(rec.devices.net(*n).name) : Json(nullptr); };
  Json j;
  j["line"] = net(s.line);
  j["neutral"] = net(s.neutral);
  j["earth"] = net(s.earth);
  j["v_rms"] = s.mains ? opt_number(s.mains->v_nominal_V) : Json(nullptr);
  j["v_rms_min"] = s.mains ? opt_number(s.mains->v_min_V) : Json(nullptr);
  j["v_rms_max"] = s.mains ? opt_number(s.mains->v_max_V) : Json(nullptr);
  j["f_hz"] = s.mains ? opt_number(s.mains->f_nominal_Hz) : Json(nullptr);
  j["f_hz_min"] = s.mains ? opt_number(s.mains->f_min_Hz) : Json(nullptr);
  j["f_hz_max"] = s.mains ? opt_number(s.mains->f_max_Hz) : Json(nullptr);
  j["from"] = s.mains_from.what;
  j["from_location"] = r.sources ? location_json(s.mains_from.loc, *r.sources) : Json(nullptr);
  const analysis::StressResult* st = r.stress;
  j["i_rms"] = st ? stress_value(st->supply.i_rms) : Json(nullptr);
  j["i_peak"] = st ? stress_value(st->supply.i_peak) : Json(nullptr);
  j["power_factor"] = st ? opt_number(st->supply.power_factor) : Json(nullptr);
  return j;
}

Json block_json(const CheckReport& r, std::size_t bi) {
  const auto& rec = *r.recognition;
  const analysis::Block& b = rec.blocks[bi];
  const auto ref = [&](std::size_t p) { return rec.devices.parts[p].ref; };
  Json j;
  j["id"] = b.id;
  j["kind"] = b.kind;
  j["variant"] = b.variant.empty() ? Json(nullptr) : Json(b.variant);
  Json parts = Json::array();
  for (std::size_t p : b.parts()) parts.push_back(ref(p));
  j["parts"] = std::move(parts);
  Json roles = Json::object();
  for (const auto& [role, members] : b.roles) {
    Json list = Json::array();
    for (std::size_t p : members) list.push_back(ref(p));
    roles[role] = std::move(list);
  }
  j["roles"] = std::move(roles);
  Json input = Json::array();
  for (auto n : b.inputs) input.push_back(rec.devices.net(n).name);
  j["input"] = std::move(input);
  const analysis::BlockStress* bs = nullptr;
  if (r.stress != nullptr) {
    for (const auto& s : r.stress->blocks) {
      if (s.block == bi) bs = &s;
    }
  }
  Json outputs = Json::array();
  for (const auto& o : b.outputs) {
    Json jo;
    jo["net"] = rec.devices.net(o.net).name;
    jo["return"] = rec.devices.net(o.ret).name;
    if (o.ac) jo["ac"] = true;
    jo["v_dc"] = nullptr;
    jo["v_ripple_pp"] = nullptr;
    jo["v_rms"] = nullptr;
    if (bs != nullptr) {
      for (const auto& os : bs->outputs) {
        if (os.net == o.net && os.ret == o.ret) {
          jo["v_dc"] = stress_value(os.v_dc);
          jo["v_ripple_pp"] = stress_value(os.v_ripple_pp);
          jo["v_rms"] = stress_value(os.v_rms);
        }
      }
    }
    outputs.push_back(std::move(jo));
  }
  j["outputs"] = std::move(outputs);
  Json figures = Json::object();
  for (const auto& [k, v] : b.figures) figures[k] = number_json(v);
  j["figures"] = std::move(figures);
  if (bs != nullptr) {
    j["converged"] = bs->converged;
    if (!bs->converged) j["failure"] = bs->failure;
  }
  return j;
}

Json ratings_json(const CheckReport& r, std::size_t part) {
  Json arr = Json::array();
  for (const rules::RatingCheck* c : ratings_of(r, part)) {
    arr.push_back(Json{{"quantity", c->quantity},
                       {"rated", opt_number(c->rated)},
                       {"source", c->source.empty() ? Json(nullptr) : Json(c->source)},
                       {"limit", opt_number(c->limit())},
                       {"stress", opt_number(c->stress)},
                       {"corner", c->corner.empty() ? Json(nullptr) : Json(c->corner)},
                       {"margin", opt_number(c->margin())},
                       {"verdict", rating_verdict_name(shown_verdict(r, *c))},
                       {"unit", c->unit},
                       {"rule", c->rule_id}});
  }
  return arr;
}

Json parts_json(const CheckReport& r) {
  Json arr = Json::array();
  if (r.stress == nullptr) return arr;
  const auto& devs = r.recognition->devices;
  for (std::size_t part : reviewed_parts(r)) {
    const parser::Part& p = devs.parts[part];
    const analysis::PartStress* ps = r.stress->find(part);  // null for a block member the solver left out
    Json j;
    j["ref"] = p.ref;
    j["kind"] = std::string(analysis::front_end_type_name(r.recognition->info.type(part)));
    Json stress = Json::object();
    Json corners = Json::object();
    for (Quantity q : analysis::kAllQuantities) {
      const analysis::StressValue* v = ps ? ps->get(q) : nullptr;
      stress[analysis::quantity_name(q)] = v ? number_json(v->value) : Json(nullptr);
      if (v) corners[analysis::quantity_name(q)] = v->corner;
    }
    j["stress"] = std::move(stress);
    // "corner": where the part's voltage stress is worst; "corners" gives it per quantity.
    const analysis::StressValue* primary = ps ? ps->get(Quantity::v_peak) : nullptr;
    j["corner"] = primary ? Json(primary->corner) : Json(nullptr);
    j["corners"] = std::move(corners);
    j["location"] = r.sources ? location_json(p.loc, *r.sources) : Json(nullptr);
    j["ratings"] = ratings_json(r, part);
    arr.push_back(std::move(j));
  }
  return arr;
}

Json finding_json(const CheckReport& r, const rules::Finding& f) {
  Json j;
  j["rule"] = f.rule_id;
  j["severity"] = parser::severity_name(f.severity);
  j["message"] = f.message;
  j["parts"] = f.parts;
  j["block"] = f.block.empty() ? Json(nullptr) : Json(f.block);
  j["location"] = r.sources ? location_json(f.loc, *r.sources) : Json(nullptr);
  if (f.measurement) {
    const auto& m = *f.measurement;
    j["measured"] = Json{{"quantity", m.quantity}, {"value", number_json(m.value)}, {"limit", number_json(m.limit)},
                         {"unit", m.unit},         {"margin", number_json(m.margin())},
                         {"corner", m.corner.empty() ? Json(nullptr) : Json(m.corner)}};
  } else {
    j["measured"] = nullptr;
  }
  j["basis"] = f.basis;
  j["fingerprint"] = finding_fingerprint(f);
  j["waived"] = f.waived_by ? Json(*f.waived_by) : Json(nullptr);
  Json notes = Json::array();
  for (const auto& n : f.notes) notes.push_back(n.message);
  j["notes"] = std::move(notes);
  return j;
}

}  // namespace

Json check_to_json_value(const CheckReport& r) {
  Json root;
  root["schema"] = kReportSchema;
  root["file"] = r.file;
  root["status"] = r.status == CheckStatus::complete      ? "complete"
                   : r.status == CheckStatus::input_error ? "input-error"
                                                          : "analysis-failed";
  root["failure"] = r.failure.empty() ? Json(nullptr) : Json(r.failure);
  if (r.recognition != nullptr) {
    root["supply"] = supply_json(r);
    Json corners = Json::array();
    if (r.corners != nullptr) {
      for (const auto& c : r.corners->corners) {
        corners.push_back(Json{{"name", c.name}, {"v_rms", number_json(c.v_rms_V)}, {"f_hz", number_json(c.f_Hz)}});
      }
    }
    root["corners"] = std::move(corners);
    Json blocks = Json::array();
    for (std::size_t i = 0; i < r.recognition->blocks.size(); ++i) blocks.push_back(block_json(r, i));
    root["blocks"] = std::move(blocks);
    Json unrec = Json::array();
    for (std::size_t p : r.recognition->unrecognised) unrec.push_back(r.recognition->devices.parts[p].ref);
    root["unrecognised"] = std::move(unrec);
    root["parts"] = parts_json(r);
    root["assumptions"] = r.stress ? Json(r.stress->assumptions) : Json::array();
    if (r.stress != nullptr && r.stress->inrush) {
      root["inrush"] = Json{{"i_peak", number_json(r.stress->inrush->i_peak_A)},
                            {"i2t", number_json(r.stress->inrush->i2t_A2s)},
                            {"corner", r.stress->inrush->corner},
                            {"instant", r.stress->inrush->instant}};
    } else {
      root["inrush"] = nullptr;
    }
  }
  Json findings = Json::array();
  for (const auto& f : r.findings) findings.push_back(finding_json(r, f));
  root["findings"] = std::move(findings);
  root["diagnostics"] = (r.diagnostics && r.sources) ? diagnostics_json(*r.diagnostics, *r.sources) : Json::array();
  const FindingCounts c = count_findings(r.findings);
  root["summary"] = Json{{"errors", c.errors},   {"warnings", c.warnings},
                         {"notes", c.notes},     {"waived", c.waived},
                         {"baseline_matched", r.baseline_matched}};
  root["caution"] = kSafetyCaution;
  return root;
}

std::string check_to_json(const CheckReport& r) { return dump_json(check_to_json_value(r)); }

namespace {

Json batch_row_json(const BatchRow& row) {
  return Json{{"file", row.file},
              {"errors", row.counts.errors},
              {"warnings", row.counts.warnings},
              {"notes", row.counts.notes},
              {"verdict", verdict_name(row.verdict)},
              {"time_s", row.elapsed_s < 0 ? Json(nullptr) : number_json(row.elapsed_s)}};
}

}  // namespace

std::string checks_to_json(const std::vector<const CheckReport*>& reports) {
  if (reports.size() == 1) return check_to_json(*reports.front());
  Json batch;
  batch["schema"] = "mainscheck-batch/1";
  batch["reports"] = Json::array();
  for (const auto* r : reports) batch["reports"].push_back(check_to_json_value(*r));
  const std::vector<BatchRow> rows = batch_rows(reports);
  Json netlists = Json::array();
  for (const BatchRow& row : rows) netlists.push_back(batch_row_json(row));
  Json total = batch_row_json(batch_total(rows));
  total.erase("file");
  batch["summary"] = Json{{"netlists", std::move(netlists)}, {"total", std::move(total)}};
  batch["caution"] = kSafetyCaution;
  return dump_json(batch);
}

}  // namespace mainscheck::report
