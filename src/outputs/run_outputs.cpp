#include "outputs/run_outputs.hpp"

#include <cmath>

#include "core/caution.hpp"
#include "core/util/number_text.hpp"
#include "formats/files/manifest.hpp"
#include "outputs/capacity_tables.hpp"
#include "outputs/what_if_table.hpp"
#include "outputs/catalog_review_files.hpp"
#include "outputs/gis_layers.hpp"
#include "outputs/output_text.hpp"
#include "outputs/output_units.hpp"
#include "outputs/pressure_history_table.hpp"
#include "outputs/pressure_raster.hpp"
#include "outputs/probabilistic_tables.hpp"
#include "outputs/run_readme.hpp"
#include "outputs/depth_screen_table.hpp"
#include "outputs/screen_tables.hpp"

namespace slipscreen::outputs {
namespace {

nlohmann::json run_block(const scenario::ResolvedScenario& s, const screening::PreparedRun& p,
                         const screen::ScreenResult& r) {
  const auto& st = p.inputs.stress;
  return {{"screen", "deterministic"},
          {"tracking_grid", screening::kTrackingGridStatement},
          {"tracked_times", r.tracked_times.size()},
          {"faults", p.fault_count},
          {"segments", p.segments.size()},
          {"wells", p.wells.size()},
          {"meridian_convergence_deg", p.convergence_rad * kRadToDeg},
          {"stress_at_reference_depth",
           {{"sv_Pa", st.sv}, {"shmax_Pa", st.shmax}, {"shmin_Pa", st.shmin}, {"pore_pressure_Pa", st.pore_pressure}}},
          {"stress_path", screening::stress_path_statement(s.region.stress)},
          {"theis", {{"diffusivity_m2_per_s", p.inputs.formation.diffusivity},
                     {"pressure_per_rate_Pa_s_per_m3", p.inputs.formation.pressure_per_rate}}},
          {"well_radius_clamped", r.radius_clamped}};
}

// Which screens ran, for the manifest and README.txt.
nlohmann::json screens_json(const RunResults& r) {
  return {{"deterministic", true},
          {"probabilistic", r.probabilistic != nullptr},
          {"pressure_map", r.pressure != nullptr},
          {"catalog_review", r.review != nullptr},
          {"capacity", r.capacity != nullptr},
          {"what_if", r.what_if != nullptr},
          {"rt_view", r.review != nullptr && r.review->rt.has_value()}};
}

std::string screens_text(const RunResults& r) {
  std::string t = "deterministic screen";
  if (r.probabilistic) t += "; probabilistic screen (" + std::to_string(r.probabilistic->result.realizations) + " realizations)";
  if (r.pressure) t += "; pressure map";
  if (r.capacity) t += "; allowable rate";
  if (r.what_if) t += "; what-if rate changes";
  if (r.review) t += "; catalog review";
  if (r.review && r.review->rt) t += "; r-t view";
  return t;
}

ReadmeContent run_readme(const scenario::ResolvedScenario& s, const RunResults& r) {
  ReadmeContent c;
  c.title = "slipscreen run: " + (s.title.empty() ? s.file : s.title);
  std::string dates;
  for (const auto& d : s.output.dates) dates += (dates.empty() ? "" : ", ") + util::format_iso_date(d);
  c.facts = {"Scenario: " + s.file, "Screens run: " + screens_text(r), "Output times: " + dates,
             readme_units_line(OutputUnits(s.output.units),
                               s.output.units == units::UnitSystem::si
                                   ? "coordinates in the working CRS's unit; screen.gpkg, the GeoTIFFs and the JSON "
                                     "files in SI"
                                   : "coordinates in the working CRS's unit; screen.gpkg in these units too; the "
                                     "GeoTIFFs (dp in MPa) and the JSON files in SI")};
  if (s.region.stress.poroelastic_path)
    c.facts.push_back("Stress path: " + screening::stress_path_statement(s.region.stress));
  if (s.region.formation.leaky)
    c.facts.push_back("Formation: leaky (Hantush & Jacob 1955), W(u, r/B) in place of Theis's E1, leakage factor B = " +
                      util::number_text(std::sqrt(r.prepared.inputs.formation.diffusivity /
                                                  r.prepared.inputs.formation.leakage_rate), 6) +
                      " m (docs/pressure.md)");
  if (s.region.formation.poroelastic_3d)
    c.facts.push_back("Formation: poroelastic_3d (Rudnicki 1986): faults screened in depth in fault_depth.csv; the "
                      "other tables, rasters and layers give the injected layer's Theis pressure with the solid's "
                      "diffusivity c = " + util::number_text(r.prepared.inputs.formation.diffusivity, 6) +
                      " m2/s (docs/physics.md)");
  if (r.depth_probability)
    c.facts.push_back("Faults in depth, Monte Carlo: " + std::to_string(r.depth_probability->realizations) +
                      " realizations of the uncertain solid, permeability and friction, one screen in depth each "
                      "(fault_depth_probability.csv; docs/uncertainty.md)");
  const std::string crs = r.prepared.working.authority();
  if (!crs.empty()) c.facts.push_back("Working CRS: " + crs + " (coordinates in metres)");
  if (s.output.report)
    c.facts.push_back("Report: report.html, report.pdf and figures/, written after this file from the run's "
                      "files (docs/report.md); the manifest lists them under \"report\"");
  c.files = screen_tables_readme(s);
  if (s.output.tables && r.history) c.files.push_back(pressure_history_readme(s, r.history->segments.size()));
  for (auto& f : pressure_raster_readme(s)) c.files.push_back(std::move(f));
  if (s.output.geopackage)
    c.files.push_back(gis_layers_readme(s, r.probabilistic != nullptr, r.review != nullptr, r.pressure != nullptr));
  if (r.probabilistic) for (auto& f : probabilistic_readme(*r.probabilistic, s.output.units)) c.files.push_back(std::move(f));
  if (r.capacity) for (auto& f : capacity_readme(*r.capacity)) c.files.push_back(std::move(f));
  if (r.what_if) for (auto& f : what_if_readme(*r.what_if)) c.files.push_back(std::move(f));
  if (r.review) for (auto& f : catalog_review_readme(*r.review)) c.files.push_back(std::move(f));
  if (r.depth && s.output.tables) c.files.push_back(depth_screen_readme(s));
  if (r.depth_probability && s.output.tables) c.files.push_back(depth_probability_readme(s));
  c.manifest = s.output.files.manifest;
  c.oilfield_units = s.output.units == units::UnitSystem::oilfield;
  return c;
}

}  // namespace

void write_run_outputs(const formats::RunFolder& folder, const scenario::ResolvedScenario& s, const RunResults& r,
                       const OutputOptions& o) {
  const auto& p = r.prepared;
  if (s.output.tables) write_screen_tables(folder, s, p, r.screen);
  if (s.output.tables && r.history) write_pressure_history(folder, s, p, *r.history);
  if (s.output.rasters && r.pressure) write_pressure_raster(folder, s, p, *r.pressure);
  if (s.output.geopackage)
    write_gis_layers(folder, s, p, r.screen, o.reproducible, r.probabilistic, r.review, r.pressure);
  if (r.probabilistic) write_probabilistic_outputs(folder, s, p, *r.probabilistic);
  if (r.capacity) write_capacity_tables(folder, s, *r.capacity);
  if (r.what_if) write_what_if_table(folder, s, *r.what_if);
  if (r.review) write_catalog_review(folder, s, p, *r.review);
  if (r.depth && s.output.tables) write_depth_screen_table(folder, s, p, *r.depth);
  if (r.depth_probability && s.output.tables) write_depth_probability_table(folder, s, p, *r.depth_probability);

  write_readme(folder, run_readme(s, r));

  formats::ManifestContent m;
  m.command_line = o.command_line;
  m.screens = screens_json(r);
  m.seed = s.seed;
  m.caution = kScreeningCaution;
  m.include_timestamp = !o.reproducible;
  m.inputs = p.manifest_inputs;
  m.parameters = {{"scenario", scenario::to_json(s, /*with_wells=*/false)}, {"run", run_block(s, p, r.screen)}};
  // The wells one at a time: a statewide review's rate periods would take about 1 GB as JSON.
  m.streamed.push_back({nlohmann::json::json_pointer("/scenario/wells"), s.wells.size(),
                        [&s](std::size_t i) { return scenario::to_json(s.wells[i]); }});
  if (r.probabilistic) m.parameters["probabilistic"] = probabilistic_manifest(s, *r.probabilistic);
  if (r.depth_probability) m.parameters["depth_probability"] = depth_probability_manifest(s, *r.depth_probability);
  if (r.capacity) m.parameters["capacity"] = capacity_manifest(*r.capacity);
  if (r.what_if) m.parameters["what_if"] = what_if_manifest(*r.what_if);
  if (r.review) m.parameters["catalog"] = catalog_manifest(*r.review);
  formats::write_manifest(folder.output("output.files.manifest", s.output.files.manifest), m, folder.staging());
}

}  // namespace slipscreen::outputs
