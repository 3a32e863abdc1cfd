#include "scenario/uncertainty.hpp"

#include <doctest/doctest.h>

#include <nlohmann/json.hpp>

#include "core/errors.hpp"
#include "core/stats/random_stream.hpp"
#include "scenario/scenario.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;
using slipscreen::test::TinyScenario;

namespace {
// The tiny scenario (a_phi stress model, formation given as k, h, φ, c_t, μ; wells W1, W2, P1)
// with an [uncertainty] block appended.
scenario::UncertaintySpec with_block(const std::string& block) {
  TinyScenario t;
  t.append("scenario.toml", "\n" + block);
  return scenario::load_scenario(t.scenario()).uncertainty;
}
}  // namespace

TEST_CASE("no [uncertainty] table: the documented defaults") {
  TinyScenario t;
  const auto spec = scenario::load_scenario(t.scenario()).uncertainty;
  CHECK_FALSE(spec.given);
  CHECK(spec.values.empty());
  CHECK(spec.realizations.value() == 1000);
  CHECK(spec.sampler == stats::SamplingMethod::monte_carlo);
  CHECK(spec.seed == 42);  // the scenario's seed
  CHECK(spec.confidence == 0.95);
  CHECK(spec.thresholds == std::vector<double>{0.05});
}

TEST_CASE("a full [uncertainty] table resolves into sorted SI inputs") {
  const auto spec = with_block(R"toml([uncertainty]
realizations = 500
sampler = "lhs"
confidence = "90 %"
thresholds = [0.2, 0.05]
pore_pressure_gradient = "normal(0.433 psi/ft, 0.005 psi/ft)"
rate_factor = "lognormal(median=1, sigma_ln=0.1)"
[uncertainty.stress]
a_phi = "uniform(1.2, 1.8)"
shmax_azimuth = "normal(60 deg, 8 deg)"
[uncertainty.formation]
permeability = "lognormal(median=100 mD, sigma_ln=0.7)"
porosity = "triangular(0.06, 0.1, 0.14)"
[uncertainty.faults]
friction = "truncnormal(mean=0.6, sd=0.1, min=0.3, max=0.9)"
strike_perturbation = "normal(0 deg, 5 deg)"
[uncertainty.fault."F1"]
friction = 0.7
[uncertainty.well."W2"]
rate_factor = "uniform(0.8, 1.2)"
)toml");
  CHECK(spec.given);
  CHECK(spec.realizations.value() == 500);
  CHECK(spec.sampler == stats::SamplingMethod::latin_hypercube);
  CHECK(spec.confidence == doctest::Approx(0.9).epsilon(1e-15));
  CHECK(spec.thresholds == std::vector<double>{0.05, 0.2});
  std::vector<std::string> keys;
  for (const auto& v : spec.values) keys.push_back(v.key);
  // Byte order of the keys, whatever the order in the file.
  CHECK(keys == std::vector<std::string>{"fault.F1.friction", "faults.friction", "faults.strike_perturbation",
                                         "formation.permeability", "formation.porosity", "pore_pressure_gradient",
                                         "rate_factor", "stress.a_phi", "stress.shmax_azimuth", "well.W2.rate_factor"});
  const auto* k = spec.find("formation.permeability");
  REQUIRE(k != nullptr);
  CHECK(k->distribution.kind() == stats::DistributionKind::lognormal);
  CHECK(k->distribution.a() == doctest::Approx(100 * 9.869233e-16).epsilon(1e-14));  // 1 mD = 9.869233e-16 m² (common practice)
  CHECK(k->text == "lognormal(median=100 mD, sigma_ln=0.7)");
  CHECK(k->where.find("scenario.toml line ") != std::string::npos);
  CHECK(spec.find("fault.F1.friction")->distribution.is_fixed());
  CHECK(spec.seed == 42);
  // The manifest block names everything.
  const auto j = scenario::to_json(spec);
  CHECK(j["sampler"] == "latin-hypercube");
  CHECK(j["realizations"] == 500);
  CHECK(j["stream"] == std::string(stats::kStreamVersion));
  CHECK(j["inputs"][3]["distribution_si"] == "lognormal(median=9.869233e-14 m2, sigma_ln=0.7)");
  CHECK_NOTHROW(scenario::check_fault_ids(spec, {"F1", "F2"}));
  CHECK_THROWS_WITH_AS(scenario::check_fault_ids(spec, {"F2", "F3"}), doctest::Contains("the id of a fault of the fault map"),
                       InputError);
}

