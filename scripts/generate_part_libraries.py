#!/usr/bin/env python3
# SPDX-License-Identifier: MIT
# Writes the generic part libraries part_libraries/{mlcc,bulk,beads}.json from the rules
# below (format: docs/part_libraries.md). Standard library only; the output is committed.
"""Generate quietrail's generic part libraries.

Usage: python3 scripts/generate_part_libraries.py [output_dir]   (default: part_libraries/)

Every number here is a *typical* planning value, not data for any real part. Where a
range comes from the project's reference notes (../shared/REFERENCES.md sections 6 and 8)
the comment says so; everything else is marked common practice, from memory or invented.
"""

import json
import math
import pathlib
import sys

FORMAT_VERSION = 1

# ----------------------------------------------------------------------------- formatting

PREFIXES = [(1e-15, "f"), (1e-12, "p"), (1e-9, "n"), (1e-6, "u"), (1e-3, "m"), (1.0, ""),
            (1e3, "k"), (1e6, "M")]


def sig(value, digits=3):
    """`value` rounded to `digits` significant figures."""
    if value == 0:
        return 0.0
    return round(value, digits - 1 - int(math.floor(math.log10(abs(value)))))


def eng(value, unit, digits=3):
    """Engineering notation that quietrail's parse_value reads back: 1e-7, "F" -> "100nF"."""
    value = sig(value, digits)
    for factor, prefix in reversed(PREFIXES):
        if abs(value) >= factor * 0.9999999:
            mantissa = sig(value / factor, digits)
            text = f"{mantissa:.{digits}g}"
            return f"{text}{prefix}{unit}"
    return f"{value:g}{unit}"


def value_code(value):
    """Compact value for ids: 1e-7 -> "100n", 4.7e-6 -> "4u7", 1e-5 -> "10u", 3.3e-10 -> "330p"."""
    for factor, prefix in [(1e-12, "p"), (1e-9, "n"), (1e-6, "u"), (1e-3, "m")]:
        mantissa = sig(value / factor, 3)
        if 1.0 <= mantissa < 1000.0:
            if mantissa == int(mantissa):
                return f"{int(mantissa)}{prefix}"
            whole, frac = f"{mantissa:g}".split(".")
            return f"{whole}{prefix}{frac}"
    raise ValueError(value)


def voltage_code(volts):
    """6.3 -> "6v3", 16 -> "16v"."""
    if volts == int(volts):
        return f"{int(volts)}v"
    whole, frac = f"{volts:g}".split(".")
    return f"{whole}v{frac}"


def current_code(amps):
    """0.5 -> "500ma", 2 -> "2a", 1.5 -> "1a5"."""
    if amps < 1:
        return f"{int(round(amps * 1000))}ma"
    if amps == int(amps):
        return f"{int(amps)}a"
    whole, frac = f"{amps:g}".split(".")
    return f"{whole}a{frac}"


def e6(low, high):
    """E6 values (IEC 60063) from `low` to `high` inclusive."""
    out = []
    decade = 10.0 ** math.floor(math.log10(low) - 1)
    while decade <= high * 10:
        for m in (1.0, 1.5, 2.2, 3.3, 4.7, 6.8):
            v = sig(m * decade, 3)
            if low * 0.999 <= v <= high * 1.001:
                out.append(v)
        decade *= 10
    return out


# ----------------------------------------------------------------------------- MLCC rules

PACKAGES = ["0201", "0402", "0603", "0805", "1206", "1210"]

# Body ESL by package, H. 0402-1206: mid values of the typical body-ESL table (REFERENCES
# §6, from memory). 0201 and 1210 are extrapolated (from memory: 0201 below 0402; 1210 about
# as 1206 since the current path is as long).
BODY_ESL = {"0201": 0.30e-9, "0402": 0.40e-9, "0603": 0.60e-9, "0805": 0.75e-9,
            "1206": 1.00e-9, "1210": 1.00e-9}

