#pragma once
// The critical rate factor of a group of wells: the smallest factor f ≥ 0 on the group's rates
// at which a fault segment slips by a horizon T, for one realization.
//
// Source: linearity of the pore-pressure change in the well rates (Theis 1935 superposition;
// docs and BRIEF 2.6, "decisions by linearity"): with the group's rates multiplied by f,
//   Δp(t; f) = Δp_rest(t) + f·Δp_G(t),
// and the segment has slipped by T iff max over tracking times t ≤ T of Δp(t; f) ≥ Δp_crit
// (the Coulomb criterion through Δp_crit, slip_tracker.hpp). Solving each time's inequality for f:
//   f_crit = min over t ≤ T with Δp_G(t) > 0 of (Δp_crit − Δp_rest(t)) / Δp_G(t),
// 0 if the rest alone reaches Δp_crit at some t ≤ T, +∞ if no f does. The segment slips at f
// iff f ≥ f_crit (times with Δp_G(t) ≤ 0 can only help at f = 0, which the first case covers),
// so P(slip by T | f) is the share of realizations with f_crit ≤ f, for every f at once.
//
// Symbol table (code name -> symbol):
//   dp_rest[k]   Δp_rest(t_k)  Pa, the wells outside the group, at tracking time t_k ≤ T
//   dp_group[k]  Δp_G(t_k)     Pa, the group at its planned rates (f = 1)
//   dp_crit      Δp_crit       Pa, the realization's pressure increase to failure
//   return       f_crit        dimensionless factor on the group's rates
//
// Accuracy: one division per time (correctly rounded), so f_crit is within 1 ulp of the exact
// quotient at the time that binds. Domain: finite dp_rest, dp_group; dp_crit finite or +∞.
// A segment already critical before injection (Δp_crit ≤ 0) gives 0 when any dp_rest ≥ Δp_crit
// (Δp_rest = 0 before injection does); the probabilistic screen counts those realizations apart.
#include <span>

namespace slipscreen::probabilistic {

// f_crit as above over the tracking times given (the caller passes t_k ≤ T only). The spans
// must have the same length (InputError otherwise), and NaN anywhere is refused (InputError).
double critical_factor(std::span<const double> dp_rest, std::span<const double> dp_group, double dp_crit);

}  // namespace slipscreen::probabilistic
