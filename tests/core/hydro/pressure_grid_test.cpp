#include "core/hydro/pressure_grid.hpp"

#include <doctest/doctest.h>
#include <omp.h>

#include <algorithm>
#include <boost/math/special_functions/expint.hpp>
#include <cmath>
#include <numbers>
#include <vector>

#include "core/errors.hpp"
#include "core/hydro/pressure_field.hpp"
#include "core/hydro/theis.hpp"

using namespace slipscreen;
using namespace slipscreen::hydro;

namespace {

constexpr double kMonth = 365.25 * 86400.0 / 12.0;

// Fictional formation: k = 1e-13 m², h = 50 m, μ = 1 mPa·s, φ = 0.1, c_t = 1e-9 1/Pa,
// so D = 1 m²/s and μ/(4π k h) = 1.59e7 Pa per m³/s.
TheisParameters formation() {
  Formation f;
  f.permeability = 1e-13;
  f.thickness = 50.0;
  f.viscosity = 1e-3;
  f.porosity = 0.1;
  f.total_compressibility = 1e-9;
  return theis_parameters(f);
}

// A fictional monthly history: `months` monthly rates around q0 with a deterministic wobble,
// starting at month m0, shut in (rate 0) at month `shut` if shut < months.
WellSource monthly_well(double x, double y, double q0, int m0, int months, int shut, int seed) {
  WellSource s;
  s.x = x;
  s.y = y;
  std::vector<double> start, rate;
  for (int m = 0; m < months; ++m) {
    start.push_back((m0 + m) * kMonth);
    const double wobble = 1.0 + 0.3 * std::sin(0.7 * m + seed) * std::cos(0.31 * m * seed);
    rate.push_back(m >= shut ? 0.0 : q0 * wobble);
  }
  s.history = RateHistory(start, rate);
  return s;
}

WellSource constant_well(double x, double y, double q, double start = 0.0) {
  WellSource s;
  s.x = x;
  s.y = y;
  s.history = RateHistory({start}, {q});
  return s;
}

double direct_at(const PressureField& field, const TheisParameters& p, double x, double y, double t) {
  return field.pressure_at(p, FieldPoint{x, y}, t);
}

GridGeometry small_grid() {
  GridGeometry g;
  g.origin_x = 500000.0;  // a north-up raster: origin at the top-left corner
  g.origin_y = 4200000.0;
  g.cell_x = 250.0;
  g.cell_y = -250.0;
  g.nx = 40;
  g.ny = 30;
  return g;
}

}  // namespace

TEST_CASE("pixel (i, j) is evaluated at origin + (i + 0.5, j + 0.5) cells") {
  GridGeometry g = small_grid();
  CHECK(g.centre_x(0) == 500125.0);
  CHECK(g.centre_y(0) == 4199875.0);
  CHECK(g.centre_x(3) == 500000.0 + 3.5 * 250.0);
  CHECK(g.centre_y(7) == 4200000.0 - 7.5 * 250.0);
  // One well exactly on the centre of pixel (i, j) = (5, 2): that pixel sees the clamped well
  // face value, its four neighbours sit at one cell width and see equal values, and every pixel
  // equals the direct sum at its documented centre.
  const TheisParameters p = formation();
  const PressureField field({constant_well(g.centre_x(5), g.centre_y(2), 0.02)});
  const std::vector<double> times = {30 * 86400.0};
  const PressureGrid fast = pressure_grid(g, field, p, times);
  // Theis (1935) at r_w = 0.1 m, E1 from Boost.Math expint(1, u).
  const double theis_rw = p.pressure_per_rate * 0.02 * boost::math::expint(1, 0.01 / (4 * p.diffusivity * times[0]));
  CHECK(fast.at(0, 5, 2) == doctest::Approx(theis_rw).epsilon(1e-9));
  CHECK(fast.at(0, 4, 2) == doctest::Approx(fast.at(0, 6, 2)).epsilon(1e-12));
  CHECK(fast.at(0, 5, 1) == doctest::Approx(fast.at(0, 5, 3)).epsilon(1e-12));
  CHECK(fast.at(0, 4, 2) == doctest::Approx(fast.at(0, 5, 1)).epsilon(1e-12));
  for (std::size_t j : {0u, 2u, 29u})
    for (std::size_t i : {0u, 4u, 39u}) {
      const double x = g.origin_x + (i + 0.5) * g.cell_x, y = g.origin_y + (j + 0.5) * g.cell_y;
      CAPTURE(i);
      CAPTURE(j);
      CHECK(std::abs(fast.at(0, i, j) - direct_at(field, p, x, y, times[0])) <= fast.error_bound);
    }
  // Storage order: values[(k·ny + j)·nx + i].
  CHECK(fast.values[(0 * g.ny + 2) * g.nx + 5] == fast.at(0, 5, 2));
  // The direct grid is PressureField::evaluate at the same centres.
  const PressureGrid direct = pressure_grid_direct(g, field, p, times);
  CHECK(direct.at(0, 5, 2) == direct_at(field, p, g.centre_x(5), g.centre_y(2), times[0]));
  CHECK(direct.at(0, 39, 29) == direct_at(field, p, g.centre_x(39), g.centre_y(29), times[0]));
}

