#include "formats/catalog/volume_history_csv.hpp"

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>

#include "core/errors.hpp"

using namespace slipscreen;

TEST_CASE("volume history CSV with units beside the values") {
  const auto h = formats::read_volume_history_csv(std::string(SLIPSCREEN_TEST_DATA) + "/catalog/volume_history.csv");
  REQUIRE(h.time.size() == 3);
  CHECK(h.time[0] == 1701388800.0);  // 2023-12-01T00:00:00Z, Python datetime
  CHECK(h.volume[2] == doctest::Approx(1.2e5).epsilon(1e-15));
  const auto p = std::filesystem::temp_directory_path() / "slipscreen_volume_bad.csv";
  {
    std::ofstream out(p);
    out << "time,cumulative_volume\n2024-01-01,0 m3\n2024-02-01,5e4 furlongs\n";
  }
  CHECK_THROWS_WITH_AS(formats::read_volume_history_csv(p.string()), doctest::Contains("line 3"), InputError);
  {
    std::ofstream out(p);
    out << "time,cumulative_volume\n2024-01-01,10 m3\n2024-02-01,5 m3\n";
  }
  CHECK_THROWS_WITH_AS(formats::read_volume_history_csv(p.string()), doctest::Contains("non-decreasing"), InputError);
  std::filesystem::remove(p);
}
