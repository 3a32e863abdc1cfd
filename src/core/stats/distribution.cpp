#include "core/stats/distribution.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <limits>

#include <boost/math/distributions/lognormal.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/triangular.hpp>
#include <boost/math/distributions/uniform.hpp>

#include "core/errors.hpp"

namespace slipscreen::stats {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
// Smallest probability a truncation interval may hold (keeps u·mass far from underflow).
constexpr double kMinTruncatedMass = 1e-100;

const boost::math::normal_distribution<double> kStdNormal(0.0, 1.0);

std::string num(double v) {
  char buf[32];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

std::string params(std::initializer_list<std::pair<const char*, double>> list) {
  std::string s;
  for (const auto& [k, v] : list) s += (s.empty() ? "" : ", ") + std::string(k) + "=" + num(v);
  return s;
}

void require_finite(double v, const char* name, std::string_view field) {
  if (!std::isfinite(v))
    throw InputError(std::string(field), std::string(name) + "=" + num(v), std::string("a finite ") + name);
}

// Standard normal density φ(z), 0 at ±infinity.
double phi(double z) { return std::isinf(z) ? 0.0 : boost::math::pdf(kStdNormal, z); }
// z·φ(z), 0 at ±infinity.
double z_phi(double z) { return std::isinf(z) ? 0.0 : z * boost::math::pdf(kStdNormal, z); }
double Phi(double z) {
  if (std::isinf(z)) return z < 0 ? 0.0 : 1.0;
  return boost::math::cdf(kStdNormal, z);
}
double Phi_upper(double z) {  // 1 − Φ(z), accurate in the upper tail
  if (std::isinf(z)) return z < 0 ? 1.0 : 0.0;
  return boost::math::cdf(boost::math::complement(kStdNormal, z));
}

}  // namespace

std::string_view distribution_name(DistributionKind kind) {
  switch (kind) {
    case DistributionKind::fixed: return "fixed";
    case DistributionKind::uniform: return "uniform";
    case DistributionKind::normal: return "normal";
    case DistributionKind::truncated_normal: return "truncnormal";
    case DistributionKind::lognormal: return "lognormal";
    case DistributionKind::triangular: return "triangular";
  }
  return "unknown";
}

Distribution Distribution::fixed(double value, std::string_view field) {
  require_finite(value, "value", field);
  return Distribution(DistributionKind::fixed, value, 0.0, 0.0, 0.0);
}

Distribution Distribution::uniform(double min, double max, std::string_view field) {
  require_finite(min, "min", field);
  require_finite(max, "max", field);
  if (!(min < max))
    throw InputError(std::string(field), "uniform(" + params({{"min", min}, {"max", max}}) + ")",
                     "min < max (for a single value write the value alone)");
  return Distribution(DistributionKind::uniform, min, max, 0.0, 0.0);
}

Distribution Distribution::normal(double mean, double sd, std::string_view field) {
  require_finite(mean, "mean", field);
  require_finite(sd, "sd", field);
  if (!(sd > 0.0))
    throw InputError(std::string(field), "normal(" + params({{"mean", mean}, {"sd", sd}}) + ")",
                     "a positive standard deviation sd (for a single value write the value alone)");
  return Distribution(DistributionKind::normal, mean, sd, 0.0, 0.0);
}

Distribution Distribution::truncated_normal(double mean, double sd, double min, double max,
                                            std::string_view field) {
  require_finite(mean, "mean", field);
  require_finite(sd, "sd", field);
  const std::string text = "truncnormal(" + params({{"mean", mean}, {"sd", sd}, {"min", min}, {"max", max}}) + ")";
  if (std::isnan(min) || std::isnan(max) || min == kInf || max == -kInf)
    throw InputError(std::string(field), text, "bounds min and max that are numbers");
  if (!(sd > 0.0)) throw InputError(std::string(field), text, "a positive standard deviation sd");
  if (std::isinf(min) && std::isinf(max))
    throw InputError(std::string(field), text, "at least one finite bound, min or max (or use normal)");
  if (!(min < max)) throw InputError(std::string(field), text, "min < max");
  Distribution d(DistributionKind::truncated_normal, mean, sd, min, max);
  d.prepare_truncation(field);
  return d;
}

void Distribution::prepare_truncation(std::string_view field) {
  const double alpha = (c_ - a_) / b_;
  const double beta = (d_ - a_) / b_;
  // Work on the tail that holds the interval's centre: there the probabilities are small
  // numbers stored to full relative precision, not 1 − small.
  upper_tail_ = std::isinf(beta) ? true : std::isinf(alpha) ? false : (alpha + beta > 0.0);
  if (upper_tail_) {
    p_lo_ = Phi_upper(alpha);  // ≥ p_hi_
    p_hi_ = Phi_upper(beta);
  } else {
    p_lo_ = Phi(alpha);
    p_hi_ = Phi(beta);
  }
  const double mass = std::abs(p_lo_ - p_hi_);
  if (!(mass >= kMinTruncatedMass))
    throw InputError(std::string(field),
                     "truncnormal(" + params({{"mean", a_}, {"sd", b_}, {"min", c_}, {"max", d_}}) + ")",
                     "bounds that hold some of the normal's probability (the interval lies more "
                     "than about 21 sd from the mean)");
}

Distribution Distribution::lognormal(double median, double sigma_ln, std::string_view field) {
  require_finite(median, "median", field);
  require_finite(sigma_ln, "sigma_ln", field);
  const std::string text = "lognormal(" + params({{"median", median}, {"sigma_ln", sigma_ln}}) + ")";
  if (!(median > 0.0)) throw InputError(std::string(field), text, "a positive median");
  if (!(sigma_ln > 0.0))
    throw InputError(std::string(field), text, "a positive sigma_ln (standard deviation of ln X)");
  return Distribution(DistributionKind::lognormal, median, sigma_ln, 0.0, 0.0);
}

Distribution Distribution::lognormal_p10_p90(double p10, double p90, std::string_view field) {
  require_finite(p10, "p10", field);
  require_finite(p90, "p90", field);
  if (!(p10 > 0.0 && p10 < p90))
    throw InputError(std::string(field), "lognormal(" + params({{"p10", p10}, {"p90", p90}}) + ")",
                     "0 < p10 < p90");
  // ln P10 = ln m − z σ, ln P90 = ln m + z σ with z = Φ⁻¹(0.9) (JKB 1994 ch. 14: ln X normal).
  const double z90 = boost::math::quantile(kStdNormal, 0.9);
  const double median = std::sqrt(p10) * std::sqrt(p90);
  const double sigma_ln = (std::log(p90) - std::log(p10)) / (2.0 * z90);
  return lognormal(median, sigma_ln, field);
}

Distribution Distribution::triangular(double min, double mode, double max, std::string_view field) {
  require_finite(min, "min", field);
  require_finite(mode, "mode", field);
  require_finite(max, "max", field);
  const std::string text = "triangular(" + params({{"min", min}, {"mode", mode}, {"max", max}}) + ")";
  if (!(min < max)) throw InputError(std::string(field), text, "min < max");
  if (!(min <= mode && mode <= max)) throw InputError(std::string(field), text, "min <= mode <= max");
  return Distribution(DistributionKind::triangular, min, mode, max, 0.0);
}

double Distribution::quantile(double u) const {
  if (!(u > 0.0 && u < 1.0))
    throw InputError("uniform variate", num(u), "a number in the open interval (0, 1)");
  switch (kind_) {
    case DistributionKind::fixed:
      return a_;
    case DistributionKind::uniform:
      // F⁻¹(u) = a + u (b − a) (JKB 1995 ch. 26).
      return std::min(b_, a_ + u * (b_ - a_));
    case DistributionKind::normal:
      // F⁻¹(u) = μ + σ Φ⁻¹(u) (JKB 1994 ch. 13), Φ⁻¹ by Boost.Math.
      return boost::math::quantile(boost::math::normal_distribution<double>(a_, b_), u);
    case DistributionKind::truncated_normal: {
      // F⁻¹(u) = μ + σ Φ⁻¹(Φ(α) + u (Φ(β) − Φ(α))), α = (a−μ)/σ, β = (b−μ)/σ (JKB 1994 ch. 13,
      // by inversion); on the upper tail with Q = 1 − Φ: Q⁻¹(Q(α) − u (Q(α) − Q(β))).
      // Interpolate from the nearer end (1 − u is exact for u ≥ 1/2), so that a small p near
      // either bound keeps its relative precision.
      const double p = u <= 0.5 ? p_lo_ + u * (p_hi_ - p_lo_) : p_hi_ - (1.0 - u) * (p_hi_ - p_lo_);
      double z;
      if (upper_tail_)
        z = boost::math::quantile(boost::math::complement(kStdNormal, std::clamp(p, 1e-300, 1.0 - 1e-16)));
      else
        z = boost::math::quantile(kStdNormal, std::clamp(p, 1e-300, 1.0 - 1e-16));
      return std::clamp(a_ + b_ * z, c_, d_);
    }
    case DistributionKind::lognormal:
      // F⁻¹(u) = exp(ln m + σ_ln Φ⁻¹(u)) (JKB 1994 ch. 14), by Boost.Math.
      return boost::math::quantile(boost::math::lognormal_distribution<double>(std::log(a_), b_), u);
    case DistributionKind::triangular:
      // F⁻¹(u) = a + √(u (b−a)(c−a)) for u < (c−a)/(b−a), else b − √((1−u)(b−a)(b−c))
      // (Kotz & van Dorp 2004 ch. 1), by Boost.Math.
      return boost::math::quantile(boost::math::triangular_distribution<double>(a_, b_, c_), u);
  }
  return a_;
}

double Distribution::cdf(double x) const {
  if (std::isnan(x)) throw InputError("x", "nan", "a number");
  if (x <= lower()) return (kind_ == DistributionKind::fixed && x == a_) ? 1.0 : 0.0;
  if (x >= upper()) return 1.0;
  switch (kind_) {
    case DistributionKind::fixed:
      return x < a_ ? 0.0 : 1.0;
    case DistributionKind::uniform:
      return (x - a_) / (b_ - a_);
    case DistributionKind::normal:
      return boost::math::cdf(boost::math::normal_distribution<double>(a_, b_), x);
    case DistributionKind::truncated_normal: {
      const double z = (x - a_) / b_;
      const double p = upper_tail_ ? Phi_upper(z) : Phi(z);
      return (p - p_lo_) / (p_hi_ - p_lo_);
    }
    case DistributionKind::lognormal:
      return boost::math::cdf(boost::math::lognormal_distribution<double>(std::log(a_), b_), x);
    case DistributionKind::triangular:
      return boost::math::cdf(boost::math::triangular_distribution<double>(a_, b_, c_), x);
  }
  return 0.0;
}

double Distribution::mean() const {
  switch (kind_) {
    case DistributionKind::fixed: return a_;
    case DistributionKind::uniform: return 0.5 * (a_ + b_);
    case DistributionKind::normal: return a_;
    case DistributionKind::truncated_normal: {
      // E[X] = μ + σ (φ(α) − φ(β)) / Z, Z = Φ(β) − Φ(α) (JKB 1994 ch. 13).
      const double alpha = (c_ - a_) / b_, beta = (d_ - a_) / b_;
      const double mass = std::abs(p_hi_ - p_lo_);
      return a_ + b_ * (phi(alpha) - phi(beta)) / mass;
    }
    case DistributionKind::lognormal:
      // E[X] = m exp(σ²/2) (JKB 1994 ch. 14).
      return boost::math::mean(boost::math::lognormal_distribution<double>(std::log(a_), b_));
    case DistributionKind::triangular:
      return boost::math::mean(boost::math::triangular_distribution<double>(a_, b_, c_));
  }
  return a_;
}

double Distribution::standard_deviation() const {
  switch (kind_) {
    case DistributionKind::fixed: return 0.0;
    case DistributionKind::uniform:
      return boost::math::standard_deviation(boost::math::uniform_distribution<double>(a_, b_));
    case DistributionKind::normal: return b_;
    case DistributionKind::truncated_normal: {
      // Var X = σ² [1 + (αφ(α) − βφ(β))/Z − ((φ(α) − φ(β))/Z)²] (JKB 1994 ch. 13).
      const double alpha = (c_ - a_) / b_, beta = (d_ - a_) / b_;
      const double mass = std::abs(p_hi_ - p_lo_);
      const double m = (phi(alpha) - phi(beta)) / mass;
      const double v = 1.0 + (z_phi(alpha) - z_phi(beta)) / mass - m * m;
      return b_ * std::sqrt(std::max(v, 0.0));
    }
    case DistributionKind::lognormal:
      return boost::math::standard_deviation(boost::math::lognormal_distribution<double>(std::log(a_), b_));
    case DistributionKind::triangular:
      return boost::math::standard_deviation(boost::math::triangular_distribution<double>(a_, b_, c_));
  }
  return 0.0;
}

double Distribution::lower() const {
  switch (kind_) {
    case DistributionKind::fixed: return a_;
    case DistributionKind::uniform: return a_;
    case DistributionKind::normal: return -kInf;
    case DistributionKind::truncated_normal: return c_;
    case DistributionKind::lognormal: return 0.0;
    case DistributionKind::triangular: return a_;
  }
  return -kInf;
}

double Distribution::upper() const {
  switch (kind_) {
    case DistributionKind::fixed: return a_;
    case DistributionKind::uniform: return b_;
    case DistributionKind::normal: return kInf;
    case DistributionKind::truncated_normal: return d_;
    case DistributionKind::lognormal: return kInf;
    case DistributionKind::triangular: return c_;
  }
  return kInf;
}

}  // namespace slipscreen::stats
