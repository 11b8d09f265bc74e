// SPDX-License-Identifier: MIT
// Single-file HTML reports: escaped text, the inline plot, no network references, the
// verdict and the caution. Rules from the HTML Living Standard and the OWASP XSS cheat sheet.
#include <catch2/catch.hpp>

#include <string>
#include <vector>

#include "quietrail/error.hpp"
#include "quietrail/report/html_report.hpp"
#include "quietrail/report/svg_plot.hpp"

using quietrail::HtmlReport;
using quietrail::InternalError;
using quietrail::PlotSeries;
using quietrail::render_svg_loglog;

namespace {

constexpr const char* kEvil = "<script>alert('x')</script>&";
constexpr const char* kEvilEscaped = "&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt;&amp;";

std::size_t count(const std::string& text, const std::string& what) {
  std::size_t n = 0;
  for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
  return n;
}

std::string sample_svg() {
  return render_svg_loglog({{"rail", {1e3, 1e6, 1e9}, {1.0, 0.01, 2.0}, PlotSeries::Style::total}}, {}, {});
}

}  // namespace

TEST_CASE("the report is one HTML5 document with UTF-8 and a viewport", "[report]") {
  HtmlReport report("Rail check");
  const std::string html = report.render();
  // HTML Living Standard: the doctype (13.1.1), the charset declaration (4.2.5.4).
  CHECK(html.starts_with("<!DOCTYPE html>\n"));
  CHECK(html.find("<html lang=\"en\">") != std::string::npos);
  CHECK(html.find("<meta charset=\"utf-8\">") != std::string::npos);
  CHECK(html.find("name=\"viewport\"") != std::string::npos);
  CHECK(html.find("<title>Rail check</title>") != std::string::npos);
  CHECK(html.find("<h1>Rail check</h1>") != std::string::npos);
  CHECK(count(html, "<style>") == 1);
  CHECK(html.ends_with("</html>\n"));
}

TEST_CASE("every text from input is HTML-escaped", "[report]") {
  // OWASP XSS Prevention Cheat Sheet, rule 1: & < > " ' escaped in element content.
  HtmlReport report(kEvil);
  report.add_heading(kEvil);
  report.add_paragraph(kEvil);
  report.add_key_values({{kEvil, kEvil}});
  report.add_table({kEvil}, {{kEvil}}, {HtmlReport::RowTone::fail});
  report.add_svg(sample_svg(), kEvil);
  report.add_verdict(false, kEvil);
  report.add_caution(kEvil);
  const std::string html = report.render();
  CHECK(html.find("<script") == std::string::npos);
  CHECK(html.find("alert('x')") == std::string::npos);
  // title, h1, h2, p, dt, dd, th, td, figcaption, verdict, caution
  CHECK(count(html, kEvilEscaped) == 11);
}

TEST_CASE("the plot is inlined as SVG without its XML declaration", "[report]") {
  const std::string svg = sample_svg();
  HtmlReport report("Plot");
  report.add_svg("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<!-- made here -->\n" + svg, "Impedance");
  const std::string html = report.render();
  CHECK(html.find(svg) != std::string::npos);
  CHECK(html.find("<?xml") == std::string::npos);
  CHECK(html.find("<figure>\n<svg xmlns=\"http://www.w3.org/2000/svg\"") != std::string::npos);
  CHECK(html.find("<figcaption>Impedance</figcaption>") != std::string::npos);
  // Something that is not an SVG element is a programming error.
  CHECK_THROWS_AS(report.add_svg("<div>no</div>"), InternalError);
}

TEST_CASE("the page references nothing outside itself", "[report]") {
  HtmlReport report("Self-contained");
  report.add_heading("Plot");
  report.add_svg(sample_svg());
  const std::string text_url = "see http://example.invalid for more";
  report.add_paragraph(text_url);  // text only, escaped, not a link
  report.add_caution("Planning estimate.");
  const std::string html = report.render();
  // The only URL-like text allowed in markup is the SVG namespace name, which browsers never
  // fetch (Namespaces in XML 1.0, section 2.2: the name is an identifier). The paragraph text
  // is plain text, so it is removed before scanning.
  std::string markup = html;
  markup.erase(markup.find(text_url), text_url.size());
  std::size_t urls = 0;
  for (const char* scheme : {"http://", "https://", "//cdn", "ftp://"}) {
    for (auto at = markup.find(scheme); at != std::string::npos; at = markup.find(scheme, at + 1)) {
      CHECK(markup.compare(at, 26, "http://www.w3.org/2000/svg") == 0);
      ++urls;
    }
  }
  CHECK(urls == 1);
  for (const char* fetcher : {"<script", "<link", "<img", "<iframe", "src=", "href=", "url(", "@import", "@font-face"})
    CHECK(markup.find(fetcher) == std::string::npos);
  // Defence in depth: a content security policy that forbids every fetch.
  CHECK(html.find("Content-Security-Policy\" content=\"default-src 'none'") != std::string::npos);
}

TEST_CASE("the verdict and the caution are shown", "[report]") {
  HtmlReport pass("p");
  pass.add_verdict(true, "Target met with 30 % margin");
  pass.add_caution("Planning estimate: confirm on hardware.");
  const std::string html = pass.render();
  CHECK(html.find("<div class=\"verdict pass\"><span class=\"badge\">PASS</span>") != std::string::npos);
  CHECK(html.find("Target met with 30 % margin") != std::string::npos);
  CHECK(html.find("<div class=\"caution\" role=\"note\"><strong>Caution</strong>Planning estimate: confirm on "
                  "hardware.</div>") != std::string::npos);

  HtmlReport fail("f");
  fail.add_verdict(false, "Worst 1.8 x target");
  CHECK(fail.render().find("<div class=\"verdict fail\"><span class=\"badge\">FAIL</span>") != std::string::npos);
}

TEST_CASE("tables keep row order, mark rows by tone and align columns", "[report]") {
  using Tone = HtmlReport::RowTone;
  using Align = HtmlReport::Align;
  HtmlReport report("t");
  report.add_table({"Part", "Count"}, {{"C1", "4"}, {"C2", "10"}, {"C3", "1"}}, {Tone::fail, Tone::plain},
                   {Align::left, Align::right});
  const std::string html = report.render();
  CHECK(html.find("<th scope=\"col\">Part</th><th class=\"right\" scope=\"col\">Count</th>") != std::string::npos);
  CHECK(html.find("<tr class=\"fail\"><td>C1</td><td class=\"right\">4</td></tr>\n"
                  "<tr><td>C2</td><td class=\"right\">10</td></tr>\n"
                  "<tr><td>C3</td><td class=\"right\">1</td></tr>") != std::string::npos);
  CHECK_THROWS_AS(report.add_table({"A", "B"}, {{"only one"}}), InternalError);
}

TEST_CASE("blocks appear in the order they were added", "[report]") {
  HtmlReport report("order");
  report.add_heading("First", 2);
  report.add_heading("Second", 3);
  report.add_heading("Clamped", 7);
  report.add_paragraph("two\nlines");
  const std::string html = report.render();
  const auto first = html.find("<h2>First</h2>");
  const auto second = html.find("<h3>Second</h3>");
  const auto clamped = html.find("<h3>Clamped</h3>");
  const auto paragraph = html.find("<p>two\nlines</p>");
  REQUIRE(first != std::string::npos);
  REQUIRE(second != std::string::npos);
  REQUIRE(clamped != std::string::npos);
  REQUIRE(paragraph != std::string::npos);
  CHECK(first < second);
  CHECK(second < clamped);
  CHECK(clamped < paragraph);
}
