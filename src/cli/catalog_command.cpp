// `slipscreen catalog`: the earthquake-catalog review on its own. Reads a CSV (common header
// spellings, or a column mapping), FDSN text or QuakeML catalog, applies filters, and reports Mc, b-value, counts, unusable rows,
// bounds on the largest magnitude, the seismogenic index and forecasts — as a readable summary
// or JSON — and optionally writes a folder with the summary, the kept events and an r-t table
// around a chosen well.
#include <CLI/CLI.hpp>
#include <cmath>
#include <filesystem>
#include <memory>
#include <ostream>
#include <sstream>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "cli/option_range.hpp"
#include "core/errors.hpp"
#include "core/seismo/catalog_filter.hpp"
#include "core/seismo/catalog_summary.hpp"
#include "core/units/units.hpp"
#include "cli/catalog_report.hpp"
#include "formats/catalog/catalog_csv.hpp"
#include "formats/table/csv_fields.hpp"
#include "formats/table/iso_time.hpp"
#include "run/catalog_job.hpp"

namespace slipscreen::cli {
namespace {

namespace fs = std::filesystem;
using units::Dimension;

struct CatalogOptions {
  std::string file, format = "auto", columns;
  bool strict = false, json = false, force = false;
  std::string from, to, polygon, radius = "10 km", depth_min, depth_max;
  std::vector<std::string> near, magnitude_types, faults, diffusivities, forecast_magnitudes;
  double bin = 0.1, mc_correction = 0.0, confidence = 0.95;
  std::string mc;
  std::size_t bootstrap = 0;
  std::uint64_t seed = 1;
  std::string net_volume, shear_modulus = "30 GPa", volume_history, planned_volume;
  std::string length_regression = "surface";
  std::string out, well, start;
  std::string units = "SI";
};

double parse_plain_number(const std::string& text, const std::string& field, const std::string& expected) {
  try {
    std::size_t used = 0;
    const double v = std::stod(text, &used);
    if (used == text.size() && std::isfinite(v)) return v;
  } catch (const std::exception&) {
  }
  throw InputError(field, text, expected);
}

// "x,y" or "x y" in the catalog's coordinates.
std::array<double, 2> parse_point(const std::string& text, const std::string& field) {
  std::string t = text;
  for (auto& c : t)
    if (c == ',') c = ' ';
  std::istringstream in(t);
  double x = 0, y = 0;
  std::string rest;
  if (!(in >> x >> y) || (in >> rest))
    throw InputError(field, text, "two coordinates 'x,y' (longitude,latitude for a geographic catalog)");
  return {x, y};
}

std::vector<std::array<double, 2>> parse_polygon(const std::string& text) {
  std::vector<std::array<double, 2>> ring;
  std::size_t pos = 0;
  while (pos <= text.size()) {
    const auto next = text.find(';', pos);
    const std::string v = text.substr(pos, next == std::string::npos ? std::string::npos : next - pos);
    pos = next == std::string::npos ? text.size() + 1 : next + 1;
    if (v.find_first_not_of(" \t") == std::string::npos) continue;
    ring.push_back(parse_point(v, "--polygon vertex"));
  }
  if (ring.size() < 3) throw InputError("--polygon", text, "at least 3 vertices 'x y; x y; x y'");
  return ring;
}

std::vector<std::string> split_list(const std::vector<std::string>& items) {
  std::vector<std::string> out;
  for (const auto& it : items)
    for (auto& f : formats::split_csv_record(it))
      if (!f.empty()) out.push_back(f);
  return out;
}

seismo::CatalogFilter build_filter(const CatalogOptions& o) {
  seismo::CatalogFilter f;
  if (!o.from.empty()) f.start = formats::parse_iso8601_utc(o.from, "--from");
  if (!o.to.empty()) f.end = formats::parse_iso8601_utc(o.to, "--to");
  if (!o.polygon.empty()) f.polygon = parse_polygon(o.polygon);
  for (const auto& p : o.near) f.buffer_points.push_back(parse_point(p, "--near"));
  if (!f.buffer_points.empty()) f.buffer_radius = units::parse(o.radius, Dimension::length, "--radius");
  if (!o.depth_min.empty()) f.depth_min = units::parse(o.depth_min, Dimension::length, "--depth-min");
  if (!o.depth_max.empty()) f.depth_max = units::parse(o.depth_max, Dimension::length, "--depth-max");
  f.magnitude_types = split_list(o.magnitude_types);
  f.strict = o.strict;
  return f;
}

seismo::SummaryOptions build_summary_options(const CatalogOptions& o) {
  seismo::SummaryOptions s;
  s.bin_width = o.bin;
  s.mc_correction = o.mc_correction;
  if (!o.mc.empty()) s.fixed_mc = parse_plain_number(o.mc, "--mc", "a magnitude such as 1.5");
  s.bootstrap_resamples = o.bootstrap;
  s.bootstrap_confidence = o.confidence;
  s.seed = o.seed;
  if (!o.net_volume.empty()) s.net_volume = units::parse(o.net_volume, Dimension::volume, "--net-volume");
  s.shear_modulus = units::parse(o.shear_modulus, Dimension::pressure, "--shear-modulus");
  if (!o.planned_volume.empty()) s.planned_volume = units::parse(o.planned_volume, Dimension::volume, "--planned-volume");
  if (!o.forecast_magnitudes.empty()) {
    s.forecast_magnitudes.clear();
    for (const auto& m : split_list(o.forecast_magnitudes))
      s.forecast_magnitudes.push_back(parse_plain_number(m, "--forecast-magnitude", "a magnitude such as 3.0"));
  }
  for (const auto& f : o.faults) {
    const auto eq = f.find('=');
    if (eq == std::string::npos || eq == 0) throw InputError("--fault", f, "NAME=LENGTH such as 'Fault A=4.5 km'");
    s.faults.push_back({f.substr(0, eq), units::parse(f.substr(eq + 1), Dimension::length, "--fault " + f.substr(0, eq))});
  }
  if (o.length_regression == "surface") s.regression = seismo::LengthRegression::surface_rupture_length_all;
  else if (o.length_regression == "subsurface") s.regression = seismo::LengthRegression::subsurface_rupture_length_all;
  else throw InputError("--length-regression", o.length_regression, "'surface' or 'subsurface'");
  return s;
}

// r-t view around a point (a well).
std::optional<run::RtRequest> build_rt(const CatalogOptions& o) {
  if (o.well.empty()) return std::nullopt;
  run::RtRequest r;
  r.well = parse_point(o.well, "--well");
  if (!o.start.empty()) r.start = formats::parse_iso8601_utc(o.start, "--start");
  for (const auto& t : split_list(o.diffusivities)) r.diffusivities.push_back(units::parse(t, Dimension::diffusivity, "--diffusivity"));
  if (r.diffusivities.empty()) r.diffusivities = {0.01, 0.1, 1.0};
  return r;
}

int run_catalog(const CatalogOptions& o, Context& ctx) {
  run::CatalogJob job;
  job.file = o.file;
  job.format = formats::parse_catalog_format(o.format, "--format");
  if (!o.columns.empty()) job.columns = formats::parse_catalog_columns(o.columns);
  job.strict = o.strict;
  job.filter = build_filter(o);
  job.summary = build_summary_options(o);
  job.volume_history = o.volume_history;
  job.rt = build_rt(o);
  job.out = o.out;
  job.force = o.force;
  if (!o.units.empty()) job.units = *units::unit_system_named(o.units);
  job.command_line = ctx.command_line;
  job.notice = [&ctx](const std::string& line) { ctx.err << "slipscreen: " << line << "\n"; };
  const run::CatalogJobResult r = run::run_catalog_job(job);
  if (o.json) ctx.out << r.json.dump(2, ' ', false, nlohmann::json::error_handler_t::replace) << "\n";
  else
    print_catalog_summary(ctx.out, r.read, r.filtered.counts, r.summary, r.rt, static_cast<std::size_t>(-1),
                          outputs::OutputUnits(job.units));
  if (!o.out.empty() && !o.json)
    ctx.out << "\nWrote " << o.out << "/ (catalog_summary.json, catalog_events.csv"
            << (r.rt ? ", rt_events.csv, rt_fronts.csv" : "") << ", README.txt, manifest.json)\n";
  return kExitOk;
}

}  // namespace

void register_catalog_command(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<CatalogOptions>();
  CLI::App* sub = app.add_subcommand("catalog", "Review an earthquake catalog: completeness, b-value, bounds, seismogenic index, forecasts");
  sub->add_option("file", o->file, "Catalog file: CSV, FDSN event service text, or QuakeML 1.2")->required();
  sub->add_option("--format", o->format, "auto (by extension and header), csv (also FDSN text, told by its header) or quakeml")
      ->default_val("auto");
  sub->add_option("--columns", o->columns,
                  "CSV column mapping for headers without the common spellings (time, lat/latitude, lon/long/longitude, "
                  "depth in km, mag/magnitude, magType, id), e.g. 'time=origin;depth=z;depth_unit=m' (docs/catalogs.md)");
  sub->add_flag("--strict", o->strict, "Unusable rows and unknown magnitude types (with --magnitude-type) are errors");
  sub->add_option("--from", o->from, "Keep events at or after this ISO 8601 UTC time");
  sub->add_option("--to", o->to, "Keep events before this ISO 8601 UTC time");
  sub->add_option("--polygon", o->polygon, "Region polygon 'x y; x y; x y; ...' in the catalog's coordinates");
  sub->add_option("--near", o->near, "Keep events within --radius of this point 'x,y' (repeatable: wells)");
  sub->add_option("--radius", o->radius, "Buffer radius around --near points")->default_val("10 km");
  sub->add_option("--depth-min", o->depth_min, "Minimum depth, e.g. '1 km'");
  sub->add_option("--depth-max", o->depth_max, "Maximum depth, e.g. '8 km'");
  sub->add_option("--magnitude-type", o->magnitude_types, "Keep these magnitude types (repeatable or comma list)");
  sub->add_option("--bin", o->bin, "Magnitude bin width")
      ->default_val(0.1)
      ->check(in_range(0, 1, "a magnitude bin width", Ends::open_low));
  sub->add_option("--mc-correction", o->mc_correction, "Added to the maximum-curvature Mc (usual: 0.2)")
      ->default_val(0.0)
      ->check(in_range(0, 1, "a magnitude correction"));
  sub->add_option("--mc", o->mc, "Use this magnitude of completeness instead of estimating it")
      ->check(in_range(-2, 10, "a magnitude"));
  sub->add_option("--bootstrap", o->bootstrap, "Bootstrap resamples for a b-value interval (0: none)")
      ->default_val(0)
      ->check(in_range(0, 100000, "a number of resamples"));
  sub->add_option("--confidence", o->confidence, "Bootstrap interval confidence")
      ->default_val(0.95)
      ->check(strictly_between(0, 1, "a confidence level"));
  sub->add_option("--seed", o->seed, "Seed of the bootstrap")->default_val(1)->check(whole_number("a seed"));
  sub->add_option("--net-volume", o->net_volume, "Net injected volume for the McGarr bound, e.g. '1e6 m3'");
  sub->add_option("--shear-modulus", o->shear_modulus, "Shear modulus for the McGarr bound")->default_val("30 GPa");
  sub->add_option("--volume-history", o->volume_history, "CSV of time,cumulative_volume for the seismogenic index");
  sub->add_option("--planned-volume", o->planned_volume, "Further planned injected volume for forecasts, e.g. '5e5 m3'");
  sub->add_option("--forecast-magnitude", o->forecast_magnitudes, "Magnitudes to forecast (default 3.0 and 4.0)");
  sub->add_option("--fault", o->faults, "Mapped fault NAME=LENGTH for a length-magnitude bound (repeatable)");
  sub->add_option("--length-regression", o->length_regression,
                  "Wells & Coppersmith (1994) all-slip regression: surface or subsurface rupture length")->default_val("surface");
  sub->add_option("--well", o->well, "Well location 'x,y' for the r-t view (catalog coordinates)");
  sub->add_option("--start", o->start, "Injection start time for the r-t view (default: first volume sample)");
  sub->add_option("--diffusivity", o->diffusivities, "Diffusivities for the front curves (default 0.01, 0.1, 1 m2/s)");
  sub->add_flag("--json", o->json, "Print the summary as JSON");
  sub->add_option("--out", o->out, "Write a folder with the summary, kept events and r-t tables");
  sub->add_option("--units", o->units, "Units of the --out tables and the summary: SI (m3, m, km) or oilfield (bbl, ft, mi)")
      ->default_val("SI")
      ->check(unit_system_name());
  sub->add_flag("--force", o->force, "Replace an earlier slipscreen catalog folder at --out (one holding only what its manifest lists)");
  sub->callback([o, &ctx] { ctx.action = [o, &ctx] { return run_catalog(*o, ctx); }; });
}

}  // namespace slipscreen::cli
