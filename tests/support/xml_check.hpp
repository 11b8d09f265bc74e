// SPDX-License-Identifier: MIT
// A small XML 1.0 well-formedness checker and tree for tests of SVG output, so they need no
// XML library. Header-only (the test target compiles only *_test.cpp files).
#pragma once

#include <algorithm>
#include <map>
#include <memory>
#include <sstream>
#include <stdexcept>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace quietrail::test {

/// One element: name, attributes (entity references resolved), text content and children.
struct XmlElement {
  std::string name;
  std::map<std::string, std::string> attributes;
  std::string text;  // all character data directly inside, references resolved
  std::vector<std::unique_ptr<XmlElement>> children;

  /// The attribute's value, or "" when absent.
  std::string attribute(const std::string& key) const {
    const auto it = attributes.find(key);
    return it == attributes.end() ? std::string() : it->second;
  }

  /// Every element below this one (depth first, document order) with the given name.
  void collect(const std::string& element_name, std::vector<const XmlElement*>& out) const {
    for (const auto& child : children) {
      if (child->name == element_name) out.push_back(child.get());
      child->collect(element_name, out);
    }
  }
  std::vector<const XmlElement*> all(const std::string& element_name) const {
    std::vector<const XmlElement*> out;
    collect(element_name, out);
    return out;
  }
};