TEST_CASE("bad [uncertainty] tables name the file, line, key and what was expected") {
  struct Bad {
    const char* block;
    const char* message;
  };
  const Bad cases[] = {
      {"[uncertainty]\nrealizations = 0\n",
       "scenario.toml line 40, column 16: field 'uncertainty.realizations' = '0': expected a whole number of realizations from 1 to 100000000"},
      {"[uncertainty]\nsampler = \"latin\"\n", "field 'uncertainty.sampler' = 'latin'"},
      {"[uncertainty]\nrealisations = 10\n", "unknown key (did you mean 'realizations'?)"},
      {"[uncertainty.faults]\nfriction = \"normal(0.6, -0.1)\"\n", "expected a positive standard deviation"},
      {"[uncertainty.faults]\nfriction = \"normal(0.2, 0.1)\"\n",
       "expected a distribution of positive values (this one puts 0.0228 of its probability outside"},
      {"[uncertainty.faults]\nfriction = \"gaussian(0.6, 0.1)\"\n", "distribution: fixed, uniform, normal"},
      {"[uncertainty.formation]\npermeability = \"lognormal(median=0 mD, sigma_ln=0.5)\"\n", "a positive median"},
      {"[uncertainty.formation]\npermeability = \"uniform(50, 80)\"\n", "the unit is missing"},
      {"[uncertainty.formation]\ntransmissivity = \"1e-4 m2/s\"\n", "unknown key"},
      {"[uncertainty.stress]\nshmin_gradient = \"uniform(15 MPa/km, 18 MPa/km)\"\n",
       "expected a key of the region's stress model 'a_phi': vertical_gradient, shmax_azimuth, a_phi"},
      {"[uncertainty.fault.\"F1\"]\ncohesion = \"1 MPa\"\n", "unknown key"},
      {"[uncertainty.stress]\na_fi = 1.2\n", "(did you mean 'a_phi'?)"},
      {"[uncertainty.stress]\nbiot = \"uniform(0.6, 0.9)\"\n", "(biot needs [stress] poroelastic_path = true)"},
      {"[uncertainty.stress]\na_phi = \"uniform(2.5, 3.5)\"\n", "a distribution of values in [0, 3]"},
      {"[uncertainty.well.\"W9\"]\nrate_factor = 1.1\n", "expected the id of a well of the scenario (did you mean 'W1'?)"},
      {"[uncertainty]\nthresholds = [0.05, 1.5]\n", "probabilities between 0 and 1"},
      {"[uncertainty]\nconfidence = 95\n", "a level between 0 and 1"},
      {"[uncertainty.faults]\nfriction = true\n", "a value or a distribution written as a string"},
  };
  for (const auto& c : cases) {
    CAPTURE(c.block);
    // Unknown keys come from the scenario reader's Section::allow as Error(input).
    CHECK_THROWS_WITH_AS(with_block(c.block), doctest::Contains(c.message), Error);
    try {
      with_block(c.block);
    } catch (const Error& e) {
      CHECK(e.category() == ErrorCategory::input);
    }
  }
}

TEST_CASE("the poroelastic path's biot and poisson_ratio may be uncertain, in their ranges") {
  TinyScenario t;
  t.replace("region.toml", "a_phi = 1.5", "a_phi = 1.5\nporoelastic_path = true\nbiot = 0.8\npoisson_ratio = 0.25");
  t.append("scenario.toml", "\n[uncertainty]\nrealizations = 10\n[uncertainty.stress]\nbiot = \"uniform(0.6, 0.95)\"\n"
                            "poisson_ratio = \"triangular(0.2, 0.25, 0.3)\"\n");
  const auto s = scenario::load_scenario(t.scenario());
  REQUIRE(s.uncertainty.values.size() == 2);
  CHECK(s.uncertainty.values[0].key == "stress.biot");
  CHECK(s.uncertainty.values[1].key == "stress.poisson_ratio");
  TinyScenario b;
  b.replace("region.toml", "a_phi = 1.5", "a_phi = 1.5\nporoelastic_path = true\nbiot = 0.8\npoisson_ratio = 0.25");
  b.append("scenario.toml", "\n[uncertainty]\nrealizations = 10\n[uncertainty.stress]\nbiot = \"uniform(0.6, 1.2)\"\n");
  CHECK_THROWS_WITH(scenario::load_scenario(b.scenario()), doctest::Contains("expected a distribution of values in (0, 1]"));
}

