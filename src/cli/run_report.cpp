#include "cli/run_report.hpp"

#include <sys/resource.h>

#include <chrono>
#include <cstdint>
#include <functional>
#include <optional>
#include <cstdio>
#include <map>
#include <ostream>
#include <algorithm>
#include <set>

#include "cli/catalog_report.hpp"
#include "cli/exit_codes.hpp"
#include "core/caution.hpp"
#include "core/util/number_text.hpp"
#include "cli/scenario_summary.hpp"
#include "screening/catalog_review.hpp"
#include "formats/table/iso_time.hpp"
#include "outputs/capacity_tables.hpp"
#include "outputs/what_if_table.hpp"
#include "outputs/output_units.hpp"
#include "run/mpi_cluster.hpp"
#include "run/run_scenario.hpp"
#include "scenario/scenario.hpp"

namespace slipscreen::cli {
namespace {

using outputs::OutputUnits;
using outputs::Quantity;

// A value on the console in the run's units, with the decimals of `si_decimals` in SI
// (outputs/output_units.hpp): pressures print 2 decimals of MPa or 0 of psi.
std::string shown(const OutputUnits& u, double si, Quantity q, int si_decimals) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.*f", u.decimals(q, si_decimals), u.value(si, q));
  return buf;
}

std::string with_unit(const std::string& label, const OutputUnits& u, Quantity q) {
  return label + " " + std::string(u.symbol(q));
}

std::string pad(std::string s, std::size_t n) {
  if (s.size() < n) s.append(n - s.size(), ' ');
  return s;
}

// The catalog review of a run: the catalog's own summary, then the events against the model.
void print_review_against_model(std::ostream& out, const scenario::ResolvedScenario& s, const screening::CatalogReview& v,
                                int shown_max) {
  out << "\n";
  const OutputUnits u(s.output.units);
  print_catalog_summary(out, v.read, v.counts, v.summary, v.rt, static_cast<std::size_t>(std::max(shown_max, 1)), u);
  char line[320];
  out << "\nEvents against the model (" << v.events.size() << " events kept):\n";
  const auto& f = v.footprint;
  std::snprintf(line, sizeof line,
                "  %zu of %zu events in the study area had modelled dp >= %.3g %s at their place and time; "
                "%.1f expected by chance (mean area fraction %.3f), one-sided p = %.2g\n",
                f.inside, f.events, u.value(v.spec.footprint_threshold, Quantity::pressure),
                std::string(u.symbol(Quantity::pressure)).c_str(), v.footprint_expected, f.area_fraction, f.p_value);
  out << line;
  std::size_t reached = 0;
  for (const auto& e : v.events) reached += e.segment_reached;
  out << "  " << reached << " events lie nearest to a segment that the deterministic screen has at its critical "
      << "pressure increase by the event time\n";
  // The largest events with their nearest segment.
  std::vector<std::size_t> idx(v.events.size());
  for (std::size_t i = 0; i < idx.size(); ++i) idx[i] = i;
  std::stable_sort(idx.begin(), idx.end(), [&](std::size_t a, std::size_t b) {
    return v.catalog.events[a].magnitude > v.catalog.events[b].magnitude;
  });
  if (!idx.empty()) {
    out << "  Largest events:\n  " << pad("date", 12) << pad("M", 6) << pad(with_unit("dp", u, Quantity::pressure), 9)
        << pad("nearest segment", 17) << pad(with_unit("distance", u, Quantity::distance_long), 13)
        << "P(slip) by then\n";
    for (std::size_t n = 0; n < idx.size() && static_cast<int>(n) < shown_max; ++n) {
      const auto& e = v.catalog.events[idx[n]];
      const auto& m = v.events[idx[n]];
      char mag[16], p[64];
      std::snprintf(mag, sizeof mag, "%.1f", e.magnitude);
      const std::string dist = shown(u, m.distance, Quantity::distance_long, 2);
      if (m.probability_time) std::snprintf(p, sizeof p, "%.3f [%.3f, %.3f]", m.p_slip, m.p_low, m.p_high);
      else std::snprintf(p, sizeof p, "-");
      out << "  " << pad(formats::format_iso8601_utc(e.time).substr(0, 10), 12) << pad(mag, 6) << pad(shown(u, m.dp, Quantity::pressure, 2), 9)
          << pad(v.segment_ids.empty() ? "-" : v.segment_ids[m.segment], 17) << pad(dist, 13) << p
          << "\n";
    }
  }
  if (v.rt) {
    out << "  r-t view around " << v.rt->well << ": " << v.rt->points.size() << " events after its first injection"
        << " (rt_events.csv, rt_fronts.csv)\n";
  }
  if (v.spec.rate_state) {
    // Faults with the highest modelled rate increase at the last output time.
    std::map<std::string, std::pair<double, double>> by_fault;  // fault -> (rate, background)
    for (std::size_t i = 0; i < v.rates.size(); ++i) {
      if (v.rates[i].samples.empty()) continue;
      auto& a = by_fault[v.segment_faults[i]];
      a.first += v.rates[i].samples.back().rate;
      a.second += v.rates[i].background_rate;
    }
    std::vector<std::pair<double, std::string>> ratio;
    for (const auto& [id, a] : by_fault)
      if (a.second > 0) ratio.emplace_back(a.first / a.second, id);
    std::stable_sort(ratio.begin(), ratio.end(), [](const auto& a, const auto& b) { return a.first > b.first; });
    out << "  Seismicity-rate response (Dieterich 1994) by " << util::format_iso_date(s.output.dates.back())
        << ", rate over background:";
    for (std::size_t n = 0; n < ratio.size() && static_cast<int>(n) < shown_max; ++n) {
      std::snprintf(line, sizeof line, "%s %s %.3g", n ? "," : "", ratio[n].second.c_str(), ratio[n].first);
      out << line;
    }
    out << " (seismicity_rate_faults.csv)\n";
  }
}

// The run's options; progress (stage and percentage, redrawn in place) only on a terminal.
run::RunOptions run_options(const RunCommandOptions& o, Context& ctx) {
  run::RunOptions ro;
  ro.out = o.out;
  ro.force = o.force;
  ro.allow_network = o.allow_network;
  ro.reproducible = o.reproducible;
  ro.command_line = ctx.command_line;
  ro.notice = [&ctx](const std::string& line) {
    ctx.err << (ctx.err_is_terminal ? "\r\033[K" : "") << "slipscreen: " << line << "\n";
  };
  ro.cost = [&ctx](const screening::RunCost& cost, double limit) {
    ctx.out << screening::cost_line(cost, limit) << "\n" << std::flush;
  };
  if (ctx.err_is_terminal) {
    ro.progress = [&ctx](const std::string& stage, double f) {
      if (f < 0) ctx.err << "\r\033[K" << stage << " ..." << std::flush;
      else ctx.err << "\r\033[K" << stage << " " << static_cast<int>(f * 100 + 0.5) << "%" << std::flush;
    };
  }
  return ro;
}

// The deterministic screen: counts, then each fault's segment with the smallest margin
// (at most `closest` faults).
void print_deterministic(std::ostream& out, const scenario::ResolvedScenario& s, const screening::RunSummary& r,
                         int closest) {
  out << "Deterministic screen of " << s.file << (s.title.empty() ? "" : " (" + s.title + ")") << "\n";
  out << "  " << r.fault_count << " faults in " << r.segment_count << " segments, " << r.well_count << " wells, "
      << s.output.dates.size() << " output times to " << r.last_date << "\n";
  out << "  " << r.crossing_count << " segments reach their critical pressure increase by " << r.last_date << "; "
      << r.already_critical_count << " already critically stressed before injection\n";
  if (r.radius_clamped) out << "  note: some check points lie within a well radius; they are evaluated at the radius\n";

  std::set<std::string> listed;
  const OutputUnits u(s.output.units);
  constexpr Quantity P = Quantity::pressure;
  out << "\nFaults closest to failure (margin = dp_crit - peak dp; negative: reached; leading well: the largest\n"
         "share of dp at the first crossing, or at " << r.last_date << " when not reached):\n";
  out << "  " << pad("fault", 10) << pad("segment", 12) << pad(with_unit("dp_crit", u, P), 13)
      << pad(with_unit("peak dp", u, P), 13) << pad(with_unit("margin", u, P), 12) << pad("first reached", 15)
      << "leading well (share)\n";
  for (const auto& line : r.closest) {
    if (static_cast<int>(listed.size()) >= closest) break;
    if (!listed.insert(line.fault_id).second) continue;
    const bool critical = line.status == geomech::CriticalStatus::already_critical;
    char share[32];
    std::snprintf(share, sizeof share, "%.0f%%", line.leading_share * 100);
    out << "  " << pad(line.fault_id, 10) << pad(line.segment_id, 12) << pad(shown(u, line.dp_crit, P, 2), 13)
        << pad(shown(u, line.peak_dp, P, 2), 13) << pad(shown(u, line.dp_crit - line.peak_dp, P, 2), 12)
        << pad(critical ? "before injection" : line.first_crossing.value_or("-"), 15)
        << (line.leading_well.empty() ? "-" : line.leading_well + " (" + share + ")") << "\n";
  }
}

// The probabilistic screen: sample, Monte Carlo error, warnings, and the segments that reach a
// probability threshold (at most `closest` rows).
void print_probabilistic(std::ostream& out, const screening::ProbabilisticSummary& p, std::uint64_t seed,
                         const std::string& last_date, int closest) {
  char line[256];
  out << "\nProbabilistic screen: " << p.realizations << " realizations (" << p.sampler << ", seed " << seed << ")";
  if (p.rejected > 0) out << "; " << p.rejected << " rejected as unphysical stress";
  out << "\n";
  std::snprintf(line, sizeof line,
                "  Monte Carlo error: the widest %.0f%% interval is +/- %.3f; pressure surrogate error %.1e\n",
                p.confidence * 100, p.mc_half_width_max, p.surrogate_error);
  out << line;
  if (p.beyond_frictional_limit > 0)
    out << "  " << p.beyond_frictional_limit
        << " realizations have stress beyond the frictional limit (optimally oriented faults critical)\n";
  if (p.already_critical_segments > 0)
    out << "  " << p.already_critical_segments
        << " segments are critically stressed before injection in some realizations (reported apart, "
           "not counted in P(slip))\n";
  std::string ths;
  for (double t : p.thresholds) {
    std::snprintf(line, sizeof line, "%s%.3g", ths.empty() ? "" : ", ", t);
    ths += line;
  }
  out << "  Segments whose injection-induced P(slip by " << last_date << ") reaches a threshold (" << ths
      << "): " << p.flagged.size() << "\n";
  if (p.flagged.empty()) return;
  out << "  P(slip): slips caused by injection; P(crit0): realizations critical before injection; the two add\n"
         "  to the total share critical by "
      << last_date << ". First reached: the first month (tracking grid) P(slip) reaches the threshold.\n";
  out << "  " << pad("fault", 10) << pad("segment", 12) << pad("P(slip)", 9) << pad("interval", 18) << pad("P(crit0)", 10)
      << pad("total", 7) << pad("threshold", 11) << "threshold first reached\n";
  int shown = 0;
  for (const auto& f : p.flagged) {
    if (shown++ >= closest) {
      out << "  ... " << (p.flagged.size() - static_cast<std::size_t>(closest))
          << " more in segment_probability_summary.csv\n";
      break;
    }
    char pr[32], ci[48], th[32], pa[32], tot[32];
    std::snprintf(pr, sizeof pr, "%.3f", f.p_final);
    std::snprintf(pa, sizeof pa, "%.3f", f.p_already_critical);
    std::snprintf(tot, sizeof tot, "%.3f", f.p_final + f.p_already_critical);
    std::snprintf(ci, sizeof ci, "[%.3f, %.3f]", f.ci_low, f.ci_high);
    std::snprintf(th, sizeof th, "%.3g", f.threshold);
    out << "  " << pad(f.fault_id, 10) << pad(f.segment_id, 12) << pad(pr, 9) << pad(ci, 18) << pad(pa, 10) << pad(tot, 7)
        << pad(th, 11) << (f.first_date.empty() ? "-" : f.first_date) << "\n";
  }
}

// The conditioned screen: observations, n_eff (with the warning), the inputs the data moved most
// and prior against conditioned P(slip) (docs/conditioning.md).
void print_conditioning(std::ostream& out, const screening::ConditioningSummary& c, const std::string& last_date) {
  char line[256];
  const std::string on = c.seismicity && c.observations == 0
                             ? std::string("the earthquakes")
                             : std::to_string(c.observations) + " pressure observations" + (c.seismicity ? " and the earthquakes" : "");
  std::snprintf(line, sizeof line, "  Conditioned on %s: effective sample size %.1f of %llu\n", on.c_str(), c.n_eff,
                static_cast<unsigned long long>(c.realizations));
  out << line;
  if (c.seismicity)  // docs/conditioning.md, "Seismicity"
    out << "  Seismicity likelihood (Poisson point process, Ogata 1988, independent segments with Dieterich 1994 "
           "rates; events at or above the catalog's Mc): "
        << screening::seismicity_sentence(*c.seismicity) << "\n";
  if (c.seismicity_beyond_domain > 0)
    out << "  Note: " << c.seismicity_beyond_domain
        << " realizations drive a segment's modelled rate beyond e^700 times its background rate and get weight 0\n";
  if (!c.warning.empty()) out << "  Warning: " << c.warning << "\n";
  if (!c.moved.empty()) {
    out << "  Inputs the observations moved most (posterior against prior; width: ratio of P5-P95 widths,\n"
           "  shift: change of the median in prior P5-P95 widths; all in posterior_inputs.csv):\n";
    for (const auto& m : c.moved) {
      std::snprintf(line, sizeof line, "    %-28s width x%.3f  shift %+.3f\n", m.input.c_str(), m.width_ratio,
                    m.median_shift);
      out << line;
    }
  }
  out << "  P(slip by " << last_date << "), prior and conditioned (interval: Wilson with n = n_eff, approximate):\n";
  out << "    " << pad("fault", 10) << pad("segment", 12) << pad("prior", 8) << pad("conditioned", 13) << "interval\n";
  for (const auto& g : c.segments) {
    char pr[32], pc[32], ci[48];
    std::snprintf(pr, sizeof pr, "%.3f", g.p_prior);
    std::snprintf(pc, sizeof pc, "%.3f", g.p_conditioned);
    std::snprintf(ci, sizeof ci, "[%.3f, %.3f]", g.ci_low, g.ci_high);
    out << "    " << pad(g.fault_id, 10) << pad(g.segment_id, 12) << pad(pr, 8) << pad(pc, 13) << ci << "\n";
  }
}

// The screen in depth of the 3-D poroelastic model (docs/physics.md): counts, then the segments
// most critical in depth (at most `closest`), with P(slip) when the run had [uncertainty].
void print_depth(std::ostream& out, const scenario::ResolvedScenario& s, const screening::DepthSummary& d,
                 const std::string& last_date, int closest) {
  const OutputUnits u(s.output.units);
  constexpr Quantity P = Quantity::pressure;
  out << "\nFaults in depth (3-D poroelastic model, Rudnicki 1986)\n  " << d.segments << " segments; " << d.crossing_count
      << " reach dCFF >= mu dp_crit at a check point in depth by " << last_date << "; " << d.already_critical_count
      << " already critically stressed before injection\n";
  const bool prob = d.realizations > 0;
  if (prob)
    out << "  P(slip by " << last_date << ") over " << d.realizations << " realizations (fault_depth_probability.csv);"
        << " the rest from the best-estimate screen:\n";
  out << "  first reached: first date with dCFF >= mu dp_crit, at that check point's depth and dCFF; closest\n"
         "  margin: the smallest mu dp_crit - dCFF at the output times (fault_depth.csv)\n";
  out << "  " << pad("fault", 10) << pad("segment", 12);
  if (prob) out << pad("P(slip)", 9) << pad("interval", 18);
  out << pad("first reached", 15) << pad(with_unit("depth", u, Quantity::length), 10) << pad(with_unit("dCFF", u, P), 12)
      << with_unit("closest margin", u, P) << "\n";
  int shown_lines = 0;
  for (const auto& l : d.lines) {
    if (shown_lines++ >= closest) {
      out << "  ... " << (d.lines.size() - static_cast<std::size_t>(closest)) << " more in fault_depth.csv\n";
      break;
    }
    out << "  " << pad(l.fault_id, 10) << pad(l.segment_id, 12);
    if (prob) {
      char pr[32], ci[48];
      std::snprintf(pr, sizeof pr, "%.3f", l.p_final.value_or(0.0));
      std::snprintf(ci, sizeof ci, "[%.3f, %.3f]", l.ci_low.value_or(0.0), l.ci_high.value_or(0.0));
      out << pad(pr, 9) << pad(ci, 18);
    }
    const std::string reached = l.already_critical ? "before injection" : l.first_crossing.value_or("-");
    out << pad(reached, 15) << pad(l.first_crossing ? shown(u, l.crossing_depth, Quantity::length, 0) : "-", 10)
        << pad(l.first_crossing ? shown(u, l.crossing_dcff, P, 4) : "-", 12) << shown(u, l.closest_margin, P, 4) << "\n";
  }
}

}  // namespace

