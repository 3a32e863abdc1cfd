#include "outputs/report/report_tables.hpp"

#include <algorithm>
#include <numeric>

#include "core/units/units.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs::report {
namespace {

std::string output_file(const ReportSource& s, const char* key, const char* fallback) {
  const auto& files = s.manifest.value("parameters", nlohmann::json::object())
                          .value("scenario", nlohmann::json::object())
                          .value("output", nlohmann::json::object())
                          .value("files", nlohmann::json::object());
  const auto it = files.find(key);
  return it != files.end() && it->is_string() ? it->get<std::string>() : fallback;
}

bool output_flag(const ReportSource& s, const char* key) {
  const auto& out = s.manifest.value("parameters", nlohmann::json::object())
                        .value("scenario", nlohmann::json::object())
                        .value("output", nlohmann::json::object());
  const auto it = out.find(key);
  return it == out.end() || !it->is_boolean() || it->get<bool>();
}

}  // namespace

std::string segments_file(const ReportSource& s) { return output_file(s, "segments", "segments.csv"); }
std::string segment_times_file(const ReportSource& s) { return output_file(s, "segment_times", "segment_times.csv"); }
std::string pressure_raster_file(const ReportSource& s) {
  return output_flag(s, "rasters") ? output_file(s, "pressure_raster", "pressure_change.tif") : "";
}
std::string geopackage_file(const ReportSource& s) {
  return output_flag(s, "geopackage") ? output_file(s, "geopackage", "screen.gpkg") : "";
}
std::string pressure_history_file(const ReportSource& s) {
  return (std::filesystem::path(segment_times_file(s)).parent_path() / "segment_pressure_history.csv").generic_string();
}

std::string capacity_curve_file(const ReportSource& s) { return output_file(s, "capacity_curve", "capacity_curve.csv"); }
std::string what_if_file(const ReportSource& s) { return output_file(s, "what_if", "what_if.csv"); }

const nlohmann::json* capacity_block(const ReportSource& s) {
  const auto p = s.manifest.find("parameters");
  if (p == s.manifest.end() || !p->is_object()) return nullptr;
  const auto c = p->find("capacity");
  return c != p->end() && c->is_object() ? &*c : nullptr;
}

DisplayUnit pressure_unit(const ReportSource& s) {
  const auto& out = s.manifest.value("parameters", nlohmann::json::object())
                        .value("scenario", nlohmann::json::object())
                        .value("output", nlohmann::json::object());
  const auto it = out.find("units");
  if (it != out.end() && it->is_string() && it->get<std::string>() == "oilfield") return {"psi", units::kPsi};
  return {"MPa", 1e6};
}

bool has_probabilistic(const ReportSource& s) {
  return RunTable::exists(s.folder, "segment_probability_summary.csv") &&
         RunTable::exists(s.folder, "segment_probability.csv");
}

std::vector<double> thresholds(const ReportSource& s) {
  std::vector<double> out;
  if (!has_probabilistic(s)) return out;
  const auto& t = s.manifest.value("parameters", nlohmann::json::object())
                      .value("probabilistic", nlohmann::json::object())
                      .value("uncertainty", nlohmann::json::object())
                      .value("thresholds", nlohmann::json::array());
  for (const auto& v : t)
    if (v.is_number()) out.push_back(v.get<double>());
  return out;
}

TopSegments top_segments(const ReportSource& s, std::size_t n) {
  TopSegments top;
  std::vector<std::pair<std::string, double>> ranked;  // id, key (smaller first)
  if (has_probabilistic(s)) {
    top.probabilistic = true;
    const RunTable& t = s.table("segment_probability_summary.csv");
    const std::size_t id = t.column("segment_id"), p = t.column("p_slip_final");
    for (std::size_t r = 0; r < t.rows(); ++r) ranked.emplace_back(t.text(r, id), -t.number(r, p));
  } else if (RunTable::exists(s.folder, segments_file(s))) {
    const RunTable& t = s.table(segments_file(s));
    const std::size_t id = t.column("segment_id");
    const auto [m, factor] = t.quantity_column("margin");
    for (std::size_t r = 0; r < t.rows(); ++r) ranked.emplace_back(t.text(r, id), t.number(r, m) * factor);
  }
  std::stable_sort(ranked.begin(), ranked.end(), [](const auto& a, const auto& b) { return a.second < b.second; });
  for (std::size_t i = 0; i < ranked.size() && i < n; ++i) top.ids.push_back(ranked[i].first);
  return top;
}

}  // namespace slipscreen::outputs::report
