#pragma once
// Shared by the solver's ngspice test and benchmark: the `*@` metadata of the decks in
// tests/data/solver/, the SolveRequest they describe, the ngspice-39 control deck that runs the same
// circuit to steady state, and the stresses computed from ngspice's wrdata output.
//
// Deck metadata (comment lines, ignored by ngspice and by the SPICE reader):
//   *@ supply V1                         the mains source
//   *@ output NET RETURN                 an output to report (repeatable)
//   *@ periods N                         mains periods ngspice integrates to reach steady state
//   *@ latch S1 triac alpha=90 ron=0.05 ihold=0.01   solve S1 as a latching triac fired at alpha
//   *@ inrush                            also compare switch-on at the peak (deck source has phase 90)
#include <sys/resource.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include "analysis/solver/solver.hpp"
#include "analysis/solver/stresses.hpp"
#include "parser/netlist.hpp"
#include "support/process_runner.hpp"

namespace mainscheck::test_support::solver_ref {

struct LatchLine {
  std::string ref;
  analysis::solver::LatchKind kind = analysis::solver::LatchKind::triac;
  double alpha_deg = 90, r_on_Ohm = 0.05, i_hold_A = 0.01;
};

struct DeckSpec {
  std::string supply;
  std::vector<std::pair<std::string, std::string>> outputs;
  int periods = 60;
  std::vector<LatchLine> latches;
  bool inrush = false;
};

inline std::string lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

inline DeckSpec parse_spec(const std::string& text) {
  DeckSpec s;
  std::istringstream in(text);
  std::string line;
  while (std::getline(in, line)) {
    if (line.rfind("*@", 0) != 0) continue;
    std::istringstream ls(line.substr(2));
    std::string key;
    ls >> key;
    if (key == "supply") ls >> s.supply;
    if (key == "periods") ls >> s.periods;
    if (key == "inrush") s.inrush = true;
    if (key == "output") {
      std::string a, b;
      ls >> a >> b;
      s.outputs.emplace_back(a, b);
    }
    if (key == "latch") {
      LatchLine l;
      std::string kind, kv;
      ls >> l.ref >> kind;
      l.kind = kind == "thyristor" ? analysis::solver::LatchKind::thyristor : analysis::solver::LatchKind::triac;
      while (ls >> kv) {
        const auto eq = kv.find('=');
        if (eq == std::string::npos) continue;
        const std::string k = kv.substr(0, eq);
        const double v = std::stod(kv.substr(eq + 1));
        if (k == "alpha") l.alpha_deg = v;
        if (k == "ron") l.r_on_Ohm = v;
        if (k == "ihold") l.i_hold_A = v;
      }
      s.latches.push_back(l);
    }
  }
  return s;
}

/// The request the deck describes; with_latches=false solves latch parts as the deck's plain switches.
inline std::optional<analysis::solver::SolveRequest> make_request(const parser::Netlist& nl, const DeckSpec& spec,
                                                                  bool with_latches, std::string& error) {
  analysis::solver::SolveRequest req;
  const auto sup = nl.find_part_index(spec.supply);
  if (!sup) {
    error = "no supply part " + spec.supply;
    return std::nullopt;
  }
  const auto ms = analysis::solver::supply_from_sine_source(nl, *sup);
  if (!ms) {
    error = "supply " + spec.supply + " is not a SIN source";
    return std::nullopt;
  }
  req.supply = *ms;
  for (const auto& [a, b] : spec.outputs) {
    const auto na = nl.find_net(a), nb = nl.find_net(b);
    if (!na || !nb) {
      error = "unknown output net " + a + "/" + b;
      return std::nullopt;
    }
    req.outputs.push_back({*na, *nb});
  }
  if (with_latches)
    for (const auto& l : spec.latches) {
      analysis::solver::LatchSpec ls;
      const auto pi = nl.find_part_index(l.ref);
      if (!pi) {
        error = "no latch part " + l.ref;
        return std::nullopt;
      }
      ls.part = *pi;
      ls.kind = l.kind;
      ls.firing.alpha_deg = l.alpha_deg;
      ls.r_on_Ohm = l.r_on_Ohm;
      ls.i_hold_A = l.i_hold_A;
      req.latches.push_back(ls);
    }
  return req;
}

/// ngspice's name of the current into a part's first pin, or empty for parts without one.
inline std::string current_vector(const parser::Part& p) {
  const std::string r = lower(p.ref);
  switch (p.kind) {
    case parser::PartKind::resistor: return "@" + r + "[i]";
    case parser::PartKind::capacitor: return "@" + r + "[i]";
    case parser::PartKind::inductor: return "i(" + r + ")";
    case parser::PartKind::diode: return "@" + r + "[id]";
    case parser::PartKind::vsource: return "i(" + r + ")";
    case parser::PartKind::vswitch: return "@" + r + "[i]";
    default: return {};
  }
}

/// A copy of the deck with a control block that runs the transient and writes every node voltage and
/// part current with wrdata. Steady state: the last two periods of spec.periods; inrush: the first
/// half period from zero initial conditions (uic).
inline std::string ngspice_deck(const std::string& text, const parser::Netlist& nl, const DeckSpec& spec,
                                double period_s, bool inrush, const std::string& out_file) {
  std::string body = text;
  const auto end = lower(body).rfind(".end");
  if (end != std::string::npos) body.erase(end);
  std::ostringstream d;
  d << body;
  // reltol tighter than ngspice's default 1e-3 and a maximum step of T/1000, so that the reference
  // is converged to well below the 3 % comparison band; rshunt matches the solver's default shunt.
  d << ".options reltol=1e-4 abstol=1e-12 vntol=1e-6 rshunt=1e9\n";
  d << ".control\nset wr_singlescale\nset wr_vecnames\nset numdgt=12\n";
  std::vector<std::string> vecs;
  for (std::size_t n = 1; n < nl.nets().size(); ++n) vecs.push_back("v(" + nl.net(static_cast<parser::NetId>(n)).key + ")");
  for (const auto& p : nl.parts) {
    const std::string v = current_vector(p);
    if (!v.empty()) vecs.push_back(v);
  }
  d << "save";
  for (const auto& v : vecs) d << " " << v;
  d << "\n";
  const double tmax = period_s / 1000;
  if (inrush)
    d << "tran " << tmax << " " << period_s / 2 << " 0 " << tmax / 4 << " uic\n";
  else
    d << "tran " << tmax << " " << spec.periods * period_s << " " << (spec.periods - 2) * period_s << " " << tmax << "\n";
  d << "wrdata " << out_file;
  for (const auto& v : vecs) d << " " << v;
  d << "\nquit\n.endc\n.end\n";
  return d.str();
}

/// Columns of a wrdata file (wr_singlescale, wr_vecnames): "time" and each vector name.
inline std::map<std::string, std::vector<double>> read_wrdata(const std::filesystem::path& file) {
  std::map<std::string, std::vector<double>> cols;
  std::ifstream f(file);
  std::string line;
  if (!std::getline(f, line)) return cols;
  std::vector<std::string> names;
  {
    std::istringstream hs(line);
    std::string n;
    while (hs >> n) names.push_back(lower(n));
  }
  while (std::getline(f, line)) {
    std::istringstream ls(line);
    double v;
    std::size_t i = 0;
    while (ls >> v && i < names.size()) cols[names[i++]].push_back(v);
  }
  return cols;
}

/// Runs ngspice on a generated deck; returns the columns and adds the child's CPU seconds to cpu_s.
inline std::map<std::string, std::vector<double>> run_ngspice(const std::string& ngspice, const std::string& deck,
                                                              const std::filesystem::path& scratch, std::string& log,
                                                              double* cpu_s = nullptr) {
  std::filesystem::create_directories(scratch);
  {
    std::ofstream f(scratch / "deck.cir");
    f << deck;
  }
  std::filesystem::remove(scratch / "out.txt");
  rusage before{}, after{};
  getrusage(RUSAGE_CHILDREN, &before);
  ProcessOptions opt;
  opt.working_dir = scratch.string();
  opt.timeout = std::chrono::seconds(300);
  const ProcessResult r = run_process({ngspice, "-b", "deck.cir"}, opt);
  getrusage(RUSAGE_CHILDREN, &after);
  if (cpu_s) {
    auto secs = [](const timeval& t) { return t.tv_sec + t.tv_usec * 1e-6; };
    *cpu_s += secs(after.ru_utime) - secs(before.ru_utime) + secs(after.ru_stime) - secs(before.ru_stime);
  }
  log = r.err;
  if (!r.exited() || r.exit_code != 0) {
    log = "ngspice failed: " + r.error + " exit " + std::to_string(r.exit_code) + "\n" + r.err;
    return {};
  }
  return read_wrdata(scratch / "out.txt");
}

/// Reference figures from ngspice samples of one period [t_end − T, t_end].
struct Reference {
  std::vector<analysis::solver::PartStress> parts;   // same order as the solver's part_indices
  std::vector<analysis::solver::OutputStress> outputs;
  analysis::solver::SupplyStress supply;
  double drift = 0;  // largest relative change of an output mean between the last two periods
};

inline std::vector<double> window(const std::vector<double>& t, const std::vector<double>& y, double t0, double t1) {
  std::vector<double> out;
  for (std::size_t k = 0; k < t.size(); ++k)
    if (t[k] > t0 + 1e-12 && t[k] <= t1 + 1e-12) out.push_back(y[k]);
  return out;
}

inline Reference reference_from(const std::map<std::string, std::vector<double>>& cols, const parser::Netlist& nl,
                                const analysis::solver::SolveRequest& req,
                                const std::vector<std::size_t>& part_indices, double period_s) {
  using analysis::solver::detail::periodic_mean;
  using analysis::solver::detail::periodic_rms;
  Reference ref;
  const auto& t_all = cols.at("time");
  const double t1 = t_all.back(), t0 = t1 - period_s;
  const std::vector<double> t = window(t_all, t_all, t0, t1);
  auto node = [&](parser::NetId n, double a, double b) {
    if (n == parser::kGroundNet) return std::vector<double>(window(t_all, t_all, a, b).size(), 0.0);
    return window(t_all, cols.at("v(" + nl.net(n).key + ")"), a, b);
  };
  auto sub = [](std::vector<double> a, const std::vector<double>& b) {
    for (std::size_t i = 0; i < a.size(); ++i) a[i] -= b[i];
    return a;
  };
  auto max_abs = [](const std::vector<double>& y) {
    double m = 0;
    for (double v : y) m = std::max(m, std::abs(v));
    return m;
  };
  for (std::size_t pi : part_indices) {
    const parser::Part& p = nl.parts[pi];
    analysis::solver::PartStress s;
    s.part = pi;
    s.ref = p.ref;
    const auto v = sub(node(p.nets[0], t0, t1), node(p.nets[1], t0, t1));
    const auto i = window(t_all, cols.at(lower(current_vector(p))), t0, t1);
    s.v_peak_V = max_abs(v);
    if (p.kind == parser::PartKind::diode || p.kind == parser::PartKind::vswitch) {
      double m = -1e300;
      for (double x : v) m = std::max(m, -x);
      s.v_reverse_peak_V = m;
    }
    s.i_peak_A = max_abs(i);
    s.i_rms_A = periodic_rms(t, i, period_s);
    s.i_avg_A = periodic_mean(t, i, period_s);
    std::vector<double> pw(v.size());
    for (std::size_t k = 0; k < v.size(); ++k) pw[k] = v[k] * i[k];
    s.p_avg_W = periodic_mean(t, pw, period_s);
    ref.parts.push_back(s);
  }
  for (const auto& o : req.outputs) {
    analysis::solver::OutputStress s;
    s.net = o.net;
    s.ret = o.ret;
    const auto v = sub(node(o.net, t0, t1), node(o.ret, t0, t1));
    s.v_dc_V = periodic_mean(t, v, period_s);
    s.v_ripple_pp_V = *std::max_element(v.begin(), v.end()) - *std::min_element(v.begin(), v.end());
    const auto t_prev = window(t_all, t_all, t0 - period_s, t0);
    const auto v_prev = sub(node(o.net, t0 - period_s, t0), node(o.ret, t0 - period_s, t0));
    if (!t_prev.empty()) {
      const double prev = periodic_mean(t_prev, v_prev, period_s);
      ref.drift = std::max(ref.drift, std::abs(prev - s.v_dc_V) /
                                          std::max({1e-9, std::abs(s.v_dc_V), s.v_ripple_pp_V}));
    }
    ref.outputs.push_back(s);
  }
  const parser::Part& sp = nl.parts[*req.supply.source_part];
  const auto vs = sub(node(sp.nets[0], t0, t1), node(sp.nets[1], t0, t1));
  auto is = window(t_all, cols.at(lower(current_vector(sp))), t0, t1);
  for (double& x : is) x = -x;
  ref.supply.v_rms_V = periodic_rms(t, vs, period_s);
  ref.supply.i_rms_A = periodic_rms(t, is, period_s);
  ref.supply.i_peak_A = max_abs(is);
  std::vector<double> pw(vs.size());
  for (std::size_t k = 0; k < vs.size(); ++k) pw[k] = vs[k] * is[k];
  ref.supply.p_avg_W = periodic_mean(t, pw, period_s);
  ref.supply.power_factor = ref.supply.p_avg_W / (ref.supply.v_rms_V * ref.supply.i_rms_A);
  return ref;
}

/// Inrush reference: peak |i| and ∫i²dt of the supply and of each part over ngspice's half period.
struct InrushReference {
  double i_peak_A = 0, i2t_A2s = 0;
  std::map<std::size_t, std::pair<double, double>> parts;  // part index → (i_peak, I²t)
};

inline InrushReference inrush_reference_from(const std::map<std::string, std::vector<double>>& cols,
                                             const parser::Netlist& nl, const std::vector<std::size_t>& part_indices,
                                             std::size_t supply) {
  InrushReference r;
  const auto& t = cols.at("time");
  auto stats = [&](const std::vector<double>& i) {
    double pk = 0, s = 0;
    for (std::size_t k = 0; k < i.size(); ++k) {
      pk = std::max(pk, std::abs(i[k]));
      if (k > 0) s += (t[k] - t[k - 1]) * 0.5 * (i[k] * i[k] + i[k - 1] * i[k - 1]);
    }
    return std::make_pair(pk, s);
  };
  std::tie(r.i_peak_A, r.i2t_A2s) = stats(cols.at(lower(current_vector(nl.parts[supply]))));
  for (std::size_t pi : part_indices) {
    const std::string v = lower(current_vector(nl.parts[pi]));
    if (cols.count(v)) r.parts[pi] = stats(cols.at(v));
  }
  return r;
}

}  // namespace mainscheck::test_support::solver_ref
