#include "core/hydro/radial_solver.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <numeric>
#include <string>

#include "core/errors.hpp"
#include "core/util/number_text.hpp"

namespace slipscreen::hydro {
namespace {

using util::number_text;

void require_positive(double v, const std::string& field, const std::string& what) {
  if (!std::isfinite(v) || v <= 0.0) throw InputError(field, number_text(v), what);
}

void validate(const RadialModel& m, std::span<const double> radii, std::span<const double> times,
              const RadialSolverOptions& o) {
  require_positive(m.well_radius, "well_radius", "a finite well radius > 0 m");
  require_positive(m.thickness, "thickness", "a finite thickness > 0 m");
  require_positive(m.viscosity, "viscosity", "a finite viscosity > 0 Pa·s");
  if (m.zones.empty()) throw InputError("zones", "(none)", "at least one radial zone");
  double inner = m.well_radius;
  for (std::size_t j = 0; j < m.zones.size(); ++j) {
    const RadialZone& z = m.zones[j];
    const std::string tag = "zones[" + std::to_string(j) + "].";
    require_positive(z.permeability, tag + "permeability", "a finite permeability > 0 m²");
    require_positive(z.storage, tag + "storage", "a finite storage φ·c_t > 0 1/Pa");
    const bool last = j + 1 == m.zones.size();
    if (std::isnan(z.outer_radius) || z.outer_radius <= inner)
      throw InputError(tag + "outer_radius", number_text(z.outer_radius),
                       "a radius greater than " + number_text(inner) +
                           " m (zones innermost first, beyond the well radius)");
    if (std::isinf(z.outer_radius)) {
      if (!last)
        throw InputError(tag + "outer_radius", "inf", "a finite radius (only the outermost zone may be infinite)");
      if (m.outer != OuterBoundary::infinite)
        throw InputError(tag + "outer_radius", "inf",
                         "a finite outer radius r_e for a closed or constant-pressure boundary");
    } else if (last && m.outer == OuterBoundary::infinite) {
      throw InputError(tag + "outer_radius", number_text(z.outer_radius),
                       "+infinity for an infinite-acting layer (or choose a closed or "
                       "constant-pressure outer boundary)");
    }
    inner = z.outer_radius;
  }
  const double r_e = m.zones.back().outer_radius;
  for (std::size_t i = 0; i < radii.size(); ++i) {
    const double r = radii[i];
    if (std::isnan(r) || r < 0.0 || std::isinf(r))
      throw InputError("radii[" + std::to_string(i) + "]", number_text(r), "a finite radius >= 0 m");
    if (r > r_e)
      throw InputError("radii[" + std::to_string(i) + "]", number_text(r),
                       "a radius within the outer radius r_e = " + number_text(r_e) + " m");
  }
  for (std::size_t i = 0; i < times.size(); ++i)
    if (!std::isfinite(times[i]))
      throw InputError("times[" + std::to_string(i) + "]", number_text(times[i]), "a finite time in s");
  if (!std::isfinite(o.cells_per_decade) || o.cells_per_decade < 5.0 || o.cells_per_decade > 2000.0)
    throw InputError("cells_per_decade", number_text(o.cells_per_decade), "a number between 5 and 2000");
  if (!std::isfinite(o.time_step_growth) || o.time_step_growth <= 1.0 || o.time_step_growth > 2.0)
    throw InputError("time_step_growth", number_text(o.time_step_growth), "a ratio > 1 and <= 2");
  if (!std::isfinite(o.first_step) || o.first_step < 0.0)
    throw InputError("first_step", number_text(o.first_step), "a time step >= 0 s (0 = automatic)");
}

// The discretised annulus.
struct Grid {
  std::vector<double> face;     // N+1 faces, face[0] = r_w, face[N] = r_e
  std::vector<double> node;     // N nodes, geometric mean of the faces
  std::vector<double> perm;     // k per cell
  std::vector<std::size_t> zone;  // zone index per cell
  std::vector<double> store;    // φ c_t V per cell (m³/Pa)
  std::vector<double> trans;    // N+1 face transmissibilities (m³/(Pa·s)); [0] unused,
                                // [N] = to the constant-pressure boundary or 0 when closed
};

Grid build_grid(const RadialModel& m, double r_e, const RadialSolverOptions& o) {
  Grid g;
  g.face.push_back(m.well_radius);
  double inner = m.well_radius;
  for (std::size_t j = 0; j < m.zones.size(); ++j) {
    const RadialZone& z = m.zones[j];
    const double outer = std::min(z.outer_radius, r_e);
    if (outer <= inner) break;
    const double decades = std::log10(outer / inner);
    const auto n = static_cast<std::size_t>(std::max(4.0, std::ceil(o.cells_per_decade * decades)));
    for (std::size_t i = 1; i <= n; ++i) {
      const double f = i == n ? outer : inner * std::pow(outer / inner, double(i) / double(n));
      g.face.push_back(f);
      g.perm.push_back(z.permeability);
      g.zone.push_back(j);
      g.store.push_back(z.storage);
    }
    inner = outer;
  }
  const std::size_t n = g.perm.size();
  const double h = m.thickness, mu = m.viscosity, pi = std::numbers::pi;
  g.node.resize(n);
  for (std::size_t i = 0; i < n; ++i) {
    g.node[i] = std::sqrt(g.face[i] * g.face[i + 1]);
    g.store[i] *= pi * (g.face[i + 1] * g.face[i + 1] - g.face[i] * g.face[i]) * h;
  }
  g.trans.assign(n + 1, 0.0);
  for (std::size_t i = 1; i < n; ++i) {
    const double resist = std::log(g.face[i] / g.node[i - 1]) / g.perm[i - 1] +
                          std::log(g.node[i] / g.face[i]) / g.perm[i];
    g.trans[i] = 2.0 * pi * h / (mu * resist);
  }
  if (m.outer == OuterBoundary::constant_pressure)
    g.trans[n] = 2.0 * pi * h * g.perm[n - 1] / (mu * std::log(g.face[n] / g.node[n - 1]));
  return g;
}

// Δp at radius r from the nodal values. Between the well face and the first node, and between
// the last node and r_e, the steady radial profile carrying the current flux (exact at steady
// state). Between nodes: cubic Lagrange interpolation in ln r (nodes are uniform in ln r within a
// zone) when four neighbouring nodes lie in one zone; otherwise, next to a zone face, the
// steady flux-continuous profile (linear in ln r on each side of the face).
double reconstruct(const Grid& g, const std::vector<double>& p, double q, double r,
                   const RadialModel& m) {
  const std::size_t n = p.size();
  const double c = m.viscosity / (2.0 * std::numbers::pi * m.thickness);  // μ/(2πh)
  r = std::max(r, g.face[0]);
  if (r <= g.node[0]) return p[0] + q * c / g.perm[0] * std::log(g.node[0] / r);
  if (r >= g.node[n - 1]) {
    const double flux = g.trans[n] * p[n - 1];  // 0 when closed
    return p[n - 1] - flux * c / g.perm[n - 1] * std::log(r / g.node[n - 1]);
  }
  const auto it = std::upper_bound(g.node.begin(), g.node.end(), r);
  const std::size_t i = static_cast<std::size_t>(it - g.node.begin()) - 1;  // node[i] <= r < node[i+1]
  if (i >= 1 && i + 2 < n && g.zone[i - 1] == g.zone[i + 2]) {
    const double x = std::log(r / g.node[i]) / std::log(g.node[i + 1] / g.node[i]);  // in [0, 1)
    const double w0 = -x * (x - 1) * (x - 2) / 6, w1 = (x + 1) * (x - 1) * (x - 2) / 2;
    const double w2 = -(x + 1) * x * (x - 2) / 2, w3 = (x + 1) * x * (x - 1) / 6;
    return w0 * p[i - 1] + w1 * p[i] + w2 * p[i + 1] + w3 * p[i + 2];
  }
  const double flux = g.trans[i + 1] * (p[i] - p[i + 1]);
  const double f = g.face[i + 1];
  if (r <= f) return p[i] - flux * c / g.perm[i] * std::log(r / g.node[i]);
  return p[i + 1] + flux * c / g.perm[i + 1] * std::log(g.node[i + 1] / r);
}

// Outer radius of the grid. Infinite-acting: a closed radius far beyond the diffusion length of
// the whole run, so that its image term is below exp(-16) ~ 1e-7 of the source anywhere requested
// (the image at distance 2 r_e − r has u ≥ (r_e − r_max)² / (4 D t) ≥ 16).
double outer_radius(const RadialModel& model, std::span<const double> radii, double t0, double t_max) {
  double r_e = model.zones.back().outer_radius;
  if (model.outer == OuterBoundary::infinite) {
    double d_max = 0.0, r_inner_last = model.well_radius;
    for (std::size_t j = 0; j < model.zones.size(); ++j) {
      d_max = std::max(d_max, model.zones[j].permeability / (model.viscosity * model.zones[j].storage));
      if (j + 1 < model.zones.size()) r_inner_last = model.zones[j].outer_radius;
    }
    double r_max = r_inner_last;
    for (double r : radii) r_max = std::max(r_max, r);
    const double span = std::max(t_max - t0, 0.0);
    r_e = std::max(2.0 * r_max, r_max + 8.0 * std::sqrt(d_max * span)) + model.well_radius;
  }
  return r_e;
}

// Output times in increasing order (equal times keep their input order).
std::vector<std::size_t> time_order(std::span<const double> times) {
  std::vector<std::size_t> order(times.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return times[a] < times[b]; });
  return order;
}

// First step after each rate change: the option, or automatic (0.01 Δr²/D of the innermost cell).
double first_time_step(const Grid& g, const RadialModel& model, const RadialSolverOptions& options) {
  const double dt_auto = [&] {
    const double d0 = g.perm[0] / (model.viscosity * model.zones.front().storage);
    const double dr = g.face[1] - g.face[0];
    return 0.01 * dr * dr / d0;
  }();
  return options.first_step > 0.0 ? options.first_step : dt_auto;
}

// The next step from t with the planned dt. Land exactly on the next event; when it is less than
// two steps away, split the remainder into two halves so that no step is much shorter than its
// predecessor. `clipped`: the step is not the planned one.
struct Step {
  double length;
  bool clipped;
};

Step next_step(double t, double dt, double t_event) {
  double step = dt;
  bool clipped = false;
  if (t + dt >= t_event) {
    step = t_event - t;
    clipped = true;
  } else if (t + 2.0 * dt > t_event) {
    step = 0.5 * (t_event - t);
    clipped = true;
  }
  return {step, clipped};
}

// Second-order variable-step BDF2 (e.g. Hairer & Wanner, Solving ODEs II, §III.5):
//   (S/Δt_n) [α p' − β p^n + γ p^{n−1}] = −T p' + q,  ω = Δt_n/Δt_{n−1},
//   α = (1+2ω)/(1+ω), β = 1+ω, γ = ω²/(1+ω); zero-stable for ω < 1+√2.
// The first step after a rate change (and after a much shorter step) is backward Euler
// (α = β = 1, γ = 0). Both conserve mass exactly within a constant-rate period.
struct Bdf2 {
  double alpha, beta, gamma;
};

Bdf2 bdf2_coefficients(bool have_prev, double step, double dt_prev) {
  const double omega = have_prev ? step / dt_prev : 0.0;
  const bool bdf2 = have_prev && omega <= 2.4;
  const double alpha = bdf2 ? (1 + 2 * omega) / (1 + omega) : 1.0;
  const double beta = bdf2 ? 1 + omega : 1.0;
  const double gamma = bdf2 ? omega * omega / (1 + omega) : 0.0;
  return {alpha, beta, gamma};
}

// Nodal Δp at the current and the previous step, and the tridiagonal system of the next step:
// a (sub-diagonal), b (diagonal), c (super-diagonal), d (right-hand side).
struct StepState {
  std::vector<double> p, p_old, a, b, c, d;
};

// The implicit step of length `step` at rate q into the well-face cell: fills a, b, c, d.
void assemble_step(const Grid& g, StepState& s, double step, const Bdf2& k, double q) {
  const std::size_t n = s.p.size();
  for (std::size_t i = 0; i < n; ++i) {
    const double st = g.store[i] / step;
    const double tw = i > 0 ? g.trans[i] : 0.0;
    const double te = g.trans[i + 1];
    s.a[i] = -tw;
    s.c[i] = i + 1 < n ? -te : 0.0;
    s.b[i] = k.alpha * st + tw + te;
    s.d[i] = st * (k.beta * s.p[i] - k.gamma * s.p_old[i]) + (i == 0 ? q : 0.0);
  }
}

// Thomas algorithm (diagonally dominant, no pivoting needed); the old p becomes p_old.
void solve_tridiagonal(StepState& s) {
  const std::size_t n = s.p.size();
  std::vector<double>& a = s.a;
  std::vector<double>& b = s.b;
  std::vector<double>& c = s.c;
  std::vector<double>& d = s.d;
  std::vector<double>& p = s.p;
  for (std::size_t i = 1; i < n; ++i) {
    const double w = a[i] / b[i - 1];
    b[i] -= w * c[i - 1];
    d[i] -= w * d[i - 1];
  }
  s.p_old.swap(p);
  p[n - 1] = d[n - 1] / b[n - 1];
  for (std::size_t i = n - 1; i-- > 0;) p[i] = (d[i] - c[i] * p[i + 1]) / b[i];
}

// Output time k: Δp at every requested radius and the storage-weighted mean over the grid.
void record(RadialSolution& out, std::size_t k, const Grid& g, const std::vector<double>& p, double q,
            double total_store, const RadialModel& model) {
  const std::size_t nr = out.radii.size();
  for (std::size_t ir = 0; ir < nr; ++ir) out.values[k * nr + ir] = reconstruct(g, p, q, out.radii[ir], model);
  double s = 0.0;
  for (std::size_t i = 0; i < p.size(); ++i) s += g.store[i] * p[i];
  out.mean_change[k] = s / total_store;
}

}  // namespace