// --timings: every stage's wall time and the peak memory so far when the next one starts, then
// this process's totals, on stderr, prefixed with the rank under mpirun (every rank prints its own).
class StageTimer {
 public:
  StageTimer(Context& ctx) : ctx_(ctx), start_(Clock::now()), stage_start_(start_) {
    if (run::cluster_ranks() > 1) prefix_ = "rank " + std::to_string(run::cluster_rank()) + ": ";
  }
  // Wraps `inner` (may be empty) so that a new stage ends the one before.
  std::function<void(const std::string&, double)> wrap(std::function<void(const std::string&, double)> inner) {
    return [this, inner = std::move(inner)](const std::string& stage, double f) {
      if (f < 0 && stage != stage_) end_stage(stage);
      if (inner) inner(stage, f);
    };
  }
  void finish() {
    end_stage("");
    const double total = std::chrono::duration<double>(Clock::now() - start_).count();
    ctx_.err << "slipscreen: timing: " << prefix_ << "total " << util::number_text(total, 3) << " s, cpu "
             << util::number_text(cpu_seconds(), 3) << " s, sent "
             << run::cluster_bytes_sent() << " bytes, received " << run::cluster_bytes_received()
             << " bytes, peak memory " << peak_memory_bytes() << " bytes\n"
             << std::flush;
  }

