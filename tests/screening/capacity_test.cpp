// The allowable rate of a group of wells (screening/capacity.hpp) against reruns of the full
// probabilistic screen: the group's planned rates multiplied by the reported factor f* keep the
// largest segment P(slip) within the threshold, and by 1.05·f* exceed it (issue 13, "done when";
// both with the same seed, so the same realizations).
#include "screening/capacity.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>

#include "core/probabilistic/allowable_factor.hpp"
#include "core/screen/deterministic_screen.hpp"
#include "core/stats/wilson_interval.hpp"
#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"
#include "screening/probabilistic_screen.hpp"
#include "support/rate_steps_fixture.hpp"
#include "support/scenario_fixture.hpp"

using namespace slipscreen;
using namespace slipscreen::screening;
using slipscreen::test::TinyScenario;

namespace {

const char* kUncertainty =
    "\n[uncertainty]\nrealizations = 400\nsampler = \"latin-hypercube\"\nthresholds = [0.05, 0.2, 0.5]\n"
    "[uncertainty.formation]\npermeability = \"lognormal(median=200 mD, sigma_ln=0.4)\"\n"
    "[uncertainty.faults]\nfriction = \"truncnormal(mean=0.6, sd=0.05, min=0.4, max=0.8)\"\n"
    "[uncertainty.well.\"P1\"]\nrate_factor = \"uniform(0.8, 1.2)\"\n";

struct Screen {
  explicit Screen(const std::filesystem::path& scenario)
      : s(scenario::load_scenario(scenario)),
        p(prepare_run(s, false)),
        det(screen::deterministic_screen(p.inputs)),
        prob(run_probabilistic_screen(s, p, s.uncertainty)),
        cap(capacity_answer(s, p, det, prob)) {}
  scenario::ResolvedScenario s;
  PreparedRun p;
  screen::ScreenResult det;
  ProbabilisticRun prob;
  CapacityResult cap;
};

Screen screen_with(const std::string& capacity) {
  TinyScenario t;
  t.append("scenario.toml", std::string(kUncertainty) + capacity);
  return Screen(t.scenario());
}

// The full screen rerun with the group's rates (from `from` on, or all) times f: the largest
// upper end of the Wilson interval of P(slip by T) over the segments not listed in `skip`.
double rerun_largest_upper(const Screen& r, double f, double from, const std::vector<std::size_t>& skip) {
  std::vector<std::string> fault_ids;
  std::vector<std::size_t> segment_fault;
  const auto model = uncertain_model(r.s, r.p, r.s.uncertainty, fault_ids, segment_fault);
  auto wells = r.prob.wells;
  for (auto& w : wells)
    if (std::find(r.cap.wells.begin(), r.cap.wells.end(), w.id) != r.cap.wells.end())
      w.steps = slipscreen::test::scaled_from(w.steps, f, from);
  auto settings = r.prob.settings;
  settings.capacity.reset();
  settings.map_points.clear();
  const auto res = probabilistic::run_probabilistic(model, wells, r.prob.segments, settings);
  const double z = stats::z_for_confidence(r.prob.confidence);
  double largest = 0.0;
  for (std::size_t i = 0; i < res.segments.size(); ++i)
    if (std::find(skip.begin(), skip.end(), i) == skip.end())
      largest = std::max(largest, stats::wilson_interval(res.segments[i].slipped_by.back(), res.realizations, z).upper);
  return largest;
}

void check_against_reruns(const Screen& r, double from, int min_answered = 2) {
  int answered = 0;
  for (const auto& th : r.cap.thresholds) {
    CAPTURE(th.threshold);
    if (th.wilson.beyond) continue;
    ++answered;
    // The point estimate's answer is over the same segments, so never below the conservative one.
    CHECK(th.wilson.allowed <= th.point.allowed);
    const double f = th.wilson.allowed;
    CHECK(f < th.wilson.limit);
    CHECK(rerun_largest_upper(r, f, from, th.reached_without) <= th.threshold);
    CHECK(rerun_largest_upper(r, 1.05 * f, from, th.reached_without) > th.threshold);
  }
  CHECK(answered >= min_answered);  // the case exercises finite answers
}

}  // namespace

TEST_CASE("allowable rate: reruns at the reported factor stay within each threshold, at 1.05 times it exceed it") {
  const Screen r = screen_with("\n[capacity]\n");
  REQUIRE(r.cap.wells == std::vector<std::string>{"P1"});  // the proposed well by default
  for (const auto& th : r.cap.thresholds)
    MESSAGE("threshold " << th.threshold << ": f* " << th.wilson.allowed << " (limit " << th.wilson.limit
                         << "), point " << th.point.allowed);
  check_against_reruns(r, -1e300);
  // At f = 1 the curves give the screen's own P(slip by T) (the same realizations, Δp split by
  // linearity): counts agree but for realizations whose Δp sits at Δp_crit to rounding.
  for (std::size_t i = 0; i < r.cap.curves.size(); ++i) {
    const auto n = static_cast<double>(r.prob.result.segments[i].slipped_by.back());
    CHECK(std::abs(static_cast<double>(r.cap.curves[i].slipped(1.0)) - n) <= 1.0);
  }
}

TEST_CASE("allowable rate with [capacity] from: only the schedule after the date scales") {
  const Screen r = screen_with("\n[capacity]\nwells = [\"P1\"]\nfrom = \"2022-01-01\"\n");
  REQUIRE(r.cap.from.has_value());
  check_against_reruns(r, *r.cap.from);
}

