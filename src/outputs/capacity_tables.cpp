#include "outputs/capacity_tables.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "core/stats/wilson_interval.hpp"
#include "core/util/civil_date.hpp"
#include "core/util/number_text.hpp"
#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"

namespace slipscreen::outputs {
namespace {
using probabilistic::ProbabilityBound;
using util::fixed_decimals;

std::string date_of(double t) { return util::format_iso_date(util::date_at(t)); }
std::string f4(double v) { return fixed_decimals(v, 4); }
// A factor as table text: empty when no segment exceeds the threshold up to up_to.
std::string factor_text(double f) { return std::isinf(f) ? std::string() : util::number_text(f, 10); }
std::string th_text(double th) { return fixed_decimals(th, 3); }

double z_of(const screening::CapacityResult& c) { return stats::z_for_confidence(c.confidence); }

// The end of capacity_curve.csv's grid: 1.5 times the largest finite answer, at least 2, at most
// up_to (the range every curve is exact on, group_factors.hpp).
double curve_end(const screening::CapacityResult& c) {
  std::vector<double> th;
  for (const auto& t : c.thresholds) th.push_back(t.threshold);
  return probabilistic::curve_end(c.curves, th, z_of(c), c.up_to);
}

void write_capacity_csv(const formats::RunFolder& folder, const screening::CapacityResult& c) {
  const double z = z_of(c);
  std::ostringstream t;
  t << "segment_id,fault_id,p_slip_f0,p_slip_f0_ci_high,p_slip_f1,p_slip_f1_ci_high";
  for (const auto& th : c.thresholds) {
    const std::string p = th_text(th.threshold);
    t << ",f_exceeds_" << p << ",f_exceeds_" << p << "_point,f_exceeds_" << p << "_ci_low_end";
  }
  t << '\n';
  for (std::size_t i = 0; i < c.curves.size(); ++i) {
    const auto& cv = c.curves[i];
    const auto at0 = stats::wilson_interval(cv.slipped(0.0), cv.realizations(), z);
    const auto at1 = stats::wilson_interval(cv.slipped(1.0), cv.realizations(), z);
    t << formats::csv_field(c.segment_ids[i]) << ',' << formats::csv_field(c.fault_ids[i]) << ',' << f4(at0.estimate)
      << ',' << f4(at0.upper) << ',' << f4(at1.estimate) << ',' << f4(at1.upper);
    for (const auto& th : c.thresholds) {
      const auto lim = [&](ProbabilityBound b) {
        const double f = probabilistic::segment_limit(cv, th.threshold, b, z);
        return f > c.up_to ? std::string() : factor_text(f);
      };
      t << ',' << lim(ProbabilityBound::wilson_upper) << ',' << lim(ProbabilityBound::point_estimate) << ','
        << lim(ProbabilityBound::wilson_lower);
    }
    t << '\n';
  }
  formats::write_text_file(folder.output("output.files.capacity", "capacity.csv"), t.str());
}

void write_capacity_curve(const formats::RunFolder& folder, const screening::CapacityResult& c) {
  const double end = curve_end(c);
  // The segments with their own column: the binding ones first, then the highest P at the grid's end.
  std::vector<std::size_t> top;
  for (const auto& th : c.thresholds)
    for (const auto& b : {th.wilson.binding, th.point.binding})
      if (b && std::find(top.begin(), top.end(), *b) == top.end()) top.push_back(*b);
  std::vector<std::size_t> order(c.curves.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    return c.curves[a].slipped(end) > c.curves[b].slipped(end);
  });
  for (std::size_t i : order)
    if (top.size() < kCapacityCurveSegments && std::find(top.begin(), top.end(), i) == top.end()) top.push_back(i);
  std::ostringstream t;
  t << "f,p_slip_max,p_slip_max_segment_id";
  for (std::size_t i : top) t << ',' << formats::csv_field("p_slip_" + c.segment_ids[i]);
  t << '\n';
  for (std::size_t k = 0; k < kCapacityCurvePoints; ++k) {
    // At most `end` (the product and quotient may round above it by an ulp).
    const double f = std::min(end, end * static_cast<double>(k) / static_cast<double>(kCapacityCurvePoints - 1));
    std::size_t best = 0;
    for (std::size_t i = 1; i < c.curves.size(); ++i)
      if (c.curves[i].slipped(f) > c.curves[best].slipped(f)) best = i;
    t << util::number_text(f, 6) << ',' << f4(c.curves[best].probability(f)) << ','
      << formats::csv_field(c.segment_ids[best]);
    for (std::size_t i : top) t << ',' << f4(c.curves[i].probability(f));
    t << '\n';
  }
  formats::write_text_file(folder.output("output.files.capacity_curve", "capacity_curve.csv"), t.str());
}

std::string group_text(const screening::CapacityResult& c) {
  std::string g;
  for (const auto& w : c.wells) g += (g.empty() ? "" : ", ") + w;
  return g;
}

nlohmann::json answer_json(const screening::CapacityResult& c, const screening::FactorAnswer& a) {
  nlohmann::json j = {{"exceeded_up_to_f_max", !a.beyond}};
  if (!a.beyond) {
    j["f_limit"] = a.limit;
    j["f_allowed"] = a.allowed;
    j["binding_segment"] = c.segment_ids[*a.binding];
  }
  return j;
}
}  // namespace

void write_capacity_tables(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                           const screening::CapacityResult& c) {
  (void)s;
  write_capacity_csv(folder, c);
  write_capacity_curve(folder, c);
}

