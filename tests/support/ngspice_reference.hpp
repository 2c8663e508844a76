#pragma once
// ngspice as an outside reference for tests: runs `ngspice -b` on a control deck that sources a
// netlist, and parses what it prints — the expanded (flattened, parameter-substituted) element
// listing of `listing expand`, and the values of `print @device[param]`.
//
// Observed with ngspice-39 (these are the facts the parsers below rely on):
// - `listing expand` prints one line per card as `   <n> : <card>`, lower-cased, the title first,
//   `.end` last; subcircuits are expanded, `{}`/`''` expressions replaced by `%.15e` numbers,
//   literal values (`1k`, `100m`) left as written.
// - Elements inside instances are renamed `<letter>.<instance path>.<name>` (`r.x1.xi.r1`), internal
//   nodes `<instance path>.<node>` (`x1.mid`), models local to a subcircuit `<instance path>:<name>`
//   (`x1.xs:dleaf`), ground aliases become `0`, `.global` nodes keep their name.
// - `print @dev[param]` prints `@dev[param] = <value>` or, for vectors (source waveforms),
//   `@dev[param] = ( v1<TAB>v2 ... )` possibly over several lines; with `set numdgt=15` values carry
//   16 significant digits. An unknown device/parameter goes to stderr and prints nothing.
// - Before an analysis has run, `@k[k]` reads 0 (the coupling factor is computed at setup), so a K
//   element's coefficient is taken from the listing text.
#include <algorithm>
#include <cctype>
#include <chrono>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "support/process_runner.hpp"

