// SPDX-License-Identifier: MIT
// Monte Carlo yield (analysis/yield.hpp): per-trial random streams from (seed, index),
// trials split over std::thread in contiguous ranges, |Z| kept per frequency block so the
// percentiles are exact order statistics without holding trials x grid at once.
#include "quietrail/analysis/yield.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <exception>
#include <limits>
#include <mutex>
#include <set>
#include <thread>
#include <variant>

#include "quietrail/error.hpp"
#include "quietrail/io/part_library.hpp"
#include "quietrail/io/project_file.hpp"
#include "quietrail/models/derating.hpp"
#include "quietrail/network/nodal_solver.hpp"
#include "quietrail/network/topology.hpp"
#include "quietrail/units.hpp"

namespace quietrail {

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kTwoPi = 2.0 * 3.14159265358979323846;
// Most |Z| values kept at once (trials x frequencies of one block): 128 MB of doubles.
constexpr std::size_t kMaxStoredMagnitudes = std::size_t{16} << 20;
constexpr unsigned kMaxThreads = 1024;

// SplitMix64 (Steele, Lea & Flood, OOPSLA 2014). A trial's stream starts at the mixed
// value of position trial + 1 of the seed's own SplitMix sequence, so streams of different
// trials are unrelated and depend on nothing but (seed, trial).
class TrialRandom {
 public:
  TrialRandom(std::uint64_t seed, std::size_t trial)
      : state_(mix(seed + (static_cast<std::uint64_t>(trial) + 1) * kGamma)) {}
  std::uint64_t next() {
    state_ += kGamma;
    return mix(state_);
  }
  // Uniform in [0, 1): the top 53 bits.
  double unit() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }
  // Uniform in [-1, 1).
  double symmetric() { return 2.0 * unit() - 1.0; }

 private:
  static constexpr std::uint64_t kGamma = 0x9E3779B97F4A7C15ULL;
  static std::uint64_t mix(std::uint64_t z) {
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
    return z ^ (z >> 31);
  }
  std::uint64_t state_;
};

const Capacitor& branch_capacitor(const YieldProblem& problem, const VariedPart& part) {
  return std::get<Capacitor>(problem.network.branches()[static_cast<std::size_t>(part.branch)].part.element);
}

// The draw for given variates: voltage and part variates in [-1, 1], temperature in [0, 1].
template <class PartVariates>
TrialDraw make_draw(const YieldProblem& problem, const YieldOptions& options, std::size_t trial, double u_voltage,
                    double u_temperature, PartVariates&& part_variates) {
  TrialDraw draw;
  draw.trial = trial;
  draw.dc_voltage = problem.dc_voltage * (1.0 + problem.voltage_tolerance * u_voltage);
  draw.temperature_c =
      problem.temperature_min_c + (problem.temperature_max_c - problem.temperature_min_c) * u_temperature;
  draw.parts.reserve(problem.parts.size());
  for (const VariedPart& part : problem.parts) {
    double u_c = 0.0, u_r = 0.0, u_l = 0.0;
    part_variates(u_c, u_r, u_l);
    const Capacitor& base = branch_capacitor(problem, part);
    const double esr_spread = part.esr_spread.value_or(options.esr_spread);
    const double esl_spread = part.esl_spread.value_or(options.esl_spread);
    double c = part.c_nominal * (1.0 + part.c_tolerance * u_c);
    if (part.dc_bias_factor) c *= part.dc_bias_factor(draw.dc_voltage);
    if (part.temperature_factor) c *= part.temperature_factor(draw.temperature_c);
    draw.parts.push_back(PartDraw{.branch = part.branch,
                                  .capacitance = c,
                                  .esr = base.esr * (1.0 + esr_spread * u_r),
                                  .esl = base.esl * (1.0 + esl_spread * u_l)});
  }
  return draw;
}

