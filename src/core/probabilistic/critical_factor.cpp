#include "core/probabilistic/critical_factor.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::probabilistic {

double critical_factor(std::span<const double> dp_rest, std::span<const double> dp_group, double dp_crit) {
  if (dp_rest.size() != dp_group.size())
    throw InputError("group pressure series", std::to_string(dp_group.size()) + " times",
                     std::to_string(dp_rest.size()) + " times, as the rest's series");
  if (std::isnan(dp_crit)) throw InputError("dp_crit", "NaN", "a pressure in Pa or +infinity");
  double f = std::numeric_limits<double>::infinity();
  for (std::size_t k = 0; k < dp_rest.size(); ++k) {
    const double r = dp_rest[k], g = dp_group[k];
    if (std::isnan(r) || std::isnan(g)) throw InputError("pressure series", "NaN", "finite pressures in Pa");
    if (r >= dp_crit) return 0.0;  // the rest alone crosses: slips at every f ≥ 0
    if (g > 0.0) f = std::min(f, (dp_crit - r) / g);
  }
  return f;
}

}  // namespace slipscreen::probabilistic