/// Parses `text` as an XML 1.0 document and returns its root element; throws
/// std::runtime_error naming the byte offset when it is not well-formed. Checks the rules of
/// XML 1.0 (5th ed.) that generated SVG could break: one root element; matching, properly
/// nested tags; Name syntax (ASCII subset); quoted, unique attributes; no '<' in attribute
/// values; '&' only as a predefined entity (amp lt gt quot apos) or a character reference
/// (section 4.1, 4.6); no "]]>" in text; no control characters other than tab, LF, CR
/// (section 2.2); comments without "--" (section 2.5); an optional leading declaration.
/// DOCTYPE and CDATA sections are rejected (never generated here).
inline std::unique_ptr<XmlElement> parse_xml(std::string_view text) {
  std::size_t pos = 0;
  auto fail = [&](const std::string& what) -> void {
    throw std::runtime_error("not well-formed XML at byte " + std::to_string(pos) + ": " + what);
  };
  auto at_end = [&] { return pos >= text.size(); };
  auto starts = [&](std::string_view s) { return text.substr(pos).starts_with(s); };
  auto skip_space = [&] {
    while (!at_end() && (text[pos] == ' ' || text[pos] == '\t' || text[pos] == '\n' || text[pos] == '\r')) ++pos;
  };
  auto name_start = [](char c) {
    return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c == '_' || c == ':' ||
           (static_cast<unsigned char>(c) >= 0x80);
  };
  auto name_char = [&](char c) { return name_start(c) || (c >= '0' && c <= '9') || c == '-' || c == '.'; };
  auto read_name = [&]() -> std::string {
    if (at_end() || !name_start(text[pos])) fail("expected a name");
    const std::size_t start = pos;
    while (!at_end() && name_char(text[pos])) ++pos;
    return std::string(text.substr(start, pos - start));
  };
  auto check_char = [&](char c) {
    const auto b = static_cast<unsigned char>(c);
    if (b < 0x20 && c != '\t' && c != '\n' && c != '\r') fail("control character");
  };
  // Character data up to `stop` (exclusive) with references resolved.
  auto read_chars = [&](char stop, bool in_attribute) -> std::string {
    std::string out;
    while (!at_end() && text[pos] != stop) {
      const char c = text[pos];
      check_char(c);
      if (c == '<') {
        if (in_attribute) fail("'<' in an attribute value");
        break;
      }
      if (!in_attribute && starts("]]>")) fail("']]>' in text");
      if (c == '&') {
        const std::size_t semi = text.find(';', pos);
        if (semi == std::string_view::npos) fail("unterminated reference");
        const std::string_view ref = text.substr(pos + 1, semi - pos - 1);
        if (ref == "amp") out += '&';
        else if (ref == "lt") out += '<';
        else if (ref == "gt") out += '>';
        else if (ref == "quot") out += '"';
        else if (ref == "apos") out += '\'';
        else if (ref.size() > 1 && ref[0] == '#') {
          const bool hex = ref[1] == 'x';
          const std::string_view digits = ref.substr(hex ? 2 : 1);
          if (digits.empty()) fail("empty character reference");
          for (const char d : digits)
            if (!((d >= '0' && d <= '9') || (hex && ((d >= 'a' && d <= 'f') || (d >= 'A' && d <= 'F')))))
              fail("bad character reference");
          out += '?';  // the value is not needed by the tests
        } else {
          fail("unknown entity '&" + std::string(ref) + ";'");
        }
        pos = semi + 1;
        continue;
      }
      out += c;
      ++pos;
    }
    return out;
  };
  auto skip_misc = [&] {  // comments, processing instructions and blanks outside the root
    for (;;) {
      skip_space();
      if (starts("<!--")) {
        const std::size_t end = text.find("--", pos + 4);
        if (end == std::string_view::npos || text.substr(end, 3) != "-->") fail("bad comment");
        pos = end + 3;
      } else if (starts("<?")) {
        const std::size_t end = text.find("?>", pos);
        if (end == std::string_view::npos) fail("unterminated processing instruction");
        pos = end + 2;
      } else {
        return;
      }
    }
  };

  skip_misc();
  if (starts("<!")) fail("DOCTYPE or CDATA not supported");
  if (!starts("<")) fail("expected the root element");

  std::unique_ptr<XmlElement> root;
  std::vector<XmlElement*> open;
  while (true) {
    if (open.empty() && root) break;
    if (at_end()) fail("unexpected end inside <" + (open.empty() ? std::string() : open.back()->name) + ">");
    if (starts("<!--")) {
      skip_misc();
      continue;
    }
    if (starts("<![CDATA[") || starts("<!")) fail("CDATA or declaration inside content");
    if (starts("<?")) {
      skip_misc();
      continue;
    }
    if (starts("</")) {
      pos += 2;
      const std::string name = read_name();
      skip_space();
      if (at_end() || text[pos] != '>') fail("expected '>'");
      ++pos;
      if (open.empty() || open.back()->name != name) fail("mismatched end tag </" + name + ">");
      open.pop_back();
      continue;
    }
    if (starts("<")) {
      ++pos;
      auto element = std::make_unique<XmlElement>();
      element->name = read_name();
      for (;;) {
        const std::size_t before = pos;
        skip_space();
        if (at_end()) fail("unterminated start tag");
        if (text[pos] == '>' || starts("/>")) break;
        if (pos == before) fail("expected white space before an attribute");
        const std::string key = read_name();
        skip_space();
        if (at_end() || text[pos] != '=') fail("expected '=' after attribute " + key);
        ++pos;
        skip_space();
        if (at_end() || (text[pos] != '"' && text[pos] != '\'')) fail("unquoted attribute value");
        const char quote = text[pos++];
        std::string value = read_chars(quote, true);
        if (at_end()) fail("unterminated attribute value");
        ++pos;
        if (!element->attributes.emplace(key, std::move(value)).second) fail("duplicate attribute " + key);
      }
      const bool empty = starts("/>");
      pos += empty ? 2 : 1;
      XmlElement* raw = element.get();
      if (open.empty()) {
        if (root) fail("second root element");
        root = std::move(element);
      } else {
        open.back()->children.push_back(std::move(element));
      }
      if (!empty) open.push_back(raw);
      continue;
    }
    if (open.empty()) fail("text outside the root element");
    open.back()->text += read_chars('<', false);
  }
  skip_misc();
  if (!at_end()) fail("content after the root element");
  return root;
}

/// (x, y) pairs of an SVG polyline's `points` attribute ("x,y x,y ..." or "x y x y ...").
inline std::vector<std::pair<double, double>> points_of(const XmlElement* e) {
  std::vector<std::pair<double, double>> out;
  std::string text = e->attribute("points");
  std::replace(text.begin(), text.end(), ',', ' ');
  std::istringstream in(text);
  double x = 0;
  double y = 0;
  while (in >> x >> y) out.emplace_back(x, y);
  return out;
}

}  // namespace quietrail::test