// Runs fn(begin, end) over [0, n) in `threads` contiguous ranges; rethrows the first error.
template <class Fn>
void parallel_ranges(std::size_t n, unsigned threads, Fn&& fn) {
  if (threads <= 1 || n < 2) {
    fn(std::size_t{0}, n);
    return;
  }
  const std::size_t used = std::min<std::size_t>(threads, n);
  std::exception_ptr error;
  std::mutex error_mutex;
  std::vector<std::thread> pool;
  pool.reserve(used);
  for (std::size_t t = 0; t < used; ++t) {
    const std::size_t begin = n * t / used;
    const std::size_t end = n * (t + 1) / used;
    pool.emplace_back([&, begin, end] {
      try {
        fn(begin, end);
      } catch (...) {
        const std::lock_guard<std::mutex> lock(error_mutex);
        if (!error) error = std::current_exception();
      }
    });
  }
  for (std::thread& thread : pool) thread.join();
  if (error) std::rethrow_exception(error);
}

// Hyndman & Fan (1996) definition 7 on `values` (reordered in place), n >= 1.
double percentile_of(std::vector<double>& values, double p) {
  const std::size_t n = values.size();
  const double h = static_cast<double>(n - 1) * p;
  const std::size_t k = std::min(static_cast<std::size_t>(std::floor(h)), n - 1);
  std::nth_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(k), values.end());
  const double low = values[k];
  const double frac = h - static_cast<double>(k);
  if (frac == 0.0 || k + 1 >= n) return low;
  const double high = *std::min_element(values.begin() + static_cast<std::ptrdiff_t>(k) + 1, values.end());
  if (high == low) return low;  // also keeps inf - inf out
  return low + frac * (high - low);
}

// Per-copy admittance count / (Z_capacitor + j omega L_mount).
Complex copies_admittance(const Capacitor& capacitor, double mounting, int count, double frequency) {
  const Complex z = capacitor.impedance(frequency) + Complex(0.0, kTwoPi * frequency * mounting);
  const double d = z.real() * z.real() + z.imag() * z.imag();
  return Complex(static_cast<double>(count) * z.real() / d, -static_cast<double>(count) * z.imag() / d);
}

bool joins_port_to_ground(const NetworkBranch& branch, NodeId port) {
  return (branch.from == port && branch.to == Network::kGround) ||
         (branch.to == port && branch.from == Network::kGround);
}

// What every trial shares: the grid, the target, the fixed admittance at the port.
struct Evaluator {
  const YieldProblem& problem;
  YieldEvaluation mode = YieldEvaluation::parallel_sum;
  std::vector<double> frequencies;
  std::vector<double> target;
  std::vector<Complex> rest;  // admittance of everything not varied, at the port (sum modes)

  // |Z| at grid points [j0, j1) into out[(j - j0) * stride], worst |Z|/Z_t returned.
  double evaluate(const TrialDraw& draw, std::size_t j0, std::size_t j1, double* out, std::size_t stride) const {
    double worst = 0.0;
    auto record = [&](std::size_t j, double magnitude) {
      if (std::isnan(magnitude)) magnitude = kInf;
      out[(j - j0) * stride] = magnitude;
      const double ratio = magnitude / target[j];
      worst = std::isfinite(ratio) ? std::max(worst, ratio) : kInf;
    };
    if (mode == YieldEvaluation::nodal) {
      const FrequencyGrid block(std::vector<double>(frequencies.begin() + static_cast<std::ptrdiff_t>(j0),
                                                    frequencies.begin() + static_cast<std::ptrdiff_t>(j1)));
      const ComplexVector z = NodalSolver(trial_network(problem, draw), block).solve(problem.port).impedance;
      for (std::size_t j = j0; j < j1; ++j) record(j, std::abs(z[static_cast<Eigen::Index>(j - j0)]));
      return worst;
    }
    thread_local std::vector<Capacitor> capacitors;
    capacitors.clear();
    for (std::size_t k = 0; k < problem.parts.size(); ++k) {
      Capacitor c = branch_capacitor(problem, problem.parts[k]);
      c.capacitance = draw.parts[k].capacitance;
      c.esr = draw.parts[k].esr;
      c.esl = draw.parts[k].esl;
      capacitors.push_back(c);
    }
    const auto& branches = problem.network.branches();
    for (std::size_t j = j0; j < j1; ++j) {
      Complex y = rest[j];
      for (std::size_t k = 0; k < capacitors.size(); ++k) {
        const MountedPart& mounted = branches[static_cast<std::size_t>(problem.parts[k].branch)].part;
        y += copies_admittance(capacitors[k], mounted.mounting_inductance, mounted.count, frequencies[j]);
      }
      record(j, 1.0 / std::sqrt(y.real() * y.real() + y.imag() * y.imag()));
    }
    return worst;
  }
};