TEST_CASE("fast path is within its stated bound of the direct sum (wells with shut-ins)") {
  const GridGeometry g = small_grid();
  const TheisParameters p = formation();
  const double x0 = g.origin_x, y0 = g.origin_y;
  const PressureField field({
      monthly_well(x0 + 2000, y0 - 1500, 0.02, 0, 36, 24, 1),    // shut in after 2 years
      monthly_well(x0 + 6125, y0 - 3875, 0.015, 3, 33, 40, 2),   // on a pixel centre
      monthly_well(x0 + 9100, y0 - 6800, 0.03, 10, 26, 18, 3),
      monthly_well(x0 + 4000, y0 - 7000, 0.01, 0, 36, 12, 4),    // shut in early
      monthly_well(x0 + 30000, y0 - 20000, 0.04, 5, 31, 40, 5),  // far outside the grid
      // A small producer (negative rate): the bound is absolute, so it holds with mixed signs.
      monthly_well(x0 + 8000, y0 - 2000, -0.004, 6, 30, 40, 6),
  });
  // Before any injection, on a step time, just after a shut-in, and later.
  const std::vector<double> times = {-kMonth, 12 * kMonth, 18.5 * kMonth, 24 * kMonth + 3600.0,
                                     30 * kMonth, 36 * kMonth, 40 * kMonth};
  const std::vector<double> factors = {1.0, 0.8, 1.2, 1.0, 1.0, 1.0};  // Monte Carlo rate factors
  const PressureGrid fast = pressure_grid(g, field, p, times, factors);
  const PressureGrid direct = pressure_grid_direct(g, field, p, times, factors);
  REQUIRE(fast.values.size() == direct.values.size());
  CHECK(fast.error_bound == doctest::Approx(0.1).epsilon(1e-12));  // 1e-4 × 1 kPa
  double worst_abs = 0.0, worst_rel = 0.0;
  std::size_t significant = 0;
  for (std::size_t n = 0; n < fast.values.size(); ++n) {
    const double e = std::abs(fast.values[n] - direct.values[n]);
    worst_abs = std::max(worst_abs, e);
    if (std::abs(direct.values[n]) > 1e3) {
      ++significant;
      worst_rel = std::max(worst_rel, e / std::abs(direct.values[n]));
    }
  }
  MESSAGE("fast vs direct: max abs error ", worst_abs, " Pa (bound ", fast.error_bound,
          "), max relative where |Δp| > 1 kPa ", worst_rel, " over ", significant,
          " values; node spacing h = ", fast.node_spacing);
  CHECK(significant > 5000);
  CHECK(worst_abs <= fast.error_bound);
  CHECK(worst_rel <= 1e-4);  // the accuracy stated in core/hydro/pressure_grid.hpp
  for (std::size_t i = 0; i < g.nx * g.ny; ++i) CHECK(fast.values[i] == 0.0);  // before injection
  // A tighter tolerance gives a finer node spacing and a smaller error.
  PressureGridOptions tight;
  tight.relative_tolerance = 1e-7;
  const PressureGrid fine = pressure_grid(g, field, p, times, factors, tight);
  CHECK(fine.node_spacing < fast.node_spacing);
  double worst_fine = 0.0;
  for (std::size_t n = 0; n < fine.values.size(); ++n)
    worst_fine = std::max(worst_fine, std::abs(fine.values[n] - direct.values[n]));
  CHECK(worst_fine <= fine.error_bound);
}

