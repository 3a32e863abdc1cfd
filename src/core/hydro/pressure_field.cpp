// Superposition of Theis line sources in time and space; see pressure_field.hpp.
#include "core/hydro/pressure_field.hpp"

#include <algorithm>
#include <cmath>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"
#include "core/util/parallel_errors.hpp"
#include "core/hydro/hantush.hpp"
#include "core/hydro/well_function.hpp"

namespace slipscreen::hydro {
namespace {

std::string well_label(const WellSource& w, std::size_t i) {
  return w.name.empty() ? "well[" + std::to_string(i) + "]" : "well '" + w.name + "'";
}

}  // namespace

bool PreparedPoints::any_clamped() const {
  return std::any_of(clamped.begin(), clamped.end(), [](std::uint8_t c) { return c != 0; });
}

PressureField::PressureField(std::vector<WellSource> wells, std::vector<Boundary> boundaries,
                             int image_generations)
    : wells_(std::move(wells)), boundaries_(std::move(boundaries)) {
  validate_boundaries(boundaries_);
  for (std::size_t i = 0; i < wells_.size(); ++i) {
    const WellSource& w = wells_[i];
    try {
      if (!std::isfinite(w.x) || !std::isfinite(w.y))
        throw InputError("location", util::number_text(w.x) + ", " + util::number_text(w.y), "finite coordinates (m)");
      if (!std::isfinite(w.well_radius) || !(w.well_radius > 0.0))
        throw InputError("well_radius", util::number_text(w.well_radius), "a finite positive radius (m)");
      if (i > 0 && !same_region(boundaries_, wells_[0].x, wells_[0].y, w.x, w.y))
        throw InputError("location", util::number_text(w.x) + ", " + util::number_text(w.y),
                         "a location on the same side of every boundary as " +
                             well_label(wells_[0], 0));
      sources_.push_back(image_wells(w.x, w.y, boundaries_, image_generations));
    } catch (const InputError& e) {
      throw e.located(well_label(w, i));
    }
    changes_.push_back(w.history.changes());
  }
}

void PressureField::check_point(std::size_t p, const FieldPoint& pt) const {
  if (!std::isfinite(pt.x) || !std::isfinite(pt.y))
    throw InputError("point[" + std::to_string(p) + "]", util::number_text(pt.x) + ", " + util::number_text(pt.y),
                     "finite coordinates (m)");
  if (!wells_.empty() && !same_region(boundaries_, wells_[0].x, wells_[0].y, pt.x, pt.y))
    throw InputError("point[" + std::to_string(p) + "]", util::number_text(pt.x) + ", " + util::number_text(pt.y),
                     "a point inside the region the boundaries enclose (the wells' side)");
}

bool PressureField::check_points(std::span<const FieldPoint> points) const {
  bool clamped = false;
  for (std::size_t p = 0; p < points.size(); ++p) {
    check_point(p, points[p]);
    for (std::size_t w = 0; w < wells_.size(); ++w) {
      if (sources_[w].empty()) continue;
      const double dx = points[p].x - sources_[w][0].x, dy = points[p].y - sources_[w][0].y;
      clamped = clamped || dx * dx + dy * dy < wells_[w].well_radius * wells_[w].well_radius;
    }
  }
  return clamped;
}

PreparedPoints PressureField::prepare(std::span<const FieldPoint> points) const {
  PreparedPoints pp;
  pp.point_count = points.size();
  pp.well_count = wells_.size();
  pp.offset.reserve(points.size() * wells_.size() + 1);
  pp.clamped.resize(points.size() * wells_.size(), 0);
  pp.offset.push_back(0);
  for (std::size_t p = 0; p < points.size(); ++p) {
    const FieldPoint& pt = points[p];
    check_point(p, pt);
    for (std::size_t w = 0; w < wells_.size(); ++w) {
      const double rw2 = wells_[w].well_radius * wells_[w].well_radius;
      for (std::size_t s = 0; s < sources_[w].size(); ++s) {
        const ImageSource& src = sources_[w][s];
        const double dx = pt.x - src.x, dy = pt.y - src.y;
        const double d2 = dx * dx + dy * dy;
        if (s == 0 && d2 < rw2) pp.clamped[p * wells_.size() + w] = 1;
        pp.r2.push_back(std::max(d2, rw2));
        pp.sign.push_back(src.sign);
      }
      pp.offset.push_back(pp.r2.size());
    }
  }
  return pp;
}

PressureResult PressureField::evaluate(const PreparedPoints& pts, std::span<const double> times,
                                       const TheisParameters& params,
                                       std::span<const double> rate_factors, bool per_well) const {
  validate(params);
  if (pts.well_count != wells_.size())
    throw InputError("points", std::to_string(pts.well_count) + " wells",
                     "points prepared by this pressure field (" + std::to_string(wells_.size()) +
                         " wells)");
  if (!rate_factors.empty() && rate_factors.size() != wells_.size())
    throw InputError("rate_factors", std::to_string(rate_factors.size()) + " factors",
                     "one factor per well (" + std::to_string(wells_.size()) + ")");
  for (std::size_t i = 0; i < rate_factors.size(); ++i)
    if (!std::isfinite(rate_factors[i]))
      throw InputError("rate_factors[" + std::to_string(i) + "]", util::number_text(rate_factors[i]), "a finite factor");
  for (std::size_t i = 0; i < times.size(); ++i)
    if (!std::isfinite(times[i]))
      throw InputError("time[" + std::to_string(i) + "]", util::number_text(times[i]), "a finite time (s)");

  const std::size_t P = pts.point_count, T = times.size(), W = wells_.size();
  PressureResult res;
  res.point_count = P;
  res.time_count = T;
  res.well_count = W;
  res.total.assign(P * T, 0.0);
  if (per_well) res.by_well.assign(P * T * W, 0.0);
  const double inv4D = 1.0 / (4.0 * params.diffusivity);

  util::ParallelErrors errors;
#pragma omp parallel
  {
    std::vector<double> u, weight, e1;
#pragma omp for schedule(dynamic, 16)
    for (std::size_t p = 0; p < P; ++p)
      errors.iteration(p, [&] {
        for (std::size_t ti = 0; ti < T; ++ti) {
          const double t = times[ti];
          double sum = 0.0;
          for (std::size_t w = 0; w < W; ++w) {
            const std::size_t b = pts.offset[p * W + w], e = pts.offset[p * W + w + 1];
            u.clear();
            weight.clear();
            for (const RateChange& c : changes_[w]) {
              if (!(c.time < t)) break;  // sorted: later changes have not happened yet
              const double k = inv4D / (t - c.time);
              for (std::size_t s = b; s < e; ++s) {
                u.push_back(pts.r2[s] * k);
                weight.push_back(c.delta * pts.sign[s]);
              }
            }
            if (u.empty()) continue;
            e1.resize(u.size());
            if (params.leakage_rate > 0.0) {
              // Leaky formation: W(u, r/B) with (r/B)² = r² c_L/D = 4 u c_L (t − t_j) (hantush.hpp).
              std::size_t i = 0;
              for (const RateChange& c : changes_[w]) {
                if (!(c.time < t)) break;
                const double lag = t - c.time;
                for (std::size_t s = b; s < e; ++s, ++i)
                  e1[i] = leaky_well_function(u[i], std::sqrt(4.0 * u[i] * params.leakage_rate * lag));
              }
            } else {
              well_function(u.data(), e1.data(), u.size());
            }
            double acc = 0.0;
            for (std::size_t i = 0; i < u.size(); ++i) acc += weight[i] * e1[i];
            const double f = rate_factors.empty() ? 1.0 : rate_factors[w];
            const double dp = params.pressure_per_rate * f * acc;
            sum += dp;
            if (per_well) res.by_well[(p * T + ti) * W + w] = dp;
          }
          res.total[p * T + ti] = sum;
        }
      });
  }
  errors.rethrow();
  return res;
}

std::vector<double> PressureField::evaluate_each(const PreparedPoints& pts, std::span<const double> times,
                                                 const TheisParameters& params) const {
  if (times.size() != pts.point_count)
    throw InputError("times", std::to_string(times.size()) + " times",
                     "one time per point (" + std::to_string(pts.point_count) + ")");
  validate(params);
  for (std::size_t i = 0; i < times.size(); ++i)
    if (!std::isfinite(times[i]))
      throw InputError("time[" + std::to_string(i) + "]", util::number_text(times[i]), "a finite time (s)");
  std::vector<double> out(pts.point_count, 0.0);
  // Inputs are checked above, so nothing inside the parallel loop throws on them.
  // Points with equal times share nothing, so each is one evaluate() of a single point; the
  // work is spread over threads here instead of inside each call.
  util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 8)
  for (std::size_t p = 0; p < pts.point_count; ++p)
    errors.iteration(p, [&] {
      PreparedPoints one;
      one.point_count = 1;
      one.well_count = pts.well_count;
      const std::size_t W = pts.well_count;
      const std::size_t b = pts.offset[p * W];
      one.offset.push_back(0);
      for (std::size_t w = 0; w < W; ++w) one.offset.push_back(pts.offset[p * W + w + 1] - b);
      one.r2.assign(pts.r2.begin() + static_cast<std::ptrdiff_t>(b),
                    pts.r2.begin() + static_cast<std::ptrdiff_t>(pts.offset[p * W + W]));
      one.sign.assign(pts.sign.begin() + static_cast<std::ptrdiff_t>(b),
                      pts.sign.begin() + static_cast<std::ptrdiff_t>(pts.offset[p * W + W]));
      one.clamped.assign(W, 0);
      out[p] = evaluate(one, times.subspan(p, 1), params).total[0];
    });
  errors.rethrow();
  return out;
}

double PressureField::pressure_at(const TheisParameters& params, FieldPoint point, double t) const {
  const FieldPoint pts[1] = {point};
  const double ts[1] = {t};
  return evaluate(prepare(pts), ts, params).total[0];
}

}  // namespace slipscreen::hydro
