#include "outputs/comparison_read.hpp"

#include <algorithm>
#include <fstream>

#include <nlohmann/json.hpp>

#include "core/errors.hpp"
#include "formats/files/earlier_run.hpp"
#include "formats/table/iso_time.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs {
namespace {

namespace fs = std::filesystem;
using nlohmann::json;

constexpr const char* kProbabilityTable = "segment_probability.csv";
constexpr const char* kCatalogSummary = "catalog_summary.json";
constexpr const char* kCatalogEvents = "catalog_events.csv";
constexpr const char* kNeedsProbabilistic =
    "a run with the probabilistic screen (compare needs P(slip) by date: the scenario's [uncertainty] table)";

json read_json(const fs::path& path, const std::string& shown) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError(shown + ": cannot read " + path.filename().string());
  json j = json::parse(in, nullptr, /*allow_exceptions=*/false);
  if (j.is_discarded() || !j.is_object())
    throw InputError(path.filename().string(), "unreadable JSON", "a JSON object written by slipscreen", shown);
  return j;
}

// The value at `pointer` (e.g. "/parameters/scenario/region/name"), or an InputError naming the key.
const json& need(const json& j, const std::string& pointer, const std::string& file, const std::string& shown,
                 json::value_t type) {
  const json::json_pointer p(pointer);
  if (!j.contains(p) || j.at(p).type() != type)
    throw InputError(pointer, j.contains(p) ? j.at(p).dump() : "missing",
                     std::string("a ") + (type == json::value_t::string ? "text" : json(type).type_name()) +
                         " value (is this run folder complete?)",
                     shown + "/" + file);
  return j.at(p);
}

const json& need_string(const json& j, const std::string& pointer, const std::string& file, const std::string& shown) {
  return need(j, pointer, file, shown, json::value_t::string);
}

const json& need_array(const json& j, const std::string& pointer, const std::string& file, const std::string& shown) {
  return need(j, pointer, file, shown, json::value_t::array);
}

double need_number(const json& j, const std::string& pointer, const std::string& file, const std::string& shown) {
  const json::json_pointer p(pointer);
  if (!j.contains(p) || !j.at(p).is_number())
    throw InputError(pointer, j.contains(p) ? j.at(p).dump() : "missing", "a number (is this run folder complete?)",
                     shown + "/" + file);
  return j.at(p).get<double>();
}

std::optional<double> number_or_null(const json& j, const std::string& pointer) {
  const json::json_pointer p(pointer);
  if (j.contains(p) && j.at(p).is_number()) return j.at(p).get<double>();
  return std::nullopt;
}

// Leaves of `j` as "prefix.key[i]..." -> JSON text.
void flatten(const json& j, const std::string& prefix, std::vector<std::pair<std::string, std::string>>& out) {
  if (j.is_object() && !j.empty()) {
    for (const auto& [k, v] : j.items()) flatten(v, prefix.empty() ? k : prefix + "." + k, out);
  } else if (j.is_array() && !j.empty()) {
    for (std::size_t i = 0; i < j.size(); ++i) flatten(j[i], prefix + "[" + std::to_string(i) + "]", out);
  } else {
    out.emplace_back(prefix, j.dump());
  }
}

std::vector<screening::RunWell> wells_of(const json& m, const std::string& shown) {
  std::vector<screening::RunWell> out;
  const std::string file = "manifest.json";
  for (const auto& w : need_array(m, "/parameters/scenario/wells", file, shown)) {
    screening::RunWell rw;
    rw.id = need_string(w, "/id", file, shown).get<std::string>();
    rw.status = need_string(w, "/status", file, shown).get<std::string>();
    rw.proposed = w.value("proposed", false);
    for (const auto& p : need_array(w, "/periods", file, shown)) {
      const std::string field = "well " + rw.id + " period";
      rw.periods.push_back({formats::parse_iso8601_utc(need_string(p, "/start", file, shown).get<std::string>(), field),
                            formats::parse_iso8601_utc(need_string(p, "/end", file, shown).get<std::string>(), field),
                            need_number(p, "/rate_m3_per_s", file, shown), p.value("assumed", false)});
    }
    out.push_back(std::move(rw));
  }
  return out;
}

void read_probabilities(const fs::path& folder, const std::string& shown, screening::RunRecord& r) {
  if (!report::RunTable::exists(folder, kProbabilityTable))
    throw InputError(kProbabilityTable, "missing",
                     "the P(slip) table its manifest.json lists (the probabilistic screen ran; is the folder complete?)",
                     shown);
  const auto t = report::RunTable::read(folder, kProbabilityTable);
  const auto c_seg = t.column("segment_id"), c_fault = t.column("fault_id"), c_date = t.column("date"),
             c_p = t.column("p_slip");
  for (std::size_t i = 0; i < t.rows(); ++i) {
    screening::RunSegmentProbability p;
    p.segment_id = t.text(i, c_seg);
    p.fault_id = t.text(i, c_fault);
    p.date = t.text(i, c_date);
    formats::parse_iso8601_utc(p.date, kProbabilityTable + std::string(" date"));
    p.p_slip = t.number(i, c_p);
    if (!(p.p_slip >= 0.0 && p.p_slip <= 1.0))
      throw InputError("p_slip", t.text(i, c_p), "a probability in [0, 1]", shown + "/" + kProbabilityTable);
    p.dp_p50 = t.si(i, "dp_p50");
    r.probabilities.push_back(std::move(p));
  }
}

