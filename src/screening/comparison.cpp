#include "screening/comparison.hpp"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <limits>
#include <map>
#include <set>

#include "core/errors.hpp"

namespace slipscreen::screening {
namespace {

// A run's history end: the latest end of a reported period of a non-proposed well.
std::optional<double> history_end(const RunRecord& r) {
  std::optional<double> end;
  for (const auto& w : r.wells)
    if (!w.proposed)
      for (const auto& p : w.periods)
        if (!p.assumed && (!end || p.end > *end)) end = p.end;
  return end;
}

// Volume of the periods accepted by `keep` inside [from, to).
template <class Keep>
double volume_between(const RunWell& w, double from, double to, Keep keep) {
  double v = 0;
  for (const auto& p : w.periods)
    if (keep(p)) {
      const double a = std::max(p.start, from), b = std::min(p.end, to);
      if (b > a) v += p.rate * (b - a);
    }
  return v;
}

bool reported(const RunWell& w, const RunWellPeriod& p) { return !w.proposed && !p.assumed; }

std::vector<InputChange> input_changes(const RunRecord& o, const RunRecord& n) {
  // The k-th file of a role against the k-th file of that role, roles in the order first seen.
  std::vector<std::string> roles;
  std::map<std::string, std::vector<const RunInputFile*>> by_old, by_new;
  for (const auto& f : o.inputs) {
    if (!by_old.count(f.role) && !by_new.count(f.role)) roles.push_back(f.role);
    by_old[f.role].push_back(&f);
  }
  for (const auto& f : n.inputs) {
    if (!by_old.count(f.role) && !by_new.count(f.role)) roles.push_back(f.role);
    by_new[f.role].push_back(&f);
  }
  std::vector<InputChange> out;
  for (const auto& role : roles) {
    const auto& a = by_old[role];
    const auto& b = by_new[role];
    for (std::size_t k = 0; k < std::max(a.size(), b.size()); ++k) {
      InputChange c{role, {}, {}, Change::unchanged};
      if (k < a.size()) c.old_file = *a[k];
      if (k < b.size()) c.new_file = *b[k];
      c.change = !c.old_file ? Change::added
                 : !c.new_file ? Change::removed
                 : c.old_file->sha256 != c.new_file->sha256 ? Change::changed
                                                              : Change::unchanged;
      out.push_back(std::move(c));
    }
  }
  return out;
}

std::vector<ParameterChange> parameter_changes(const RunRecord& o, const RunRecord& n) {
  std::map<std::string, std::pair<std::optional<std::string>, std::optional<std::string>>> all;
  for (const auto& [k, v] : o.parameters) all[k].first = v;
  for (const auto& [k, v] : n.parameters) all[k].second = v;
  std::vector<ParameterChange> out;
  for (const auto& [k, v] : all)
    if (v.first != v.second) out.push_back({k, v.first, v.second});
  return out;
}

std::vector<WellChange> well_changes(const RunRecord& o, const RunRecord& n, std::optional<double> end_old,
                                     std::optional<double> end_new) {
  std::map<std::string, std::pair<const RunWell*, const RunWell*>> all;
  for (const auto& w : o.wells) all[w.id].first = &w;
  for (const auto& w : n.wells) all[w.id].second = &w;
  std::vector<WellChange> out;
  for (const auto& [id, pair] : all) {
    // Plain pointers, not a structured binding: clang 15 (the fuzz build) cannot capture those.
    const RunWell* const a = pair.first;
    const RunWell* const b = pair.second;
    WellChange c;
    c.id = id;
    if (a) c.old_status = a->status;
    if (b) c.new_status = b->status;
    c.change = !a ? Change::added
               : !b ? Change::removed
               : (a->status != b->status || a->proposed != b->proposed) ? Change::changed
                                                                       : Change::unchanged;
    if (end_old && end_new && *end_new > *end_old) {
      if (b) c.volume_reported_new = volume_between(*b, *end_old, *end_new, [&](const auto& p) { return reported(*b, p); });
      if (a) c.volume_expected_old = volume_between(*a, *end_old, *end_new, [](const auto&) { return true; });
    }
    if (end_old) {
      const double lo = -std::numeric_limits<double>::infinity();
      const double before_new = b ? volume_between(*b, lo, *end_old, [&](const auto& p) { return reported(*b, p); }) : 0.0;
      const double before_old = a ? volume_between(*a, lo, *end_old, [&](const auto& p) { return reported(*a, p); }) : 0.0;
      c.volume_revised = before_new - before_old;
    }
    out.push_back(std::move(c));
  }
  return out;
}

// Segment ids in first-seen order, and each segment's rows by date.
struct ProbabilityIndex {
  std::vector<std::string> order;
  std::map<std::string, std::map<std::string, const RunSegmentProbability*>> rows;
  std::set<std::string> dates;
};

ProbabilityIndex index_of(const RunRecord& r) {
  ProbabilityIndex ix;
  for (const auto& p : r.probabilities) {
    auto& by_date = ix.rows[p.segment_id];
    if (by_date.empty()) ix.order.push_back(p.segment_id);
    if (!by_date.emplace(p.date, &p).second)
      throw InputError("segment_probability.csv", p.segment_id + " " + p.date,
                       "one row per segment and output date", r.folder);
    ix.dates.insert(p.date);
  }
  return ix;
}

CatalogChange catalog_change(const RunRecord& o, const RunRecord& n) {
  CatalogChange c;
  c.old_reviewed = o.catalog.has_value();
  c.new_reviewed = n.catalog.has_value();
  if (o.catalog) {
    c.old_last_time = o.catalog->last_time;
    c.mc_old = o.catalog->mc;
    c.b_old = o.catalog->b;
    c.sigma_old = o.catalog->sigma;
  }
  if (n.catalog) {
    c.new_last_time = n.catalog->last_time;
    c.mc_new = n.catalog->mc;
    c.b_new = n.catalog->b;
    c.sigma_new = n.catalog->sigma;
  }
  if (o.catalog && n.catalog)
    for (const auto& e : n.catalog->events)
      if (!o.catalog->last_time_s || e.time_s > *o.catalog->last_time_s) c.new_events.push_back(e);
  return c;
}

bool differs(const std::optional<double>& a, const std::optional<double>& b) { return a != b; }

}  // namespace

const char* change_name(Change c) {
  switch (c) {
    case Change::unchanged: return "unchanged";
    case Change::changed: return "changed";
    case Change::added: return "added";
    case Change::removed: return "removed";
  }
  return "?";
}

std::optional<std::string> incomparable(const RunRecord& o, const RunRecord& n) {
  if (o.region != n.region)
    return "region '" + o.region + "' (" + o.folder + ") against '" + n.region + "' (" + n.folder + ")";
  if (o.crs != n.crs)
    return "working CRS '" + o.crs + "' (" + o.folder + ") against '" + n.crs + "' (" + n.folder + ")";
  return std::nullopt;
}

Comparison compare_runs(const RunRecord& o, const RunRecord& n, double z_crit) {
  if (const auto why = incomparable(o, n))
    throw InputError("runs", *why, "two runs of the same region in the same working CRS");
  Comparison c;
  c.z_crit = z_crit;
  c.history_end_old = history_end(o);
  c.history_end_new = history_end(n);
  c.inputs = input_changes(o, n);
  c.parameters = parameter_changes(o, n);
  c.wells = well_changes(o, n, c.history_end_old, c.history_end_new);
  c.realizations_old = o.realizations;
  c.realizations_new = n.realizations;

  const ProbabilityIndex a = index_of(o), b = index_of(n);
  std::set_intersection(a.dates.begin(), a.dates.end(), b.dates.begin(), b.dates.end(),
                        std::back_inserter(c.common_dates));
  if (c.common_dates.empty())
    throw InputError("output dates", o.folder + " and " + n.folder + " share none",
                     "two runs with at least one output date in common ([output.times])");
  for (const auto& id : a.order)
    if (!b.rows.count(id)) c.segments_only_old.push_back(id);
  for (const auto& id : b.order)
    if (!a.rows.count(id)) c.segments_only_new.push_back(id);

  std::set<double> th(o.thresholds.begin(), o.thresholds.end());
  th.insert(n.thresholds.begin(), n.thresholds.end());
  c.thresholds.assign(th.begin(), th.end());
  c.flag_date = c.common_dates.back();
  for (double t : c.thresholds) c.flags.push_back({t, {}, {}});

  for (const auto& id : b.order) {
    const auto it = a.rows.find(id);
    if (it == a.rows.end()) continue;
    for (const auto& date : c.common_dates) {
      const auto po = it->second.find(date);
      const auto pn = b.rows.at(id).find(date);
      if (po == it->second.end() || pn == b.rows.at(id).end())
        throw InputError("segment_probability.csv", id + " " + date, "a row for every segment at every output date",
                         po == it->second.end() ? o.folder : n.folder);
      SegmentChange s;
      s.segment_id = id;
      s.fault_id = pn->second->fault_id;
      s.date = date;
      s.p_old = po->second->p_slip;
      s.p_new = pn->second->p_slip;
      s.dp_p50_old = po->second->dp_p50;
      s.dp_p50_new = pn->second->dp_p50;
      s.test = stats::two_proportion_test(s.p_old, o.realizations, s.p_new, n.realizations, z_crit);
      for (std::size_t k = 0; k < c.thresholds.size(); ++k) {
        const double t = c.thresholds[k];
        const bool was = s.p_old >= t, is = s.p_new >= t;
        if (is && !was) s.newly_flagged.push_back(t);
        if (was && !is) s.cleared.push_back(t);
        if (date == *c.flag_date) {
          if (is && !was) c.flags[k].newly_flagged.push_back(id);
          if (was && !is) c.flags[k].cleared.push_back(id);
        }
      }
      c.segments.push_back(std::move(s));
    }
  }
  c.catalog = catalog_change(o, n);
  return c;
}

std::vector<std::string> Comparison::moved_segments() const {
  std::vector<std::string> out;
  for (const auto& s : segments)
    if (s.test.exceeds_noise && (out.empty() || out.back() != s.segment_id)) out.push_back(s.segment_id);
  return out;
}

bool Comparison::any_change() const {
  for (const auto& i : inputs)
    if (i.change != Change::unchanged) return true;
  for (const auto& w : wells)
    if (w.change != Change::unchanged || w.volume_reported_new != 0 || w.volume_revised != 0) return true;
  if (!parameters.empty() || !segments_only_old.empty() || !segments_only_new.empty()) return true;
  for (const auto& s : segments)
    if (s.p_old != s.p_new || !(s.dp_p50_old == s.dp_p50_new || (std::isnan(s.dp_p50_old) && std::isnan(s.dp_p50_new))))
      return true;
  const auto& k = catalog;
  return k.old_reviewed != k.new_reviewed || !k.new_events.empty() || differs(k.mc_old, k.mc_new) ||
         differs(k.b_old, k.b_new) || differs(k.sigma_old, k.sigma_new);
}

}  // namespace slipscreen::screening
