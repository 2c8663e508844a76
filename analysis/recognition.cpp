#include "analysis/recognition.hpp"

#include <algorithm>
#include <map>
#include <set>
#include <span>

#include <fmt/format.h>

#include "analysis/block_conflicts.hpp"
#include "analysis/circuit_graph.hpp"
#include "analysis/inlets.hpp"
#include "analysis/mains_sides.hpp"

namespace mainscheck::analysis {

using parser::NetId;

std::optional<std::size_t> RecognitionContext::ac_source_of(NetId a, NetId b) const {
  if (hot_side[a] >= 0 && hot_side[a] == ret_side[b]) return static_cast<std::size_t>(hot_side[a]);
  if (hot_side[b] >= 0 && hot_side[b] == ret_side[a]) return static_cast<std::size_t>(hot_side[b]);
  return std::nullopt;
}

namespace {

bool has_type_attr(const std::map<std::string, std::string>& attrs) { return attrs.count("type") != 0; }

// Instances the designer declared to be one front-end part, by instance ref (lower case).
std::set<std::string> collapsed_refs(const parser::Netlist& nl, const parser::PartsLibrary* library) {
  std::set<std::string> by_ref, by_model;
  for (const auto& a : nl.annotations) {
    if (!has_type_attr(a.attrs)) continue;
    if (a.target_kind == "part") by_ref.insert(parser::to_lower(a.target));
    if (a.target_kind == "model") by_model.insert(parser::to_lower(a.target));
  }
  std::set<std::string> out;
  for (const auto& inst : nl.instances) {
    const std::string key = parser::to_lower(inst.ref);
    const bool lib = library && library->find(inst.subckt) && !library->find(inst.subckt)->type.empty();
    if (by_ref.count(key) || by_model.count(parser::to_lower(inst.subckt)) || lib) out.insert(key);
  }
  // Readers that keep no instance list: an annotation naming a ref prefix of flattened parts.
  if (nl.instances.empty())
    for (const auto& r : by_ref)
      if (!nl.find_part_index(r)) out.insert(r);
  return out;
}

// The outermost collapsed instance holding `ref` ("x1.x2.r1" is inside "x1" and "x1.x2").
std::optional<std::string> collapsed_owner(const std::string& lower_ref, const std::set<std::string>& refs) {
  for (std::size_t dot = lower_ref.find('.'); dot != std::string::npos; dot = lower_ref.find('.', dot + 1)) {
    std::string prefix = lower_ref.substr(0, dot);
    if (refs.count(prefix)) return prefix;
  }
  return std::nullopt;
}

DeviceView collapse_instances(const parser::Netlist& nl, const std::set<std::string>& refs,
                              parser::DiagnosticSink& diags) {
  DeviceView v;
  v.devices.title = nl.title;
  v.devices.top_file = nl.top_file;
  v.devices.models = nl.models;
  v.devices.annotations = nl.annotations;
  v.devices.instances = nl.instances;
  // Interning in order reproduces the same net ids.
  v.devices.parts.reserve(nl.parts.size());
  for (std::size_t n = 1; n < nl.nets().size(); ++n) v.devices.intern_net(nl.nets()[n].name, nl.nets()[n].loc);

  std::map<std::string, const parser::Instance*> inst_by_ref;
  for (const auto& inst : nl.instances) inst_by_ref[parser::to_lower(inst.ref)] = &inst;
  std::map<std::string, std::size_t> device_of;  // collapsed ref → device index
  for (std::size_t i = 0; i < nl.parts.size(); ++i) {
    const parser::Part& p = nl.parts[i];
    const auto owner = collapsed_owner(parser::to_lower(p.ref), refs);
    if (!owner) {
      v.devices.add_part(p);
      v.members.push_back({i});
      continue;
    }
    auto it = device_of.find(*owner);
    if (it == device_of.end()) {
      parser::Part d;
      d.kind = parser::PartKind::other;
      if (auto ii = inst_by_ref.find(*owner); ii != inst_by_ref.end()) {
        d.ref = ii->second->ref;
        d.type_name = ii->second->subckt;
        d.model = ii->second->subckt;
        d.nets = ii->second->nets;
        d.pin_names = ii->second->port_names;
        d.loc = ii->second->loc;
      } else {
        d.ref = p.ref.substr(0, owner->size());
        d.loc = p.loc;
      }
      d.instance_path = p.instance_path;
      it = device_of.emplace(*owner, v.devices.add_part(std::move(d))).first;
      v.members.emplace_back();
    }
    v.members[it->second].push_back(i);
  }
  // Without an instance list the ports are the outside nets the internals touch, in first-use order.
  for (const auto& [ref, idx] : device_of) {
    parser::Part& d = v.devices.parts[idx];
    if (!d.nets.empty() || inst_by_ref.count(ref)) continue;
    const std::string inner = ref + ".";
    for (std::size_t m : v.members[idx])
      for (NetId n : nl.parts[m].nets)
        if (nl.net(n).key.rfind(inner, 0) != 0 && std::find(d.nets.begin(), d.nets.end(), n) == d.nets.end())
          d.nets.push_back(n);
    diags.note(d.loc, fmt::format("{} shown as one part with {} pins, ordered by first use in its internal parts "
                                  "(the reader kept no instance list, so port order and names are unknown)",
                                  d.ref, d.nets.size()));
  }
  return v;
}

bool is_direct_load(const RecognitionContext& ctx, std::size_t p) {
  const FrontEndType t = ctx.type(p);
  if (t != FrontEndType::heater && t != FrontEndType::lamp && t != FrontEndType::resistor) return false;
  if (!ctx.graph.is_two_terminal(p)) return false;
  const auto nets = ctx.graph.nets_of(p);
  return ctx.ac_source_of(nets[0], nets[1]).has_value();
}

RecognitionResult recognise_session(RecognitionSession& session) {
  std::vector<Block> blocks;
  const std::vector<Block> none;
  for (const auto stage : {RecogniserStage::supply_transform, RecogniserStage::front_end}) {
    const RecognitionContext ctx = session.context(stage == RecogniserStage::front_end ? blocks : none);
    std::vector<Block> found;
    for (const auto& rec : recognisers()) {
      if (rec->stage() != stage) continue;
      const std::size_t before = found.size();
      rec->recognise(ctx, found);
      for (std::size_t i = before; i < found.size(); ++i) found[i].recogniser = std::string(rec->name());
    }
    if (stage == RecogniserStage::supply_transform) {
      // Transformer outputs feed what hangs on them: offer each as an AC source.
      for (std::size_t b = 0; b < found.size(); ++b) {
        const auto& srcs = session.ac_sources();
        const double in_ratio = found[b].fed_by && *found[b].fed_by < srcs.size() && srcs[*found[b].fed_by].v_ratio
                                    ? *srcs[*found[b].fed_by].v_ratio
                                    : 1.0;
        for (const auto& o : found[b].outputs) {
          if (!o.ac) continue;
          std::optional<double> ratio;
          if (o.v_ratio) ratio = in_ratio * *o.v_ratio;
          session.add_ac_source(AcSource{o.net, o.ret, o.centre_tap, ratio, "", b});
        }
      }
    }
    blocks.insert(blocks.end(), std::make_move_iterator(found.begin()), std::make_move_iterator(found.end()));
  }
  session.attach_folded(blocks);
  const std::vector<std::size_t> kept_index = resolve_block_conflicts(blocks, session.info());

  // Unrecognised: parts with a pin on a net of the mains' sides (or earth) that belong to no block.
  std::vector<std::size_t> unrecognised;
  {
    const auto& dev = session.devices();
    const auto& hot = session.hot_side();
    const auto& ret = session.ret_side();
    const auto& earth = session.supply().earth;
    std::vector<char> in_block(dev.parts.size(), 0);
    for (const auto& b : blocks)
      for (std::size_t p : b.parts()) in_block[p] = 1;
    const bool have_mains = !session.ac_sources().empty() && session.ac_sources()[0].origin == "mains";
    const RecognitionContext final_ctx = session.context(blocks);
    for (std::size_t p = 0; have_mains && p < dev.parts.size(); ++p) {
      // The inlet is the mains' entry point, not a part on it (analysis/inlets.hpp).
      if (in_block[p] || session.supply().source_part == p || session.info().type(p) == FrontEndType::coupling ||
          session.info().type(p) == FrontEndType::inlet ||
          session.skeleton().fold(p) == SkeletonFold::reference)
        continue;
      // A heater, lamp or resistor straight across one source is the product's load, not an
      // unrecognised block: its ratings are checked part by part, and no block rule applies to it.
      if (is_direct_load(final_ctx, p)) continue;
      // A folded part has no pins in the skeleton: judge it by the pins it was drawn with.
      const auto* drawn = session.skeleton().fold(p) == SkeletonFold::series ? session.skeleton().original_nets(p)
                                                                             : nullptr;
      const auto nets = drawn ? std::span<const NetId>(*drawn) : session.graph().nets_of(p);
      for (NetId n : nets)
        if (hot[n] == 0 || ret[n] == 0 || (earth && n == *earth)) {
          unrecognised.push_back(p);
          break;
        }
    }
  }
  RecognitionResult r;
  session.move_into(r);
  session.skeleton().return_outputs(blocks, r.devices);
  r.unrecognised = std::move(unrecognised);

  // Deterministic numbering: by first member's position in the device list, then kind and variant.
  std::vector<std::size_t> order(blocks.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::vector<std::vector<std::size_t>> members(blocks.size());
  for (std::size_t i = 0; i < blocks.size(); ++i) members[i] = blocks[i].parts();
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    const auto& ma = members[a];
    const auto& mb = members[b];
    const std::size_t fa = ma.empty() ? SIZE_MAX : ma.front();
    const std::size_t fb = mb.empty() ? SIZE_MAX : mb.front();
    if (fa != fb) return fa < fb;
    if (blocks[a].kind != blocks[b].kind) return blocks[a].kind < blocks[b].kind;
    if (blocks[a].variant != blocks[b].variant) return blocks[a].variant < blocks[b].variant;
    return ma < mb;
  });
  std::vector<std::size_t> new_index(blocks.size());
  for (std::size_t k = 0; k < order.size(); ++k) new_index[order[k]] = k;
  for (std::size_t k = 0; k < order.size(); ++k) {
    Block b = std::move(blocks[order[k]]);
    b.id = fmt::format("B{}", k + 1);
    b.member_locs.clear();
    for (std::size_t p : members[order[k]]) b.member_locs.push_back(r.devices.parts[p].loc);
    r.blocks.push_back(std::move(b));
  }
  for (auto& s : r.ac_sources) {
    // Blocks that feed AC sources (transformers) hold no rectifying part, so conflicts never remove them.
    if (s.block && kept_index[*s.block] != SIZE_MAX) {
      s.block = new_index[kept_index[*s.block]];
      s.origin = r.blocks[*s.block].id;
    }
  }

