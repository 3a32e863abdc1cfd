// Exponential integral E1(u) = W(u), evaluated branch-free so that loops over many arguments
// vectorise. Two pieces, coefficients fitted by tools/fit_e1.py (mpmath, 60 digits):
//
//   0 < u < 1:  E1(u) = −γ − ln u + u·S(u)            (Abramowitz & Stegun 1964, eq. 5.1.11)
//               S(u) = Σ_{k≥1} (−1)^(k+1) u^(k−1)/(k·k!), as a degree-11 Chebyshev-economised
//               polynomial (fit error 9.9e-19 absolute on [0, 1]).
//   u ≥ 1:      E1(u) = e^(−u)/u · g(u), g(u) = u e^u E1(u) ∈ (0.59, 1]  (A&S 1964, eq. 5.1.51
//               gives the same form as a bound); g = P(u)/Q(u), a degree-10/10 rational in 1/u
//               written with reversed coefficients as a rational in u (fit error 1.5e-17
//               relative on [1, ∞); all coefficients positive, so the evaluation is stable).
//
// ln and exp are the project's own (argument reduction by powers of two, Cody & Waite 1980
// two-constant reduction of x − n ln 2, economised atanh and exponential series), written with
// plain arithmetic and bit casts so the compiler vectorises them. Polynomials use Estrin's
// scheme (short dependency chains).
//
// Symbols: u -> u, kEulerGamma -> γ (Euler–Mascheroni), kSmall -> S(u), kLargeP/kLargeQ -> P, Q
// with g(u) = P(u)/Q(u).
//
// The kernel below is branch-free only if the compiler may evaluate both arms of each select
// without regard to floating-point traps (slipscreen never enables FP exceptions). Without this
// GCC keeps the branches and the batched loop does not vectorise.
#pragma GCC optimize("no-trapping-math")
#include "core/hydro/well_function.hpp"

#include <array>
#include <bit>
#include <cstdint>
#include <limits>

#include "core/errors.hpp"

