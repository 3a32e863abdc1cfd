#include "io/catalog_outputs.hpp"

#include <algorithm>
#include <cstdio>
#include <fstream>
#include <sstream>

#include "core/caution.hpp"
#include "core/errors.hpp"
#include "core/seismo/epicentral_distance.hpp"
#include "core/units/units.hpp"
#include "io/iso_time.hpp"
#include "io/run_outputs.hpp"

namespace slipscreen::io {

namespace {

std::string g(double v, int digits) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.*g", digits, v);
  return buf;
}

}  // namespace

void write_text_file(const std::filesystem::path& path, const std::string& text) {
  std::ofstream f(path, std::ios::binary);
  f << text;
  f.close();
  if (!f) throw IoError("cannot write '" + path.string() + "'");
}

RtView make_rt_view(const seismo::Catalog& c, std::array<double, 2> position, double start,
                    std::vector<double> diffusivities, std::string well) {
  RtView v;
  v.well = std::move(well);
  v.position = position;
  v.start = start;
  std::sort(diffusivities.begin(), diffusivities.end());
  diffusivities.erase(std::unique(diffusivities.begin(), diffusivities.end()), diffusivities.end());
  v.diffusivities = std::move(diffusivities);
  std::vector<double> r;
  for (const auto& e : c.events) r.push_back(seismo::epicentral_distance(c.kind, position[0], position[1], e.x, e.y));
  v.points = seismo::rt_points(seismo::times(c), r, start);
  for (double d : v.diffusivities) v.fraction_inside.push_back(seismo::fraction_inside_front(v.points, d));
  return v;
}

std::string rt_events_csv(const seismo::Catalog& c, const RtView& v) {
  std::ostringstream t;
  t << "# r-t view: distance from " << (v.well.empty() ? "the point" : "well " + v.well) << " at ("
    << g(v.position[0], 10) << ", " << g(v.position[1], 10) << ") against time since "
    << format_iso8601_utc(v.start) << ". " << kScreeningCaution << "\n";
  t << "event_id,time,days_since_start,distance_m,magnitude,diffusivity_through_point_m2_s\n";
  for (const auto& p : v.points) {
    const auto& e = c.events[p.event];
    t << csv_field(e.id) << "," << format_iso8601_utc(e.time) << "," << fixed_decimals(p.t / units::kDay, 4) << ","
      << fixed_decimals(p.r, 1) << "," << g(e.magnitude, 4) << "," << g(p.d_fit, 6) << "\n";
  }
  return t.str();
}

std::string rt_fronts_csv(const RtView& v) {
  std::ostringstream fc;
  fc << "# Triggering fronts r = sqrt(4 pi D t) (Shapiro et al. 1997). " << kScreeningCaution << "\n";
  fc << "days_since_start";
  for (double d : v.diffusivities) fc << ",front_m_D_" << g(d, 4) << "_m2_s";
  fc << "\n";
  double t_max = 0.0;
  for (const auto& p : v.points) t_max = std::max(t_max, p.t);
  if (t_max <= 0.0) t_max = 365.25 * units::kDay;
  const int n = 200;
  for (int k = 0; k <= n; ++k) {
    const double tt = t_max * k / n;
    fc << fixed_decimals(tt / units::kDay, 4);
    for (double d : v.diffusivities) fc << "," << fixed_decimals(seismo::front_radius(d, tt), 1);
    fc << "\n";
  }
  return fc.str();
}

}  // namespace slipscreen::io
