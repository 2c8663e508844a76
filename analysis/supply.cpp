#include "analysis/supply.hpp"

#include <array>
#include <charconv>
#include <cmath>

#include <fmt/format.h>

namespace mainscheck::analysis {

using parser::NetId;

namespace {

// A cursor over the supply text; the grammar is in docs/annotations.md ("Supply text").
class SpecReader {
 public:
  explicit SpecReader(std::string_view t) : t_(t) {}

  bool done() const { return i_ >= t_.size(); }
  char peek() const { return done() ? '\0' : t_[i_]; }
  bool eat(std::string_view s) {
    if (t_.substr(i_, s.size()) != s) return false;
    i_ += s.size();
    return true;
  }
  // Eats `s` in any letter case.
  bool eat_nocase(std::string_view s) {
    if (parser::to_lower(t_.substr(i_, s.size())) != s) return false;
    i_ += s.size();
    return true;
  }
  void skip_spaces() {
    while (!done() && (t_[i_] == ' ' || t_[i_] == '\t')) ++i_;
  }
  std::optional<double> number() {
    skip_spaces();
    double v = 0;
    const char* b = t_.data() + i_;
    const auto [end, ec] = std::from_chars(b, t_.data() + t_.size(), v, std::chars_format::fixed);
    if (ec != std::errc() || end == b) return std::nullopt;
    i_ += static_cast<std::size_t>(end - b);
    skip_spaces();
    return v;
  }
  std::string_view rest() const { return t_.substr(i_); }