namespace slipscreen::hydro {
namespace {

constexpr double kEulerGamma = 0.57721566490153286060651209008240243;
constexpr double kLn2Hi = 6.93147180369123816490e-01;  // high part of ln 2 (trailing bits zero)
constexpr double kLn2Lo = 1.90821492927058770002e-10;  // ln 2 − kLn2Hi
constexpr double kLog2e = 1.44269504088896338700e+00;

// S(u), highest degree first (tools/fit_e1.py, degree 11, fit error 9.9e-19 absolute).
constexpr double kSmall[] = {
    -1.1414417031142649973e-10, 2.1319070629865462768e-9,  -2.734600022984367809e-8,
    3.0599482362144029635e-7,   -3.1000753921024848565e-6, 2.8344619881522921277e-5,
    -2.314814673480262557e-4,   1.6666666641944307141e-3,  -1.0416666666411158915e-2,
    5.5555555555541897912e-2,   -2.4999999999999971382e-1, 9.9999999999999999901e-1,
};
// R(z) in ln m = 2s + s R(s²) (tools/fit_e1.py, degree 7 on [0, 0.0295], error 2.3e-18).
constexpr double kLogR[] = {
    1.4809710360655276698e-1, 1.5312528148364190966e-1, 1.8183631680229328804e-1,
    2.2222197056726046608e-1, 2.8571428760641679883e-1, 3.9999999999302338113e-1,
    6.6666666666667645658e-1, -2.2519348924382190901e-18,
};
// e^r for |r| ≤ ln(2)/2 (tools/fit_e1.py, degree 11, error 3.2e-18).
constexpr double kExp[] = {
    2.5110037605963777712e-8, 2.7632639639041029749e-7, 2.7557240918578969823e-6,
    2.4801485482328492419e-5, 1.9841269890047113707e-4, 1.3888888952314774652e-3,
    8.3333333333196006109e-3, 4.1666666666488095495e-2, 1.6666666666666680806e-1,
    5.0000000000000183855e-1, 9.9999999999999999976e-1, 9.9999999999999999693e-1,
};
// g(u) = P(u)/Q(u), highest power of u first (tools/fit_e1.py, degree 10/10).
constexpr double kLargeP[] = {
    9.9999999999999998805e-1, 4.0980541425898050623e+1, 6.4908038901005426619e+2,
    5.1354204572037701187e+3, 2.1946865649057117479e+4, 5.1309470696494789019e+4,
    6.3679814046204794105e+4, 3.8910247869563209781e+4, 1.0087240193998925721e+4,
    7.9739633083040973878e+2, 4.3841661365340015445,
};
constexpr double kLargeQ[] = {
    1.0,                      4.1980541425898008062e+1, 6.8906093043598003389e+2,
    5.7465203047809613307e+3, 2.6543147342444135e+4,    6.9606409942234406389e+4,
    1.0245925806571948954e+5, 8.100022066583042138e+4,  3.1498708069870388988e+4,
    5.0862888762481993233e+3, 2.2964731966688142624e+2,
};

// Polynomial with coefficients c (highest degree first) by Estrin's scheme: the same sum as
// Horner's rule with a dependency depth of log2(N) multiply-adds instead of N, which keeps the
// vector units busy. Expanded at compile time (no loops, no branches).
template <std::size_t N>
constexpr std::array<double, N> lowest_first(const double (&c)[N]) {
  std::array<double, N> a{};
  for (std::size_t k = 0; k < N; ++k) a[k] = c[N - 1 - k];
  return a;
}

// Σ_{k<N} a[I+k] x^k with pw[j] = x^(2^j).
template <std::size_t I, std::size_t N, std::size_t M>
[[gnu::always_inline]] inline double estrin(const std::array<double, M>& a, const double* pw) {
  if constexpr (N == 1) {
    return a[I];
  } else {
    constexpr std::size_t h = std::bit_floor(N - 1);
    constexpr int j = std::countr_zero(h);
    return estrin<I, h, M>(a, pw) + pw[j] * estrin<I + h, N - h, M>(a, pw);
  }
}

template <std::size_t M>
[[gnu::always_inline]] inline double poly(const std::array<double, M>& a, double x) {
  double pw[4] = {x, x * x, 0.0, 0.0};
  pw[2] = pw[1] * pw[1];
  pw[3] = pw[2] * pw[2];
  static_assert(M <= 16);
  return estrin<0, M, M>(a, pw);
}

constexpr auto kSmallLo = lowest_first(kSmall);
constexpr auto kLargePLo = lowest_first(kLargeP);
constexpr auto kLargeQLo = lowest_first(kLargeQ);
constexpr auto kLogRLo = lowest_first(kLogR);
constexpr auto kExpLo = lowest_first(kExp);

// ln x for normal x, in two steps so the kernel can share one division: x = 2^e m with
// m in [sqrt(1/2), sqrt(2)), f = m − 1; then ln x = e ln 2 + 2 atanh(s), s = f / (2 + f).
// Relative error ≈ 1 ulp away from x = 1, absolute error ≈ 1e-16 near it.
struct LogReduced {
  double e;  // exponent
  double f;  // m − 1, |f| ≤ 0.415
};

[[gnu::always_inline]] inline LogReduced log_reduce(double x) {
  // Adding (bits of 1) − (bits of √(1/2)) to the bits of x moves the exponent boundary from
  // mantissa 1 to √2: the exponent field of t is e + 1023 with x = 2^e m, m in [√(1/2), √2),
  // without compares or selects.
  constexpr std::uint64_t kSqrtHalfBits = 0x3fe6a09e667f3bcdULL;  // bits of √(1/2)
  const std::uint64_t bits = std::bit_cast<std::uint64_t>(x);
  const std::uint64_t t = bits + (0x3ff0000000000000ULL - kSqrtHalfBits);
  // exponent as a double without an int->double conversion (not in AVX2): 2^52 + field − 2^52
  const double e = std::bit_cast<double>(0x4330000000000000ULL | (t >> 52)) - (0x1p52 + 1023.0);
  const double m = std::bit_cast<double>((t & 0x000fffffffffffffULL) + kSqrtHalfBits);
  return {e, m - 1.0};  // m − 1 is exact (Sterbenz)
}

// s = f / (2 + f) from log_reduce.
[[gnu::always_inline]] inline double log_finish(double e, double s) {
  const double z = s * s;
  // ln m = 2 atanh s = 2s + s R(s²), |s| ≤ 0.1716: the series of ln((1+s)/(1−s))
  // (A&S 1964, ch. 4), economised.
  const double lnm = 2.0 * s + s * poly(kLogRLo, z);
  return e * kLn2Hi + (lnm + e * kLn2Lo);
}

// e^(−x) for x in [0, 708]. Relative error ≈ 1 ulp.
[[gnu::always_inline]] inline double exp_neg(double x) {
  const double y = -x;
  const double shifter = 0x1.8p52;
  const double t = y * kLog2e + shifter;  // round(y / ln 2) in the low mantissa bits
  const double n = t - shifter;
  const double r = (y - n * kLn2Hi) - n * kLn2Lo;  // |r| ≤ ln2/2
  const double p = poly(kExpLo, r);  // e^r, economised (fit error 3.2e-18)
  const std::int64_t ni = std::bit_cast<std::int64_t>(t) - std::bit_cast<std::int64_t>(shifter);
  const double scale = std::bit_cast<double>(static_cast<std::uint64_t>(ni + 1023) << 52);
  return p * scale;
}

// The two pieces, each branch-free over its whole input range so that loops over them
// vectorise. small_piece: u < 1, including 0 (+inf), subnormal u and u < 0 (NaN).
[[gnu::always_inline]] inline double small_piece(double u) {
  // −γ − ln u + u S(u); arguments below 2^-1000 (and subnormals) are scaled by 2^200 before ln
  const bool tiny = u < 0x1p-1000;
  const LogReduced lr = log_reduce(u * (tiny ? 0x1p200 : 1.0));  // u ≤ 0 gives a finite dummy
  const double lnu = log_finish(lr.e, lr.f / (2.0 + lr.f)) - (tiny ? 200.0 * kLn2Hi + 200.0 * kLn2Lo : 0.0);
  double w = (-kEulerGamma - lnu) + u * poly(kSmallLo, u);
  w = u == 0.0 ? std::numeric_limits<double>::infinity() : w;
  w = u < 0.0 ? std::numeric_limits<double>::quiet_NaN() : w;
  return w;
}

// large_piece: u ≥ 1, including u above the underflow point and +inf (0) and NaN (NaN).
[[gnu::always_inline]] inline double large_piece(double u) {
  // e^(−u) P(u) / (u Q(u)), evaluated on u clamped to 705 (beyond it the result is flushed)
  const double uc = u < 705.0 ? u : 705.0;
  double w = exp_neg(uc) * (poly(kLargePLo, uc) / (uc * poly(kLargeQLo, uc)));
  w = u > kWellFunctionUnderflow ? 0.0 : w;
  w = u != u ? std::numeric_limits<double>::quiet_NaN() : w;
  return w;
}

// Both pieces at once for a vector of mixed arguments: each is computed on clamped arguments
// and one is selected per lane; a single division serves both.
template <bool kRegular>
[[gnu::always_inline]] inline double both_pieces(double u) {
  // kRegular: the caller guarantees 2^-1000 ≤ u ≤ kWellFunctionUnderflow (no special values)
  const bool is_small = u < 1.0;
  // small piece on us in (0, 1]: −γ − ln u + u S(u)
  const double us = is_small ? u : 1.0;
  const bool subnormal = !kRegular && us < 0x1p-1000;  // scale tiny and subnormal u before ln
  const double uscaled = kRegular ? us : us * (subnormal ? 0x1p200 : 1.0);  // 0 -> finite dummy
  const LogReduced lr = log_reduce(uscaled);
  const double series = us * poly(kSmallLo, us);
  // large piece on ul in [1, 705]: e^(−u) P(u) / (u Q(u))
  const double ul0 = u > 1.0 ? u : 1.0;
  const double ul = kRegular ? ul0 : (ul0 < 705.0 ? ul0 : 705.0);
  const double pl = poly(kLargePLo, ul);
  const double ql = ul * poly(kLargeQLo, ul);
  const double ex = exp_neg(ul);
  // One division serves whichever piece the lane needs: f/(2+f) for ln, or P/(uQ).
  const double ratio = (is_small ? lr.f : pl) / (is_small ? 2.0 + lr.f : ql);
  double lnu = log_finish(lr.e, ratio);
  if constexpr (!kRegular) lnu -= subnormal ? 200.0 * kLn2Hi + 200.0 * kLn2Lo : 0.0;
  const double small = (-kEulerGamma - lnu) + series;
  const double large = ex * ratio;
  double w = is_small ? small : large;
  if constexpr (!kRegular) {
    w = u > kWellFunctionUnderflow ? 0.0 : w;
    w = u == 0.0 ? std::numeric_limits<double>::infinity() : w;
    w = ((u < 0.0) | (u != u)) ? std::numeric_limits<double>::quiet_NaN() : w;
  }
  return w;
}

}  // namespace

double well_function(double u) { return u < 1.0 ? small_piece(u) : large_piece(u); }

// The batched form works on blocks: a block whose arguments all fall in one piece (the usual
// case: arguments along a time series or across a grid change smoothly) costs only that piece;
// a mixed block evaluates both pieces per lane and selects. (Compacting mixed blocks into the two
// pieces was measured slower: the scalar bookkeeping costs more than the piece it saves.)
#define SLIPSCREEN_E1_BLOCKED                                                              \
  constexpr std::size_t kBlock = 128;                                                      \
  for (std::size_t b0 = 0; b0 < n; b0 += kBlock) {                                         \
    const std::size_t m = n - b0 < kBlock ? n - b0 : kBlock;                               \
    const double* ub = u + b0;                                                             \
    double* ob = out + b0;                                                                 \
    std::size_t ns = 0, nr = 0;                                                            \
    _Pragma("omp simd reduction(+ : ns, nr)") for (std::size_t i = 0; i < m; ++i) {        \
      ns += ub[i] < 1.0;                                                                   \
      nr += (ub[i] >= 0x1p-1000) & (ub[i] <= kWellFunctionUnderflow);                      \
    }                                                                                      \
    if (ns == m) {                                                                         \
      _Pragma("omp simd") for (std::size_t i = 0; i < m; ++i) ob[i] = small_piece(ub[i]);  \
    } else if (ns == 0) {                                                                  \
      _Pragma("omp simd") for (std::size_t i = 0; i < m; ++i) ob[i] = large_piece(ub[i]);  \
    } else if (nr == m) {                                                                  \
      _Pragma("omp simd") for (std::size_t i = 0; i < m; ++i) ob[i] = both_pieces<true>(ub[i]); \
    } else {                                                                               \
      _Pragma("omp simd") for (std::size_t i = 0; i < m; ++i) ob[i] = both_pieces<false>(ub[i]); \
    }                                                                                      \
  }

// Runtime dispatch: the same code built for AVX-512, for AVX2+FMA and for portable x86-64 (SSE2);
// the widest one the CPU supports is chosen once.
__attribute__((target("avx512f,avx512dq,avx512vl,avx2,fma"))) static void well_function_avx512(
    const double* u, double* out, std::size_t n) {
  SLIPSCREEN_E1_BLOCKED
}

__attribute__((target("avx2,fma"))) static void well_function_avx2(const double* u, double* out,
                                                                    std::size_t n) {
  SLIPSCREEN_E1_BLOCKED
}

static void well_function_portable(const double* u, double* out, std::size_t n) {
  SLIPSCREEN_E1_BLOCKED
}

namespace {
using BatchFn = void (*)(const double*, double*, std::size_t);
BatchFn pick_batch() {
  __builtin_cpu_init();
  if (__builtin_cpu_supports("avx512f") && __builtin_cpu_supports("avx512dq") &&
      __builtin_cpu_supports("avx512vl"))
    return &well_function_avx512;
  if (__builtin_cpu_supports("avx2") && __builtin_cpu_supports("fma")) return &well_function_avx2;
  return &well_function_portable;
}
}  // namespace

void well_function(const double* u, double* out, std::size_t n) {
  static const BatchFn batch = pick_batch();
  batch(u, out, n);
}

bool well_function_build_available(WellFunctionBuild build) {
  __builtin_cpu_init();
  switch (build) {
    case WellFunctionBuild::portable: return true;
    case WellFunctionBuild::avx2_fma:
      return __builtin_cpu_supports("avx2") && __builtin_cpu_supports("fma");
    case WellFunctionBuild::avx512:
      return __builtin_cpu_supports("avx512f") && __builtin_cpu_supports("avx512dq") &&
             __builtin_cpu_supports("avx512vl");
  }
  return false;
}

void well_function_with(WellFunctionBuild build, const double* u, double* out, std::size_t n) {
  if (!well_function_build_available(build))
    throw RefusedError("well function: this CPU cannot run the requested instruction-set build");
  switch (build) {
    case WellFunctionBuild::portable: well_function_portable(u, out, n); return;
    case WellFunctionBuild::avx2_fma: well_function_avx2(u, out, n); return;
    case WellFunctionBuild::avx512: well_function_avx512(u, out, n); return;
  }
}

}  // namespace slipscreen::hydro
