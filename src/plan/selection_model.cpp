// SPDX-License-Identifier: MIT
#include <algorithm>
#include <cmath>
#include <limits>
#include <utility>

#include "quietrail/error.hpp"
#include "quietrail/frequency_grid.hpp"
#include "quietrail/network/nodal_solver.hpp"
#include "quietrail/plan/search.hpp"

namespace quietrail {
namespace {

// Image of the disc |w - 1| <= rho under 1/w: a disc (rho < 1) or the outside of a disc
// (rho > 1), both centred on the real axis. Returns {centre, radius, outside}.
struct DiscImage {
  double centre;
  double radius;
  bool outside;
};

DiscImage reciprocal_of_unit_disc(double rho) {
  const double d = 1.0 - rho * rho;
  return {1.0 / d, rho / std::abs(d), d < 0.0};
}

}  // namespace

SelectionModel::SelectionModel(const PlanProblem& problem, std::vector<double> frequencies, double target_scale,
                               double guard)
    : frequencies_(std::move(frequencies)), candidates_(problem.candidates.size()) {
  QUIETRAIL_ASSERT(problem.target.has_value());
  QUIETRAIL_ASSERT(target_scale > 0.0 && guard >= 0.0 && guard < 1.0);
  const FrequencyGrid grid(frequencies_);  // validates: positive, increasing
  const std::size_t n = frequencies_.size();

  // The fixed network's driving-point impedances. For port != board the transfer impedance
  // comes from a third solve with a probe resistor R at the board node: the port then sees
  // Z_pp - Z_pb^2 / (Z_bb + R), so Z_pb^2 = (Z_pp - Z_probe) * (Z_bb + R). R near the
  // typical |Z_bb| keeps the difference well away from cancellation.
  const ComplexVector zbb = solve_port_impedance(problem.network, problem.board, grid);
  zbb_.assign(zbb.data(), zbb.data() + zbb.size());
  a_.assign(n, Complex(0.0, 0.0));
  b_ = zbb_;
  if (problem.port != problem.board) {
    const ComplexVector zpp = solve_port_impedance(problem.network, problem.port, grid);
    std::vector<double> magnitudes(n);
    for (std::size_t i = 0; i < n; ++i) magnitudes[i] = std::abs(zbb_[i]);
    std::nth_element(magnitudes.begin(), magnitudes.begin() + static_cast<std::ptrdiff_t>(n / 2), magnitudes.end());
    const double probe = std::max(magnitudes[n / 2], 1e-9);
    Network probed = problem.network;
    std::string name = "plan_probe";
    while (probed.find_branch(name)) name += "_";
    probed.add_branch(name, problem.board, Network::kGround, MountedPart{Resistor{.resistance = probe}});
    const ComplexVector zt = solve_port_impedance(probed, problem.port, grid);
    for (std::size_t i = 0; i < n; ++i) {
      const Complex zpb2 = (zpp[static_cast<Eigen::Index>(i)] - zt[static_cast<Eigen::Index>(i)]) * (zbb_[i] + probe);
      b_[i] = zpb2 / zbb_[i];
      a_[i] = zpp[static_cast<Eigen::Index>(i)] - b_[i];
    }
  }

  limit_.resize(n);
  centre_.resize(n);
  radius_.resize(n);
  reachable_.resize(n);
  for (std::size_t i = 0; i < n; ++i) {
    limit_[i] = problem.target->at(frequencies_[i]) * target_scale * (1.0 - guard);
    // |A + B u| <= limit with u = 1/(1 + Z_bb S): u lies in the disc |u - (-A/B)| <= limit/|B|.
    // That disc holds u = 0 (S infinite) iff |A| < limit; 1/u = 1 + Z_bb S then lies outside
    // a disc (centre conj(m)/(|m|^2 - r^2), radius r/(r^2 - |m|^2)), and S outside its image.
    const double r = limit_[i] / std::abs(b_[i]);
    const Complex m = -a_[i] / b_[i];
    const double denominator = std::norm(m) - r * r;
    reachable_[i] = denominator < 0.0;
    if (!reachable_[i]) {
      centre_[i] = Complex(0.0, 0.0);
      radius_[i] = std::numeric_limits<double>::infinity();
      continue;
    }
    const Complex v_centre = std::conj(m) / denominator;
    const double v_radius = r / -denominator;
    centre_[i] = (v_centre - 1.0) / zbb_[i];
    radius_[i] = v_radius / std::abs(zbb_[i]);
  }

  unit_.resize(candidates_ * n);
  for (std::size_t k = 0; k < candidates_; ++k) {
    const MountedPart& part = problem.candidates[k].part;
    for (std::size_t i = 0; i < n; ++i) {
      const double f = frequencies_[i];
      const Complex z = element_impedance(part.element, f) + Complex(0.0, omega(f) * part.mounting_inductance);
      unit_[k * n + i] = 1.0 / z;
    }
  }
}

AdmittanceVector SelectionModel::admittance(const std::vector<int>& counts) const {
  QUIETRAIL_ASSERT(counts.size() == candidates_);
  AdmittanceVector total(frequencies_.size(), Complex(0.0, 0.0));
  for (std::size_t k = 0; k < candidates_; ++k)
    if (counts[k] != 0) add(k, counts[k], total);
  return total;
}

void SelectionModel::add(std::size_t k, int delta, AdmittanceVector& total) const {
  QUIETRAIL_ASSERT(k < candidates_ && total.size() == frequencies_.size());
  const std::size_t n = frequencies_.size();
  const Complex* y = unit_.data() + k * n;
  const double d = static_cast<double>(delta);
  for (std::size_t i = 0; i < n; ++i) total[i] += d * y[i];
}

Complex SelectionModel::port_impedance(std::size_t i, Complex s) const {
  // B / d written out (d = 1 + Z_bb S): std::complex division guards against overflow
  // and infinities at a cost this inner loop cannot afford; d is never near overflow here.
  const Complex d = 1.0 + zbb_[i] * s;
  const double scale = 1.0 / std::norm(d);
  return a_[i] + b_[i] * std::conj(d) * scale;
}

double SelectionModel::ratio(std::size_t i, Complex s) const {
  return std::sqrt(std::norm(port_impedance(i, s))) / limit_[i];  // not hypot: this is the inner loop
}

std::pair<double, std::size_t> SelectionModel::worst(const AdmittanceVector& total) const {
  QUIETRAIL_ASSERT(total.size() == frequencies_.size());
  double worst = -1.0;
  std::size_t at = 0;
  for (std::size_t i = 0; i < total.size(); ++i) {
    const double r = ratio(i, total[i]);
    if (!(r <= worst)) {  // NaN counts as worst
      worst = std::isnan(r) ? std::numeric_limits<double>::infinity() : r;
      at = i;
    }
  }
  return {worst, at};
}

bool SelectionModel::meets(const AdmittanceVector& total) const {
  QUIETRAIL_ASSERT(total.size() == frequencies_.size());
  for (std::size_t i = 0; i < total.size(); ++i)
    if (!(ratio(i, total[i]) <= 1.0)) return false;
  return true;
}

double SelectionModel::floor_ratio(std::size_t i, double reach) const {
  // S in |S| <= reach: w = 1 + Z_bb S in |w - 1| <= rho, rho = |Z_bb| reach; Z = A + B / w.
  double rho = std::abs(zbb_[i]) * reach;
  if (std::abs(rho - 1.0) < 1e-12) rho = 1.0 + 1e-12;  // the image is a half-plane: step past it
  const DiscImage image = reciprocal_of_unit_disc(rho);
  const Complex centre = a_[i] + b_[i] * image.centre;
  const double radius = std::abs(b_[i]) * image.radius;
  const double distance = std::abs(centre);
  const double least = image.outside ? std::max(0.0, radius - distance) : std::max(0.0, distance - radius);
  return least / limit_[i];
}

}  // namespace quietrail
