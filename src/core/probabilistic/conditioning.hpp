#pragma once
// Conditioning the probabilistic screen on observed pore pressures: importance weights of the
// prior realizations (docs/conditioning.md).
//
// Sources (one line each):
//   ℓ_i = −½ Σ_obs ((observed − modelled_i)/σ)²          Gaussian log-likelihood, independent errors
//   w_i ∝ exp(ℓ_i), normalised in log space              importance sampling from the prior
//                                                        (Smith & Gelfand 1992, Am. Stat. 46:84)
//   n_eff = (Σ w)² / Σ w²                                Kish (1965), Survey Sampling, Wiley
//   interval of a weighted proportion: Wilson (1927) with n = n_eff (an approximation)
//
// Symbols (code -> literature): log_likelihood ℓ_i, units the weight w_i in fixed point
// (w_i = units_i / total), sigma σ = √(sd² + model_error²) [Pa], modelled Δp_i at the
// observation point and date [Pa], n_eff the effective sample size.
//
// Fixed point: normalised weights are held as integers summing to about kWeightUnits = 2^52
// (each weight rounded to the nearest 2^-52 of the total), so every weighted count is an
// integer sum, exact in any order: realization blocks merged across threads and processes give
// the single-process result bit for bit (docs/cluster.md), and all such sums stay below 2^53,
// exact in double. A weight below 2^-53 of the total rounds to 0 (its realization then counts
// in n but carries no weight); the total differs from 2^52 by at most half a unit per
// realization, i.e. relative 1.1e-8 for 1e8 realizations.
//
// The modelled Δp at an observation comes from the same pressure model as the fault segments
// (pressure_model.hpp: Theis superposition with images, the realization's D, μ/(4π k h) and rate
// factors, the same Chebyshev surrogate in D) at the observation's date, so its accuracy is the
// surrogate's (PressureSurrogate::max_relative_error()).
#include <Eigen/Dense>
#include <cstdint>
#include <span>
#include <vector>

#include "core/probabilistic/pressure_model.hpp"
#include "core/probabilistic/screen_inputs.hpp"
#include "core/stats/wilson_interval.hpp"

namespace slipscreen::probabilistic {

inline constexpr std::uint64_t kWeightUnits = std::uint64_t{1} << 52;

struct ImportanceWeights {
  std::vector<double> log_likelihood;  // per valid realization (column)
  std::vector<std::uint64_t> units;    // per column: the normalised weight in fixed point
  std::uint64_t total = 0;             // Σ units
  double n_eff = 0.0;                  // Kish (1965), from the fixed-point weights
  double max_log_likelihood = 0.0;
  double weight(std::size_t column) const { return static_cast<double>(units[column]) / static_cast<double>(total); }
};

// w_i = exp(ℓ_i − max ℓ) / Σ_j exp(ℓ_j − max ℓ) in fixed point. Every ℓ_i must be finite or −∞,
// and at least one finite (NumericalError otherwise). Sequential: the same result for any thread
// count.
ImportanceWeights importance_weights(std::span<const double> log_likelihood);

// Σ_obs −½ ((observed − modelled)/σ)² for one realization (constants dropped: they cancel in
// the normalisation). σ > 0.
double gaussian_log_likelihood(std::span<const double> observed, std::span<const double> modelled,
                               std::span<const double> sigma);

// Δp at every observation (rows) for every valid realization (columns) of the pressure model
// `pm` built for `wells` and `settings` (the same sources, groups, D range and Chebyshev nodes):
// similarity tables at the observations' dates, a surrogate at their points, then
// Σ_g Σ_d G_{o,g}(t_o, D_d) ℓ_d(D_c) P_c f_{g,c}. Observation times must be finite.
Eigen::MatrixXd observation_pressures(const PressureModel& pm, const std::vector<WellInput>& wells,
                                      const RunSettings& settings, const std::vector<PressureObservation>& observations);

// P5, P50 and P95 (the percentile rule of stats::weighted_percentile).
struct Percentiles {
  double p05 = 0.0, p50 = 0.0, p95 = 0.0;
};
Percentiles percentiles(std::span<const double> x, std::span<const std::uint64_t> units);
// Unweighted (every weight 1): the values of rank ⌊q(n − 1)⌋, as the quantile sketches.
Percentiles percentiles(std::span<const double> x);

// What conditioning adds to a run (ProbabilisticResult::conditioning).
struct Conditioning {
  ImportanceWeights weights;
  // ℓ_i = pressure part + seismicity part (either may be absent: then 0), per valid realization.
  std::vector<double> pressure_log_likelihood;
  std::vector<double> seismicity_log_likelihood;  // empty without RunSettings::seismicity
  std::uint64_t seismicity_beyond_domain = 0;     // realizations whose rate left the model's domain
  Eigen::MatrixXd modelled;                    // observations × valid realizations: Δp [Pa]
  std::vector<Percentiles> fit_prior, fit_posterior;      // per observation: modelled Δp
  std::vector<Percentiles> input_prior, input_posterior;  // per sampled input (sampler order)
  std::vector<char> input_uncertain;                      // per sampled input: not a fixed value
};

// Weights, observation fit and the prior and posterior percentiles of every sampled input.
// `inputs`: sampled inputs × valid realizations (SampledRealizations::inputs) in `list`'s order.
// `seismicity`: the seismicity log-likelihood of every valid realization (seismicity_likelihood.hpp),
// added to the pressures' (empty: pressures only; no pressure observations: seismicity only).
Conditioning condition_on_pressures(const PressureModel& pm, const std::vector<WellInput>& wells,
                                    const RunSettings& settings, const InputList& list, const Eigen::MatrixXd& inputs,
                                    std::span<const double> seismicity = {});

// A weighted proportion Σ_{slipped} w / Σ w from fixed-point sums, with the Wilson (1927) score
// interval taking n = n_eff trials (an approximation: exact only for equal weights, where it is
// the unweighted interval).
stats::ProportionInterval weighted_proportion(std::uint64_t units, const ImportanceWeights& w, double z);

}  // namespace slipscreen::probabilistic
