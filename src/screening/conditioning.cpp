// The scenario's observations for the probabilistic screen; see conditioning.hpp.
#include "screening/conditioning.hpp"

#include <algorithm>
#include <cmath>
#include <map>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"
#include "formats/gis/crs.hpp"

namespace slipscreen::screening {

std::vector<probabilistic::PressureObservation> observation_inputs(const scenario::ResolvedScenario& s,
                                                                   const PreparedRun& p) {
  std::vector<probabilistic::PressureObservation> out;
  if (!s.observations) return out;
  const scenario::ObservationsSpec& spec = *s.observations;
  std::map<std::string, formats::Transformer> transformers;
  for (const auto& o : spec.pressure) {
    probabilistic::PressureObservation in;
    try {
      auto it = transformers.find(o.crs);
      if (it == transformers.end())
        it = transformers.emplace(o.crs, formats::Transformer(formats::Crs::from_user_string(o.crs, "crs"), p.working))
                 .first;
      const geometry::Point2 q = it->second({o.x, o.y}, "observation location");
      in.x = q.x;
      in.y = q.y;
      if (!std::isfinite(in.x) || !std::isfinite(in.y))
        throw InputError("x, y", util::number_text(o.x, 12) + ", " + util::number_text(o.y, 12),
                         "a place the working CRS " + s.region.crs + " can hold");
      for (const auto& w : p.inputs.wells) {
        if (w.history.empty()) continue;  // not an injection well
        const double d = std::hypot(in.x - w.x, in.y - w.y);
        if (d < std::max(kAtInjectorDistance, w.radius) && !spec.at_injector)
          throw InputError("x, y", util::number_text(o.x, 12) + ", " + util::number_text(o.y, 12),
                           "a monitoring point away from the injection wells: it is " + util::number_text(d, 3) +
                               " m from well '" + w.id +
                               "'; the line-source (Theis) model ignores the skin and the wellbore storage, so it "
                               "cannot be compared with a pressure measured in the injecting well itself (set "
                               "at_injector = true under [observations] to use it anyway)");
      }
    } catch (const InputError& e) {
      throw e.located(o.source + " (observation '" + o.id + "')");
    }
    in.time = o.time;
    in.observed = o.dp;
    in.sigma = std::sqrt(o.sd * o.sd + spec.model_error * spec.model_error);
    out.push_back(in);
  }
  return out;
}

std::string low_effective_sample_warning(double n_eff, std::uint64_t realizations) {
  if (!(n_eff < kLowEffectiveSample)) return {};
  return "effective sample size n_eff = " + util::number_text(n_eff, 3) + " of " + std::to_string(realizations) +
         " realizations (below " + util::number_text(kLowEffectiveSample, 3) +
         "): the observations are more informative than the prior sample can represent, so the conditioned "
         "probabilities and percentiles rest on few realizations; run more realizations";
}

}  // namespace slipscreen::screening
