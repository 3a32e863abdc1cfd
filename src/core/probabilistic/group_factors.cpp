// The critical factors of a group of wells; see group_factors.hpp.
#include "core/probabilistic/group_factors.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <span>
#include <string>

#include "core/errors.hpp"
#include "core/probabilistic/chunk_bounds.hpp"
#include "core/probabilistic/critical_factor.hpp"
#include "core/util/parallel_errors.hpp"

namespace slipscreen::probabilistic {
namespace {
constexpr std::size_t kBlock = 256;  // realizations per matrix product
constexpr Eigen::Index kChunk = 24;  // tracking times per chunk of the first-crossing search
constexpr double kInf = std::numeric_limits<double>::infinity();


// The two models with their split bases, for the bounds (chunk_bounds.hpp).
struct Pair {
  const PressureModel& base;
  const PressureModel& part;
  Eigen::MatrixXd parts_base, parts_part;
  Pair(const PressureModel& b, const PressureModel& p)
      : base(b), part(p), parts_base(split_basis(b.draws.basis)), parts_part(split_basis(p.draws.basis)) {}
};

// f_crit of every realization of segment s, chunk by chunk of kChunk tracking times: a chunk is
// evaluated for a realization only where B_base + max(1, f − 1)·B_part over the chunk reaches
// Δp_crit, f the smaller of the smallest factor found so far for it and the cutoff C: no time in
// that chunk can give a factor at or below f. C = min(f_max, max(floor, the k-th smallest factor
// found so far over the realizations)); the factors found are upper bounds of the true ones, so
// C never falls below the true k-th smallest and only shrinks as the search goes on. Every
// realization whose f_crit is at or below the final C is then found exactly, the others are
// reported as +∞, and the curve is exact up to C (group_factors.hpp).
SlipFactorCurve segment_curve(const Pair& m, const Eigen::MatrixXf& dp_crit, std::size_t s, Eigen::Index rows, double f_max,
                              std::uint64_t k, double floor) {
  const Eigen::Index n = dp_crit.cols();
  const auto& pts = m.base.segment_points[s];
  const auto crit_of = [&](Eigen::Index r) { return double(dp_crit(static_cast<Eigen::Index>(s), r)); };
  // Whether Δp(t; f) = Δp_screen(t) + (f − 1)·Δp_part(t) can reach Δp_crit where the screen's Δp is
  // at most ub and the part's between lp and up (chunk_bounds.hpp): a factor φ(t) ≤ f at some t
  // means exactly that (critical_factor.hpp).
  const auto can_reach = [](double ub, double up, double lp, double f, double crit) {
    const double c = f - 1.0;
    return ub + c * (c >= 0.0 ? up : lp) >= crit;
  };
  // First sieve: the bounds over every time and check point at once, at f_max.
  Eigen::RowVectorXd span_base, span_part, span_lower;
  span_bounds(*m.base.surrogate, pts, 0, rows, m.parts_base, m.base.draws.scale, span_base, nullptr);
  span_bounds(*m.part.surrogate, m.part.segment_points[s], 0, rows, m.parts_part, m.part.draws.scale, span_part, &span_lower);
  std::vector<Eigen::Index> sieved;
  for (Eigen::Index r = 0; r < n; ++r) {
    const double crit = crit_of(r);
    if (crit > 0.0 && !std::isinf(crit) && can_reach(span_base(r), span_part(r), span_lower(r), f_max, crit))
      sieved.push_back(r);
  }
  // Per chunk and realization: the largest upper bound of the screen's Δp and of the part's over
  // the check points, and the smallest lower bound of the part's.
  Eigen::MatrixXd upper_base, upper_part, lower_part, ub, up, lp;
  for (std::size_t i = 0; i < pts.size(); ++i) {
    chunk_bounds(*m.base.surrogate, pts[i], 0, rows, kChunk, m.parts_base, m.base.draws.scale, ub, nullptr, &sieved);
    chunk_bounds(*m.part.surrogate, m.part.segment_points[s][i], 0, rows, kChunk, m.parts_part, m.part.draws.scale, up, &lp,
                 &sieved);
    upper_base = i == 0 ? ub : upper_base.cwiseMax(ub);
    upper_part = i == 0 ? up : upper_part.cwiseMax(up);
    lower_part = i == 0 ? lp : lower_part.cwiseMin(lp);
  }
  // Whether chunk q of realization r can give a factor at or below f.
  const auto reaches = [&](Eigen::Index q, Eigen::Index r, double f) {
    return can_reach(upper_base(q, r), upper_part(q, r), lower_part(q, r), f, crit_of(r));
  };
  std::vector<double> f(static_cast<std::size_t>(n), kInf), kth;
  std::vector<Eigen::Index> active, in_chunk, cols, listed;
  SeriesBuffers buf;
  Eigen::MatrixXd group, rest;
  for (Eigen::Index r = 0; r < n; ++r)
    if (crit_of(r) > 0.0) listed.push_back(r);  // critical before injection: counted apart
  active = sieved;
  // The cutoff from the factors found so far (the k-th smallest over the listed realizations).
  const auto cutoff = [&] {
    double c = kInf;
    if (k > 0 && k <= listed.size()) {
      kth.clear();
      for (Eigen::Index r : listed) kth.push_back(f[static_cast<std::size_t>(r)]);
      std::nth_element(kth.begin(), kth.begin() + static_cast<std::ptrdiff_t>(k - 1), kth.end());
      c = kth[k - 1];
    }
    return std::min(f_max, std::max(floor, c));
  };
  double c = cutoff();
  // Latest chunk first: Δp usually grows while the wells inject, so the late chunks give the
  // small factors early, and the tightened bound then skips most of the earlier ones. Any order
  // gives the same result.
  const Eigen::Index n_chunks = (rows + kChunk - 1) / kChunk;
  for (Eigen::Index q = n_chunks - 1; q >= 0 && !active.empty(); --q) {
    const Eigen::Index k0 = q * kChunk, len = std::min(kChunk, rows - k0);
    in_chunk.clear();
    for (Eigen::Index r : active)
      if (reaches(q, r, std::min(c, f[static_cast<std::size_t>(r)]))) in_chunk.push_back(r);
    for (std::size_t c0 = 0; c0 < in_chunk.size(); c0 += kBlock) {
      cols.assign(in_chunk.begin() + static_cast<std::ptrdiff_t>(c0),
                  in_chunk.begin() + static_cast<std::ptrdiff_t>(std::min(in_chunk.size(), c0 + kBlock)));
      point_series(m.part, m.part.segment_points[s], len, cols, k0, buf, group);
      point_series(m.base, pts, len, cols, k0, buf, rest);
      rest -= group;
      const auto l = static_cast<std::size_t>(len);
      for (std::size_t j = 0; j < cols.size(); ++j) {
        const auto ci = static_cast<Eigen::Index>(j);
        double& fr = f[static_cast<std::size_t>(cols[j])];
        for (std::size_t i = 0; i < pts.size(); ++i) {
          const Eigen::Index at = static_cast<Eigen::Index>(i) * len;
          fr = std::min(fr, critical_factor(std::span<const double>(rest.col(ci).data() + at, l),
                                            std::span<const double>(group.col(ci).data() + at, l), crit_of(cols[j])));
        }
      }
    }
    std::erase_if(active, [&](Eigen::Index r) { return f[static_cast<std::size_t>(r)] == 0.0; });
    c = cutoff();
  }
  std::vector<double> f_crit;
  for (Eigen::Index r : listed) {
    const double fr = f[static_cast<std::size_t>(r)];
    f_crit.push_back(fr <= c ? fr : kInf);
  }
  return SlipFactorCurve(std::move(f_crit), static_cast<std::uint64_t>(n), c);
}

void check_pair(const PressureModel& base, const PressureModel& part, std::size_t realizations) {
  bool same = base.segment_points.size() == part.segment_points.size() &&
              base.draws.basis.cols() == static_cast<Eigen::Index>(realizations) &&
              part.draws.basis.cols() == static_cast<Eigen::Index>(realizations) && part.surrogate &&
              part.surrogate->time_count() == base.surrogate->time_count();
  for (std::size_t s = 0; same && s < base.segment_points.size(); ++s)
    same = base.segment_points[s].size() == part.segment_points[s].size();
  if (!same)
    throw InputError("group pressure model", std::to_string(part.segment_points.size()) + " segments",
                     "the screen's check points, tracking times and realizations");
}

// out[s] = one(s) for every segment s with `wanted(s)` (OpenMP over segments; the first failure
// is rethrown).
template <class T, class One, class Wanted>
void per_segment(std::vector<T>& out, const One& one, const Wanted& wanted) {
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t s = 0; s < out.size(); ++s)
    errors.iteration(s, [&] {
      if (wanted(s)) out[s] = one(s);
    });
  errors.rethrow();
}
}  // namespace