double grid_worst_ratio(const Evaluator& evaluator, const TrialDraw& draw) {
  std::vector<double> scratch(evaluator.frequencies.size());
  return evaluator.evaluate(draw, 0, scratch.size(), scratch.data(), 1);
}

std::string percent_text(double fraction) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.1f", 100.0 * fraction);
  return buffer;
}

}  // namespace

void YieldProblem::validate() const {
  require_input(target.has_value(), {{}, "target"}, "a target impedance", "none");
  band.validate();
  require_input(std::isfinite(dc_voltage), {{}, "dc_voltage"}, "a finite DC voltage in V",
                format_value(dc_voltage, "V"));
  require_input(std::isfinite(voltage_tolerance) && voltage_tolerance >= 0.0 && voltage_tolerance <= 1.0,
                {{}, "voltage_tolerance"}, "a fraction in [0, 1]", format_value(voltage_tolerance, ""));
  require_input(std::isfinite(temperature_min_c), {{}, "temperature_min_c"}, "a finite temperature in C",
                format_value(temperature_min_c, ""));
  require_input(std::isfinite(temperature_max_c) && temperature_max_c >= temperature_min_c,
                {{}, "temperature_max_c"},
                "a finite temperature in C, not below temperature_min_c (" + format_value(temperature_min_c, "") +
                    " C)",
                format_value(temperature_max_c, ""));
  std::set<BranchId> seen;
  auto fraction_ok = [](double v) { return std::isfinite(v) && v >= 0.0 && v < 1.0; };
  for (std::size_t i = 0; i < parts.size(); ++i) {
    const VariedPart& part = parts[i];
    const std::string field = "parts/" + std::to_string(i);
    const bool known = part.branch >= 0 && static_cast<std::size_t>(part.branch) < network.branch_count();
    require_input(known, {{}, field + "/branch"}, "a branch of the network", std::to_string(part.branch));
    require_input(std::holds_alternative<Capacitor>(network.branches()[static_cast<std::size_t>(part.branch)].part.element),
                  {{}, field + "/branch"}, "a capacitor branch",
                  network.branches()[static_cast<std::size_t>(part.branch)].name);
    require_input(seen.insert(part.branch).second, {{}, field + "/branch"}, "each branch varied at most once",
                  network.branches()[static_cast<std::size_t>(part.branch)].name + " again");
    require_input(std::isfinite(part.c_nominal) && part.c_nominal > 0.0, {{}, field + "/c_nominal"},
                  "a capacitance > 0 F", format_value(part.c_nominal, "F"));
    require_input(fraction_ok(part.c_tolerance), {{}, field + "/c_tolerance"}, "a fraction in [0, 1)",
                  format_value(part.c_tolerance, ""));
    if (part.esr_spread)
      require_input(fraction_ok(*part.esr_spread), {{}, field + "/esr_spread"}, "a fraction in [0, 1)",
                    format_value(*part.esr_spread, ""));
    if (part.esl_spread)
      require_input(fraction_ok(*part.esl_spread), {{}, field + "/esl_spread"}, "a fraction in [0, 1)",
                    format_value(*part.esl_spread, ""));
  }
}

void YieldOptions::validate() const {
  require_input(trials >= 1 && trials <= kMaxYieldTrials, {{}, "trials"},
                "a trial count from 1 to " + std::to_string(kMaxYieldTrials) + " (the cap)", std::to_string(trials));
  require_input(threads <= kMaxThreads, {{}, "threads"},
                "0 (all cores) to " + std::to_string(kMaxThreads) + " threads", std::to_string(threads));
  auto fraction_ok = [](double v) { return std::isfinite(v) && v >= 0.0 && v < 1.0; };
  require_input(fraction_ok(esr_spread), {{}, "esr_spread"}, "a fraction in [0, 1)", format_value(esr_spread, ""));
  require_input(fraction_ok(esl_spread), {{}, "esl_spread"}, "a fraction in [0, 1)", format_value(esl_spread, ""));
  for (std::size_t i = 0; i < percentiles.size(); ++i)
    require_input(std::isfinite(percentiles[i]) && percentiles[i] >= 0.0 && percentiles[i] <= 1.0,
                  {{}, "percentiles/" + std::to_string(i)}, "a fraction in [0, 1] (0.05 for 5 %)",
                  format_value(percentiles[i], ""));
  require_input(std::isfinite(confidence) && confidence > 0.0 && confidence < 1.0, {{}, "confidence"},
                "a level in (0, 1), e.g. 0.95", format_value(confidence, ""));
}

