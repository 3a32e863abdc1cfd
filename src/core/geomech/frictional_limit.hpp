#pragma once
// The frictional limit on the ratio of effective principal stresses.
//
// Source: (S1 − p)/(S3 − p) ≤ [√(μ² + 1) + μ]²      Jaeger & Cook (1979); Zoback (2007) ch. 4
//
// Symbol table (code -> literature):
//   mu        μ    coefficient of sliding friction (dimensionless)
//   s1, s3    S1, S3  greatest and least principal stress, Pa (compression positive)
//   p         p, Pp   pore pressure, Pa
//   ratio     (S1 − p)/(S3 − p)
//   limit     [√(μ²+1) + μ]²  (= 3.12 for μ = 0.6)

namespace slipscreen::geomech {

// Throws InputError("friction", ...) unless 0 < μ < ∞.
void check_friction(double mu);

// [√(μ²+1) + μ]²: the largest effective-stress ratio a population of cohesionless faults of
// every orientation with friction μ can sustain. Exact (rounding only); domain μ > 0.
double frictional_limit_ratio(double mu);

enum class LimitStatus {
  within,   // ratio below the limit: no optimally oriented fault is at failure
  at_limit, // ratio equals the limit within 1e-9 relative: optimally oriented faults are critical
  beyond,   // ratio above the limit: such a stress state cannot persist; it is reported, not used silently
};

struct FrictionalLimitCheck {
  double ratio;  // (S1 − p)/(S3 − p)
  double limit;  // [√(μ²+1) + μ]²
  LimitStatus status;
};

// Compares the effective-stress ratio with the frictional limit. Domain: s1 ≥ s3 > p, μ > 0
// (InputError otherwise: s3 ≤ p means the least stress is at or below pore pressure).
FrictionalLimitCheck check_frictional_limit(double s1, double s3, double p, double mu);

// "within", "at limit", "beyond".
const char* to_string(LimitStatus s);

}  // namespace slipscreen::geomech