TEST_CASE("allowable rate, deterministic answer: the best-estimate margin at the factor stays at or above [capacity] margin") {
  const Screen r = screen_with("\n[capacity]\nmargin = \"0.1 MPa\"\nup_to = 1000\n");
  REQUIRE_FALSE(r.cap.deterministic.beyond);
  const std::size_t b = *r.cap.deterministic.binding;
  MESSAGE("deterministic f " << r.cap.deterministic.allowed << ", bound by " << r.cap.segment_ids[b]);
  // Rerun the deterministic screen with P1's rates times f: the binding segment's peak Δp
  // against Δp_crit − margin (peak over the tracked times; table accuracy ~1e-6 relative).
  for (double scale : {1.0, 1.05}) {
    auto in = r.p.inputs;
    for (auto& w : in.wells)
      if (w.id == "P1") w.history = w.history.scaled(scale * r.cap.deterministic.allowed);
    const auto det = screen::deterministic_screen(in);
    const double room = det.segments[b].dp_crit - r.cap.margin - det.segments[b].peak_dp;
    CAPTURE(scale);
    if (scale == 1.0) CHECK(room >= -1e-6 * det.segments[b].peak_dp);
    else CHECK(room < 0.0);
  }
}

TEST_CASE("allowable rate of a group with the global rate factor only (a rate group of its own in the run)") {
  const Screen r = screen_with("\n[capacity]\nwells = [\"W1\", \"W2\"]\nup_to = 100\n");
  for (const auto& th : r.cap.thresholds)
    MESSAGE("threshold " << th.threshold << ": f* " << th.wilson.allowed << ", point " << th.point.allowed);
  check_against_reruns(r, -1e300);
}

TEST_CASE("allowable rate: the curves cut where the answers no longer need them equal the whole curves where exact") {
  // group_factors.hpp searches each segment's factors only up to the cutoff its answers need.
  // The same run without thresholds resolves every factor up to up_to: every answer, the curve
  // shown and every count within each cut curve's exact range must be the same.
  // One low threshold and a high up_to, so that the answers need few factors of each segment.
  TinyScenario t;
  std::string u = kUncertainty;
  u.replace(u.find("[0.05, 0.2, 0.5]"), 16, "[0.05]");
  t.append("scenario.toml", u + "\n[capacity]\nup_to = 100\n");
  const Screen r(t.scenario());
  std::vector<std::string> fault_ids;
  std::vector<std::size_t> segment_fault;
  const auto model = uncertain_model(r.s, r.p, r.s.uncertainty, fault_ids, segment_fault);
  auto settings = r.prob.settings;
  settings.capacity->thresholds.clear();
  settings.map_points.clear();
  const auto whole = probabilistic::run_probabilistic(model, r.prob.wells, r.prob.segments, settings).capacity;
  REQUIRE(whole.size() == r.cap.curves.size());
  const double z = stats::z_for_confidence(r.prob.confidence);
  const double end = probabilistic::curve_end(r.cap.curves, r.prob.thresholds, z, r.cap.up_to);
  CHECK(end == probabilistic::curve_end(whole, r.prob.thresholds, z, r.cap.up_to));
  int cut = 0;
  for (std::size_t s = 0; s < whole.size(); ++s) {
    CAPTURE(s);
    const auto& c = r.cap.curves[s];
    CHECK(whole[s].exact_up_to() == r.cap.up_to);  // factors above up_to are reported as beyond it
    CHECK(c.exact_up_to() >= end);
    if (c.exact_up_to() < r.cap.up_to) ++cut;
    for (double th : r.prob.thresholds)
      for (auto b : {probabilistic::ProbabilityBound::point_estimate, probabilistic::ProbabilityBound::wilson_upper,
                     probabilistic::ProbabilityBound::wilson_lower})
        CHECK(probabilistic::segment_limit(c, th, b, z) == probabilistic::segment_limit(whole[s], th, b, z));
    for (double f : whole[s].steps())
      if (f <= c.exact_up_to()) CHECK(c.slipped(f) == whole[s].slipped(f));
    CHECK(c.slipped(c.exact_up_to()) == whole[s].slipped(c.exact_up_to()));
  }
  MESSAGE(cut << " of " << whole.size() << " curves cut below up_to");
  CHECK(cut > 0);  // the case exercises the cut
}

TEST_CASE("allowable rate on the poroelastic stress path: reruns at f* and 1.05 f* bracket each threshold") {
  // ΔCFF stays linear in Δp on the path (Engelder & Fischer 1994: Δσh = κΔp), so the same
  // construction holds with the path's Δp_crit; the answers differ from the plain path's.
  const Screen path = screen_with(
      "\n[region.override.stress]\nporoelastic_path = true\nbiot = 0.8\npoisson_ratio = 0.25\n\n[capacity]\n");
  REQUIRE(path.prob.settings.capacity.has_value());
  check_against_reruns(path, -1e300, 1);  // one threshold is answered on this case
  const Screen plain = screen_with("\n[capacity]\n");
  bool differs = false;
  for (std::size_t i = 0; i < path.cap.thresholds.size(); ++i)
    differs = differs || path.cap.thresholds[i].wilson.limit != plain.cap.thresholds[i].wilson.limit;
  CHECK(differs);
}
