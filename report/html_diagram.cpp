#include "report/html_diagram.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <functional>
#include <optional>

#include "report/markup.hpp"
#include "report/svg_plot.hpp"
#include "report/units.hpp"

namespace mainscheck::report {

namespace {

constexpr double kMainsW = 130, kBoxW = 250, kGap = 80, kMargin = 10, kLine = 14, kHead = 20, kRowGap = 18;
constexpr std::size_t kWrap = 36;      // characters per line at 11 px sans-serif in kBoxW (about 6 px each)
constexpr std::size_t kMaxLines = 12;  // lines of one box; a longer part list ends in "…"

struct Box {
  double x = 0, y = 0, h = 0;
  std::string title, subtitle;
  std::vector<std::string> lines;
  bool has_dc_output = false;
};

/// Splits "label: a b c ..." into lines of at most kWrap characters (continuations indented).
void wrap_into(std::vector<std::string>& lines, const std::string& label, const std::vector<std::string>& words) {
  std::string cur = label + ":";
  for (const auto& w : words) {
    if (cur.size() + 1 + w.size() > kWrap && cur.size() > 2) {
      lines.push_back(cur);
      cur = "  " + w;
    } else {
      cur += " " + w;
    }
  }
  lines.push_back(cur);
}

std::string mains_text(const CheckReport& r) {
  const auto& s = r.recognition->supply;
  if (!s.mains || !s.mains->v_nominal_V) return "mains";
  std::string t = format_si(*s.mains->v_nominal_V, "V");
  if (s.mains->f_nominal_Hz) t += " " + format_si(*s.mains->f_nominal_Hz, "Hz");
  return t;
}

void draw_box(std::string& out, const Box& b, double w, const char* cls) {
  out += fmt::format("<g class=\"{}\"><rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" rx=\"4\"/>\n", cls,
                     svg_number(b.x), svg_number(b.y), svg_number(w), svg_number(b.h));
  double y = b.y + 15;
  out += fmt::format("<text x=\"{}\" y=\"{}\" font-weight=\"bold\">{}</text>\n", svg_number(b.x + 8), svg_number(y),
                     escape_markup(b.title));
  if (!b.subtitle.empty()) {
    y += kLine;
    out += fmt::format("<text x=\"{}\" y=\"{}\" font-style=\"italic\">{}</text>\n", svg_number(b.x + 8),
                       svg_number(y), escape_markup(b.subtitle));
  }
  for (const auto& l : b.lines) {
    y += kLine;
    out += fmt::format("<text x=\"{}\" y=\"{}\">{}</text>\n", svg_number(b.x + 8), svg_number(y), escape_markup(l));
  }
  out += "</g>\n";
}

void arrow_head(std::string& out, double x, double y) {
  out += fmt::format("<polygon class=\"head\" points=\"{},{} {},{} {},{}\"/>\n", svg_number(x), svg_number(y),
                     svg_number(x - 7), svg_number(y - 4), svg_number(x - 7), svg_number(y + 4));
}

}  // namespace

std::string block_diagram_svg(const CheckReport& r) {
  if (r.recognition == nullptr || r.recognition->blocks.empty()) return {};
  const auto& rec = *r.recognition;
  const auto net = [&](parser::NetId n) { return rec.devices.net(n).name; };
  const std::size_t n = rec.blocks.size();

  // Column 1 for blocks on the mains, one further right for each transformer in front of a block.
  std::vector<int> column(n, 0);
  std::vector<std::optional<std::size_t>> feeder(n);
  for (std::size_t i = 0; i < n; ++i) {
    const auto& fb = rec.blocks[i].fed_by;
    if (fb && *fb < rec.ac_sources.size() && rec.ac_sources[*fb].block && *rec.ac_sources[*fb].block != i)
      feeder[i] = rec.ac_sources[*fb].block;
  }
  std::function<int(std::size_t, int)> col = [&](std::size_t i, int depth) -> int {
    if (column[i] != 0) return column[i];
    const int c = (feeder[i] && *feeder[i] < n && depth < 8) ? col(*feeder[i], depth + 1) + 1 : 1;
    return column[i] = c;
  };
  int n_cols = 1;
  for (std::size_t i = 0; i < n; ++i) n_cols = std::max(n_cols, col(i, 0));

  std::vector<Box> boxes(n);
  std::vector<double> col_y(static_cast<std::size_t>(n_cols) + 1, kMargin);
  double height = 0;
  for (std::size_t i = 0; i < n; ++i) {
    const auto& b = rec.blocks[i];
    Box& box = boxes[i];
    box.title = b.id + " " + b.kind;
    box.subtitle = b.variant;
    for (const auto& [role, members] : b.roles) {
      std::vector<std::string> refs;
      for (std::size_t p : members) refs.push_back(rec.devices.parts[p].ref);
      wrap_into(box.lines, role, refs);
    }
    std::vector<std::string> ins;
    for (auto in : b.inputs) ins.push_back(net(in));
    if (!ins.empty()) wrap_into(box.lines, "in", ins);
    for (const auto& o : b.outputs) {
      box.lines.push_back(fmt::format("out: {} − {}{}", net(o.net), net(o.ret), o.ac ? " (ac)" : ""));
      box.has_dc_output = box.has_dc_output || !o.ac;
    }
    if (box.lines.size() > kMaxLines) {
      box.lines.resize(kMaxLines);
      box.lines.back() = "…";
    }
    box.h = kHead + kLine * static_cast<double>(box.lines.size() + (box.subtitle.empty() ? 0 : 1)) + 8;
    const auto c = static_cast<std::size_t>(column[i]);
    box.x = kMargin + kMainsW + kGap + static_cast<double>(c - 1) * (kBoxW + kGap);
    box.y = col_y[c];
    col_y[c] += box.h + kRowGap;
    height = std::max(height, box.y + box.h + kMargin);
  }

  const auto& s = rec.supply;
  Box mains;
  mains.x = kMargin;
  mains.y = kMargin;
  mains.title = "mains";
  mains.subtitle = mains_text(r);
  if (s.line) mains.lines.push_back("line: " + net(*s.line));
  if (s.neutral) mains.lines.push_back("neutral: " + net(*s.neutral));
  if (s.earth) mains.lines.push_back("earth: " + net(*s.earth));
  mains.h = kHead + kLine * static_cast<double>(mains.lines.size() + 1) + 8;
  height = std::max(height, mains.y + mains.h + kMargin);
  // Room on the right for the output arrows (22 px) of the last column.
  const double width = kMargin + kMainsW + static_cast<double>(n_cols) * (kBoxW + kGap) + 30 + kMargin;

  std::string out = fmt::format(
      "<svg class=\"diagram\" width=\"{0}\" height=\"{1}\" viewBox=\"0 0 {0} {1}\" role=\"img\" "
      "font-family=\"sans-serif\" font-size=\"11\">\n<title>recognised blocks</title>\n",
      svg_number(width), svg_number(height));
  // Connectors first, so the boxes sit on top of them.
  for (std::size_t i = 0; i < n; ++i) {
    const Box& to = boxes[i];
    const bool from_block = feeder[i] && *feeder[i] < n;
    const double fx = from_block ? boxes[*feeder[i]].x + kBoxW : mains.x + kMainsW;
    const double fy = from_block ? boxes[*feeder[i]].y + boxes[*feeder[i]].h / 2 : mains.y + mains.h / 2;
    const double ty = to.y + to.h / 2;
    const double mid = fx + kGap / 2;
    out += fmt::format("<path class=\"wire\" d=\"M {} {} H {} V {} H {}\"/>\n", svg_number(fx), svg_number(fy),
                       svg_number(mid), svg_number(ty), svg_number(to.x - 1));
    arrow_head(out, to.x - 1, ty);
    if (to.has_dc_output) {
      const double oy = to.y + to.h / 2;
      out += fmt::format("<path class=\"wire out\" d=\"M {} {} H {}\"/>\n", svg_number(to.x + kBoxW), svg_number(oy),
                         svg_number(to.x + kBoxW + 22));
      arrow_head(out, to.x + kBoxW + 22, oy);
    }
  }
  draw_box(out, mains, kMainsW, "box mains");
  for (std::size_t i = 0; i < n; ++i) draw_box(out, boxes[i], kBoxW, "box block");
  out += "</svg>\n";
  return out;
}

}  // namespace mainscheck::report
