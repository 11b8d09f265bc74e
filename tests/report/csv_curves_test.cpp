// SPDX-License-Identifier: MIT
// CSV curve output: header, one row per frequency, magnitude and phase from closed forms.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>
#include <string>
#include <vector>

#include "quietrail/error.hpp"
#include "quietrail/report/csv_curves.hpp"
#include "support/temp_dir.hpp"

using Catch::Matchers::WithinRel;
using quietrail::ComplexVector;
using quietrail::FrequencyGrid;
using quietrail::NamedCurve;

namespace {

// Ten significant digits are printed.
constexpr double kPrintTolerance = 1e-9;

std::vector<std::string> split(const std::string& text, char separator) {
  std::vector<std::string> parts;
  std::string part;
  std::istringstream in(text);
  while (std::getline(in, part, separator)) parts.push_back(part);
  return parts;
}

}  // namespace

TEST_CASE("the CSV has a header and one row of |Z|, phase, Re, Im per frequency", "[report]") {
  const FrequencyGrid grid(std::vector<double>{1e6, 2e6});
  ComplexVector z(2);
  z << quietrail::Complex(3.0, 4.0), quietrail::Complex(0.0, -2.0);
  const auto lines = split(quietrail::format_impedance_csv(grid, z), '\n');
  REQUIRE(lines.size() == 3);
  CHECK(lines[0] == "frequency_Hz,port_abs_ohm,port_phase_deg,port_re_ohm,port_im_ohm");

  const auto row = split(lines[1], ',');
  REQUIRE(row.size() == 5);
  CHECK_THAT(std::stod(row[0]), WithinRel(1e6, kPrintTolerance));
  // 3-4-5 right triangle: |3 + 4j| = 5, angle atan(4/3) = 53.13010235 degrees.
  CHECK_THAT(std::stod(row[1]), WithinRel(5.0, kPrintTolerance));
  CHECK_THAT(std::stod(row[2]), WithinRel(53.13010235415598, kPrintTolerance));
  CHECK_THAT(std::stod(row[3]), WithinRel(3.0, kPrintTolerance));
  CHECK_THAT(std::stod(row[4]), WithinRel(4.0, kPrintTolerance));

  // A pure negative reactance (ideal capacitor) is at -90 degrees.
  const auto row2 = split(lines[2], ',');
  CHECK_THAT(std::stod(row2[1]), WithinRel(2.0, kPrintTolerance));
  CHECK_THAT(std::stod(row2[2]), WithinRel(-90.0, kPrintTolerance));
}

TEST_CASE("extra curves add four columns each with escaped names", "[report]") {
  const FrequencyGrid grid(std::vector<double>{1e3});
  ComplexVector port(1), part(1);
  port << quietrail::Complex(1.0, 0.0);
  part << quietrail::Complex(0.0, 1.0);
  const std::string csv = quietrail::format_impedance_csv(grid, port, {NamedCurve{"=cmd,x", part}, {"C1", part}});
  const auto lines = split(csv, '\n');
  REQUIRE(lines.size() == 2);
  // Escaping per RFC 4180 and the formula guard (report/escape.hpp).
  CHECK(lines[0] ==
        "frequency_Hz,port_abs_ohm,port_phase_deg,port_re_ohm,port_im_ohm,"
        "\"'=cmd,x abs_ohm\",\"'=cmd,x phase_deg\",\"'=cmd,x re_ohm\",\"'=cmd,x im_ohm\","
        "C1 abs_ohm,C1 phase_deg,C1 re_ohm,C1 im_ohm");
  const auto row = split(lines[1], ',');
  REQUIRE(row.size() == 13);
  CHECK_THAT(std::stod(row[6]), WithinRel(90.0, kPrintTolerance));  // +j: +90 degrees
}

TEST_CASE("real-valued columns follow the port columns with escaped names and their values", "[report]") {
  const FrequencyGrid grid(std::vector<double>{1e3, 1e4});
  ComplexVector port(2), part(2);
  port << quietrail::Complex(3.0, 4.0), quietrail::Complex(0.0, 2.0);
  part << quietrail::Complex(1.0, 0.0), quietrail::Complex(1.0, 0.0);
  quietrail::RealVector target(2);
  target << 10.0, 1.0;
  // Columns are written as given, ten significant digits; the name gets the formula guard.
  quietrail::RealVector ratio(2);
  ratio << 0.5, 2.0;
  const std::string csv = quietrail::format_impedance_csv(grid, port, {NamedCurve{"C1", part}},
                                                          {{"target_ohm", target}, {"=ratio", ratio}});
  const auto lines = split(csv, '\n');
  REQUIRE(lines.size() == 3);
  CHECK(lines[0] ==
        "frequency_Hz,port_abs_ohm,port_phase_deg,port_re_ohm,port_im_ohm,target_ohm,'=ratio,"
        "C1 abs_ohm,C1 phase_deg,C1 re_ohm,C1 im_ohm");
  const auto row = split(lines[2], ',');
  REQUIRE(row.size() == 11);
  CHECK_THAT(std::stod(row[5]), WithinRel(1.0, kPrintTolerance));
  CHECK_THAT(std::stod(row[6]), WithinRel(2.0, kPrintTolerance));
  CHECK_THAT(std::stod(row[7]), WithinRel(1.0, kPrintTolerance));  // C1 |Z| follows
}

TEST_CASE("a curve of the wrong length is a bug, not bad input", "[report]") {
  const FrequencyGrid grid(std::vector<double>{1e3, 2e3});
  ComplexVector z(1);
  z << quietrail::Complex(1.0, 0.0);
  CHECK_THROWS_AS(quietrail::format_impedance_csv(grid, z), quietrail::InternalError);
}

TEST_CASE("the CSV file is written whole through the atomic writer", "[report]") {
  quietrail::test::TempDir dir("csv");
  const FrequencyGrid grid(std::vector<double>{1e3, 1e4, 1e5});
  ComplexVector z = ComplexVector::Constant(3, quietrail::Complex(0.5, 0.0));
  quietrail::write_impedance_csv(dir / "rail_impedance.csv", grid, z);
  const std::string text = quietrail::test::read_text(dir / "rail_impedance.csv");
  CHECK(text == quietrail::format_impedance_csv(grid, z));
  CHECK(split(text, '\n').size() == 4);
  CHECK(quietrail::test::list_names(dir.path()) == std::vector<std::string>{"rail_impedance.csv"});
}
