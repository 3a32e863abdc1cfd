// The pore-pressure model of a probabilistic run; see pressure_model.hpp.
#include "core/probabilistic/pressure_model.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <span>
#include <string>

#include "core/errors.hpp"
#include "core/hydro/image_wells.hpp"

namespace slipscreen::probabilistic {
namespace {

// Rate groups, sources (wells and images) and the smallest well radius.
double add_sources(const std::vector<WellInput>& wells, const RunSettings& settings, const InputList& list,
                   PressureModel& m) {
  for (const auto& w : wells) m.steps.push_back(w.steps);
  m.group_of.assign(wells.size(), 0);
  m.groups = 1;
  for (std::size_t w = 0; w < wells.size(); ++w)
    if (list.well_rate[w] != InputList::npos) m.group_of[w] = m.groups++;
  m.first_source.assign(wells.size() + 1, 0);
  double rw_min = std::numeric_limits<double>::infinity();
  for (std::size_t w = 0; w < wells.size(); ++w) {
    rw_min = std::min(rw_min, wells[w].radius);
    m.first_source[w] = m.sources.size();
    for (const auto& im : hydro::image_wells(wells[w].x, wells[w].y, settings.boundaries))
      m.sources.push_back({im.x, im.y, wells[w].radius, w, im.sign, m.group_of[w]});
  }
  m.first_source[wells.size()] = m.sources.size();
  return rw_min;
}

// f_g per valid realization: the global rate factor, times the well's own for its group.
Eigen::MatrixXd rate_factors(const PressureModel& m, const InputList& list, const Eigen::MatrixXd& xv) {
  const Eigen::Index n = xv.cols();
  Eigen::MatrixXd factor(static_cast<Eigen::Index>(m.groups), n);
  for (Eigen::Index c = 0; c < n; ++c) {
    factor(0, c) = xv(static_cast<Eigen::Index>(list.rate), c);
    for (std::size_t g = 1; g < m.groups; ++g) factor(static_cast<Eigen::Index>(g), c) = factor(0, c);
    for (std::size_t w = 0; w < m.group_of.size(); ++w)
      if (list.well_rate[w] != InputList::npos)
        factor(static_cast<Eigen::Index>(m.group_of[w]), c) =
            factor(0, c) * xv(static_cast<Eigen::Index>(list.well_rate[w]), c);
  }
  return factor;
}

}  // namespace

PressureModel build_pressure_model(const std::vector<WellInput>& wells, const std::vector<SegmentInput>& segments,
                                   const RunSettings& settings, const InputList& list, const SampledRealizations& r,
                                   const util::WorkShare* share, std::optional<SegmentRows> own) {
  if (own && (own->first > own->second || own->second > segments.size()))
    throw InputError("own segments", std::to_string(own->first) + " to " + std::to_string(own->second),
                     "a range of the " + std::to_string(segments.size()) + " segments");
  PressureModel m;
  m.diffusivity_min = *std::min_element(r.diffusivity.begin(), r.diffusivity.end());
  m.diffusivity_max = *std::max_element(r.diffusivity.begin(), r.diffusivity.end());
  const double rw_min = add_sources(wells, settings, list, m);
  std::vector<hydro::ObservationPoint> points;
  m.segment_points.resize(segments.size());
  double r2_max = 0.0;
  for (std::size_t s = 0; s < segments.size(); ++s)
    for (const auto& p : segments[s].check_points) {
      m.segment_points[s].push_back(points.size());
      points.push_back(p);
      for (const auto& src : m.sources)
        r2_max = std::max(r2_max, (p.x - src.x) * (p.x - src.x) + (p.y - src.y) * (p.y - src.y));
    }
  m.grid = {std::log(rw_min * rw_min / (4.0 * m.diffusivity_max)) - 0.1,
            std::log(std::max(r2_max, 1.0) / (4.0 * m.diffusivity_min)) + 0.1, 0.025, settings.leakage_rate};
  // Tables shared only for the leaky well function, the surrogate always (docs/cluster.md: a
  // Theis table costs about as much to send as to build).
  m.tables = hydro::build_tables(m.steps, settings.tracking_times, m.grid, settings.leakage_rate > 0.0 ? share : nullptr);
  m.nodes = settings.surrogate_nodes > 0
                ? settings.surrogate_nodes
                // Clamped as a double before the cast (fmin/fmax also take NaN to a bound), so no
                // ratio of diffusivities can make the float-to-integer cast undefined.
                : static_cast<std::size_t>(
                      std::fmax(4.0, std::fmin(64.0, std::ceil(8.0 * std::log(m.diffusivity_max / m.diffusivity_min)))));
  if (own) {  // this part's segments only: their points are contiguous in `points`
    const std::size_t first = own->first < own->second ? m.segment_points[own->first].front() : 0;
    const std::size_t end = own->first < own->second ? m.segment_points[own->second - 1].back() + 1 : 0;
    for (std::size_t s = 0; s < segments.size(); ++s)
      if (s < own->first || s >= own->second) m.segment_points[s].clear();
      else
        for (auto& i : m.segment_points[s]) i -= first;
    m.surrogate.emplace(m.tables, m.sources, std::span(points).subspan(first, end - first), m.groups, m.diffusivity_min,
                        m.diffusivity_max, m.nodes, nullptr, hydro::PointRange{first, points.size()});
  } else {
    m.surrogate.emplace(m.tables, m.sources, points, m.groups, m.diffusivity_min, m.diffusivity_max, m.nodes, share);
  }
  m.factor = rate_factors(m, list, r.inputs);
  m.draws = make_pressure_draws(*m.surrogate, r.diffusivity, r.prefactor, m.factor);
  return m;
}

hydro::PressureSurrogate map_surrogate(const PressureModel& m, const RunSettings& settings) {
  double r2m = 0.0;
  for (const auto& p : settings.map_points)
    for (const auto& src : m.sources) {
      const double dx = p.x - src.x, dy = p.y - src.y;
      r2m = std::max(r2m, dx * dx + dy * dy);
    }
  const hydro::SimilarityGrid grid{
      m.grid.ln_x_min, std::max(m.grid.ln_x_max, std::log(std::max(r2m, 1.0) / (4.0 * m.diffusivity_min)) + 0.1),
      0.025, m.grid.leakage_rate};
  if (grid.ln_x_max > m.grid.ln_x_max)
    return {hydro::build_tables(m.steps, settings.tracking_times, grid), m.sources, settings.map_points, m.groups,
            m.diffusivity_min, m.diffusivity_max, m.nodes};
  if (m.tables.empty()) throw InputError("similarity tables", "(released)", "the model's tables for the map's surrogate");
  return {m.tables, m.sources, settings.map_points, m.groups, m.diffusivity_min, m.diffusivity_max, m.nodes};
}

void release_tables(PressureModel& m, const RunSettings& settings) {
  if (!settings.map_points.empty()) m.map_surrogate.emplace(map_surrogate(m, settings));
  if (settings.attribute_median)
    for (std::size_t k : settings.output_index)
      for (const auto& table : m.tables) m.median_nodes.push_back(table.nodes_at(k));
  std::vector<hydro::SimilarityTable>().swap(m.tables);
}

void point_series(const PressureModel& pm, const std::vector<std::size_t>& points, Eigen::Index rows,
                  const std::vector<Eigen::Index>& cols, Eigen::Index first_row, SeriesBuffers& buf, Eigen::MatrixXd& out) {
  const auto np = static_cast<Eigen::Index>(points.size());
  const auto nc = static_cast<Eigen::Index>(cols.size());
  out.setZero(np * rows, nc);
  buf.block.resize(pm.draws.basis.rows(), nc);
  buf.stacked.resize(np * rows, pm.draws.basis.rows());
  for (std::size_t g = 0; g < pm.groups; ++g) {
    for (Eigen::Index c = 0; c < nc; ++c)
      buf.block.col(c) = pm.draws.basis.col(cols[static_cast<std::size_t>(c)]) *
                         pm.draws.scale(static_cast<Eigen::Index>(g), cols[static_cast<std::size_t>(c)]);
    for (Eigen::Index i = 0; i < np; ++i)
      buf.stacked.middleRows(i * rows, rows) =
          pm.surrogate->table(points[static_cast<std::size_t>(i)], g).middleRows(first_row, rows);
    out.noalias() += buf.stacked * buf.block;
  }
}

Eigen::MatrixXd max_over_points(const Eigen::MatrixXd& stacked, std::size_t points, Eigen::Index rows) {
  Eigen::MatrixXd best = stacked.topRows(rows);
  for (std::size_t i = 1; i < points; ++i) best = best.cwiseMax(stacked.middleRows(static_cast<Eigen::Index>(i) * rows, rows));
  return best;
}

}  // namespace slipscreen::probabilistic
