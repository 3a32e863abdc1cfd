// The pore-pressure model of a probabilistic run; see pressure_model.hpp.
#include "core/probabilistic/pressure_model.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <span>
#include <string>

#include "core/errors.hpp"
#include "core/hydro/image_wells.hpp"
#include "core/hydro/similarity_table.hpp"

namespace slipscreen::probabilistic {
namespace {

// Rate groups, sources (wells and images) and the smallest well radius.
double add_sources(const std::vector<WellInput>& wells, const RunSettings& settings, const InputList& list,
                   PressureModel& m) {
  if (list.well_rate.size() != wells.size())
    throw InputError("well rate factors", std::to_string(list.well_rate.size()), std::to_string(wells.size()) + ", one per well");
  for (const auto& w : wells) m.steps.push_back(w.steps);
  m.group_of.assign(wells.size(), 0);
  m.groups = rate_group_count(list);
  for (std::size_t w = 0, g = 1; w < wells.size(); ++w)
    if (list.well_rate[w] != InputList::npos) m.group_of[w] = g++;
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

// The grid of the map's tables: the model's, widened to reach the farthest pixel.
hydro::SimilarityGrid map_grid(const PressureModel& m, const RunSettings& settings) {
  double r2m = 0.0;
  for (const auto& p : settings.map_points)
    for (const auto& src : m.sources) {
      const double dx = p.x - src.x, dy = p.y - src.y;
      r2m = std::max(r2m, dx * dx + dy * dy);
    }
  return {m.grid.ln_x_min, std::max(m.grid.ln_x_max, std::log(std::max(r2m, 1.0) / (4.0 * m.diffusivity_min)) + 0.1),
          0.025, m.grid.leakage_rate};
}

// The similarity tables, built by blocks of wells (RunSettings::table_block_bytes) and added block by
// block into the segments' surrogate, the map's (when its pixels lie within the same grid; else
// from its own wider tables, by blocks too) and the table nodes at the output times for the
// median's attribution; each block is dropped before the next, so a statewide review never holds
// every table (W · n_x · G floats, 5 GB; docs/cluster.md).
// With `segments_only` the tables fill the segments' surrogate alone (a later chunk of a split
// run's segments, rebuild_segment_surrogate), each part building every table itself.
void add_tables(PressureModel& m, const RunSettings& settings, const util::WorkShare* share, bool segments_only = false) {
  const std::size_t W = m.steps.size(), G = settings.tracking_times.size();
  const hydro::SimilarityGrid wide = map_grid(m, settings);
  const bool map_own_grid = wide.ln_x_max > m.grid.ln_x_max;
  if (!settings.map_points.empty() && !segments_only)
    m.map_surrogate.emplace(settings.map_points, m.groups, G, m.diffusivity_min, m.diffusivity_max, m.nodes);
  const bool median = settings.attribute_median && !segments_only;
  if (median) m.median_nodes.assign(settings.output_index.size() * W, {});
  // Tables shared only for the leaky well function (docs/cluster.md: a Theis table costs about as
  // much to send as to build).
  const util::WorkShare* tables_share = settings.leakage_rate > 0.0 && !segments_only ? share : nullptr;
  const hydro::TableBuilder builder(m.steps, settings.tracking_times, m.grid);
  for (const auto& [first, end] : builder.blocks(settings.table_block_bytes)) {
    const std::vector<hydro::SimilarityTable> tables = builder.build(first, end, tables_share);
    m.surrogate->add(tables, first, m.sources);
    if (m.map_surrogate && !map_own_grid && !segments_only) m.map_surrogate->add(tables, first, m.sources);
    if (median)
      for (std::size_t t = 0; t < settings.output_index.size(); ++t)
        for (std::size_t w = first; w < end; ++w)
          m.median_nodes[t * W + w] = tables[w - first].nodes_at(settings.output_index[t]);
  }
  m.surrogate->finish(W);
  if (!m.map_surrogate || segments_only) return;
  if (map_own_grid) {
    const hydro::TableBuilder map_builder(m.steps, settings.tracking_times, wide);
    for (const auto& [first, end] : map_builder.blocks(settings.table_block_bytes))
      m.map_surrogate->add(map_builder.build(first, end), first, m.sources);
  }
  m.map_surrogate->finish(W);
}

// An empty surrogate (tables still to add) at the check points of segments `own` only, and
// their segment_points (the other segments' emptied): those points are contiguous in the whole
// set, and the error estimate samples the whole set's points (hydro::PointRange).
void own_surrogate(PressureModel& m, const std::vector<SegmentInput>& segments, const RunSettings& settings, SegmentRows own) {
  std::vector<hydro::ObservationPoint> points;
  std::size_t first = 0, total = 0;
  m.segment_points.assign(segments.size(), {});
  for (std::size_t s = 0; s < segments.size(); ++s) {
    const auto& cps = segments[s].check_points;
    if (s < own.first) first += cps.size();
    total += cps.size();
    if (s < own.first || s >= own.second) continue;
    for (const auto& p : cps) {
      m.segment_points[s].push_back(points.size());
      points.push_back(p);
    }
  }
  m.surrogate.emplace(points, m.groups, settings.tracking_times.size(), m.diffusivity_min, m.diffusivity_max, m.nodes,
                      nullptr, hydro::PointRange{first, total});
}

}  // namespace

std::size_t rate_group_count(const InputList& list) {
  return 1 + static_cast<std::size_t>(std::count_if(list.well_rate.begin(), list.well_rate.end(),
                                                    [](std::size_t i) { return i != InputList::npos; }));
}

std::size_t surrogate_node_count(const RunSettings& settings, double d_min, double d_max) {
  return settings.surrogate_nodes > 0
             ? settings.surrogate_nodes
             // Clamped as a double before the cast (fmin/fmax also take NaN to a bound), so no
             // ratio of diffusivities can make the float-to-integer cast undefined.
             : static_cast<std::size_t>(std::fmax(4.0, std::fmin(64.0, std::ceil(8.0 * std::log(d_max / d_min)))));
}

void rebuild_segment_surrogate(PressureModel& m, const std::vector<SegmentInput>& segments, const RunSettings& settings,
                               SegmentRows own) {
  if (own.first > own.second || own.second > segments.size())
    throw InputError("own segments", std::to_string(own.first) + " to " + std::to_string(own.second),
                     "a range of the " + std::to_string(segments.size()) + " segments");
  if (!m.surrogate || m.segment_points.size() != segments.size())
    throw InputError("pressure model", "not built for these segments", "a model from build_pressure_model");
  m.surrogate.reset();  // freed before the next one is built
  own_surrogate(m, segments, settings, own);
  add_tables(m, settings, nullptr, true);
}

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
  m.nodes = surrogate_node_count(settings, m.diffusivity_min, m.diffusivity_max);
  if (own) own_surrogate(m, segments, settings, *own);
  else m.surrogate.emplace(points, m.groups, settings.tracking_times.size(), m.diffusivity_min, m.diffusivity_max, m.nodes, share);
  add_tables(m, settings, share);
  m.factor = rate_factors(m, list, r.inputs);
  m.draws = make_pressure_draws(*m.surrogate, r.diffusivity, r.prefactor, m.factor);
  return m;
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
