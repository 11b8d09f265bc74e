// SPDX-License-Identifier: MIT
// Single-file HTML reports (see html_report.hpp). The style sheet is ours: sober ink-blue
// headings on white, tinted verdict and caution boxes, tabular figures in tables.
#include "quietrail/report/html_report.hpp"

#include <algorithm>

#include "quietrail/error.hpp"
#include "quietrail/report/escape.hpp"

namespace quietrail {
namespace {

// No url(), @import or @font-face: the page must never reach out to the network.
constexpr const char* kStyleSheet = R"css(
:root { color-scheme: light; }
* { box-sizing: border-box; }
body { margin: 0; background: #f3f1ec; color: #2f2e2a;
  font: 15px/1.5 system-ui, -apple-system, "Segoe UI", "DejaVu Sans", sans-serif; }
main { max-width: 1100px; margin: 0 auto; padding: 28px 32px 48px; background: #ffffff;
  min-height: 100vh; }
h1 { font-size: 1.65rem; line-height: 1.25; margin: 0 0 1.2rem; padding-bottom: .45rem;
  border-bottom: 3px solid #1d3a5f; color: #1f2a36; }
h2 { font-size: 1.22rem; margin: 2.1rem 0 .6rem; color: #1d3a5f; }
h3 { font-size: 1.02rem; margin: 1.5rem 0 .4rem; color: #34332f; }
p { margin: .5rem 0; white-space: pre-line; max-width: 80ch; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: .2rem 1.6rem;
  margin: .6rem 0 1rem; }
dl.facts dt { color: #66625a; }
dl.facts dd { margin: 0; font-variant-numeric: tabular-nums; }
.table-wrap { overflow-x: auto; margin: .6rem 0 1rem; }
table { border-collapse: collapse; width: 100%; font-size: .92rem;
  font-variant-numeric: tabular-nums; }
th { text-align: left; padding: .4rem .65rem; background: #f5f3ef; color: #34332f;
  border-bottom: 2px solid #cfc8bc; white-space: nowrap; font-weight: 600; }
td { padding: .32rem .65rem; border-bottom: 1px solid #ebe7e0; vertical-align: top; }
th.right, td.right { text-align: right; }
tbody tr:nth-child(even) td { background: #fbfaf7; }
tr.pass td:first-child { box-shadow: inset 4px 0 #4d7c5a; }
tr.fail td { background: #fbeeed !important; }
tr.fail td:first-child { box-shadow: inset 4px 0 #b3202f; }
tr.warning td { background: #fdf6e7 !important; }
tr.warning td:first-child { box-shadow: inset 4px 0 #c08a1e; }
tr.muted td { color: #8a857b; }
figure { margin: 1rem 0 1.4rem; }
figure svg { display: block; width: 100%; height: auto; max-width: 100%;
  border: 1px solid #e4e0d8; border-radius: 4px; }
figcaption { color: #66625a; font-size: .9rem; margin-top: .35rem; }
.verdict { display: flex; align-items: center; gap: 1.1rem; margin: 1rem 0 1.4rem;
  padding: .9rem 1.15rem; border: 1px solid; border-radius: 6px; }
.verdict .badge { flex: none; font-weight: 700; font-size: 1.45rem; letter-spacing: .09em;
  padding: .12rem .85rem; border-radius: 4px; color: #ffffff; }
.verdict .text { font-size: 1.05rem; }
.verdict.pass { background: #eef5ef; border-color: #a3c4ab; }
.verdict.pass .badge { background: #3f7350; }
.verdict.fail { background: #fbeeed; border-color: #e2aca7; }
.verdict.fail .badge { background: #b3202f; }
.caution { margin: 1.6rem 0; padding: .75rem 1rem; background: #fdf7ea;
  border-left: 4px solid #c08a1e; border-radius: 0 4px 4px 0; }
.caution strong { color: #7a5510; margin-right: .4rem; }
@media (max-width: 700px) {
  main { padding: 18px 14px 32px; }
  dl.facts { grid-template-columns: 1fr; }
  dl.facts dd { margin-bottom: .4rem; }
  .verdict { flex-direction: column; align-items: flex-start; }
}
@media print {
  body { background: #ffffff; font-size: 11pt; }
  main { max-width: none; padding: 0; min-height: 0; }
  .verdict, .caution, figure, tr { break-inside: avoid; }
  h2, h3 { break-after: avoid; }
  * { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
}
)css";

const char* tone_class(HtmlReport::RowTone tone) {
  switch (tone) {
    case HtmlReport::RowTone::pass: return "pass";
    case HtmlReport::RowTone::fail: return "fail";
    case HtmlReport::RowTone::warning: return "warning";
    case HtmlReport::RowTone::muted: return "muted";
    case HtmlReport::RowTone::plain: break;
  }
  return "";
}

// The SVG text from its root element on: leading blanks, an XML declaration and comments
// before the root are dropped (an XML declaration is not allowed inside HTML).
std::string_view svg_root(std::string_view svg) {
  for (;;) {
    const auto start = svg.find_first_not_of(" \t\r\n");
    if (start == std::string_view::npos) return {};
    svg.remove_prefix(start);
    const char* close = nullptr;
    if (svg.starts_with("<?")) close = "?>";
    else if (svg.starts_with("<!--")) close = "-->";
    if (close == nullptr) return svg;
    const auto end = svg.find(close);
    if (end == std::string_view::npos) return {};
    svg.remove_prefix(end + std::string_view(close).size());
  }
}

}  // namespace

HtmlReport::HtmlReport(std::string title) : title_(std::move(title)) {}

void HtmlReport::add_heading(const std::string& text, int level) {
  level = std::clamp(level, 2, 3);
  body_ += "<h" + std::to_string(level) + ">" + escape_html(text) + "</h" + std::to_string(level) + ">\n";
}

void HtmlReport::add_paragraph(const std::string& text) { body_ += "<p>" + escape_html(text) + "</p>\n"; }

void HtmlReport::add_key_values(const std::vector<std::pair<std::string, std::string>>& items) {
  body_ += "<dl class=\"facts\">\n";
  for (const auto& [key, value] : items)
    body_ += "<dt>" + escape_html(key) + "</dt><dd>" + escape_html(value) + "</dd>\n";
  body_ += "</dl>\n";
}

void HtmlReport::add_table(const std::vector<std::string>& headers, const std::vector<std::vector<std::string>>& rows,
                           const std::vector<RowTone>& tones, const std::vector<Align>& align) {
  auto cell_class = [&](std::size_t column) {
    return column < align.size() && align[column] == Align::right ? std::string(" class=\"right\"") : std::string();
  };
  body_ += "<div class=\"table-wrap\"><table>\n<thead><tr>";
  for (std::size_t c = 0; c < headers.size(); ++c)
    body_ += "<th" + cell_class(c) + " scope=\"col\">" + escape_html(headers[c]) + "</th>";
  body_ += "</tr></thead>\n<tbody>\n";
  for (std::size_t r = 0; r < rows.size(); ++r) {
    QUIETRAIL_ASSERT(rows[r].size() == headers.size());
    const char* tone = r < tones.size() ? tone_class(tones[r]) : "";
    body_ += tone[0] != '\0' ? std::string("<tr class=\"") + tone + "\">" : std::string("<tr>");
    for (std::size_t c = 0; c < rows[r].size(); ++c)
      body_ += "<td" + cell_class(c) + ">" + escape_html(rows[r][c]) + "</td>";
    body_ += "</tr>\n";
  }
  body_ += "</tbody>\n</table></div>\n";
}

void HtmlReport::add_svg(const std::string& svg, const std::string& caption) {
  const std::string_view root = svg_root(svg);
  QUIETRAIL_ASSERT(root.starts_with("<svg"));
  body_ += "<figure>\n";
  body_.append(root);
  if (!body_.ends_with('\n')) body_ += '\n';
  if (!caption.empty()) body_ += "<figcaption>" + escape_html(caption) + "</figcaption>\n";
  body_ += "</figure>\n";
}

void HtmlReport::add_verdict(bool pass, const std::string& text) {
  body_ += std::string("<div class=\"verdict ") + (pass ? "pass" : "fail") + "\"><span class=\"badge\">" +
           (pass ? "PASS" : "FAIL") + "</span><span class=\"text\">" + escape_html(text) + "</span></div>\n";
}

void HtmlReport::add_caution(const std::string& text) {
  body_ += "<div class=\"caution\" role=\"note\"><strong>Caution</strong>" + escape_html(text) + "</div>\n";
}

std::string HtmlReport::render() const {
  std::string out = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
                    "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
                    // Defence in depth: even a stray reference could not fetch anything.
                    "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; "
                    "style-src 'unsafe-inline'\">\n";
  out += "<title>" + escape_html(title_) + "</title>\n<style>" + kStyleSheet + "</style>\n</head>\n<body>\n<main>\n";
  out += "<h1>" + escape_html(title_) + "</h1>\n";
  out += body_;
  out += "</main>\n</body>\n</html>\n";
  return out;
}

}  // namespace quietrail
