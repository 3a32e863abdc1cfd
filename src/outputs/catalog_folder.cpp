#include "outputs/catalog_folder.hpp"

#include <sstream>

#include "core/caution.hpp"
#include "core/util/number_text.hpp"
#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"
#include "formats/table/iso_time.hpp"
#include "outputs/rt_tables.hpp"
#include "outputs/run_readme.hpp"

namespace slipscreen::outputs {

nlohmann::json rt_view_json(const screening::RtView& v) {
  nlohmann::json j = {{"method", "triggering front r = sqrt(4 pi D t) (Shapiro et al. 1997)"},
                      {"well", {v.position[0], v.position[1]}},
                      {"start", formats::format_iso8601_utc(v.start)},
                      {"events_after_start", v.points.size()}};
  nlohmann::json fr = nlohmann::json::array();
  for (std::size_t i = 0; i < v.diffusivities.size(); ++i)
    fr.push_back({{"diffusivity_m2_per_s", v.diffusivities[i]}, {"fraction_inside", v.fraction_inside[i]}});
  j["fronts"] = fr;
  return j;
}

std::string catalog_events_csv(const seismo::Catalog& c, const OutputUnits& u) {
  using formats::csv_field;
  const bool geographic = c.kind == seismo::CoordinateKind::geographic;
  std::ostringstream ev;
  ev << "event_id,time," << (geographic ? "longitude_deg,latitude_deg" : "x_m,y_m")
     << ',' << u.column("depth", Quantity::length) << ",magnitude,magnitude_type\n";
  for (const auto& e : c.events)
    ev << csv_field(e.id) << "," << formats::format_iso8601_utc(e.time) << "," << util::number_text(e.x, 10) << ","
       << util::number_text(e.y, 10) << "," << (e.depth ? util::number_text(u.value(*e.depth, Quantity::length), 8) : "") << ","
       << util::number_text(e.magnitude, 4) << "," << csv_field(e.magnitude_type) << "\n";
  return ev.str();
}

void write_catalog_folder(const formats::RunFolder& folder, const nlohmann::json& summary, const seismo::Catalog& c,
                          const std::optional<screening::RtView>& rt, const CatalogFolderRecord& record) {
  formats::write_text_file(folder.output("catalog", "catalog_summary.json"),
                           summary.dump(2, ' ', false, nlohmann::json::error_handler_t::replace) + "\n");
  const OutputUnits u(record.units);
  formats::write_text_file(folder.output("catalog", "catalog_events.csv"), catalog_events_csv(c, u));
  ReadmeContent readme;
  readme.title = "slipscreen catalog review";
  readme.facts = {"Catalog: " + summary["catalog"]["path"].get<std::string>() + " (" +
                      summary["catalog"]["format"].get<std::string>() + ", coordinates in " + c.crs + ")",
                  std::string("Screens run: catalog review") + (rt ? "; r-t view" : ""),
                  readme_units_line(u, "coordinates in the catalog's; the JSON files in SI")};
  readme.oilfield_units = record.units == units::UnitSystem::oilfield;
  readme.files = {{"catalog_summary.json", "catalog review: counts, unusable records, completeness, b-value, bounds, "
                                           "seismogenic index, forecasts, assumptions"},
                  {"catalog_events.csv", "the kept events, coordinates in " + c.crs}};
  if (rt) {
    formats::write_text_file(folder.output("catalog", "rt_events.csv"), rt_events_csv(c, *rt, u));
    formats::write_text_file(folder.output("catalog", "rt_fronts.csv"), rt_fronts_csv(*rt, u));
    readme.files.push_back({"rt_events.csv", rt_events_description(*rt)});
    readme.files.push_back({"rt_fronts.csv", rt_fronts_description(*rt)});
  }
  write_readme(folder, readme);

  formats::ManifestContent m;
  m.command_line = record.command_line;
  m.caution = kScreeningCaution;
  m.inputs = record.inputs;
  m.screens = {{"deterministic", false}, {"probabilistic", false}, {"pressure_map", false},
               {"catalog_review", true}, {"rt_view", rt.has_value()}};
  m.parameters = {{"catalog", {{"format", summary["catalog"]["format"]}, {"columns", summary["catalog"]["columns"]}}},
                  {"units", std::string(units::unit_system_name(record.units))}};
  formats::write_manifest(folder.output("manifest", "manifest.json"), m, folder.staging());
}

}  // namespace slipscreen::outputs