# Land-pattern courtyard area by package, mm^2 (nominal-density land patterns, typical,
# from memory: about 1.3x0.7, 1.9x1.0, 2.9x1.45, 3.4x1.8, 4.4x2.2, 4.4x3.0 mm).
AREA_MM2 = {"0201": 0.91, "0402": 1.90, "0603": 4.20, "0805": 6.12, "1206": 9.68, "1210": 13.2}

# Relative cost base by package (invented, for ranking only: mid sizes cheapest).
COST_BASE = {"0201": 1.2, "0402": 1.0, "0603": 1.05, "0805": 1.3, "1206": 2.0, "1210": 3.0}

# Largest value offered per package, dielectric and rating (F), and the smallest value
# listed. Common practice (from memory): the capacitance-voltage product a case holds; X5R
# reaches about 1 uF in 0201, 10 uF in 0402, 22 uF in 0603, 47 uF in 0805, 100 uF in
# 1206/1210; X7R a step or two lower; C0G a few nF to about 100 nF.
MAX_VALUE = {
    "X5R": {
        "0201": {6.3: 1e-6, 10: 470e-9, 16: 100e-9, 25: 22e-9},
        "0402": {4: 10e-6, 6.3: 10e-6, 10: 4.7e-6, 16: 1e-6, 25: 470e-9, 50: 100e-9},
        "0603": {4: 22e-6, 6.3: 22e-6, 10: 10e-6, 16: 4.7e-6, 25: 2.2e-6, 50: 470e-9},
        "0805": {4: 47e-6, 6.3: 47e-6, 10: 22e-6, 16: 10e-6, 25: 4.7e-6, 50: 1e-6},
        "1206": {4: 100e-6, 6.3: 100e-6, 10: 47e-6, 16: 22e-6, 25: 10e-6, 50: 2.2e-6},
        "1210": {4: 100e-6, 6.3: 100e-6, 10: 100e-6, 16: 47e-6, 25: 22e-6, 50: 4.7e-6},
    },
    "X7R": {
        "0201": {6.3: 220e-9, 10: 100e-9, 16: 47e-9, 25: 10e-9, 50: 2.2e-9},
        "0402": {6.3: 2.2e-6, 10: 1e-6, 16: 220e-9, 25: 100e-9, 50: 22e-9},
        "0603": {6.3: 4.7e-6, 10: 2.2e-6, 16: 1e-6, 25: 470e-9, 50: 220e-9},
        "0805": {6.3: 10e-6, 10: 10e-6, 16: 4.7e-6, 25: 2.2e-6, 50: 1e-6},
        "1206": {6.3: 22e-6, 10: 22e-6, 16: 10e-6, 25: 4.7e-6, 50: 2.2e-6},
        "1210": {6.3: 47e-6, 10: 22e-6, 16: 22e-6, 25: 10e-6, 50: 4.7e-6},
    },
    "C0G": {
        "0201": {25: 1e-9, 50: 470e-12},
        "0402": {25: 10e-9, 50: 4.7e-9},
        "0603": {25: 22e-9, 50: 10e-9},
        "0805": {25: 47e-9, 50: 22e-9},
        "1206": {25: 100e-9, 50: 47e-9},
        "1210": {25: 100e-9, 50: 100e-9},
    },
}
MIN_VALUE = {
    "X5R": {"0201": 10e-9, "0402": 100e-9, "0603": 470e-9, "0805": 1e-6, "1206": 2.2e-6, "1210": 4.7e-6},
    "X7R": {"0201": 1e-9, "0402": 1e-9, "0603": 1e-9, "0805": 10e-9, "1206": 10e-9, "1210": 100e-9},
    "C0G": {"0201": 100e-12, "0402": 100e-12, "0603": 100e-12, "0805": 1e-9, "1206": 1e-9, "1210": 10e-9},
}

