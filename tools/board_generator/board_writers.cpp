#include "tools/board_generator/board_writers.hpp"

namespace mainscheck::tools {
namespace {

// SPICE letters are the parts' own ref prefixes; front-end parts without a SPICE element are
// resistors with a `*@part ... type=` annotation (docs/annotations.md).
const char* annotation_type(ElementKind k) {
  switch (k) {
    case ElementKind::zener: return "zener";
    case ElementKind::fuse: return "fuse";
    case ElementKind::varistor: return "varistor";
    case ElementKind::ntc: return "ntc";
    default: return nullptr;
  }
}

class SpiceWriter final : public BoardWriter {
 public:
  explicit SpiceWriter(std::ostream& out) : out_(out) {}
  void begin(std::string_view title) override { out_ << title << '\n'; }
  void comment(std::string_view text) override { out_ << "* " << text << '\n'; }
  void supply(std::string_view line, std::string_view neutral, std::string_view earth) override {
    out_ << "*@supply line=" << line << " neutral=" << neutral << " earth=" << earth << " mains=230V+-10%/50Hz\n";
  }
  void model(std::string_view name, std::string_view type, const Attrs& params) override {
    out_ << ".model " << name << ' ' << type << '(';
    for (std::size_t i = 0; i < params.size(); ++i) out_ << (i ? " " : "") << params[i].first << '=' << params[i].second;
    out_ << ")\n";
  }
  void begin_block(std::string_view name, const std::vector<std::string>& pins) override {
    out_ << ".subckt " << name;
    for (const auto& p : pins) out_ << ' ' << p;
    out_ << '\n';
  }
  void end_block(std::string_view name) override { out_ << ".ends " << name << '\n'; }
  void element(const Element& e) override {
    const char* type = annotation_type(e.kind);
    if (type || !e.attrs.empty()) {
      out_ << "*@part " << e.ref;
      if (type) out_ << " type=" << type;
      for (const auto& [k, v] : e.attrs) out_ << ' ' << k << '=' << v;
      out_ << '\n';
    }
    out_ << e.ref;
    for (const auto& n : e.nets) out_ << ' ' << n;
    if (e.kind == ElementKind::vsource) {
      out_ << " SIN(0 " << e.value << ")\n";
      return;
    }
    if (!e.value.empty()) out_ << ' ' << e.value;
    if (!e.model.empty()) out_ << ' ' << e.model;
    out_ << '\n';
  }
  void instance(std::string_view ref, std::string_view block, const std::vector<std::string>& nets) override {
    out_ << ref;
    for (const auto& n : nets) out_ << ' ' << n;
    out_ << ' ' << block << '\n';
  }
  void end() override { out_ << ".end\n"; }

 private:
  std::ostream& out_;
};

const char* xml_kind(ElementKind k) {
  switch (k) {
    case ElementKind::resistor: return "resistor";
    case ElementKind::capacitor: return "capacitor";
    case ElementKind::inductor: return "inductor";
    case ElementKind::diode: return "diode";
    case ElementKind::zener: return "zener";
    case ElementKind::mosfet: return "mosfet";
    case ElementKind::bjt: return "bjt";
    case ElementKind::fuse: return "fuse";
    case ElementKind::varistor: return "varistor";
    case ElementKind::ntc: return "resistor";  // with type="ntc": the solver models it by its value
    case ElementKind::vsource: return "vsource";
  }
  return "other";
}

// Kinds whose principal value the XML format takes as `value=`; the others carry ratings only.
bool xml_takes_value(ElementKind k) {
  return k == ElementKind::resistor || k == ElementKind::capacitor || k == ElementKind::inductor ||
         k == ElementKind::ntc;
}

class XmlWriter final : public BoardWriter {
 public:
  explicit XmlWriter(std::ostream& out) : out_(out) {}
  void begin(std::string_view title) override {
    out_ << "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<netlist version=\"1\" title=\"" << title << "\">\n";
  }
  void comment(std::string_view text) override { out_ << indent() << "<!-- " << text << " -->\n"; }
  void supply(std::string_view line, std::string_view neutral, std::string_view earth) override {
    out_ << "  <supply line=\"" << line << "\" neutral=\"" << neutral << "\" earth=\"" << earth
         << "\" v_rms=\"230V\" tol=\"10%\" f=\"50Hz\"/>\n";
  }
  void model(std::string_view name, std::string_view type, const Attrs& params) override {
    out_ << "  <model name=\"" << name << "\" type=\"" << type << '"';
    for (const auto& [k, v] : params) out_ << ' ' << k << "=\"" << v << '"';
    out_ << "/>\n";
  }
  void begin_block(std::string_view name, const std::vector<std::string>& pins) override {
    out_ << "  <block name=\"" << name << "\" pins=\"";
    for (std::size_t i = 0; i < pins.size(); ++i) out_ << (i ? " " : "") << pins[i];
    out_ << "\">\n";
    in_block_ = true;
  }
  void end_block(std::string_view) override {
    out_ << "  </block>\n";
    in_block_ = false;
  }
  void element(const Element& e) override {
    out_ << indent() << "<part ref=\"" << e.ref << "\" kind=\"" << xml_kind(e.kind) << '"';
    if (xml_takes_value(e.kind) && !e.value.empty()) out_ << " value=\"" << e.value << '"';
    if (!e.model.empty()) out_ << " model=\"" << e.model << '"';
    if (e.kind == ElementKind::ntc) out_ << " type=\"ntc\"";
    for (const auto& [k, v] : e.attrs) out_ << ' ' << k << "=\"" << v << '"';
    out_ << " nets=\"";
    for (std::size_t i = 0; i < e.nets.size(); ++i) out_ << (i ? " " : "") << e.nets[i];
    out_ << '"';
    if (e.kind == ElementKind::vsource) {
      const auto space = e.value.find(' ');
      out_ << "><sin offset=\"0\" amplitude=\"" << e.value.substr(0, space) << "\" freq=\"" << e.value.substr(space + 1)
           << "\"/></part>\n";
      return;
    }
    out_ << "/>\n";
  }
  void instance(std::string_view ref, std::string_view block, const std::vector<std::string>& nets) override {
    out_ << indent() << "<instance ref=\"" << ref << "\" block=\"" << block << "\" nets=\"";
    for (std::size_t i = 0; i < nets.size(); ++i) out_ << (i ? " " : "") << nets[i];
    out_ << "\"/>\n";
  }
  void end() override { out_ << "</netlist>\n"; }

 private:
  const char* indent() const { return in_block_ ? "    " : "  "; }
  std::ostream& out_;
  bool in_block_ = false;
};

}  // namespace

std::unique_ptr<BoardWriter> make_board_writer(BoardFormat format, std::ostream& out) {
  if (format == BoardFormat::xml) return std::make_unique<XmlWriter>(out);
  return std::make_unique<SpiceWriter>(out);
}

}  // namespace mainscheck::tools
