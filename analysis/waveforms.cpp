#include "analysis/waveforms.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <set>

namespace mainscheck::analysis {

namespace {

const std::set<std::string> kRectifiers{"bridge-rectifier", "half-wave-rectifier", "centre-tap-rectifier",
                                        "dual-rail-rectifier"};
const std::set<std::string> kDroppers{"capacitive-dropper", "resistive-dropper"};
const std::set<std::string> kMultipliers{"voltage-doubler", "switchable-doubler", "half-wave-doubler",
                                         "voltage-quadrupler", "cockcroft-walton"};

std::vector<std::size_t> role(const Block& b, const char* name) {
  auto it = b.roles.find(name);
  return it == b.roles.end() ? std::vector<std::size_t>{} : it->second;
}

class SpecList {
 public:
  SpecList(const RecognitionResult& rec, const Block& b, std::vector<TraceSpec>& out)
      : rec_(rec), b_(b), out_(out), start_(out.size()) {}

  void current(std::size_t part, std::string suffix = {}) {
    add({rec_.devices.parts[part].ref + " current" + suffix, b_.id, TraceSource::part_current, part, {}, {}});
  }
  void voltage(std::size_t part, const char* what) {
    add({fmt::format("{} voltage ({})", rec_.devices.parts[part].ref, what), b_.id, TraceSource::part_voltage, part,
         {}, {}});
  }
  /// Each output of the block as a net pair, naming the reservoir capacitor that sits across it.
  void outputs(std::initializer_list<const char*> reservoir_roles) {
    for (const BlockOutput& o : b_.outputs) {
      if (o.ac) continue;
      std::string name = fmt::format("{} − {} voltage", rec_.devices.net(o.net).name, rec_.devices.net(o.ret).name);
      for (const char* r : reservoir_roles) {
        for (std::size_t c : role(b_, r)) {
          const auto& nets = rec_.devices.parts[c].nets;
          if (nets.size() == 2 && ((nets[0] == o.net && nets[1] == o.ret) || (nets[0] == o.ret && nets[1] == o.net)))
            name += " (reservoir " + rec_.devices.parts[c].ref + ")";
        }
      }
      add({name, b_.id, TraceSource::net_voltage, 0, o.net, o.ret});
    }
  }

