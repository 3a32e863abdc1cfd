// Conditioning on observed pore pressures; see conditioning.hpp for the method and sources.
#include "core/probabilistic/conditioning.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "core/errors.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/stats/weighted_sketch.hpp"

namespace slipscreen::probabilistic {
namespace {

__extension__ typedef unsigned __int128 Wide;

// (Σu)² / Σu² from integers: the quotient and remainder of exact 128-bit integers, so that equal
// weights give n exactly.
double kish_n_eff(const std::vector<std::uint64_t>& units, std::uint64_t total) {
  Wide squares = 0;
  for (auto u : units) squares += static_cast<Wide>(u) * u;
  if (squares == 0) return 0.0;
  const Wide num = static_cast<Wide>(total) * total;
  return static_cast<double>(static_cast<std::uint64_t>(num / squares)) +
         static_cast<double>(num % squares) / static_cast<double>(squares);
}

}  // namespace

ImportanceWeights importance_weights(std::span<const double> log_likelihood) {
  ImportanceWeights w;
  w.log_likelihood.assign(log_likelihood.begin(), log_likelihood.end());
  double top = -std::numeric_limits<double>::infinity();
  for (double l : log_likelihood) {
    if (std::isnan(l) || l == std::numeric_limits<double>::infinity())
      throw NumericalError("log-likelihood of a realization is " + std::to_string(l) + ": expected a finite number");
    top = std::max(top, l);
  }
  if (!std::isfinite(top))
    throw NumericalError("no realization has a finite log-likelihood: the observations cannot weight the sample");
  w.max_log_likelihood = top;
  // Log-sum-exp: exp(ℓ_i − max) ≤ 1, the largest exactly 1, so the sum is in [1, n].
  std::vector<double> e(log_likelihood.size());
  double sum = 0.0;
  for (std::size_t i = 0; i < e.size(); ++i) sum += e[i] = std::exp(log_likelihood[i] - top);
  w.units.resize(e.size());
  const double scale = static_cast<double>(kWeightUnits) / sum;
  for (std::size_t i = 0; i < e.size(); ++i) {
    w.units[i] = static_cast<std::uint64_t>(std::llround(e[i] * scale));
    w.total += w.units[i];
  }
  w.n_eff = kish_n_eff(w.units, w.total);
  return w;
}

double gaussian_log_likelihood(std::span<const double> observed, std::span<const double> modelled,
                               std::span<const double> sigma) {
  if (observed.size() != modelled.size() || observed.size() != sigma.size())
    throw InputError("observations", std::to_string(observed.size()), "one modelled value and one σ per observation");
  double l = 0.0;
  for (std::size_t o = 0; o < observed.size(); ++o) {
    if (!(sigma[o] > 0.0)) throw InputError("observation σ", std::to_string(sigma[o]), "a standard deviation > 0 Pa");
    const double z = (observed[o] - modelled[o]) / sigma[o];
    l -= 0.5 * z * z;
  }
  return l;
}

Eigen::MatrixXd observation_pressures(const PressureModel& pm, const std::vector<WellInput>& wells,
                                      const RunSettings& settings, const std::vector<PressureObservation>& observations) {
  const auto n = pm.draws.basis.cols();
  Eigen::MatrixXd out = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(observations.size()), n);
  if (observations.empty()) return out;
  std::vector<double> times;
  std::vector<hydro::ObservationPoint> points;
  double rw_min = std::numeric_limits<double>::infinity(), r2_max = 0.0;
  for (const auto& w : wells) rw_min = std::min(rw_min, w.radius);
  for (const auto& o : observations) {
    if (!std::isfinite(o.time) || !std::isfinite(o.x) || !std::isfinite(o.y))
      throw InputError("observation", std::to_string(o.x) + ", " + std::to_string(o.y), "a finite place and time");
    times.push_back(o.time);
    points.push_back({o.x, o.y});
    for (const auto& src : pm.sources)
      r2_max = std::max(r2_max, (o.x - src.x) * (o.x - src.x) + (o.y - src.y) * (o.y - src.y));
  }
  std::sort(times.begin(), times.end());
  times.erase(std::unique(times.begin(), times.end()), times.end());
  // The segments' grid in ln x, reaching the farthest observation (same step and leakage).
  const hydro::SimilarityGrid grid{std::log(rw_min * rw_min / (4.0 * pm.diffusivity_max)) - 0.1,
                                   std::log(std::max(r2_max, 1.0) / (4.0 * pm.diffusivity_min)) + 0.1, pm.grid.step,
                                   settings.leakage_rate};
  const auto tables = hydro::build_tables(pm.steps, times, grid);
  // Same D range and node count as the segments' surrogate, so the realizations' basis is shared.
  const hydro::PressureSurrogate sur(tables, pm.sources, points, pm.groups, pm.diffusivity_min, pm.diffusivity_max,
                                     pm.nodes);
  const auto& basis = pm.draws.basis;
  const auto& scale = pm.draws.scale;
  for (std::size_t o = 0; o < observations.size(); ++o) {
    const auto k = static_cast<Eigen::Index>(std::lower_bound(times.begin(), times.end(), observations[o].time) - times.begin());
    for (std::size_t g = 0; g < pm.groups; ++g) {
      const Eigen::RowVectorXd row = sur.table(o, g).row(k);  // nodes
      const Eigen::RowVectorXd at = row * basis;               // per realization
      out.row(static_cast<Eigen::Index>(o)) += at.cwiseProduct(scale.row(static_cast<Eigen::Index>(g)));
    }
  }
  return out;
}

