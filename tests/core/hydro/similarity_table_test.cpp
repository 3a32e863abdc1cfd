#include "core/hydro/similarity_table.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <thread>
#include <vector>

#include "core/errors.hpp"
#include "support/thread_exchange.hpp"

using namespace slipscreen::hydro;

namespace {
constexpr double kDay = 86400.0;

// Fictional history: 3 years of monthly-varying rates with a 4-month shut-in.
RateSteps test_history() {
  RateSteps s;
  double q_prev = 0.0;
  for (int m = 0; m < 36; ++m) {
    const double q = (m >= 20 && m < 24) ? 0.0 : 0.02 + 0.01 * std::sin(0.7 * m);
    s.time.push_back(m * 30.0 * kDay);
    s.delta_rate.push_back(q - q_prev);
    q_prev = q;
  }
  return s;
}
}  // namespace

TEST_CASE("similarity table matches direct superposition") {
  const RateSteps steps = test_history();
  std::vector<double> times;
  for (int k = 1; k <= 48; ++k) times.push_back(k * 30.0 * kDay + 0.5 * kDay);
  // x = r²/(4D) from r = 0.1 m, D = 1 m²/s up to r = 30 km, D = 0.05 m²/s.
  const double x_lo = 0.01 / 4.0, x_hi = 9e8 / 0.2;
  const SimilarityTable table(steps, times, SimilarityGrid{std::log(x_lo), std::log(x_hi), 0.05});
  // Error at each tracking time relative to that time's largest |H| over the x sweep.
  std::vector<double> peak(times.size(), 0.0), err(times.size(), 0.0);
  for (double x = x_lo; x < x_hi; x *= 1.37) {
    const auto tap = table.tap(x);
    for (std::size_t k = 0; k < times.size(); ++k) {
      const double exact = SimilarityTable::direct(steps, x, times[k]);
      peak[k] = std::max(peak[k], std::abs(exact));
      const double u_min = x / (times[k] - steps.time.front());
      if (u_min > 10.0) continue;  // stated accuracy domain: u <= 10 for the earliest step
      err[k] = std::max(err[k], std::abs(table.value(tap, k) - exact));
    }
  }
  double worst = 0.0;
  for (std::size_t k = 0; k < times.size(); ++k) worst = std::max(worst, err[k] / peak[k]);
  // The header states 1e-6 of max_x |H(x, t_k)| for u <= 10 (cubic interpolation plus float storage).
  MESSAGE("similarity table worst relative error: " << worst);
  CHECK(worst < 1e-6);
}

TEST_CASE("similarity table: before the first step and past the underflow limit it is zero") {
  const RateSteps steps = test_history();
  const std::vector<double> times = {-kDay, 10 * kDay};
  const SimilarityTable table(steps, times, SimilarityGrid{std::log(1e-3), std::log(1e9), 0.05});
  const auto near = table.tap(1.0);
  CHECK(table.value(near, 0) == 0.0);
  CHECK(table.value(near, 1) > 0.0);
  const auto far = table.tap(1e30);
  CHECK(table.value(far, 1) == 0.0);
}

TEST_CASE("similarity table rejects bad input") {
  const RateSteps steps = test_history();
  const std::vector<double> unsorted = {2.0, 1.0};
  CHECK_THROWS_AS(SimilarityTable(steps, unsorted, SimilarityGrid{0.0, 1.0, 0.05}), slipscreen::InputError);
  CHECK_THROWS_AS(SimilarityTable(steps, std::vector<double>{}, SimilarityGrid{0.0, 1.0, 0.05}), slipscreen::InputError);
  const std::vector<double> t = {1.0};
  CHECK_THROWS_AS(SimilarityTable(steps, t, SimilarityGrid{1.0, 0.0, 0.05}), slipscreen::InputError);
}

