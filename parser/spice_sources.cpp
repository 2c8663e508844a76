#include "parser/spice_sources.hpp"

#include <array>
#include <boost/spirit/home/x3.hpp>
#include <map>

namespace mainscheck::parser {

namespace {

namespace x3 = boost::spirit::x3;

// Argument counts of the transient functions: SPICE3/ngspice manual, "Independent Sources"
// (SIN vo va freq td theta phase; PULSE v1 v2 td tr tf pw per np; EXP v1 v2 td1 tau1 td2 tau2;
// SFFM vo va fc mdi fs phasec phases; AM va vo mf fc td phases).
struct WaveShape {
  std::string_view name;
  std::size_t min_args;
  std::size_t max_args;
};
constexpr std::array<WaveShape, 8> kWaves{{{"sin", 2, 6},
                                           {"pulse", 2, 8},
                                           {"pwl", 2, 1u << 30},
                                           {"exp", 2, 6},
                                           {"sffm", 2, 7},
                                           {"am", 2, 6},
                                           {"trnoise", 1, 8},
                                           {"trrandom", 1, 5}}};

struct SpecBuilder {
  const Statement* st = nullptr;
  ElementTemplate* t = nullptr;
  std::map<std::size_t, const Token*> tokens;  // by offset in the logical line
  std::string error;
  std::size_t error_offset = 0;
  bool dc_seen = false;

