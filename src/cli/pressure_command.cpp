// `slipscreen pressure`: pore-pressure change Δp at given distances or points and times, from
// one or more wells with rate schedules, by the Theis line source with superposition
// (src/core/hydro). Every input carries its unit; the table shows units in its headers, and
// `--json` writes the same numbers for scripts. `--example` runs the fictional example in
// regions/example-pressure/; `--file` reads the same settings from any such TOML file
// (scenario/pressure_query.hpp; format in docs/pressure.md).
#include <CLI/CLI.hpp>
#include <algorithm>
#include <cmath>
#include <filesystem>
#include <iomanip>
#include <map>
#include <memory>
#include <nlohmann/json.hpp>
#include <optional>
#include <ostream>
#include <sstream>

#include "cli/commands.hpp"
#include "core/util/trim.hpp"
#include "cli/exit_codes.hpp"
#include "core/caution.hpp"
#include "core/errors.hpp"
#include "core/hydro/pressure_field.hpp"
#include "core/units/units.hpp"
#include "scenario/pressure_query.hpp"

namespace slipscreen::cli {
namespace {

using units::Dimension;

// Everything the command needs, as text with units (from the command line or a TOML file).
struct PressureOptions {
  std::string permeability, thickness, viscosity, porosity, compressibility;
  std::string transmissivity, storativity, density;
  std::string well_radius = "0.1 m";
  std::vector<std::string> wells;      // "NAME=X,Y"
  std::vector<std::string> rates;      // "[NAME=]RATE [from START]"
  std::vector<std::string> distances;  // along +x from the first well
  std::vector<std::string> points;     // "X,Y"
  std::vector<std::string> boundaries; // "KIND: X,Y,AZIMUTH"
  std::vector<std::string> times;      // since time zero of the schedules
  std::string unit;         // empty: the file's, else MPa
  std::string length_unit;  // empty: the file's, else m
  std::string file;
  bool example = false;
  bool json = false;
};

std::vector<std::string> split(const std::string& s, char sep) {
  std::vector<std::string> out;
  std::string cur;
  std::istringstream in(s);
  while (std::getline(in, cur, sep)) out.push_back(util::trim(cur));
  return out;
}

// ---- a settings file (read by scenario::read_pressure_query) as the same options ----

// Options given on the command line win over the file's.
void fill_from_file(const scenario::PressureQuery& q, PressureOptions& o) {
  const auto keep = [](std::string& cli, const std::string& file) {
    if (cli.empty()) cli = file;
  };
  keep(o.permeability, q.permeability);
  keep(o.thickness, q.thickness);
  keep(o.viscosity, q.viscosity);
  keep(o.porosity, q.porosity);
  keep(o.compressibility, q.total_compressibility);
  keep(o.transmissivity, q.transmissivity);
  keep(o.storativity, q.storativity);
  keep(o.density, q.fluid_density);
  if (o.wells.empty() && o.rates.empty()) {
    for (const scenario::PressureWell& w : q.wells) {
      o.wells.push_back(w.name + "=" + w.x + "," + w.y + (w.radius.empty() ? "" : "," + w.radius));
      for (const scenario::PressureRateStep& r : w.schedule) o.rates.push_back(w.name + "=" + r.rate + " from " + r.from);
    }
  }
  if (o.distances.empty() && o.points.empty()) {
    o.distances = q.distances;
    o.points = q.points;
  }
  if (o.times.empty()) o.times = q.times;
  if (o.boundaries.empty())
    for (const scenario::PressureBoundary& b : q.boundaries)
      o.boundaries.push_back(b.kind + ": " + b.x + "," + b.y + "," + b.azimuth);
  keep(o.unit, q.unit);
  keep(o.length_unit, q.length_unit);
}

// ---- from text to the physics ----

struct Problem {
  std::vector<hydro::WellSource> wells;
  std::vector<std::vector<std::string>> schedule_text;  // per well, for the header
  hydro::TheisParameters params;
  std::string formation_text;
  std::vector<hydro::Boundary> boundaries;
  std::vector<std::string> boundary_text;
  std::vector<hydro::FieldPoint> points;
  std::vector<double> times;
  std::vector<std::string> time_labels;
};

// A core validation error restated with the option's name and the text the user wrote.
[[noreturn]] void rethrow_as_option(
    const InputError& e, const std::map<std::string, std::pair<std::string, std::string>>& as_given) {
  const auto it = as_given.find(e.field());
  if (it == as_given.end()) throw e;
  throw InputError(it->second.first, it->second.second, e.expected());
}

hydro::TheisParameters formation_from(const PressureOptions& o, std::string& text) {
  const bool hydro_set = !o.transmissivity.empty() || !o.storativity.empty();
  const bool petro_set = !o.permeability.empty() || !o.thickness.empty() || !o.viscosity.empty() ||
                         !o.porosity.empty() || !o.compressibility.empty();
  if (hydro_set && petro_set)
    throw InputError("--transmissivity/--storativity", "given with --permeability etc.",
                     "one parameter set: (k, h, mu, phi, c_t) or (T, S, rho)");
  const auto need = [](const std::string& v, const char* opt, const char* example) {
    if (v.empty()) throw InputError(opt, "(missing)", std::string("a value, e.g. '") + example + "'");
  };
  if (hydro_set) {
    need(o.transmissivity, "--transmissivity", "1e-3 m2/s");
    need(o.storativity, "--storativity", "1e-4");
    need(o.density, "--density", "1000 kg/m3");
    hydro::Aquifer a;
    a.transmissivity = units::parse(o.transmissivity, Dimension::diffusivity, "--transmissivity");
    a.storativity = units::parse(o.storativity, Dimension::dimensionless, "--storativity");
    a.fluid_density = units::parse(o.density, Dimension::density, "--density");
    text = "T = " + o.transmissivity + ", S = " + o.storativity + ", rho = " + o.density;
    try {
      return hydro::theis_parameters(a);
    } catch (const InputError& e) {
      rethrow_as_option(e, {{"transmissivity", {"--transmissivity", o.transmissivity}},
                            {"storativity", {"--storativity", o.storativity}},
                            {"fluid_density", {"--density", o.density}}});
    }
  }
  need(o.permeability, "--permeability", "10 mD");
  need(o.thickness, "--thickness", "30 m");
  need(o.viscosity, "--viscosity", "0.5 cP");
  need(o.porosity, "--porosity", "0.15");
  need(o.compressibility, "--compressibility", "1e-9 1/Pa");
  hydro::Formation f;
  f.permeability = units::parse(o.permeability, Dimension::permeability, "--permeability");
  f.thickness = units::parse(o.thickness, Dimension::length, "--thickness");
  f.viscosity = units::parse(o.viscosity, Dimension::viscosity, "--viscosity");
  f.porosity = units::parse(o.porosity, Dimension::dimensionless, "--porosity");
  f.total_compressibility = units::parse(o.compressibility, Dimension::compressibility, "--compressibility");
  text = "k = " + o.permeability + ", h = " + o.thickness + ", mu = " + o.viscosity +
         ", phi = " + o.porosity + ", c_t = " + o.compressibility;
  try {
    return hydro::theis_parameters(f);
  } catch (const InputError& e) {
    rethrow_as_option(e, {{"permeability", {"--permeability", o.permeability}},
                          {"thickness", {"--thickness", o.thickness}},
                          {"viscosity", {"--viscosity", o.viscosity}},
                          {"porosity", {"--porosity", o.porosity}},
                          {"total_compressibility", {"--compressibility", o.compressibility}}});
  }
}

// The wells as given by --well (or one well at the origin), before their rate schedules.
struct WellPlaces {
  std::vector<std::string> names;
  std::vector<std::pair<double, double>> xy;  // m
  std::vector<double> radius;                 // r_w, m
};

WellPlaces parse_wells(const std::vector<std::string>& specs, double default_radius) {
  WellPlaces wp;
  for (const std::string& w : specs) {
    const auto eq = w.find('=');
    const std::string name = util::trim(eq == std::string::npos ? "" : w.substr(0, eq));
    const auto coords = split(eq == std::string::npos ? w : w.substr(eq + 1), ',');
    if (name.empty() || coords.size() < 2 || coords.size() > 3)
      throw InputError("--well", w, "NAME=X,Y[,R_W] with units, e.g. 'A=0 m,1.5 km' or 'A=0 m,0 m,0.1 m'");
    if (std::find(wp.names.begin(), wp.names.end(), name) != wp.names.end())
      throw InputError("--well", w, "a well name used once ('" + name + "' repeats)");
    wp.names.push_back(name);
    wp.xy.emplace_back(units::parse(coords[0], Dimension::length, "--well " + name + " x"),
                       units::parse(coords[1], Dimension::length, "--well " + name + " y"));
    wp.radius.push_back(coords.size() == 3 ? units::parse(coords[2], Dimension::length, "--well " + name + " radius")
                                           : default_radius);
  }
  if (wp.names.empty()) {
    wp.names.push_back("well");
    wp.xy.emplace_back(0.0, 0.0);
    wp.radius.push_back(default_radius);
  }
  return wp;
}

// Each --rate "[NAME=]RATE [from START]" added to its well's schedule; then one WellSource per well.
void add_wells(const PressureOptions& o, const WellPlaces& wp, Problem& pb) {
  const auto& names = wp.names;
  std::vector<std::vector<double>> starts(names.size()), rates(names.size());
  pb.schedule_text.resize(names.size());
  if (o.rates.empty())
    throw InputError("--rate", "(missing)", "at least one rate, e.g. '2e4 bbl/d' or 'A=2e4 bbl/d from 1 yr'");
  for (const std::string& r : o.rates) {
    std::string body = r;
    std::size_t wi = 0;
    const auto eq = r.find('=');
    if (eq != std::string::npos) {
      const std::string name = util::trim(r.substr(0, eq));
      const auto it = std::find(names.begin(), names.end(), name);
      if (it == names.end())
        throw InputError("--rate", r, "a rate for a well defined by --well (unknown well '" + name + "')");
      wi = static_cast<std::size_t>(it - names.begin());
      body = r.substr(eq + 1);
    } else if (names.size() > 1) {
      throw InputError("--rate", r, "NAME=RATE when there are several wells");
    }
    std::string rate_text = util::trim(body), from_text = "0 s";
    const auto from = body.find(" from ");
    if (from != std::string::npos) {
      rate_text = util::trim(body.substr(0, from));
      from_text = util::trim(body.substr(from + 6));
    }
    starts[wi].push_back(units::parse(from_text, Dimension::time, "--rate start"));
    rates[wi].push_back(units::parse(rate_text, Dimension::volume_rate, "--rate"));
    pb.schedule_text[wi].push_back(rate_text + " from " + from_text);
  }
  for (std::size_t i = 0; i < names.size(); ++i) {
    hydro::WellSource w;
    w.name = names[i];
    w.x = wp.xy[i].first;
    w.y = wp.xy[i].second;
    w.well_radius = wp.radius[i];
    try {
      w.history = hydro::RateHistory(starts[i], rates[i]);
    } catch (const InputError& e) {
      throw e.located("--rate schedule of well '" + names[i] + "' (list its steps in time order)");
    }
    pb.wells.push_back(std::move(w));
  }
}

// Boundaries: a line through (X, Y) along AZIMUTH (clockwise from +y, north).
void add_boundaries(const std::vector<std::string>& specs, Problem& pb) {
  for (const std::string& b : specs) {
    const auto colon = b.find(':');
    const std::string kind = util::trim(colon == std::string::npos ? "" : b.substr(0, colon));
    const auto parts = split(colon == std::string::npos ? "" : b.substr(colon + 1), ',');
    if ((kind != "no-flow" && kind != "constant-pressure") || parts.size() != 3)
      throw InputError("--boundary", b, "'no-flow: X,Y,AZIMUTH' or 'constant-pressure: X,Y,AZIMUTH', e.g. 'no-flow: 2 km,0 m,0 deg'");
    hydro::Boundary bd;
    bd.kind = kind == "no-flow" ? hydro::BoundaryKind::no_flow : hydro::BoundaryKind::constant_pressure;
    bd.x0 = units::parse(parts[0], Dimension::length, "--boundary x");
    bd.y0 = units::parse(parts[1], Dimension::length, "--boundary y");
    const double az = units::parse(parts[2], Dimension::angle, "--boundary azimuth");
    bd.dx = std::sin(az);
    bd.dy = std::cos(az);
    pb.boundaries.push_back(bd);
    pb.boundary_text.push_back(b);
  }
}

// The points (--distance along +x from the first well, then --point) and the times.
void add_points_and_times(const PressureOptions& o, Problem& pb) {
  for (const std::string& d : o.distances) {
    const double r = units::parse(d, Dimension::length, "--distance");
    if (r < 0) throw InputError("--distance", d, "a distance >= 0");
    pb.points.push_back({pb.wells[0].x + r, pb.wells[0].y});
  }
  for (const std::string& p : o.points) {
    const auto c = split(p, ',');
    if (c.size() != 2) throw InputError("--point", p, "X,Y with units, e.g. '1 km,-200 m'");
    pb.points.push_back({units::parse(c[0], Dimension::length, "--point x"),
                         units::parse(c[1], Dimension::length, "--point y")});
  }
  if (pb.points.empty())
    throw InputError("--distance/--point", "(missing)", "at least one distance ('1 km') or point ('1 km,0 m')");
  for (const std::string& t : o.times) {
    pb.times.push_back(units::parse(t, Dimension::time, "--time"));
    pb.time_labels.push_back(t);
  }
  if (pb.times.empty()) throw InputError("--time", "(missing)", "at least one time, e.g. '30 d' or '10 yr'");
}

Problem build_problem(const PressureOptions& o) {
  Problem pb;
  pb.params = formation_from(o, pb.formation_text);
  const double rw = units::parse(o.well_radius, Dimension::length, "--well-radius");
  add_wells(o, parse_wells(o.wells, rw), pb);
  add_boundaries(o.boundaries, pb);
  add_points_and_times(o, pb);
  return pb;
}

// Significant digits suited to a table of pressures.
std::string sig(double v) {
  if (v == 0.0) return "0";
  std::ostringstream s;
  const double a = std::abs(v);
  if (a >= 1e-3 && a < 1e6) {
    const int digits = std::max(0, 4 - 1 - static_cast<int>(std::floor(std::log10(a))));
    s << std::fixed << std::setprecision(digits) << v;
  } else {
    s << std::scientific << std::setprecision(3) << v;
  }
  return s.str();
}

// --example and --file filled in, the output units defaulted and checked. Returns the line that
// names where the settings came from (empty for the command line alone).
std::string resolve_settings(PressureOptions& o) {
  std::string source_note;
  if (o.example) {
    const std::filesystem::path p =
        std::filesystem::path(SLIPSCREEN_SOURCE_DIR) / "regions/example-pressure/pressure.toml";
    o.file = p.string();
    source_note = "Fictional example (invented numbers): regions/example-pressure/pressure.toml";
  }
  if (!o.file.empty()) {
    fill_from_file(scenario::read_pressure_query(o.file), o);
    if (source_note.empty()) source_note = "Settings from " + o.file;
  }
  if (o.unit.empty()) o.unit = "MPa";
  if (o.length_unit.empty()) o.length_unit = "m";
  // check the output units first, so a typo fails before any work
  units::lookup(o.unit, Dimension::pressure, "--unit");
  units::lookup(o.length_unit, Dimension::length, "--length-unit");
  return source_note;
}

// The problem and its Δp at every point and time (each well's share too when there are several).
struct Evaluated {
  const Problem& pb;
  hydro::PreparedPoints prepared;
  hydro::PressureResult res;
  bool per_well;
  std::string pressure_unit, length_unit;

