#pragma once
// Spirit X3 grammar for the tokens of one SPICE logical line: words, `{}`/`''` expressions,
// double-quoted strings, `key=value` pairs and `NAME(args)` groups (source functions, model cards).
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace mainscheck::parser {

/// Lexical kind of a token.
enum class TokenKind { word, brace_expr, quote_expr, string };

/// One token; `text` is the whole token, `body` the part inside its delimiters (= text for words).
struct Token {
  TokenKind kind = TokenKind::word;
  std::string_view text;
  std::string_view body;
  std::size_t offset = 0;       // of text in the logical line
  std::size_t body_offset = 0;  // of body in the logical line
  bool is_expr() const { return kind == TokenKind::brace_expr || kind == TokenKind::quote_expr; }
};

/// Structural kind of an item of a line.
enum class ItemKind { atom, key_value, group };

/// A bare token, a `key=value` pair, or a `head(args...)` group whose args are atoms and pairs.
struct Item {
  ItemKind kind = ItemKind::atom;
  Token head;   // the atom, the key, or the group name
  Token value;  // key_value only
  std::vector<Item> args;  // group only
  std::size_t end_offset = 0;  // one past the item's last byte
};

/// Items of a line, or the first syntax error with its byte offset in the line.
struct LineItems {
  std::vector<Item> items;
  bool ok = false;
  std::string error;
  std::size_t error_offset = 0;
};

/// Parses a logical line (comments already removed); `text` must outlive the result.
LineItems parse_line_items(std::string_view text);

}  // namespace mainscheck::parser