 private:
  void add(TraceSpec s) {
    if (out_.size() - start_ < kMaxTracesPerBlock) out_.push_back(std::move(s));
  }
  const RecognitionResult& rec_;
  const Block& b_;
  std::vector<TraceSpec>& out_;
  std::size_t start_;
};

std::string firing_of(const std::vector<solver::LatchSpec>& latches, std::size_t part, const parser::Netlist& devs) {
  for (const auto& l : latches) {
    if (l.part != part) continue;
    if (l.firing.alpha_deg) return fmt::format(" (fired at {:.0f}°)", *l.firing.alpha_deg);
    if (l.firing.delay_s) return fmt::format(" (fired {:.3g} ms after each zero crossing)", *l.firing.delay_s * 1e3);
    if (l.firing.diac_part) return " (fired by " + devs.parts[*l.firing.diac_part].ref + ")";
  }
  return {};
}

}  // namespace

std::vector<TraceSpec> traces_that_matter(const RecognitionResult& rec, const std::vector<solver::LatchSpec>& latches) {
  std::vector<TraceSpec> out;
  for (const Block& b : rec.blocks) {
    SpecList s(rec, b, out);
    if (kRectifiers.count(b.kind) != 0) {
      for (const char* r : {"diodes", "diode", "bridge"})
        for (std::size_t p : role(b, r)) s.current(p);
      s.outputs({"reservoir", "reservoir_pos", "reservoir_neg"});
    } else if (kDroppers.count(b.kind) != 0) {
      for (const char* r : {"series_capacitor", "series_resistor"})
        for (std::size_t p : role(b, r)) s.current(p);
      s.outputs({"reservoir"});
    } else if (kMultipliers.count(b.kind) != 0) {
      s.outputs({});
      for (const char* r : {"upper_capacitor", "lower_capacitor", "smoothing_capacitor"})
        for (std::size_t p : role(b, r)) s.voltage(p, "stage");
    } else if (b.kind == "phase-control") {
      for (const char* r : {"triac", "thyristor"})
        for (std::size_t p : role(b, r)) s.current(p, firing_of(latches, p, rec.devices));
    }
  }
  return out;
}

TraceSpec inrush_trace() { return {"supply current at switch-on", "", TraceSource::supply_current, 0, {}, {}}; }

std::optional<Waveform> extract_trace(const TraceSpec& spec, const parser::Netlist& devices, const solver::Waveforms& w,
                                      const std::vector<std::size_t>& part_indices, double t0_s,
                                      std::size_t max_points) {
  // v_net_V is empty for nets outside the solved set; the ground net reads 0 V.
  auto net_v = [&](parser::NetId n) -> const std::vector<double>* {
    return n < w.v_net_V.size() && w.v_net_V[n].size() == w.t_s.size() ? &w.v_net_V[n] : nullptr;
  };
  const std::vector<double> zeros(w.t_s.size(), 0.0);
  auto net_or_ground = [&](parser::NetId n) -> const std::vector<double>* {
    const std::vector<double>* v = net_v(n);
    return v != nullptr ? v : n == parser::kGroundNet ? &zeros : nullptr;
  };
  Waveform out;
  out.name = spec.name;
  out.block = spec.block;
  std::vector<double> y;
  switch (spec.source) {
    case TraceSource::part_current: {
      auto it = std::find(part_indices.begin(), part_indices.end(), spec.part);
      if (it == part_indices.end()) return std::nullopt;
      const auto& i = w.i_part_A[static_cast<std::size_t>(it - part_indices.begin())];
      if (i.size() != w.t_s.size()) return std::nullopt;
      y = i;
      out.quantity = "current";
      out.part = devices.parts[spec.part].ref;
      break;
    }
    case TraceSource::part_voltage:
    case TraceSource::net_voltage: {
      parser::NetId a = spec.net, b = spec.ret;
      if (spec.source == TraceSource::part_voltage) {
        const auto& nets = devices.parts[spec.part].nets;
        if (nets.size() < 2) return std::nullopt;
        a = nets[0];
        b = nets[1];
        out.part = devices.parts[spec.part].ref;
      }
      const std::vector<double>* va = net_or_ground(a);
      const std::vector<double>* vb = net_or_ground(b);
      if (va == nullptr || vb == nullptr) return std::nullopt;
      y.resize(w.t_s.size());
      for (std::size_t k = 0; k < y.size(); ++k) y[k] = (*va)[k] - (*vb)[k];
      out.quantity = "voltage";
      out.net = devices.net(a).name;
      out.ret = devices.net(b).name;
      break;
    }
    case TraceSource::supply_current:
      if (w.i_supply_A.size() != w.t_s.size()) return std::nullopt;
      y = w.i_supply_A;
      out.quantity = "current";
      break;
  }
  if (y.empty()) return std::nullopt;
  out.unit = out.quantity == "current" ? "A" : "V";
  out.t_s.reserve(w.t_s.size());
  for (double t : w.t_s) out.t_s.push_back(t - t0_s);
  out.values = std::move(y);
  decimate_min_max(out.t_s, out.values, max_points);
  return out;
}

void decimate_min_max(std::vector<double>& t, std::vector<double>& y, std::size_t max_points) {
  max_points = std::max<std::size_t>(max_points, 4);
  const std::size_t n = std::min(t.size(), y.size());
  if (n <= max_points) return;
  const std::size_t buckets = (max_points - 2) / 2;
  const std::size_t inner = n - 2;  // samples 1 .. n-2
  std::vector<double> tt{t.front()}, yy{y.front()};
  for (std::size_t b = 0; b < buckets; ++b) {
    const std::size_t lo = 1 + b * inner / buckets, hi = 1 + (b + 1) * inner / buckets;
    if (lo >= hi) continue;
    std::size_t imin = lo, imax = lo;
    for (std::size_t k = lo; k < hi; ++k) {
      if (y[k] < y[imin]) imin = k;
      if (y[k] > y[imax]) imax = k;
    }
    const std::size_t first = std::min(imin, imax), second = std::max(imin, imax);
    tt.push_back(t[first]);
    yy.push_back(y[first]);
    if (second != first) {
      tt.push_back(t[second]);
      yy.push_back(y[second]);
    }
  }
  tt.push_back(t[n - 1]);
  yy.push_back(y[n - 1]);
  t = std::move(tt);
  y = std::move(yy);
}

double peak_magnitude(const Waveform& w) {
  double m = 0;
  for (double v : w.values) m = std::max(m, std::fabs(v));
  return m;
}

}  // namespace mainscheck::analysis
