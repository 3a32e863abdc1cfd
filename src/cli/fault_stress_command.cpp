// `slipscreen fault-stress`: the in-situ stress at one depth resolved onto one or more fault
// planes — σn, σn', τ, slip and dilation tendency, Δp_crit, rake and slip sense — with the
// stress regime, A_φ, principal stresses and the frictional-limit status. A table, or JSON.
#include <CLI/CLI.hpp>
#include <charconv>
#include <cmath>
#include <iomanip>
#include <limits>
#include <memory>
#include <nlohmann/json.hpp>
#include <numbers>
#include <optional>
#include <ostream>
#include <sstream>
#include <string>
#include <vector>

#include "cli/commands.hpp"
#include "core/util/trim.hpp"
#include "cli/exit_codes.hpp"
#include "core/caution.hpp"
#include "core/errors.hpp"
#include "core/geomech/a_phi.hpp"
#include "core/geomech/coulomb.hpp"
#include "core/geomech/depth_profile.hpp"
#include "core/geomech/fault_plane.hpp"
#include "core/geomech/fault_stress.hpp"
#include "core/geomech/frictional_limit.hpp"
#include "core/geomech/horizontal_stress.hpp"
#include "core/geomech/orientation_search.hpp"
#include "core/geomech/stress_state.hpp"
#include "core/units/units.hpp"

