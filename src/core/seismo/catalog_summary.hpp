#pragma once
// The catalog review on its own: completeness, b-value, bounds on the largest magnitude,
// seismogenic index and forecasts, gathered into one value for reports (console, JSON).
// Each statistic is either computed or carries the reason it was not (too few events, no
// volume history...), so a summary never holds NaN. The scenario run calls the same function
// and adds the events-against-model attributes beside it.
#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/seismo/b_value.hpp"
#include "core/seismo/catalog.hpp"
#include "core/seismo/completeness.hpp"
#include "core/seismo/rupture_length_magnitude.hpp"
#include "core/seismo/seismogenic_index.hpp"

namespace slipscreen::seismo {

struct MappedFaultLength {
  std::string name;
  double length = 0.0;  // m
};

struct SummaryOptions {
  double bin_width = 0.1;                 // ΔM
  double mc_correction = 0.0;             // added to Mc(MAXC), e.g. 0.2
  std::optional<double> fixed_mc;         // use this Mc instead of estimating it
  std::size_t bootstrap_resamples = 0;    // 0: no bootstrap
  double bootstrap_confidence = 0.95;
  std::uint64_t seed = 1;
  std::optional<double> net_volume;       // m³, for the McGarr bound
  double shear_modulus = 3.0e10;          // Pa (30 GPa: common practice for crustal rock)
  std::optional<VolumeHistory> volume_history;  // for Σ (times on the catalog's epoch-second axis)
  std::optional<double> planned_volume;   // m³ of further injection, for forecasts
  std::vector<double> forecast_magnitudes = {3.0, 4.0};
  std::vector<MappedFaultLength> faults;  // for the per-fault length bound
  LengthRegression regression = LengthRegression::surface_rupture_length_all;
};

struct Forecast {
  double magnitude = 0.0;
  double planned_volume = 0.0;  // m³
  double expected = 0.0;        // N(>=M)
  double probability = 0.0;     // P(>=1), Poisson
};

struct FaultBound {
  std::string name;
  double length = 0.0;  // m
  LengthMagnitude estimate;
};

struct CatalogSummary {
  std::size_t events = 0;
  std::optional<double> first_time, last_time;       // s since epoch
  std::optional<double> min_magnitude, max_magnitude;
  std::vector<MagnitudeBin> fmd;                     // frequency-magnitude distribution

  std::optional<Completeness> completeness;  // absent when Mc was given or no events
  double mc = 0.0;                           // Mc used (estimated or given); valid if has_mc
  bool has_mc = false;
  bool mc_given = false;
  std::string mc_note;                       // why Mc is missing, if it is
  std::size_t events_at_or_above_mc = 0;

  std::optional<BValueEstimate> b;
  std::string b_note;
  std::optional<BootstrapInterval> bootstrap;
  std::string bootstrap_note;

  std::optional<double> mcgarr_moment;       // N·m
  std::optional<double> mcgarr_mw;
  double shear_modulus = 0.0;
  double net_volume = 0.0;

  std::optional<SeismogenicIndexFit> seismogenic_index;
  std::string seismogenic_index_note;
  std::vector<Forecast> forecasts;
  std::string forecast_note;

  std::vector<FaultBound> fault_bounds;
  std::string regression;                    // name of the length regression used

  std::vector<std::string> assumptions;      // stated with every summary
};

// Computes everything the inputs allow. Throws InputError only for invalid options (bin width,
// correction, negative volumes, a bad volume history, fault lengths <= 0); shortage of events
// is reported in the notes instead.
CatalogSummary summarize_catalog(const Catalog& catalog, const SummaryOptions& options);

}  // namespace slipscreen::seismo