# Typical MLCC ESR near the SRF by value (REFERENCES §8, from memory): geometric mid of each
# range, interpolated log-log between them and extended along the end slopes.
ESR_RANGES = [(10e-9, 0.050, 0.150), (100e-9, 0.015, 0.050), (1e-6, 0.005, 0.020),
              (10e-6, 0.002, 0.010), (100e-6, 0.001, 0.005)]
ESR_ANCHORS = [(c, math.sqrt(lo * hi)) for c, lo, hi in ESR_RANGES]


def typical_esr(capacitance):
    xs = [math.log10(c) for c, _ in ESR_ANCHORS]
    ys = [math.log10(r) for _, r in ESR_ANCHORS]
    x = math.log10(capacitance)
    i = 0 if x < xs[1] else len(xs) - 2
    for k in range(len(xs) - 1):
        if xs[k] <= x <= xs[k + 1]:
            i = k
    y = ys[i] + (ys[i + 1] - ys[i]) * (x - xs[i]) / (xs[i + 1] - xs[i])
    return 10.0 ** y


# DC-bias curve C(V)/C0 = 1 / (1 + (V/V_half)^p) (model form REFERENCES §8). Planning rule
# (common practice, from memory, no part data): the loss is set by the field in the
# dielectric, so it scales with the rating, V_half = k * V_rated, and is worst for the
# high-CV parts that fill a case: k = 0.5 * PACKAGE_FACTOR * fullness^-0.2, with fullness =
# C / (largest C the case holds at that rating). A full small case then keeps 50 % at half
# rating and 26 % at rating, inside the REFERENCES §8 band (40-80 % and 20-60 %); larger
# cases and lower fullness lose less. p is held at 1.5 for every part so that curves of
# different parts never cross.
DC_BIAS_EXPONENT = 1.5
PACKAGE_FACTOR = {"0201": 0.9, "0402": 1.0, "0603": 1.1, "0805": 1.2, "1206": 1.35, "1210": 1.5}


def dc_bias(package, dielectric, rated, capacitance):
    fullness = capacitance / MAX_VALUE[dielectric][package][rated]
    k = 0.5 * PACKAGE_FACTOR[package] * fullness ** -0.2
    return {"v_half": eng(k * rated, "V"), "exponent": DC_BIAS_EXPONENT}


def mlcc_tolerance(dielectric, capacitance):
    """C0G 5 % (J); X7R 10 % (K); X5R 10 % below 10 uF, 20 % (M) from 10 uF. Common practice."""
    if dielectric == "C0G":
        return 0.05
    if dielectric == "X5R" and capacitance >= 10e-6 * 0.999:
        return 0.20
    return 0.10


def mlcc_cost(package, dielectric, rated, capacitance):
    """Relative cost, invented: grows with value, package and case fullness (rating)."""
    fullness = capacitance / MAX_VALUE[dielectric][package][rated]
    cost = COST_BASE[package] * (capacitance / 100e-9) ** 0.3 * (0.6 + 0.8 * fullness)
    if dielectric == "C0G":
        cost *= 1.5
    return sig(cost, 3)


def mlcc_parts():
    parts = []
    for package in PACKAGES:
        for dielectric in ("C0G", "X7R", "X5R"):
            ratings = MAX_VALUE[dielectric][package]
            top = max(ratings.values())
            for c in e6(MIN_VALUE[dielectric][package], top):
                # The highest ratings a value comes in (three for class 2, one for C0G): low
                # ratings of small values exist but are rarely chosen (common practice).
                offered = [v for v in sorted(ratings) if c <= ratings[v] * 1.001]
                for rated in offered[-(1 if dielectric == "C0G" else 3):]:
                    part = {
                        "id": f"mlcc-{package}-{dielectric.lower()}-{value_code(c)}-{voltage_code(rated)}",
                        "kind": "capacitor",
                        "description": f"{eng(c, 'F')} {rated:g} V {dielectric} multilayer ceramic, {package}",
                        "package": package,
                        "dielectric": dielectric,
                        "capacitance": eng(c, "F"),
                        "esr": eng(typical_esr(c), "ohm"),
                        "esl": eng(BODY_ESL[package], "H"),
                        "rated_voltage": eng(rated, "V"),
                        "tolerance": mlcc_tolerance(dielectric, c),
                        "area": f"{AREA_MM2[package]:.3g}mm^2",
                        "cost": mlcc_cost(package, dielectric, rated, c),
                    }
                    if dielectric != "C0G":
                        part["dc_bias"] = dc_bias(package, dielectric, rated, c)
                    parts.append(part)
    return parts