TEST_CASE("a leaky formation allows only the permeability to be uncertain") {
  TinyScenario t;
  t.replace("region.toml", "viscosity = \"0.5 cP\"", "viscosity = \"0.5 cP\"\nmodel = \"leaky\"\nleakage_factor = \"4 km\"");
  t.append("scenario.toml", "\n[uncertainty]\nrealizations = 10\n[uncertainty.formation]\n"
                            "permeability = \"lognormal(median=200 mD, sigma_ln=0.3)\"\n");
  CHECK(scenario::load_scenario(t.scenario()).uncertainty.values.size() == 1);
  t.append("scenario.toml", "porosity = \"uniform(0.08, 0.12)\"\n");
  CHECK_THROWS_WITH(scenario::load_scenario(t.scenario()),
                    doctest::Contains("field 'uncertainty.formation.porosity' = 'uniform(0.08, 0.12)': expected a fixed value: "
                                      "with [formation] model = 'leaky'"));
}

TEST_CASE("the spec does not depend on the order of the lines") {
  const auto a = with_block("[uncertainty]\nsampler = \"lhs\"\nrealizations = 50\n[uncertainty.faults]\nfriction = \"uniform(0.5, 0.7)\"\n"
                            "cohesion = \"uniform(0 MPa, 1 MPa)\"\n");
  const auto b = with_block("[uncertainty.faults]\ncohesion = \"uniform(0 MPa, 1 MPa)\"\nfriction = \"uniform(0.5, 0.7)\"\n"
                            "[uncertainty]\nrealizations = 50\nsampler = \"lhs\"\n");
  REQUIRE(a.values.size() == 2);
  REQUIRE(b.values.size() == 2);
  for (std::size_t k = 0; k < 2; ++k) {
    CHECK(a.values[k].key == b.values[k].key);
    CHECK(a.values[k].distribution == b.values[k].distribution);
  }
  CHECK(scenario::to_json(a)["inputs"][0]["key"] == "faults.cohesion");
}

TEST_CASE("each key names the model input it replaces") {
  using Model = probabilistic::UncertainModel;
  const auto spec = with_block(R"toml([uncertainty]
rate_factor = "uniform(0.9, 1.1)"
[uncertainty.formation]
permeability = "lognormal(median=200 mD, sigma_ln=0.3)"
[uncertainty.stress]
a_phi = "uniform(1.2, 1.8)"
[uncertainty.faults]
dip_perturbation = "normal(0 deg, 3 deg)"
[uncertainty.fault."F1"]
friction = "uniform(0.5, 0.7)"
[uncertainty.well."W2"]
rate_factor = "uniform(0.8, 1.2)"
)toml");
  const auto field = [&](const char* key) {
    const auto* v = spec.find(key);
    REQUIRE_MESSAGE(v != nullptr, key);
    CHECK(v->scope == scenario::UncertainScope::model);
    return v->field;
  };
  CHECK(field("rate_factor") == &Model::rate_factor);
  CHECK(field("formation.permeability") == &Model::permeability);
  CHECK(field("stress.a_phi") == &Model::a_phi);
  CHECK(field("faults.dip_perturbation") == &Model::dip_perturbation);
  const auto* f = spec.find("fault.F1.friction");
  REQUIRE(f != nullptr);
  CHECK(f->scope == scenario::UncertainScope::fault_friction);
  CHECK(f->id == "F1");
  const auto* w = spec.find("well.W2.rate_factor");
  REQUIRE(w != nullptr);
  CHECK(w->scope == scenario::UncertainScope::well_rate_factor);
  CHECK(w->id == "W2");
}
