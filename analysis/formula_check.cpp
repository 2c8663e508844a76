#include "analysis/formula_check.hpp"

#include <cmath>

#include "analysis/formulas/multiplier.hpp"
#include "analysis/formulas/rectifier.hpp"

namespace mainscheck::analysis {

namespace {

using formulas::RectifierKind;

std::optional<RectifierKind> rectifier_kind(const std::string& kind) {
  if (kind == "half-wave-rectifier") return RectifierKind::half_wave;
  if (kind == "bridge-rectifier") return RectifierKind::bridge;
  if (kind == "centre-tap-rectifier") return RectifierKind::centre_tap;
  if (kind == "dual-rail-rectifier") return RectifierKind::dual_rail;
  return std::nullopt;
}

const Corner* corner_named(const CornerPlan& plan, const std::string& name) {
  for (const auto& c : plan.corners) {
    if (c.name == name) return &c;
  }
  return nullptr;
}

/// Crest of the AC driving a block at a corner: mains crest times the feeding source's ratio
/// (a transformer secondary), halved for the half windings of centre-tapped rectifiers.
double drive_peak_V(const RecognitionResult& rec, const Block& b, const Corner& c, bool half_winding) {
  double ratio = 1.0;
  if (b.fed_by && *b.fed_by < rec.ac_sources.size() && rec.ac_sources[*b.fed_by].v_ratio) {
    ratio = *rec.ac_sources[*b.fed_by].v_ratio;
  }
  return std::sqrt(2.0) * c.v_rms_V * ratio * (half_winding ? 0.5 : 1.0);
}

void compare(StressValue& v, double formula, double margin, std::size_t part, const char* quantity,
             BlockStress& bs) {
  v.formula_value = formula;
  const double scale = std::max(std::fabs(v.value), std::fabs(formula));
  if (scale > 0 && std::fabs(v.value - formula) / scale > margin) {
    bs.disagreements.push_back(Disagreement{part, quantity, v.value, formula, margin});
  }
}

PartStress* find_part(StressResult& res, std::size_t part) {
  for (auto& p : res.parts) {
    if (p.part == part) return &p;
  }
  return nullptr;
}

double role_sum(const Block& b, const char* role, const RecognitionResult& rec) {
  double sum = 0;
  auto it = b.roles.find(role);
  if (it == b.roles.end()) return 0;
  for (std::size_t p : it->second) sum += rec.devices.parts[p].value.value_or(0);
  return sum;
}

void check_rectifier(const RecognitionResult& rec, const CornerPlan& plan, double margin, const Block& b,
                     RectifierKind kind, StressResult& res, BlockStress& bs) {
  const bool half = kind == RectifierKind::centre_tap || kind == RectifierKind::dual_rail;
  auto diodes = b.roles.find("diodes");
  if (diodes == b.roles.end()) return;
  double i_diode_sum = 0;
  for (std::size_t d : diodes->second) {
    PartStress* ps = find_part(res, d);
    if (ps == nullptr) continue;
    if (auto it = ps->values.find(Quantity::i_avg); it != ps->values.end()) i_diode_sum += std::fabs(it->second.value);
    auto vr = ps->values.find(Quantity::v_reverse_peak);
    const Corner* c = vr != ps->values.end() ? corner_named(plan, vr->second.corner) : nullptr;
    if (c == nullptr) continue;
    // No-load peak inverse voltage is the worst case the formula gives; the solver's includes the load.
    compare(vr->second, formulas::diode_reverse_peak_V(kind, drive_peak_V(rec, b, *c, half), 0.0), margin, d,
            "v_reverse_peak", bs);
  }
  const double c_F = role_sum(b, "reservoir", rec);
  if (c_F <= 0 || bs.outputs.empty() || !bs.outputs.front().v_dc) return;
  StressValue& v_dc = *bs.outputs.front().v_dc;
  const Corner* c = corner_named(plan, v_dc.corner);
  if (c == nullptr) return;
  formulas::RectifierInput in;
  in.kind = kind;
  in.v_peak_V = drive_peak_V(rec, b, *c, half);
  in.f_Hz = c->f_Hz;
  in.c_F = kind == RectifierKind::dual_rail ? c_F / 2 : c_F;
  // Load current of one rail from the diodes' mean currents: a bridge passes it through two diodes
  // in each half cycle, so the four means sum to twice the load current.
  in.i_dc_A = kind == RectifierKind::bridge ? i_diode_sum / 2 : kind == RectifierKind::dual_rail ? i_diode_sum / 2
                                                                                                  : i_diode_sum;
  in.v_f_V = 0.8;  // common practice: silicon rectifier forward drop near its repetitive peak current
  if (auto est = formulas::estimate_rectifier(in); est && est->small_ripple) {
    compare(v_dc, est->v_dc_V, margin, SIZE_MAX, "v_dc", bs);
  }
}

}  // namespace

void cross_check_formulas(const RecognitionResult& rec, const CornerPlan& plan, double margin, StressResult& res) {
  for (BlockStress& bs : res.blocks) {
    if (!bs.converged) continue;
    const Block& b = rec.blocks[bs.block];
    if (auto kind = rectifier_kind(b.kind)) {
      check_rectifier(rec, plan, margin, b, *kind, res, bs);
      continue;
    }
    if (b.kind == "cockcroft-walton" && b.figures.count("stages") && !bs.outputs.empty() && bs.outputs.front().v_dc) {
      StressValue& v_dc = *bs.outputs.front().v_dc;
      const Corner* c = corner_named(plan, v_dc.corner);
      if (c == nullptr) continue;
      const int n = static_cast<int>(b.figures.at("stages"));
      // Compared with the no-load bound 2 n Vpk only: a loaded cascade sits below it, never above.
      const formulas::MultiplierInput no_load{drive_peak_V(rec, b, *c, false), c->f_Hz, 1.0, 0.0, 0.0};
      if (auto est = formulas::estimate_cockcroft_walton(n, no_load)) {
        v_dc.formula_value = est->v_no_load_V;
        if (v_dc.value > est->v_no_load_V * (1 + margin)) {
          bs.disagreements.push_back(Disagreement{SIZE_MAX, "v_dc", v_dc.value, est->v_no_load_V, margin});
        }
      }
    }
  }
}

}  // namespace mainscheck::analysis