std::vector<ReadmeFile> capacity_readme(const screening::CapacityResult& c) {
  const std::string g = "allowable rate of " + group_text(c) + ": ";
  const std::string by = "P(slip by " + date_of(c.horizon) + " | f), f the factor on the group's planned rates";
  return {{"capacity.csv", g + "per fault segment, " + by + " at f = 0 and 1, and the factor at which it exceeds "
                               "each threshold (upper end of the Wilson interval, point estimate, lower end)"},
          {"capacity_curve.csv", g + by + " on a grid of f: the largest over the segments and the segments that bind"}};
}

nlohmann::json capacity_manifest(const screening::CapacityResult& c) {
  nlohmann::json th = nlohmann::json::array();
  for (const auto& t : c.thresholds) {
    nlohmann::json without = nlohmann::json::array();
    for (std::size_t i : t.reached_without) without.push_back(c.segment_ids[i]);
    th.push_back({{"threshold", t.threshold},
                  {"wilson_upper", answer_json(c, t.wilson)},
                  {"point_estimate", answer_json(c, t.point)},
                  {"reached_without_group", without}});
  }
  nlohmann::json det_without = nlohmann::json::array();
  for (std::size_t i : c.deterministic_reached_without) det_without.push_back(c.segment_ids[i]);
  return {{"wells", c.wells},
          {"from", c.from ? nlohmann::json(date_of(*c.from)) : nlohmann::json(nullptr)},
          {"horizon", date_of(c.horizon)},
          {"f_max", c.up_to},
          {"confidence", c.confidence},
          {"thresholds", th},
          {"deterministic", {{"margin_Pa", c.margin}, {"answer", answer_json(c, c.deterministic)},
                             {"reached_without_group", det_without}}},
          {"method", "exact by linearity of dp in the rates: f_crit per realization and segment "
                     "(docs/decisions.md, Allowable rate)"}};
}

std::vector<std::string> capacity_schedule(const screening::CapacityResult& c, double f, const OutputUnits& u) {
  std::vector<std::string> lines;
  for (const auto& w : c.plan) {
    std::string line = w.id + ": up to " + util::number_text(f, 3) + " x plan";
    std::size_t shown = 0;
    for (const auto& p : w.periods) {
      if (shown++ == 3) {
        line += ", ... (" + std::to_string(w.periods.size() - 3) + " more periods)";
        break;
      }
      line += (shown == 1 ? ": " : ", ") + util::number_text(u.value(f * p.rate, Quantity::volume_rate), 3) + " " +
              std::string(u.symbol(Quantity::volume_rate)) + " from " + date_of(p.start) +
              (std::isinf(p.end) ? std::string() : " to " + date_of(p.end));
    }
    lines.push_back(std::move(line));
  }
  return lines;
}

std::vector<std::string> capacity_console(const screening::CapacityResult& c, const OutputUnits& u) {
  std::vector<std::string> out;
  std::string head = "Allowable rate of " + group_text(c) + " (the factor f on the planned rates";
  if (c.from) head += " from " + date_of(*c.from);
  head += ") by " + date_of(c.horizon) + ":";
  out.push_back(head);
  const auto pct = util::number_text(100.0 * c.confidence, 3);
  for (const auto& t : c.thresholds) {
    const std::string th = th_text(t.threshold);
    if (t.wilson.beyond) {
      out.push_back("  P(slip) <= " + th + ": no segment exceeds it up to " + util::number_text(c.up_to, 3) + " x plan");
    } else {
      std::string l = "  P(slip) <= " + th + " (upper end of the " + pct + "% interval): f <= " +
                      util::number_text(t.wilson.allowed, 3) + ", bound by " + c.segment_ids[*t.wilson.binding];
      l += t.point.beyond ? "; point estimate: beyond " + util::number_text(c.up_to, 3)
                          : "; point estimate: f <= " + util::number_text(t.point.allowed, 3);
      out.push_back(l);
      for (auto& s : capacity_schedule(c, t.wilson.allowed, u)) out.push_back("    " + s);
      // A looser threshold can allow less than a stricter one: the stricter answer leaves out the
      // segments already above it without the group, and one of them may bind the looser answer
      // (docs/decisions.md). Say so rather than leave it looking like an error.
      for (const auto& lower : c.thresholds) {
        if (lower.threshold >= t.threshold || lower.wilson.beyond || lower.wilson.allowed <= t.wilson.allowed) continue;
        const auto& left_out = lower.reached_without;
        if (std::find(left_out.begin(), left_out.end(), *t.wilson.binding) == left_out.end()) continue;
        out.push_back("    less than at P(slip) <= " + th_text(lower.threshold) + ": " + c.segment_ids[*t.wilson.binding] +
                      " is already above " + th_text(lower.threshold) + " without these wells, so that answer leaves it out");
        break;
      }
    }
    if (!t.reached_without.empty()) {
      std::string l = "    reached without these wells (" + std::to_string(t.reached_without.size()) + "):";
      for (std::size_t k = 0; k < t.reached_without.size() && k < 6; ++k) l += " " + c.segment_ids[t.reached_without[k]];
      if (t.reached_without.size() > 6) l += " ...";
      out.push_back(l);
    }
  }
  const std::string m = util::number_text(u.value(c.margin, Quantity::pressure), 3) + " " + std::string(u.symbol(Quantity::pressure));
  if (c.deterministic.beyond)
    out.push_back("  Deterministic (margin >= " + m + "): no segment's margin falls below it up to " +
                  util::number_text(c.up_to, 3) + " x plan");
  else
    out.push_back("  Deterministic (margin >= " + m + "): f <= " + util::number_text(c.deterministic.allowed, 3) +
                  ", bound by " + c.segment_ids[*c.deterministic.binding] + "; " +
                  std::to_string(c.deterministic_reached_without.size()) + " segments below it without these wells");
  out.push_back("  Details: capacity.csv, capacity_curve.csv (exact by linearity in the rates; a screening estimate)");
  return out;
}

}  // namespace slipscreen::outputs