TEST_CASE("image wells: boundaries through the raster, pixels beyond them are no data") {
  // A no-flow boundary (sealing fault) along x = x0 + 6 km and a constant-pressure boundary
  // (outcrop) along y = y0 − 6 km, perpendicular (method of images, Ferris et al. 1962).
  const GridGeometry g = small_grid();
  const TheisParameters p = formation();
  const double x0 = g.origin_x, y0 = g.origin_y;
  std::vector<Boundary> bounds(2);
  bounds[0] = {BoundaryKind::no_flow, x0 + 6000.0, y0, 0.0, 1.0};
  bounds[1] = {BoundaryKind::constant_pressure, x0, y0 - 6000.0, 1.0, 0.0};
  const PressureField field({monthly_well(x0 + 4000, y0 - 2500, 0.02, 0, 24, 18, 1),
                             monthly_well(x0 + 1500, y0 - 4000, 0.01, 4, 20, 30, 2)},
                            bounds);
  const std::vector<double> times = {6 * kMonth, 20 * kMonth, 30 * kMonth};
  const PressureGrid fast = pressure_grid(g, field, p, times);
  const PressureGrid direct = pressure_grid_direct(g, field, p, times);
  std::size_t inside = 0, outside = 0;
  for (std::size_t k = 0; k < times.size(); ++k)
    for (std::size_t j = 0; j < g.ny; ++j)
      for (std::size_t i = 0; i < g.nx; ++i) {
        const bool in = g.centre_x(i) < x0 + 6000.0 && g.centre_y(j) > y0 - 6000.0;
        CAPTURE(i);
        CAPTURE(j);
        if (in) {
          ++inside;
          CHECK(std::abs(fast.at(k, i, j) - direct.at(k, i, j)) <= fast.error_bound);
        } else {
          ++outside;
          CHECK(std::isnan(fast.at(k, i, j)));
          CHECK(std::isnan(direct.at(k, i, j)));
        }
      }
  CHECK(inside > 0);
  CHECK(outside > 0);
  // Each boundary alone: next to the no-flow line Δp is raised by the image injector, next to
  // the constant-pressure line it is small (zero on it); compared with no boundary at all.
  const std::vector<WellSource> wells = field.wells();
  const PressureGrid free = pressure_grid(g, PressureField(wells), p, times);
  const PressureGrid sealed = pressure_grid(g, PressureField(wells, {bounds[0]}), p, times);
  const PressureGrid recharged = pressure_grid(g, PressureField(wells, {bounds[1]}), p, times);
  CHECK(sealed.at(1, 23, 10) > 1.2 * free.at(1, 23, 10));    // centre 125 m from the no-flow line
  CHECK(recharged.at(1, 10, 23) < 0.2 * free.at(1, 10, 23));  // 125 m from the constant-pressure line
}

TEST_CASE("explicit sources (images expanded by the caller) give the same map") {
  const GridGeometry g = small_grid();
  const TheisParameters p = formation();
  const double x0 = g.origin_x, y0 = g.origin_y;
  const std::vector<Boundary> bounds = {{BoundaryKind::constant_pressure, x0, y0 - 6000.0, 1.0, 0.0}};
  const PressureField field({monthly_well(x0 + 4000, y0 - 2500, 0.02, 0, 24, 18, 1)}, bounds);
  std::vector<GridSource> sources;
  for (const ImageSource& img : field.sources(0)) {
    GridSource s{img.x, img.y, field.wells()[0].history.start_times(), field.wells()[0].history.rates()};
    for (double& q : s.rate) q *= img.sign;
    sources.push_back(s);
  }
  const std::vector<double> times = {10 * kMonth, 22 * kMonth};
  const PressureGrid a = pressure_grid(g, field, p, times);
  const PressureGrid b = pressure_grid(g, GridFormation{p.pressure_per_rate, p.diffusivity, 0.1}, sources, times);
  CHECK(a.node_spacing == b.node_spacing);
  std::size_t compared = 0;
  for (std::size_t n = 0; n < a.values.size(); ++n)
    if (!std::isnan(a.values[n])) {
      ++compared;
      CHECK(std::abs(a.values[n] - b.values[n]) <= 1e-9 * std::abs(a.values[n]) + 1e-9);
    }
  CHECK(compared > 1000);
  GridSource bad = sources[0];
  bad.rate.pop_back();
  CHECK_THROWS_WITH_AS(pressure_grid(g, GridFormation{p.pressure_per_rate, p.diffusivity, 0.1},
                                     std::vector<GridSource>{bad}, times),
                       doctest::Contains("one per step start"), InputError);
}

