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

namespace {
struct BadText {
  const char* text;
  Dimension dimension;
  const char* field;
  const char* message;
};
}  // namespace

TEST_CASE("bad distribution text gives one clear message") {
  // Whole messages: unknown name with a suggestion from the edit distance
  // (core/util/suggest.hpp), and a parameter check reported with the text as written.
  CHECK_THROWS_WITH_AS(parse_distribution("lognormel(10 mD, 0.8)", Dimension::permeability, "permeability"),
                       "field 'permeability' = 'lognormel(10 mD, 0.8)': expected a value with a unit or a distribution: "
                       "fixed, uniform, normal, truncnormal, lognormal or triangular (did you mean 'lognormal'?)",
                       InputError);
  CHECK_THROWS_WITH_AS(parse_distribution("uniform(24 MPa/km, 20 MPa/km)", Dimension::pressure_gradient, "shmin"),
                       "field 'shmin' = 'uniform(24 MPa/km, 20 MPa/km)': expected min < max (for a single value write "
                       "the value alone)",
                       InputError);
  // (text, dimension, field, part of the message)
  const BadText cases[] = {
      // unknown names
      {"gamma(2, 3)", Dimension::dimensionless, "mu", "fixed, uniform, normal"},
      {"normal", Dimension::dimensionless, "mu", "in parentheses (did you mean 'normal'?)"},
      // missing or wrong units
      {"uniform(20, 24)", Dimension::pressure_gradient, "shmin_gradient",
       "field 'shmin_gradient' = 'uniform(20, 24)': expected for min ('20') a number with a pressure gradient unit"},
      {"lognormal(median=10, sigma_ln=0.8)", Dimension::permeability, "permeability", "the unit is missing"},
      {"10", Dimension::permeability, "permeability", "the unit is missing"},
      {"normal(10 psi, 1 psi)", Dimension::permeability, "permeability", "not a pressure unit"},
      // parameter checks
      {"normal(0.6, -0.05)", Dimension::dimensionless, "friction",
       "'normal(0.6, -0.05)': expected a positive standard deviation"},
      {"lognormal(median=0 mD, sigma_ln=0.8)", Dimension::permeability, "permeability", "expected a positive median"},
      {"lognormal(median=-3 mD, sigma_ln=0.8)", Dimension::permeability, "permeability", "expected a positive median"},
      {"triangular(min=0.5, mode=0.9, max=0.8)", Dimension::dimensionless, "mu", "min <= mode <= max"},
      // syntax
      {"normal(mean=0.6, sdev=0.05)", Dimension::dimensionless, "mu", "not 'sdev' (did you mean 'sd'?)"},
      {"normal(0.6, mean=0.5)", Dimension::dimensionless, "mu", "'mean' is given twice"},
      {"normal(mean=0.6, 0.05)", Dimension::dimensionless, "mu", "positional parameters before named ones"},
      {"normal(0.6, 0.05, 0.1)", Dimension::dimensionless, "mu", "at most 2 parameters"},
      {"normal(0.6)", Dimension::dimensionless, "mu", "a value for sd: normal(mean, sd)"},
      {"normal(0.6,)", Dimension::dimensionless, "mu", "a value between every pair of commas"},
      {"normal(0.6, 0.05", Dimension::dimensionless, "mu", "one pair of parentheses"},
      {"normal()", Dimension::dimensionless, "mu", "parameters: normal(mean, sd)"},
      {"lognormal(median=10 mD, p90=50 mD)", Dimension::permeability, "k", "not a mix"},
      {"truncnormal(mean=0.6, sd=0.1)", Dimension::dimensionless, "mu", "min or max"},
      {"", Dimension::dimensionless, "mu", "field 'mu' = '': expected a value with a unit or a distribution"},
  };
  for (const auto& c : cases) {
    CAPTURE(c.text);
    CHECK_THROWS_WITH_AS(parse_distribution(c.text, c.dimension, c.field), doctest::Contains(c.message), InputError);
  }
}
