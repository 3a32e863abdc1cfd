#include "core/stats/distribution_text.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numbers>

#include "core/errors.hpp"
#include "relative.hpp"

using namespace slipscreen;
using stats::Distribution;
using stats::DistributionKind;
using stats::parse_distribution;
using stats::test::relative_error;
using units::Dimension;

// Unit factors: 1 MPa/km = 1000 Pa/m; 1 mD = 9.869233e-16 m² (common practice, as in units.hpp);
// 1 deg = π/180 rad.

TEST_CASE("each distribution is read with its units into SI") {
  const Distribution fixed = parse_distribution("10 mD", Dimension::permeability, "permeability");
  CHECK(fixed.kind() == DistributionKind::fixed);
  CHECK(relative_error(fixed.a(), 9.869233e-15) < 1e-15);
  CHECK(parse_distribution("fixed(10 mD)", Dimension::permeability, "k") == fixed);

  const Distribution u = parse_distribution("uniform(20 MPa/km, 24 MPa/km)", Dimension::pressure_gradient, "shmin");
  CHECK(u.kind() == DistributionKind::uniform);
  CHECK(u.a() == 20e3);
  CHECK(u.b() == 24e3);
  CHECK(parse_distribution(" Uniform( max = 24 MPa/km , min=20 MPa/km ) ", Dimension::pressure_gradient, "shmin") == u);

  const Distribution n = parse_distribution("normal(0.6, 0.05)", Dimension::dimensionless, "friction");
  CHECK(n.kind() == DistributionKind::normal);
  CHECK(n.a() == 0.6);
  CHECK(n.b() == 0.05);
  CHECK(parse_distribution("normal(60 %, sd=5 %)", Dimension::dimensionless, "friction").a() == doctest::Approx(0.6).epsilon(1e-15));

  const Distribution ang = parse_distribution("normal(mean=0 deg, sd=5 deg)", Dimension::angle, "strike");
  CHECK(ang.a() == 0.0);
  CHECK(relative_error(ang.b(), 5.0 * std::numbers::pi / 180.0) < 1e-15);

  const Distribution t = parse_distribution("truncnormal(mean=0.6, sd=0.1, min=0.3, max=0.9)", Dimension::dimensionless, "mu");
  CHECK(t.kind() == DistributionKind::truncated_normal);
  CHECK(t.c() == 0.3);
  CHECK(t.d() == 0.9);
  CHECK(parse_distribution("truncated_normal(0.6, 0.1, 0.3, 0.9)", Dimension::dimensionless, "mu") == t);
  const Distribution half = parse_distribution("truncnormal(mean=0.6, sd=0.1, min=0)", Dimension::dimensionless, "mu");
  CHECK(half.c() == 0.0);
  CHECK(std::isinf(half.d()));

  const Distribution ln = parse_distribution("lognormal(median=10 mD, sigma_ln=0.8)", Dimension::permeability, "k");
  CHECK(ln.kind() == DistributionKind::lognormal);
  CHECK(relative_error(ln.a(), 9.869233e-15) < 1e-15);
  CHECK(ln.b() == 0.8);
  CHECK(parse_distribution("lognormal(10 mD, 0.8)", Dimension::permeability, "k") == ln);
  const Distribution lp = parse_distribution("lognormal(p10=2 mD, p90=50 mD)", Dimension::permeability, "k");
  CHECK(relative_error(lp.a(), 10 * 9.869233e-16) < 1e-14);  // √(P10·P90) = 10 mD
  CHECK(relative_error(lp.b(), 1.2558510759184032) < 4e-15);  // scipy: log(25)/(2 norm.ppf(0.9)); a few ulp

  const Distribution tri = parse_distribution("triangular(min=0.5, mode=0.6, max=0.8)", Dimension::dimensionless, "mu");
  CHECK(tri.kind() == DistributionKind::triangular);
  CHECK(tri.b() == 0.6);
  CHECK(parse_distribution("triangular(0.5, 0.6, max=0.8)", Dimension::dimensionless, "mu") == tri);

  CHECK(parse_distribution("-5 deg", Dimension::angle, "dip").a() == doctest::Approx(-5.0 * std::numbers::pi / 180.0).epsilon(1e-15));
}

