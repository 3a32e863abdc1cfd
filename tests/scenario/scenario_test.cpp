#include "scenario/scenario.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <nlohmann/json.hpp>

#include "core/errors.hpp"
#include "core/units/units.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;
using namespace slipscreen::scenario;
using slipscreen::test::TinyScenario;

namespace {
// Unit factors are exact definitions (NIST SP 811): ft = 0.3048 m, psi = 6894.757293168361 Pa,
// bbl = 0.158987294928 m^3; mD = 9.869233e-16 m^2 (common practice).
constexpr double kPsiPerFt = 6894.757293168361 / 0.3048;
constexpr double kBbl = 0.158987294928;
constexpr double kPi = 3.14159265358979323846;
}  // namespace

TEST_CASE("the tiny scenario resolves into SI values") {
  TinyScenario t;
  const ResolvedScenario s = load_scenario(t.scenario());
  CHECK(s.title == "tiny test scenario");
  CHECK(s.seed == 42);
  const RegionSpec& r = s.region;
  CHECK(r.crs == "EPSG:32708");
  CHECK(r.reference_depth == 3000.0);
  CHECK(std::abs(r.pore_pressure_gradient - 0.433 * kPsiPerFt) < 1e-9);
  CHECK(r.stress.model == StressModel::a_phi);
  CHECK(std::abs(r.stress.vertical_gradient - 1.1 * kPsiPerFt) < 1e-9);
  CHECK(std::abs(r.stress.shmax_azimuth - kPi / 3) < 1e-15);
  CHECK(r.stress.a_phi == 1.5);
  CHECK(r.stress.equilibrium_friction == 0.6);  // defaults to the fault friction
  CHECK(r.faults.path == (t.dir() / "faults.geojson").lexically_normal());
  CHECK(r.faults.id_attribute == "fault_id");
  CHECK(r.faults.dip_direction_attribute == "dip_dir");
  CHECK(r.faults.segment_length == 1000.0);
  CHECK(r.faults.check_points == 3);
  // The scenario overrides the region's 100 mD.
  CHECK(std::abs(r.formation.permeability - 200 * 9.869233e-16) < 1e-27);
  CHECK(r.formation.thickness == 100.0);
  // D = k/(mu phi c_t) = 1.9738466e-13 / (5e-4 * 0.1 * 1e-9) = 3.9476932 m^2/s (hand calculation)
  CHECK(std::abs(theis_parameters_of(r.formation).diffusivity - 3.9476932) < 1e-9);

  REQUIRE(s.wells.size() == 3);
  const WellSpec& w1 = s.wells[0];
  CHECK(w1.id == "W1");
  CHECK(w1.crs == "EPSG:32708");
  CHECK(w1.x == 500000.0);
  CHECK(w1.top == 2900.0);
  CHECK(w1.radius == 0.1);
  REQUIRE(w1.periods.size() == 3);
  // January 2020 has 31 days: 300000 bbl over 31 d.
  CHECK(std::abs(w1.periods[0].rate - 300000 * kBbl / (31 * 86400.0)) < 1e-15);
  CHECK(std::abs(w1.volume_until(util::to_seconds({2020, 3, 1})) - 580000 * kBbl) < 1e-6);
  CHECK(std::abs(w1.volume_until(util::to_seconds({2030, 1, 1})) - 890000 * kBbl) < 1e-6);
  const WellSpec& w2 = s.wells[1];
  CHECK(w2.status == WellStatus::shut_in);
  CHECK(std::abs(w2.top - 9500 * 0.3048) < 1e-9);
  const WellSpec& p1 = s.wells[2];
  CHECK(p1.proposed);
  CHECK(p1.crs == "EPSG:32708");
  REQUIRE(p1.periods.size() == 2);
  CHECK(std::abs(p1.periods[1].rate - 8000 * kBbl / 86400.0) < 1e-15);
  CHECK(p1.periods[1].start == util::to_seconds({2022, 1, 1}));

  REQUIRE(s.output.dates.size() == 3);
  CHECK(s.output.dates[2] == util::CivilDate{2023, 1, 1});
  CHECK(s.output.times[1] == util::to_seconds({2022, 1, 1}));
  CHECK_FALSE(s.output.grid.automatic_extent);
  CHECK(s.output.grid.xmax == 506000.0);
  CHECK(s.output.grid.cell_size == 1000.0);
  CHECK(s.output.folder == "runs/tiny");
  CHECK(s.inputs.size() == 4);
  CHECK_FALSE(s.uncertainty.given);

  const auto j = to_json(s);
  CHECK(j["seed"] == 42);
  CHECK(j["region"]["stress"]["model"] == "a_phi");
  CHECK(j["wells"].size() == 3);
  CHECK(j["output"]["dates"][0] == "2021-01-01");
}