  return r;
}

}  // namespace

DeviceView build_device_view(parser::Netlist&& nl, const parser::PartsLibrary* library,
                             parser::DiagnosticSink& diags) {
  const auto refs = collapsed_refs(nl, library);
  if (!refs.empty()) return collapse_instances(nl, refs, diags);
  DeviceView v;  // nothing collapses: members stay empty (device part i is input part i)
  v.devices = std::move(nl);
  v.is_input = true;
  return v;
}

DeviceView build_device_view(const parser::Netlist& nl, const parser::PartsLibrary* library,
                             parser::DiagnosticSink& diags) {
  const auto refs = collapsed_refs(nl, library);
  if (!refs.empty()) return collapse_instances(nl, refs, diags);
  // One copy keeps the cached hashes of both indexes; re-adding part by part would rehash every
  // ref and net again.
  DeviceView v;
  v.devices = nl;
  return v;
}

RecognitionSession::RecognitionSession(const parser::Netlist& nl, const SupplyOptions& options,
                                       const parser::PartsLibrary* library, parser::DiagnosticSink& diags)
    : RecognitionSession(build_device_view(nl, library, diags), options, library, diags) {}

RecognitionSession::RecognitionSession(DeviceView view, const SupplyOptions& options,
                                       const parser::PartsLibrary* library, parser::DiagnosticSink& diags)
    : diags_(&diags) {
  devices_ = std::move(view.devices);
  members_ = std::move(view.members);
  info_ = PartInfoTable(devices_, library, diags);
  supply_ = resolve_supply(devices_, options, diags);
  mark_inlets(devices_, info_, supply_);
  skeleton_.fold_references(devices_, info_);
  skeleton_.split_control_ports(devices_);
  graph_ = std::make_unique<CircuitGraph>(devices_);
  if (supply_.line && supply_.neutral)
    sources_.push_back(AcSource{*supply_.line, *supply_.neutral, std::nullopt, 1.0, "mains", std::nullopt});
  mark_common_mode_chokes(*graph_, info_, sources_);
  update_sides_and_fold();
}