namespace slipscreen::cli {
namespace {

using namespace geomech;
using units::Dimension;
constexpr double kDeg = std::numbers::pi / 180.0;
struct Options {
  std::string depth;
  std::string sv_gradient = "1 psi/ft";
  std::vector<std::string> density_layers;
  std::string pore_gradient;
  std::string shmax_gradient, shmin_gradient;
  std::string poisson, biot = "1", young, strain_shmin, strain_shmax;
  std::string a_phi;
  std::string azimuth = "0 deg";
  std::string friction = "0.6";
  std::string cohesion = "0 MPa";
  std::vector<std::string> planes, planes_dd;
  bool poroelastic = false;
  bool json = false;
  std::string pressure_unit = "MPa";
};

// An angle with a unit ("30 deg", "0.5 rad"), or a bare number in degrees (strike/dip convention).
double parse_angle(const std::string& text, const std::string& field) {
  const std::string t = util::trim(text);
  double v = 0.0;
  const auto r = std::from_chars(t.data(), t.data() + t.size(), v);
  if (!t.empty() && r.ec == std::errc() && r.ptr == t.data() + t.size()) {
    if (!std::isfinite(v)) throw InputError(field, text, "a finite angle");
    return v * kDeg;
  }
  return units::parse(t, Dimension::angle, field);
}

// "A/B" → two angles (strike/dip or dip direction/dip).
std::pair<double, double> parse_angle_pair(const std::string& text, const std::string& option, const char* what) {
  const auto slash = text.find('/');
  if (slash == std::string::npos || text.find('/', slash + 1) != std::string::npos)
    throw InputError(option, text, std::string(what) + " in degrees, e.g. '30/60' or '30 deg/60 deg'");
  return {parse_angle(text.substr(0, slash), option), parse_angle(text.substr(slash + 1), option)};
}

std::vector<DensityLayer> parse_layers(const std::vector<std::string>& specs) {
  std::vector<DensityLayer> layers;
  for (const auto& s : specs) {
    const auto eq = s.find('=');
    if (eq == std::string::npos)
      throw InputError("--density-layer", s, "TOP=DENSITY, e.g. '0 m=2300 kg/m3' or '1 km=2.5 g/cc'");
    layers.push_back({units::parse(s.substr(0, eq), Dimension::length, "--density-layer top"),
                      units::parse(s.substr(eq + 1), Dimension::density, "--density-layer density")});
  }
  return layers;
}

double dimless(const std::string& text, const char* field) { return units::parse(text, Dimension::dimensionless, field); }

struct Setup {
  double depth;
  AndersonianStress stress;
  std::string model;  // how the horizontal stresses were obtained
  Friction friction;
  std::optional<PoroelasticPath> path;
  double kappa = 0.0;
  std::vector<FaultPlane> planes;
};

Setup build(const Options& o) {
  Setup s;
  s.depth = units::parse(o.depth, Dimension::length, "--depth");
  check_depth(s.depth);
  s.friction = {dimless(o.friction, "--friction"), units::parse(o.cohesion, Dimension::pressure, "--cohesion")};
  check(s.friction);
  // Vertical stress and pore pressure.
  if (!o.density_layers.empty()) {
    const auto layers = parse_layers(o.density_layers);
    s.stress.sv = vertical_stress_from_layers(layers, s.depth);
  } else {
    s.stress.sv = from_gradient(units::parse(o.sv_gradient, Dimension::pressure_gradient, "--sv-gradient"), s.depth,
                                "--sv-gradient");
  }
  const double pore_gradient = o.pore_gradient.empty()
                                   ? kHydrostaticGradient
                                   : units::parse(o.pore_gradient, Dimension::pressure_gradient, "--pore-gradient");
  s.stress.pore_pressure = from_gradient(pore_gradient, s.depth, "--pore-gradient");
  s.stress.shmax_azimuth = wrap_azimuth(parse_angle(o.azimuth, "--shmax-azimuth"));
  // Horizontal stresses: exactly one description.
  const bool gradients = !o.shmax_gradient.empty() || !o.shmin_gradient.empty();
  const bool aphi = !o.a_phi.empty();
  const bool uniaxial = !o.poisson.empty() && !gradients && !aphi;
  if (gradients + aphi + uniaxial != 1)
    throw InputError("horizontal stress", gradients && aphi ? "both gradients and --a-phi" : "none given",
                     "exactly one of: --shmax-gradient with --shmin-gradient; --poisson (uniaxial strain); --a-phi");
  HorizontalStresses h{};
  if (gradients) {
    if (o.shmax_gradient.empty() || o.shmin_gradient.empty())
      throw InputError(o.shmax_gradient.empty() ? "--shmax-gradient" : "--shmin-gradient", "(missing)",
                       "both --shmax-gradient and --shmin-gradient");
    h = horizontal_stresses_from_gradients(
        units::parse(o.shmax_gradient, Dimension::pressure_gradient, "--shmax-gradient"),
        units::parse(o.shmin_gradient, Dimension::pressure_gradient, "--shmin-gradient"), s.depth);
    s.model = "gradients";
  } else if (aphi) {
    h = horizontal_stresses_from_a_phi(dimless(o.a_phi, "--a-phi"), s.stress.sv, s.stress.pore_pressure, s.friction.mu);
    s.model = "A_phi at frictional equilibrium";
  } else {
    UniaxialStrainModel m;
    m.poisson = dimless(o.poisson, "--poisson");
    m.biot = dimless(o.biot, "--biot");
    if (!o.young.empty()) m.young = units::parse(o.young, Dimension::pressure, "--young");
    if (!o.strain_shmin.empty()) m.strain_h = dimless(o.strain_shmin, "--strain-shmin");
    if (!o.strain_shmax.empty()) m.strain_H = dimless(o.strain_shmax, "--strain-shmax");
    h = horizontal_stresses_uniaxial_strain(m, s.stress.sv, s.stress.pore_pressure);
    s.model = "uniaxial strain";
  }
  s.stress.shmax = h.shmax;
  s.stress.shmin = h.shmin;
  check(s.stress);
  if (o.poroelastic) {
    if (o.poisson.empty()) throw InputError("--poisson", "(missing)", "Poisson's ratio for the --poroelastic stress path");
    s.path = PoroelasticPath{dimless(o.biot, "--biot"), dimless(o.poisson, "--poisson")};
    s.kappa = stress_path_coefficient(*s.path);
  }
  for (const auto& text : o.planes) {
    const auto [strike, dip] = parse_angle_pair(text, "--plane", "STRIKE/DIP (right-hand rule)");
    try {
      s.planes.push_back(FaultPlane::from_strike_dip(strike, dip));
    } catch (const InputError& e) {
      throw e.located("--plane '" + text + "'");
    }
  }
  for (const auto& text : o.planes_dd) {
    const auto [dd, dip] = parse_angle_pair(text, "--plane-dd", "DIP-DIRECTION/DIP");
    try {
      s.planes.push_back(FaultPlane::from_dip_direction(dd, dip));
    } catch (const InputError& e) {
      throw e.located("--plane-dd '" + text + "'");
    }
  }
  if (s.planes.empty()) throw InputError("--plane", "(none)", "at least one plane, e.g. --plane 30/60");
  return s;
}

struct PlaneResult {
  FaultPlane plane;
  ResolvedStress r;
  CriticalPressure dp;
};

// What the command reports: the stress state's invariants and each plane's resolved stress.
struct Analysis {
  PrincipalStresses principal;
  FaultingRegime regime;
  double aphi;
  FrictionalLimitCheck limit;
  DangerousOrientation worst;  // the most dangerous orientation and its Δp_crit
  double opening;              // opening_pressure, Pa
  std::vector<PlaneResult> planes;