# ----------------------------------------------------------------------------- bulk rules

# (value F, rating V, case, ESR ohm, mounted ESL H, courtyard mm^2, relative cost).
# ESR and mounted ESL inside the typical ranges of REFERENCES §8 (from memory):
# polymer aluminium 5-30 mohm / 1.5-4 nH; polymer tantalum 6-100 mohm / 1-3 nH;
# MnO2 tantalum 0.05-2 ohm / 1.5-3 nH; wet aluminium 0.02-2 ohm / 5-20 nH (leaded).
# Cases are generic sizes (chip L x W, or can diameter x height); costs invented.
BULK = {
    "polymer_aluminium": {
        "prefix": "poly-al", "name": "polymer aluminium", "tolerance": 0.20,
        "leak_k": 0.2,  # spec-limit leakage I <= k * C[uF] * V (uA), from memory
        "parts": [
            (100e-6, 6.3, "7.3x4.3 mm chip", 0.015, 2.0e-9, 19.2, 14.0),
            (220e-6, 2.5, "7.3x4.3 mm chip", 0.009, 2.0e-9, 19.2, 15.0),
            (330e-6, 2.5, "7.3x4.3 mm chip", 0.006, 2.0e-9, 19.2, 17.0),
            (470e-6, 2.5, "7.3x4.3 mm chip", 0.006, 2.0e-9, 19.2, 20.0),
            (560e-6, 4.0, "8x9 mm can", 0.008, 3.0e-9, 81.0, 22.0),
            (820e-6, 2.5, "8x9 mm can", 0.007, 3.0e-9, 81.0, 25.0),
            (150e-6, 16.0, "8x9 mm can", 0.025, 3.0e-9, 81.0, 20.0),
        ],
    },
    "polymer_tantalum": {
        "prefix": "poly-ta", "name": "polymer tantalum", "tolerance": 0.20, "leak_k": 0.1,
        "parts": [
            (47e-6, 10.0, "3.5x2.8 mm chip", 0.070, 1.8e-9, 13.4, 10.0),
            (100e-6, 6.3, "3.5x2.8 mm chip", 0.045, 1.8e-9, 13.4, 11.0),
            (220e-6, 6.3, "7.3x4.3 mm chip", 0.025, 2.2e-9, 19.2, 16.0),
            (330e-6, 2.5, "7.3x4.3 mm chip", 0.010, 2.2e-9, 19.2, 17.0),
            (470e-6, 2.5, "7.3x4.3 mm chip", 0.008, 2.2e-9, 19.2, 19.0),
            (150e-6, 16.0, "7.3x4.3 mm chip", 0.040, 2.2e-9, 19.2, 18.0),
        ],
    },
    "mno2_tantalum": {
        "prefix": "mno2-ta", "name": "MnO2 tantalum", "tolerance": 0.10, "leak_k": 0.01,
        "parts": [
            (10e-6, 16.0, "3.2x1.6 mm chip", 1.8, 1.6e-9, 8.4, 4.0),
            (22e-6, 10.0, "3.5x2.8 mm chip", 0.9, 1.8e-9, 13.4, 5.0),
            (47e-6, 16.0, "6.0x3.2 mm chip", 0.5, 2.0e-9, 16.2, 7.0),
            (100e-6, 10.0, "7.3x4.3 mm chip", 0.2, 2.3e-9, 19.2, 9.0),
            (220e-6, 6.3, "7.3x4.3 mm chip", 0.12, 2.3e-9, 19.2, 11.0),
            (330e-6, 10.0, "7.3x4.3 mm chip", 0.07, 2.3e-9, 19.2, 14.0),
        ],
    },
    "wet_aluminium": {
        "prefix": "wet-al", "name": "wet aluminium electrolytic", "tolerance": 0.20, "leak_k": 0.01,
        "parts": [
            (47e-6, 50.0, "6.3x11 mm radial", 0.8, 8.0e-9, 46.2, 3.0),
            (100e-6, 25.0, "6.3x11 mm radial", 0.45, 8.0e-9, 46.2, 3.0),
            (470e-6, 16.0, "8x11.5 mm radial", 0.15, 10.0e-9, 72.3, 4.0),
            (1000e-6, 16.0, "10x16 mm radial", 0.08, 12.0e-9, 110.0, 6.0),
            (2200e-6, 10.0, "10x20 mm radial", 0.045, 14.0e-9, 110.0, 8.0),
            (4700e-6, 6.3, "12.5x20 mm radial", 0.03, 15.0e-9, 169.0, 11.0),
        ],
    },
}


