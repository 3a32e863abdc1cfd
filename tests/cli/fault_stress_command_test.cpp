// `fault-stress --poroelastic` against the scenario screens with [stress] poroelastic_path = true
// (docs/geomechanics.md, "The poroelastic path in runs"): on the tiny fixture scenario with every
// input fixed, the probabilistic screen's Δp_crit (double precision, before its single-precision
// store) and the deterministic screen's Δp_crit of every segment agree with the command's JSON
// for the same stress, friction, α, ν and plane to 1e-9 relative.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdio>
#include <nlohmann/json.hpp>
#include <sstream>

#include "cli/app.hpp"
#include "core/probabilistic/realization_sampler.hpp"
#include "core/screen/deterministic_screen.hpp"
#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"
#include "screening/probabilistic_screen.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;

namespace {

std::string degrees(double rad) {
  char b[40];
  std::snprintf(b, sizeof b, "%.17g", rad * 180.0 / 3.14159265358979323846);
  return b;
}

// Δp_crit of one plane from `slipscreen fault-stress --poroelastic --json`, the tiny region's
// stress (a_phi 1.5 at frictional equilibrium for μ = 0.6, 1.1 psi/ft, 0.433 psi/ft, 3000 m).
double command_dp_crit(double strike, double dip) {
  const std::vector<std::string> args = {
      "fault-stress", "--depth", "3000 m", "--sv-gradient", "1.1 psi/ft", "--pore-gradient", "0.433 psi/ft",
      "--a-phi", "1.5", "--shmax-azimuth", "60 deg", "--friction", "0.6", "--poisson", "0.25", "--biot", "0.8",
      "--poroelastic", "--json", "--plane", degrees(strike) + "/" + degrees(dip)};
  std::ostringstream out, err;
  REQUIRE_MESSAGE(cli::run(args, out, err) == 0, err.str());
  const auto j = nlohmann::json::parse(out.str());
  CHECK(j["stress_path"]["kappa"].get<double>() == doctest::Approx(0.8 * 0.5 / 0.75).epsilon(1e-15));
  return j["planes"][0]["dp_crit_pa"].get<double>();
}

}  // namespace

TEST_CASE("fault-stress --poroelastic agrees with both screens of a scenario on the path to 1e-9") {
  test::TinyScenario t;
  t.replace("region.toml", "a_phi = 1.5", "a_phi = 1.5\nporoelastic_path = true\nbiot = 0.8\npoisson_ratio = 0.25");
  t.append("scenario.toml", "\n[uncertainty]\nrealizations = 4\n");
  const scenario::ResolvedScenario s = scenario::load_scenario(t.scenario());
  const screening::PreparedRun p = screening::prepare_run(s, false);
  REQUIRE(p.inputs.stress_path_kappa == doctest::Approx(0.8 * 0.5 / 0.75).epsilon(1e-15));
  const screen::ScreenResult det = screen::deterministic_screen(p.inputs);

  std::vector<std::string> fault_ids;
  std::vector<std::size_t> segment_fault;
  const auto model = screening::uncertain_model(s, p, s.uncertainty, fault_ids, segment_fault);
  REQUIRE(model.poroelastic_path);
  std::vector<probabilistic::SegmentInput> segments;
  for (std::size_t i = 0; i < p.inputs.segments.size(); ++i)
    segments.push_back({{}, p.inputs.segments[i].strike, p.inputs.segments[i].dip, segment_fault[i]});
  const auto list = probabilistic::make_inputs(model, {}, fault_ids.size());
  probabilistic::RunSettings set;
  const stats::RealizationCount count(4, "realizations");
  const auto prob = probabilistic::realization_critical_pressures(model, list, segments, fault_ids.size(), set, count, 0);
  REQUIRE(prob.size() == segments.size());
  REQUIRE(segments.size() >= 3);

  double without_path_differs = 0.0, worst_prob = 0.0, worst_det = 0.0;
  for (std::size_t i = 0; i < segments.size(); ++i) {
    CAPTURE(i);
    const double ref = command_dp_crit(segments[i].strike, segments[i].dip);
    REQUIRE(std::isfinite(ref));
    CHECK(std::fabs(prob[i] - ref) <= 1e-9 * std::fabs(ref));
    worst_prob = std::max(worst_prob, std::fabs(prob[i] - ref) / std::fabs(ref));
    worst_det = std::max(worst_det, std::fabs(det.segments[i].dp_crit - ref) / std::fabs(ref));
    CHECK(std::fabs(det.segments[i].dp_crit - ref) <= 1e-9 * std::fabs(ref));
    // ΔCFF along the path at Δp_crit cancels the initial CFF: CFF(0) + ΔCFF(Δp_crit) = 0.
    const auto& g = det.segments[i];
    const double cff0 = g.shear_stress - g.friction * g.effective_normal_stress;
    CHECK(std::fabs(cff0 + g.coulomb_change.at(g.dp_crit)) <= 1e-6 * std::fabs(g.effective_normal_stress));
    // Not the no-path value: the test would notice the path being ignored.
    const double no_path = g.effective_normal_stress - g.shear_stress / g.friction;
    without_path_differs = std::max(without_path_differs, std::fabs(no_path - ref));
  }
  CHECK(without_path_differs > 1e5);  // Pa
  MESSAGE("worst relative difference from fault-stress: probabilistic " << worst_prob << ", deterministic "
                                                                         << worst_det << " over " << segments.size()
                                                                         << " segments");
}
