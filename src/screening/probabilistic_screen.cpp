#include "screening/probabilistic_screen.hpp"

#include <algorithm>
#include <cmath>
#include <map>

#include "core/screen/tracking_grid.hpp"
#include "core/stats/wilson_interval.hpp"
#include "core/util/civil_date.hpp"
#include "screening/capacity_split.hpp"
#include "screening/conditioning.hpp"
#include "screening/seismicity_likelihood.hpp"
#include "screening/what_if_split.hpp"

namespace slipscreen::screening {
namespace {

using stats::Distribution;

Distribution fixed(double v, const char* what) { return Distribution::fixed(std::isnan(v) ? 0.0 : v, what); }

}  // namespace

probabilistic::UncertainModel uncertain_model(const scenario::ResolvedScenario& s, const PreparedRun& p,
                                              const scenario::UncertaintySpec& spec, std::vector<std::string>& fault_ids,
                                              std::vector<std::size_t>& segment_fault) {
  probabilistic::UncertainModel m;
  const scenario::RegionSpec& rg = s.region;
  const scenario::FormationSpec& fm = rg.formation;
  m.from_transmissivity = fm.from_transmissivity;
  m.permeability = fixed(fm.permeability, "permeability");
  m.thickness = fixed(fm.thickness, "thickness");
  m.porosity = fixed(fm.porosity, "porosity");
  m.total_compressibility = fixed(fm.total_compressibility, "total_compressibility");
  m.viscosity = fixed(fm.viscosity, "viscosity");
  m.transmissivity = fixed(fm.transmissivity, "transmissivity");
  m.storativity = fixed(fm.storativity, "storativity");
  m.fluid_density = fm.fluid_density;
  m.depth = rg.reference_depth;
  const scenario::StressSpec& st = rg.stress;
  // The integrated overburden at the reference depth, as a mean gradient (exact at that depth).
  m.vertical_gradient = fixed(p.inputs.stress.sv / rg.reference_depth, "vertical_gradient");
  m.pore_pressure_gradient = fixed(p.inputs.stress.pore_pressure / rg.reference_depth, "pore_pressure_gradient");
  m.shmax_azimuth = fixed(p.inputs.stress.shmax_azimuth, "shmax_azimuth");
  switch (st.model) {
    case scenario::StressModel::gradients:
      m.model = probabilistic::HorizontalStressModel::gradients;
      m.shmax_gradient = fixed(st.shmax_gradient, "shmax_gradient");
      m.shmin_gradient = fixed(st.shmin_gradient, "shmin_gradient");
      break;
    case scenario::StressModel::uniaxial_strain:
      m.model = probabilistic::HorizontalStressModel::uniaxial_strain;
      m.poisson_ratio = fixed(st.poisson_ratio, "poisson_ratio");
      m.uniaxial = uniaxial_strain_model_of(st);
      break;
    case scenario::StressModel::a_phi:
      m.model = probabilistic::HorizontalStressModel::a_phi;
      m.a_phi = fixed(st.a_phi, "a_phi");
      // Magnitudes at frictional equilibrium for the region's friction (best estimate), so that
      // sampled fault friction changes how close faults are to failure.
      m.equilibrium_friction = std::isnan(st.equilibrium_friction) ? rg.faults.friction : st.equilibrium_friction;
      break;
  }
  if (st.poroelastic_path) {  // κ = α(1−2ν)/(1−ν) per realization (Engelder & Fischer 1994)
    m.poroelastic_path = true;
    m.poisson_ratio = fixed(st.poisson_ratio, "poisson_ratio");
    m.biot = fixed(st.biot, "biot");
  }
  m.friction = fixed(p.inputs.friction.mu, "friction");
  m.cohesion = fixed(p.inputs.friction.cohesion, "cohesion");

  // Faults in order of first appearance; a fault's own friction from the fault map is fixed.
  std::map<std::string, std::size_t> index;
  segment_fault.clear();
  fault_ids.clear();
  for (std::size_t i = 0; i < p.segments.size(); ++i) {
    const auto [it, added] = index.emplace(p.segments[i].fault_id, fault_ids.size());
    if (added) {
      fault_ids.push_back(p.segments[i].fault_id);
      m.fault_friction.emplace_back();
      if (p.inputs.segments[i].friction)
        m.fault_friction.back() = Distribution::fixed(*p.inputs.segments[i].friction, "friction");
    }
    segment_fault.push_back(it->second);
  }
  m.fault_ids = fault_ids;
  m.well_rate_factor.assign(p.inputs.wells.size(), std::nullopt);
  if (s.observations && s.observations->seismicity) {  // [catalog.rate_state]'s values unless [uncertainty.seismicity]
    m.seismicity = true;
    m.a_sigma = fixed(s.catalog->a_sigma, "a_sigma");
    m.background_rate_per_km = fixed(s.catalog->background_rate_per_m * 1000.0, "background_rate_per_km");
  }

  // The scenario's distributions replace the best estimates they name (the inputs each key
  // names are set by the key table of scenario/uncertainty_reader.cpp).
  for (const auto& v : spec.values) {
    switch (v.scope) {
      case scenario::UncertainScope::model: m.*(v.field) = v.distribution; break;
      case scenario::UncertainScope::fault_friction: m.fault_friction[index.at(v.id)] = v.distribution; break;
      case scenario::UncertainScope::well_rate_factor:
        for (std::size_t w = 0; w < p.inputs.wells.size(); ++w)
          if (p.inputs.wells[w].id == v.id) m.well_rate_factor[w] = v.distribution;
        break;
      case scenario::UncertainScope::poro3d:
        break;  // the screen in depth's inputs (screening/depth_probability.hpp), not the Theis screen's
    }
  }
  return m;
}

ProbabilisticRun run_probabilistic_screen(const scenario::ResolvedScenario& s, const PreparedRun& p,
                                          const scenario::UncertaintySpec& spec,
                                          std::vector<std::uint64_t> audit_realizations,
                                          std::vector<std::size_t> audit_segments,
                                          const probabilistic::RealizationSplit* split) {
  ProbabilisticRun run;
  const auto model = uncertain_model(s, p, spec, run.fault_ids, run.segment_fault);
  run.confidence = spec.confidence;
  run.thresholds = spec.thresholds;

  std::vector<probabilistic::WellInput> wells;
  std::vector<double> changes;
  for (const auto& w : p.inputs.wells) {
    probabilistic::WellInput in;
    in.id = w.id;
    in.x = w.x;
    in.y = w.y;
    in.radius = w.radius;
    for (const auto& c : w.history.changes()) {
      in.steps.time.push_back(c.time);
      in.steps.delta_rate.push_back(c.delta);
      changes.push_back(c.time);
    }
    wells.push_back(std::move(in));
  }
  std::vector<probabilistic::SegmentInput> segments;
  for (std::size_t i = 0; i < p.inputs.segments.size(); ++i) {
    probabilistic::SegmentInput in;
    for (const auto& c : p.inputs.segments[i].check_points) in.check_points.push_back({c.x, c.y});
    in.strike = p.inputs.segments[i].strike;
    in.dip = p.inputs.segments[i].dip;
    in.fault = run.segment_fault[i];
    segments.push_back(std::move(in));
  }

  probabilistic::RunSettings set;
  set.seed = s.seed;
  set.realizations = spec.realizations.value();
  set.method = spec.sampler;
  set.boundaries = p.inputs.boundaries;
  set.leakage_rate = p.inputs.formation.leakage_rate;  // leaky formation: c_L = D/B², fixed
  run.tracked_times = screen::tracking_grid(changes, s.output.times);
  if (run.tracked_times.empty()) run.tracked_times = s.output.times;
  set.tracking_times = run.tracked_times;
  for (double t : s.output.times) {
    const auto it = std::lower_bound(run.tracked_times.begin(), run.tracked_times.end(), t);
    set.output_index.push_back(static_cast<std::size_t>(it - run.tracked_times.begin()));
  }

  // Probability maps: the output grid, coarsened by a whole factor to at most kMapCells cells.
  run.map_grid = geometry::coarsened(p.grid, spec.map_cell_size > 0.0 ? spec.map_cell_size : p.grid.cell_size,
                                     kMapCells);
  for (int j = 0; j < run.map_grid.rows; ++j)
    for (int i = 0; i < run.map_grid.columns; ++i) {
      const auto c = run.map_grid.cell_centre(i, j);
      set.map_points.push_back({c.x, c.y});
    }
  if (spec.map_strike) {
    run.map_strike = spec.map_strike;
    run.map_dip = spec.map_dip;
    set.map_strike = spec.map_strike;
    set.map_dip = spec.map_dip;
  }

  set.attribute_median = s.output.tables;  // written to median_well_shares.csv
  set.audit_realizations = std::move(audit_realizations);
  set.audit_segments = std::move(audit_segments);
  if (s.capacity) {
    set.capacity = capacity_split(s, wells, run.tracked_times);
    set.capacity->thresholds = spec.thresholds;
    set.capacity->z = stats::z_for_confidence(spec.confidence);
  }
  for (const auto& w : s.what_if) set.what_if.push_back(what_if_split(w, p, wells));
  set.observations = observation_inputs(s, p);  // [observations]: weights (docs/conditioning.md)
  run.seismicity = seismicity_use(s, p);
  if (run.seismicity) set.seismicity = run.seismicity->data;
  run.result = probabilistic::run_probabilistic(model, wells, segments, set, split);
  run.wells = std::move(wells);
  run.segments = std::move(segments);
  run.settings = std::move(set);
  const double z = stats::z_for_confidence(run.confidence);
  for (const auto& seg : run.result.segments)
    for (auto n : seg.slipped_by) {
      const auto ci = stats::wilson_interval(n, run.result.realizations, z);
      run.mc_half_width_max = std::max(run.mc_half_width_max, 0.5 * (ci.upper - ci.lower));
    }
  run.spec = spec;
  return run;
}

double slip_probability(const ProbabilisticRun& run, std::size_t segment, std::size_t k) {
  return static_cast<double>(run.result.segments[segment].slipped_by[k]) /
         static_cast<double>(run.result.realizations);
}

std::string first_date_reaching(const ProbabilisticRun& run, std::size_t segment, double threshold) {
  const auto k = probabilistic::first_tracking_index_reaching(run.result.segments[segment], run.result.realizations,
                                                              threshold);
  return k ? util::format_iso_date(util::date_at(run.tracked_times.at(*k))) : std::string();
}

}  // namespace slipscreen::screening
