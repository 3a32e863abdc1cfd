// The observed earthquakes of a conditioned run; see seismicity_likelihood.hpp.
#include "screening/seismicity_likelihood.hpp"

#include <algorithm>
#include <cmath>

#include "core/errors.hpp"
#include "core/seismo/catalog_summary.hpp"
#include "core/seismo/nearest_fault.hpp"
#include "core/util/number_text.hpp"
#include "formats/table/iso_time.hpp"
#include "screening/catalog_review.hpp"

namespace slipscreen::screening {

std::optional<SeismicityUse> seismicity_use(const scenario::ResolvedScenario& s, const PreparedRun& p) {
  if (!s.observations || !s.observations->seismicity) return std::nullopt;
  const scenario::ObservationsSpec& obs = *s.observations;
  const scenario::CatalogSpec& c = *s.catalog;  // the scenario reader requires [catalog] and its rate_state
  SeismicityUse u;
  u.distance = obs.seismicity_distance;
  const seismo::FilterResult kept = filtered_catalog(s, p);
  const seismo::Catalog& catalog = kept.catalog;
  u.catalog_events = catalog.events.size();

  // Mc as the catalog review computes it (given, or by maximum curvature with its correction).
  seismo::SummaryOptions so;
  so.bin_width = c.bin_width;
  so.mc_correction = c.mc_correction;
  so.fixed_mc = c.mc;
  const seismo::CatalogSummary summary = seismo::summarize_catalog(catalog, so);
  if (!summary.has_mc)
    throw InputError("observations.seismicity", "true",
                     "a catalog with a magnitude of completeness (" + summary.mc_note +
                         "): give [catalog] mc or events after the filters",
                     obs.seismicity_where);
  u.mc = summary.mc;
  const double tol = 1e-9 * std::max(1.0, c.bin_width);  // the catalog summary's comparison with Mc

  auto& d = u.data;
  d.injection_start = first_injection_time(s, p);
  d.t0 = std::max(d.injection_start, c.from.value_or(d.injection_start));
  double end = s.output.times.back();
  if (c.to) end = *c.to;
  else if (!catalog.events.empty()) end = seismo::times(catalog).back();
  d.t1 = std::min(end, s.output.times.back());
  if (!(d.t1 > d.t0))
    throw InputError("observations.seismicity", "true",
                     "a catalog period that extends after the first injection (" +
                         formats::format_iso8601_utc(d.t0) + ") and before the last output time: it ends " +
                         formats::format_iso8601_utc(d.t1),
                     obs.seismicity_where);

  const std::vector<seismo::FaultTrace> traces = segment_traces(p);
  const std::vector<seismo::NearestFault> nearest =
      traces.empty() || catalog.events.empty() ? std::vector<seismo::NearestFault>(catalog.events.size())
                                               : seismo::nearest_faults(catalog, traces);
  for (std::size_t e = 0; e < catalog.events.size(); ++e) {
    const auto& ev = catalog.events[e];
    if (!(ev.magnitude >= u.mc - tol)) {
      ++u.below_mc;
      continue;
    }
    if (!(ev.time >= d.t0 && ev.time <= d.t1)) {
      ++u.outside_window;
      continue;
    }
    seismo::AssignedEvent a{ev.time, seismo::kBackgroundPool};
    if (!traces.empty() && nearest[e].distance <= u.distance) a.segment = nearest[e].segment;
    (a.segment == seismo::kBackgroundPool ? u.pool : u.assigned) += 1;
    d.events.push_back(a);
  }
  u.used = d.events.size();
  d.pool_rate = static_cast<double>(u.pool) / (d.t1 - d.t0);  // maximum likelihood; 0 with no pool event
  for (const auto& seg : p.segments) d.segment_length.push_back(seg.trace.length_m);
  d.stressing_rate = c.a_sigma / c.aftershock_duration;  // τ̇_r = Aσ / t_a ([catalog.rate_state])
  return u;
}

}  // namespace slipscreen::screening