VariantSearch prepare_variant(const PressureModel& base, PressureModel part, double factor, std::size_t realizations) {
  if (!base.surrogate) throw InputError("what-if pressure model", "(none)", "the screen's pressure model");
  if (!(factor >= 0.0)) throw InputError("what-if factor", std::to_string(factor), "a factor >= 0");
  check_pair(base, part, realizations);
  VariantSearch v;
  v.base = &base;
  v.part = std::move(part);
  v.factor = factor;
  v.parts_base = split_basis(base.draws.basis);
  v.parts_part = split_basis(v.part.draws.basis);
  v.from_row = v.part.surrogate->time_count();
  for (std::size_t pt = 0; pt < v.part.surrogate->point_count(); ++pt)
    for (std::size_t g = 0; g < v.part.groups; ++g) {
      const Eigen::MatrixXd& t = v.part.surrogate->table(pt, g);
      for (Eigen::Index k = 0; k < static_cast<Eigen::Index>(v.from_row); ++k)
        if ((t.row(k).array() != 0.0).any()) {
          v.from_row = static_cast<std::size_t>(k);
          break;
        }
    }
  return v;
}

std::vector<std::uint64_t> variant_segment_slips(const VariantSearch& v, const Eigen::MatrixXf& dp_crit, std::size_t s,
                                                 std::span<const int> first_crossing,
                                                 const std::vector<std::size_t>& output_index) {
  const PressureModel& base = *v.base;
  const auto n = static_cast<Eigen::Index>(first_crossing.size());
  if (output_index.empty() || output_index.back() >= base.surrogate->time_count() || s >= base.segment_points.size() ||
      first_crossing.size() != static_cast<std::size_t>(dp_crit.cols()))
    throw InputError("what-if search", std::to_string(s), "a segment, output times and columns of the run");
  std::vector<std::uint64_t> slipped(output_index.size(), 0);
  const auto count = [&](std::size_t k) {
    for (std::size_t t = 0; t < output_index.size(); ++t)
      if (output_index[t] >= k) ++slipped[t];
  };
  const auto crit_of = [&](Eigen::Index c) { return double(dp_crit(static_cast<Eigen::Index>(s), c)); };
  const auto rows = static_cast<Eigen::Index>(output_index.back() + 1);
  const auto from = static_cast<Eigen::Index>(v.from_row);
  const double c_part = v.factor - 1.0;
  std::vector<Eigen::Index> active;  // local columns still to search from `from` on
  for (Eigen::Index c = 0; c < n; ++c) {
    const double crit = crit_of(c);
    if (!(crit > 0.0) || std::isinf(crit)) continue;  // critical before injection (counted apart), or never
    const int fc = first_crossing[static_cast<std::size_t>(c)];
    if (fc >= 0 && (fc < from || c_part == 0.0)) count(static_cast<std::size_t>(fc));
    else if (from < rows && c_part != 0.0) active.push_back(c);
  }
  if (active.empty()) return slipped;
  const Eigen::Index span_rows = rows - from;
  const auto& pts = base.segment_points[s];
  // An upper bound of the variant's Δp = Δp_screen + (factor − 1)·Δp_part (chunk_bounds.hpp): first
  // over every time from `from` and check point at once (a sieve), then per chunk and realization,
  // max over the check points, for the realizations left.
  const auto pb = v.parts_base.leftCols(n), pp = v.parts_part.leftCols(n);
  const auto sb = base.draws.scale.leftCols(n), sp = v.part.draws.scale.leftCols(n);
  const auto variant_bound = [&](const auto& ub, const auto& up, const auto& lp) {
    return (ub + c_part * (c_part >= 0.0 ? up : lp)).eval();
  };
  {
    Eigen::RowVectorXd ub, up, lp;
    span_bounds(*base.surrogate, pts, from, span_rows, pb, sb, ub, nullptr);
    span_bounds(*v.part.surrogate, v.part.segment_points[s], from, span_rows, pp, sp, up, &lp);
    const Eigen::RowVectorXd b = variant_bound(ub, up, lp);
    std::erase_if(active, [&](Eigen::Index c) { return b(c) < crit_of(c); });
  }
  if (active.empty()) return slipped;
  Eigen::MatrixXd bound, ub, up, lp;
  for (std::size_t i = 0; i < pts.size(); ++i) {
    chunk_bounds(*base.surrogate, pts[i], from, span_rows, kChunk, pb, sb, ub, nullptr, &active);
    chunk_bounds(*v.part.surrogate, v.part.segment_points[s][i], from, span_rows, kChunk, pp, sp, up, &lp, &active);
    const Eigen::MatrixXd b = variant_bound(ub, up, lp);
    bound = i == 0 ? b : bound.cwiseMax(b);
  }
  std::erase_if(active, [&](Eigen::Index c) { return bound.col(c).maxCoeff() < crit_of(c); });
  std::vector<Eigen::Index> in_chunk, cols;
  SeriesBuffers buf;
  Eigen::MatrixXd dp, part;
  for (Eigen::Index q = 0; q * kChunk < span_rows && !active.empty(); ++q) {
    const Eigen::Index k0 = from + q * kChunk, len = std::min(kChunk, span_rows - q * kChunk);
    in_chunk.clear();
    for (Eigen::Index c : active)
      if (bound(q, c) >= crit_of(c)) in_chunk.push_back(c);
    std::vector<char> crossed(static_cast<std::size_t>(n), 0);
    for (std::size_t b0 = 0; b0 < in_chunk.size(); b0 += kBlock) {
      cols.clear();
      for (std::size_t j = b0; j < std::min(in_chunk.size(), b0 + kBlock); ++j) cols.push_back(in_chunk[j]);
      point_series(base, pts, len, cols, k0, buf, dp);
      point_series(v.part, v.part.segment_points[s], len, cols, k0, buf, part);
      dp.noalias() += c_part * part;
      const Eigen::MatrixXd best = max_over_points(dp, pts.size(), len);
      for (std::size_t j = 0; j < cols.size(); ++j) {
        const Eigen::Index c = in_chunk[b0 + j];
        const double crit = crit_of(c);
        for (Eigen::Index k = 0; k < len; ++k)
          if (best(k, static_cast<Eigen::Index>(j)) >= crit) {
            count(static_cast<std::size_t>(k0 + k));
            crossed[static_cast<std::size_t>(c)] = 1;
            break;
          }
      }
    }
    std::erase_if(active, [&](Eigen::Index c) { return crossed[static_cast<std::size_t>(c)] != 0; });
  }
  return slipped;
}