TEST_CASE("rates beyond the table's single precision are a NumericalError, never inf") {
  // 1e70 bbl/d is 1.84e65 m³/s: H = Δq E1 is far beyond float's 3.4e38 (IEEE 754 binary32).
  RateSteps steps;
  steps.time = {0.0};
  steps.delta_rate = {1.84e65};
  const std::vector<double> times = {10 * kDay, 20 * kDay};
  const SimilarityGrid grid{std::log(1e-3), std::log(1e9), 0.05};
  CHECK_THROWS_WITH_AS(SimilarityTable(steps, times, grid), doctest::Contains("single-precision range"),
                       slipscreen::NumericalError);
  CHECK_THROWS_WITH_AS(build_tables({test_history(), steps}, times, grid), doctest::Contains("single-precision range"),
                       slipscreen::NumericalError);  // the lattice build, inside its OpenMP region
  // 1e25 bbl/d (1.84e20 m³/s) still fits, and the table keeps its relative accuracy.
  steps.delta_rate = {1.84e20};
  const SimilarityTable big(steps, times, grid);
  const double x = 1e4;
  const double exact = SimilarityTable::direct(steps, x, times[1]);
  CHECK(std::abs(big.value(big.tap(x), 1) - exact) <= 1e-6 * big.scale(1));
  steps.delta_rate = {INFINITY};
  CHECK_THROWS_WITH_AS(SimilarityTable(steps, times, grid), doctest::Contains("rate step 1"), slipscreen::InputError);
}

TEST_CASE("lattice build over whole days equals the direct build") {
  const RateSteps steps = test_history();  // steps every 30 days: whole days
  std::vector<double> times;
  for (int k = 1; k <= 40; ++k) times.push_back(k * 31.0 * kDay);
  const SimilarityGrid grid{std::log(1e-3), std::log(1e9), 0.05};
  const SimilarityTable direct(steps, times, grid);
  const auto lattice = build_tables({steps}, times, grid);
  REQUIRE(lattice.size() == 1);
  double worst = 0.0;
  for (double x = 1e-3; x < 1e9; x *= 2.3) {
    const auto a = direct.tap(x), b = lattice[0].tap(x);
    for (std::size_t k = 0; k < times.size(); ++k)
      worst = std::max(worst, std::abs(direct.value(a, k) - lattice[0].value(b, k)));
  }
  // Same sums in a different order, E1 rounded to float in the kernel: ~1e-7 of the rate scale.
  CHECK(worst < 1e-7 * 0.03 * 40);
}

TEST_CASE("similarity table: interpolation from one time's nodes equals the table's value") {
  const RateSteps steps = test_history();
  std::vector<double> times;
  for (int k = 1; k <= 12; ++k) times.push_back(k * 90.0 * kDay);
  const SimilarityTable table(steps, times, SimilarityGrid{std::log(1e-3), std::log(1e9), 0.05});
  for (std::size_t k = 0; k < times.size(); ++k) {
    const std::vector<float> nodes = table.nodes_at(k);
    REQUIRE(nodes.size() == table.node_count());
    for (double x = 1e-4; x < 1e10; x *= 3.7) {
      const auto tap = table.tap(x);
      CHECK(SimilarityTable::value_from_nodes(tap, nodes.data()) == table.value(tap, k));  // same sum
    }
  }
}