RadialSolution solve_radial_flow(const RadialModel& model, std::span<const double> radii,
                                 std::span<const double> times, const RadialSolverOptions& options) {
  validate(model, radii, times, options);
  RadialSolution out;
  out.radii.assign(radii.begin(), radii.end());
  out.times.assign(times.begin(), times.end());
  out.values.assign(radii.size() * times.size(), 0.0);
  out.mean_change.assign(times.size(), 0.0);

  const std::vector<double>& starts = model.history.start_times();
  const std::vector<double>& rates = model.history.rates();
  const double t0 = starts.empty() ? 0.0 : starts.front();
  const double t_max = times.empty() ? t0 : *std::max_element(times.begin(), times.end());
  const double r_e = outer_radius(model, radii, t0, t_max);
  const Grid g = build_grid(model, r_e, options);
  const std::size_t n = g.node.size();
  out.outer_radius = r_e;
  out.cells = n;
  const double total_store = std::accumulate(g.store.begin(), g.store.end(), 0.0);
  const std::vector<std::size_t> order = time_order(times);
  const double dt_first = first_time_step(g, model, options);
  StepState s{std::vector<double>(n, 0.0), std::vector<double>(n, 0.0), std::vector<double>(n),
              std::vector<double>(n), std::vector<double>(n), std::vector<double>(n)};

  std::size_t next_out = 0;
  // Times before the first rate step (or with no rates at all): Δp = 0.
  while (next_out < order.size() && (starts.empty() || times[order[next_out]] <= t0)) ++next_out;
  if (starts.empty()) return out;

  double t = t0, q = 0.0, dt = dt_first, dt_prev = 0.0;
  bool have_prev = false;  // a previous step within the current constant-rate period (for BDF2)
  std::size_t next_rate = 0;
  while (next_out < order.size()) {
    // Apply every rate change at the current time (restarting the geometric step sequence).
    while (next_rate < starts.size() && starts[next_rate] <= t) {
      q = rates[next_rate];
      dt = dt_first;
      have_prev = false;
      ++next_rate;
    }
    const double t_out = times[order[next_out]];
    const double t_event = next_rate < starts.size() ? std::min(t_out, starts[next_rate]) : t_out;
    const Step step = next_step(t, dt, t_event);
    assemble_step(g, s, step.length, bdf2_coefficients(have_prev, step.length, dt_prev), q);
    solve_tridiagonal(s);
    ++out.steps;
    have_prev = true;
    dt_prev = step.length;

    t = step.length == t_event - t ? t_event : t + step.length;
    if (!step.clipped) dt *= options.time_step_growth;
    while (next_out < order.size() && times[order[next_out]] <= t)
      record(out, order[next_out++], g, s.p, q, total_store, model);
  }
  return out;
}

}  // namespace slipscreen::hydro