std::vector<SlipFactorCurve> group_factor_curves(const PressureModel& base, const PressureModel& part,
                                                 const Eigen::MatrixXf& dp_crit, std::size_t horizon, double f_max,
                                                 const std::vector<double>& thresholds, double z) {
  if (!base.surrogate || horizon >= base.surrogate->time_count())
    throw InputError("capacity horizon", std::to_string(horizon), "a tracking-time index");
  if (!(f_max >= 1.0)) throw InputError("capacity f_max", std::to_string(f_max), "a factor >= 1");
  check_pair(base, part, static_cast<std::size_t>(dp_crit.cols()));
  const Pair m(base, part);
  const auto rows = static_cast<Eigen::Index>(horizon + 1);
  const auto n = static_cast<std::uint64_t>(dp_crit.cols());
  // Pass 1: every answer's steps (steps_needed) and the curve up to f = 2; then the curve's
  // range follows from the answers, and pass 2 extends the segments whose range falls short of it.
  const std::uint64_t k = steps_needed(std::max<std::uint64_t>(1, n), thresholds, z);
  std::vector<SlipFactorCurve> curves(base.segment_points.size(), SlipFactorCurve({}, std::max<std::uint64_t>(1, n)));
  per_segment(
      curves, [&](std::size_t s) { return segment_curve(m, dp_crit, s, rows, f_max, k, std::min(2.0, f_max)); },
      [](std::size_t) { return true; });
  const double end = curve_end(curves, thresholds, z, f_max);
  per_segment(
      curves, [&](std::size_t s) { return segment_curve(m, dp_crit, s, rows, f_max, k, end); },
      [&](std::size_t s) { return curves[s].exact_up_to() < end; });
  return curves;
}

}  // namespace slipscreen::probabilistic
