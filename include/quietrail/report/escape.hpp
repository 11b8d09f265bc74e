// SPDX-License-Identifier: MIT
// Escaping for names that come from input files and end up in CSV, HTML or SVG/XML
// output. One small function per format; each has its own tests (report/escape_test).
#pragma once

#include <string>
#include <string_view>

namespace quietrail {

/// Escapes one CSV cell of text (not for numbers written by the program).
///
/// 1. Formula-injection guard: a cell starting with = + - @, a tab or a carriage return
///    gets a leading single quote, so spreadsheet programs show it as text instead of
///    evaluating it (OWASP, "CSV Injection").
/// 2. RFC 4180 quoting: a cell containing a comma, a double quote, CR or LF is wrapped
///    in double quotes, and each double quote inside is doubled.
/// Example: "=SUM(A1),x" -> "\"'=SUM(A1),x\"".
std::string escape_csv_cell(std::string_view text);

/// Escapes text for HTML element content and quoted attribute values: & < > " ' become
/// &amp; &lt; &gt; &quot; &#39; (OWASP XSS Prevention Cheat Sheet, rule 1; HTML
/// Living Standard, named character references).
std::string escape_html(std::string_view text);

/// Escapes text for XML (SVG) content and attribute values: & < > " ' become &amp; &lt;
/// &gt; &quot; &apos; (XML 1.0, 5th ed., section 2.4 and 4.6). Control characters other
/// than tab, LF and CR are not allowed anywhere in an XML 1.0 document (section 2.2, the
/// Char production), so each becomes U+FFFD REPLACEMENT CHARACTER; so does DEL (0x7F),
/// which section 2.2 discourages. Other bytes, including UTF-8 sequences, pass through.
std::string escape_xml(std::string_view text);

}  // namespace quietrail
