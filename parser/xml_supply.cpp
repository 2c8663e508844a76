#include "parser/xml_supply.hpp"

#include <fmt/format.h>

namespace mainscheck::parser {
namespace {

std::optional<double> percent_part(std::string_view t) {
  const XmlValue v = parse_xml_value(t, XmlUnit::percent);
  if (!v.value || *v.value < 0) return std::nullopt;
  return v.value;
}

std::string percent_text(double fraction) { return format_xml_number(fraction * 100.0) + "%"; }

}  // namespace

std::optional<XmlTolerance> parse_xml_tolerance(std::string_view t) {
  if (t.substr(0, 2) == "+-") {
    t.remove_prefix(2);
  } else if (t.substr(0, 2) == "\xC2\xB1") {
    t.remove_prefix(2);
  } else if (!t.empty() && t[0] == '+') {
    const std::size_t minus = t.find('-');
    if (minus == std::string_view::npos) return std::nullopt;
    std::string_view plus_text = t.substr(1, minus - 1);
    if (!plus_text.empty() && plus_text.back() == '/') plus_text.remove_suffix(1);
    const auto plus = percent_part(plus_text);
    const auto low = percent_part(t.substr(minus + 1));
    if (!plus || !low) return std::nullopt;
    return XmlTolerance{*plus, *low};
  }
  const auto p = percent_part(t);
  if (!p) return std::nullopt;
  return XmlTolerance{*p, *p};
}

std::optional<XmlSupplyDecl> read_xml_supply(XmlChecker& check, pugi::xml_node node) {
  check.only_attributes(node, {"line", "neutral", "earth", "v_rms", "v_min", "v_max", "tol", "f", "f_min", "f_max",
                               "source_impedance"});
  check.only_children(node, {});
  const std::size_t errors_before = check.diags().error_count();
  XmlSupplyDecl s;
  s.annotation.target_kind = "supply";
  s.annotation.loc = check.doc().loc(node);
  auto& attrs = s.annotation.attrs;

  for (const char* name : {"line", "neutral", "earth"}) {
    const auto a = node.attribute(name);
    if (!a) {
      if (std::string_view(name) != "earth")
        check.error(s.annotation.loc, fmt::format("<supply> has no '{}' attribute naming the {} net", name, name));
      continue;
    }
    if (!check_xml_net_name(check, a.value(), check.doc().value_loc(a))) continue;
    attrs[name] = a.value();
    s.nets.push_back({name, a.value(), check.doc().value_loc(a)});
  }

  // Read by analysis like the *@supply key (R,L or none, docs/annotations.md).
  if (const auto a = node.attribute("source_impedance")) attrs["source_impedance"] = a.value();

  std::map<std::string, double> v;
  for (const char* name : {"v_rms", "v_min", "v_max", "f", "f_min", "f_max"}) {
    const auto a = node.attribute(name);
    if (!a) continue;
    const bool volts = name[0] == 'v';
    const auto x = read_xml_quantity(check, a, volts ? XmlUnit::volt : XmlUnit::hertz, std::string(name) + " of <supply>");
    if (!x) continue;
    if (*x <= 0) {
      check.error(check.doc().value_loc(a), fmt::format("{}={} of <supply> must be positive", name, a.value()));
      continue;
    }
    v[name] = *x;
    attrs[name] = format_xml_number(*x);
  }

  std::optional<XmlTolerance> tol;
  if (const auto a = node.attribute("tol")) {
    tol = parse_xml_tolerance(a.value());
    if (!tol) {
      check.error(check.doc().value_loc(a),
                  fmt::format("invalid value '{}' for tol of <supply>: write 10%, +-10% or +10%/-6%", a.value()));
    } else if (v.count("v_min") || v.count("v_max")) {
      check.error(check.doc().loc(a), "<supply> gives both tol and v_min/v_max; give one of them");
      tol.reset();
    } else {
      attrs["tol"] = a.value();
    }
  }

  const auto range = [&](const char* lo, const char* hi, const char* nominal, const char* unit) {
    const bool has_lo = v.count(lo) != 0, has_hi = v.count(hi) != 0;
    if (has_lo != has_hi) {
      check.error(check.doc().loc(node.attribute(has_lo ? lo : hi)),
                  fmt::format("<supply> gives {} without {}", has_lo ? lo : hi, has_lo ? hi : lo));
      return;
    }
    if (has_lo && v[lo] > v[hi]) {
      check.error(check.doc().loc(node.attribute(lo)),
                  fmt::format("{} {} {} of <supply> is above {} {} {}", lo, attrs[lo], unit, hi, attrs[hi], unit));
      return;
    }
    if (has_lo && v.count(nominal) && (v[nominal] < v[lo] || v[nominal] > v[hi])) {
      check.error(check.doc().loc(node.attribute(nominal)),
                  fmt::format("{} {} {} of <supply> lies outside {}-{} {}", nominal, attrs[nominal], unit, attrs[lo],
                              attrs[hi], unit));
    }
  };
  range("v_min", "v_max", "v_rms", "V");
  range("f_min", "f_max", "f", "Hz");
  if (!v.count("v_rms") && !(v.count("v_min") && v.count("v_max")) && errors_before == check.diags().error_count())
    check.error(s.annotation.loc, "<supply> gives no voltage; set v_rms, or v_min and v_max");
  if (!v.count("f") && !(v.count("f_min") && v.count("f_max")) && errors_before == check.diags().error_count())
    check.error(s.annotation.loc, "<supply> gives no frequency; set f, or f_min and f_max");
  if (check.diags().error_count() != errors_before) return std::nullopt;

  // The same facts in the `*@supply mains=` spelling analysis/ reads (VOLTS[TOL]/FREQ), with plain
  // numbers so that no reader's prefix rules apply.
  std::string mains = v.count("v_min") ? fmt::format("{}-{}V", attrs["v_min"], attrs["v_max"]) : attrs["v_rms"] + "V";
  if (tol) {
    mains += tol->plus == tol->minus ? "+-" + percent_text(tol->plus)
                                     : "+" + percent_text(tol->plus) + "-" + percent_text(tol->minus);
  }
  mains += "/";
  mains += v.count("f_min") ? fmt::format("{}-{}Hz", attrs["f_min"], attrs["f_max"]) : attrs["f"] + "Hz";
  attrs["mains"] = mains;
  return s;
}

}  // namespace mainscheck::parser
