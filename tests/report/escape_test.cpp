// SPDX-License-Identifier: MIT
// CSV, HTML and XML escaping of names taken from input files.
// Expected strings follow the published standards named beside each check (RFC 4180,
// OWASP cheat sheets, XML 1.0).
#include <catch2/catch.hpp>

#include <string>

#include "quietrail/report/escape.hpp"

using quietrail::escape_csv_cell;
using quietrail::escape_html;
using quietrail::escape_xml;

TEST_CASE("plain CSV cells pass through unchanged", "[report]") {
  CHECK(escape_csv_cell("C12 bulk") == "C12 bulk");
  CHECK(escape_csv_cell("") == "");
  CHECK(escape_csv_cell("100nF x20") == "100nF x20");
  CHECK(escape_csv_cell("caf\xC3\xA9") == "caf\xC3\xA9");  // UTF-8 untouched
}

TEST_CASE("CSV cells with separators or quotes are quoted with doubled quotes", "[report]") {
  // RFC 4180, section 2, rules 6 and 7.
  CHECK(escape_csv_cell("a,b") == "\"a,b\"");
  CHECK(escape_csv_cell("say \"hi\"") == "\"say \"\"hi\"\"\"");
  CHECK(escape_csv_cell("two\nlines") == "\"two\nlines\"");
  CHECK(escape_csv_cell("cr\rhere") == "\"cr\rhere\"");
}

TEST_CASE("CSV cells that a spreadsheet would evaluate get a leading quote", "[report]") {
  // OWASP "CSV Injection": cells starting with = + - @ tab or CR are formulas to
  // spreadsheet programs; a leading single quote makes them text.
  CHECK(escape_csv_cell("=1+1") == "'=1+1");
  CHECK(escape_csv_cell("+1") == "'+1");
  CHECK(escape_csv_cell("-cmd") == "'-cmd");
  CHECK(escape_csv_cell("@SUM(A1)") == "'@SUM(A1)");
  CHECK(escape_csv_cell("\tx") == "'\tx");
  CHECK(escape_csv_cell("\rx") == "\"'\rx\"");  // guarded, then quoted for the CR
  CHECK(escape_csv_cell("=HYPERLINK(\"x\",\"y\")") == "\"'=HYPERLINK(\"\"x\"\",\"\"y\"\")\"");
  // Only the first character matters.
  CHECK(escape_csv_cell("a=b") == "a=b");
  CHECK(escape_csv_cell("x-1") == "x-1");
}

TEST_CASE("HTML escaping replaces the five significant characters", "[report]") {
  // OWASP XSS Prevention Cheat Sheet, rule 1 (& < > " ').
  CHECK(escape_html("<script>alert('x')</script>") == "&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt;");
  CHECK(escape_html("a & b \"c\"") == "a &amp; b &quot;c&quot;");
  CHECK(escape_html("&amp;") == "&amp;amp;");  // already-escaped text is escaped again
  CHECK(escape_html("plain 100nF") == "plain 100nF");
}

TEST_CASE("XML escaping replaces markup characters and characters XML 1.0 forbids", "[report]") {
  // XML 1.0 (5th ed.) section 4.6 predefined entities; section 2.2 Char production.
  CHECK(escape_xml("<g id=\"a&b\">'") == "&lt;g id=&quot;a&amp;b&quot;&gt;&apos;");
  CHECK(escape_xml("tab\tnl\ncr\r") == "tab\tnl\ncr\r");
  const std::string replacement = "\xEF\xBF\xBD";
  CHECK(escape_xml(std::string("a\x01" "b", 3)) == "a" + replacement + "b");
  CHECK(escape_xml(std::string("nul\0!", 5)) == "nul" + replacement + "!");
  CHECK(escape_xml("\x1b[31m") == replacement + "[31m");
  CHECK(escape_xml("\xC2\xB5" "F") == "\xC2\xB5" "F");  // UTF-8 micro sign kept
}
