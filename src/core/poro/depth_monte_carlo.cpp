// The Monte Carlo engine of the screen in depth; see depth_monte_carlo.hpp.
#include "core/poro/depth_monte_carlo.hpp"

#include "core/util/parallel_errors.hpp"

namespace slipscreen::poro {

DepthSlipCounts depth_slip_counts(const DepthScreenInputs& base, std::span<const DepthRealization> draws) {
  const std::size_t S = base.segments.size(), K = base.output_times.size(), N = draws.size();
  std::vector<std::uint8_t> slipped(N * S * K, 0);  // per realization, so threads never share a slot
  util::ParallelErrors errors;
#pragma omp parallel
  {
    DepthScreenInputs in;
    errors.setup([&] { in = base; });
#pragma omp for schedule(dynamic)
    for (std::size_t i = 0; i < N; ++i)
      errors.iteration(i, [&] {
        in.medium = rudnicki_constants(draws[i].medium);
        for (std::size_t s = 0; s < S; ++s)
          in.segments[s].friction = draws[i].friction ? draws[i].friction : base.segments[s].friction;
        const DepthScreenResult r = depth_screen(in);
        for (std::size_t s = 0; s < S; ++s) {
          const DepthSegmentScreen& g = r.segments[s];
          for (std::size_t k = 0; k < K; ++k)
            slipped[(i * S + s) * K + k] =
                g.already_critical || (g.first_crossing && *g.first_crossing <= base.output_times[k]);
        }
      });
  }
  errors.rethrow();
  DepthSlipCounts out;
  out.realizations = N;
  out.slipped.assign(S, std::vector<std::uint32_t>(K, 0));
  for (std::size_t i = 0; i < N; ++i)
    for (std::size_t s = 0; s < S; ++s)
      for (std::size_t k = 0; k < K; ++k) out.slipped[s][k] += slipped[(i * S + s) * K + k];
  return out;
}

}  // namespace slipscreen::poro
