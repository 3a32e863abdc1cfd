#pragma once
// Probability distributions of uncertain inputs: small value types with a quantile function
// (inverse CDF), so that plain Monte Carlo and Latin hypercube sampling drive the same code
// through one uniform variate u in (0, 1): x = F⁻¹(u).
//
// Sources (one line beside each formula in distribution.cpp):
//   uniform, normal, lognormal: Johnson, Kotz & Balakrishnan (1994, 1995), Continuous
//     Univariate Distributions, 2nd ed., Wiley, vol. 1 ch. 13-14, vol. 2 ch. 26.
//   truncated normal by inversion: Johnson, Kotz & Balakrishnan (1994) vol. 1 ch. 13
//     (doubly truncated normal: density, mean and variance).
//   triangular: Kotz & van Dorp (2004), Beyond Beta, World Scientific, ch. 1.
//   Inverse CDFs are evaluated by Boost.Math (normal, lognormal, triangular distributions).
//
// Symbol table (code name -> symbol in the sources):
//   mean           μ      mean of the normal (before truncation)
//   sd             σ      standard deviation of the normal (before truncation)
//   min, max       a, b   lower and upper bound (uniform, truncated normal, triangular)
//   mode           c      mode of the triangular distribution
//   median         e^μ    median of the lognormal; mu_ln = ln(median) is the μ of ln X
//   sigma_ln       σ      standard deviation of ln X (lognormal shape)
//   u              u      uniform variate in (0, 1); quantile(u) = F⁻¹(u)
//   Φ, Φ⁻¹                standard normal CDF and its inverse
//
// Lognormal parameterisation (chosen for this project): median and σ of ln X. The median is
// the value users quote for permeability ("10 mD"), σ_ln is the spread in natural-log units.
// The alternative P10/P90 form is converted exactly: median = √(P10·P90),
// σ_ln = ln(P90/P10) / (2 Φ⁻¹(0.9)).
//
// Values are in SI (the text syntax in distribution_text.hpp converts units). Every
// constructor validates its parameters and throws InputError(field, canonical text, expected).
#include <string>
#include <string_view>

namespace slipscreen::stats {

enum class DistributionKind { fixed, uniform, normal, truncated_normal, lognormal, triangular };

// The name used in the text syntax: "fixed", "uniform", "normal", "truncnormal", "lognormal",
// "triangular".
std::string_view distribution_name(DistributionKind kind);

class Distribution {
 public:
  // A single value (no uncertainty). Any finite value.
  static Distribution fixed(double value, std::string_view field = "distribution");
  // Uniform on [min, max]; requires finite min < max.
  static Distribution uniform(double min, double max, std::string_view field = "distribution");
  // Normal N(mean, sd²); requires sd > 0.
  static Distribution normal(double mean, double sd, std::string_view field = "distribution");
  // Normal N(mean, sd²) restricted to [min, max]; either bound may be infinite but not both;
  // requires sd > 0, min < max and at least 1e-100 of the normal's probability inside.
  static Distribution truncated_normal(double mean, double sd, double min, double max,
                                       std::string_view field = "distribution");
  // Lognormal: ln X ~ N(ln median, sigma_ln²); requires median > 0 and sigma_ln > 0.
  static Distribution lognormal(double median, double sigma_ln, std::string_view field = "distribution");
  // Lognormal from its 10th and 90th percentiles; requires 0 < p10 < p90.
  static Distribution lognormal_p10_p90(double p10, double p90, std::string_view field = "distribution");
  // Triangular on [min, max] with mode; requires min < max and min ≤ mode ≤ max.
  static Distribution triangular(double min, double mode, double max,
                                 std::string_view field = "distribution");

  DistributionKind kind() const noexcept { return kind_; }
  bool is_fixed() const noexcept { return kind_ == DistributionKind::fixed; }

  // Inverse CDF x = F⁻¹(u) for u in the open interval (0, 1); throws InputError otherwise.
  // Accuracy: that of Boost.Math's inverse CDFs (a few ulp in x for the normal, lognormal and
  // triangular; uniform is exact to rounding). Truncated normal: the tail on the side of the
  // interval's centre is inverted through the complementary CDF, so the relative accuracy is
  // about 1e-14 in x whenever the interval holds ≥ 1e-100 of the probability; results are
  // clamped into [min, max].
  double quantile(double u) const;

  // CDF F(x) (for tests and diagnostics), same accuracy as quantile.
  double cdf(double x) const;

  // Mean and standard deviation of the distribution (analytic; for the truncated normal the
  // Johnson-Kotz-Balakrishnan formulas, relative accuracy ~1e-12 while the interval holds
  // ≥ 1e-10 of the probability). A fixed value has sd 0.
  double mean() const;
  double standard_deviation() const;

  // Support [lower, upper] (±infinity for unbounded tails).
  double lower() const;
  double upper() const;

  // Parameters as given (SI). Meaning by kind:
  //   fixed: a = value; uniform: a = min, b = max; normal: a = mean, b = sd;
  //   truncated_normal: a = mean, b = sd, c = min, d = max;
  //   lognormal: a = median, b = sigma_ln; triangular: a = min, b = mode, c = max.
  double a() const noexcept { return a_; }
  double b() const noexcept { return b_; }
  double c() const noexcept { return c_; }
  double d() const noexcept { return d_; }

  bool operator==(const Distribution& other) const = default;

 private:
  Distribution(DistributionKind kind, double a, double b, double c, double d)
      : kind_(kind), a_(a), b_(b), c_(c), d_(d) {}
  void prepare_truncation(std::string_view field);

  DistributionKind kind_ = DistributionKind::fixed;
  double a_ = 0.0, b_ = 0.0, c_ = 0.0, d_ = 0.0;
  // Truncated normal: the bounds' probabilities, on the lower tail (Φ) or, when the interval
  // lies mostly above the mean, on the upper tail (1 − Φ) for accuracy.
  bool upper_tail_ = false;
  double p_lo_ = 0.0, p_hi_ = 0.0;
};

}  // namespace slipscreen::stats