std::string to_string(YieldEvaluation evaluation) {
  switch (evaluation) {
    case YieldEvaluation::parallel_sum: return "parallel_sum";
    case YieldEvaluation::port_reduction: return "port_reduction";
    case YieldEvaluation::nodal: return "nodal";
  }
  return "unknown";
}

ProportionInterval wilson_interval(std::size_t successes, std::size_t n, double z) {
  QUIETRAIL_ASSERT(n >= 1 && successes <= n && std::isfinite(z) && z >= 0.0);
  const double nn = static_cast<double>(n);
  const double p = static_cast<double>(successes) / nn;
  const double z2 = z * z;
  const double denominator = 1.0 + z2 / nn;
  const double centre = (p + z2 / (2.0 * nn)) / denominator;
  const double half = z * std::sqrt(p * (1.0 - p) / nn + z2 / (4.0 * nn * nn)) / denominator;
  // Clamp the rounding at 0 and n successes, where the exact bound is 0 or 1.
  return {std::max(0.0, centre - half), std::min(1.0, centre + half)};
}

double two_sided_normal_quantile(double confidence) {
  QUIETRAIL_ASSERT(confidence > 0.0 && confidence < 1.0);
  // erf(z / sqrt 2) rises monotonically from 0; Newton from z = 1 with a bisection bracket.
  double low = 0.0, high = 40.0, z = 1.0;
  for (int i = 0; i < 200; ++i) {
    const double f = std::erf(z / std::sqrt(2.0)) - confidence;
    if (f > 0.0) high = z; else low = z;
    const double slope = std::sqrt(2.0 / 3.14159265358979323846) * std::exp(-0.5 * z * z);
    double next = slope > 0.0 ? z - f / slope : 0.5 * (low + high);
    if (!(next > low && next < high)) next = 0.5 * (low + high);
    if (std::abs(next - z) <= 1e-15 * z) return next;
    z = next;
  }
  return z;
}

TrialDraw draw_trial(const YieldProblem& problem, const YieldOptions& options, std::size_t trial) {
  TrialRandom random(options.seed, trial);
  // Fixed order: voltage, temperature, then C, ESR, ESL per part. Every variate is drawn
  // even when its spread is 0, so changing one spread leaves the others' draws alone.
  const double u_voltage = random.symmetric();
  const double u_temperature = random.unit();
  return make_draw(problem, options, trial, u_voltage, u_temperature, [&](double& c, double& r, double& l) {
    c = random.symmetric();
    r = random.symmetric();
    l = random.symmetric();
  });
}

TrialDraw corner_draw(const YieldProblem& problem, const YieldOptions& options, double u) {
  return make_draw(problem, options, options.trials + (u > 0.0 ? 1 : 0), u, u > 0.0 ? 1.0 : 0.0,
                   [u](double& c, double& r, double& l) { c = r = l = u; });
}

Network trial_network(const YieldProblem& problem, const TrialDraw& draw) {
  const Network& source = problem.network;
  Network out(source.node_names().front());
  for (std::size_t i = 1; i < source.node_count(); ++i) out.add_node(source.node_names()[i]);
  std::vector<const PartDraw*> by_branch(source.branch_count(), nullptr);
  for (const PartDraw& part : draw.parts) by_branch[static_cast<std::size_t>(part.branch)] = &part;
  for (std::size_t b = 0; b < source.branch_count(); ++b) {
    const NetworkBranch& branch = source.branches()[b];
    MountedPart part = branch.part;
    if (const PartDraw* d = by_branch[b]) {
      Capacitor& c = std::get<Capacitor>(part.element);
      c.capacitance = d->capacitance;
      c.esr = d->esr;
      c.esl = d->esl;
    }
    out.add_branch(branch.name, branch.from, branch.to, part);
  }
  return out;
}

