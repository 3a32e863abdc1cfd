#include "core/stats/two_proportion.hpp"

#include <cmath>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::stats {
namespace {

void check(const char* field, double p, std::uint64_t n) {
  if (!(p >= 0.0 && p <= 1.0)) throw InputError(field, std::to_string(p), "a probability in [0, 1]");
  if (n == 0) throw InputError("realizations", "0", "at least one realization");
}

}  // namespace

TwoProportionTest two_proportion_test(double p_old, std::uint64_t n_old, double p_new, std::uint64_t n_new,
                                      double z_crit) {
  check("p_old", p_old, n_old);
  check("p_new", p_new, n_new);
  if (!(z_crit > 0.0) || !std::isfinite(z_crit))
    throw InputError("z_crit", std::to_string(z_crit), "a positive normal quantile");
  const double n1 = static_cast<double>(n_old);
  const double n2 = static_cast<double>(n_new);
  TwoProportionTest t;
  t.change = p_new - p_old;
  // Fleiss, Levin & Paik (2003), ch. 3: p̄ = (n1 p1 + n2 p2)/(n1 + n2), SE = √(p̄(1 − p̄)(1/n1 + 1/n2)).
  t.pooled = (n1 * p_old + n2 * p_new) / (n1 + n2);
  const double variance = t.pooled * (1.0 - t.pooled) * (1.0 / n1 + 1.0 / n2);
  if (!(variance > 0.0)) return t;  // p̄ = 0 or 1: both estimates are 0 (or 1), z = 0
  t.z = t.change / std::sqrt(variance);
  t.exceeds_noise = std::fabs(t.z) > z_crit;
  return t;
}

}  // namespace slipscreen::stats
