// SPDX-License-Identifier: MIT
// Aligned text tables for terminal summaries. Expected layouts are derived by hand from
// the rule in text_table.hpp: two spaces between columns, padding to the widest cell.
#include <catch2/catch.hpp>

#include <string>

#include "quietrail/error.hpp"
#include "quietrail/report/text_table.hpp"

using quietrail::InternalError;
using quietrail::text_columns;
using quietrail::TextTable;

TEST_CASE("columns are padded to the widest cell and aligned left or right", "[report]") {
  TextTable table({"Part", "Count", "Note"}, {TextTable::Align::left, TextTable::Align::right});
  table.add_row({"C1", "4", "bulk"});
  table.add_row({"C22 long", "120", ""});
  // Widths 8, 5, 4; the third column defaults to left; no trailing blanks.
  const std::string expected =
      "  Part      Count  Note\n"
      "  ---------------------\n"
      "  C1            4  bulk\n"
      "  C22 long    120\n";
  CHECK(table.render() == expected);
  CHECK(table.row_count() == 2);
}

TEST_CASE("a rule can separate a totals row", "[report]") {
  TextTable table({"Part", "Cost"}, {TextTable::Align::left, TextTable::Align::right});
  table.add_row({"C1", "0.10"});
  table.add_rule();
  table.add_row({"Total", "0.10"});
  const std::string expected =
      "Part   Cost\n"
      "-----------\n"
      "C1     0.10\n"
      "-----------\n"
      "Total  0.10\n";
  CHECK(table.render(0) == expected);
  CHECK(table.row_count() == 2);
}

TEST_CASE("UTF-8 text counts one column per code point", "[report]") {
  // U+03A9 (2 bytes) and U+00B5 (2 bytes) each take one column (Unicode: one code point,
  // East Asian Width "ambiguous"/"neutral", narrow in Western terminals).
  CHECK(text_columns("10 m\xCE\xA9") == 5);
  CHECK(text_columns("4.7 \xC2\xB5" "F") == 6);
  CHECK(text_columns("") == 0);
  TextTable table({"Z"}, {TextTable::Align::right});
  table.add_row({"10 m\xCE\xA9"});
  table.add_row({"1 \xCE\xA9"});
  CHECK(table.render(0) == "    Z\n-----\n10 m\xCE\xA9\n  1 \xCE\xA9\n");
}

TEST_CASE("the header style applies to the header text only", "[report]") {
  TextTable table({"A", "B"});
  table.add_row({"x", "y"});
  // Built by appending: GCC 12 warns falsely (-Wrestrict) on "[" + std::string + "]".
  const std::string out = table.render(1, [](std::string_view h) { return std::string("[").append(h).append("]"); });
  CHECK(out == " [A  B]\n ----\n x  y\n");
  CHECK(table.render(-3) == "A  B\n----\nx  y\n");  // negative indent counts as none
}

TEST_CASE("a row with the wrong number of cells is a programming error", "[report]") {
  TextTable table({"A", "B"});
  CHECK_THROWS_AS(table.add_row({"only one"}), InternalError);
}