YieldProblem yield_problem(const Project& project, const PartLibrary& library) {
  YieldProblem problem;
  problem.network = project.network;
  problem.port = project.port;
  problem.target = project.target;
  problem.band = project.band;
  problem.dc_voltage = project.dc_voltage;
  problem.voltage_tolerance = project.rail.ripple;
  problem.temperature_min_c = std::min(25.0, project.rail.temperature_c);
  problem.temperature_max_c = std::max(25.0, project.rail.temperature_c);
  for (const PlacedPart& placed : project.parts) {
    if (!std::holds_alternative<Capacitor>(placed.effective)) continue;
    VariedPart part;
    part.branch = placed.branch;
    part.source = placed.source;
    if (placed.library_id.empty()) {
      // Inline: its derating curves are not kept, so it varies around its effective value.
      part.c_nominal = std::get<Capacitor>(placed.effective).capacitance;
      part.c_tolerance = kInlineCapacitanceTolerance;
    } else {
      const LibraryPart* found = library.find(placed.library_id);
      require_input(found != nullptr && found->kind == PartKind::capacitor, {project.file, placed.source},
                    "a capacitor of the part libraries", placed.library_id);
      part.c_nominal = std::get<Capacitor>(found->nominal).capacitance;
      part.c_tolerance = found->tolerance;
      part.dc_bias_factor = [bias = found->dc_bias](double volts) { return dc_bias_factor(bias, volts); };
      part.temperature_factor = [dielectric = found->dielectric](double celsius) {
        return temperature_factor(dielectric, celsius);
      };
    }
    problem.parts.push_back(std::move(part));
  }
  return problem;
}

YieldProblem yield_problem(const Project& project) {
  std::vector<std::filesystem::path> paths(project.libraries.begin(), project.libraries.end());
  return yield_problem(project, PartLibrary::from_files(paths));
}

std::string YieldResult::brief() const {
  char worst[32];
  std::snprintf(worst, sizeof worst, "%.3g", worst_trial < trial_worst_ratio.size() ? trial_worst_ratio[worst_trial] : 0.0);
  return "yield " + percent_text(yield) + " % (" + std::to_string(passes) + "/" + std::to_string(trials) + "; " +
         percent_text(confidence) + " % CI " + percent_text(interval.low) + "-" + percent_text(interval.high) +
         " %); worst grid |Z|/Z_t " + worst + " at trial " + std::to_string(worst_trial);
}

