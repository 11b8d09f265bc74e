// SPDX-License-Identifier: MIT
// Capacitance derating: dielectric kinds, the EIA-198 class-2 temperature code, the
// temperature and DC-bias factors, and the effective capacitance at a rail's operating
// point. Part data that feeds these models lives in part_libraries/ (io/part_library.hpp).
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

namespace quietrail {

/// Dielectric (or electrolyte) kind of a capacitor.
///
/// Ceramic class 1: c0g (also written NP0). Ceramic class 2 by EIA-198 code: x5r, x7r, x6s,
/// x7s, x8r, y5v, z5u. Bulk kinds: polymer_aluminium, polymer_tantalum, mno2_tantalum,
/// wet_aluminium. `none` is a part with no derating (e.g. an ideal or unknown capacitor).
enum class Dielectric {
  none,
  c0g,
  x5r,
  x7r,
  x6s,
  x7s,
  x8r,
  y5v,
  z5u,
  polymer_aluminium,
  polymer_tantalum,
  mno2_tantalum,
  wet_aluminium,
};

/// "C0G", "X5R", ..., "polymer_aluminium", ..., "none". Ceramic codes are upper case as
/// printed on data sheets; bulk kinds are snake_case.
std::string_view to_string(Dielectric dielectric);

/// Parses a dielectric name, case-insensitive: the strings of to_string, plus "NP0"/"NPO"
/// and "COG" (letter O) for C0G. std::nullopt for anything else.
std::optional<Dielectric> parse_dielectric(std::string_view text);

/// True for the multilayer-ceramic kinds (c0g and the class-2 codes).
bool is_ceramic(Dielectric dielectric);
/// True for the class-2 ceramic kinds (x5r, x7r, x6s, x7s, x8r, y5v, z5u).
bool is_class2(Dielectric dielectric);

/// The temperature behaviour encoded by an EIA-198 class-2 code.
///
/// Temperatures in degrees Celsius; the changes are fractions of the 25 C capacitance,
/// both given as positive magnitudes: the capacitance stays within
/// [1 - change_minus, 1 + change_plus] x C(25 C) over [low_c, high_c].
struct TemperatureClass {
  /// Lowest rated temperature, C.
  double low_c = 0.0;
  /// Highest rated temperature, C.
  double high_c = 0.0;
  /// Largest allowed fall over the range, fraction (0.15 for -15 %).
  double change_minus = 0.0;
  /// Largest allowed rise over the range, fraction (0.15 for +15 %).
  double change_plus = 0.0;
};

/// Decodes a three-character EIA-198 class-2 code such as "X7R" (case-insensitive).
///
/// First letter = low limit (X -55, Y -30, Z +10 C); digit = high limit (2 +45, 4 +65,
/// 5 +85, 6 +105, 7 +125, 8 +150, 9 +200 C); last letter = maximum change (A 1.0, B 1.5,
/// C 2.2, D 3.3, E 4.7, F 7.5, P 10, R 15, S 22 % both ways; T +22/-33, U +22/-56,
/// V +22/-82 %). Source: EIA-198 (aligned with IEC 60384-22), table as reproduced in
/// REFERENCES §8. std::nullopt for any text that is not such a code.
std::optional<TemperatureClass> decode_eia_class2(std::string_view code);

/// The EIA temperature class of a class-2 kind; std::nullopt for every other kind.
std::optional<TemperatureClass> temperature_class(Dielectric dielectric);

/// Range of temperatures over which a kind is normally rated, C.
struct TemperatureRange {
  double low_c = 0.0;   ///< lowest rated temperature, C
  double high_c = 0.0;  ///< highest rated temperature, C
};

/// The rated range of `dielectric`: class 2 from its EIA code; C0G -55..125 C (usual
/// rating, REFERENCES §8); polymer aluminium -55..105 C, polymer tantalum -55..105 C,
/// MnO2 tantalum -55..125 C, wet aluminium -40..105 C (typical ratings, from memory);
/// none: unbounded (-inf..+inf).
TemperatureRange rated_temperature_range(Dielectric dielectric);

/// Nominal temperature coefficient of C0G, 1/K: 0 ppm/K (EIA-198 class 1, REFERENCES §8).
inline constexpr double kC0gTemperatureCoefficient = 0.0;
/// Tolerance on the C0G coefficient, 1/K: +/-30 ppm/K (EIA-198 letter G; REFERENCES §8).
/// A spread for Monte Carlo, not part of the nominal factor.
inline constexpr double kC0gCoefficientTolerance = 30e-6;

/// Class-1 temperature factor C(T)/C(25 C) = 1 + alpha * (T - 25), with `alpha` in 1/K and
/// T in C. Linear temperature coefficient, the defining form of the EIA class-1 code.
double class1_temperature_factor(double alpha, double temperature_c);

/// Temperature factor C(T)/C(25 C) of `dielectric` at `temperature_c` (C), dimensionless.
///
/// - Class 2 (planning model, common practice; not a measured part curve): the capacitance
///   falls parabolically from 1 at 25 C to the class's lower limit at each edge of its
///   range, 1 - change_minus * ((T - 25) / (edge - 25))^2, with edge = high_c above 25 C and
///   low_c below. Beyond the rated range the value is held at the edge value (the part is
///   outside its rating: check with rated_temperature_range). Real class-2 curves are
///   often flatter or even rise at one side; this model takes the class limit as the
///   planning worst case at the edges.
/// - C0G: class1_temperature_factor(kC0gTemperatureCoefficient, T) = 1 (nominal).
/// - Polymer aluminium, polymer tantalum, MnO2 tantalum: 1 (roughly flat over their range;
///   typical, from memory).
/// - Wet aluminium: loses capacitance in the cold, taken linear from 1 at 25 C to 0.8 at
///   -40 C and 1 at and above 25 C (typical, from memory); clamped to the rated range.
/// - none: 1.
/// `temperature_c` must be finite (QUIETRAIL_ASSERT).
double temperature_factor(Dielectric dielectric, double temperature_c);

/// DC-bias curve in closed form: C(V)/C0 = 1 / (1 + (|V| / v_half)^exponent).
///
/// v_half is the DC voltage at which half the capacitance is left, V (> 0, or +infinity
/// for no loss); exponent is dimensionless (> 0). Model form: REFERENCES §8 ("C(V)/C0 =
/// 1/(1 + (V/V_h)^p)", generic, from memory). The factor is exactly 1 at 0 V.
struct DcBiasCurve {
  /// Voltage where C(V)/C0 = 0.5, V. > 0; +infinity means no DC-bias loss.
  double v_half = 0.0;
  /// Steepness p, dimensionless. > 0.
  double exponent = 1.0;