TEST_CASE("output times as a date list, a monthly step, and the uncertainty placeholder") {
  TinyScenario t;
  t.replace("scenario.toml", "start = \"2021-01-01\"\nend = \"2023-01-01\"\nstep = \"1 year\"",
            "dates = [2021-06-01, \"2022-03-15\"]");
  t.append("scenario.toml", "\n[uncertainty]\nrealizations = 100\n");
  const auto s = load_scenario(t.scenario());
  REQUIRE(s.output.dates.size() == 2);
  CHECK(s.output.dates[0] == util::CivilDate{2021, 6, 1});
  CHECK(s.output.dates[1] == util::CivilDate{2022, 3, 15});
  REQUIRE(s.uncertainty.given);
  CHECK(s.uncertainty.realizations.value() == 100);

  TinyScenario m;
  m.replace("scenario.toml", "step = \"1 year\"", "step = \"1 month\"");
  m.replace("scenario.toml", "start = \"2021-01-01\"", "start = \"2021-01-31\"");
  const auto sm = load_scenario(m.scenario());
  CHECK(sm.output.dates.size() == 24);  // 2021-01-31 ... 2022-12-31, month ends clamped
  CHECK(sm.output.dates[1] == util::CivilDate{2021, 2, 28});
  CHECK(sm.output.dates[2] == util::CivilDate{2021, 3, 31});
}

TEST_CASE("the three stress forms and transmissivity-storativity") {
  TinyScenario t;
  t.replace("region.toml", "model = \"a_phi\"", "model = \"gradients\"\nshmax_gradient = \"30 MPa/km\"\nshmin_gradient = \"17 MPa/km\"");
  t.replace("region.toml", "a_phi = 1.5\n", "");
  CHECK(load_scenario(t.scenario()).region.stress.shmin_gradient == doctest::Approx(17000.0).epsilon(1e-15));

  TinyScenario u;
  u.replace("region.toml", "model = \"a_phi\"", "model = \"uniaxial_strain\"\npoisson_ratio = 0.25\nbiot = 0.8");
  u.replace("region.toml", "a_phi = 1.5\n", "");
  u.replace("region.toml", "vertical_gradient = \"1.1 psi/ft\"", "overburden_density = \"2500 kg/m3\"");
  const auto su = load_scenario(u.scenario());
  CHECK(su.region.stress.poisson_ratio == 0.25);
  CHECK(su.region.stress.biot == 0.8);
  CHECK(std::abs(su.region.stress.vertical_gradient - 2500 * 9.80665) < 1e-9);  // rho g, standard gravity

  TinyScenario h;
  h.replace("scenario.toml", "[region.override.formation]\npermeability = \"200 mD\"\n", "");
  h.replace("region.toml",
            "permeability = \"100 mD\"\nthickness = \"100 m\"\nporosity = 0.1\ntotal_compressibility = \"1e-9 1/Pa\"\n"
            "viscosity = \"0.5 cP\"",
            "transmissivity = \"0.02 m2/s\"\nstorativity = 1e-4");
  const auto sh = load_scenario(h.scenario());
  CHECK(sh.region.formation.from_transmissivity);
  CHECK(std::abs(theis_parameters_of(sh.region.formation).diffusivity - 200.0) < 1e-12);  // T/S
  CHECK(std::abs(theis_parameters_of(sh.region.formation).pressure_per_rate - 1000 * 9.80665 / (4 * 3.14159265358979323846 * 0.02)) < 1e-6);  // rho g/(4 pi T)
}