screening::RunCatalogReview read_catalog(const fs::path& folder, const std::string& shown) {
  for (const char* f : {kCatalogSummary, kCatalogEvents})
    if (!report::RunTable::exists(folder, f))
      throw InputError(f, "missing", "the catalog review's file (the manifest says the run reviewed a catalog)", shown);
  screening::RunCatalogReview c;
  const json s = read_json(folder / kCatalogSummary, shown);
  if (s.contains("last_time") && s["last_time"].is_string()) {
    c.last_time = s["last_time"].get<std::string>();
    c.last_time_s = formats::parse_iso8601_utc(*c.last_time, std::string(kCatalogSummary) + " last_time");
  }
  c.mc = number_or_null(s, "/completeness/mc");
  c.b = number_or_null(s, "/b_value/b");
  c.sigma = number_or_null(s, "/seismogenic_index/sigma");
  const auto t = report::RunTable::read(folder, kCatalogEvents);
  const auto c_id = t.column("event_id"), c_time = t.column("time"), c_mag = t.column("magnitude");
  for (std::size_t i = 0; i < t.rows(); ++i)
    c.events.push_back({t.text(i, c_id), t.text(i, c_time),
                        formats::parse_iso8601_utc(t.text(i, c_time), std::string(kCatalogEvents) + " time"),
                        t.number(i, c_mag)});
  return c;
}

json read_manifest(const fs::path& folder, const std::string& shown) {
  std::error_code ec;
  if (!fs::is_directory(folder, ec)) throw RefusedError(shown + ": not a run folder of slipscreen: no such folder");
  if (const auto why = formats::not_a_run(folder)) throw RefusedError(shown + ": not a run folder of slipscreen: " + *why);
  json m = read_json(folder / "manifest.json", shown);
  if (!m.contains("parameters") || !m["parameters"].is_object() || !m["parameters"].contains("scenario"))
    throw RefusedError(shown + ": not a run of a scenario: its manifest.json has no parameters.scenario (the folder "
                               "of `slipscreen catalog --out` or `slipscreen compare`?); give the folders of two "
                               "`slipscreen run` or `demo` runs");
  return m;
}

}  // namespace

std::string run_units(const fs::path& folder) {
  const json m = read_manifest(folder, folder.generic_string());
  const json::json_pointer p("/parameters/scenario/output/units");
  return m.contains(p) && m.at(p).is_string() ? m.at(p).get<std::string>() : std::string("SI");
}

screening::RunRecord read_run_record(const fs::path& folder, const std::string& shown) {
  const json m = read_manifest(folder, shown);
  const std::string mf = "manifest.json";
  screening::RunRecord r;
  r.folder = shown;
  r.region = need_string(m, "/parameters/scenario/region/name", mf, shown).get<std::string>();
  r.crs = need_string(m, "/parameters/scenario/region/crs", mf, shown).get<std::string>();
  for (const auto& f : need_array(m, "/inputs", mf, shown))
    r.inputs.push_back({need_string(f, "/role", mf, shown).get<std::string>(),
                        need_string(f, "/path", mf, shown).get<std::string>(),
                        need_string(f, "/sha256", mf, shown).get<std::string>()});
  json scenario = m["parameters"]["scenario"];
  r.wells = wells_of(m, shown);
  scenario.erase("wells");
  flatten(scenario, "scenario", r.parameters);
  if (!m.value("screens", json::object()).value("probabilistic", false) ||
      !m["parameters"].contains("probabilistic"))
    throw InputError("screens.probabilistic", "false", kNeedsProbabilistic, shown + "/" + mf);
  const json& prob = m["parameters"]["probabilistic"];
  flatten(prob.value("uncertainty", json::object()), "uncertainty", r.parameters);
  if (m["parameters"].contains("catalog")) flatten(m["parameters"]["catalog"], "catalog", r.parameters);
  // An input file's path is no parameter: the inputs are compared by content (SHA-256), and the
  // same file named from another working directory is the same input.
  std::erase_if(r.parameters, [&](const auto& kv) {
    return std::any_of(r.inputs.begin(), r.inputs.end(), [&](const auto& f) { return json(f.path).dump() == kv.second; });
  });
  std::sort(r.parameters.begin(), r.parameters.end());
  const double n = need_number(m, "/parameters/probabilistic/realizations_valid", mf, shown);
  if (!(n >= 1.0))
    throw InputError("parameters.probabilistic.realizations_valid", std::to_string(n), "at least one valid realization",
                     shown + "/" + mf);
  r.realizations = static_cast<std::uint64_t>(n);
  for (const auto& t : need_array(m, "/parameters/probabilistic/uncertainty/thresholds", mf, shown)) {
    if (!t.is_number()) throw InputError("thresholds", t.dump(), "numbers", shown + "/" + mf);
    r.thresholds.push_back(t.get<double>());
  }
  try {  // the tables' messages name the file only: add the folder, both runs have the same names
    read_probabilities(folder, shown, r);
    if (m.value("screens", json::object()).value("catalog_review", false)) r.catalog = read_catalog(folder, shown);
  } catch (const InputError& e) {
    if (e.where().rfind(shown, 0) == 0) throw;
    throw e.located(shown);
  }
  return r;
}

}  // namespace slipscreen::outputs