 private:
  std::string_view t_;
  std::size_t i_ = 0;
};

struct Quantity {
  std::optional<double> nom, min, max;
};

// NUMBER [- NUMBER] [unit], then for volts an optional tolerance. Returns an error text or "".
std::string read_quantity(SpecReader& r, std::string_view unit, bool allow_tolerance, Quantity& q,
                          std::string_view what) {
  const auto a = r.number();
  if (!a) return fmt::format("expected the {} as a number at '{}'", what, r.rest());
  std::optional<double> b;
  if (r.eat("-")) {
    b = r.number();
    if (!b) return fmt::format("expected the upper {} after '-' at '{}'", what, r.rest());
  }
  r.eat_nocase(unit);
  r.skip_spaces();
  if (b) {
    if (*b < *a) return fmt::format("{} range {}-{} runs downwards", what, *a, *b);
    q.min = a;
    q.max = b;
  } else {
    q.nom = a;
  }
  if (!allow_tolerance) return {};
  std::optional<double> plus, minus;
  if (r.eat("+-") || r.eat("\xC2\xB1")) {
    plus = r.number();
    minus = plus;
    if (!plus) return fmt::format("expected a tolerance in percent at '{}'", r.rest());
    if (!r.eat("%")) return fmt::format("tolerance needs a '%' sign at '{}'", r.rest());
  } else if (r.peek() == '+' || r.peek() == '-') {
    for (int k = 0; k < 2 && (r.peek() == '+' || r.peek() == '-'); ++k) {
      const bool up = r.eat("+");
      if (!up) r.eat("-");
      auto v = r.number();
      if (!v) return fmt::format("expected a tolerance in percent at '{}'", r.rest());
      (up ? plus : minus) = v;
      if (!r.eat("%")) return fmt::format("tolerance needs a '%' sign at '{}'", r.rest());
      r.skip_spaces();
    }
    if (!plus || !minus) return "an asymmetric tolerance needs both sides, like +10%-15%";
  } else {
    return {};
  }
  r.skip_spaces();
  if (b) return "a voltage range takes no tolerance";
  if (*minus >= 100) return fmt::format("tolerance -{}% leaves no voltage", *minus);
  q.min = *a * (1 - *minus / 100);
  q.max = *a * (1 + *plus / 100);
  return {};
}

constexpr std::array kLineNames{"l", "line", "ac_l", "acl", "live", "l1"};
constexpr std::array kNeutralNames{"n", "neutral", "ac_n", "acn"};
constexpr std::array kEarthNames{"pe", "earth", "prot_earth", "protective_earth"};

// The only net among `names` present in the netlist; several present is reported as ambiguous.
template <std::size_t N>
std::optional<NetId> net_by_name(const parser::Netlist& nl, const std::array<const char*, N>& names,
                                 std::string_view role, parser::DiagnosticSink& diags) {
  std::vector<NetId> found;
  for (const char* n : names)
    if (auto id = nl.find_net(n); id && *id != parser::kGroundNet) found.push_back(*id);
  if (found.size() > 1) {
    parser::Diagnostic d{parser::Severity::error, nl.net(found[1]).loc,
                         fmt::format("several nets could be the {} by name ({} and {}); name it with --{} or a "
                                     "*@supply annotation",
                                     role, nl.net(found[0]).name, nl.net(found[1]).name, role),
                         {{nl.net(found[0]).loc, fmt::format("net {} first used here", nl.net(found[0]).name)}}};
    diags.report(std::move(d));
    return std::nullopt;
  }
  if (found.empty()) return std::nullopt;
  return found[0];
}

struct NetChoice {
  std::optional<NetId> line, neutral, earth;
  SupplyOrigin origin;
};

std::optional<NetId> named_net(const parser::Netlist& nl, const std::string& name, std::string_view option,
                               parser::SourceLoc loc, parser::DiagnosticSink& diags) {
  auto id = nl.find_net(name);
  if (!id) diags.error(loc, fmt::format("{} names net '{}', which is not in the netlist", option, name));
  return id;
}

}  // namespace

MainsSpecParse parse_mains_spec(std::string_view text) {
  MainsSpecParse out;
  SpecReader r(text);
  Quantity v, f;
  if (auto e = read_quantity(r, "v", true, v, "voltage"); !e.empty()) {
    out.error = e;
    return out;
  }
  if (!r.eat("/")) {
    out.error = r.done() ? fmt::format("supply '{}' gives no frequency; write it like 230V/50Hz", text)
                         : fmt::format("expected '/' before the frequency at '{}'", r.rest());
    return out;
  }
  if (auto e = read_quantity(r, "hz", false, f, "frequency"); !e.empty()) {
    out.error = e;
    return out;
  }
  if (!r.done()) {
    out.error = fmt::format("unexpected text '{}' after the frequency", r.rest());
    return out;
  }
  for (auto x : {v.nom, v.min, v.max, f.nom, f.min, f.max})
    if (x && *x <= 0) {
      out.error = fmt::format("supply '{}' has a value that is not positive", text);
      return out;
    }
  out.spec = MainsSpec{v.nom, v.min, v.max, f.nom, f.min, f.max};
  return out;
}

Supply resolve_supply(const parser::Netlist& nl, const SupplyOptions& options, parser::DiagnosticSink& diags) {
  Supply s;
  auto take_nets = [&](const NetChoice& c) {
    bool any = false;
    if (!s.line && c.line) s.line = c.line, any = true;
    if (!s.neutral && c.neutral) s.neutral = c.neutral, any = true;
    if (!s.earth && c.earth) s.earth = c.earth, any = true;
    if (any && s.nets_from.what.empty()) s.nets_from = c.origin;
  };

  // 1. Command line.
  {
    NetChoice c{{}, {}, {}, {"command line", {}}};
    if (options.line) c.line = named_net(nl, *options.line, "--line", {}, diags);
    if (options.neutral) c.neutral = named_net(nl, *options.neutral, "--neutral", {}, diags);
    if (options.earth) c.earth = named_net(nl, *options.earth, "--earth", {}, diags);
    take_nets(c);
    if (options.supply) {
      auto p = parse_mains_spec(*options.supply);
      if (!p.spec) diags.error({}, fmt::format("--supply '{}': {}", *options.supply, p.error));
      else s.mains = p.spec, s.mains_from = {"command line", {}};
    }
  }

  // 2. Supply annotations (XML <supply> element or `*@supply`); two of them are ambiguous.
  const parser::Annotation* ann = nullptr;
  for (const auto& a : nl.annotations) {
    if (a.target_kind != "supply") continue;
    if (ann) {
      diags.report({parser::Severity::error, a.loc, "second supply annotation; a netlist states its supply once",
                    {{ann->loc, "first supply annotation here"}}});
      continue;
    }
    ann = &a;
  }
  if (ann) {
    NetChoice c{{}, {}, {}, {"supply annotation", ann->loc}};
    for (const auto& [k, v] : ann->attrs) {
      if (k == "line") c.line = named_net(nl, v, "supply annotation line=", ann->loc, diags);
      else if (k == "neutral") c.neutral = named_net(nl, v, "supply annotation neutral=", ann->loc, diags);
      else if (k == "earth") c.earth = named_net(nl, v, "supply annotation earth=", ann->loc, diags);
      else if (k == "mains") {
        auto p = parse_mains_spec(v);
        if (!p.spec) diags.error(ann->loc, fmt::format("supply annotation mains='{}': {}", v, p.error));
        else if (!s.mains) {
          s.mains = p.spec;
          s.mains_from = {"supply annotation", ann->loc};
          // XML gives a nominal beside a range; the mains text carries only the range.
          if (auto it = ann->attrs.find("v_rms"); it != ann->attrs.end() && !s.mains->v_nominal_V)
            if (auto n = parse_mains_spec(it->second + "V/1Hz"); n.spec) s.mains->v_nominal_V = n.spec->v_nominal_V;
          if (auto it = ann->attrs.find("f"); it != ann->attrs.end() && !s.mains->f_nominal_Hz)
            if (auto n = parse_mains_spec("1V/" + it->second + "Hz"); n.spec) s.mains->f_nominal_Hz = n.spec->f_nominal_Hz;
        }
      } else if (k == "source_impedance") {
        auto z = parse_source_impedance(v);
        if (!z.value) diags.error(ann->loc, fmt::format("supply annotation source_impedance='{}': {}", v, z.error));
        else s.source_impedance = z.value;
      } else if (k == "v_rms" || k == "v_min" || k == "v_max" || k == "f" || k == "f_min" || k == "f_max" ||
                 k == "tol") {
        // The separate values the XML reader also passes; `mains` carries the same facts.
        if (!ann->attrs.count("mains"))
          diags.warning(ann->loc, fmt::format("supply annotation key '{}' is read only together with mains=", k));
      } else {
        diags.warning(ann->loc, fmt::format("unknown supply annotation key '{}'", k));
      }
    }
    take_nets(c);
  }

  // 3. An independent sinusoidal voltage source: its nets are line (+) and neutral (-).
  std::vector<std::size_t> sin_sources;
  for (std::size_t i = 0; i < nl.parts.size(); ++i) {
    const auto& p = nl.parts[i];
    if (p.kind == parser::PartKind::vsource && p.nets.size() == 2 && p.source && p.source->waveform &&
        p.source->waveform->kind == "sin" && p.source->waveform->args.size() >= 3)
      sin_sources.push_back(i);
  }
  if (sin_sources.size() > 1 && !(s.line && s.neutral && s.mains)) {
    const auto& a = nl.parts[sin_sources[0]];
    const auto& b = nl.parts[sin_sources[1]];
    diags.report({parser::Severity::error, b.loc,
                  fmt::format("several sinusoidal sources could be the mains ({} and {}); state the supply with "
                              "--supply/--line/--neutral or a *@supply annotation",
                              a.ref, b.ref),
                  {{a.loc, fmt::format("{} defined here", a.ref)}}});
  } else if (sin_sources.size() == 1) {
    const auto& p = nl.parts[sin_sources[0]];
    const auto& w = *p.source->waveform;
    const double va = std::abs(w.args[1]), freq = w.args[2];
    if (va > 0 && freq > 0) {
      take_nets({p.nets[0], p.nets[1], {}, {"source " + p.ref, p.loc}});
      s.source_part = sin_sources[0];
      // RMS of a sinusoid is its amplitude over sqrt(2) (any circuits textbook).
      const double v_rms = va / std::sqrt(2.0);
      if (!s.mains) {
        s.mains = MainsSpec{v_rms, {}, {}, freq, {}, {}};
        s.mains_from = {"source " + p.ref, p.loc};
        diags.note(p.loc, fmt::format("mains taken from source {}: {} V peak is {:.1f} V r.m.s. at {} Hz", p.ref, va,
                                      v_rms, freq));
      } else if (s.mains->v_nominal_V && std::abs(*s.mains->v_nominal_V - v_rms) > 0.05 * v_rms) {
        diags.note(p.loc, fmt::format("source {} ({:.1f} V r.m.s.) differs from the supply taken from the {}", p.ref,
                                      v_rms, s.mains_from.what));
      }
      if (w.args[0] != 0)
        diags.note(p.loc, fmt::format("source {} has a DC offset of {} V; the mains is taken as its AC part", p.ref,
                                      w.args[0]));
    }
  }

  // 4. Common net names, only for what is still unknown, with a note saying so.
  {
    NetChoice c{{}, {}, {}, {"net name", {}}};
    if (!s.line) c.line = net_by_name(nl, kLineNames, "line", diags);
    if (!s.neutral) c.neutral = net_by_name(nl, kNeutralNames, "neutral", diags);
    if (!s.earth) c.earth = net_by_name(nl, kEarthNames, "earth", diags);
    for (auto [id, role] : {std::pair{c.line, "line"}, std::pair{c.neutral, "neutral"}, std::pair{c.earth, "earth"}})
      if (id) diags.note(nl.net(*id).loc, fmt::format("net {} taken as {} from its name", nl.net(*id).name, role));
    take_nets(c);
  }

  if (s.line && s.neutral && *s.line == *s.neutral) {
    diags.error(s.nets_from.loc, fmt::format("line and neutral are the same net {}", nl.net(*s.line).name));
    s.neutral.reset();
  }
  if (!s.line || !s.neutral)
    diags.error({}, fmt::format("no mains {} found: name it with --line/--neutral, a *@supply annotation or an "
                                "XML <supply> element, or drive the deck from a SIN source",
                                !s.line && !s.neutral ? "line and neutral" : (!s.line ? "line" : "neutral")));
  if (!s.mains || !s.mains->usable())
    diags.error({}, "no mains voltage and frequency: give --supply like 230V/50Hz, a *@supply mains=... annotation "
                    "or a SIN source");
  return s;
}

}  // namespace mainscheck::analysis