TEST_CASE("[stress] poroelastic_path takes biot and poisson_ratio, checked, with any stress model") {
  TinyScenario t;
  t.replace("region.toml", "a_phi = 1.5", "a_phi = 1.5\nporoelastic_path = true\nbiot = 0.7\npoisson_ratio = 0.3");
  const auto s = load_scenario(t.scenario());
  CHECK(s.region.stress.poroelastic_path);
  CHECK(s.region.stress.biot == 0.7);
  CHECK(s.region.stress.poisson_ratio == 0.3);
  CHECK_FALSE(load_scenario(TinyScenario().scenario()).region.stress.poroelastic_path);
  const std::pair<const char*, const char*> bad[] = {
      {"poroelastic_path = true\nbiot = 0.7", "key 'stress.poisson_ratio': missing"},
      {"poroelastic_path = true\nbiot = 0\npoisson_ratio = 0.3", "a Biot coefficient in (0, 1]"},
      {"poroelastic_path = true\nbiot = 1.1\npoisson_ratio = 0.3", "a Biot coefficient in (0, 1]"},
      {"poroelastic_path = true\npoisson_ratio = 0.5", "a Poisson ratio in [0, 0.5)"},
      {"biot = 0.7", "no 'biot' with model = 'a_phi'"},
      {"poroelastic_path = true\npoisson_ratio = 0.3\nyoung_modulus = \"20 GPa\"", "no 'young_modulus' with model = 'a_phi'"},
  };
  for (const auto& [text, message] : bad) {
    CAPTURE(text);
    TinyScenario b;
    b.replace("region.toml", "a_phi = 1.5", std::string("a_phi = 1.5\n") + text);
    CHECK_THROWS_WITH(load_scenario(b.scenario()), doctest::Contains(message));
  }
}

TEST_CASE("[formation] model = 'leaky' with the aquitard or the leakage factor B") {
  TinyScenario t;
  t.replace("region.toml", "viscosity = \"0.5 cP\"",
            "viscosity = \"0.5 cP\"\nmodel = \"leaky\"\nleakage = { aquitard_thickness = \"20 m\", aquitard_permeability = \"0.001 mD\" }");
  const auto s = load_scenario(t.scenario());
  REQUIRE(s.region.formation.leaky);
  // c_L = D/B² = k'/(μ φ c_t h b') (Hantush & Jacob 1955; k cancels): 0.001 mD, 0.5 cP, 0.1, 1e-9 1/Pa, 100 m, 20 m.
  const double k1 = 0.001 * 9.869233e-16;
  const double want = k1 / (0.5e-3 * 0.1 * 1e-9 * 100.0 * 20.0);
  CHECK(std::abs(theis_parameters_of(s.region.formation).leakage_rate - want) <= 1e-13 * want);
  TinyScenario b;
  b.replace("region.toml", "viscosity = \"0.5 cP\"", "viscosity = \"0.5 cP\"\nmodel = \"leaky\"\nleakage_factor = \"4 km\"");
  const auto sb = load_scenario(b.scenario());
  const auto pb = theis_parameters_of(sb.region.formation);
  CHECK(std::abs(pb.leakage_rate - pb.diffusivity / 16e6) <= 1e-15 * pb.leakage_rate);
  CHECK(theis_parameters_of(load_scenario(TinyScenario().scenario()).region.formation).leakage_rate == 0.0);
  const std::pair<const char*, const char*> bad[] = {
      {"model = \"leaky\"", "exactly one of leakage"},
      {"model = \"hantush\"", "'theis', 'leaky' or 'poroelastic_3d'"},
      {"leakage_factor = \"4 km\"", "model = 'leaky' for a leaky formation"},
      {"model = \"leaky\"\nleakage_factor = \"0.5 m\"", "a leakage factor B from 1 m to 1e12 m"},
      {"model = \"leaky\"\nleakage = { aquitard_thickness = \"20 m\" }", "aquitard_permeability"},
  };
  for (const auto& [text, message] : bad) {
    CAPTURE(text);
    TinyScenario x;
    x.replace("region.toml", "viscosity = \"0.5 cP\"", std::string("viscosity = \"0.5 cP\"\n") + text);
    CHECK_THROWS_WITH(load_scenario(x.scenario()), doctest::Contains(message));
  }
}