TEST_CASE("leaky similarity table matches the direct leaky sum (Hantush & Jacob 1955)") {
  // A shorter fictional history than above (the leaky function costs far more than E1).
  RateSteps steps;
  steps.time = {0.0, 200 * kDay, 400 * kDay};
  steps.delta_rate = {0.02, 0.01, -0.03};
  const std::vector<double> times = {100 * kDay, 300 * kDay, 700 * kDay};
  // c_L = D/B² for D = 0.5 m²/s, B = 3 km: r/B = 2√(c_L x) reaches ~7 at the far end.
  const double leak = 0.5 / 9e6;
  const double x_lo = 0.01 / 2.0, x_hi = 2e8;
  const SimilarityTable table(steps, times, SimilarityGrid{std::log(x_lo), std::log(x_hi), 0.05, leak});
  std::vector<double> peak(times.size(), 0.0), err(times.size(), 0.0);
  double theis_gap = 0.0;
  for (double x = x_lo; x < x_hi; x *= 1.9) {
    const auto tap = table.tap(x);
    for (std::size_t k = 0; k < times.size(); ++k) {
      const double exact = SimilarityTable::direct(steps, x, times[k], leak);
      peak[k] = std::max(peak[k], std::abs(exact));
      if (x / times[k] > 10.0) continue;  // the stated domain, as above
      err[k] = std::max(err[k], std::abs(table.value(tap, k) - exact));
      theis_gap = std::max(theis_gap, std::abs(SimilarityTable::direct(steps, x, times[k]) - exact));
    }
  }
  double worst = 0.0;
  for (std::size_t k = 0; k < times.size(); ++k) worst = std::max(worst, err[k] / peak[k]);
  MESSAGE("leaky similarity table worst relative error: " << worst);
  CHECK(worst < 1e-6);
  CHECK(theis_gap > 1e-3);  // the leakage matters here (m³/s units of H): the check is not Theis's

  // The lattice build (whole days, as in runs) holds the same leaky values.
  RateSteps days;
  days.time = {0.0, 10 * kDay, 25 * kDay};
  days.delta_rate = {0.02, 0.01, -0.03};
  const std::vector<double> day_times = {5 * kDay, 20 * kDay, 40 * kDay};
  const SimilarityGrid g{std::log(x_lo), std::log(1e7), 0.05, leak};
  const LagKernel kernel(g, kDay, 40);
  const SimilarityTable lattice(days, day_times, g, kernel), direct_build(days, day_times, g);
  for (std::size_t i = 0; i < g.node_count(); i += 7)
    for (std::size_t k = 0; k < day_times.size(); ++k)
      CHECK(lattice.nodes_at(k)[i] == doctest::Approx(direct_build.nodes_at(k)[i]).epsilon(1e-6));
}

TEST_CASE("tables built by parts and exchanged equal the tables of one process, bit for bit") {
  // Five fictional wells (the test history, scaled and shifted by whole months), Theis and leaky.
  std::vector<RateSteps> steps;
  for (int w = 0; w < 5; ++w) {
    RateSteps s = test_history();
    for (auto& t : s.time) t += w * 30.0 * kDay;
    for (auto& q : s.delta_rate) q *= 1.0 + 0.3 * w;
    steps.push_back(s);
  }
  for (double leakage : {0.0, 1e-8}) {
    CAPTURE(leakage);
    // 50 monthly times, 16 when leaky: its lag kernel costs about 3000 E1 per whole-day lag and
    // node (screening/run_cost.hpp), and each part builds it.
    std::vector<double> times;
    for (int k = 1; k <= (leakage > 0.0 ? 16 : 50); ++k) times.push_back(k * 30.0 * kDay);
    const SimilarityGrid grid{std::log(1e-3), std::log(1e8), 0.05, leakage};
    const auto whole = build_tables(steps, times, grid);
    for (std::size_t parts : {2u, 3u}) {
      CAPTURE(parts);
      slipscreen::threads::Exchange exchange(parts);
      std::vector<std::vector<SimilarityTable>> got(parts);
      std::vector<std::thread> threads;
      for (std::size_t p = 0; p < parts; ++p)
        threads.emplace_back([&, p] {
          slipscreen::util::WorkShare share{p, parts, [&, p](std::vector<std::uint8_t> b) { return exchange.all(p, std::move(b)); }};
          got[p] = build_tables(steps, times, grid, &share);
        });
      for (auto& t : threads) t.join();
      for (std::size_t p = 0; p < parts; ++p)
        for (std::size_t w = 0; w < steps.size(); ++w) {
          CHECK(got[p][w].raw_values() == whole[w].raw_values());
          CHECK(got[p][w].node_count() == whole[w].node_count());
          CHECK(got[p][w].scale(7) == whole[w].scale(7));
        }
    }
  }
}

