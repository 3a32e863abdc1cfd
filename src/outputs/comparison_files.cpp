#include "outputs/comparison_files.hpp"

#include <cmath>
#include <fstream>
#include <sstream>

#include "core/caution.hpp"
#include "core/util/number_text.hpp"
#include "formats/files/earlier_run.hpp"
#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"
#include "formats/table/iso_time.hpp"
#include "outputs/run_readme.hpp"

namespace slipscreen::outputs {
namespace {

using nlohmann::json;
using util::fixed_decimals;

std::string thresholds_text(const std::vector<double>& t) {
  std::string s;
  for (double v : t) {
    if (!s.empty()) s += ';';
    s += fixed_decimals(v, 3);
  }
  return s;
}

json optional_text(const std::optional<std::string>& s) { return s ? json(*s) : json(nullptr); }
json optional_number(const std::optional<double>& v) { return v && std::isfinite(*v) ? json(*v) : json(nullptr); }
json optional_time(const std::optional<double>& t) {
  return t ? json(formats::format_iso8601_utc(*t)) : json(nullptr);
}
json change_of(const std::optional<double>& a, const std::optional<double>& b) {
  return a && b ? json(*b - *a) : json(nullptr);
}
// A parameter's value as the manifest wrote it (JSON text) back to JSON.
json value_of(const std::optional<std::string>& text) {
  if (!text) return nullptr;
  json j = json::parse(*text, nullptr, false);
  return j.is_discarded() ? json(*text) : j;
}

json run_json(const screening::RunRecord& r, const std::optional<double>& history_end) {
  return {{"folder", r.folder},
          {"region", r.region},
          {"working_crs", r.crs},
          {"realizations", r.realizations},
          {"thresholds", r.thresholds},
          {"history_end", optional_time(history_end)},
          {"catalog_reviewed", r.catalog.has_value()}};
}

json catalog_json(const screening::CatalogChange& k) {
  const auto review = [](bool reviewed, const std::optional<std::string>& last, const std::optional<double>& mc,
                         const std::optional<double>& b, const std::optional<double>& sigma) {
    if (!reviewed) return json("not reviewed");
    return json{{"last_event", optional_text(last)}, {"mc", optional_number(mc)}, {"b", optional_number(b)},
                {"sigma", optional_number(sigma)}};
  };
  json j;
  j["old"] = review(k.old_reviewed, k.old_last_time, k.mc_old, k.b_old, k.sigma_old);
  j["new"] = review(k.new_reviewed, k.new_last_time, k.mc_new, k.b_new, k.sigma_new);
  if (k.old_reviewed && k.new_reviewed) {
    json ev = json::array();
    for (const auto& e : k.new_events) ev.push_back({{"event_id", e.id}, {"time", e.time}, {"magnitude", e.magnitude}});
    j["events_after_old_last_event"] = ev;
    j["change"] = {{"mc", change_of(k.mc_old, k.mc_new)}, {"b", change_of(k.b_old, k.b_new)},
                   {"sigma", change_of(k.sigma_old, k.sigma_new)}};
  } else {
    j["events_after_old_last_event"] = "not reviewed";
    j["change"] = "not reviewed";
  }
  return j;
}

}  // namespace

std::string comparison_csv(const screening::Comparison& c, const OutputUnits& u) {
  using formats::csv_field;
  constexpr Quantity P = Quantity::pressure;
  std::ostringstream t;
  t << "segment_id,fault_id,date,p_slip_old,p_slip_new,p_slip_change,z,exceeds_noise," << u.column("dp_p50_old", P)
    << ',' << u.column("dp_p50_new", P) << ",newly_flagged,cleared\n";
  for (const auto& s : c.segments)
    t << csv_field(s.segment_id) << ',' << csv_field(s.fault_id) << ',' << s.date << ',' << fixed_decimals(s.p_old, 4)
      << ',' << fixed_decimals(s.p_new, 4) << ',' << fixed_decimals(s.test.change, 4) << ','
      << fixed_decimals(s.test.z, 3) << ',' << (s.test.exceeds_noise ? "yes" : "no") << ','
      << u.text(s.dp_p50_old, P, 4) << ',' << u.text(s.dp_p50_new, P, 4) << ',' << thresholds_text(s.newly_flagged)
      << ',' << thresholds_text(s.cleared) << '\n';
  return t.str();
}

json comparison_json(const screening::Comparison& c, const screening::RunRecord& o, const screening::RunRecord& n) {
  json j;
  j["caution"] = kScreeningCaution;
  j["old_run"] = run_json(o, c.history_end_old);
  j["new_run"] = run_json(n, c.history_end_new);
  j["any_change"] = c.any_change();

  json inputs = json::array();
  for (const auto& i : c.inputs) {
    const auto file = [](const std::optional<screening::RunInputFile>& f) {
      return f ? json{{"path", f->path}, {"sha256", f->sha256}} : json(nullptr);
    };
    inputs.push_back({{"role", i.role}, {"change", screening::change_name(i.change)}, {"old", file(i.old_file)},
                      {"new", file(i.new_file)}});
  }
  j["inputs"] = inputs;
  json params = json::array();
  for (const auto& p : c.parameters) params.push_back({{"key", p.key}, {"old", value_of(p.old_value)}, {"new", value_of(p.new_value)}});
  j["parameters"] = params;

  json wells = json::array();
  for (const auto& w : c.wells)
    wells.push_back({{"well_id", w.id},
                     {"change", screening::change_name(w.change)},
                     {"old_status", optional_text(w.old_status)},
                     {"new_status", optional_text(w.new_status)},
                     {"volume_reported_new_m3", w.volume_reported_new},
                     {"volume_expected_old_m3", w.volume_expected_old},
                     {"volume_revised_before_old_end_m3", w.volume_revised}});
  j["wells"] = {{"volume_interval", {{"from", optional_time(c.history_end_old)}, {"to", optional_time(c.history_end_new)}}},
                {"wells", wells}};

  j["probabilities"] = {
      {"test", "pooled two-proportion z test, two-sided (Fleiss, Levin & Paik 2003), no continuity correction"},
      {"confidence", 0.95},
      {"z_critical", c.z_crit},
      {"realizations_old", c.realizations_old},
      {"realizations_new", c.realizations_new},
      {"common_dates", c.common_dates},
      {"segments_only_old", c.segments_only_old},
      {"segments_only_new", c.segments_only_new},
      {"segments_exceeding_noise", c.moved_segments()}};
  json th = json::array();
  for (const auto& f : c.flags)
    th.push_back({{"threshold", f.threshold}, {"date", optional_text(c.flag_date)},
                  {"newly_flagged", f.newly_flagged}, {"cleared", f.cleared}});
  j["thresholds"] = th;
  j["catalog"] = catalog_json(c.catalog);
  return j;
}

void write_comparison_folder(const formats::RunFolder& folder, const screening::Comparison& c,
                             const screening::RunRecord& o, const screening::RunRecord& n, const ComparisonRecord& record) {
  const OutputUnits u(record.units);
  formats::write_text_file(folder.output("comparison", kComparisonTable), comparison_csv(c, u));
  formats::write_text_file(folder.output("comparison", kComparisonJson),
                           comparison_json(c, o, n).dump(2, ' ', false, json::error_handler_t::replace) + "\n");
  ReadmeContent readme;
  readme.title = "slipscreen comparison: " + o.folder + " (earlier) against " + n.folder + " (later)";
  readme.facts = {"Earlier run: " + o.folder, "Later run: " + n.folder,
                  "Region: " + n.region + "; working CRS " + n.crs,
                  readme_units_line(u, "comparison.json in SI")};
  readme.oilfield_units = record.units == units::UnitSystem::oilfield;
  readme.files = {{kComparisonTable, "one row per fault segment and output date of both runs: P(slip by date) "
                                     "earlier and later, the change, the pooled two-proportion z and whether the "
                                     "change exceeds Monte Carlo noise at 95 %, the median dp of both runs, the "
                                     "thresholds newly reached or no longer reached"},
                  {kComparisonJson, "what changed: input files and parameters, wells and their volumes between "
                                    "the two histories' ends, P(slip) test settings, segments newly flagged or "
                                    "cleared per threshold, the catalog reviews (SI)"}};
  write_readme(folder, readme);

  formats::ManifestContent m;
  m.command_line = record.command_line;
  m.caution = kScreeningCaution;
  m.inputs = record.inputs;
  m.include_timestamp = !record.reproducible;
  m.screens = {{"comparison", true}};
  m.parameters = {{"comparison", {{"old_run", o.folder}, {"new_run", n.folder}, {"confidence", 0.95},
                                  {"units", std::string(units::unit_system_name(record.units))}}}};
  formats::write_manifest(folder.output("manifest", "manifest.json"), m, folder.staging());
}

std::optional<std::string> not_a_comparison(const std::filesystem::path& folder) {
  if (auto why = formats::not_a_run(folder)) return why;
  std::ifstream in(folder / "manifest.json", std::ios::binary);
  const json m = json::parse(in, nullptr, false);
  const json::json_pointer p("/screens/comparison");
  if (m.is_discarded() || !m.is_object() || !m.contains(p) || m.at(p) != json(true))
    return std::string("it is a slipscreen run, not the output of `slipscreen compare`");
  return std::nullopt;
}

}  // namespace slipscreen::outputs