TEST_CASE("[formation] model = 'poroelastic_3d': the solid's constants, the implied storage, the faults' depth range") {
  // The tiny region's formation has porosity and compressibility: the 3-D model implies them, so
  // they are refused; with them removed, D is the solid's c (Rice & Cleary 1976, poro/rudnicki.hpp).
  const std::string solid = "model = \"poroelastic_3d\"\nshear_modulus = \"6 GPa\"\npoisson_ratio = 0.2\n"
                            "undrained_poisson_ratio = 0.33\nbiot = 0.8";
  TinyScenario refused;
  refused.replace("region.toml", "viscosity = \"0.5 cP\"", "viscosity = \"0.5 cP\"\n" + solid);
  CHECK_THROWS_WITH(load_scenario(refused.scenario()), doctest::Contains("no 'porosity' with model = 'poroelastic_3d'"));
  TinyScenario t;
  t.replace("region.toml", "viscosity = \"0.5 cP\"", "viscosity = \"0.5 cP\"\n" + solid);
  t.replace("region.toml", "porosity = 0.1", "");
  t.replace("region.toml", "total_compressibility = \"1e-9 1/Pa\"", "");
  t.replace("region.toml", "[faults]", "[faults]\ntop = \"3 km\"\nbottom = \"4 km\"\ndepth_levels = 2");
  const auto s = load_scenario(t.scenario());
  REQUIRE(s.region.formation.poroelastic_3d);
  CHECK(s.region.faults.top == 3000.0);
  CHECK(s.region.faults.bottom == 4000.0);
  CHECK(s.region.faults.depth_levels == 2);
  const poro::RudnickiConstants k = poro::rudnicki_constants(poroelastic_medium_of(s.region.formation));
  CHECK(theis_parameters_of(s.region.formation).diffusivity == k.diffusivity);
  CHECK(std::abs(k.stress_coefficient - 0.8 * 0.6 / 1.6) <= 1e-15);
  const std::pair<const char*, const char*> bad[] = {
      {"shear_modulus = \"6 GPa\"", "model = 'poroelastic_3d' for the solid's constants"},
      {"model = \"poroelastic_3d\"\nshear_modulus = \"6 GPa\"\npoisson_ratio = 0.3\nundrained_poisson_ratio = 0.25\nbiot = 0.8",
       "a value above poisson_ratio"},
  };
  for (const auto& [text, message] : bad) {
    CAPTURE(text);
    TinyScenario x;
    x.replace("region.toml", "viscosity = \"0.5 cP\"", std::string("viscosity = \"0.5 cP\"\n") + text);
    x.replace("region.toml", "porosity = 0.1", "");
    x.replace("region.toml", "total_compressibility = \"1e-9 1/Pa\"", "");
    CHECK_THROWS_WITH(load_scenario(x.scenario()), doctest::Contains(message));
  }
}

