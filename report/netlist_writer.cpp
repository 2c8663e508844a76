#include "report/netlist_writer.hpp"

#include <fmt/format.h>

#include <charconv>
#include <cmath>

#include "report/json_common.hpp"

namespace mainscheck::report {

std::string format_number(double v) {
  if (!std::isfinite(v)) return "nan";
  char buf[64];
  auto res = std::to_chars(buf, buf + sizeof buf, v);  // shortest round-trip form
  return std::string(buf, res.ptr);
}

namespace {

Json params_json(const parser::ParamMap& params) {
  Json j = Json::object();
  for (const auto& [key, p] : params) {
    if (p.value) {
      j[key] = number_json(*p.value);
    } else {
      j[key] = p.text;
    }
  }
  return j;
}

Json source_json(const parser::SourceSpec& s) {
  Json j = Json::object();
  j["dc"] = s.dc ? number_json(*s.dc) : Json(nullptr);
  if (s.ac_mag) j["ac"] = Json{{"mag", number_json(*s.ac_mag)}, {"phase_deg", number_json(s.ac_phase_deg.value_or(0))}};
  if (s.waveform) {
    Json args = Json::array();
    for (double a : s.waveform->args) args.push_back(number_json(a));
    j["waveform"] = Json{{"kind", s.waveform->kind}, {"args", std::move(args)}};
  }
  return j;
}

}  // namespace

std::string netlist_to_json(const parser::Netlist& nl, const parser::SourceManager& sm,
                            const parser::DiagnosticSink& diags) {
  Json root;
  root["title"] = nl.title;
  Json parts = Json::array();
  for (const auto& p : nl.parts) {
    Json j;
    j["ref"] = p.ref;
    j["kind"] = p.kind == parser::PartKind::other ? p.type_name : std::string(parser::part_kind_name(p.kind));
    Json nets = Json::array();
    for (parser::NetId n : p.nets) nets.push_back(nl.net(n).name);
    j["nets"] = std::move(nets);
    j["value"] = p.value ? number_json(*p.value) : Json(nullptr);
    j["model"] = p.model ? Json(*p.model) : Json(nullptr);
    j["params"] = params_json(p.params);
    if (!p.controls.empty()) j["controls"] = p.controls;
    if (p.source) j["source"] = source_json(*p.source);
    j["location"] = location_json(p.loc, sm);
    parts.push_back(std::move(j));
  }
  root["parts"] = std::move(parts);
  Json nets = Json::array();
  for (const auto& n : nl.nets()) nets.push_back(n.name);
  root["nets"] = std::move(nets);
  Json models = Json::array();
  for (const auto& m : nl.models) {
    models.push_back(Json{{"name", m.name}, {"type", m.type}, {"scope", m.scope}, {"params", params_json(m.params)},
                          {"location", location_json(m.loc, sm)}});
  }
  root["models"] = std::move(models);
  root["diagnostics"] = diagnostics_json(diags, sm);
  return dump_json(root);
}

std::string netlist_to_text(const parser::Netlist& nl, const parser::SourceManager& sm) {
  std::string out;
  out += fmt::format("title: {}\n", nl.title);
  out += fmt::format("{} parts, {} nets, {} models\n", nl.parts.size(), nl.nets().size(), nl.models.size());
  for (const auto& p : nl.parts) {
    std::string nets;
    for (parser::NetId n : p.nets) nets += (nets.empty() ? "" : " ") + nl.net(n).name;
    const std::string kind = p.kind == parser::PartKind::other ? p.type_name : std::string(parser::part_kind_name(p.kind));
    out += fmt::format("{}: {} {} ({})", format_location(p.loc, sm), p.ref, kind, nets);
    if (p.value) out += " value=" + format_number(*p.value);
    if (p.model) out += " model=" + *p.model;
    for (const auto& [k, v] : p.params) out += " " + k + "=" + (v.value ? format_number(*v.value) : v.text);
    for (const auto& c : p.controls) out += " ->" + c;
    out += '\n';
  }
  return out;
}

}  // namespace mainscheck::report