def bulk_parts():
    parts = []
    for dielectric, family in BULK.items():
        for c, rated, case, esr, esl, area, cost in family["parts"]:
            # Spec-limit leakage as a resistance: R = V / (k C V) = 1 / (k C) with C in uF and
            # I in uA (from memory; wet aluminium and MnO2 limits also have a few-uA floor).
            leak_current = max(family["leak_k"] * c * 1e6 * rated * 1e-6, 3e-6 if family["leak_k"] <= 0.01 else 0.0)
            parts.append({
                "id": f"{family['prefix']}-{value_code(c)}-{voltage_code(rated)}",
                "kind": "capacitor",
                "description": f"{eng(c, 'F')} {rated:g} V {family['name']}, {case}",
                "package": case,
                "dielectric": dielectric,
                "capacitance": eng(c, "F"),
                "esr": eng(esr, "ohm"),
                "esl": eng(esl, "H"),
                "esl_includes_mounting": True,
                "leakage_resistance": eng(rated / leak_current, "ohm"),
                "rated_voltage": eng(rated, "V"),
                "tolerance": family["tolerance"],
                "area": f"{area:.3g}mm^2",
                "cost": cost,
            })
    return parts


# ----------------------------------------------------------------------------- beads and inductors

def bead_inductance(z100, r_core, f_peak):
    """L (H) such that |1/(1/(jwL) + 1/R + jwC)| = z100 at 100 MHz with C from f_peak.

    Below the peak the parallel L-C is inductive: B = (1/(wL)) (1 - (f/f_p)^2), and
    |Z| = 1/sqrt(G^2 + B^2) (REFERENCES §11 bead model without R_dc)."""
    w = 2 * math.pi * 100e6
    g = 1.0 / r_core
    b = math.sqrt((1.0 / z100) ** 2 - g ** 2)
    return (1.0 - (100e6 / f_peak) ** 2) / (w * b)


def bead_impedance(l, r_dc, r_core, c_p, f):
    w = 2 * math.pi * f
    return abs(r_dc + 1.0 / (1.0 / (1j * w * l) + 1.0 / r_core + 1j * w * c_p))


# (package, |Z| at 100 MHz ohm, rated current A, R_dc ohm, core-loss R ohm, peak frequency
# Hz, area mm^2, cost). Typical, from memory: 0402-0805 beads span tens of ohms at several
# amperes to about 1 kohm at a few hundred mA; the peak lies between 100 and 500 MHz; R_dc
# grows with |Z| and falls with size. The core-loss R sits 25-40 % above the 100 MHz value.
BEADS = [
    ("0402", 120.0, 2.0, 0.040, 160.0, 300e6, 1.90, 1.5),
    ("0402", 600.0, 0.5, 0.40, 780.0, 170e6, 1.90, 1.5),
    ("0603", 60.0, 4.0, 0.012, 80.0, 400e6, 4.20, 2.0),
    ("0603", 220.0, 2.0, 0.050, 290.0, 220e6, 4.20, 2.0),
    ("0603", 600.0, 1.0, 0.15, 780.0, 180e6, 4.20, 2.0),
    ("0805", 1000.0, 1.0, 0.20, 1300.0, 150e6, 6.12, 2.5),
]