  // Δp_crit beyond the opening pressure: tensile opening would come first.
  bool beyond_opening(const CriticalPressure& c) const {
    return c.status != CriticalStatus::already_critical && c.dp > opening;
  }
};

Analysis analyse(const Setup& s) {
  const Eigen::Matrix3d tensor = stress_tensor_ned(s.stress);
  const double p0 = s.stress.pore_pressure;
  const PrincipalStresses principal = principal_stresses(tensor);
  Analysis a{.principal = principal,
             .regime = classify_regime(s.stress),
             .aphi = a_phi(s.stress.sv, s.stress.shmax, s.stress.shmin),
             .limit = check_frictional_limit(principal.values(0), principal.values(2), p0, s.friction.mu),
             .worst = most_dangerous_orientation(tensor, p0, s.friction, s.kappa),
             .opening = opening_pressure(s.stress, s.kappa),
             .planes = {}};
  for (const auto& plane : s.planes) {
    const auto r = resolve(tensor, p0, plane);
    const auto dp = s.path ? critical_pressure_poroelastic(tensor, p0, plane.normal(), s.friction, s.kappa)
                           : critical_pressure(r.shear_stress, r.normal_stress, p0, s.friction);
    a.planes.push_back({plane, r, dp});
  }
  return a;
}

std::string fixed(double v, int digits) {
  if (!std::isfinite(v)) return "-";
  if (std::fabs(v) < 0.5 * std::pow(10.0, -digits)) v = 0.0;  // no "-0.0000"
  std::ostringstream s;
  s << std::fixed << std::setprecision(digits) << v;
  return s.str();
}

// Δp_crit as text: "never" for +∞ (CFF never reaches 0), "-inf" for −∞ (critical for any
// pressure decrease along the stress path).
std::string dp_text(double v, double in_unit) {
  if (std::isinf(v)) return v > 0 ? "never" : "-inf";
  return fixed(in_unit, 4);
}

// The JSON output: every quantity in SI units (Pa, m, degrees), null for a non-finite value.
void print_json(std::ostream& out, const Setup& s, const Analysis& a) {
  using nlohmann::json;
  const auto num = [](double v) { return std::isfinite(v) ? json(v) : json(nullptr); };
  json j;
  j["screening_caution"] = kScreeningCaution;
  j["depth_m"] = s.depth;
  j["stress"] = {{"sv_pa", s.stress.sv},
                 {"shmax_pa", s.stress.shmax},
                 {"shmin_pa", s.stress.shmin},
                 {"shmax_azimuth_deg", s.stress.shmax_azimuth / kDeg},
                 {"pore_pressure_pa", s.stress.pore_pressure},
                 {"horizontal_from", s.model}};
  j["regime"] = to_string(a.regime);
  j["a_phi"] = a.aphi;
  j["principal_stresses"] = json::array();
  for (int i = 0; i < 3; ++i) {
    const auto ax = axis_orientation(a.principal.directions.col(i));
    j["principal_stresses"].push_back({{"name", "S" + std::to_string(i + 1)},
                                       {"value_pa", a.principal.values(i)},
                                       {"trend_deg", ax.trend / kDeg},
                                       {"plunge_deg", ax.plunge / kDeg}});
  }
  j["frictional_limit"] = {{"ratio", a.limit.ratio}, {"limit", a.limit.limit}, {"status", to_string(a.limit.status)}};
  j["friction"] = {{"mu", s.friction.mu}, {"cohesion_pa", s.friction.cohesion}};
  j["stress_path"] = s.path ? json{{"biot", s.path->biot}, {"poisson", s.path->poisson}, {"kappa", s.kappa}} : json(nullptr);
  j["opening_pressure_pa"] = a.opening;
  j["most_dangerous_orientation"] = {{"strike_deg", a.worst.plane.strike() / kDeg},
                                     {"dip_deg", a.worst.plane.dip() / kDeg},
                                     {"dp_crit_pa", num(a.worst.dp_crit)}};
  j["planes"] = json::array();
  for (const auto& pr : a.planes) {
    j["planes"].push_back({{"strike_deg", pr.plane.strike() / kDeg},
                           {"dip_deg", pr.plane.dip() / kDeg},
                           {"dip_direction_deg", pr.plane.dip_direction() / kDeg},
                           {"normal_stress_pa", pr.r.normal_stress},
                           {"effective_normal_stress_pa", pr.r.effective_normal_stress},
                           {"shear_stress_pa", pr.r.shear_stress},
                           {"slip_tendency", pr.r.slip_tendency},
                           {"dilation_tendency", num(pr.r.dilation_tendency)},
                           {"dp_crit_pa", num(pr.dp.dp)},
                           {"dp_crit_status", to_string(pr.dp.status)},
                           {"dp_crit_exceeds_opening_pressure", a.beyond_opening(pr.dp)},
                           {"rake_deg", num(pr.r.rake / kDeg)},
                           {"slip_sense", to_string(pr.r.sense)}});
  }
  out << j.dump(2) << "\n";
}

// The stress state above the table: magnitudes, regime, principal axes, frictional limit,
// friction and stress path, opening pressure and the most dangerous orientation.
void print_stress_state(std::ostream& out, const Setup& s, const Analysis& a, const std::string& p_unit) {
  const auto P = [&](double pa) { return units::to_unit(pa, p_unit, Dimension::pressure); };
  const std::string u = " " + p_unit;
  out << "Stress at " << fixed(s.depth, 1) << " m (horizontal stresses from " << s.model << "):\n";
  out << "  Sv " << fixed(P(s.stress.sv), 4) << u << ", SHmax " << fixed(P(s.stress.shmax), 4) << u << " (azimuth "
      << fixed(s.stress.shmax_azimuth / kDeg, 1) << " deg), Shmin " << fixed(P(s.stress.shmin), 4) << u << ", p0 "
      << fixed(P(s.stress.pore_pressure), 4) << u << "\n";
  out << "  regime " << to_string(a.regime) << ", A_phi " << fixed(a.aphi, 3) << "\n";
  for (int i = 0; i < 3; ++i) {
    const auto ax = axis_orientation(a.principal.directions.col(i));
    out << "  S" << i + 1 << " " << fixed(P(a.principal.values(i)), 4) << u << " (trend " << fixed(ax.trend / kDeg, 1)
        << " deg, plunge " << fixed(ax.plunge / kDeg, 1) << " deg)\n";
  }
  out << "Frictional limit: (S1-p0)/(S3-p0) = " << fixed(a.limit.ratio, 2) << ", limit [sqrt(mu^2+1)+mu]^2 = "
      << fixed(a.limit.limit, 2) << " for mu " << fixed(s.friction.mu, 2) << ": " << to_string(a.limit.status) << "\n";
  if (a.limit.status == LimitStatus::beyond)
    out << "  WARNING: this stress state exceeds the frictional limit: optimally oriented faults would already be\n"
           "  slipping, so it cannot persist. Results below are reported as computed; check the stress inputs.\n";
  out << "Friction " << fixed(s.friction.mu, 3) << ", cohesion " << fixed(P(s.friction.cohesion), 4) << u;
  if (s.path) out << "; poroelastic stress path: Biot " << fixed(s.path->biot, 3) << ", Poisson " << fixed(s.path->poisson, 3)
                  << ", dSh/dp = " << fixed(s.kappa, 4);
  out << "\n";
  out << "Opening pressure (pressure increase at which the least effective stress reaches zero): "
      << fixed(P(a.opening), 4) << u << "\n";
  out << "Most dangerous orientation: strike " << fixed(a.worst.plane.strike() / kDeg, 1) << " deg, dip "
      << fixed(a.worst.plane.dip() / kDeg, 1) << " deg, dp_crit " << dp_text(a.worst.dp_crit, P(a.worst.dp_crit)) << u
      << "\n\n";
}

// One row per plane, columns aligned (numbers right, text left), then the legend and the caution.
void print_plane_table(std::ostream& out, const Analysis& a, const std::string& p_unit) {
  const auto P = [&](double pa) { return units::to_unit(pa, p_unit, Dimension::pressure); };
  const std::vector<std::string> head = {"strike[deg]", "dip[deg]", "sn[" + p_unit + "]", "sn_eff[" + p_unit + "]",
                                         "tau[" + p_unit + "]", "slip_tend[-]", "dilat_tend[-]", "dp_crit[" + p_unit + "]",
                                         "dp_status", "rake[deg]", "slip_sense"};
  std::vector<std::vector<std::string>> rows;
  for (const auto& pr : a.planes) {
    rows.push_back({fixed(pr.plane.strike() / kDeg, 1), fixed(pr.plane.dip() / kDeg, 1), fixed(P(pr.r.normal_stress), 4),
                    fixed(P(pr.r.effective_normal_stress), 4), fixed(P(pr.r.shear_stress), 4), fixed(pr.r.slip_tendency, 4),
                    fixed(pr.r.dilation_tendency, 4),
                    dp_text(pr.dp.dp, P(pr.dp.dp)),
                    std::string(to_string(pr.dp.status)) + (a.beyond_opening(pr.dp) ? " (> opening)" : ""),
                    fixed(pr.r.rake / kDeg, 1), to_string(pr.r.sense)});
  }
  std::vector<std::size_t> width(head.size());
  for (std::size_t c = 0; c < head.size(); ++c) {
    width[c] = head[c].size();
    for (const auto& r : rows) width[c] = std::max(width[c], r[c].size());
  }
  const auto line = [&](const std::vector<std::string>& cells) {
    for (std::size_t c = 0; c < cells.size(); ++c) {
      const bool text = c >= 8 && c != 9;
      const bool last = c + 1 == cells.size();
      out << (c ? "  " : "") << (text ? std::left : std::right) << std::setw(last ? 0 : static_cast<int>(width[c])) << cells[c];
    }
    out << "\n";
  };
  line(head);
  for (const auto& r : rows) line(r);
  out << "\ndp_crit: pore-pressure increase to Coulomb failure; <= 0 means already critical; '(> opening)':\n"
         "tensile opening would come first, so the Coulomb estimate does not apply there.\n"
      << kScreeningCaution << "\n";
}

int run_fault_stress(const Options& o, Context& ctx) {
  const Setup s = build(o);
  units::lookup(o.pressure_unit, Dimension::pressure, "--pressure-unit");
  const Analysis a = analyse(s);
  if (o.json) {
    print_json(ctx.out, s, a);
  } else {
    print_stress_state(ctx.out, s, a, o.pressure_unit);
    print_plane_table(ctx.out, a, o.pressure_unit);
  }
  return kExitOk;
}

}  // namespace

void register_fault_stress_command(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<Options>();
  CLI::App* sub = app.add_subcommand(
      "fault-stress",
      "Resolve the in-situ stress at a depth onto fault planes: normal and shear stress, slip and dilation tendency, "
      "pore-pressure increase to Coulomb failure, slip sense (a screening estimate)");
  sub->add_option("--depth", o->depth, "Depth of the faults, e.g. '3 km' or '9000 ft'")->required();
  sub->add_option("--sv-gradient", o->sv_gradient, "Overburden (Sv) gradient")->default_val("1 psi/ft");
  sub->add_option("--density-layer", o->density_layers,
                  "Density table row TOP=DENSITY (repeat; first top 0 m), e.g. '0 m=2300 kg/m3'; replaces --sv-gradient");
  sub->add_option("--pore-gradient", o->pore_gradient, "Pore-pressure gradient (default: hydrostatic 9.80665 MPa/km)");
  sub->add_option("--shmax-gradient", o->shmax_gradient, "SHmax gradient (with --shmin-gradient)");
  sub->add_option("--shmin-gradient", o->shmin_gradient, "Shmin gradient (with --shmax-gradient)");
  sub->add_option("--poisson", o->poisson, "Poisson's ratio: uniaxial-strain horizontal stress, and the --poroelastic path");
  sub->add_option("--biot", o->biot, "Biot coefficient")->default_val("1");
  sub->add_option("--young", o->young, "Young's modulus for tectonic strains, e.g. '20 GPa'");
  sub->add_option("--strain-shmin", o->strain_shmin, "Tectonic strain along Shmin (uniaxial-strain model)");
  sub->add_option("--strain-shmax", o->strain_shmax, "Tectonic strain along SHmax (uniaxial-strain model)");
  sub->add_option("--a-phi", o->a_phi, "Simpson's A_phi in [0, 3]; magnitudes at frictional equilibrium for --friction");
  sub->add_option("--shmax-azimuth", o->azimuth, "SHmax azimuth clockwise from north (degrees if no unit)")->default_val("0 deg");
  sub->add_option("--friction", o->friction, "Friction coefficient mu")->default_val("0.6");
  sub->add_option("--cohesion", o->cohesion, "Cohesion")->default_val("0 MPa");
  sub->add_option("--plane", o->planes, "A plane STRIKE/DIP, right-hand rule, degrees if no unit (repeat), e.g. 30/60");
  sub->add_option("--plane-dd", o->planes_dd, "A plane DIP-DIRECTION/DIP in degrees (repeat), e.g. 120/60");
  sub->add_flag("--poroelastic", o->poroelastic, "dp_crit along the uniaxial-strain poroelastic stress path (needs --poisson)");
  sub->add_option("--pressure-unit", o->pressure_unit, "Unit for stresses and pressures in the table")->default_val("MPa");
  sub->add_flag("--json", o->json, "JSON output (SI units) instead of the table");
  sub->callback([o, &ctx] { ctx.action = [o, &ctx] { return run_fault_stress(*o, ctx); }; });
}

}  // namespace slipscreen::cli