TEST_CASE("fast path: results do not depend on the thread count or the table memory") {
  const GridGeometry g = small_grid();
  const TheisParameters p = formation();
  const PressureField field({monthly_well(g.origin_x + 3000, g.origin_y - 2000, 0.02, 0, 24, 20, 1),
                             monthly_well(g.origin_x + 7000, g.origin_y - 5000, 0.01, 2, 22, 30, 2)});
  const std::vector<double> times = {26 * kMonth, 6 * kMonth, 12 * kMonth};  // any order
  const int threads = omp_get_max_threads();
  omp_set_num_threads(1);
  const PressureGrid a = pressure_grid(g, field, p, times);
  omp_set_num_threads(std::max(2, threads));
  const PressureGrid b = pressure_grid(g, field, p, times);
  omp_set_num_threads(threads);
  CHECK(a.values == b.values);
  // Small table memory: one output time per block; same values within the bound.
  PressureGridOptions small;
  small.max_table_bytes = 1e6;
  const PressureGrid c = pressure_grid(g, field, p, times, {}, small);
  for (std::size_t n = 0; n < a.values.size(); ++n) CHECK(std::abs(c.values[n] - a.values[n]) <= 2 * a.error_bound);
  // Requested order is kept: map k is the direct sum at times[k].
  for (std::size_t k = 0; k < times.size(); ++k)
    CHECK(std::abs(a.at(k, 12, 8) - direct_at(field, p, g.centre_x(12), g.centre_y(8), times[k])) <= a.error_bound);
}

TEST_CASE("fast path with unaligned step times (a long union of steps)") {
  GridGeometry g = small_grid();
  g.nx = 12;
  g.ny = 10;
  const TheisParameters p = formation();
  std::vector<WellSource> wells;
  for (int w = 0; w < 3; ++w) {
    WellSource s = monthly_well(g.origin_x + 500 + 900 * w, g.origin_y - 700 - 400 * w, 0.01, 0, 110, 90, w + 1);
    std::vector<double> start = s.history.start_times();
    for (double& t : start) t += 86400.0 * (3 * w + 1);  // offsets of days: 330 distinct steps
    s.history = RateHistory(start, s.history.rates());
    wells.push_back(s);
  }
  const PressureField field(wells);
  const std::vector<double> times = {50 * kMonth, 100 * kMonth, 115 * kMonth};
  const PressureGrid fast = pressure_grid(g, field, p, times);
  const PressureGrid direct = pressure_grid_direct(g, field, p, times);
  for (std::size_t n = 0; n < fast.values.size(); ++n)
    CHECK(std::abs(fast.values[n] - direct.values[n]) <= fast.error_bound);
}

TEST_CASE("a source whose cut-off radius never reaches the raster is dropped within its share") {
  const GridGeometry g = small_grid();
  const TheisParameters p = formation();
  const WellSource near = monthly_well(g.origin_x + 3000, g.origin_y - 2000, 0.02, 0, 24, 30, 1);
  // 2000 km away: E1(r²/(4 D t)) underflows for 2 years at D = 1 m²/s.
  const WellSource far = monthly_well(g.origin_x + 2e6, g.origin_y, 0.05, 0, 24, 30, 2);
  const std::vector<double> times = {24 * kMonth};
  const PressureGrid one = pressure_grid(g, PressureField({near}), p, times);
  const PressureGrid both = pressure_grid(g, PressureField({near, far}), p, times);
  CHECK(both.node_spacing == one.node_spacing);  // the far source does not refine the nodes
  for (std::size_t n = 0; n < one.values.size(); ++n)
    CHECK(std::abs(both.values[n] - one.values[n]) <= one.error_bound);  // cut-off shares differ
  CHECK(direct_at(PressureField({far}), p, g.centre_x(0), g.centre_y(0), times[0]) == 0.0);
}

TEST_CASE("fourth-derivative constant of the error bound") {
  // I = ∫₀^∞ e^{−x} |x³ − 6x² + 7x − 1| dx by composite Simpson on [0, 60] (the tail beyond is
  // below 1e-20), as an independent check of the closed form used in the bound.
  const int n = 600000;
  const double a = 0.0, b = 60.0, step = (b - a) / n;
  auto f = [](double x) { return std::exp(-x) * std::abs(((x - 6) * x + 7) * x - 1); };
  double sum = f(a) + f(b);
  for (int i = 1; i < n; ++i) sum += (i % 2 ? 4.0 : 2.0) * f(a + i * step);
  CHECK(sum * step / 3 == doctest::Approx(kProfileFourthDerivativeIntegral).epsilon(1e-8));
}

TEST_CASE("no wells, or only zero rates, give a zero map") {
  const GridGeometry g = small_grid();
  const TheisParameters p = formation();
  const std::vector<double> times = {kMonth};
  const PressureGrid a = pressure_grid(g, PressureField({}), p, times);
  const PressureGrid b = pressure_grid(g, PressureField({constant_well(g.origin_x, g.origin_y, 0.0)}), p, times);
  CHECK(std::all_of(a.values.begin(), a.values.end(), [](double v) { return v == 0.0; }));
  CHECK(std::all_of(b.values.begin(), b.values.end(), [](double v) { return v == 0.0; }));
  CHECK(a.values.size() == g.nx * g.ny);
}

