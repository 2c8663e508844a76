#include "rules/settings_xml.hpp"

namespace mainscheck::rules {

parser::SourceLoc settings_loc(const pugi::xml_node& n, parser::FileId file) {
  const auto off = n.offset_debug();
  return {file, static_cast<std::uint32_t>(off < 0 ? 0 : off)};
}

pugi::xml_node load_settings_xml(const std::string& name, std::string text, const char* expected_root,
                                 const std::string& what, parser::SourceManager& sm, parser::DiagnosticSink& diags,
                                 pugi::xml_document& doc, parser::FileId& file) {
  file = sm.add_file(name, std::move(text));
  const std::string_view buf = sm.contents(file);
  // Parse the kept bytes as UTF-8 so pugixml's offsets are offsets into our buffer.
  const pugi::xml_parse_result res = doc.load_buffer(buf.data(), buf.size(), pugi::parse_default, pugi::encoding_utf8);
  if (!res) {
    diags.error({file, static_cast<std::uint32_t>(res.offset)}, std::string("malformed XML: ") + res.description());
    return {};
  }
  const pugi::xml_node root = doc.document_element();
  if (std::string(root.name()) != expected_root) {
    diags.error(settings_loc(root, file), what + "'s root element is <" + std::string(root.name()) + ">, expected <" +
                                              expected_root + ">");
    return {};
  }
  return root;
}

bool read_settings_file(const std::string& path, const std::string& noun, parser::FileReader& files,
                        parser::DiagnosticSink& diags, std::string& text) {
  parser::FileReadResult r = files.read(path, 16u << 20);
  if (!r.ok) {
    diags.error({}, "cannot read " + noun + " '" + path + "': " + r.error);
    return false;
  }
  text = std::move(r.contents);
  return true;
}

}  // namespace mainscheck::rules