TEST_CASE("tables built by blocks of wells equal the tables built at once, shared or not") {
  // Four fictional wells, the last starting 200 days after the others: the lag kernel spans every
  // well's steps whichever block is built, so each block's tables are the whole build's.
  std::vector<RateSteps> steps;
  for (int w = 0; w < 4; ++w) {
    RateSteps s = test_history();
    for (auto& t : s.time) t += (w == 3 ? 200.0 : w * 30.0) * kDay;
    steps.push_back(s);
  }
  std::vector<double> times;
  for (int k = 1; k <= 50; ++k) times.push_back(k * 30.0 * kDay);
  const SimilarityGrid grid{std::log(1e-3), std::log(1e8), 0.05};
  const auto whole = build_tables(steps, times, grid);
  const TableBuilder builder(steps, times, grid);
  CHECK(builder.table_bytes() == static_cast<double>(grid.node_count() * times.size() * sizeof(float)));
  // Budgets: one table per block (also below one table's size), two, and all of them.
  const std::vector<std::pair<double, std::size_t>> budgets = {
      {1.0, 1}, {2.5 * builder.table_bytes(), 2}, {1e12, 4}};
  for (const auto& [budget, per_block] : budgets) {
    CAPTURE(budget);
    const auto blocks = builder.blocks(budget);
    std::size_t next = 0;
    for (const auto& [first, end] : blocks) {
      CHECK(first == next);
      CHECK(end - first <= per_block);
      next = end;
      const auto got = builder.build(first, end);
      REQUIRE(got.size() == end - first);
      for (std::size_t w = first; w < end; ++w) CHECK(got[w - first].raw_values() == whole[w].raw_values());
    }
    CHECK(next == steps.size());
    CHECK(blocks.size() == (steps.size() + per_block - 1) / per_block);
  }
  // A block built by two processes and exchanged.
  slipscreen::threads::Exchange exchange(2);
  std::vector<std::vector<SimilarityTable>> got(2);
  std::vector<std::thread> threads;
  for (std::size_t p = 0; p < 2; ++p)
    threads.emplace_back([&, p] {
      slipscreen::util::WorkShare share{p, 2, [&, p](std::vector<std::uint8_t> b) { return exchange.all(p, std::move(b)); }};
      got[p] = builder.build(1, 4, &share);
    });
  for (auto& t : threads) t.join();
  for (std::size_t p = 0; p < 2; ++p)
    for (std::size_t w = 1; w < 4; ++w) CHECK(got[p][w - 1].raw_values() == whole[w].raw_values());
  CHECK_THROWS_AS(builder.build(3, 5), slipscreen::InputError);
}

TEST_CASE("tables at a subset of the tracking times equal those columns of the whole tables") {
  // Two fictional wells; the subsets of a process sharing a screen by time (every second or
  // third time), for the lattice build, the direct build (a time off the day lattice) and the
  // leaky well function.
  std::vector<RateSteps> steps{test_history(), test_history()};
  for (auto& t : steps[1].time) t += 45.0 * kDay;
  for (bool lattice : {true, false})
    for (double leakage : {0.0, 1e-8}) {
      CAPTURE(lattice);
      CAPTURE(leakage);
      // 40 monthly times, 20 when leaky (the leaky well function's cost, as above).
      const int n = leakage > 0.0 ? 20 : 40;
      std::vector<double> times;
      for (int k = 1; k <= n; ++k) times.push_back(k * 30.0 * kDay + (lattice || k != 7 ? 0.0 : 0.5 * kDay));
      const SimilarityGrid grid{std::log(1e-3), std::log(1e8), 0.05, leakage};
      const auto whole = build_tables(steps, times, grid);
      const std::size_t last = static_cast<std::size_t>(n) - 1;
      for (const std::vector<std::size_t>& own : {std::vector<std::size_t>{1, 3, 5, last}, {0, 3, 6, 9, 12, 15, 18}}) {
        const auto part = TableBuilder(steps, times, grid, own).build(0, steps.size());
        for (std::size_t w = 0; w < steps.size(); ++w) {
          REQUIRE(part[w].time_count() == own.size());
          for (std::size_t k = 0; k < own.size(); ++k) {
            CHECK(part[w].nodes_at(k) == whole[w].nodes_at(own[k]));
            CHECK(part[w].scale(k) == whole[w].scale(own[k]));
          }
        }
      }
    }
  const std::vector<double> times{30.0 * kDay, 60.0 * kDay};
  const SimilarityGrid grid{std::log(1e-3), std::log(1e8), 0.05};
  for (const std::vector<std::size_t>& bad : {std::vector<std::size_t>{2}, {1, 0}, {1, 1}})
    CHECK_THROWS_AS(TableBuilder(steps, times, grid, bad), slipscreen::InputError);
}
