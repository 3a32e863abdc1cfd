#include "outputs/catalog_folder.hpp"

#include <cstdio>
#include <sstream>

#include "core/caution.hpp"
#include "core/util/number_text.hpp"
#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"
#include "formats/table/iso_time.hpp"
#include "outputs/rt_tables.hpp"

namespace slipscreen::outputs {
namespace {

}  // namespace

nlohmann::json rt_view_json(const screening::RtView& v) {
  nlohmann::json j = {{"method", "triggering front r = sqrt(4 pi D t) (Shapiro et al. 1997)"},
                      {"well", {v.position[0], v.position[1]}},
                      {"start", formats::format_iso8601_utc(v.start)},
                      {"events_after_start", v.points.size()}};
  nlohmann::json fr = nlohmann::json::array();
  for (std::size_t i = 0; i < v.diffusivities.size(); ++i)
    fr.push_back({{"diffusivity_m2_s", v.diffusivities[i]}, {"fraction_inside", v.fraction_inside[i]}});
  j["fronts"] = fr;
  return j;
}

void write_catalog_folder(const formats::RunFolder& folder, const nlohmann::json& summary, const seismo::Catalog& c,
                          const std::optional<screening::RtView>& rt) {
  using formats::csv_field;
  formats::write_text_file(folder.output("catalog", "catalog_summary.json"),
                           summary.dump(2, ' ', false, nlohmann::json::error_handler_t::replace) + "\n");
  std::ostringstream ev;
  ev << "# " << kScreeningCaution << "\n";
  ev << "event_id,time,x,y,depth_m,magnitude,magnitude_type\n";
  for (const auto& e : c.events)
    ev << csv_field(e.id) << "," << formats::format_iso8601_utc(e.time) << "," << util::number_text(e.x, 10) << "," << util::number_text(e.y, 10)
       << "," << (e.depth ? util::number_text(*e.depth, 8) : "") << "," << util::number_text(e.magnitude, 4) << "," << csv_field(e.magnitude_type)
       << "\n";
  formats::write_text_file(folder.output("catalog", "catalog_events.csv"), ev.str());
  if (rt) {
    formats::write_text_file(folder.output("catalog", "rt_events.csv"), rt_events_csv(c, *rt));
    formats::write_text_file(folder.output("catalog", "rt_fronts.csv"), rt_fronts_csv(*rt));
  }
}

}  // namespace slipscreen::outputs
