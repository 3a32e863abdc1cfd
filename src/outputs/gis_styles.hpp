#pragma once
// The run's symbology for GIS (docs/gis.md, "How the layers open"): the default styles kept in
// screen.gpkg's layer_styles table and the sidecar <raster>.qml of each GeoTIFF. The colours:
// - probability: viridis (matplotlib's perceptually uniform, colour-blind-safe ramp; van der Walt
//   & Smith 2015), sampled at 6 points from matplotlib 3.6;
// - Δp: inferno from 0.2 to 1 (matplotlib; the near-black end dropped so that the faults drawn on
//   it stay visible), 7 points;
// - deterministic margin: cividis reversed (Nuñez et al. 2018), 6 points, the smallest margin
//   brightest;
// - categories (well status, footprint, events): the Okabe & Ito (2008) colour-blind-safe set.
#include <optional>
#include <string>

#include "formats/gis/geopackage.hpp"
#include "formats/gis/qml.hpp"
#include "outputs/output_units.hpp"

namespace slipscreen::outputs {

// fault_segments, graduated by P(slip) in `field` (probabilities 0..1).
// `time`: the style is time-aware (features shown from its start field until its end field).
formats::LayerStyle segments_by_probability(const formats::VectorLayer& layer, const std::string& field,
                                            const std::string& what,
                                            const std::optional<formats::TemporalFields>& time = {});
// fault_segments, graduated by the margin Δp_crit − Δp in `field` (in the pressure unit of `u`:
// the classes are the MPa classes converted, labelled in that unit).
formats::LayerStyle segments_by_margin(const formats::VectorLayer& layer, const std::string& field,
                                       const std::string& what, const OutputUnits& u);
// A line layer graduated by Δp in `field` (in the pressure unit of `u`), the classes of the Δp
// raster converted.
formats::LayerStyle lines_by_dp(const formats::VectorLayer& layer, const std::string& field, const std::string& what,
                                const OutputUnits& u, const std::optional<formats::TemporalFields>& time = {});
// wells, categorized by `status`, proposed wells as large stars.
formats::LayerStyle wells_by_status(const formats::VectorLayer& layer);
// earthquakes, graduated in size by `magnitude`.
formats::LayerStyle earthquakes_by_magnitude(const formats::VectorLayer& layer);
// The Δp footprint polygons: a translucent fill, time-aware.
formats::LayerStyle footprint_style(const formats::VectorLayer& layer, const formats::TemporalFields& time);

// Sidecar QML of the rasters: `band` (the last output time's) in pseudocolour, in the classes
// and colours of the line styles.
std::string pressure_raster_qml(int band);     // Δp, MPa (the GeoTIFFs stay in SI)
std::string probability_raster_qml(int band);  // P(slip), 0..1

}  // namespace slipscreen::outputs
