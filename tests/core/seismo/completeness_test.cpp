#include "core/seismo/completeness.hpp"

#include <doctest/doctest.h>

#include <vector>

#include "core/errors.hpp"

using namespace slipscreen;
using namespace slipscreen::seismo;

namespace {
// A catalog built from a histogram: `counts[j]` events at magnitude m0 + j·dm.
std::vector<double> from_histogram(double m0, double dm, const std::vector<int>& counts) {
  std::vector<double> m;
  for (std::size_t j = 0; j < counts.size(); ++j)
    for (int k = 0; k < counts[j]; ++k) m.push_back(m0 + static_cast<double>(j) * dm);
  return m;
}
}  // namespace

TEST_CASE("maximum curvature picks the modal bin of a constructed FMD") {
  // Constructed histogram (Wiemer & Wyss 2000 definition: Mc = magnitude of the largest
  // non-cumulative count): rising incompletely to 1.3, then a Gutenberg-Richter fall-off.
  const auto m = from_histogram(0.8, 0.1, {2, 6, 15, 31, 44, 35, 28, 22, 17, 14, 11, 9, 7, 5, 4, 3, 2, 2, 1, 1});
  const auto c = maximum_curvature(m, 0.1);
  CHECK(c.mc_curvature == doctest::Approx(1.2).epsilon(1e-12));
  CHECK(c.mc == doctest::Approx(1.2).epsilon(1e-12));
  CHECK(c.modal_count == 44);
  CHECK(c.events == m.size());
  // The usual +0.2 correction (Woessner & Wiemer 2005) is an explicit option.
  const auto c2 = maximum_curvature(m, 0.1, 0.2);
  CHECK(c2.mc_curvature == doctest::Approx(1.2).epsilon(1e-12));
  CHECK(c2.mc == doctest::Approx(1.4).epsilon(1e-12));
  CHECK(c2.correction == 0.2);
}

TEST_CASE("ties keep the lowest magnitude; bin width matters") {
  const auto m = from_histogram(2.0, 0.1, {3, 9, 4, 9, 1});
  CHECK(maximum_curvature(m, 0.1).mc == doctest::Approx(2.1).epsilon(1e-12));
  // With 0.2 bins, half-bin values round up: 2.0 -> 2.0 (3), 2.1 and 2.2 -> 2.2 (9 + 4),
  // 2.3 and 2.4 -> 2.4 (9 + 1): counts 3, 13, 10 -> Mc = 2.2 (arithmetic).
  CHECK(maximum_curvature(m, 0.2).mc == doctest::Approx(2.2).epsilon(1e-12));
}

TEST_CASE("FMD bins include empty bins and round half-bin decimals up") {
  const std::vector<double> m = {1.0, 1.0, 1.3, 1.05, 1.0499999999};
  const auto bins = frequency_magnitude_distribution(m, 0.1);
  REQUIRE(bins.size() == 4);  // 1.0, 1.1, 1.2, 1.3
  CHECK(bins[0].count == 2);
  CHECK(bins[1].count == 2);  // 1.05 and its float neighbour
  CHECK(bins[2].count == 0);
  CHECK(bins[3].count == 1);
  CHECK(bin_centre(-0.05, 0.1) == doctest::Approx(-0.1).epsilon(1e-12));
}

TEST_CASE("empty catalogs and bad bin widths are input errors") {
  const std::vector<double> none;
  CHECK_THROWS_WITH_AS(maximum_curvature(none, 0.1), doctest::Contains("at least one event"), InputError);
  const std::vector<double> m = {1.0};
  CHECK_THROWS_AS(maximum_curvature(m, 0.0), InputError);
  CHECK_THROWS_AS(maximum_curvature(m, -0.1), InputError);
  CHECK(frequency_magnitude_distribution(none, 0.1).empty());
}
