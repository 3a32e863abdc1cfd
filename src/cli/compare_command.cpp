// `slipscreen compare OLD_RUN NEW_RUN [--out DIR]`: what changed between two finished runs of one
// region (run/compare_job.hpp, docs/compare.md), written to comparison.csv and comparison.json and
// summarized here with the caution once.
#include <CLI/CLI.hpp>
#include <algorithm>
#include <cmath>
#include <memory>
#include <ostream>

#include "cli/commands.hpp"
#include "cli/option_range.hpp"
#include "core/caution.hpp"
#include "core/util/number_text.hpp"
#include "formats/table/iso_time.hpp"
#include "outputs/output_units.hpp"
#include "run/compare_job.hpp"

namespace slipscreen::cli {

namespace {

struct CompareCommandOptions {
  std::string old_run, new_run, out, units;
  bool force = false, reproducible = false;
  int list = 10;
};

std::string joined(const std::vector<std::string>& items, std::size_t most) {
  std::string s;
  for (std::size_t i = 0; i < items.size() && i < most; ++i) {
    if (i) s += ", ";
    s += items[i];
  }
  if (items.size() > most) s += ", ... (" + std::to_string(items.size() - most) + " more)";
  return s.empty() ? "none" : s;
}

std::string date_of(const std::optional<double>& t) {
  return t ? formats::format_iso8601_utc(*t).substr(0, 10) : std::string("none");
}

std::string number(const std::optional<double>& v, int decimals) {
  return v ? util::fixed_decimals(*v, decimals) : std::string("not estimated");
}

void print_inputs(const screening::Comparison& c, std::ostream& out, std::size_t most) {
  std::vector<std::string> changed;
  for (const auto& i : c.inputs)
    if (i.change != screening::Change::unchanged)
      changed.push_back(i.role + " (" + screening::change_name(i.change) + ")");
  out << "Input files changed: " << joined(changed, most) << "\n";
  out << "Parameters changed: " << c.parameters.size() << "\n";
  for (std::size_t i = 0; i < c.parameters.size() && i < most; ++i) {
    const auto& p = c.parameters[i];
    out << "  " << p.key << ": " << p.old_value.value_or("(absent)") << " -> " << p.new_value.value_or("(absent)")
        << "\n";
  }
  if (c.parameters.size() > most) out << "  ... (" << c.parameters.size() - most << " more in comparison.json)\n";
}

void print_wells(const screening::Comparison& c, const outputs::OutputUnits& u, std::ostream& out, std::size_t most) {
  std::vector<std::string> added, removed, status;
  for (const auto& w : c.wells) {
    if (w.change == screening::Change::added) added.push_back(w.id);
    if (w.change == screening::Change::removed) removed.push_back(w.id);
    if (w.change == screening::Change::changed) status.push_back(w.id + " " + *w.old_status + " -> " + *w.new_status);
  }
  out << "Wells added: " << joined(added, most) << "; removed: " << joined(removed, most)
      << "; status changed: " << joined(status, most) << "\n";
  constexpr auto V = outputs::Quantity::volume;
  out << "Volume by well between the histories' ends (" << date_of(c.history_end_old) << " to "
      << date_of(c.history_end_new) << ", " << u.symbol(V) << "): ";
  std::size_t shown = 0;
  for (const auto& w : c.wells) {
    // A removed well is named above (its history, now gone, is in comparison.json).
    if (w.change == screening::Change::removed) continue;
    if (w.volume_reported_new == 0 && w.volume_expected_old == 0 && w.volume_revised == 0) continue;
    if (shown++ == 0) out << "\n";
    if (shown > most) continue;
    out << "  " << w.id << ": reported " << u.text(w.volume_reported_new, V, 0) << " (the earlier run expected "
        << u.text(w.volume_expected_old, V, 0) << ")";
    if (w.volume_revised != 0) out << "; earlier history revised by " << u.text(w.volume_revised, V, 0);
    out << "\n";
  }
  if (shown == 0) out << "none\n";
  else if (shown > most) out << "  ... (" << shown - most << " more wells in comparison.json)\n";
}

void print_probabilities(const screening::Comparison& c, std::ostream& out, std::size_t most) {
  out << "P(slip) at " << c.common_dates.size() << " common output dates (" << c.common_dates.front() << " to "
      << c.common_dates.back() << "), " << c.realizations_old << " and " << c.realizations_new << " realizations\n";
  if (!c.segments_only_old.empty()) out << "  segments only in the earlier run: " << joined(c.segments_only_old, most) << "\n";
  if (!c.segments_only_new.empty()) out << "  segments only in the later run: " << joined(c.segments_only_new, most) << "\n";
  // Each moved segment at its date of largest |z|.
  std::vector<const screening::SegmentChange*> moved;
  for (const auto& s : c.segments) {
    if (!s.test.exceeds_noise) continue;
    if (!moved.empty() && moved.back()->segment_id == s.segment_id) {
      if (std::fabs(s.test.z) > std::fabs(moved.back()->test.z)) moved.back() = &s;
    } else {
      moved.push_back(&s);
    }
  }
  out << "Segments whose P(slip) changed by more than Monte Carlo noise (pooled two-proportion z test, 95 %): "
      << moved.size() << "\n";
  for (std::size_t i = 0; i < moved.size() && i < most; ++i) {
    const auto& s = *moved[i];
    out << "  " << s.segment_id << " at " << s.date << ": " << util::fixed_decimals(s.p_old, 4) << " -> "
        << util::fixed_decimals(s.p_new, 4) << " (z = " << util::fixed_decimals(s.test.z, 2) << ")\n";
  }
  if (moved.size() > most) out << "  ... (" << moved.size() - most << " more in comparison.csv)\n";
  for (const auto& f : c.flags)
    out << "Threshold " << util::fixed_decimals(f.threshold, 3) << " at " << *c.flag_date
        << ": newly flagged " << joined(f.newly_flagged, most) << "; cleared " << joined(f.cleared, most) << "\n";
}

void print_catalog(const screening::CatalogChange& k, std::ostream& out) {
  if (!k.old_reviewed || !k.new_reviewed) {
    out << "Catalog: earlier run " << (k.old_reviewed ? "reviewed" : "not reviewed") << ", later run "
        << (k.new_reviewed ? "reviewed" : "not reviewed") << "; no comparison\n";
    return;
  }
  out << "Catalog: " << k.new_events.size() << " events after the earlier review's last event ("
      << k.old_last_time.value_or("none") << ")";
  if (!k.new_events.empty()) {
    const auto largest = std::max_element(k.new_events.begin(), k.new_events.end(),
                                          [](const auto& a, const auto& b) { return a.magnitude < b.magnitude; });
    out << ", largest M " << util::fixed_decimals(largest->magnitude, 1);
  }
  out << "\n  Mc " << number(k.mc_old, 2) << " -> " << number(k.mc_new, 2) << "; b " << number(k.b_old, 3) << " -> "
      << number(k.b_new, 3) << "; seismogenic index " << number(k.sigma_old, 3) << " -> " << number(k.sigma_new, 3)
      << "\n";
}

int compare(const CompareCommandOptions& o, Context& ctx) {
  run::CompareJob job;
  job.old_run = o.old_run;
  job.new_run = o.new_run;
  job.out = o.out;
  job.force = o.force;
  job.reproducible = o.reproducible;
  if (!o.units.empty()) job.units = units::unit_system_named(o.units);
  job.command_line = ctx.command_line;
  job.notice = [&ctx](const std::string& line) { ctx.err << "slipscreen: " << line << "\n"; };
  const run::CompareJobResult r = run::run_compare_job(job);
  const auto& c = r.comparison;
  const std::size_t most = static_cast<std::size_t>(o.list);
  auto& out = ctx.out;
  out << "Comparison of " << r.old_run.folder << " (earlier) with " << r.new_run.folder << " (later)\n"
      << "Region: " << r.new_run.region << "; working CRS " << r.new_run.crs << "\n";
  if (!c.any_change()) out << "No change: the two runs have the same inputs, parameters, wells, P(slip) and catalog.\n";
  print_inputs(c, out, most);
  print_wells(c, outputs::OutputUnits(r.units), out, most);
  print_probabilities(c, out, most);
  print_catalog(c.catalog, out);
  out << "Written to " << r.folder.generic_string() << ": comparison.csv, comparison.json, README.txt, manifest.json\n";
  out << "\nScreening caution: " << kScreeningCaution << "\n";
  return 0;
}

}  // namespace

void register_compare_command(CLI::App& app, Context& ctx) {
  auto opts = std::make_shared<CompareCommandOptions>();
  CLI::App* sub = app.add_subcommand(
      "compare", "Compare two finished runs of one region: what changed since the earlier review (docs/compare.md)");
  sub->footer("Reads the two run folders only (manifest.json and tables); nothing is computed again. Writes\n"
              "comparison.csv and comparison.json into a new folder (default: compare-<OLD>-<NEW> beside NEW_RUN).");
  sub->add_option("old_run", opts->old_run, "The earlier run folder (`slipscreen run` or `demo`)")->required();
  sub->add_option("new_run", opts->new_run, "The later run folder")->required();
  sub->add_option("--out", opts->out, "Folder for the comparison (default: compare-<OLD>-<NEW> beside NEW_RUN)");
  sub->add_flag("--force", opts->force,
                "Replace an earlier comparison folder (never a run or any other folder); the old one stays until "
                "the new one is complete");
  sub->add_flag("--reproducible", opts->reproducible, "Leave the creation time out of the manifest");
  sub->add_option("--units", opts->units,
                  "Units of comparison.csv and the summary: SI or oilfield; default: the later run's")
      ->check(unit_system_name());
  sub->add_option("--list", opts->list, "Most items listed per line of the summary")
      ->default_val(10)
      ->check(in_range(1, 10000, "a number of items"));
  sub->callback([opts, &ctx] { ctx.action = [opts, &ctx] { return compare(*opts, ctx); }; });
}

}  // namespace slipscreen::cli
