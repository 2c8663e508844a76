#include "rules/options_view.hpp"

#include <algorithm>
#include <charconv>
#include <stdexcept>

#include "rules/policy.hpp"
#include "rules/rule.hpp"

namespace mainscheck::rules {

namespace {

const OptionSpec& spec_of(const RuleInfo& rule, std::string_view name) {
  for (const auto& o : rule.options) {
    if (o.name == name) return o;
  }
  throw std::logic_error("rule " + rule.id + " reads undeclared option '" + std::string(name) + "'");
}

}  // namespace

bool parse_option_number(std::string_view text, double& out) {
  while (!text.empty() && text.front() == ' ') text.remove_prefix(1);
  while (!text.empty() && text.back() == ' ') text.remove_suffix(1);
  bool percent = false;
  if (!text.empty() && text.back() == '%') {
    percent = true;
    text.remove_suffix(1);
  }
  if (!text.empty() && text.front() == '+') text.remove_prefix(1);
  double v = 0;
  auto res = std::from_chars(text.data(), text.data() + text.size(), v);
  if (res.ec != std::errc() || res.ptr != text.data() + text.size() || text.empty()) return false;
  if (!(v == v) || v > 1e300 || v < -1e300) return false;  // no NaN or infinities from a config file
  out = percent ? v / 100.0 : v;
  return true;
}

double OptionsView::number(std::string_view name) const {
  const OptionSpec& spec = spec_of(rule_, name);
  double v = spec.default_value;
  if (policy_ != nullptr) {
    auto it = policy_->options.find(rule_.id + "." + std::string(name));
    // validate_policy has already rejected unparsable values, so a failure here keeps the default.
    if (it != policy_->options.end()) parse_option_number(it->second.value, v);
  }
  return v;
}

std::string OptionsView::text(std::string_view name) const {
  const OptionSpec& spec = spec_of(rule_, name);
  if (policy_ != nullptr) {
    auto it = policy_->options.find(rule_.id + "." + std::string(name));
    if (it != policy_->options.end()) return it->second.value;
  }
  return spec.default_text.empty() ? std::to_string(spec.default_value) : spec.default_text;
}

std::string nearest_name(std::string_view name, const std::vector<std::string>& candidates) {
  // Levenshtein distance; accept a candidate within a third of the name's length.
  auto distance = [](std::string_view a, std::string_view b) {
    std::vector<std::size_t> prev(b.size() + 1), cur(b.size() + 1);
    for (std::size_t j = 0; j <= b.size(); ++j) prev[j] = j;
    for (std::size_t i = 1; i <= a.size(); ++i) {
      cur[0] = i;
      for (std::size_t j = 1; j <= b.size(); ++j) {
        cur[j] = std::min({prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] == b[j - 1] ? 0 : 1)});
      }
      std::swap(prev, cur);
    }
    return prev[b.size()];
  };
  std::string best;
  std::size_t best_d = name.size() / 3 + 2;
  for (const auto& c : candidates) {
    const std::size_t d = distance(name, c);
    if (d < best_d) {
      best_d = d;
      best = c;
    }
  }
  return best;
}

}  // namespace mainscheck::rules