# Wound power inductors: (L H, rated A, R_dc ohm, winding C F, core-loss R ohm, case,
# area mm^2, cost). Typical, from memory: SRF of tens of MHz, R_dc tens to hundreds of mohm.
INDUCTORS = [
    (1.0e-6, 3.0, 0.030, 3.0e-12, 2000.0, "4x4 mm", 21.2, 8.0),
    (2.2e-6, 2.0, 0.060, 3.0e-12, 3000.0, "4x4 mm", 21.2, 8.0),
    (10e-6, 1.0, 0.20, 4.0e-12, 6000.0, "5x5 mm", 31.4, 10.0),
]


def ohm_code(z):
    return f"{int(z // 1000)}k" if z >= 1000 and z % 1000 == 0 else f"{int(z)}r"


def bead_parts():
    parts = []
    for package, z100, amps, r_dc, r_core, f_peak, area, cost in BEADS:
        l = sig(bead_inductance(z100, r_core, f_peak), 3)
        c_p = sig(1.0 / ((2 * math.pi * f_peak) ** 2 * l), 3)
        # Rounding to three figures must leave |Z(100 MHz)| at the stated value.
        if abs(bead_impedance(l, r_dc, r_core, c_p, 100e6) / z100 - 1.0) > 0.05:
            raise SystemExit(f"bead {package} {z100} ohm: rounded model misses its 100 MHz value")
        parts.append({
            "id": f"bead-{package}-{ohm_code(z100)}-{current_code(amps)}",
            "kind": "bead",
            "description": f"ferrite bead {z100:g} ohm at 100 MHz, {amps:g} A, {package}",
            "package": package,
            "inductance": eng(l, "H"),
            "dc_resistance": eng(r_dc, "ohm"),
            "core_loss_resistance": eng(r_core, "ohm"),
            "parallel_capacitance": eng(c_p, "F"),
            "impedance_100mhz": eng(z100, "ohm"),
            "rated_current": eng(amps, "A"),
            "tolerance": 0.25,
            "area": f"{area:.3g}mm^2",
            "cost": cost,
        })
    for l, amps, r_dc, c_w, r_core, case, area, cost in INDUCTORS:
        parts.append({
            "id": f"ind-{value_code(l)}-{current_code(amps)}",
            "kind": "inductor",
            "description": f"{eng(l, 'H')} wound power inductor, {amps:g} A, {case}",
            "package": case,
            "inductance": eng(l, "H"),
            "dc_resistance": eng(r_dc, "ohm"),
            "core_loss_resistance": eng(r_core, "ohm"),
            "parallel_capacitance": eng(c_w, "F"),
            "rated_current": eng(amps, "A"),
            "tolerance": 0.20,
            "area": f"{area:.3g}mm^2",
            "cost": cost,
        })
    return parts


# ----------------------------------------------------------------------------- files

COMMON_CAVEATS = [
    "Generic planning values for no particular part: confirm against the data of the parts you buy.",
    "Costs are invented relative numbers for ranking only.",
]

