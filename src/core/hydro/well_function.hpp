#pragma once
// Exponential integral E1(u), the hydrogeologists' well function W(u).
//
// Source: E1(u) = ∫_u^∞ e^(−s)/s ds (Abramowitz & Stegun 1964, eq. 5.1.1); W(u) ≡ E1(u) in the
// Theis (1935) solution.
//
// Symbols: u -> u (dimensionless argument, u = r²/(4 D t) in Theis), well_function -> E1 = W.
//
// Accuracy (both forms): relative error ≤ 2e-15 against Boost.Math expint(1, u) over
// 1e-300 ≤ u ≤ 700 (the tests check 1e-13 over 1e-12 ≤ u ≤ 700 and report the observed maximum;
// measured ≈ 1e-15 at worst, just below u = 1, scalar and batched). The batched form may use FMA where the CPU has it, so it
// can differ from the scalar form in the last bits, always within the stated accuracy.
//
// Domain and end behaviour:
//   u = 0                 -> +infinity (E1 has a logarithmic singularity, E1 ≈ −γ − ln u);
//   0 < u (incl. subnormal u) -> E1(u), accurate as above;
//   u > kWellFunctionUnderflow (≈ 701.84, where E1 drops below the smallest normal double)
//                         -> exactly 0 (flushed: no subnormal results, no NaN), also for u = +inf;
//   u < 0 or NaN          -> NaN (E1 of a negative argument is not a real-valued well function).
#include <cstddef>
#include <span>

namespace slipscreen::hydro {

// Above this argument E1(u) < 2^-1022 (smallest normal double) and the well function returns 0.
inline constexpr double kWellFunctionUnderflow = 701.84128944637666;

// E1(u) for one argument.
double well_function(double u);

// E1(u[i]) for i < n into out[i] (the hot path: vectorised, AVX2+FMA picked at run time when the
// CPU has it). `u` and `out` may be the same array; otherwise they must not overlap.
void well_function(const double* u, double* out, std::size_t n);

// The instruction-set builds of the batched form (chosen automatically by well_function); named
// here so the tests can check every build the machine can run against the same reference.
enum class WellFunctionBuild { portable, avx2_fma, avx512 };
bool well_function_build_available(WellFunctionBuild build);
// Throws RefusedError (core/errors.hpp) when the CPU cannot run `build`.
void well_function_with(WellFunctionBuild build, const double* u, double* out, std::size_t n);

inline void well_function(std::span<const double> u, std::span<double> out) {
  well_function(u.data(), out.data(), u.size() < out.size() ? u.size() : out.size());
}

}  // namespace slipscreen::hydro