void RecognitionSession::update_sides_and_fold() {
  // Each round folds one part of every chain; a chain longer than this is a string, not a limiter.
  constexpr int kMaxFoldRounds = 8;
  for (int round = 0;; ++round) {
    MainsSides sides = compute_mains_sides(*graph_, info_, sources_);
    hot_ = std::move(sides.hot);
    ret_ = std::move(sides.ret);
    if (round == kMaxFoldRounds || !skeleton_.fold_series_round(devices_, *graph_, info_, hot_, ret_)) break;
    graph_ = std::make_unique<CircuitGraph>(devices_);
  }
}

void RecognitionSession::add_ac_source(AcSource source) {
  sources_.push_back(std::move(source));
  update_sides_and_fold();
}

RecognitionContext RecognitionSession::context(const std::vector<Block>& earlier) const {
  return RecognitionContext{devices_, *graph_, info_, supply_, sources_, hot_, ret_, earlier, *diags_};
}

void RecognitionSession::move_into(RecognitionResult& r) {
  skeleton_.restore(devices_);
  graph_.reset();  // it described the skeleton's pins
  r.references = skeleton_.references();
  r.devices = std::move(devices_);
  r.device_members = std::move(members_);
  r.info = std::move(info_);
  r.supply = std::move(supply_);
  r.ac_sources = std::move(sources_);
}

RecognitionResult recognise(const parser::Netlist& nl, const SupplyOptions& options,
                            const parser::PartsLibrary* library, parser::DiagnosticSink& diags) {
  RecognitionSession session(nl, options, library, diags);
  RecognitionResult r = recognise_session(session);
  r.input_ref = &nl;
  return r;
}

RecognitionResult recognise(parser::Netlist&& nl, const SupplyOptions& options, const parser::PartsLibrary* library,
                            parser::DiagnosticSink& diags) {
  DeviceView view = build_device_view(std::move(nl), library, diags);
  const bool view_is_input = view.is_input;
  RecognitionSession session(std::move(view), options, library, diags);
  RecognitionResult r = recognise_session(session);
  if (!view_is_input) r.own_input = std::move(nl);  // left untouched by build_device_view
  return r;
}

}  // namespace mainscheck::analysis