TEST_CASE("active wells may continue at the mean rate of their last reported months") {
  TinyScenario t;
  t.replace("scenario.toml", "file = \"histories.csv\"", "file = \"histories.csv\"\ncontinue_active_until = \"2020-06-01\"");
  const auto s = load_scenario(t.scenario());
  const WellSpec& w1 = s.wells[0];  // active, reported January to March 2020
  REQUIRE(w1.periods.size() == 4);
  const RatePeriod& c = w1.periods.back();
  CHECK(c.assumed);
  CHECK(c.start == util::to_seconds({2020, 4, 1}));
  CHECK(c.end == util::to_seconds({2020, 6, 1}));
  // Fewer than 12 months reported: the mean over the 91 days from 2020-01-01 to 2020-04-01.
  CHECK(std::abs(c.rate - 890000 * kBbl / (91 * 86400.0)) < 1e-15);
  CHECK(std::abs(w1.reported_volume_until(util::to_seconds({2030, 1, 1})) - 890000 * kBbl) < 1e-6);
  CHECK(s.wells[1].periods.size() == 2);  // W2 is shut in: not continued
}

// Each bad input gets its own message naming file, place, key or field, value and expectation.
TEST_CASE("misspelt keys name the file, line, key path and the nearest valid key") {
  TinyScenario t;
  t.replace("scenario.toml", "cell_size = \"1 km\"", "cel_size = \"1 km\"");
  CHECK_THROWS_WITH(load_scenario(t.scenario()),
                    doctest::Contains("scenario.toml line 37, column 1: key 'output.grid.cel_size': unknown key "
                                      "(did you mean 'cell_size'?)"));
  TinyScenario o;
  o.replace("scenario.toml", "permeability = \"200 mD\"", "permeabilty = \"200 mD\"");
  CHECK_THROWS_WITH(load_scenario(o.scenario()),
                    doctest::Contains("key 'region.override.formation.permeabilty': unknown key (did you mean 'permeability'?)"));
  TinyScenario r;
  r.replace("region.toml", "check_points = 3", "check_point = 3");
  CHECK_THROWS_WITH(load_scenario(r.scenario()),
                    doctest::Contains("region.toml line 18, column 1: key 'faults.check_point': unknown key (did you mean 'check_points'?)"));
}

TEST_CASE("values: missing unit, wrong unit, wrong type, TOML syntax") {
  TinyScenario t;
  t.replace("region.toml", "thickness = \"100 m\"", "thickness = 100");
  CHECK_THROWS_WITH_AS(load_scenario(t.scenario()),
                       doctest::Contains("region.toml line 28, column 13: field 'formation.thickness' = '100': expected "
                                         "a number with a length unit"),
                       InputError);
  TinyScenario u;
  u.replace("region.toml", "\"0.433 psi/ft\"", "\"0.433 psi\"");
  CHECK_THROWS_WITH_AS(load_scenario(u.scenario()), doctest::Contains("not a pressure unit"), InputError);
  TinyScenario s;
  s.replace("scenario.toml", "seed = 42", "seed = = 42");
  CHECK_THROWS_WITH(load_scenario(s.scenario()), doctest::Contains("scenario.toml line 3, column"));
  TinyScenario m;
  m.replace("region.toml", "model = \"a_phi\"", "model = \"a-phi\"");
  CHECK_THROWS_WITH_AS(load_scenario(m.scenario()), doctest::Contains("'gradients', 'uniaxial_strain', 'a_phi'"), InputError);
  TinyScenario d;
  d.replace("scenario.toml", "step = \"1 year\"", "step = \"1 fortnight\"");
  CHECK_THROWS_WITH_AS(load_scenario(d.scenario()), doctest::Contains("field 'output.times.step' = '1 fortnight'"), InputError);
}

TEST_CASE("missing files") {
  TinyScenario t;
  t.replace("scenario.toml", "file = \"region.toml\"", "file = \"nowhere.toml\"");
  CHECK_THROWS_WITH_AS(load_scenario(t.scenario()), doctest::Contains("scenario.toml line 6, column 8: key 'region.file' = 'nowhere.toml': no such file"), IoError);
  TinyScenario w;
  w.replace("scenario.toml", "file = \"wells.csv\"", "file = \"no-wells.csv\"");
  CHECK_THROWS_WITH_AS(load_scenario(w.scenario()), doctest::Contains("key 'wells.file' = 'no-wells.csv': no such file"), IoError);
  CHECK_THROWS_AS(load_scenario(t.dir() / "no-scenario.toml"), IoError);
}

