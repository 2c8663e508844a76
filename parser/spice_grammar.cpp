#include "parser/spice_grammar.hpp"

#include <boost/spirit/home/x3.hpp>

namespace mainscheck::parser {

namespace {

namespace x3 = boost::spirit::x3;

// Builds the item tree while the grammar runs. Every action belongs to a token that has been
// fully matched and the grammar never backtracks over a token, so no action is ever undone.
struct ItemBuilder {
  std::string_view line;
  LineItems out;
  bool in_group = false;
  bool expect_value = false;
  std::size_t group_open = 0;

  std::vector<Item>& current() { return in_group ? out.items.back().args : out.items; }

  bool fail(std::size_t offset, std::string message) {
    out.error = std::move(message);
    out.error_offset = offset;
    return false;
  }

  bool token(TokenKind kind, const char* b, const char* e) {
    Token t;
    t.kind = kind;
    t.offset = static_cast<std::size_t>(b - line.data());
    t.text = std::string_view(b, static_cast<std::size_t>(e - b));
    if (kind == TokenKind::word) {
      t.body = t.text;
      t.body_offset = t.offset;
    } else {
      t.body = t.text.substr(1, t.text.size() - 2);
      t.body_offset = t.offset + 1;
    }
    if (expect_value) {
      current().back().value = t;
      current().back().end_offset = t.offset + t.text.size();
      expect_value = false;
      return true;
    }
    Item it;
    it.head = t;
    it.end_offset = t.offset + t.text.size();
    current().push_back(std::move(it));
    return true;
  }

  bool equals(std::size_t at) {
    auto& items = current();
    if (expect_value) return fail(at, "expected a value after '=', found '='");
    if (items.empty() || items.back().kind != ItemKind::atom || items.back().head.kind != TokenKind::word)
      return fail(at, "'=' must follow a parameter name");
    items.back().kind = ItemKind::key_value;
    expect_value = true;
    return true;
  }

  bool open(std::size_t at) {
    if (expect_value) return fail(at, "expected a value after '=', found '('");
    if (in_group) return fail(at, "nested '(' is not allowed here");
    if (out.items.empty() || out.items.back().kind != ItemKind::atom || out.items.back().head.kind != TokenKind::word)
      return fail(at, "'(' must follow a name such as SIN or a model type");
    out.items.back().kind = ItemKind::group;
    in_group = true;
    group_open = at;
    return true;
  }

  bool close(std::size_t at) {
    if (expect_value) return fail(at, "expected a value after '=', found ')'");
    if (!in_group) return fail(at, "unbalanced ')' without a matching '('");
    in_group = false;
    out.items.back().end_offset = at + 1;
    return true;
  }

  bool finish(std::size_t end) {
    if (expect_value) return fail(end, "expected a value after '='");
    if (in_group) return fail(group_open, "'(' is not closed with ')'");
    return true;
  }
};

struct builder_tag;

template <TokenKind K>
struct on_token {
  template <typename Ctx>
  void operator()(Ctx& ctx) const {
    auto& b = x3::get<builder_tag>(ctx).get();
    // raw[]'s attribute is the matched range (X3's _where does not bound it in Boost 1.74).
    const auto& range = x3::_attr(ctx);
    x3::_pass(ctx) = b.token(K, &*range.begin(), &*range.begin() + (range.end() - range.begin()));
  }
};

template <char C>
struct on_punct {
  template <typename Ctx>
  void operator()(Ctx& ctx) const {
    auto& b = x3::get<builder_tag>(ctx).get();
    const auto at = static_cast<std::size_t>(&*x3::_attr(ctx).begin() - b.line.data());
    if constexpr (C == '=') x3::_pass(ctx) = b.equals(at);
    if constexpr (C == '(') x3::_pass(ctx) = b.open(at);
    if constexpr (C == ')') x3::_pass(ctx) = b.close(at);
  }
};

// Checklist item 13: blanks and commas separate; `(`, `)` and `=` are tokens of their own.
const auto separator = +x3::char_(" \t\r\f\v,");
const auto word = +~x3::char_(" \t\r\f\v,(){}='\"");
const auto brace_expr = x3::lit('{') >> *~x3::char_('}') >> x3::lit('}');
const auto quote_expr = x3::lit('\'') >> *~x3::char_('\'') >> x3::lit('\'');
const auto dq_string = x3::lit('"') >> *~x3::char_('"') >> x3::lit('"');
const auto token = x3::raw[word][on_token<TokenKind::word>{}] |
                   x3::raw[brace_expr][on_token<TokenKind::brace_expr>{}] |
                   x3::raw[quote_expr][on_token<TokenKind::quote_expr>{}] |
                   x3::raw[dq_string][on_token<TokenKind::string>{}] | x3::raw[x3::lit('=')][on_punct<'='>{}] |
                   x3::raw[x3::lit('(')][on_punct<'('>{}] | x3::raw[x3::lit(')')][on_punct<')'>{}];
const auto line_grammar = x3::omit[*separator] >> *(token >> x3::omit[*separator]);

std::string describe_stop(std::string_view line, std::size_t at) {
  if (at >= line.size()) return "unexpected end of line";
  switch (line[at]) {
    case '{': return "unbalanced '{': no closing '}' on this line";
    case '}': return "unbalanced '}' without a matching '{'";
    case '\'': return "unclosed quote: no closing ' on this line";
    case '"': return "unclosed double quote: no closing \" on this line";
    default: return std::string("unexpected character '") + line[at] + "'";
  }
}

}  // namespace

LineItems parse_line_items(std::string_view text) {
  ItemBuilder b;
  b.line = text;
  const char* first = text.data();
  const char* const last = text.data() + text.size();
  const auto parser = x3::with<builder_tag>(std::ref(b))[line_grammar];
  const bool matched = x3::parse(first, last, parser);
  const auto stop = static_cast<std::size_t>(first - text.data());
  if (!b.out.error.empty()) return std::move(b.out);
  if (!matched || first != last) {
    b.out.error = describe_stop(text, stop);
    b.out.error_offset = stop;
    return std::move(b.out);
  }
  b.out.ok = b.finish(text.size());
  return std::move(b.out);
}

}  // namespace mainscheck::parser
