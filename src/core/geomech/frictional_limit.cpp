#include "core/geomech/frictional_limit.hpp"

#include <cmath>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::geomech {

void check_friction(double mu) {
  if (!std::isfinite(mu) || mu <= 0.0)
    throw InputError("friction", std::to_string(mu), "a friction coefficient > 0 (typically 0.6 to 1.0)");
}

double frictional_limit_ratio(double mu) {
  check_friction(mu);
  const double r = std::sqrt(mu * mu + 1.0) + mu;  // Zoback (2007) ch. 4
  return r * r;
}

FrictionalLimitCheck check_frictional_limit(double s1, double s3, double p, double mu) {
  if (!(s3 > p))
    throw InputError("least principal stress", std::to_string(s3) + " Pa",
                     "a stress above the pore pressure (" + std::to_string(p) + " Pa)");
  if (!(s1 >= s3))
    throw InputError("greatest principal stress", std::to_string(s1) + " Pa",
                     "a stress >= the least principal stress (" + std::to_string(s3) + " Pa)");
  FrictionalLimitCheck c{(s1 - p) / (s3 - p), frictional_limit_ratio(mu), LimitStatus::within};
  const double tol = 1e-9 * c.limit;
  if (std::fabs(c.ratio - c.limit) <= tol) c.status = LimitStatus::at_limit;
  else if (c.ratio > c.limit) c.status = LimitStatus::beyond;
  return c;
}

const char* to_string(LimitStatus s) {
  switch (s) {
    case LimitStatus::within: return "within";
    case LimitStatus::at_limit: return "at limit";
    case LimitStatus::beyond: return "beyond";
  }
  return "?";
}

}  // namespace slipscreen::geomech