  std::size_t offset_of(const char* p) const { return static_cast<std::size_t>(p - st->line->text.data()); }
  std::optional<ValueText> value_at(const char* p) const {
    auto it = tokens.find(offset_of(p));
    if (it == tokens.end()) return std::nullopt;
    return st->value(*it->second);
  }
  bool fail(const char* p, std::string msg) {
    if (error.empty()) {
      error = std::move(msg);
      error_offset = offset_of(p);
    }
    return false;
  }
};

struct spec_tag;

template <typename Ctx>
SpecBuilder& builder(Ctx& ctx) {
  return x3::get<spec_tag>(ctx).get();
}
template <typename Ctx>
const char* where(const Ctx& ctx) {
  return &*x3::_attr(ctx).begin();  // every action here sits on a raw[] whose attribute is the match
}

struct set_dc {
  template <typename Ctx>
  void operator()(Ctx& ctx) const {
    auto& b = builder(ctx);
    if (b.dc_seen) {
      x3::_pass(ctx) = b.fail(where(ctx), "DC value given twice");
      return;
    }
    b.dc_seen = true;
    b.t->source->dc = b.value_at(where(ctx));
  }
};
struct set_ac_mag {
  template <typename Ctx>
  void operator()(Ctx& ctx) const {
    builder(ctx).t->source->ac_mag = builder(ctx).value_at(where(ctx));
  }
};
struct set_ac_phase {
  template <typename Ctx>
  void operator()(Ctx& ctx) const {
    builder(ctx).t->source->ac_phase = builder(ctx).value_at(where(ctx));
  }
};
struct set_wave {
  template <typename Ctx>
  void operator()(Ctx& ctx) const {
    auto& b = builder(ctx);
    const auto& r = x3::_attr(ctx);
    if (b.t->source->wave_kind) {
      x3::_pass(ctx) = b.fail(where(ctx), "a source can have only one transient function");
      return;
    }
    b.t->source->wave_kind = to_lower(std::string_view(&*r.begin(), static_cast<std::size_t>(r.end() - r.begin())));
    b.t->source->wave_loc = b.st->loc_at(b.offset_of(where(ctx)));
    b.t->source->wave_args.clear();
  }
};
struct add_arg {
  template <typename Ctx>
  void operator()(Ctx& ctx) const {
    auto& b = builder(ctx);
    if (auto v = b.value_at(where(ctx))) b.t->source->wave_args.push_back(*v);
  }
};
struct add_param {
  template <typename Ctx>
  void operator()(Ctx& ctx) const {
    auto& b = builder(ctx);
    auto it = b.tokens.find(b.offset_of(where(ctx)));
    if (it == b.tokens.end()) return;
    // The key token's Item holds the value; find it through the statement.
    for (const Item& item : b.st->items) {
      if (item.kind == ItemKind::key_value && item.head.offset == it->first) {
        const std::string key = to_lower(item.head.text);
        if (key == "dc") {
          if (b.dc_seen) {
            x3::_pass(ctx) = b.fail(where(ctx), "DC value given twice");
            return;
          }
          b.dc_seen = true;
          b.t->source->dc = b.st->value(item.value);
        } else {
          b.t->params.emplace_back(key, b.st->value(item.value));
        }
        return;
      }
    }
  }
};

const auto sep = x3::omit[+x3::char_(" \t\r\f\v,")];
const auto word_char = ~x3::char_(" \t\r\f\v,(){}='\"");
const auto word = +word_char;
const auto value = x3::raw[(x3::lit('{') >> *~x3::char_('}') >> '}') | (x3::lit('\'') >> *~x3::char_('\'') >> '\'') | word];
const auto kw = [](const char* k) { return x3::no_case[x3::lit(k)] >> !word_char; };
const auto wave_name = x3::raw[x3::no_case[x3::lit("sin") | "pulse" | "pwl" | "exp" | "sffm" | "am" | "trnoise" |
                                           "trrandom"] >>
                               !word_char];
const auto keyword = kw("dc") | kw("ac") | wave_name;
const auto key_value = x3::raw[word >> -sep >> '=' >> -sep >> value][add_param{}];
const auto dc_spec = kw("dc") >> -sep >> value[set_dc{}];
const auto ac_spec = kw("ac") >> -sep >> value[set_ac_mag{}] >> -(sep >> !keyword >> !(word >> -sep >> '=') >> value[set_ac_phase{}]);
const auto wave_args =
    (x3::lit('(') >> -sep >> *(value[add_arg{}] >> -sep) >> ')') | *(!keyword >> !(word >> -sep >> '=') >> value[add_arg{}] >> -sep);
const auto wave_spec = wave_name[set_wave{}] >> -sep >> wave_args;
const auto spec = -sep >> *((key_value | dc_spec | ac_spec | wave_spec | value[set_dc{}]) >> -sep);

void collect(const std::vector<Item>& items, std::size_t first, std::map<std::size_t, const Token*>& out) {
  for (std::size_t i = first; i < items.size(); ++i) {
    out.emplace(items[i].head.offset, &items[i].head);
    if (items[i].kind == ItemKind::key_value) out.emplace(items[i].value.offset, &items[i].value);
    collect(items[i].args, 0, out);
  }
}

}  // namespace

bool parse_source_spec(const Statement& st, std::size_t first, const std::string& what, ElementTemplate& t,
                       DiagnosticSink& diags) {
  if (first >= st.items.size()) return true;
  SpecBuilder b;
  b.st = &st;
  b.t = &t;
  collect(st.items, first, b.tokens);
  const std::string_view text = st.line->text;
  const char* begin = text.data() + st.items[first].head.offset;
  const char* it = begin;
  const char* const end = text.data() + text.size();
  const bool ok = x3::parse(it, end, x3::with<spec_tag>(std::ref(b))[spec]);
  if (!b.error.empty()) {
    diags.error(st.loc_at(b.error_offset), b.error + " in " + what);
    return false;
  }
  if (!ok || it != end) {
    const std::size_t at = static_cast<std::size_t>(it - text.data());
    std::size_t e = at;
    while (e < text.size() && text[e] != ' ' && text[e] != '\t') ++e;
    diags.error(st.loc_at(at), "unexpected '" + std::string(text.substr(at, e - at)) +
                                   "' in the source specification of " + what);
    return false;
  }
  if (t.source->wave_kind) {
    for (const auto& w : kWaves) {
      if (w.name != *t.source->wave_kind) continue;
      const std::size_t n = t.source->wave_args.size();
      std::string upper = to_lower(*t.source->wave_kind);
      for (char& c : upper) c = static_cast<char>(c - 'a' + 'A');
      if (n < w.min_args || n > w.max_args) {
        diags.error(t.source->wave_loc, upper + " of " + what + " has " + std::to_string(n) + " arguments, expected " +
                                    std::to_string(w.min_args) +
                                    (w.max_args > 100 ? " or more" : " to " + std::to_string(w.max_args)));
        return false;
      }
      if (w.name == "pwl" && n % 2 != 0) {
        diags.error(t.source->wave_loc, "PWL of " + what + " needs time-value pairs, found " + std::to_string(n) + " values");
        return false;
      }
    }
  }
  return true;
}

}  // namespace mainscheck::parser
