// SPDX-License-Identifier: MIT
// Which branches form an impedance peak (the inductive and capacitive sides whose
// susceptances cancel there), the resonant loop they form, and what would lower it.
#pragma once

#include <string>
#include <vector>

#include "quietrail/analysis/peaks.hpp"
#include "quietrail/network/network.hpp"
#include "quietrail/types.hpp"

namespace quietrail {

/// BranchId of a contributor that is not one branch: the rest of a network seen from the
/// port through its series branches.
inline constexpr BranchId kRestOfNetwork = -1;

/// One contributor to a side of an anti-resonance.
struct PeakContributor {
  /// The branch (all copies, count included), or kRestOfNetwork.
  BranchId branch = kRestOfNetwork;
  /// Branch name, or "network behind <series branch names>" for kRestOfNetwork.
  std::string name;
  /// Admittance of the contributor at the peak frequency, siemens.
  Complex admittance;
  /// Its share of its side's total |Im Y|, in (0, 1].
  double share = 0.0;
  /// One phrase for reports, e.g. "the inductive tail of bulk_330u (above its SRF of
  /// 1.2 MHz)" or "the capacitive side of mlcc_100n (below its SRF of 22.5 MHz)".
  std::string role;
};

/// Options for attribute_peak.
struct AttributionOptions {
  /// The dominant contributors of a side are the largest by |Im Y| until their cumulative
  /// share reaches this fraction. In (0, 1]. Default 0.8 (common practice: the few parts
  /// carrying most of the susceptance).
  double dominant_share = 0.8;
  /// Relative frequency step of the central difference used for the reactance slope of
  /// each side. In [1e-7, 1e-2]. Default 1e-4: truncation error ~1e-8, rounding ~1e-12
  /// (central difference; any numerical analysis text).
  double derivative_step = 1e-4;

