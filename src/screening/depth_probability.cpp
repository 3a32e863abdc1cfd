// The probabilistic screen of faults in depth; see depth_probability.hpp.
#include "screening/depth_probability.hpp"

#include <string>

#include "core/errors.hpp"
#include "core/stats/wilson_interval.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::screening {

std::optional<DepthDraws> depth_draws(const scenario::ResolvedScenario& s, const PreparedRun& p) {
  const scenario::UncertaintySpec& spec = s.uncertainty;
  if (!spec.given || !s.region.formation.poroelastic_3d) return std::nullopt;
  const poro::PoroelasticMedium base = scenario::poroelastic_medium_of(s.region.formation);
  const double fixed[] = {base.shear_modulus, base.poisson_drained, base.poisson_undrained,
                          base.biot,          base.permeability,    p.inputs.friction.mu};
  std::vector<stats::UncertainInput> inputs;
  for (std::size_t j = 0; j < std::size(kDepthUncertainKeys); ++j) {
    const scenario::UncertainValue* v = spec.find(kDepthUncertainKeys[j]);
    inputs.push_back({kDepthUncertainKeys[j], v ? v->distribution : stats::Distribution::fixed(fixed[j])});
  }
  const bool friction_uncertain = spec.find("faults.friction") != nullptr;
  const stats::Sampler sampler(inputs, spec.sampler, spec.seed, spec.realizations);
  const std::uint64_t n = sampler.realization_count();
  DepthDraws out;
  std::vector<poro::DepthRealization>& draws = out.draws;
  draws.resize(n);
  std::vector<double> x(inputs.size());
  // Every realization is drawn and checked before the first screen.
  for (std::uint64_t i = 0; i < n; ++i) {
    sampler.draw(i, x);
    poro::DepthRealization& r = draws[i];
    r.medium = {x[0], x[1], x[2], x[3], x[4], base.viscosity};
    if (friction_uncertain) r.friction = x[5];
    try {
      poro::rudnicki_constants(r.medium);
      if (!(x[5] > 0.0)) throw InputError("friction", util::number_text(x[5], 6), "a positive friction coefficient");
    } catch (const InputError& e) {
      throw InputError("uncertainty", "realization " + std::to_string(i) + ": G = " + util::number_text(x[0], 6) +
                                          " Pa, nu = " + util::number_text(x[1], 6) + ", nu_u = " +
                                          util::number_text(x[2], 6) + ", alpha = " + util::number_text(x[3], 6) +
                                          ", friction = " + util::number_text(x[5], 6),
                       "distributions whose every draw is a valid medium (0 <= nu < nu_u < 0.5, 0 < alpha <= 1, "
                       "G > 0, k > 0, friction > 0; " + std::string(e.what()) +
                           "): narrow or truncate them (truncnormal)",
                       s.file + " [uncertainty]");
    }
  }
  out.sampler = sampler.descriptor();
  for (const auto& in : inputs) out.input_names.push_back(in.name);
  return out;
}

DepthProbability depth_probability(const scenario::ResolvedScenario& s, const DepthScreen& d, const DepthDraws& draws) {
  const poro::DepthSlipCounts counts = poro::depth_slip_counts(d.inputs, draws.draws);
  DepthProbability out;
  out.realizations = counts.realizations;
  out.sampler = draws.sampler;
  out.input_names = draws.input_names;
  out.z = stats::z_for_confidence(s.uncertainty.confidence);
  out.slipped = counts.slipped;
  return out;
}

}  // namespace slipscreen::screening
