#include "report/junit_writer.hpp"

#include <fmt/chrono.h>
#include <fmt/format.h>

#include <chrono>
#include <cstdlib>
#include <filesystem>
#include <pugixml.hpp>
#include <sstream>

#include "report/verdicts.hpp"

namespace mainscheck::report {

namespace {

std::string timestamp() {
  std::time_t t = std::time(nullptr);
  if (const char* epoch = std::getenv("SOURCE_DATE_EPOCH")) t = static_cast<std::time_t>(std::strtoll(epoch, nullptr, 10));
  return fmt::format("{:%Y-%m-%dT%H:%M:%S}", fmt::gmtime(t));
}

std::string finding_lines(const std::vector<const rules::Finding*>& fs) {
  std::string out;
  for (const rules::Finding* f : fs) {
    out += fmt::format("{}: {} [{}]\n", parser::severity_name(f->severity), f->message, f->rule_id);
  }
  return out;
}

void add_suite(pugi::xml_node root, const CheckReport& r, int id, const std::string& stamp) {
  const std::vector<VerdictCell> cells = verdict_matrix(r);
  int failures = 0, errors = 0, skipped = 0;
  for (const auto& c : cells) {
    if (c.verdict == Verdict::fail) ++failures;
    if (c.verdict == Verdict::unverified) ++errors;
    if (c.verdict == Verdict::not_applicable) ++skipped;
  }
  pugi::xml_node s = root.append_child("testsuite");
  s.append_attribute("name") = r.file.c_str();
  s.append_attribute("timestamp") = stamp.c_str();
  s.append_attribute("hostname") = "localhost";
  s.append_attribute("tests") = static_cast<int>(cells.size());
  s.append_attribute("failures") = failures;
  s.append_attribute("errors") = errors;
  s.append_attribute("skipped") = skipped;
  s.append_attribute("time") = "0";
  s.append_attribute("package") = "mainscheck";
  s.append_attribute("id") = id;
  pugi::xml_node props = s.append_child("properties");
  auto prop = [&](const std::string& name, const std::string& value) {
    pugi::xml_node p = props.append_child("property");
    p.append_attribute("name") = name.c_str();
    p.append_attribute("value") = value.c_str();
  };
  prop("caution", kSafetyCaution);
  const std::string classname = "mainscheck." + std::filesystem::path(r.file).stem().string();
  for (const auto& c : cells) {
    for (const rules::Finding* f : c.findings) {
      if (f->severity != rules::Severity::error) {
        prop(fmt::format("{}.{}.{}", parser::severity_name(f->severity), c.rule_id, c.block), f->message);
      }
    }
    pugi::xml_node tc = s.append_child("testcase");
    tc.append_attribute("name") = fmt::format("{} [{} {}]", c.rule_id, c.block, c.block_kind).c_str();
    tc.append_attribute("classname") = classname.c_str();
    tc.append_attribute("time") = "0";
    if (c.verdict == Verdict::fail) {
      pugi::xml_node f = tc.append_child("failure");
      f.append_attribute("message") = c.findings.front()->message.c_str();
      f.append_attribute("type") = c.rule_id.c_str();
      f.text() = finding_lines(c.findings).c_str();
    } else if (c.verdict == Verdict::unverified) {
      pugi::xml_node e = tc.append_child("error");
      e.append_attribute("message") = r.status != CheckStatus::complete
                                          ? ("check incomplete: " + r.failure).c_str()
                                          : "a rating this rule needs could not be compared (no rating or no stress)";
      e.append_attribute("type") = "unverified";
    } else if (c.verdict == Verdict::not_applicable) {
      tc.append_child("skipped").append_attribute("message") = "not applicable: the block holds nothing this rule checks";
    }
  }
  std::string out, err;
  for (const auto& c : cells) {
    for (const rules::Finding* f : c.findings) {
      if (f->severity == rules::Severity::warning) out += fmt::format("warning: {} [{}]\n", f->message, f->rule_id);
    }
  }
  s.append_child("system-out").text() = out.c_str();
  if (r.status != CheckStatus::complete) err = "check incomplete: " + r.failure + "\n";
  s.append_child("system-err").text() = err.c_str();
}

}  // namespace

std::string checks_to_junit(const std::vector<const CheckReport*>& reports) {
  pugi::xml_document doc;
  pugi::xml_node decl = doc.append_child(pugi::node_declaration);
  decl.append_attribute("version") = "1.0";
  decl.append_attribute("encoding") = "UTF-8";
  pugi::xml_node root = doc.append_child("testsuites");
  const std::string stamp = timestamp();
  int id = 0;
  for (const CheckReport* r : reports) add_suite(root, *r, id++, stamp);
  std::ostringstream os;
  doc.save(os, "  ", pugi::format_default, pugi::encoding_utf8);
  return os.str();
}

}  // namespace mainscheck::report