YieldResult run_yield(const YieldProblem& problem, const YieldOptions& options) {
  options.validate();
  problem.validate();

  YieldResult result;
  result.trials = options.trials;
  result.confidence = options.confidence;
  result.percentiles = options.percentiles;
  const CheckOptions check_options{.grid = problem.band};
  // The nominal check also validates the target's cover of the band and the topology.
  result.nominal = run_check(problem.network, problem.port, *problem.target, check_options);
  result.frequencies = result.nominal.frequencies;
  result.target = result.nominal.target;

  Evaluator evaluator{.problem = problem, .mode = YieldEvaluation::parallel_sum, .frequencies = result.frequencies,
                      .target = {}, .rest = {}};
  const std::size_t nf = result.frequencies.size();
  evaluator.target.assign(result.target.data(), result.target.data() + nf);

  bool varied_at_port = true;
  std::vector<bool> varied(problem.network.branch_count(), false);
  for (const VariedPart& part : problem.parts) {
    varied[static_cast<std::size_t>(part.branch)] = true;
    varied_at_port = varied_at_port &&
                     joins_port_to_ground(problem.network.branches()[static_cast<std::size_t>(part.branch)], problem.port);
  }
  const auto& branches = problem.network.branches();
  if (is_all_parallel(problem.network, problem.port)) {
    evaluator.mode = YieldEvaluation::parallel_sum;
    evaluator.rest.assign(nf, Complex(0.0, 0.0));
    for (std::size_t b = 0; b < branches.size(); ++b) {
      if (varied[b]) continue;
      for (std::size_t j = 0; j < nf; ++j) evaluator.rest[j] += 1.0 / branches[b].part.impedance(result.frequencies[j]);
    }
  } else if (varied_at_port) {
    // The rest of the network is fixed: its admittance at the port is the nominal port
    // admittance less the nominal varied parts. The subtraction loses at most about
    // eps * max |Y_k| absolute, the same as summing the parts directly would.
    evaluator.mode = YieldEvaluation::port_reduction;
    evaluator.rest.resize(nf);
    for (std::size_t j = 0; j < nf; ++j) {
      Complex y = 1.0 / result.nominal.impedance[static_cast<Eigen::Index>(j)];
      for (const VariedPart& part : problem.parts) {
        const MountedPart& mounted = branches[static_cast<std::size_t>(part.branch)].part;
        y -= copies_admittance(std::get<Capacitor>(mounted.element), mounted.mounting_inductance, mounted.count,
                               result.frequencies[j]);
      }
      evaluator.rest[j] = y;
    }
  } else {
    evaluator.mode = YieldEvaluation::nodal;
  }
  result.evaluation = evaluator.mode;

  const unsigned hardware = std::max(1u, std::thread::hardware_concurrency());
  const unsigned threads = options.threads == 0 ? hardware : options.threads;
  const std::size_t n = options.trials;
  result.threads_used = static_cast<unsigned>(std::min<std::size_t>(threads, n));

  // Frequency blocks small enough that trials x block magnitudes fit kMaxStoredMagnitudes.
  const std::size_t block = std::max<std::size_t>(1, std::min(nf, kMaxStoredMagnitudes / n));
  result.trial_worst_ratio.assign(n, 0.0);
  result.percentile_magnitude.assign(options.percentiles.size(), RealVector::Zero(static_cast<Eigen::Index>(nf)));
  std::vector<double> magnitudes;
  for (std::size_t j0 = 0; j0 < nf; j0 += block) {
    const std::size_t j1 = std::min(nf, j0 + block);
    const std::size_t width = j1 - j0;
    magnitudes.assign(n * width, 0.0);  // column-major: magnitudes[(j - j0) * n + trial]
    parallel_ranges(n, threads, [&](std::size_t begin, std::size_t end) {
      for (std::size_t trial = begin; trial < end; ++trial) {
        const TrialDraw draw = draw_trial(problem, options, trial);
        const double worst = evaluator.evaluate(draw, j0, j1, magnitudes.data() + trial, n);
        result.trial_worst_ratio[trial] = std::max(result.trial_worst_ratio[trial], worst);
      }
    });
    parallel_ranges(width, threads, [&](std::size_t begin, std::size_t end) {
      std::vector<double> column;
      for (std::size_t j = begin; j < end; ++j) {
        // nth_element only reorders the column, so one copy serves every percentile.
        column.assign(magnitudes.begin() + static_cast<std::ptrdiff_t>(j * n),
                      magnitudes.begin() + static_cast<std::ptrdiff_t>((j + 1) * n));
        for (std::size_t q = 0; q < options.percentiles.size(); ++q) {
          result.percentile_magnitude[q][static_cast<Eigen::Index>(j0 + j)] =
              percentile_of(column, options.percentiles[q]);
        }
      }
    });
  }

  for (std::size_t trial = 0; trial < n; ++trial) {
    if (result.trial_worst_ratio[trial] <= 1.0) ++result.passes;
    if (result.trial_worst_ratio[trial] > result.trial_worst_ratio[result.worst_trial]) result.worst_trial = trial;
  }
  result.yield = static_cast<double>(result.passes) / static_cast<double>(n);
  result.interval = wilson_interval(result.passes, n, two_sided_normal_quantile(options.confidence));
  result.worst_draw = draw_trial(problem, options, result.worst_trial);

  result.low_corner = YieldCorner{.name = "low", .draw = corner_draw(problem, options, -1.0)};
  result.high_corner = YieldCorner{.name = "high", .draw = corner_draw(problem, options, 1.0)};
  for (YieldCorner* corner : {&result.low_corner, &result.high_corner})
    corner->grid_worst_ratio = grid_worst_ratio(evaluator, corner->draw);
  if (options.refine_worst) {
    result.worst_check = run_check(trial_network(problem, result.worst_draw), problem.port, *problem.target,
                                   check_options);
    for (YieldCorner* corner : {&result.low_corner, &result.high_corner})
      corner->check = run_check(trial_network(problem, corner->draw), problem.port, *problem.target, check_options);
  }
  return result;
}

}  // namespace quietrail
