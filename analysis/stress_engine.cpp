#include "analysis/stress_engine.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <set>

#include "analysis/formula_check.hpp"
#include "analysis/solve_netlist.hpp"

namespace mainscheck::analysis {

namespace {

/// Nominal value of each solved part that has one, so each corner scales from the nominal.
std::vector<std::pair<std::size_t, double>> nominal_values(const SolveNetlist& base) {
  std::vector<std::pair<std::size_t, double>> out;
  for (std::size_t i : base.request.parts) {
    if (const auto& v = base.netlist.parts[i].value) out.emplace_back(i, *v);
  }
  return out;
}

/// Moves the solved capacitor and resistor values of the solve netlist to the corner's tolerance side, in
/// place: a copy per corner would copy the whole board, of which only the front end is solved.
void scale_for(SolveNetlist& base, const std::vector<std::pair<std::size_t, double>>& nominal,
               const RecognitionResult& rec, const Corner& c) {
  for (const auto& [i, value] : nominal) {
    parser::Part& p = base.netlist.parts[i];
    p.value = value;
    const ToleranceSide side = p.kind == parser::PartKind::capacitor  ? c.scaling.capacitors
                               : p.kind == parser::PartKind::resistor ? c.scaling.resistors
                                                                      : ToleranceSide::nominal;
    if (side == ToleranceSide::nominal) continue;
    if (auto tol = rec.info[base.device_part[i]].number("tol")) *p.value = apply_tolerance(value, Tolerance{*tol, *tol}, side);
  }
}

/// Solve-netlist part indices as part indices of the device view.
std::vector<std::size_t> device_parts(const SolveNetlist& base, const std::vector<std::size_t>& local) {
  std::vector<std::size_t> out;
  out.reserve(local.size());
  for (std::size_t i : local) out.push_back(base.device_part[i]);
  return out;
}

/// The latch descriptors with their part and diac indices in the device view.
std::vector<solver::LatchSpec> device_latches(const SolveNetlist& base) {
  std::vector<solver::LatchSpec> out = base.request.latches;
  for (auto& l : out) {
    l.part = base.device_part[l.part];
    if (l.firing.diac_part && *l.firing.diac_part < base.device_part.size())
      l.firing.diac_part = base.device_part[*l.firing.diac_part];
    else
      l.firing.diac_part.reset();
  }
  return out;
}

/// Keeps the larger magnitude of a quantity across corners, with the corner it came from.
void keep_worst(std::map<Quantity, StressValue>& into, Quantity q, double v, const std::string& corner) {
  auto it = into.find(q);
  if (it == into.end() || std::fabs(v) > std::fabs(it->second.value)) into[q] = StressValue{v, corner, "solver", {}};
}

void keep_worst(std::optional<StressValue>& into, double v, const std::string& corner) {
  if (!into || std::fabs(v) > std::fabs(into->value)) into = StressValue{v, corner, "solver", {}};
}

std::string join(const std::vector<std::string>& parts) {
  std::string out;
  for (const auto& p : parts) out += (out.empty() ? "" : "; ") + p;
  return out;
}

/// Untyped low-BV diodes that recognition placed as shunt regulators (analysis::breakdown_candidate_V)
/// are zeners only when the solver holds them in breakdown: the reverse peak reaches BV (within 5 %,
/// the solver's model conducts IBV at BV). Either way the report states the decision.
void decide_breakdown_candidates(const RecognitionResult& rec, StressResult& res) {
  constexpr double kBreakdownReach = 0.95;
  std::set<std::size_t> seen;
  for (const auto& b : rec.blocks) {
    const auto role = b.roles.find("shunt_regulator");
    if (role == b.roles.end()) continue;
    for (std::size_t p : role->second) {
      const auto bv = breakdown_candidate_V(rec.info[p]);
      if (!bv || !seen.insert(p).second) continue;
      const PartStress* ps = res.find(p);
      const StressValue* vr = ps ? ps->get(Quantity::v_reverse_peak) : nullptr;
      const std::string& ref = rec.devices.parts[p].ref;
      if (vr && std::fabs(vr->value) >= kBreakdownReach * *bv) {
        std::string note = fmt::format("{} taken as zener: solved in breakdown ({:.3g} V reverse at {} against "
                                       "its model's BV={:g} V)",
                                       ref, std::fabs(vr->value), vr->corner, *bv);
        res.assumptions.push_back(note);
        res.taken_as_zener.emplace(p, std::move(note));
      } else {
        res.assumptions.push_back(fmt::format("{} (model BV={:g} V) in a shunt-regulator position is not solved in "
                                              "breakdown: checked as a rectifier diode",
                                              ref, *bv));
      }
    }
  }
}

void mark_blocks(StressResult& res, std::size_t n_blocks, const std::string& why) {
  res.blocks.clear();
  for (std::size_t b = 0; b < n_blocks; ++b) res.blocks.push_back(BlockStress{b, false, why, {}, {}});
  res.parts.clear();
  res.failure = why;
}

bool has_transformer(const RecognitionResult& rec) {
  return std::any_of(rec.blocks.begin(), rec.blocks.end(), [](const Block& b) {
    return b.kind == "isolation-transformer" || b.kind == "autotransformer";
  });
}

// Switch-on with every store empty at the highest line voltage: at both crests, so each diode of a
// bridge, centre tap or dual rail meets the polarity that charges through it, and at the zero
// crossing where a transformer is present (magnetising inrush is worst there). Each part keeps its
// worst instant.
void compute_inrush(const RecognitionResult& rec, SolveNetlist& base,
                    const std::vector<std::pair<std::size_t, double>>& nominal, const Corner& high,
                    const StressOptions& options, StressResult& res) {
  scale_for(base, nominal, rec, high);
  solver::SolveRequest req = base.request;
  req.supply.v_rms_V = high.v_rms_V;
  req.supply.f_Hz = high.f_Hz;
  std::vector<solver::SwitchOnInstant> instants{solver::SwitchOnInstant::positive_crest,
                                                solver::SwitchOnInstant::negative_crest};
  if (has_transformer(rec)) {
    instants.push_back(solver::SwitchOnInstant::zero_crossing);
    for (const auto& b : rec.blocks)
      if (b.kind == "isolation-transformer" || b.kind == "autotransformer")
        res.assumptions.push_back(fmt::format(
            "{} {}: windings modelled as linear inductors; the magnetising inrush of a saturating core at "
            "switch-on at the zero crossing (up to tens of times the rated current, common practice) is not "
            "simulated",
            b.id, b.kind));
  }
  InrushStress is;
  is.corner = high.name;
  std::optional<solver::InrushResult> kept;  // the run with the largest supply peak, for its waveform
  for (const auto at : instants) {
    solver::InrushResult in = solver::solve_inrush(base.netlist, req, at);
    if (!in.ok) {
      res.inrush_failure = fmt::format("switch-on at the {} ({}) could not be simulated: {}",
                                       solver::switch_on_instant_name(at), high.name, in.reason);
      return;
    }
    const std::string name = solver::switch_on_instant_name(at);
    for (const auto& p : in.parts) {
      const std::size_t part = base.device_part[p.part];
      auto [it, fresh] = is.per_part.try_emplace(part, p.i_peak_A, p.i2t_A2s);
      if (fresh || std::fabs(p.i_peak_A) > std::fabs(it->second.first)) {
        it->second.first = p.i_peak_A;
        is.per_part_instant[part] = name;
      }
      it->second.second = std::max(it->second.second, p.i2t_A2s);
    }
    is.i2t_A2s = std::max(is.i2t_A2s, in.i2t_A2s);
    if (!kept || in.i_peak_A > is.i_peak_A) {
      is.i_peak_A = in.i_peak_A;
      is.instant = name;
      kept = std::move(in);
    }
  }
  if (options.waveform_points != 0 && kept) {
    if (auto w = extract_trace(inrush_trace(), rec.devices, kept->waveforms, device_parts(base, kept->part_indices),
                               kept->t_switch_on_s, options.waveform_points)) {
      w->interval = "inrush";
      w->corner = is.where();
      res.waveforms.push_back(std::move(*w));
    }
  }
  res.inrush = std::move(is);
}

}  // namespace

StressResult compute_stresses(const RecognitionResult& rec, const CornerPlan& plan, const StressOptions& options) {
  StressResult res;
  if (plan.corners.empty()) {
    mark_blocks(res, rec.blocks.size(), "no supply corners to analyse");
    return res;
  }
  SolveNetlist base = build_solve_netlist(rec);
  base.request.options = options.solver;
  base.request.supply.r_source_Ohm = options.source_impedance.r_Ohm;
  base.request.supply.l_source_H = options.source_impedance.l_H;
  res.assumptions = base.assumptions;
  if (!options.source_impedance.origin.empty())
    res.assumptions.push_back(describe_source_impedance(options.source_impedance));
  if (!base.unsupported.empty()) {
    std::vector<std::string> why;
    for (const auto& [part, reason] : base.unsupported) why.push_back(reason);
    mark_blocks(res, rec.blocks.size(), "the front-end could not be modelled: " + join(why));
    return res;
  }
  if (base.request.parts.empty()) {
    mark_blocks(res, rec.blocks.size(), "no parts are connected to the mains");
    return res;
  }

  const std::vector<std::pair<std::size_t, double>> nominal = nominal_values(base);
  std::map<std::size_t, std::map<Quantity, StressValue>> worst;
  // Each trace is kept from the corner where its peak magnitude is largest (ties: the first corner).
  const std::vector<TraceSpec> traces =
      options.waveform_points == 0 ? std::vector<TraceSpec>{} : traces_that_matter(rec, device_latches(base));
  std::vector<std::optional<Waveform>> kept(traces.size());
  std::map<std::pair<parser::NetId, parser::NetId>, OutputStress> outputs;
  const Corner* high = &plan.corners.front();
  for (const Corner& c : plan.corners) {
    if (c.v_rms_V > high->v_rms_V) high = &c;
    scale_for(base, nominal, rec, c);
    const parser::Netlist& nl = base.netlist;
    solver::SolveRequest req = base.request;
    req.supply.v_rms_V = c.v_rms_V;
    req.supply.f_Hz = c.f_Hz;
    const solver::SteadyStateResult ss = solver::solve_steady_state(nl, req);
    if (!ss.converged) {
      mark_blocks(res, rec.blocks.size(), fmt::format("the solver did not converge at corner {}: {}", c.name, ss.reason));
      return res;
    }
    for (const auto& ps : ss.parts) {
      auto& w = worst[base.device_part[ps.part]];
      keep_worst(w, Quantity::v_peak, ps.v_peak_V, c.name);
      if (ps.v_reverse_peak_V) keep_worst(w, Quantity::v_reverse_peak, *ps.v_reverse_peak_V, c.name);
      keep_worst(w, Quantity::i_peak, ps.i_peak_A, c.name);
      keep_worst(w, Quantity::i_rms, ps.i_rms_A, c.name);
      keep_worst(w, Quantity::i_avg, ps.i_avg_A, c.name);
      keep_worst(w, Quantity::p_avg, ps.p_avg_W, c.name);
    }
    for (const auto& o : ss.outputs) {
      OutputStress& os = outputs[{o.net, o.ret}];
      os.net = o.net;
      os.ret = o.ret;
      keep_worst(os.v_dc, o.v_dc_V, c.name);
      keep_worst(os.v_ripple_pp, o.v_ripple_pp_V, c.name);
      keep_worst(os.v_rms, o.v_rms_V, c.name);
      // The smallest output (low line): whether a regulator behind it is still reached.
      if (!os.v_dc_lowest || std::fabs(o.v_dc_V) < std::fabs(os.v_dc_lowest->value)) {
        os.v_dc_lowest = StressValue{o.v_dc_V, c.name, "solver", {}};
        os.v_ripple_pp_at_lowest = StressValue{o.v_ripple_pp_V, c.name, "solver", {}};
      }
    }
    for (std::size_t k = 0; k < traces.size(); ++k) {
      const double t0 = ss.waveforms.t_s.empty() ? 0.0 : ss.waveforms.t_s.front();
      auto w = extract_trace(traces[k], rec.devices, ss.waveforms, device_parts(base, ss.part_indices), t0, options.waveform_points);
      if (!w || (kept[k] && peak_magnitude(*w) <= peak_magnitude(*kept[k]))) continue;
      w->interval = "period";
      w->corner = c.name;
      kept[k] = std::move(w);
    }
    keep_worst(res.supply.i_rms, ss.supply.i_rms_A, c.name);
    keep_worst(res.supply.i_peak, ss.supply.i_peak_A, c.name);
    if (&c == high || !res.supply.power_factor) res.supply.power_factor = ss.supply.power_factor;
  }
  res.supply.corner = res.supply.i_rms ? res.supply.i_rms->corner : "";
  for (auto& [part, values] : worst) res.parts.push_back(PartStress{part, std::move(values)});
  for (auto& w : kept) {
    if (w) res.waveforms.push_back(std::move(*w));
  }

  compute_inrush(rec, base, nominal, *high, options, res);

  for (std::size_t b = 0; b < rec.blocks.size(); ++b) {
    BlockStress bs{b, true, "", {}, {}};
    for (const auto& o : rec.blocks[b].outputs) {
      auto it = outputs.find({o.net, o.ret});
      if (it != outputs.end()) bs.outputs.push_back(it->second);
    }
    res.blocks.push_back(std::move(bs));
  }
  decide_breakdown_candidates(rec, res);
  cross_check_formulas(rec, plan, options.formula_margin, res);
  return res;
}

}  // namespace mainscheck::analysis
