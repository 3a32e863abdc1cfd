#include "core/seismo/catalog_summary.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

namespace {
Catalog from_magnitudes(const std::vector<double>& m) {
  Catalog c;
  for (std::size_t i = 0; i < m.size(); ++i)
    c.events.push_back({std::to_string(i), 1000.0 + 10.0 * static_cast<double>(i), 0.0, 0.0, 1000.0, m[i], "ML", ""});
  return c;
}
}  // namespace

TEST_CASE("an empty catalog gives a documented result, not an error or NaN") {
  const auto s = summarize_catalog(Catalog{}, SummaryOptions{});
  CHECK(s.events == 0);
  CHECK_FALSE(s.has_mc);
  CHECK(s.mc_note.find("no events") != std::string::npos);
  CHECK_FALSE(s.b);
  CHECK(s.b_note.find("no Mc") != std::string::npos);
  CHECK(s.seismogenic_index_note.find("no injected-volume history") != std::string::npos);
  CHECK_FALSE(s.assumptions.empty());
}

TEST_CASE("no event above a given Mc: notes instead of a b-value") {
  SummaryOptions o;
  o.fixed_mc = 3.0;
  o.volume_history = VolumeHistory{{0.0, 1e6}, {0.0, 1e4}};
  o.planned_volume = 1e4;
  const auto s = summarize_catalog(from_magnitudes({1.0, 1.1, 1.2, 2.9}), o);
  CHECK(s.has_mc);
  CHECK(s.mc_given);
  CHECK(s.events_at_or_above_mc == 0);
  CHECK_FALSE(s.b);
  CHECK(s.b_note.find("0 event(s) at or above Mc = 3") != std::string::npos);
  CHECK_FALSE(s.seismogenic_index);
  CHECK(s.seismogenic_index_note.find("no b-value") != std::string::npos);
  CHECK(s.forecasts.empty());
  CHECK(s.forecast_note.find("no seismogenic index") != std::string::npos);
}

TEST_CASE("a full summary: Mc, b, McGarr, Σ, forecasts, fault bounds") {
  // 12 events: FMD mode at 1.0 (4 events); b from the 10 events >= 1.0.
  const std::vector<double> m = {0.9, 1.0, 1.0, 1.0, 1.0, 1.1, 1.2, 1.3, 1.5, 1.8, 2.1, 0.8};
  SummaryOptions o;
  o.net_volume = 1e6;
  o.shear_modulus = 3e10;
  o.volume_history = VolumeHistory{{0.0, 2000.0}, {0.0, 5e4}};
  o.planned_volume = 1e5;
  o.forecast_magnitudes = {2.0};
  o.faults = {{"F1", 10e3}};
  o.bootstrap_resamples = 200;
  const auto s = summarize_catalog(from_magnitudes(m), o);
  REQUIRE(s.completeness);
  CHECK(s.mc == doctest::Approx(1.0).epsilon(1e-12));
  CHECK(s.events_at_or_above_mc == 10);
  REQUIRE(s.b);
  // M̄ of the 10 events = 13.0/10 = 1.3; b = log10(e)/(1.3 - 0.95) = 1.2408414 (arithmetic).
  CHECK(s.b->b == doctest::Approx(0.4342944819032518 / 0.35).epsilon(1e-12));
  CHECK(s.b_note.find("poorly constrained") != std::string::npos);
  REQUIRE(s.bootstrap);
  REQUIRE(s.mcgarr_mw);
  CHECK(*s.mcgarr_mw == doctest::Approx(4.918080836479775).epsilon(1e-12));  // McGarr (2014), IASPEI (2013)
  REQUIRE(s.seismogenic_index);
  // Σ = log10(10/5e4) + b·1.0 (Shapiro et al. 2010 with the Poisson MLE).
  CHECK(s.seismogenic_index->sigma == doctest::Approx(std::log10(10.0 / 5e4) + s.b->b).epsilon(1e-12));
  REQUIRE(s.forecasts.size() == 1);
  // N(>=2) = 1e5 · 10^(Σ - 2b) = 1e5 · (10/5e4) · 10^(-b) = 20 · 10^-1.2408 = 1.1484 (arithmetic).
  CHECK(s.forecasts[0].expected == doctest::Approx(20.0 * std::pow(10.0, -s.b->b)).epsilon(1e-12));
  CHECK(s.forecasts[0].probability == doctest::Approx(-std::expm1(-s.forecasts[0].expected)).epsilon(1e-14));
  REQUIRE(s.fault_bounds.size() == 1);
  CHECK(s.fault_bounds[0].estimate.magnitude == doctest::Approx(6.24).epsilon(1e-12));
}

TEST_CASE("invalid options are input errors") {
  SummaryOptions o;
  o.bin_width = 0.0;
  CHECK_THROWS_AS(summarize_catalog(Catalog{}, o), InputError);
  SummaryOptions v;
  v.volume_history = VolumeHistory{{0.0}, {0.0}};
  CHECK_THROWS_AS(summarize_catalog(from_magnitudes({1.0, 2.0}), v), InputError);
}