TEST_CASE("the canonical text reads back to the same distribution") {
  constexpr double inf = std::numeric_limits<double>::infinity();
  const std::pair<Distribution, Dimension> cases[] = {
      {Distribution::fixed(9.869233e-15), Dimension::permeability},
      {Distribution::uniform(20e3, 24e3), Dimension::pressure_gradient},
      {Distribution::normal(0.6, 0.05), Dimension::dimensionless},
      {Distribution::truncated_normal(0.6, 0.1, 0.3, inf), Dimension::dimensionless},
      {Distribution::truncated_normal(1e-3, 2e-4, 0.0, 2e-3), Dimension::viscosity},
      {Distribution::lognormal(9.869233e-15, 0.8), Dimension::permeability},
      {Distribution::triangular(0.1, 0.2, 0.4), Dimension::angle},
  };
  for (const auto& [d, dim] : cases) {
    const std::string text = stats::format_distribution(d, dim);
    CAPTURE(text);
    CHECK(parse_distribution(text, dim, "x") == d);
  }
  CHECK(stats::format_distribution(Distribution::lognormal(9.869233e-15, 0.8), Dimension::permeability) ==
        "lognormal(median=9.869233e-15 m2, sigma_ln=0.8)");
  CHECK(stats::format_distribution(Distribution::normal(0.6, 0.05), Dimension::dimensionless) == "normal(mean=0.6, sd=0.05)");
}

TEST_CASE("bad distribution text gives one clear message") {
  const auto k = Dimension::permeability;
  // Unknown name, with a suggestion from the edit distance (core/util/suggest.hpp).
  CHECK_THROWS_WITH_AS(parse_distribution("lognormel(10 mD, 0.8)", k, "permeability"),
                       "field 'permeability' = 'lognormel(10 mD, 0.8)': expected a value with a unit or a distribution: "
                       "fixed, uniform, normal, truncnormal, lognormal or triangular (did you mean 'lognormal'?)",
                       InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("gamma(2, 3)", Dimension::dimensionless, "mu"),
                       doctest::Contains("fixed, uniform, normal"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("normal", Dimension::dimensionless, "mu"),
                       doctest::Contains("in parentheses (did you mean 'normal'?)"), InputError);
  // Missing units.
  CHECK_THROWS_WITH_AS(parse_distribution("uniform(20, 24)", Dimension::pressure_gradient, "shmin_gradient"),
                       doctest::Contains("field 'shmin_gradient' = 'uniform(20, 24)': expected for min ('20') a number "
                                         "with a pressure gradient unit"),
                       InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("lognormal(median=10, sigma_ln=0.8)", k, "permeability"),
                       doctest::Contains("the unit is missing"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("10", k, "permeability"), doctest::Contains("the unit is missing"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("normal(10 psi, 1 psi)", k, "permeability"),
                       doctest::Contains("not a pressure unit"), InputError);
  // Parameter checks, reported with the text as written.
  CHECK_THROWS_WITH_AS(parse_distribution("uniform(24 MPa/km, 20 MPa/km)", Dimension::pressure_gradient, "shmin"),
                       "field 'shmin' = 'uniform(24 MPa/km, 20 MPa/km)': expected min < max (for a single value write "
                       "the value alone)",
                       InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("normal(0.6, -0.05)", Dimension::dimensionless, "friction"),
                       doctest::Contains("'normal(0.6, -0.05)': expected a positive standard deviation"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("lognormal(median=0 mD, sigma_ln=0.8)", k, "permeability"),
                       doctest::Contains("expected a positive median"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("lognormal(median=-3 mD, sigma_ln=0.8)", k, "permeability"),
                       doctest::Contains("expected a positive median"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("triangular(min=0.5, mode=0.9, max=0.8)", Dimension::dimensionless, "mu"),
                       doctest::Contains("min <= mode <= max"), InputError);
  // Syntax.
  CHECK_THROWS_WITH_AS(parse_distribution("normal(mean=0.6, sdev=0.05)", Dimension::dimensionless, "mu"),
                       doctest::Contains("not 'sdev' (did you mean 'sd'?)"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("normal(0.6, mean=0.5)", Dimension::dimensionless, "mu"),
                       doctest::Contains("'mean' is given twice"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("normal(mean=0.6, 0.05)", Dimension::dimensionless, "mu"),
                       doctest::Contains("positional parameters before named ones"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("normal(0.6, 0.05, 0.1)", Dimension::dimensionless, "mu"),
                       doctest::Contains("at most 2 parameters"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("normal(0.6)", Dimension::dimensionless, "mu"),
                       doctest::Contains("a value for sd: normal(mean, sd)"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("normal(0.6,)", Dimension::dimensionless, "mu"),
                       doctest::Contains("a value between every pair of commas"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("normal(0.6, 0.05", Dimension::dimensionless, "mu"),
                       doctest::Contains("one pair of parentheses"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("normal()", Dimension::dimensionless, "mu"),
                       doctest::Contains("parameters: normal(mean, sd)"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("lognormal(median=10 mD, p90=50 mD)", k, "k"),
                       doctest::Contains("not a mix"), InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("truncnormal(mean=0.6, sd=0.1)", Dimension::dimensionless, "mu"),
                       doctest::Contains("min or max"), InputError);
  CHECK_THROWS_AS(parse_distribution("", Dimension::dimensionless, "mu"), InputError);
}
