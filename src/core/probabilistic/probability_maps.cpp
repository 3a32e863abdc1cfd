// Slip-probability maps for unmapped faults; see probability_maps.hpp.
#include "core/probabilistic/probability_maps.hpp"

#include <algorithm>
#include <cmath>

namespace slipscreen::probabilistic {
namespace {

// Injection-induced slips by each output time at every pixel, for the thresholds `crit` (1 × N).
void count_slips(const hydro::PressureSurrogate& surrogate, const PressureDraws& draws, const Eigen::MatrixXf& crit,
                 const RunSettings& settings, std::vector<std::uint64_t>& counts) {
  const std::size_t n_out = settings.output_index.size();
  std::vector<std::vector<std::size_t>> pixel_points(settings.map_points.size());
  for (std::size_t p = 0; p < pixel_points.size(); ++p) pixel_points[p] = {p};
  counts.assign(settings.map_points.size() * n_out, 0);
  track_slip(surrogate, pixel_points, draws, crit, settings.output_index, [&](const SegmentOutcome& o) {
    for (std::size_t c = 0; c < o.first_crossing.size(); ++c) {
      const int first = o.first_crossing[c];
      if (first < 0 || !(crit(0, static_cast<Eigen::Index>(c)) > 0.0f)) continue;
      for (std::size_t t = 0; t < n_out; ++t)
        if (settings.output_index[t] >= static_cast<std::size_t>(first)) ++counts[o.segment * n_out + t];
    }
  });
}

}  // namespace

ProbabilityMaps probability_maps(const PressureModel& model, const SampledRealizations& r, const RunSettings& settings,
                                 std::optional<ColumnRange> columns) {
  ProbabilityMaps maps;
  if (settings.map_points.empty()) return maps;
  if (!model.map_surrogate || model.map_surrogate->point_count() != settings.map_points.size())
    throw InputError("map surrogate", model.map_surrogate ? std::to_string(model.map_surrogate->point_count()) + " points" : "(none)",
                     "the model built with these " + std::to_string(settings.map_points.size()) + " map points");
  const hydro::PressureSurrogate& surrogate = *model.map_surrogate;
  const ColumnRange cols = columns.value_or(ColumnRange{0, r.diffusivity.size()});
  const auto c0 = static_cast<Eigen::Index>(cols.begin), nc = static_cast<Eigen::Index>(cols.size());
  const PressureDraws draws =
      make_pressure_draws(surrogate, std::span(r.diffusivity).subspan(cols.begin, cols.size()),
                          std::span(r.prefactor).subspan(cols.begin, cols.size()), model.factor.middleCols(c0, nc));
  const bool oriented = settings.map_strike && settings.map_dip;
  for (int which = 0; which < (oriented ? 2 : 1); ++which) {
    auto& counts = which == 0 ? maps.dangerous : maps.oriented;
    auto& already = which == 0 ? maps.dangerous_already_critical : maps.oriented_already_critical;
    const Eigen::MatrixXf row = r.map_dp_crit.row(which).segment(c0, nc);
    already = static_cast<std::uint64_t>((row.array() <= 0.0f).count());
    count_slips(surrogate, draws, row, settings, counts);
  }
  return maps;
}

}  // namespace slipscreen::probabilistic