TEST_CASE("CSV values: non-numeric, unitless, unknown well, overlapping months, bad dates") {
  TinyScenario a;
  a.replace("wells.csv", "W1,500000,6120000,2900", "W1,500000,6120000,abc");
  CHECK_THROWS_WITH_AS(load_scenario(a.scenario()),
                       doctest::Contains("wells.csv line 4, column 4 ('top [m]'): field 'top' = 'abc': expected a number"),
                       InputError);
  TinyScenario b;
  b.replace("wells.csv", "0.1 m,active", "0.1,active");
  CHECK_THROWS_WITH_AS(load_scenario(b.scenario()),
                       doctest::Contains("wells.csv line 4, column 6 ('radius'): field 'radius' = '0.1': expected a "
                                         "number with a length unit"),
                       InputError);
  TinyScenario c;
  c.replace("histories.csv", "W2,2020-01", "W3,2020-01");
  CHECK_THROWS_WITH_AS(load_scenario(c.scenario()),
                       doctest::Contains("histories.csv line 5, column 1 ('well'): field 'well' = 'W3': expected a well "
                                         "id from the wells table (did you mean 'W1'?)"),
                       InputError);
  TinyScenario d;
  d.replace("histories.csv", "W1,2020-03", "W1,2020-02");
  CHECK_THROWS_WITH_AS(load_scenario(d.scenario()),
                       doctest::Contains("histories.csv line 4: field 'period' = '2020-02-01 to 2020-03-01': expected no "
                                         "overlap with the period from 2020-02-01 to 2020-03-01 of well 'W1' ("),
                       InputError);
  TinyScenario e;
  e.replace("histories.csv", "W1,2020-03", "W1,2020-3");
  CHECK_THROWS_WITH_AS(load_scenario(e.scenario()),
                       doctest::Contains("histories.csv line 4, column 2 ('month'): field 'month' = '2020-3': expected a month as YYYY-MM"),
                       InputError);
  TinyScenario f;
  f.replace("histories.csv", ",300000", ",-300000");
  CHECK_THROWS_WITH_AS(load_scenario(f.scenario()), doctest::Contains("expected a value >= 0"), InputError);
  TinyScenario g;
  g.replace("wells.csv", "# crs: EPSG:32708\n", "");
  CHECK_THROWS_WITH_AS(load_scenario(g.scenario()), doctest::Contains("field 'crs' = '(missing)'"), InputError);
  TinyScenario h;
  h.replace("wells.csv", ",status", ",stat");
  h.replace("wells.csv", ",top [m]", ",tpo [m]");
  CHECK_THROWS_WITH_AS(load_scenario(h.scenario()), doctest::Contains("named 'top' (did you mean 'tpo'?)"), InputError);
}

TEST_CASE("planned schedules") {
  TinyScenario t;
  t.replace("scenario.toml", "\"5000 bbl/d from 2021-01-01 to 2022-01-01\"", "\"5000 bbl from 2021-01-01 to 2022-01-01\"");
  CHECK_THROWS_WITH_AS(load_scenario(t.scenario()),
                       doctest::Contains("scenario.toml line 24, column 13: field 'proposed_well[0].schedule[0]' = 'bbl': expected a volume rate unit"), InputError);
  TinyScenario o;
  o.replace("scenario.toml", "to 2024-01-01", "to 2021-06-01");
  CHECK_THROWS_WITH_AS(load_scenario(o.scenario()), doctest::Contains("expected an end date after the start date"), InputError);
  TinyScenario v;
  v.replace("scenario.toml", "from 2022-01-01 to 2024", "from 2021-06-01 to 2024");
  CHECK_THROWS_WITH_AS(load_scenario(v.scenario()), doctest::Contains("expected no overlap"), InputError);
  TinyScenario w;
  w.replace("scenario.toml", "id = \"P1\"", "id = \"W1\"");
  CHECK_THROWS_WITH_AS(load_scenario(w.scenario()), doctest::Contains("a well id not used by another well"), InputError);
}