  /// Throws InputError naming "dominant_share" or "derivative_step" under `field`.
  void validate(const std::string& file = {}, const std::string& field = {}) const;
};

/// How a peak was attributed.
enum class AttributionStatus {
  /// Both sides found; every number below is set.
  resonance,
  /// All branches at the port lean one way at the frequency (e.g. a band-edge maximum on
  /// an inductive slope): no cancelling pair. Sides and the sentence are set; loop figures
  /// are NaN.
  one_sided,
};

/// What forms a peak and what would lower it.
///
/// Method: at the peak frequency f_p, each branch directly between the port and ground
/// contributes its admittance Y_k (all copies). For any other network the remainder
/// Y_port - sum Y_k (Y_port = 1/Z_port) is one more contributor, "the network behind" the
/// port's series branches. Contributors with Im Y < 0 form the inductive side, Im Y > 0
/// the capacitive side; a parallel anti-resonance is where the two susceptances cancel.
/// Each side's impedance Z_s = 1 / sum Y is fitted, at f_p, by a series R-L-C with the
/// same reactance X and reactance slope dX/domega (central difference):
///   L_s = (X/omega + dX/domega) / 2,   1/(omega^2 C_s) = (dX/domega - X/omega) / 2,
/// exact for a series RLC branch (X = omega L - 1/(omega C)). When that fit is unphysical
/// (L < 0 or C <= 0: parallel members with comparable resistance and reactance), the side's
/// members' resistances are dropped and the side is read as pure reactances,
/// X = 1 / sum(1 / Im Z_k), which always fits (a lossless reactance rises at least as
/// |X|/omega; Foster's reactance theorem, 1924). The two sides form one series
/// loop: L_loop = L_ind + L_cap, C_loop = series(C_ind, C_cap), R_loop = Re Z_ind + Re Z_cap,
/// f_loop = 1/(2 pi sqrt(L_loop C_loop)), Z0 = sqrt(L_loop/C_loop), Q_loop = Z0 / R_loop.
/// For two series-RLC branches this is exactly L1 + L2 and C1 C2/(C1 + C2) of REFERENCES
/// section 3 (anti-resonance of two parallel branches, derived from circuit theory).
/// Damping: a series R-L-C loop is critically damped at R_loop = 2 Z0; with Z0 in each side
/// the port impedance is flat at Z0 (constant-resistance network, REFERENCES section 10).
struct PeakAttribution {
  /// The peak frequency the attribution was made at, Hz.
  double frequency = 0.0;
  /// Whether a cancelling pair was found (which fields below are set).
  AttributionStatus status = AttributionStatus::one_sided;
  /// False when the network is not all-parallel at the port (a "network behind"
  /// contributor may appear).
  bool all_parallel = true;
  /// Dominant contributors of the inductive side (Im Y < 0), largest |Im Y| first.
  std::vector<PeakContributor> inductive;
  /// Dominant contributors of the capacitive side (Im Y > 0), largest |Im Y| first.
  std::vector<PeakContributor> capacitive;
  /// Total |Im Y| of the inductive side (all members, not only the dominant), siemens.
  double inductive_susceptance = 0.0;
  /// Total Im Y of the capacitive side, siemens.
  double capacitive_susceptance = 0.0;
  /// Series-LC fit of the inductive side: inductance L_ind, H.
  double inductive_side_inductance = 0.0;
  /// Series-LC fit of the inductive side: capacitance C_ind, F (infinity for none).
  double inductive_side_capacitance = 0.0;
  /// Series-LC fit of the capacitive side: inductance L_cap, H.
  double capacitive_side_inductance = 0.0;
  /// Series-LC fit of the capacitive side: capacitance C_cap, F.
  double capacitive_side_capacitance = 0.0;
  /// L_loop = L_ind + L_cap, H.
  double loop_inductance = 0.0;
  /// C_loop = C_ind C_cap / (C_ind + C_cap), F.
  double loop_capacitance = 0.0;
  /// R_loop = Re Z_ind + Re Z_cap at f_p, ohm.
  double loop_resistance = 0.0;
  /// Z0 = sqrt(L_loop / C_loop), ohm.
  double characteristic_impedance = 0.0;
  /// f_loop = 1 / (2 pi sqrt(L_loop C_loop)), Hz.
  double loop_frequency = 0.0;
  /// Q_loop = Z0 / R_loop.
  double loop_q = 0.0;
  /// Total loop resistance for critical damping, 2 Z0, ohm.
  double damping_resistance = 0.0;
  /// True when the fit is physical: both sides' inductances >= 0 and capacitances > 0 (all
  /// finite except a side without capacitance), after the lossless fallback. A side of lossy
  /// parts (leakage near its corner) may still break the series-LC picture near f_p; the
  /// loop figures are then reported but not used in the remedy.
  bool loop_fit_valid = false;
  /// Capacitance whose SRF with the mounted inductance (ESL + mounting, one copy) of the
  /// dominant capacitive contributor falls at f_p: C = 1 / ((2 pi f_p)^2 L), F (series RLC
  /// SRF, REFERENCES section 2). NaN when that contributor is not a capacitor.
  double srf_fill_capacitance = 0.0;
  /// What forms the peak, one sentence, e.g. "the inductive tail of bulk_330u (above its
  /// SRF of 1.2 MHz) against the capacitive side of mlcc_100n (below its SRF of 22.5 MHz)".
  std::string explanation;
  /// One line of what would lower it, with numbers.
  std::string remedy;
};

/// Attributes the peak at `frequency` (Hz, > 0) of the impedance seen at `port`.
/// `port_impedance` is the exact port impedance (used only when the network is not
/// all-parallel at the port). Throws InputError for invalid options or a port that is not
/// a node other than ground.
PeakAttribution attribute_peak(const Network& network, NodeId port, double frequency,
                               const ImpedanceFunction& port_impedance, const AttributionOptions& options = {});

/// As above at peak.frequency. For a maximum on a band edge (peak.at_band_edge) the
/// sentence says so and gives the loop's own resonance, and the remedy leaves out the
/// capacitance that would resonate at the edge frequency.
PeakAttribution attribute_peak(const Network& network, NodeId port, const Peak& peak,
                               const ImpedanceFunction& port_impedance, const AttributionOptions& options = {});

}  // namespace quietrail
