#include "cli/catalog_report.hpp"

#include <algorithm>
#include <cstdio>
#include <string>
#include <vector>

#include "core/caution.hpp"
#include "core/util/number_text.hpp"
#include "formats/table/iso_time.hpp"

namespace slipscreen::cli {
namespace {

std::string fixed(double v, int decimals) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

}  // namespace

namespace {

// The McGarr (2014) bound and the rupture-length bounds of the largest mapped faults.
using outputs::Quantity;

// A volume or length in the console's units, `digits` significant digits, with its unit.
std::string in_units(const outputs::OutputUnits& u, double si, Quantity q, int digits) {
  return util::number_text(u.value(si, q), digits) + " " + std::string(u.symbol(q));
}

void print_magnitude_bounds(std::ostream& out, const seismo::CatalogSummary& s, std::size_t max_fault_bounds,
                            const outputs::OutputUnits& u) {
  out << "\nLargest-magnitude bounds\n";
  if (s.mcgarr_moment) {
    out << "  McGarr (2014), net volume " << in_units(u, s.net_volume, Quantity::volume, 4) << ", G = " << util::number_text(s.shear_modulus / 1e9, 3)
        << " GPa: M0 <= " << util::number_text(*s.mcgarr_moment, 4) << " N·m";
    if (s.mcgarr_mw) out << ", Mw <= " << fixed(*s.mcgarr_mw, 2) << " (IASPEI 2013)";
    out << "\n";
  } else {
    out << "  McGarr (2014): not computed (give --net-volume)\n";
  }
  std::vector<const seismo::FaultBound*> bounds;
  for (const auto& f : s.fault_bounds) bounds.push_back(&f);
  if (bounds.size() > max_fault_bounds) {
    std::stable_sort(bounds.begin(), bounds.end(), [](const seismo::FaultBound* a, const seismo::FaultBound* b) {
      return a->estimate.magnitude > b->estimate.magnitude;
    });
    bounds.resize(max_fault_bounds);
  }
  for (const seismo::FaultBound* bound : bounds) {
    const seismo::FaultBound& f = *bound;
    out << "  " << f.name << ", " << in_units(u, f.length, Quantity::distance_long, 3) << ": M " << fixed(f.estimate.magnitude, 2) << " ± "
        << fixed(f.estimate.sd, 2) << (f.estimate.extrapolated ? " (length outside the regression's data, extrapolated)" : "")
        << "\n";
  }
  if (bounds.size() < s.fault_bounds.size())
    out << "  ... " << s.fault_bounds.size() - bounds.size() << " more faults in catalog_summary.json\n";
  if (!s.fault_bounds.empty()) out << "  (" << s.regression << "; rupture of the whole fault)\n";
}

// The seismogenic index (Shapiro et al. 2010) and the forecasts for further injection.
void print_seismogenic_index(std::ostream& out, const seismo::CatalogSummary& s, const outputs::OutputUnits& u) {
  out << "\nSeismogenic index (Shapiro et al. 2010): ";
  if (s.seismogenic_index) {
    const auto& f = *s.seismogenic_index;
    out << "Σ = " << fixed(f.sigma, 2) << " ± " << fixed(f.sigma_count_se, 2) << " (count) ± " << fixed(f.sigma_b_se, 2)
        << " (b), from " << f.events << " events >= Mc while " << in_units(u, f.volume, Quantity::volume, 4) << " were injected ("
        << formats::format_iso8601_utc(f.window_start) << " to " << formats::format_iso8601_utc(f.window_end) << ")\n";
  } else {
    out << "not fitted (" << s.seismogenic_index_note << ")\n";
  }
  if (!s.forecasts.empty()) {
    out << "Forecast for a further " << in_units(u, s.forecasts.front().planned_volume, Quantity::volume, 4)
        << " injected:\n";
    for (const auto& f : s.forecasts)
      out << "  M >= " << fixed(f.magnitude, 1) << ": expected " << util::number_text(f.expected, 3) << " events, P(at least one) = "
          << util::number_text(100.0 * f.probability, 3) << " %\n";
    out << "  (Poisson, same Σ and b as observed; uncertainty of Σ and b not included)\n";
  } else {
    out << "Forecast: " << s.forecast_note << "\n";
  }
}

}  // namespace

void print_catalog_summary(std::ostream& out, const formats::CatalogReadResult& read, const seismo::FilterCounts& c,
                   const seismo::CatalogSummary& s, const std::optional<screening::RtView>& rt,
                           std::size_t max_fault_bounds, const outputs::OutputUnits& u) {
  out << "Catalog review: " << read.path << " (" << read.format << ")\n";
  out << kScreeningCaution << "\n";
  if (!read.catalog.description.empty()) out << "File says: " << read.catalog.description << "\n";
  out << "\nRecords: " << read.records << " read, " << read.catalog.events.size() << " usable, " << read.rejected.size()
      << " unusable\n";
  const std::size_t shown = std::min<std::size_t>(read.rejected.size(), 20);
  for (std::size_t i = 0; i < shown; ++i)
    out << "  unusable line " << read.rejected[i].line << ": " << read.rejected[i].reason << "\n";
  if (read.rejected.size() > shown) out << "  ... and " << read.rejected.size() - shown << " more (all listed in --json)\n";
  for (const auto& w : read.warnings) out << "  warning: " << w << "\n";
  out << "Filters: " << c.kept << " of " << c.input << " events kept";
  const std::pair<const char*, std::size_t> reasons[] = {
      {"outside the time window", c.outside_time},     {"outside the polygon", c.outside_polygon},
      {"outside the well buffer", c.outside_buffer},   {"outside the depth range", c.outside_depth},
      {"without depth", c.missing_depth},              {"of another magnitude type", c.other_magnitude_type},
      {"of an unknown magnitude type", c.unknown_magnitude_type}, {"below the minimum magnitude", c.below_magnitude}};
  for (const auto& [what, n] : reasons)
    if (n > 0) out << "; " << n << " " << what;
  out << "\n";
  if (s.events > 0)
    out << "Events: " << s.events << " from " << formats::format_iso8601_utc(*s.first_time) << " to "
        << formats::format_iso8601_utc(*s.last_time) << ", M " << fixed(*s.min_magnitude, 1) << " to "
        << fixed(*s.max_magnitude, 1) << "\n";
  else
    out << "Events: none after filtering\n";

  out << "\nMagnitude of completeness: ";
  if (!s.has_mc) out << "not estimated (" << s.mc_note << ")\n";
  else if (s.mc_given) out << "Mc = " << fixed(s.mc, 2) << " (given)";
  else {
    out << "Mc = " << fixed(s.mc, 2) << " (maximum curvature, Wiemer & Wyss 2000";
    if (s.completeness->correction != 0.0) out << ", " << fixed(s.completeness->mc_curvature, 2) << " + " << util::number_text(s.completeness->correction, 4) << " correction";
    out << ")";
  }
  if (s.has_mc) out << ", " << s.events_at_or_above_mc << " events at or above\n";
  out << "b-value: ";
  if (s.b) {
    out << fixed(s.b->b, 2) << " ± " << fixed(s.b->sigma, 2) << " (Aki 1965 with Utsu's correction, σ Shi & Bolt 1982; n = "
        << s.b->n << ", a = " << fixed(s.b->a, 2) << ")\n";
    if (s.bootstrap)
      out << "  bootstrap " << util::number_text(100 * s.bootstrap->confidence, 3) << " % interval: " << fixed(s.bootstrap->lower, 2) << " to "
          << fixed(s.bootstrap->upper, 2) << " (" << s.bootstrap->resamples << " resamples, seed " << s.bootstrap->seed << ")\n";
    if (!s.b_note.empty()) out << "  note: " << s.b_note << "\n";
  } else {
    out << "not estimated (" << s.b_note << ")\n";
  }

  print_magnitude_bounds(out, s, max_fault_bounds, u);
  print_seismogenic_index(out, s, u);

  if (rt) {
    out << "\nr-t view around " << (rt->well.empty() ? "the well" : "well " + rt->well) << " at (" << util::number_text(rt->position[0], 8)
        << ", " << util::number_text(rt->position[1], 8) << ") from "
        << formats::format_iso8601_utc(rt->start) << ": " << rt->points.size() << " events after the start\n";
    for (std::size_t i = 0; i < rt->diffusivities.size(); ++i)
      out << "  inside the triggering front for D = " << util::number_text(rt->diffusivities[i], 3)
          << " m2/s: " << util::number_text(100.0 * rt->fraction_inside[i], 3) << " %\n";
    out << "  (r = sqrt(4 pi D t), Shapiro et al. 1997)\n";
  }
  out << "\nAssumptions:\n";
  for (const auto& a : s.assumptions) out << "  - " << a << "\n";
}

}  // namespace slipscreen::cli
