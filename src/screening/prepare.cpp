#include "screening/prepare.hpp"

#include "core/hydro/image_wells.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <set>

#include "core/errors.hpp"
#include "core/geomech/a_phi.hpp"
#include "core/geomech/coulomb.hpp"
#include "core/geomech/depth_profile.hpp"
#include "core/geomech/horizontal_stress.hpp"
#include "formats/files/path_policy.hpp"
#include "core/screen/tracking_grid.hpp"
#include "core/util/number_text.hpp"
#include "formats/gis/fault_table.hpp"
#include "scenario/plausibility.hpp"
#include "screening/study_area.hpp"

namespace slipscreen::screening {

geomech::UniaxialStrainModel uniaxial_strain_model_of(const scenario::StressSpec& st) {
  geomech::UniaxialStrainModel m;
  m.poisson = st.poisson_ratio;
  m.biot = st.biot;
  m.young = st.young_modulus;
  m.strain_h = st.strain_shmin;
  m.strain_H = st.strain_shmax;
  m.tectonic_h = st.tectonic_shmin;
  m.tectonic_H = st.tectonic_shmax;
  return m;
}

double stress_path_kappa_of(const scenario::StressSpec& st) {
  return st.poroelastic_path ? geomech::stress_path_coefficient({st.biot, st.poisson_ratio}) : 0.0;
}

std::string stress_path_statement(const scenario::StressSpec& st) {
  if (!st.poroelastic_path) return "none: total stresses unchanged, dCFF = mu dp";
  return "poroelastic (Engelder & Fischer 1994): dSh = dSH = kappa dp, dSv = 0, kappa = alpha(1-2nu)/(1-nu) = " +
         util::number_text(stress_path_kappa_of(st), 6) + " (alpha " + util::number_text(st.biot, 6) + ", nu " +
         util::number_text(st.poisson_ratio, 6) + "); dp_crit exact along the path";
}

geomech::AndersonianStress stress_at_reference_depth(const scenario::RegionSpec& r) {
  const scenario::StressSpec& st = r.stress;
  const double z = r.reference_depth;
  double sv = 0;
  try {
    if (!st.density_layers.empty()) {
      std::vector<geomech::DensityLayer> layers;
      for (const auto& l : st.density_layers) layers.push_back({l.top, l.density});
      sv = geomech::vertical_stress_from_layers(layers, z);
    } else {
      sv = geomech::from_gradient(st.vertical_gradient, z, "vertical_gradient");
    }
    const double p0 = geomech::from_gradient(r.pore_pressure_gradient, z, "pore_pressure_gradient");
    geomech::HorizontalStresses h{};
    switch (st.model) {
      case scenario::StressModel::gradients:
        h = geomech::horizontal_stresses_from_gradients(st.shmax_gradient, st.shmin_gradient, z);
        break;
      case scenario::StressModel::uniaxial_strain: {
        const geomech::UniaxialStrainModel m = uniaxial_strain_model_of(st);
        geomech::check(m);
        h = geomech::horizontal_stresses_uniaxial_strain(m, sv, p0);
        break;
      }
      case scenario::StressModel::a_phi:
        h = geomech::horizontal_stresses_from_a_phi(st.a_phi, sv, p0, st.equilibrium_friction);
        break;
    }
    geomech::AndersonianStress s{sv, h.shmax, h.shmin, st.shmax_azimuth, p0};
    geomech::check(s);
    return s;
  } catch (const InputError& e) {
    throw e.located(r.file + " [stress] at reference_depth " + util::number_text(z) + " m");
  }
}

hydro::RateHistory rate_history_of(const scenario::WellSpec& w) {
  std::vector<hydro::RatePeriod> periods;
  for (const auto& p : w.periods) periods.push_back({p.start, p.end, p.rate});
  return hydro::RateHistory::from_periods(periods);
}

namespace {

geometry::RasterGrid output_grid(const scenario::ResolvedScenario& s, const PreparedRun& run) {
  const scenario::OutputGrid& g = s.output.grid;
  if (!g.crs.empty()) {
    const formats::Crs grid_crs = formats::Crs::from_user_string(g.crs, "output.grid.crs");
    if (!grid_crs.same_as(run.working))
      throw InputError("output.grid.crs", g.crs,
                       "the region's working CRS (" + s.region.crs + "): rasters are computed in the working CRS",
                       s.file);
  }
  double xmin = g.xmin, ymin = g.ymin, xmax = g.xmax, ymax = g.ymax;
  if (g.automatic_extent) {
    xmin = ymin = std::numeric_limits<double>::infinity();
    xmax = ymax = -xmin;
    const auto take = [&](double x, double y) {
      xmin = std::min(xmin, x), xmax = std::max(xmax, x);
      ymin = std::min(ymin, y), ymax = std::max(ymax, y);
    };
    for (const auto& w : run.wells) take(w.x, w.y);
    for (const auto& seg : run.segments)
      for (const auto& v : seg.trace.vertices) take(v.x, v.y);
    xmin = std::floor((xmin - g.margin) / g.cell_size) * g.cell_size;
    ymin = std::floor((ymin - g.margin) / g.cell_size) * g.cell_size;
    xmax = std::ceil((xmax + g.margin) / g.cell_size) * g.cell_size;
    ymax = std::ceil((ymax + g.margin) / g.cell_size) * g.cell_size;
    const double cells = (xmax - xmin) / g.cell_size * (ymax - ymin) / g.cell_size;
    if (cells > 2.5e7)
      throw InputError("output.grid.cell_size", std::to_string(g.cell_size) + " m",
                       "a cell size giving at most 25 million cells over the automatic extent", s.file);
  }
  return geometry::grid_from_extent(xmin, ymin, xmax, ymax, g.cell_size);
}

formats::Crs working_crs_of(const scenario::RegionSpec& r) {
  try {
    return formats::working_crs(r.crs, "crs");
  } catch (const InputError& e) {
    throw e.located(r.file);
  }
}

// Wells into the working CRS (one transformer per distinct CRS).
std::vector<scenario::WellSpec> wells_in(const formats::Crs& working, const scenario::ResolvedScenario& s) {
  std::vector<scenario::WellSpec> out;
  std::map<std::string, formats::Transformer> transformers;
  for (scenario::WellSpec w : s.wells) {
    try {
      auto it = transformers.find(w.crs);
      if (it == transformers.end())
        it = transformers.emplace(w.crs, formats::Transformer(formats::Crs::from_user_string(w.crs, "crs"), working)).first;
      const geometry::Point2 p = it->second({w.x, w.y}, "well location");
      // A transformation outside a projection's domain may give no finite place at all.
      if (!scenario::plausible::kProjectedCoordinate.contains(p.x) ||
          !scenario::plausible::kProjectedCoordinate.contains(p.y))
        throw InputError("location", scenario::plausible::number_as_read(w.x) + ", " +
                                         scenario::plausible::number_as_read(w.y) + " (" + w.crs + ")",
                         "a place that " + s.region.crs + " can hold (" +
                             scenario::plausible::kProjectedCoordinate.expected + "); it became (" +
                             scenario::plausible::number_as_read(p.x) + ", " + scenario::plausible::number_as_read(p.y) +
                             ")");
      w.x = p.x;
      w.y = p.y;
      w.crs = s.region.crs;
    } catch (const InputError& e) {
      throw e.located(w.source + " (well '" + w.id + "')");
    }
    out.push_back(std::move(w));
  }
  return out;
}

// Faults: read, reproject, segment; the fault count, and the meridian convergence at their centre.
void read_faults(const scenario::ResolvedScenario& s, bool allow_network, PreparedRun& run) {
  const scenario::RegionSpec& r = s.region;
  formats::FaultFileOptions fo;
  fo.attributes.id = r.faults.id_attribute;
  fo.attributes.dip = r.faults.dip_attribute;
  fo.attributes.dip_direction = r.faults.dip_direction_attribute;
  fo.attributes.dips_to = r.faults.dips_to_attribute;
  fo.attributes.friction = r.faults.friction_attribute;
  // a fault's own depth range: read for the screen in depth only (elsewhere such fields are ignored)
  fo.attributes.top = r.formation.poroelastic_3d ? r.faults.top_attribute : "";
  fo.attributes.bottom = r.formation.poroelastic_3d ? r.faults.bottom_attribute : "";
  fo.max_depth_m = scenario::plausible::kMaxDepth;
  if (!std::isnan(r.faults.default_dip)) fo.attributes.default_dip_rad = r.faults.default_dip;
  fo.layer = r.faults.layer;
  if (!r.faults.crs.empty()) fo.source_crs = r.faults.crs;
  fo.max_segment_length_m = r.faults.segment_length;
  fo.check_points = r.faults.check_points;
  fo.allow_network = allow_network;
  fo.allow_folded = r.faults.allow_folded;
  run.segments = formats::is_fault_table(r.faults.path)
                     ? formats::read_fault_table(r.faults.path, formats::display_name(r.faults.path), run.working,
                                                 r.faults.crs, r.faults.segment_length, r.faults.check_points,
                                                 scenario::plausible::kMaxDepth)
                     : formats::read_fault_segments(r.faults.path, run.working, fo);
  if (run.segments.empty())
    throw InputError("faults", formats::display_name(r.faults.path), "a fault map with at least one fault", r.file);
  std::set<std::string> ids;
  for (const auto& seg : run.segments) ids.insert(seg.fault_id);
  run.fault_count = ids.size();
  // [uncertainty.fault."id"] names faults of this map (checked before any computing).
  scenario::check_fault_ids(s.uncertainty, std::vector<std::string>(ids.begin(), ids.end()));

  // Meridian convergence: strikes come from the map (grid azimuths); SHmax is a true azimuth.
  double cx = 0, cy = 0;
  for (const auto& seg : run.segments) cx += seg.trace.centre.x, cy += seg.trace.centre.y;
  cx /= double(run.segments.size());
  cy /= double(run.segments.size());
  run.convergence_rad = formats::grid_convergence_rad(run.working, {cx, cy});
}

// The screen's inputs: stress, friction, formation and boundaries, wells with their rate
// histories, segments with true-north strikes, output and tracking times.
screen::ScreenInputs screen_inputs(const scenario::ResolvedScenario& s, const PreparedRun& run) {
  const scenario::RegionSpec& r = s.region;
  screen::ScreenInputs in{};
  in.stress = stress_at_reference_depth(r);
  in.friction = {r.faults.friction, r.faults.cohesion};
  if (r.stress.poroelastic_path) in.stress_path_kappa = stress_path_kappa_of(r.stress);
  in.formation = [&] {
    try {
      return theis_parameters_of(r.formation);
    } catch (const InputError& e) {
      throw e.located(r.file + " [formation]");
    }
  }();
  for (const auto& b : r.formation.boundaries)
    in.boundaries.push_back({b.kind == scenario::BoundarySpec::Kind::no_flow ? hydro::BoundaryKind::no_flow
                                                                    : hydro::BoundaryKind::constant_pressure,
                             b.x1, b.y1, b.x2 - b.x1, b.y2 - b.y1});
  std::vector<double> changes;
  for (const auto& w : run.wells) {
    screen::ScreenWell sw{w.id, w.x, w.y, w.radius, {}};
    try {
      sw.history = rate_history_of(w);
    } catch (const InputError& e) {
      throw e.located(w.source + " (well '" + w.id + "')");
    }
    for (double t : sw.history.start_times()) changes.push_back(t);
    in.wells.push_back(std::move(sw));
  }
  const formats::MeridianConvergence convergence(run.working);
  for (const auto& seg : run.segments) {
    const double conv = convergence(seg.trace.centre);
    in.segments.push_back({seg.segment_id, seg.strike_rad - conv, seg.dip_rad, seg.trace.check_points, seg.friction});
  }
  in.output_times = s.output.times;
  in.tracking_times = screen::tracking_grid(changes, in.output_times);
  in.all_well_shares = s.output.tables;  // well_shares.csv; otherwise the leading wells are enough
  return in;
}

// The manifest's inputs, and the [catalog] read now, so that a bad column mapping stops the run
// before any computing.
void add_manifest_inputs_and_catalog(const scenario::ResolvedScenario& s, PreparedRun& run) {
  const scenario::RegionSpec& r = s.region;
  run.manifest_inputs.push_back({"scenario", s.path, s.file});
  run.manifest_inputs.push_back({"region", r.path, r.file});
  if (!s.wells_file.empty()) run.manifest_inputs.push_back({"wells", s.wells_path, s.wells_file});
  if (!s.histories_file.empty()) run.manifest_inputs.push_back({"histories", s.histories_path, s.histories_file});
  run.manifest_inputs.push_back({"fault map", r.faults.path, formats::display_name(r.faults.path)});
  if (s.observations)
    if (!s.observations->pressure_path.empty())  // seismicity only: no pressure file
      run.manifest_inputs.push_back({"pressure observations", s.observations->pressure_path, s.observations->pressure_file});
  if (!s.catalog) return;
  const scenario::CatalogSpec& c = *s.catalog;
  run.manifest_inputs.push_back({"catalog", c.path, c.file});
  try {
    run.catalog = formats::read_catalog(c.path.string(), c.format_kind, c.column_map, c.strict);
  } catch (const InputError& e) {
    throw e.located(c.where);  // the scenario's [catalog] key, then the catalog file's own line
  }
  run.catalog->path = c.file;
}

}  // namespace

PreparedRun prepare_run(const scenario::ResolvedScenario& s, bool allow_network) {
  PreparedRun run{working_crs_of(s.region), {}, {}, {}, {}, 0.0, {}, 0, std::nullopt};
  run.wells = wells_in(run.working, s);
  read_faults(s, allow_network, run);
  if (!s.allow_outside)
    check_wells_in_area(study_area(run.segments, s.output.grid, scenario::plausible::kStudyAreaMargin), s.wells,
                        run.wells, s.region.crs, run.segments);
  run.inputs = screen_inputs(s, run);
  if (s.output.rasters) run.grid = output_grid(s, run);
  add_manifest_inputs_and_catalog(s, run);
  return run;
}

std::vector<hydro::GridSource> grid_sources(const PreparedRun& p) {
  std::vector<hydro::GridSource> sources;
  for (const auto& w : p.inputs.wells) {
    if (w.history.empty()) continue;
    for (const auto& img : hydro::image_wells(w.x, w.y, p.inputs.boundaries)) {
      hydro::GridSource src{img.x, img.y, w.history.start_times(), w.history.rates()};
      for (double& q : src.rate) q *= img.sign;
      sources.push_back(std::move(src));
    }
  }
  return sources;
}

hydro::GridGeometry grid_geometry(const geometry::RasterGrid& g) {
  return {g.x_origin, g.y_origin, g.cell_size, -g.cell_size, static_cast<std::size_t>(g.columns),
          static_cast<std::size_t>(g.rows)};
}

hydro::GridFormation grid_formation(const PreparedRun& p) {
  double radius = 1.0;
  for (const auto& w : p.wells) radius = std::min(radius, w.radius);
  return {p.inputs.formation.pressure_per_rate, p.inputs.formation.diffusivity, radius};
}

}  // namespace slipscreen::screening
