#pragma once
// The pore-pressure model of a probabilistic run, prepared once for all realizations.
//
// Source: Theis (1935) with superposition in time and space; images for straight boundaries
// (hydro/image_wells.hpp). Across realizations the hydrogeology enters only through D and
// P = μ/(4π k h), and the rate factors scale rate groups linearly (docs/uncertainty.md,
// "The Monte Carlo engine and its accuracy"):
//   Δp_p(t_k) = P · Σ_g f_g · G_{p,g}(t_k, D)       (hydro/pressure_surrogate.hpp)
//
// Symbols (code -> literature): diffusivity D [m²/s], prefactor P [Pa per m³/s], factor f_g
// [1] (rate group g: group 0 = wells with the global rate factor only; every well with its own
// factor is a group of its own, f_g = global × own), x = r²/(4D) [s] (similarity tables).
//
// Grid of the similarity tables: ln x from ln(r_w,min²/(4 D_max)) − 0.1 to
// ln(max(r²_max, 1 m²)/(4 D_min)) + 0.1 in steps of 0.025, r²_max the largest squared distance
// between a check point and a source. Surrogate nodes: RunSettings::surrogate_nodes, or
// 8 per e-fold of D_max/D_min, at least 4 and at most 64.
//
// Accuracy: that of the similarity tables and of the surrogate (its max_relative_error()).
#include <Eigen/Dense>
#include <cstddef>
#include <optional>
#include <vector>

#include "core/util/work_share.hpp"
#include "core/hydro/pressure_surrogate.hpp"
#include "core/hydro/similarity_table.hpp"
#include "core/probabilistic/realization_sampler.hpp"
#include "core/probabilistic/screen_inputs.hpp"
#include "core/probabilistic/slip_tracker.hpp"

namespace slipscreen::probabilistic {

struct PressureModel {
  std::vector<hydro::RateSteps> steps;                   // per well
  std::vector<std::size_t> group_of;                     // rate group of each well
  std::size_t groups = 1;                                // number of rate groups
  std::vector<hydro::PressureSource> sources;            // wells and their images, well by well
  std::vector<std::size_t> first_source;                 // sources of well w: [first_source[w], first_source[w+1])
  std::vector<std::vector<std::size_t>> segment_points;  // surrogate point index of every check point
  double diffusivity_min = 0.0, diffusivity_max = 0.0;   // m²/s over the valid realizations
  hydro::SimilarityGrid grid;
  std::size_t nodes = 0;                                 // Chebyshev nodes in ln D
  std::optional<hydro::PressureSurrogate> surrogate;     // at the segments' check points
  std::optional<hydro::PressureSurrogate> map_surrogate; // at RunSettings::map_points (none without them)
  std::vector<std::vector<float>> median_nodes;          // with RunSettings::attribute_median: every
                                                         // table's nodes at every output time [t · wells + w]
  Eigen::MatrixXd factor;                                // groups × valid realizations: f_g
  PressureDraws draws;                                   // the realizations' basis and P · f_g
};

// Builds the model for the valid realizations of `r` (their D, P and rate-factor inputs). With an
// active `share` the parts build the tables and the surrogate together (every part then calls
// this with the same inputs, in the same order as its other shared builds). With `own` the
// surrogate holds only the check points of those segments (a part of a split run that tracks
// them; the other segments' segment_points are empty), each point's G bit for bit that of the
// whole model; `share` then serves only the tables. The similarity tables are built by blocks of
// wells and each block is added into the surrogates (the segments' and, with map points, the
// map's) and the median's table nodes (with attribute_median) before the next is built: the model
// never holds every table (hydro::TableBuilder, docs/cluster.md).
PressureModel build_pressure_model(const std::vector<WellInput>& wells, const std::vector<SegmentInput>& segments,
                                   const RunSettings& settings, const InputList& list, const SampledRealizations& r,
                                   const util::WorkShare* share = nullptr, std::optional<SegmentRows> own = std::nullopt);

// The rate groups of a model of `list`'s wells: one for the wells without a rate factor of their
// own, one for each well with one.
std::size_t rate_group_count(const InputList& list);

// The surrogate's Chebyshev nodes in ln D for diffusivities in [d_min, d_max]: the setting when
// given, else 8 per e-fold of D_max/D_min, from 4 to 64.
std::size_t surrogate_node_count(const RunSettings& settings, double d_min, double d_max);

// Replaces the segments' surrogate of a model built with `own` by one at the check points of
// segments `own` (a later chunk of a split run's segments, docs/cluster.md): the old one is freed
// first, the tables are built again by blocks (each part building them itself) and fill this
// surrogate alone; the map's surrogate, the median's table nodes and the draws stay as they are
// (the draws depend on the nodes in ln D only, the same for every chunk). Every point's G is bit
// for bit that of the whole model.
void rebuild_segment_surrogate(PressureModel& m, const std::vector<SegmentInput>& segments, const RunSettings& settings,
                               SegmentRows own);

// Σ over the model's groups of its table rows [first_row, first_row + rows) times basis · scale_g,
// for the realizations `cols`, at every check point of `points`, stacked into `out`: row i·rows + k
// is point i at tracking index first_row + k (points.size()·rows × cols.size()). One product per
// group for all the points, the realizations' block of basis · scale_g built once; each entry is
// the same sum, in the same order, as a product per point. `buf` is reused from call to call.
struct SeriesBuffers {
  Eigen::MatrixXd block, stacked;
};
void point_series(const PressureModel& pm, const std::vector<std::size_t>& points, Eigen::Index rows,
                  const std::vector<Eigen::Index>& cols, Eigen::Index first_row, SeriesBuffers& buf, Eigen::MatrixXd& out);

// The largest over the `points` stacked blocks of `rows` rows of point_series()'s result: rows ×
// columns (a segment's Δp is the largest over its check points).
Eigen::MatrixXd max_over_points(const Eigen::MatrixXd& stacked, std::size_t points, Eigen::Index rows);

}  // namespace slipscreen::probabilistic
