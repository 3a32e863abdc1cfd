#include "core/seismo/catalog_summary.hpp"

#include <algorithm>
#include <cmath>

#include "core/errors.hpp"
#include "core/seismo/moment_bound.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::seismo {

namespace {

// Event count, time span, magnitude range and the frequency-magnitude distribution.
void describe_events(CatalogSummary& s, const std::vector<double>& mags, const std::vector<double>& ts,
                     const SummaryOptions& o) {
  s.events = mags.size();
  if (mags.empty()) return;
  s.first_time = *std::min_element(ts.begin(), ts.end());
  s.last_time = *std::max_element(ts.begin(), ts.end());
  s.min_magnitude = *std::min_element(mags.begin(), mags.end());
  s.max_magnitude = *std::max_element(mags.begin(), mags.end());
  s.fmd = frequency_magnitude_distribution(mags, o.bin_width);
}

// Magnitude of completeness: given, or by maximum curvature (Wiemer & Wyss 2000; completeness.hpp).
void estimate_completeness(CatalogSummary& s, const std::vector<double>& mags, const SummaryOptions& o) {
  if (o.fixed_mc) {
    s.mc = *o.fixed_mc;
    s.has_mc = true;
    s.mc_given = true;
  } else if (!mags.empty()) {
    s.completeness = maximum_curvature(mags, o.bin_width, o.mc_correction);
    s.mc = s.completeness->mc;
    s.has_mc = true;
  } else {
    s.mc_note = "no events after filtering: Mc not estimated";
  }
  const double tol = 1e-9 * std::max(1.0, o.bin_width);
  if (s.has_mc)
    s.events_at_or_above_mc = static_cast<std::size_t>(
        std::count_if(mags.begin(), mags.end(), [&](double m) { return m >= s.mc - tol; }));
}

// b-value by maximum likelihood (Aki 1965, Utsu's binning correction; b_value.hpp) and its
// bootstrap interval when asked for.
void estimate_b_value(CatalogSummary& s, const std::vector<double>& mags, const SummaryOptions& o) {
  if (!s.has_mc) {
    s.b_note = "no Mc: b-value not estimated";
  } else if (s.events_at_or_above_mc < 2) {
    s.b_note = std::to_string(s.events_at_or_above_mc) + " event(s) at or above Mc = " + util::number_text(s.mc, 3) +
               ": at least 2 are needed for a b-value";
  } else {
    try {
      s.b = b_value(mags, s.mc, o.bin_width);
      if (s.b->n < 50)
        s.b_note = "only " + std::to_string(s.b->n) +
                   " events at or above Mc: the b-value is poorly constrained (practice: 50 or more)";
    } catch (const InputError& e) {
      s.b_note = std::string("b-value not estimated: ") + e.what();
    }
  }
  if (o.bootstrap_resamples > 0) {
    if (s.b) {
      s.bootstrap = bootstrap_b_value(mags, s.mc, o.bin_width, o.bootstrap_resamples, o.bootstrap_confidence, o.seed);
    } else {
      s.bootstrap_note = "no b-value: bootstrap not run";
    }
  }
}

// Upper bound on the seismic moment from the net injected volume (McGarr 2014; moment_bound.hpp).
void mcgarr_bound(CatalogSummary& s, const SummaryOptions& o) {
  s.shear_modulus = o.shear_modulus;
  if (o.net_volume) {
    s.net_volume = *o.net_volume;
    s.mcgarr_moment = mcgarr_max_moment(o.shear_modulus, *o.net_volume);
    if (*s.mcgarr_moment > 0.0) s.mcgarr_mw = moment_magnitude(*s.mcgarr_moment);
  }
}

// Seismogenic index (Shapiro et al. 2010; seismogenic_index.hpp) fitted to the volume history.
void fit_index(CatalogSummary& s, const std::vector<double>& ts, const std::vector<double>& mags,
               const SummaryOptions& o) {
  if (!o.volume_history) {
    s.seismogenic_index_note = "no injected-volume history given: seismogenic index not fitted";
    return;
  }
  validate(*o.volume_history);
  if (!s.b) {
    s.seismogenic_index_note = "no b-value: seismogenic index not fitted";
    return;
  }
  try {
    s.seismogenic_index = fit_seismogenic_index(ts, mags, *o.volume_history, s.mc, s.b->b, s.b->sigma);
  } catch (const InputError& e) {
    s.seismogenic_index_note = std::string("seismogenic index not fitted: ") + e.what();
  }
}

// Expected count and probability of at least one event at or above each forecast magnitude for
// the planned volume (Shapiro et al. 2010; seismogenic_index.hpp).
void forecast(CatalogSummary& s, const SummaryOptions& o) {
  if (!o.planned_volume) {
    s.forecast_note = "no planned volume given: no forecast";
    return;
  }
  if (!(*o.planned_volume >= 0.0))
    throw InputError("planned volume", util::number_text(*o.planned_volume, 6), "a volume >= 0 m3");
  if (!s.seismogenic_index) {
    s.forecast_note = "no seismogenic index: no forecast";
    return;
  }
  for (double m : o.forecast_magnitudes) {
    Forecast f;
    f.magnitude = m;
    f.planned_volume = *o.planned_volume;
    f.expected = expected_event_count(s.seismogenic_index->sigma, s.b->b, m, f.planned_volume);
    f.probability = probability_at_least_one(f.expected);
    s.forecasts.push_back(f);
  }
}

std::vector<std::string> assumptions(const SummaryOptions& o, const std::string& regression) {
  return {
      "Mc by maximum curvature (Wiemer & Wyss 2000)" +
          std::string(o.mc_correction != 0.0 ? " plus a correction of " + util::number_text(o.mc_correction, 3) : "") +
          "; magnitudes binned at " + util::number_text(o.bin_width, 3) + ".",
      "b-value: Aki (1965) maximum likelihood with Utsu's binning correction; uncertainty Shi & Bolt (1982).",
      "Magnitudes of different types are treated as one scale unless filtered by type.",
      "Seismogenic index (Shapiro et al. 2010): event count at or above Mc proportional to the cumulative "
      "injected volume, Gutenberg-Richter magnitudes with the fitted b, events independent (Poisson); valid "
      "during injection, not after shut-in.",
      "Forecasts assume the planned injection behaves like the past one in the same rocks (same Σ and b) and "
      "do not include the uncertainty of Σ and b unless stated.",
      "McGarr (2014) bound M0 <= G·ΔV assumes the earthquake is driven by the injected volume; ruptures "
      "running away on tectonic stress can exceed it.",
      "Length-magnitude bounds assume rupture of the whole mapped fault (" + regression + ").",
  };
}

}  // namespace

CatalogSummary summarize_catalog(const Catalog& catalog, const SummaryOptions& o) {
  if (!(o.bin_width > 0.0)) throw InputError("bin width", util::number_text(o.bin_width, 6), "a positive magnitude bin width");
  CatalogSummary s;
  const auto mags = magnitudes(catalog);
  const auto ts = times(catalog);
  describe_events(s, mags, ts, o);
  estimate_completeness(s, mags, o);
  estimate_b_value(s, mags, o);
  mcgarr_bound(s, o);
  fit_index(s, ts, mags, o);
  forecast(s, o);

  // Per-fault length bound (Wells & Coppersmith 1994; rupture_length_magnitude.hpp).
  s.regression = regression_name(o.regression);
  for (const auto& f : o.faults) s.fault_bounds.push_back({f.name, f.length, magnitude_from_length(f.length, o.regression)});
  s.assumptions = assumptions(o, s.regression);
  return s;
}

}  // namespace slipscreen::seismo