  double P(double pa) const { return units::to_unit(pa, pressure_unit, Dimension::pressure); }
  double L(double m) const { return units::to_unit(m, length_unit, Dimension::length); }
  // Distance from point p to the first well, m.
  double r_first(std::size_t p) const {
    return std::hypot(pb.points[p].x - pb.wells[0].x, pb.points[p].y - pb.wells[0].y);
  }
};

Evaluated evaluate(const Problem& pb, const PressureOptions& o) {
  const hydro::PressureField field(pb.wells, pb.boundaries);
  hydro::PreparedPoints prepared = field.prepare(pb.points);
  const bool per_well = pb.wells.size() > 1;
  hydro::PressureResult res = field.evaluate(prepared, pb.times, pb.params, {}, per_well);
  return {pb, std::move(prepared), std::move(res), per_well, o.unit, o.length_unit};
}

nlohmann::ordered_json wells_json(const Evaluated& e) {
  nlohmann::ordered_json wells = nlohmann::ordered_json::array();
  for (const hydro::WellSource& well : e.pb.wells) {
    nlohmann::ordered_json jw;
    jw["name"] = well.name;
    jw["x"] = e.L(well.x);
    jw["y"] = e.L(well.y);
    jw["well_radius_m"] = well.well_radius;
    nlohmann::ordered_json sched = nlohmann::ordered_json::array();
    const auto& h = well.history;
    for (std::size_t k = 0; k < h.start_times().size(); ++k)
      sched.push_back({{"from_s", h.start_times()[k]}, {"rate_m3_per_s", h.rates()[k]}});
    jw["schedule"] = sched;
    wells.push_back(jw);
  }
  return wells;
}

nlohmann::ordered_json point_json(const Evaluated& e, std::size_t p) {
  const Problem& pb = e.pb;
  nlohmann::ordered_json jp;
  jp["x"] = e.L(pb.points[p].x);
  jp["y"] = e.L(pb.points[p].y);
  jp["distance_to_" + pb.wells[0].name] = e.L(e.r_first(p));
  nlohmann::ordered_json clamped = nlohmann::ordered_json::array();
  for (std::size_t w = 0; w < pb.wells.size(); ++w)
    if (e.prepared.was_clamped(p, w)) clamped.push_back(pb.wells[w].name);
  jp["clamped_to_well_radius"] = clamped;
  nlohmann::ordered_json dp = nlohmann::ordered_json::array();
  for (std::size_t t = 0; t < pb.times.size(); ++t) dp.push_back(e.P(e.res.at(p, t)));
  jp["dp"] = dp;
  if (e.per_well) {
    nlohmann::ordered_json bw;
    for (std::size_t w = 0; w < pb.wells.size(); ++w) {
      nlohmann::ordered_json v = nlohmann::ordered_json::array();
      for (std::size_t t = 0; t < pb.times.size(); ++t) v.push_back(e.P(e.res.contribution(p, t, w)));
      bw[pb.wells[w].name] = v;
    }
    jp["dp_by_well"] = bw;
  }
  return jp;
}

void print_json(std::ostream& out, const Evaluated& e) {
  const Problem& pb = e.pb;
  nlohmann::ordered_json j;
  j["model"] = "Theis line source with superposition in time and space";
  j["pressure_unit"] = e.pressure_unit;
  j["length_unit"] = e.length_unit;
  j["diffusivity_m2_per_s"] = pb.params.diffusivity;
  j["pressure_per_rate_Pa_per_m3_per_s"] = pb.params.pressure_per_rate;
  j["formation"] = pb.formation_text;
  j["wells"] = wells_json(e);
  j["boundaries"] = pb.boundary_text;
  nlohmann::ordered_json times = nlohmann::ordered_json::array();
  for (std::size_t t = 0; t < pb.times.size(); ++t)
    times.push_back({{"label", pb.time_labels[t]}, {"seconds", pb.times[t]}});
  j["times"] = times;
  nlohmann::ordered_json pts = nlohmann::ordered_json::array();
  for (std::size_t p = 0; p < pb.points.size(); ++p) pts.push_back(point_json(e, p));
  j["points"] = pts;
  j["caution"] = kScreeningCaution;
  out << j.dump(2) << "\n";
}

// The lines above the table: the model, where the settings came from, formation, wells, boundaries.
void print_setting(std::ostream& out, const Evaluated& e, const std::string& source_note) {
  const Problem& pb = e.pb;
  out << "Pore-pressure change dp (Theis line source, superposition in time and space)\n";
  if (!source_note.empty()) out << source_note << "\n";
  out << "Formation: " << pb.formation_text << "\n";
  out << "  diffusivity D = " << sig(pb.params.diffusivity) << " m2/s\n";
  for (std::size_t w = 0; w < pb.wells.size(); ++w) {
    out << "Well " << pb.wells[w].name << " at (" << sig(e.L(pb.wells[w].x)) << " " << e.length_unit
        << ", " << sig(e.L(pb.wells[w].y)) << " " << e.length_unit << "), r_w = "
        << pb.wells[w].well_radius << " m: ";
    for (std::size_t k = 0; k < pb.schedule_text[w].size(); ++k)
      out << (k ? "; " : "") << pb.schedule_text[w][k];
    out << "\n";
  }
  for (const auto& b : pb.boundary_text) out << "Boundary " << b << " (method of images)\n";
  out << "\n";
}

// One row per point, one column per time, right-aligned; a '*' marks a distance clamped to r_w.
void print_table(std::ostream& out, const Evaluated& e) {
  const Problem& pb = e.pb;
  const std::string& lu = e.length_unit;
  std::vector<std::string> header = {"x [" + lu + "]", "y [" + lu + "]", "r to " + pb.wells[0].name + " [" + lu + "]"};
  for (const auto& t : pb.time_labels) header.push_back("dp at " + t + " [" + e.pressure_unit + "]");
  std::vector<std::vector<std::string>> rows;
  for (std::size_t p = 0; p < pb.points.size(); ++p) {
    std::vector<std::string> row = {sig(e.L(pb.points[p].x)), sig(e.L(pb.points[p].y)), sig(e.L(e.r_first(p)))};
    bool clamped = false;
    for (std::size_t w = 0; w < pb.wells.size(); ++w) clamped = clamped || e.prepared.was_clamped(p, w);
    if (clamped) row[2] += " *";
    for (std::size_t t = 0; t < pb.times.size(); ++t) row.push_back(sig(e.P(e.res.at(p, t))));
    rows.push_back(row);
  }
  std::vector<std::size_t> width(header.size());
  for (std::size_t c = 0; c < header.size(); ++c) {
    width[c] = header[c].size();
    for (const auto& r : rows) width[c] = std::max(width[c], r[c].size());
  }
  rows.insert(rows.begin(), header);
  for (const auto& r : rows) {
    for (std::size_t c = 0; c < r.size(); ++c)
      out << (c ? "  " : "") << std::setw(static_cast<int>(width[c])) << r[c];
    out << "\n";
  }
}

// After the table: which distances were clamped to the well radius, and the caution.
void print_notes(std::ostream& out, const Evaluated& e) {
  const Problem& pb = e.pb;
  if (e.prepared.any_clamped()) {
    out << "\n* within the well radius of a well: r was clamped to r_w (the line source is "
           "singular inside the well)\n";
    for (std::size_t p = 0; p < pb.points.size(); ++p)
      for (std::size_t w = 0; w < pb.wells.size(); ++w)
        if (e.prepared.was_clamped(p, w))
          out << "  point " << p + 1 << ": r to " << pb.wells[w].name << " clamped to r_w = "
              << pb.wells[w].well_radius << " m\n";
  }
  if (e.per_well) out << "\n(use --json for each well's contribution)\n";
  out << "\n" << kScreeningCaution << "\n";
}

int run_pressure(PressureOptions o, Context& ctx) {
  const std::string source_note = resolve_settings(o);
  const Problem pb = build_problem(o);
  const Evaluated e = evaluate(pb, o);
  if (o.json) {
    print_json(ctx.out, e);
    return kExitOk;
  }
  print_setting(ctx.out, e, source_note);
  print_table(ctx.out, e);
  print_notes(ctx.out, e);
  return kExitOk;
}

}  // namespace

void register_pressure_command(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<PressureOptions>();
  CLI::App* sub = app.add_subcommand(
      "pressure",
      "Pore-pressure change at distances/points and times from injection wells (Theis line "
      "source). Example: pressure --permeability '10 mD' --thickness '30 m' --viscosity '0.5 cP' "
      "--porosity 0.15 --compressibility '1e-9 1/Pa' --rate '2e4 bbl/d' --distance '1 km,5 km' "
      "--time '1 yr,10 yr' --unit psi");
  sub->add_flag("--example", o->example, "Run the fictional example in regions/example-pressure/");
  sub->add_option("--file", o->file, "Read the settings from a TOML file (see regions/example-pressure/)");
  sub->add_option("--permeability", o->permeability, "Formation permeability k, e.g. '10 mD'");
  sub->add_option("--thickness", o->thickness, "Formation thickness h, e.g. '30 m' or '100 ft'");
  sub->add_option("--viscosity", o->viscosity, "Fluid viscosity mu, e.g. '0.5 cP'");
  sub->add_option("--porosity", o->porosity, "Porosity phi, e.g. '0.15' or '15 %'");
  sub->add_option("--compressibility", o->compressibility, "Total compressibility c_t, e.g. '1e-9 1/Pa' or '6e-6 1/psi'");
  sub->add_option("--transmissivity", o->transmissivity, "Instead of k, h, mu, phi, c_t: transmissivity T, e.g. '1e-3 m2/s'");
  sub->add_option("--storativity", o->storativity, "With --transmissivity: storativity S, e.g. '1e-4'");
  sub->add_option("--density", o->density, "With --transmissivity: fluid density rho, e.g. '1000 kg/m3'");
  sub->add_option("--well", o->wells, "A well NAME=X,Y[,R_W], e.g. 'A=0 m,0 m' or 'A=0 m,0 m,0.1 m' (repeat; default: one well at 0,0)");
  sub->add_option("--well-radius", o->well_radius, "Well radius r_w of wells that do not give their own (default '0.1 m')");
  sub->add_option("--rate", o->rates, "Rate step [NAME=]RATE [from START], e.g. '2e4 bbl/d' or 'A=0 bbl/d from 5 yr' (repeat, in time order; injection > 0)");
  sub->add_option("--boundary", o->boundaries, "A straight boundary 'no-flow: X,Y,AZIMUTH' or 'constant-pressure: X,Y,AZIMUTH' (line through X,Y; azimuth clockwise from north), e.g. 'no-flow: 2 km,0 m,0 deg' (repeat; parallel or perpendicular only)");
  sub->add_option("--distance", o->distances, "Distances from the first well along +x, e.g. '500 m,1 km,5 km'")->delimiter(',');
  sub->add_option("--point", o->points, "A point X,Y, e.g. '1 km,-200 m' (repeat)");
  sub->add_option("--time", o->times, "Times since the schedules' zero, e.g. '30 d,1 yr,10 yr'")->delimiter(',');
  sub->add_option("--unit", o->unit, "Pressure unit of the output (default MPa; e.g. psi, kPa, bar)");
  sub->add_option("--length-unit", o->length_unit, "Length unit of the output (default m; e.g. km, ft)");
  sub->add_flag("--json", o->json, "Write JSON instead of the table");
  sub->callback([o, &ctx] { ctx.action = [o, &ctx] { return run_pressure(*o, ctx); }; });
}

}  // namespace slipscreen::cli