Percentiles percentiles(std::span<const double> x, std::span<const std::uint64_t> units) {
  return {stats::weighted_percentile(x, units, 0.05), stats::weighted_percentile(x, units, 0.5),
          stats::weighted_percentile(x, units, 0.95)};
}

Percentiles percentiles(std::span<const double> x) {
  const std::vector<std::uint64_t> ones(x.size(), 1);
  return percentiles(x, ones);
}

Conditioning condition_on_pressures(const PressureModel& pm, const std::vector<WellInput>& wells,
                                    const RunSettings& settings, const InputList& list, const Eigen::MatrixXd& inputs,
                                    std::span<const double> seismicity) {
  Conditioning c;
  for (const auto& in : list.inputs) c.input_uncertain.push_back(!in.distribution.is_fixed());
  const auto& obs = settings.observations;
  c.modelled = observation_pressures(pm, wells, settings, obs);
  const auto n = static_cast<std::size_t>(c.modelled.cols());
  std::vector<double> observed, sigma;
  for (const auto& o : obs) {
    observed.push_back(o.observed);
    sigma.push_back(o.sigma);
  }
  std::vector<double> ll(n), modelled(obs.size());
  for (std::size_t i = 0; i < n; ++i) {
    for (std::size_t o = 0; o < obs.size(); ++o)
      modelled[o] = c.modelled(static_cast<Eigen::Index>(o), static_cast<Eigen::Index>(i));
    ll[i] = gaussian_log_likelihood(observed, modelled, sigma);
  }
  c.pressure_log_likelihood = ll;
  if (!seismicity.empty()) {
    if (seismicity.size() != n)
      throw InputError("seismicity log-likelihoods", std::to_string(seismicity.size()), "one per valid realization");
    c.seismicity_log_likelihood.assign(seismicity.begin(), seismicity.end());
    for (std::size_t i = 0; i < n; ++i) ll[i] += seismicity[i];
  }
  c.weights = importance_weights(ll);
  std::vector<double> row(n);
  const auto summarise = [&](const Eigen::MatrixXd& m, std::vector<Percentiles>& prior, std::vector<Percentiles>& post) {
    for (Eigen::Index j = 0; j < m.rows(); ++j) {
      for (std::size_t i = 0; i < n; ++i) row[i] = m(j, static_cast<Eigen::Index>(i));
      prior.push_back(percentiles(row));
      post.push_back(percentiles(row, c.weights.units));
    }
  };
  summarise(c.modelled, c.fit_prior, c.fit_posterior);
  summarise(inputs, c.input_prior, c.input_posterior);
  return c;
}

stats::ProportionInterval weighted_proportion(std::uint64_t units, const ImportanceWeights& w, double z) {
  if (w.total == 0 || units > w.total)
    throw InputError("weighted count", std::to_string(units), "at most the total weight " + std::to_string(w.total));
  if (!(z > 0.0) || !std::isfinite(z)) throw InputError("z", std::to_string(z), "a positive normal quantile");
  // Sums below 2^53: exact in double, so equal weights give r/n exactly.
  const double p = static_cast<double>(units) / static_cast<double>(w.total);
  const double n = w.n_eff, r = p * n;
  // Wilson (1927) in Newcombe's (1998) form with n = n_eff (as stats::wilson_interval).
  const double z2 = z * z;
  const double centre = 2.0 * r + z2;
  const double spread = z * std::sqrt(z2 + 4.0 * r * (n - r) / n);
  const double denom = 2.0 * (n + z2);
  stats::ProportionInterval out;
  out.estimate = p;
  out.lower = units == 0 ? 0.0 : std::clamp((centre - spread) / denom, 0.0, p);
  out.upper = units == w.total ? 1.0 : std::clamp((centre + spread) / denom, p, 1.0);
  return out;
}

}  // namespace slipscreen::probabilistic
