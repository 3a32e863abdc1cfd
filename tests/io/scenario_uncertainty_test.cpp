#include "io/scenario_uncertainty.hpp"

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <numbers>

#include "core/errors.hpp"

namespace fs = std::filesystem;
using namespace slipscreen;

namespace {
// A scenario on the fictional demo region with a given [uncertainty] table.
io::ResolvedScenario scenario_with(const std::string& uncertainty) {
  const fs::path dir = fs::temp_directory_path() / ("slipscreen-unc-" + std::to_string(::getpid()));
  fs::create_directories(dir);
  const fs::path file = dir / "scenario.toml";
  std::ofstream(file) << "[region]\nfile = \"" << SLIPSCREEN_SOURCE_DIR << "/regions/marrowick/region.toml\"\n"
                      << "[output.times]\ndates = [\"2030-01-01\"]\n"
                      << "[[proposed_well]]\nid = \"P\"\nx = 501000.0\ny = 6124000.0\ntop = \"2600 m\"\n"
                      << "bottom = \"2700 m\"\nradius = \"0.1 m\"\nschedule = [\"1000 m3/d from 2027-01-01 to 2029-01-01\"]\n"
                      << uncertainty;
  auto s = io::load_scenario(file);
  return s;
}
}  // namespace

TEST_CASE("no [uncertainty] table: the model holds the region's best estimates as fixed values") {
  const auto s = scenario_with("");
  const auto u = io::load_uncertainty(s);
  CHECK_FALSE(u.enabled);
  CHECK(u.model.friction.is_fixed());
  CHECK(u.model.friction.a() == s.region.faults.friction);
  CHECK(u.model.depth == s.region.reference_depth);
}

TEST_CASE("[uncertainty] distributions, sampler, thresholds and maps are read in SI") {
  const auto s = scenario_with(
      "[uncertainty]\nrealizations = 500\nsampler = \"monte-carlo\"\nthresholds = [0.05, 0.5]\n"
      "friction = \"normal(0.6, 0.05)\"\nstrike_perturbation = \"normal(0 deg, 5 deg)\"\n"
      "[uncertainty.well_rate_factor]\n\"MW-P1\" = \"uniform(0.8, 1.2)\"\n"
      "[uncertainty.maps]\ncell_size = \"2 km\"\nstrike = \"30 deg\"\ndip = \"70 deg\"\n");
  const auto u = io::load_uncertainty(s);
  CHECK(u.enabled);
  CHECK(u.realizations == 500);
  CHECK(u.method == stats::SamplingMethod::monte_carlo);
  CHECK(u.thresholds == std::vector<double>{0.05, 0.5});
  CHECK(u.model.friction.kind() == stats::DistributionKind::normal);
  CHECK(u.model.strike_perturbation.b() == doctest::Approx(5 * std::numbers::pi / 180).epsilon(1e-12));
  CHECK(u.well_rate_factor.count("MW-P1") == 1);
  CHECK(u.map_cell_size == 2000.0);
  CHECK(*u.map_dip == doctest::Approx(70 * std::numbers::pi / 180).epsilon(1e-12));
}

TEST_CASE("[uncertainty] bad input names the place, key and value") {
  CHECK_THROWS_WITH_AS(io::load_uncertainty(scenario_with("[uncertainty]\nfriktion = \"normal(0.6, 0.05)\"\n")),
                       doctest::Contains("did you mean 'friction'"), Error);
  CHECK_THROWS_WITH_AS(io::load_uncertainty(scenario_with("[uncertainty]\nrealizations = 0\n")),
                       doctest::Contains("realizations"), InputError);
  CHECK_THROWS_WITH_AS(io::load_uncertainty(scenario_with("[uncertainty]\nfriction = \"normal(0.6, -0.05)\"\n")),
                       doctest::Contains("line 14"), InputError);
  CHECK_THROWS_WITH_AS(io::load_uncertainty(scenario_with("[uncertainty]\nfriction = \"gaussian(0.6, 0.05)\"\n")),
                       doctest::Contains("friction"), InputError);
  CHECK_THROWS_AS(io::load_uncertainty(scenario_with("[uncertainty]\nthresholds = [0.5, 0.1]\n")), InputError);
  CHECK_THROWS_AS(io::load_uncertainty(scenario_with("[uncertainty]\npermeability = \"uniform(20 mD, 10 mD)\"\n")),
                  InputError);
}