namespace mainscheck::test_support {

/// One element card of ngspice's expanded listing, split by element type.
struct NgspiceElement {
  std::string name;                  // as listed: "r.x1.r2"
  char letter = '?';                 // element type letter, lower case
  std::vector<std::string> nodes;    // in pin order
  std::vector<std::string> controls; // K: coupled inductors; W: controlling source
  std::optional<std::string> value;  // R/C/L/K: the value token as listed
  std::optional<std::string> model;  // D/Q/M/S/W: model name as listed ("x1:dloc")
  std::vector<std::string> flags;    // bare words after the model (`off`)
  std::map<std::string, std::string> params;  // key=value pairs, lower-case keys
  std::optional<std::string> dc;     // V/I: DC value token, when written
  std::optional<std::string> ac_mag;
  std::optional<std::string> ac_phase;
  std::optional<std::string> waveform;        // V/I: "sin", "pulse", ...
  std::vector<std::string> waveform_args;     // as listed
  std::string line;                  // the whole card
};

/// One `.model` card of the listing.
struct NgspiceModel {
  std::string name;
  std::string type;
  std::map<std::string, std::string> params;
};

/// The parsed `listing expand` output.
struct NgspiceListing {
  std::string title;
  std::vector<NgspiceElement> elements;
  std::map<std::string, NgspiceModel> models;  // by listed name
  std::vector<std::string> problems;           // cards the parser could not classify
};

namespace ngspice_detail {

inline std::string lower(std::string_view s) {
  std::string r(s);
  for (char& c : r) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return r;
}

// Tokens of a listed card: words, and the single characters `(`, `)` and `=`; commas separate.
inline std::vector<std::string> tokenize(std::string_view card) {
  std::vector<std::string> toks;
  std::string cur;
  auto flush = [&] {
    if (!cur.empty()) toks.push_back(cur);
    cur.clear();
  };
  for (char c : card) {
    if (c == ' ' || c == '\t' || c == ',') {
      flush();
    } else if (c == '(' || c == ')' || c == '=') {
      flush();
      toks.emplace_back(1, c);
    } else {
      cur += c;
    }
  }
  flush();
  return toks;
}

inline bool starts_numeric(std::string_view t) {
  if (t.empty()) return false;
  std::size_t i = (t[0] == '+' || t[0] == '-') ? 1 : 0;
  if (i < t.size() && t[i] == '.') ++i;
  return i < t.size() && std::isdigit(static_cast<unsigned char>(t[i]));
}

// Splits tokens after the fixed pins into key=value pairs and bare words.
inline void take_params(const std::vector<std::string>& t, std::size_t i, std::vector<std::string>& bare,
                        std::map<std::string, std::string>& params) {
  while (i < t.size()) {
    if (i + 2 < t.size() && t[i + 1] == "=") {
      params[lower(t[i])] = t[i + 2];
      i += 3;
    } else {
      if (t[i] != "(" && t[i] != ")") bare.push_back(t[i]);
      ++i;
    }
  }
}

inline bool is_waveform_name(std::string_view w) {
  for (std::string_view k : {"sin", "pulse", "pwl", "exp", "sffm", "am"})
    if (w == k) return true;
  return false;
}

inline void parse_source(NgspiceElement& e, const std::vector<std::string>& t, std::vector<std::string>& problems) {
  std::size_t i = 3;
  while (i < t.size()) {
    const std::string w = lower(t[i]);
    if (w == "dc" && i + 1 < t.size()) {
      std::size_t v = i + 1;
      if (t[v] == "=" && v + 1 < t.size()) ++v;
      e.dc = t[v];
      i = v + 1;
    } else if (w == "ac" && i + 1 < t.size()) {
      e.ac_mag = t[i + 1];
      i += 2;
      if (i < t.size() && starts_numeric(t[i])) e.ac_phase = t[i++];
    } else if (i + 1 < t.size() && t[i + 1] == "(") {
      e.waveform = w;
      i += 2;
      while (i < t.size() && t[i] != ")") e.waveform_args.push_back(t[i++]);
      ++i;
    } else if (is_waveform_name(w) && i + 1 < t.size() && starts_numeric(t[i + 1])) {
      e.waveform = w;  // bare form: `sin 0 325 50`
      ++i;
      while (i < t.size() && starts_numeric(t[i])) e.waveform_args.push_back(t[i++]);
    } else if (starts_numeric(t[i]) && !e.dc && !e.waveform && !e.ac_mag) {
      e.dc = t[i++];
    } else {
      problems.push_back("unclassified source token '" + t[i] + "' in: " + e.line);
      ++i;
    }
  }
}

inline NgspiceElement parse_element(const std::string& card, const std::map<std::string, NgspiceModel>& models,
                                    std::vector<std::string>& problems) {
  NgspiceElement e;
  e.line = card;
  const std::vector<std::string> t = tokenize(card);
  e.name = lower(t.at(0));
  e.letter = e.name[0];
  auto need = [&](std::size_t n) {
    if (t.size() < n) problems.push_back("too few tokens in: " + card);
    return t.size() >= n;
  };
  auto nodes = [&](std::size_t n) {
    for (std::size_t k = 1; k <= n && k < t.size(); ++k) e.nodes.push_back(lower(t[k]));
  };
  std::vector<std::string> bare;
  switch (e.letter) {
    case 'r':
    case 'c':
    case 'l':
      if (!need(4)) break;
      nodes(2);
      e.value = t[3];
      take_params(t, 4, bare, e.params);
      break;
    case 'k':
      if (!need(4)) break;
      for (std::size_t k = 1; k + 1 < t.size(); ++k) e.controls.push_back(lower(t[k]));
      e.value = t.back();
      break;
    case 'd':
      if (!need(4)) break;
      nodes(2);
      e.model = lower(t[3]);
      take_params(t, 4, bare, e.params);
      break;
    case 'q': {
      if (!need(5)) break;
      const bool four = t.size() > 5 && models.count(lower(t[5])) != 0;  // 4th node present when token 5 is a model
      nodes(four ? 4 : 3);
      e.model = lower(t[four ? 5 : 4]);
      take_params(t, four ? 6 : 5, bare, e.params);
      break;
    }
    case 'm':
    case 's':
      if (!need(6)) break;
      nodes(4);
      e.model = lower(t[5]);
      take_params(t, 6, bare, e.params);
      break;
    case 'w':
      if (!need(5)) break;
      nodes(2);
      e.controls.push_back(lower(t[3]));
      e.model = lower(t[4]);
      take_params(t, 5, bare, e.params);
      break;
    case 'v':
    case 'i':
      if (!need(3)) break;
      nodes(2);
      parse_source(e, t, problems);
      break;
    default:
      problems.push_back("element type '" + std::string(1, e.letter) + "' not handled by the listing parser: " + card);
  }
  for (auto& b : bare) e.flags.push_back(lower(b));
  return e;
}

inline NgspiceModel parse_model(const std::string& card) {
  const std::vector<std::string> t = tokenize(card);
  NgspiceModel m;
  if (t.size() >= 3) {
    m.name = lower(t[1]);
    m.type = lower(t[2]);
    std::vector<std::string> bare;
    take_params(t, 3, bare, m.params);
  }
  return m;
}

}  // namespace ngspice_detail

/// Parses ngspice's `listing expand` output (stdout of the run).
inline NgspiceListing parse_ngspice_listing(std::string_view out) {
  NgspiceListing listing;
  std::vector<std::string> cards;
  for (const std::string& line : split_lines(out)) {
    // "    12 : r.x1.r1 in x1.mid 2.0e+03"
    std::size_t i = line.find_first_not_of(" \t");
    if (i == std::string::npos || !std::isdigit(static_cast<unsigned char>(line[i]))) continue;
    const std::size_t sep = line.find(" : ", i);
    if (sep == std::string::npos || line.find_first_not_of("0123456789", i) != sep) continue;
    std::string card = line.substr(sep + 3);
    while (!card.empty() && (card.back() == ' ' || card.back() == '\t')) card.pop_back();
    cards.push_back(card);
  }
  if (cards.empty()) return listing;
  listing.title = cards.front();
  for (std::size_t k = 1; k < cards.size(); ++k) {
    if (ngspice_detail::lower(cards[k].substr(0, 6)) == ".model") {
      NgspiceModel m = ngspice_detail::parse_model(cards[k]);
      listing.models[m.name] = m;
    }
  }
  for (std::size_t k = 1; k < cards.size(); ++k) {
    const std::string& c = cards[k];
    if (c.empty() || c[0] == '.' || c[0] == '*') continue;
    listing.elements.push_back(ngspice_detail::parse_element(c, listing.models, listing.problems));
  }
  return listing;
}

/// Parses the output of `print @a[b] ...` commands: the values printed for each expression.
inline std::map<std::string, std::vector<double>> parse_ngspice_prints(std::string_view out) {
  std::map<std::string, std::vector<double>> values;
  const std::vector<std::string> lines = split_lines(out);
  for (std::size_t k = 0; k < lines.size(); ++k) {
    const std::string& line = lines[k];
    if (line.empty() || line[0] != '@') continue;
    const std::size_t eq = line.find(" = ");
    if (eq == std::string::npos) continue;
    const std::string key = ngspice_detail::lower(line.substr(0, eq));
    std::string rest = line.substr(eq + 3);
    if (rest.find('(') != std::string::npos) {
      while (rest.find(')') == std::string::npos && k + 1 < lines.size()) rest += " " + lines[++k];
      rest = rest.substr(rest.find('(') + 1);
      rest = rest.substr(0, rest.find(')'));
    }
    std::vector<double> v;
    const char* p = rest.c_str();
    for (;;) {
      char* end = nullptr;
      const double d = std::strtod(p, &end);
      if (end == p) break;
      v.push_back(d);
      p = end;
    }
    values[key] = v;
  }
  return values;
}

/// Where ngspice is: `MAINSCHECK_NGSPICE` if set, else `ngspice` in PATH.
inline std::optional<std::string> find_ngspice() {
  if (const char* env = std::getenv("MAINSCHECK_NGSPICE"); env != nullptr && *env != '\0') return std::string(env);
  return find_program("ngspice");
}

/// Runs ngspice in batch mode on a control deck that sources `netlist` (from the netlist's own
/// directory, so its relative `.include`s resolve as ngspice resolves them) and then runs `commands`.
/// `scratch_dir` receives the control deck.
inline ProcessResult run_ngspice_commands(const std::string& ngspice, const std::filesystem::path& netlist,
                                          const std::vector<std::string>& commands,
                                          const std::filesystem::path& scratch_dir) {
  std::filesystem::create_directories(scratch_dir);
  const std::filesystem::path deck = scratch_dir / "reference.ctl";
  {
    std::ofstream f(deck);
    f << "* mainscheck reference run\n.control\nset numdgt=15\nsource " << netlist.filename().string() << "\n";
    for (const auto& c : commands) f << c << "\n";
    f << "quit\n.endc\n";
  }
  ProcessOptions opt;
  opt.working_dir = netlist.parent_path().string();
  opt.timeout = std::chrono::seconds(60);
  return run_process({ngspice, "-b", std::filesystem::absolute(deck).string()}, opt);
}

}  // namespace mainscheck::test_support
