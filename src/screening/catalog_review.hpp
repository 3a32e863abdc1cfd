#pragma once
// The catalog review inside a scenario run ([catalog] in the scenario; docs/catalogs.md): the
// catalog's own statistics (core/seismo/catalog_summary.hpp) with the scenario's volumes, and
// every event weighed against the model.
//
// Events against the model (per event, in the working CRS):
//   Δp at the epicentre and origin time     hydro::PressureField, exact Theis superposition
//                                           with image wells (Theis 1935)
//   nearest fault segment and distance      seismo::nearest_faults (planar, map distance)
//   that segment's Δp, Δp_crit, whether the deterministic screen has it reach Δp_crit by the
//   event time, and its injection-induced P(slip) at the last output time at or before the
//   event, with the Wilson interval (when the scenario has [uncertainty])
// Footprint against chance: events inside the study area (the output grid's extent) whose own
//   Δp ≥ footprint_threshold, against the number expected if they fell uniformly over the area:
//   Σ_e f(t_e), with f(t) the footprint's area fraction (cells of the coarsened output grid with
//   Δp ≥ threshold at the output times, linear in between; footprint_fraction_at). The p-value is
//   the one-sided binomial tail with the mean fraction: by Hoeffding (1956) the tail of a sum of
//   independent Bernoulli trials above its mean + 1 is at most the binomial tail with the same
//   mean (from memory), so the reported p-value is conservative.
// Seismicity-rate response (Dieterich 1994; core/seismo/rate_state.hpp) per fault segment to
//   ΔCFF(t) = μ Δp(t) (pore pressure only, κ = 0), or with [stress] poroelastic_path the change
//   along the path, |a + bΔp| − |a| + μ(1 − κ sin²δ)Δp (geomech::CoulombPathChange), as in the screen
//   on the screen's tracking grid, with background rate r = rate per km × trace length.
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/screen/deterministic_screen.hpp"
#include "core/seismo/catalog_filter.hpp"
#include "core/seismo/catalog_summary.hpp"
#include "core/seismo/event_footprint.hpp"
#include "core/seismo/nearest_fault.hpp"
#include "core/seismo/rate_state.hpp"
#include "formats/catalog/catalog_file.hpp"
#include "screening/rt_view.hpp"
#include "screening/prepare.hpp"
#include "scenario/scenario.hpp"

namespace slipscreen::screening {

struct ProbabilisticRun;

struct EventAgainstModel {
  double x = 0, y = 0;              // working CRS, m
  bool in_study_area = false;
  double dp = 0;                    // Pa at the epicentre and origin time
  double footprint_fraction = 0;    // f(t_e)
  std::size_t segment = 0;          // nearest segment (index into the prepared run)
  double distance = 0;              // m
  double segment_dp = 0;            // Pa: the segment's Δp at the last tracked time <= t_e
  double segment_dp_crit = 0;       // Pa (+inf: never; <= 0: critical before injection)
  bool segment_reached = false;     // the screen's first crossing is at or before t_e
  std::optional<std::size_t> probability_time;  // output time index used for P(slip)
  double p_slip = 0, p_low = 0, p_high = 0;     // when probability_time is set
  std::optional<double> rt_time, rt_distance;   // s since the r-t well's first injection, m
};

struct SegmentRate {
  double background_rate = 0;             // events/s
  std::vector<seismo::RateSample> samples;  // at the output times
  std::vector<double> dcff;               // Pa, ΔCFF at the output times (μ Δp without a stress path)
  double history_start = 0;               // s: expected counts are from here
  std::vector<double> background_expected;  // events expected at the background rate by each output time
  std::string note;                       // why it is missing (samples empty)
};

// A fault's seismicity-rate response: its segments' rates and expected counts summed, and their
// largest ΔCFF, at each output time (segments without a response are left out).
struct FaultRateSample {
  double max_dcff = 0;             // Pa
  double background_rate = 0, rate = 0;  // events/s
  double expected = 0, background_expected = 0;
};
struct FaultRate {
  std::string fault_id;
  std::vector<FaultRateSample> samples;  // at the output times
};

struct CatalogReview {
  scenario::CatalogSpec spec;
  formats::CatalogReadResult read;              // as read (the file's own CRS)
  seismo::FilterCounts counts;
  seismo::Catalog catalog;             // events kept, in the working CRS
  seismo::CatalogSummary summary;
  std::vector<EventAgainstModel> events;  // one per kept event
  seismo::FootprintCount footprint;    // events inside the study area
  double footprint_expected = 0;       // Σ f(t_e) over those events
  std::vector<double> footprint_fractions;  // per output time
  geometry::RasterGrid footprint_grid;
  std::optional<RtView> rt;            // around the r-t well (working CRS)
  std::vector<SegmentRate> rates;      // per segment, when [catalog.rate_state] is given
  std::vector<FaultRate> fault_rates;  // per fault in order of first appearance, with rates
  std::vector<std::string> segment_ids, segment_faults;  // of the prepared run's segments
  double catalog_end = 0;              // s: the end of the reviewed period (for forecasts)
  // The summed cumulative volume of the scenario wells while the catalog ran, the history the
  // seismogenic index was fitted to (empty when there is none).
  std::optional<seismo::VolumeHistory> volume_history;
  std::vector<std::string> assumptions;
  bool poroelastic_path = false;  // the rates' ΔCFF follows the poroelastic stress path
};

// The [catalog] events (read by prepare_run) in the working CRS, after the [catalog] filters.
seismo::FilterResult filtered_catalog(const scenario::ResolvedScenario& s, const PreparedRun& p);
// The prepared run's segment traces, for seismo::nearest_faults.
std::vector<seismo::FaultTrace> segment_traces(const PreparedRun& p);
// The start of the first injection period of any well (the last output time if none injects).
double first_injection_time(const scenario::ResolvedScenario& s, const PreparedRun& p);

// Reads, reprojects, filters and reviews the scenario's catalog against the screen's results
// (`probabilistic` may be null). Throws InputError / IoError naming the catalog file.
CatalogReview review_catalog(const scenario::ResolvedScenario& s, const PreparedRun& p, const screen::ScreenResult& r,
                             const ProbabilisticRun* probabilistic);

}  // namespace slipscreen::screening