HEADERS = {
    "mlcc": {
        "family": "mlcc",
        "description": "Multilayer ceramic capacitors, 0201 to 1210, C0G / X7R / X5R, E6 values.",
        "values": "typical, from common practice",
        "sources": [
            "Temperature codes: EIA-198 (aligned with IEC 60384-21/-22); decoded by the tool, not stored.",
            "Body ESL by package: typical table, mid values (0402 0.3-0.5, 0603 0.4-0.8, 0805 0.5-1.0, "
            "1206 0.8-1.2 nH), from memory; 0201 and 1210 extrapolated.",
            "ESR near the SRF by value: 10 nF 50-150, 100 nF 15-50, 1 uF 5-20, 10 uF 2-10, 100 uF 1-5 mohm "
            "(from memory); geometric mids interpolated log-log.",
            "DC bias C(V)/C0 = 1/(1 + (V/v_half)^exponent); high-CV small cases keep 40-80 % at half rating "
            "and 20-60 % at rating, larger cases and ratings lose less (from memory, no part data).",
            "Value ranges per case and rating, tolerances (C0G J 5 %, X7R K 10 %, X5R K/M) and courtyard "
            "areas: common practice, from memory.",
        ],
        "caveats": COMMON_CAVEATS + [
            "DC-bias curves are a planning rule (v_half = k x rating, worst for parts that fill their case), "
            "not measured curves; aging is not included.",
        ],
    },
    "bulk": {
        "family": "bulk",
        "description": "Bulk capacitors: polymer aluminium, polymer tantalum, MnO2 tantalum, wet aluminium.",
        "values": "typical, from common practice",
        "sources": [
            "ESR and mounted ESL ranges: aluminium polymer 5-30 mohm / 1.5-4 nH; tantalum polymer "
            "6-100 mohm / 1-3 nH; tantalum MnO2 0.05-2 ohm / 1.5-3 nH; wet aluminium 0.02-2 ohm / "
            "5-20 nH leaded (from memory).",
            "Leakage resistance from spec-limit leakage I = k C V (polymer aluminium k 0.2, polymer "
            "tantalum 0.1, MnO2 tantalum and wet aluminium 0.01 with a 3 uA floor; from memory).",
        ],
        "caveats": COMMON_CAVEATS + [
            "ESL is a typical mounted value (esl_includes_mounting); add no default mounting.",
            "Wet aluminium ESR rises 3-10x at -40 C (not modelled); electrolytic capacitance rolls off "
            "above about 1/(2 pi ESR C).",
        ],
    },
    "beads": {
        "family": "beads",
        "description": "Ferrite beads and wound power inductors for filtered sub-rails.",
        "values": "typical, from common practice",
        "sources": [
            "Model Z = R_dc + (jwL || R_core || 1/(jwC_p)), the usual bead form (Swaminathan & Engin "
            "2007, from memory); L and C_p chosen so |Z(100 MHz)| equals the stated value.",
            "Impedance, current and R_dc combinations and peak frequencies: common practice, from memory.",
        ],
        "caveats": COMMON_CAVEATS + [
            "Linear at zero DC current: a bead's inductance falls with DC bias (not modelled).",
            "impedance_100mhz is descriptive (what a BOM names); bead impedance tolerance is about 25 %.",
        ],
    },
}


def write(directory, name, parts):
    ids = [p["id"] for p in parts]
    if len(ids) != len(set(ids)):
        raise SystemExit(f"duplicate ids in {name}")
    path = directory / f"{name}.json"
    tmp = path.with_suffix(".json.tmp")
    # Header indented; one part per line, so a diff shows which parts changed.
    head = json.dumps({"format_version": FORMAT_VERSION, "header": HEADERS[name]}, indent=2, ensure_ascii=True)
    lines = [json.dumps(p, ensure_ascii=True) for p in parts]
    with open(tmp, "w", encoding="ascii") as out:
        out.write(head[:-2] + ',\n  "parts": [\n    ' + ",\n    ".join(lines) + "\n  ]\n}\n")
    tmp.replace(path)
    print(f"{path}: {len(parts)} parts")


def main():
    directory = pathlib.Path(sys.argv[1]) if len(sys.argv) > 1 else \
        pathlib.Path(__file__).resolve().parent.parent / "part_libraries"
    directory.mkdir(parents=True, exist_ok=True)
    write(directory, "mlcc", mlcc_parts())
    write(directory, "bulk", bulk_parts())
    write(directory, "beads", bead_parts())


if __name__ == "__main__":
    main()