TEST_CASE("bad grid input is a clear InputError") {
  const PressureField field({constant_well(0.0, 0.0, 0.01)});
  const std::vector<double> t = {kMonth};
  auto bad = [&](auto edit, const char* needle) {
    GridGeometry g = small_grid();
    TheisParameters p = formation();
    std::vector<double> tt = t, factors;
    PressureGridOptions o;
    edit(g, p, tt, factors, o);
    CHECK_THROWS_WITH_AS(pressure_grid(g, field, p, tt, factors, o), doctest::Contains(needle), InputError);
  };
  using V = std::vector<double>;
  using O = PressureGridOptions;
  using P = TheisParameters;
  bad([](GridGeometry& g, P&, V&, V&, O&) { g.nx = 0; }, "at least 1x1");
  bad([](GridGeometry& g, P&, V&, V&, O&) { g.cell_x = -5; }, "cell_x");
  bad([](GridGeometry& g, P&, V&, V&, O&) { g.cell_y = 0; }, "cell_y");
  bad([](GridGeometry& g, P&, V&, V&, O&) { g.origin_x = std::nan(""); }, "origin_x");
  bad([](GridGeometry&, P& p, V&, V&, O&) { p.pressure_per_rate = 0; }, "pressure_per_rate");
  bad([](GridGeometry&, P& p, V&, V&, O&) { p.diffusivity = -1; }, "diffusivity");
  bad([](GridGeometry&, P&, V& tt, V&, O&) { tt = {std::nan("")}; }, "times[0]");
  bad([](GridGeometry&, P&, V&, V& f, O&) { f = {1.0, 2.0}; }, "one factor per well");
  bad([](GridGeometry&, P&, V&, V& f, O&) { f = {INFINITY}; }, "rate_factors[0]");
  bad([](GridGeometry&, P&, V&, V&, O& o) { o.threshold = 0; }, "threshold");
  bad([](GridGeometry&, P&, V&, V&, O& o) { o.relative_tolerance = 2; }, "relative_tolerance");
  bad([](GridGeometry&, P&, V&, V&, O& o) { o.max_table_bytes = 10; }, "max_table_bytes");
}

TEST_CASE("absurd rates are refused with a NumericalError before the tables are allocated") {
  // 1 bbl = 0.158987294928 m³ (common practice), so 1 bbl/d = 1.8401e-6 m³/s.
  const GridGeometry g = small_grid();
  const TheisParameters p = formation();
  const std::vector<double> times = {12 * kMonth, 24 * kMonth};
  for (double bbl_per_day : {1e25, 1e30, 1e40, 1e70, 1e300}) {
    CAPTURE(bbl_per_day);
    const double q = bbl_per_day * 0.158987294928 / 86400.0;
    const PressureField field({constant_well(g.origin_x + 5000, g.origin_y - 4000, q)});
    // Before the bound, 1e25 bbl/d asked for about 1e8 profile nodes per source (gigabytes per
    // thread) and 1e30 bbl/d exhausted the memory; the check comes before any table exists.
    CHECK_THROWS_WITH_AS(pressure_grid(g, field, p, times), doctest::Contains("profile nodes per source"),
                         NumericalError);
  }
  // A large but physical rate, 2e5 bbl/d (0.368 m³/s), still gives its map within the bound.
  const double q = 2e5 * 0.158987294928 / 86400.0;
  const PressureField field({constant_well(g.origin_x + 5000, g.origin_y - 4000, q)});
  const PressureGrid m = pressure_grid(g, field, p, times);
  CHECK(m.profile_nodes < 20000);
  CHECK(std::abs(m.at(1, 10, 10) - direct_at(field, p, g.centre_x(10), g.centre_y(10), times[1])) <= m.error_bound);
}

TEST_CASE("one output time's tables beyond max_table_bytes are refused, not allocated anyway") {
  const GridGeometry g = small_grid();
  std::vector<WellSource> wells;
  for (int w = 0; w < 200; ++w) wells.push_back(constant_well(g.origin_x + 40.0 * w, g.origin_y - 3000, 0.01));
  const PressureField field(wells);
  PressureGridOptions o;
  o.max_table_bytes = 1e6;  // 200 sources × a few hundred nodes × 16 bytes exceeds it
  CHECK_THROWS_WITH_AS(pressure_grid(g, field, formation(), std::vector<double>{12 * kMonth}, {}, o),
                       doctest::Contains("bytes of tables per output time"), NumericalError);
}
