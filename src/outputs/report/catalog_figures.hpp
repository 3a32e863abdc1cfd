#pragma once
// The catalog figures of the report (docs/report.md, "Stress and catalog figures"), drawn from
// the catalog review's files in a finished run folder (docs/catalogs.md):
//
//   catalog_magnitude_time       every reviewed event's magnitude against its origin time, with Mc
//   catalog_frequency_magnitude  incremental and cumulative counts per magnitude bin (log axis),
//                                Mc and the Gutenberg-Richter line log10 N(≥M) = a − bM of the
//                                Aki-Utsu fit (catalog_summary.json)
//   catalog_volume               events at or above Mc against the volume injected since the
//                                seismogenic index's window start, with the fit
//                                N = ΔV·10^(Σ − b·Mc) (Shapiro et al. 2010; injected_volume.csv)
//   catalog_rt                   distance from the r–t well against time since its first
//                                injection, with the triggering fronts r = √(4πDt) (rt_*.csv)
//   catalog_event_map            the events over Δp at the last output time (pressure_change.tif),
//                                the footprint (Δp ≥ the review's threshold) outlined, faults
//                                and wells from screen.gpkg
#include <vector>

#include "outputs/report/figure.hpp"

namespace slipscreen::outputs::report {

// Empty when the run had no catalog review; each figure only when its files exist (no r–t
// view, no volume history, no raster: that figure is left out). Throws InputError / IoError
// naming the file when a file the figures need is malformed.
std::vector<Figure> catalog_figures(const ReportSource& source);

}  // namespace slipscreen::outputs::report
