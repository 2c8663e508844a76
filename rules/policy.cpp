#include "rules/policy.hpp"

#include "rules/options_view.hpp"
#include "rules/registry.hpp"
#include "rules/settings_xml.hpp"

namespace mainscheck::rules {

std::optional<Severity> parse_severity(std::string_view text) {
  if (text == "error") return Severity::error;
  if (text == "warning") return Severity::warning;
  if (text == "note") return Severity::note;
  return std::nullopt;
}

namespace {

constexpr const char* kRoot = "mainscheck-policy";

void read_rule(const pugi::xml_node& n, parser::FileId file, Policy& p, parser::DiagnosticSink& diags) {
  const parser::SourceLoc loc = settings_loc(n, file);
  const std::string id = n.attribute("id").as_string();
  if (id.empty()) {
    diags.error(loc, "<rule> needs an id attribute naming the rule");
    return;
  }
  PolicyRule r;
  r.loc = loc;
  if (auto a = n.attribute("severity")) {
    r.severity = parse_severity(a.as_string());
    if (!r.severity) diags.error(loc, "severity '" + std::string(a.as_string()) + "' of rule " + id +
                                          " must be error, warning or note");
  }
  if (auto a = n.attribute("enabled")) {
    const std::string v = a.as_string();
    if (v == "true" || v == "false") r.enabled = v == "true";
    else diags.error(loc, "enabled='" + v + "' of rule " + id + " must be true or false");
  }
  for (const auto& child : n.children()) {
    if (child.type() != pugi::node_element) continue;
    if (std::string(child.name()) != "option") {
      diags.error(settings_loc(child, file), "unexpected <" + std::string(child.name()) + "> in <rule>; expected <option>");
      continue;
    }
    const std::string name = child.attribute("name").as_string();
    if (name.empty() || !child.attribute("value")) {
      diags.error(settings_loc(child, file), "<option> needs name and value attributes");
      continue;
    }
    p.options[id + "." + name] = PolicyOption{child.attribute("value").as_string(), settings_loc(child, file)};
  }
  if (p.rules.count(id) != 0) diags.error(loc, "rule " + id + " appears twice in the policy");
  p.rules[id] = r;
}

}  // namespace

Policy read_policy_text(const std::string& name, std::string text, parser::SourceManager& sm,
                        parser::DiagnosticSink& diags) {
  Policy p;
  pugi::xml_document doc;
  parser::FileId file = 0;
  const pugi::xml_node root = load_settings_xml(name, std::move(text), kRoot, "the policy", sm, diags, doc, file);
  if (!root) return p;
  for (const auto& n : root.children()) {
    if (n.type() != pugi::node_element) continue;
    const std::string tag = n.name();
    if (tag == "rule") {
      read_rule(n, file, p, diags);
    } else if (tag == "supply") {
      if (auto a = n.attribute("tolerance")) {
        p.supply_tolerance = a.as_string();
        p.supply_loc = settings_loc(n, file);
      } else {
        diags.error(settings_loc(n, file), "<supply> needs a tolerance attribute, e.g. tolerance=\"+10/-10\"");
      }
    } else {
      diags.error(settings_loc(n, file), "unknown element <" + tag + "> in the policy; expected <rule> or <supply>");
    }
  }
  return p;
}

Policy read_policy_file(const std::string& path, parser::FileReader& files, parser::SourceManager& sm,
                        parser::DiagnosticSink& diags) {
  std::string text;
  if (!read_settings_file(path, "policy", files, diags, text)) return {};
  return read_policy_text(path, std::move(text), sm, diags);
}

void validate_policy(const Policy& policy, parser::DiagnosticSink& diags) {
  std::vector<std::string> ids;
  for (const auto& r : all_rules()) ids.push_back(r->info().id);
  auto suggest = [](const std::string& near) { return near.empty() ? std::string() : "; did you mean '" + near + "'?"; };
  for (const auto& [id, r] : policy.rules) {
    if (find_rule(id) == nullptr) diags.error(r.loc, "unknown rule '" + id + "'" + suggest(nearest_name(id, ids)));
  }
  for (const auto& [key, opt] : policy.options) {
    const auto dot = key.rfind('.');
    const std::string id = key.substr(0, dot);
    const std::string name = key.substr(dot + 1);
    const Rule* rule = find_rule(id);
    if (rule == nullptr) continue;  // already reported with the rule
    const OptionSpec* spec = nullptr;
    std::vector<std::string> names;
    for (const auto& o : rule->info().options) {
      names.push_back(o.name);
      if (o.name == name) spec = &o;
    }
    if (spec == nullptr) {
      diags.error(opt.loc, "rule " + id + " has no option '" + name + "'" + suggest(nearest_name(name, names)));
      continue;
    }
    if (spec->is_text()) {
      bool ok = spec->choices.empty();
      std::string list;
      for (const auto& c : spec->choices) {
        ok = ok || c == opt.value;
        list += (list.empty() ? "" : ", ") + c;
      }
      if (!ok) diags.error(opt.loc, "option " + key + " is '" + opt.value + "', expected one of " + list);
      continue;
    }
    double v = 0;
    if (!parse_option_number(opt.value, v)) {
      diags.error(opt.loc, "option " + key + " needs a number (a plain decimal, optionally with %), got '" +
                               opt.value + "'");
    }
  }
}

}  // namespace mainscheck::rules