TEST_CASE("output paths that escape the run folder are refused") {
  TinyScenario t;
  t.replace("scenario.toml", "cog = false", "cog = false\n[output.files]\nsegments = \"../../escape.csv\"");
  CHECK_THROWS_WITH_AS(load_scenario(t.scenario()),
                       doctest::Contains("scenario.toml line 30, column 12: refused: key output.files.segments = '../../escape.csv': a '..' component leaves the run folder"), RefusedError);
  TinyScenario a;
  a.replace("scenario.toml", "folder = \"runs/tiny\"", "folder = \"/tmp/elsewhere\"");
  CHECK_THROWS_AS(load_scenario(a.scenario()), RefusedError);
  TinyScenario v;
  v.replace("scenario.toml", "cog = false", "cog = false\n[output.files]\ngeopackage = \"/vsizip/x.zip/a.gpkg\"");
  CHECK_THROWS_AS(load_scenario(v.scenario()), RefusedError);
  TinyScenario n;
  n.replace("scenario.toml", "file = \"wells.csv\"", "file = \"/vsicurl/https://example.invalid/wells.csv\"");
  CHECK_THROWS_WITH_AS(load_scenario(n.scenario()), doctest::Contains("scenario inputs are local files"), RefusedError);
}

TEST_CASE("[output] units: SI by default, oilfield when asked, a misspelt name refused with its place") {
  TinyScenario t;
  CHECK(load_scenario(t.scenario()).output.units == units::UnitSystem::si);
  CHECK(to_json(load_scenario(t.scenario()))["output"]["units"] == "SI");
  TinyScenario o;
  o.replace("scenario.toml", "cog = false", "cog = false\nunits = \"oilfield\"");
  CHECK(load_scenario(o.scenario()).output.units == units::UnitSystem::oilfield);
  CHECK(to_json(load_scenario(o.scenario()))["output"]["units"] == "oilfield");
  TinyScenario m;
  m.replace("scenario.toml", "cog = false", "cog = false\nunits = \"oilfeild\"");
  CHECK_THROWS_WITH_AS(load_scenario(m.scenario()),
                       doctest::Contains("scenario.toml line 29, column 9: field 'output.units' = 'oilfeild': expected "
                                         "\"SI\" or \"oilfield\" (did you mean 'oilfield'?)"),
                       InputError);
  TinyScenario n;
  n.replace("scenario.toml", "cog = false", "cog = false\nunits = 3");
  CHECK_THROWS_AS(load_scenario(n.scenario()), InputError);
}

TEST_CASE("[output] footprint: a pressure above zero, 0.1 MPa when not given") {
  TinyScenario t;
  CHECK(load_scenario(t.scenario()).output.footprint == 0.1e6);  // the documented default (docs/scenario.md)
  CHECK_FALSE(load_scenario(t.scenario()).output.footprint_given);
  TinyScenario g;
  g.replace("scenario.toml", "cog = false\n", "cog = false\nfootprint = \"50 kPa\"\n");
  CHECK(load_scenario(g.scenario()).output.footprint == 5e4);
  TinyScenario z;
  z.replace("scenario.toml", "cog = false\n", "cog = false\nfootprint = \"0 MPa\"\n");
  CHECK_THROWS_WITH_AS(load_scenario(z.scenario()),
                       doctest::Contains("field 'output.footprint' = '0 MPa': expected a pressure change above zero"),
                       InputError);
  TinyScenario u;
  u.replace("scenario.toml", "cog = false\n", "cog = false\nfootprint = \"0.1 m\"\n");
  CHECK_THROWS_WITH_AS(load_scenario(u.scenario()), doctest::Contains("output.footprint"), InputError);
}
