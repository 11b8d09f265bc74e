// SPDX-License-Identifier: MIT
// Derating models: table-driven EIA-198 decoding and the temperature and DC-bias factors.
// The sources and the planning simplifications are in the header.
#include "quietrail/models/derating.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <limits>

#include "detail/checks.hpp"
#include "detail/overloaded.hpp"

namespace quietrail {
namespace {

struct DielectricRow {
  Dielectric dielectric;
  std::string_view name;
};

constexpr std::array<DielectricRow, 13> kDielectrics{{
    {Dielectric::none, "none"},
    {Dielectric::c0g, "C0G"},
    {Dielectric::x5r, "X5R"},
    {Dielectric::x7r, "X7R"},
    {Dielectric::x6s, "X6S"},
    {Dielectric::x7s, "X7S"},
    {Dielectric::x8r, "X8R"},
    {Dielectric::y5v, "Y5V"},
    {Dielectric::z5u, "Z5U"},
    {Dielectric::polymer_aluminium, "polymer_aluminium"},
    {Dielectric::polymer_tantalum, "polymer_tantalum"},
    {Dielectric::mno2_tantalum, "mno2_tantalum"},
    {Dielectric::wet_aluminium, "wet_aluminium"},
}};

// EIA-198 class-2 code tables (REFERENCES §8).
struct LowLetter {
  char letter;
  double low_c;
};
constexpr std::array<LowLetter, 3> kLowLimits{{{'X', -55.0}, {'Y', -30.0}, {'Z', 10.0}}};

struct HighDigit {
  char digit;
  double high_c;
};
constexpr std::array<HighDigit, 7> kHighLimits{
    {{'2', 45.0}, {'4', 65.0}, {'5', 85.0}, {'6', 105.0}, {'7', 125.0}, {'8', 150.0}, {'9', 200.0}}};

struct ChangeLetter {
  char letter;
  double minus_percent;
  double plus_percent;
};
constexpr std::array<ChangeLetter, 12> kChanges{{
    {'A', 1.0, 1.0},
    {'B', 1.5, 1.5},
    {'C', 2.2, 2.2},
    {'D', 3.3, 3.3},
    {'E', 4.7, 4.7},
    {'F', 7.5, 7.5},
    {'P', 10.0, 10.0},
    {'R', 15.0, 15.0},
    {'S', 22.0, 22.0},
    {'T', 33.0, 22.0},
    {'U', 56.0, 22.0},
    {'V', 82.0, 22.0},
}};

char upper(char c) { return static_cast<char>(std::toupper(static_cast<unsigned char>(c))); }

bool equal_ignoring_case(std::string_view a, std::string_view b) {
  return a.size() == b.size() && std::equal(a.begin(), a.end(), b.begin(), [](char x, char y) {
           return upper(x) == upper(y);
         });
}

constexpr double kReferenceTemperature = 25.0;  // C, where the nominal value is specified

// Wet aluminium cold loss (header: from memory): fraction lost at -40 C.
constexpr double kWetAluminiumColdLoss = 0.2;
constexpr double kWetAluminiumColdEdge = -40.0;

}  // namespace

std::string_view to_string(Dielectric dielectric) {
  for (const auto& row : kDielectrics)
    if (row.dielectric == dielectric) return row.name;
  QUIETRAIL_ASSERT(false);
  return {};
}

std::optional<Dielectric> parse_dielectric(std::string_view text) {
  for (const auto& row : kDielectrics)
    if (equal_ignoring_case(row.name, text)) return row.dielectric;
  // Other spellings of C0G: "NP0" (N-P-zero, the older name), and the letter-O slips.
  for (const std::string_view alias : {"NP0", "NPO", "COG"})
    if (equal_ignoring_case(alias, text)) return Dielectric::c0g;
  return std::nullopt;
}

bool is_ceramic(Dielectric dielectric) { return dielectric == Dielectric::c0g || is_class2(dielectric); }

bool is_class2(Dielectric dielectric) {
  switch (dielectric) {
    case Dielectric::x5r:
    case Dielectric::x7r:
    case Dielectric::x6s:
    case Dielectric::x7s:
    case Dielectric::x8r:
    case Dielectric::y5v:
    case Dielectric::z5u: return true;
    default: return false;
  }
}

std::optional<TemperatureClass> decode_eia_class2(std::string_view code) {
  if (code.size() != 3) return std::nullopt;
  const auto low = std::find_if(kLowLimits.begin(), kLowLimits.end(),
                                [&](const LowLetter& row) { return row.letter == upper(code[0]); });
  const auto high = std::find_if(kHighLimits.begin(), kHighLimits.end(),
                                 [&](const HighDigit& row) { return row.digit == code[1]; });
  const auto change = std::find_if(kChanges.begin(), kChanges.end(),
                                   [&](const ChangeLetter& row) { return row.letter == upper(code[2]); });
  if (low == kLowLimits.end() || high == kHighLimits.end() || change == kChanges.end()) return std::nullopt;
  return TemperatureClass{.low_c = low->low_c,
                          .high_c = high->high_c,
                          .change_minus = change->minus_percent / 100.0,
                          .change_plus = change->plus_percent / 100.0};
}

std::optional<TemperatureClass> temperature_class(Dielectric dielectric) {
  if (!is_class2(dielectric)) return std::nullopt;
  const auto decoded = decode_eia_class2(to_string(dielectric));
  QUIETRAIL_ASSERT(decoded.has_value());
  return decoded;
}

TemperatureRange rated_temperature_range(Dielectric dielectric) {
  if (const auto eia = temperature_class(dielectric)) return {eia->low_c, eia->high_c};
  switch (dielectric) {
    case Dielectric::c0g: return {-55.0, 125.0};
    case Dielectric::polymer_aluminium: return {-55.0, 105.0};
    case Dielectric::polymer_tantalum: return {-55.0, 105.0};
    case Dielectric::mno2_tantalum: return {-55.0, 125.0};
    case Dielectric::wet_aluminium: return {-40.0, 105.0};
    default: break;
  }
  constexpr double kInf = std::numeric_limits<double>::infinity();
  return {-kInf, kInf};
}

double class1_temperature_factor(double alpha, double temperature_c) {
  return 1.0 + alpha * (temperature_c - kReferenceTemperature);
}

double temperature_factor(Dielectric dielectric, double temperature_c) {
  QUIETRAIL_ASSERT(std::isfinite(temperature_c));
  if (const auto eia = temperature_class(dielectric)) {
    // Clamp first: outside the rating the planning value is the edge value.
    const double t = std::clamp(temperature_c, eia->low_c, eia->high_c);
    const double edge = t >= kReferenceTemperature ? eia->high_c : eia->low_c;
    const double x = (t - kReferenceTemperature) / (edge - kReferenceTemperature);
    return 1.0 - eia->change_minus * x * x;
  }
  switch (dielectric) {
    case Dielectric::c0g: return class1_temperature_factor(kC0gTemperatureCoefficient, temperature_c);
    case Dielectric::wet_aluminium: {
      const TemperatureRange range = rated_temperature_range(dielectric);
      const double t = std::clamp(temperature_c, range.low_c, range.high_c);
      if (t >= kReferenceTemperature) return 1.0;
      return 1.0 - kWetAluminiumColdLoss * (kReferenceTemperature - t) /
                       (kReferenceTemperature - kWetAluminiumColdEdge);
    }
    default: return 1.0;
  }
}

double DcBiasCurve::factor(double voltage) const {
  const double v = std::abs(voltage);
  if (v == 0.0 || std::isinf(v_half)) return 1.0;
  return 1.0 / (1.0 + std::pow(v / v_half, exponent));
}

void DcBiasCurve::validate(const std::string& file, const std::string& field) const {
  detail::require_positive_or_infinite(v_half, file, field + "/v_half", "V");
  detail::require_positive(exponent, file, field + "/exponent", "");
}

double DcBiasTable::factor(double voltage) const {
  const double v = std::abs(voltage);
  double v0 = 0.0;
  double f0 = 1.0;
  for (const auto& point : points) {
    if (v <= point.voltage) {
      if (point.voltage == v0) return point.factor;
      return f0 + (point.factor - f0) * (v - v0) / (point.voltage - v0);
    }
    v0 = point.voltage;
    f0 = point.factor;
  }
  return f0;  // hold the last factor above the table
}

void DcBiasTable::validate(const std::string& file, const std::string& field) const {
  double previous = -1.0;
  for (std::size_t i = 0; i < points.size(); ++i) {
    const std::string at = field + "/" + std::to_string(i);
    const DcBiasPoint& p = points[i];
    detail::require_non_negative(p.voltage, file, at, "V");
    require_input(p.voltage > previous, {file, at}, "voltages in strictly increasing order",
                  detail::describe_number(p.voltage, "V") + " after " + detail::describe_number(previous, "V"));
    require_input(std::isfinite(p.factor) && p.factor > 0.0 && p.factor <= 1.0, {file, at},
                  "a capacitance factor C(V)/C0 in (0, 1]", detail::describe_number(p.factor, ""));
    require_input(p.voltage > 0.0 || p.factor == 1.0, {file, at}, "the factor 1 at 0 V (the nominal value)",
                  detail::describe_number(p.factor, ""));
    previous = p.voltage;
  }
}

double dc_bias_factor(const DcBias& dc_bias, double voltage) {
  return std::visit(detail::Overloaded{
                        [](const std::monostate&) { return 1.0; },
                        [&](const DcBiasCurve& curve) { return curve.factor(voltage); },
                        [&](const DcBiasTable& table) { return table.factor(voltage); },
                    },
                    dc_bias);
}

void DeratingConditions::validate() const {
  detail::require_finite(dc_voltage, "", "dc_voltage", "V");
  detail::require_finite(temperature_c, "", "temperature_c", "C");
}

double effective_capacitance(double nominal_capacitance, Dielectric dielectric, const DcBias& dc_bias,
                             const DeratingConditions& conditions) {
  return nominal_capacitance * dc_bias_factor(dc_bias, conditions.dc_voltage) *
         temperature_factor(dielectric, conditions.temperature_c);
}

}  // namespace quietrail
