// Flattening of an XML design: blocks are expanded with an explicit stack (no recursion, depth
// bounded by ReadLimits::max_subckt_depth), refs become `X1.R2` and internal nets `x1.<net>`,
// the same naming as the SPICE reader (spice-syntax checklist item 60).
#include <fmt/format.h>

#include <set>

#include "parser/xml_design.hpp"

namespace mainscheck::parser {
namespace {

struct Frame {
  const XmlScope* scope = nullptr;
  std::size_t next = 0;
  std::string ref_prefix;                       // "X1.X2." in original case
  std::string net_prefix;                       // "x1.x2." in lower case
  std::map<std::string, std::string> pin_nets;  // lower-case block pin -> caller's net name
  std::vector<SourceLoc> path;
  std::vector<std::size_t> blocks;  // block indices from the outermost instance down
};

class Flattener {
 public:
  Flattener(XmlDesign& design, DiagnosticSink& diags, const ReadLimits& limits)
      : design_(design), diags_(diags), limits_(limits) {}

  Netlist run() {
    nl_.title = design_.title;
    nl_.models = design_.models;
    stack_.push_back(Frame{&design_.top, 0, "", "", {}, {}, {}});
    while (!stack_.empty() && !stopped_) {
      Frame& f = stack_.back();
      if (f.next == f.scope->order.size()) {
        annotate_nets(f);
        stack_.pop_back();
        continue;
      }
      const XmlScope::Item item = f.scope->order[f.next++];
      if (item.instance) {
        enter(f.scope->instances[item.index]);  // may push: `f` is not used after this
      } else {
        emit(f, f.scope->parts[item.index]);
      }
    }
    if (!stopped_) add_supply();
    return std::move(nl_);
  }

 private:
  std::string net_name(const Frame& f, const std::string& local) const {
    if (is_ground_name(local)) return "0";
    auto it = f.pin_nets.find(to_lower(local));
    if (it != f.pin_nets.end()) return it->second;
    return f.net_prefix + local;
  }

  NetId net(const Frame& f, const XmlPinRef& pin) { return nl_.intern_net(net_name(f, pin.net), pin.loc); }

  bool room_for_part(SourceLoc loc) {
    if (nl_.parts.size() < limits_.max_parts) return true;
    diags_.error(loc, fmt::format("the netlist has more than {} parts after flattening (limit max_parts)",
                                  limits_.max_parts));
    stopped_ = true;
    return false;
  }

  void emit(const Frame& f, const XmlPartDecl& d) {
    if (d.transformer) {
      emit_transformer(f, d);
      return;
    }
    if (!room_for_part(d.part.loc)) return;
    Part p = d.part;
    p.ref = f.ref_prefix + p.ref;
    for (auto& c : p.controls) c = f.ref_prefix + c;
    for (const auto& pin : d.pins) {
      p.nets.push_back(net(f, pin));
      p.pin_names.push_back(pin.pin);
    }
    p.instance_path = f.path;
    nl_.add_part(std::move(p));
  }

  // A transformer becomes one inductor per winding and a coupling between them, grouped as an
  // Instance so analysis/ can present it as one part, as it does for a SPICE transformer subcircuit.
  void emit_transformer(const Frame& f, const XmlPartDecl& d) {
    const std::string ref = f.ref_prefix + d.part.ref;
    Instance inst{ref, "transformer", {}, {}, d.part.loc};
    Part k;
    k.ref = ref + ".k";
    k.kind = PartKind::coupling;
    k.type_name = "coupling";
    k.value = d.k;
    k.params = d.part.params;
    k.loc = d.part.loc;
    k.instance_path = f.path;
    k.instance_path.push_back(d.part.loc);
    for (const auto& w : d.windings) {
      if (!room_for_part(w.loc)) return;
      Part l;
      l.ref = ref + "." + w.name;
      l.kind = PartKind::inductor;
      l.type_name = "inductor";
      l.value = w.l_H;
      l.params = w.params;
      if (!l.params.count("type")) l.params.emplace("type", Param{"transformer-winding", std::nullopt, w.loc});
      l.nets = {net(f, w.start), net(f, w.end)};
      l.pin_names = {"1", "2"};
      l.loc = w.loc;
      l.instance_path = k.instance_path;
      inst.nets.insert(inst.nets.end(), l.nets.begin(), l.nets.end());
      inst.port_names.push_back(w.start.pin);
      inst.port_names.push_back(w.end.pin);
      k.controls.push_back(l.ref);
      nl_.add_part(std::move(l));
    }
    if (!room_for_part(d.part.loc)) return;
    nl_.add_part(std::move(k));
    nl_.instances.push_back(std::move(inst));
  }

