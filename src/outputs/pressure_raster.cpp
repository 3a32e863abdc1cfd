#include "outputs/pressure_raster.hpp"

#include "core/caution.hpp"
#include "formats/gis/geotiff.hpp"
#include "outputs/gis_styles.hpp"
#include "outputs/output_text.hpp"
#include "outputs/styled_raster.hpp"

namespace slipscreen::outputs {

std::vector<ReadmeFile> pressure_raster_readme(const scenario::ResolvedScenario& s) {
  std::vector<ReadmeFile> r{
      {s.output.files.pressure_raster,
       "pressure map: GeoTIFF of the pore-pressure change dp (MPa) over the output grid, one band per output time"}};
  for (auto& f : style_sidecar_readme(s.output.files.pressure_raster)) r.push_back(std::move(f));
  return r;
}

void write_pressure_raster(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                           const screening::PreparedRun& p, const screening::PressureMap& map) {
  std::vector<formats::RasterBand> bands(map.dp.size());
  for (std::size_t k = 0; k < bands.size(); ++k) {
    bands[k].description = util::format_iso_date(s.output.dates[k]);
    bands[k].values.resize(map.dp[k].size());
    for (std::size_t c = 0; c < map.dp[k].size(); ++c) bands[k].values[c] = static_cast<float>(map.dp[k][c] / kMPa);
  }
  formats::GeoTiffOptions opt;
  opt.cloud_optimized = s.output.cog;
  opt.unit = "MPa";
  opt.metadata = {{"QUANTITY", s.region.formation.leaky
                                    ? "pore-pressure change from injection (Hantush-Jacob leaky superposition), MPa"
                                    : "pore-pressure change from injection (Theis superposition), MPa"},
                  {"CAUTION", kScreeningCaution},
                  {"SCENARIO", s.file}};
  write_styled_geotiff(folder, "output.files.pressure_raster", s.output.files.pressure_raster, p.grid, p.working,
                       bands, opt, pressure_raster_qml(static_cast<int>(bands.size())));
}

}  // namespace slipscreen::outputs