 private:
  using Clock = std::chrono::steady_clock;
  void end_stage(const std::string& next) {
    const auto now = Clock::now();
    if (!stage_.empty())
      ctx_.err << "slipscreen: timing: " << prefix_ << stage_ << ": "
               << util::number_text(std::chrono::duration<double>(now - stage_start_).count(), 3)
               << " s, peak memory so far " << peak_memory_bytes() << " bytes\n"
               << std::flush;
    stage_ = next;
    stage_start_ = now;
  }
  static double cpu_seconds() {  // user + system time of this process, all threads
    rusage ru{};
    getrusage(RUSAGE_SELF, &ru);
    return static_cast<double>(ru.ru_utime.tv_sec + ru.ru_stime.tv_sec) +
           1e-6 * static_cast<double>(ru.ru_utime.tv_usec + ru.ru_stime.tv_usec);
  }
  static long long peak_memory_bytes() {
    rusage ru{};
    getrusage(RUSAGE_SELF, &ru);
    return static_cast<long long>(ru.ru_maxrss) * 1024;  // Linux: kilobytes
  }
  Context& ctx_;
  Clock::time_point start_, stage_start_;
  std::string stage_, prefix_;
};

int run_and_report(const RunCommandOptions& o, Context& ctx) {
  scenario::ResolvedScenario s = scenario::load_scenario(o.scenario);
  // --units overrides [output] units (CLI11 has checked the name); the manifest records the result.
  if (!o.units.empty()) s.output.units = *units::unit_system_named(o.units);
  run::RunOptions ro = run_options(o, ctx);
  ro.split = run::cluster_split();
  std::optional<StageTimer> timer;
  if (o.timings) timer.emplace(ctx);
  if (run::cluster_rank() != 0) {  // under mpirun: rank 0 alone reports and writes (docs/cluster.md)
    ro.notice = nullptr;
    ro.cost = nullptr;
    ro.progress = timer ? timer->wrap(nullptr) : nullptr;
    run::run_scenario(s, ro);
    if (timer) timer->finish();
    return kExitOk;
  }
  if (timer) ro.progress = timer->wrap(std::move(ro.progress));
  const screening::RunSummary r = run::run_scenario(s, ro);
  if (timer) timer->finish();
  if (ctx.err_is_terminal) ctx.err << "\r\033[K" << std::flush;

  print_deterministic(ctx.out, s, r, o.closest);
  if (r.probabilistic) print_probabilistic(ctx.out, *r.probabilistic, s.seed, r.last_date, o.closest);
  if (r.conditioning) print_conditioning(ctx.out, *r.conditioning, r.last_date);
  if (r.depth) print_depth(ctx.out, s, *r.depth, r.last_date, o.closest);
  if (r.capacity) {
    ctx.out << "\n";
    for (const auto& line : outputs::capacity_console(*r.capacity, outputs::OutputUnits(s.output.units))) ctx.out << line << "\n";
  }
  if (r.what_if) {
    ctx.out << "\n";
    for (const auto& line : outputs::what_if_console(s, *r.what_if)) ctx.out << line << "\n";
  }
  if (r.catalog) print_review_against_model(ctx.out, s, *r.catalog, o.closest);
  ctx.out << "\nOutputs in " << r.folder.generic_string() << "/:\n";
  for (const auto& f : r.files) ctx.out << "  " << f << "\n";
  ctx.out << "\nScreening caution: " << kScreeningCaution << "\n";
  return kExitOk;
}

}  // namespace slipscreen::cli