  /// C(V)/C0 at DC voltage `voltage` (V, the magnitude is used).
  double factor(double voltage) const;
  /// Throws InputError naming `field` + "/v_half" or "/exponent" for an out-of-domain value.
  void validate(const std::string& file, const std::string& field) const;
};

/// One measured or tabulated point of C(V)/C0.
struct DcBiasPoint {
  double voltage = 0.0;  ///< DC voltage, V, >= 0
  double factor = 1.0;   ///< C(V)/C0, dimensionless, in (0, 1]
};

/// DC-bias curve as a table of points, interpolated linearly in V.
///
/// An implicit point (0 V, 1) starts the table (a point at 0 V, if given, must have factor
/// 1). Voltages must increase strictly; factors lie in (0, 1]. Above the last point the
/// last factor is held (extrapolation would be a guess). The magnitude of the voltage is
/// used. Form: "a user table C(V)/C0" (REFERENCES §8).
struct DcBiasTable {
  /// Points in increasing voltage. May be empty (then the factor is 1 everywhere).
  std::vector<DcBiasPoint> points{};

  /// C(V)/C0 at DC voltage `voltage` (V).
  double factor(double voltage) const;
  /// Throws InputError naming `field` + "/<index>" for an unordered or out-of-domain point.
  void validate(const std::string& file, const std::string& field) const;
};

/// A part's DC-bias behaviour: none (std::monostate: no loss, as for C0G and bulk kinds),
/// the closed form, or a table.
using DcBias = std::variant<std::monostate, DcBiasCurve, DcBiasTable>;

/// C(V)/C0 of `dc_bias` at `voltage` (V): 1 for std::monostate.
double dc_bias_factor(const DcBias& dc_bias, double voltage);

/// The operating point at which a capacitor's effective value is wanted.
struct DeratingConditions {
  /// DC voltage across the part, V. Finite; its magnitude is used.
  double dc_voltage = 0.0;
  /// Part temperature, C. Finite. 25 C is the reference temperature of the nominal value.
  double temperature_c = 25.0;

  /// Throws InputError naming "dc_voltage" or "temperature_c" for a non-finite value.
  void validate() const;
};

/// Effective capacitance, F:
///   C_eff = C_nominal * dc_bias_factor(dc_bias, V) * temperature_factor(dielectric, T).
/// The two factors are taken as independent (a planning simplification: in real class-2
/// parts the DC-bias loss depends somewhat on temperature). Aging is not included.
double effective_capacitance(double nominal_capacitance, Dielectric dielectric, const DcBias& dc_bias,
                             const DeratingConditions& conditions);

}  // namespace quietrail