  void enter(const XmlInstanceDecl& inst) {
    const Frame& f = stack_.back();
    auto bit = design_.block_index.find(to_lower(inst.block));
    if (bit == design_.block_index.end()) {
      report_once(inst.block_loc, fmt::format("instance {} uses block '{}', which no <block> defines", inst.ref,
                                              inst.block));
      return;
    }
    const XmlBlockDecl& block = design_.blocks[bit->second];
    for (std::size_t i = 0; i < f.blocks.size(); ++i) {
      if (f.blocks[i] != bit->second) continue;
      Diagnostic d{Severity::error, inst.loc,
                   fmt::format("instance {} of block '{}' is inside block '{}' itself; blocks cannot recurse",
                               inst.ref, block.name, block.name),
                   {{block.loc, "block defined here"}}};
      if (reported_.insert(inst.loc.offset).second) diags_.report(std::move(d));
      return;
    }
    if (f.path.size() >= limits_.max_subckt_depth) {
      report_once(inst.loc, fmt::format("instance {} nests blocks deeper than {} levels (limit max_subckt_depth)",
                                        inst.ref, limits_.max_subckt_depth));
      return;
    }
    std::vector<const XmlPinRef*> by_pin(block.pins.size(), nullptr);
    bool ok = true;
    const bool named = !inst.pins.empty() && !inst.pins.front().pin.empty();
    if (!named) {
      if (inst.pins.size() != block.pins.size()) {
        report_once(inst.loc, fmt::format("instance {} connects {} nets; block '{}' has {} pins ({})", inst.ref,
                                          inst.pins.size(), block.name, block.pins.size(), join(block.pins)));
        return;
      }
      for (std::size_t i = 0; i < inst.pins.size(); ++i) by_pin[i] = &inst.pins[i];
    } else {
      for (const auto& p : inst.pins) {
        std::optional<std::size_t> idx;
        for (std::size_t i = 0; i < block.pins.size() && !idx; ++i) {
          if (to_lower(block.pins[i]) == to_lower(p.pin)) idx = i;
        }
        if (!idx) {
          report_once(p.loc, fmt::format("block '{}' has no pin '{}'; its pins are {}", block.name, p.pin,
                                         join(block.pins)));
          ok = false;
        } else if (by_pin[*idx] != nullptr) {
          report_once(p.loc, fmt::format("pin {} of instance {} is connected twice", block.pins[*idx], inst.ref));
          ok = false;
        } else {
          by_pin[*idx] = &p;
        }
      }
      for (std::size_t i = 0; i < block.pins.size() && ok; ++i) {
        if (by_pin[i] == nullptr) {
          report_once(inst.loc, fmt::format("pin {} of instance {} is not connected", block.pins[i], inst.ref));
          ok = false;
        }
      }
    }
    if (!ok) return;

    Frame child{&block.scope, 0, f.ref_prefix + inst.ref + ".", f.net_prefix + to_lower(inst.ref) + ".", {}, f.path,
                f.blocks};
    Instance out{f.ref_prefix + inst.ref, block.name, {}, block.pins, inst.loc};
    for (std::size_t i = 0; i < block.pins.size(); ++i) {
      const std::string actual = net_name(f, by_pin[i]->net);
      child.pin_nets[to_lower(block.pins[i])] = actual;
      out.nets.push_back(nl_.intern_net(actual, by_pin[i]->loc));
    }
    child.path.push_back(inst.loc);
    child.blocks.push_back(bit->second);
    nl_.instances.push_back(std::move(out));
    stack_.push_back(std::move(child));
  }

  void annotate_nets(const Frame& f) {
    for (const auto& d : f.scope->nets) {
      const auto id = nl_.find_net(net_name(f, d.net));
      if (!id) continue;  // check_scope proved the net is used; a dropped part may have taken it
      nl_.annotations.push_back(Annotation{"net", nl_.net(*id).name, d.attrs, d.loc, {}});
    }
  }

  void add_supply() {
    if (!design_.supply) return;
    bool ok = true;
    for (const auto& n : design_.supply->nets) {
      if (!nl_.find_net(n.net)) {
        diags_.error(n.loc, fmt::format("<supply> {} net '{}' is not connected to any part", n.pin, n.net));
        ok = false;
      }
    }
    if (ok) nl_.annotations.push_back(design_.supply->annotation);
  }

  void report_once(SourceLoc loc, std::string msg) {
    // A faulty instance inside a block would otherwise be reported once per instantiation.
    if (reported_.insert(loc.offset).second) diags_.error(loc, std::move(msg));
  }

  static std::string join(const std::vector<std::string>& v) {
    std::string out;
    for (const auto& s : v) out += (out.empty() ? "" : " ") + s;
    return out;
  }

  XmlDesign& design_;
  DiagnosticSink& diags_;
  const ReadLimits& limits_;
  Netlist nl_;
  std::vector<Frame> stack_;
  std::set<std::uint32_t> reported_;
  bool stopped_ = false;
};

}  // namespace

Netlist flatten_xml_design(XmlDesign& design, DiagnosticSink& diags, const ReadLimits& limits) {
  return Flattener(design, diags, limits).run();
}

}  // namespace mainscheck::parser
