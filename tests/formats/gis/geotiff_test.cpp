#include "formats/gis/geotiff.hpp"

#include <doctest/doctest.h>
#include <gdal_priv.h>
#include <ogr_spatialref.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <limits>
#include <string>

#include "core/errors.hpp"
#include "support/temp_dir.hpp"

using namespace slipscreen;

namespace {

// A 5 x 3 grid of 1 km cells in UTM 14N; value = 100·band + 10·row + column, one NaN cell.
struct Fixture {
  geometry::RasterGrid grid = geometry::grid_from_extent(630000, 3980000, 635000, 3983000, 1000);
  formats::Crs crs = formats::working_crs("EPSG:32614");
  std::vector<formats::RasterBand> bands;
  Fixture() {
    for (int b = 0; b < 2; ++b) {
      formats::RasterBand band{b == 0 ? "2030-01-01" : "2035-07-01", std::vector<float>(grid.cell_count())};
      for (int r = 0; r < grid.rows; ++r)
        for (int c = 0; c < grid.columns; ++c)
          band.values[grid.index(c, r)] = static_cast<float>(100 * b + 10 * r + c);
      bands.push_back(band);
    }
    bands[1].values[grid.index(4, 2)] = std::numeric_limits<float>::quiet_NaN();
  }
};

struct Closer {
  void operator()(GDALDataset* d) const { GDALClose(GDALDataset::ToHandle(d)); }
};
std::unique_ptr<GDALDataset, Closer> open_raster(const std::filesystem::path& p) {
  return std::unique_ptr<GDALDataset, Closer>(
      GDALDataset::Open(p.string().c_str(), GDAL_OF_RASTER | GDAL_OF_READONLY, nullptr, nullptr, nullptr));
}

float pixel(GDALDataset& ds, int band, int col, int row) {
  float v = 0;
  REQUIRE(ds.GetRasterBand(band)->RasterIO(GF_Read, col, row, 1, 1, &v, 1, 1, GDT_Float32, 0, 0, nullptr) == CE_None);
  return v;
}

void check_common(GDALDataset& ds, const Fixture& f) {
  CHECK(ds.GetRasterXSize() == 5);
  CHECK(ds.GetRasterYSize() == 3);
  REQUIRE(ds.GetRasterCount() == 2);
  double gt[6];
  REQUIRE(ds.GetGeoTransform(gt) == CE_None);
  // GDAL data model: pixel/line (P + 0.5, L + 0.5) is the centre of pixel (P, L);
  // Xgeo = gt0 + P·gt1 + L·gt2, Ygeo = gt3 + P·gt4 + L·gt5.
  const double cx = gt[0] + 0.5 * gt[1] + 0.5 * gt[2], cy = gt[3] + 0.5 * gt[4] + 0.5 * gt[5];
  CHECK(cx == 630500.0);  // centre of the north-west cell of the extent (plain geometry)
  CHECK(cy == 3982500.0);
  const double ex = gt[0] + 4.5 * gt[1] + 2.5 * gt[2], ey = gt[3] + 4.5 * gt[4] + 2.5 * gt[5];
  CHECK(ex == 634500.0);  // centre of the south-east cell
  CHECK(ey == 3980500.0);
  CHECK(f.grid.cell_centre(4, 2) == geometry::Point2{ex, ey});
  const OGRSpatialReference* srs = ds.GetSpatialRef();
  REQUIRE(srs != nullptr);
  CHECK(srs->IsSame(&f.crs.osr()));
  CHECK(std::string(srs->GetAuthorityCode(nullptr)) == "32614");
  CHECK(std::string(ds.GetRasterBand(1)->GetDescription()) == "2030-01-01");
  CHECK(std::string(ds.GetRasterBand(2)->GetDescription()) == "2035-07-01");
  int has_nodata = 0;
  CHECK(ds.GetRasterBand(1)->GetNoDataValue(&has_nodata) == -9999.0);
  CHECK(has_nodata == 1);
  CHECK(ds.GetRasterBand(1)->GetRasterDataType() == GDT_Float32);
  CHECK(std::string(ds.GetRasterBand(1)->GetUnitType()) == "Pa");
  CHECK(pixel(ds, 1, 0, 0) == 0.0f);
  CHECK(pixel(ds, 1, 3, 2) == 23.0f);   // row 2 = southern row
  CHECK(pixel(ds, 2, 1, 1) == 111.0f);
  CHECK(pixel(ds, 2, 4, 2) == -9999.0f);  // NaN written as nodata
  const char* compression = ds.GetMetadataItem("COMPRESSION", "IMAGE_STRUCTURE");
  REQUIRE(compression != nullptr);
  CHECK(std::string(compression) == "DEFLATE");
  const char* caution = ds.GetMetadataItem("CAUTION");
  REQUIRE(caution != nullptr);
  CHECK(std::string(caution) == "screening estimate");
}

}  // namespace

TEST_CASE("plain GeoTIFF reads back with its georeferencing, bands and compression") {
  const Fixture f;
  test::TempDir dir("tif");
  const auto path = dir / "dp.tif";
  formats::write_geotiff(path, f.grid, f.crs, f.bands, {.unit = "Pa", .metadata = {{"CAUTION", "screening estimate"}}});
  auto ds = open_raster(path);
  REQUIRE(ds);
  check_common(*ds, f);
  const char* predictor = ds->GetMetadataItem("PREDICTOR", "IMAGE_STRUCTURE");
  REQUIRE(predictor != nullptr);
  CHECK(std::string(predictor) == "3");  // floating-point predictor
  int bx = 0, by = 0;
  ds->GetRasterBand(1)->GetBlockSize(&bx, &by);
  CHECK(bx == 256);  // tiled
  CHECK(by == 256);
  CHECK(ds->GetMetadataItem("LAYOUT", "IMAGE_STRUCTURE") == nullptr);
}

TEST_CASE("Cloud-Optimized variant reports LAYOUT=COG") {
  const Fixture f;
  test::TempDir dir("cog");
  const auto path = dir / "dp_cog.tif";
  formats::write_geotiff(path, f.grid, f.crs, f.bands,
                    {.cloud_optimized = true, .unit = "Pa", .metadata = {{"CAUTION", "screening estimate"}}});
  auto ds = open_raster(path);
  REQUIRE(ds);
  check_common(*ds, f);
  const char* layout = ds->GetMetadataItem("LAYOUT", "IMAGE_STRUCTURE");
  REQUIRE(layout != nullptr);
  CHECK(std::string(layout) == "COG");
}

TEST_CASE("rerunning gives byte-identical GeoTIFFs") {
  const Fixture f;
  test::TempDir dir("tif-repro");
  for (bool cog : {false, true}) {
    CAPTURE(cog);
    formats::GeoTiffOptions o;
    o.cloud_optimized = cog;
    formats::write_geotiff(dir / "a.tif", f.grid, f.crs, f.bands, o);
    formats::write_geotiff(dir / "b.tif", f.grid, f.crs, f.bands, o);
    std::ifstream a(dir / "a.tif", std::ios::binary), b(dir / "b.tif", std::ios::binary);
    const std::string sa(std::istreambuf_iterator<char>(a), {}), sb(std::istreambuf_iterator<char>(b), {});
    CHECK(sa.size() > 100);
    CHECK(sa == sb);
  }
}

TEST_CASE("GeoTIFF input errors") {
  const Fixture f;
  test::TempDir dir("tif-bad");
  auto bands = f.bands;
  bands[1].values.pop_back();
  CHECK_THROWS_WITH_AS(formats::write_geotiff(dir / "x.tif", f.grid, f.crs, bands),
                       doctest::Contains("2035-07-01"), InputError);
  CHECK_THROWS_AS(formats::write_geotiff(dir / "x.tif", f.grid, f.crs, {}), InputError);
  CHECK_THROWS_WITH_AS(formats::write_geotiff(dir / "no-such-folder" / "x.tif", f.grid, f.crs, f.bands),
                       doctest::Contains("no-such-folder"), IoError);
}

TEST_CASE("every band is gray index with its statistics stored, equal to GDAL's ComputeStatistics") {
  const Fixture f;
  test::TempDir dir("tif-stats");
  for (bool cog : {false, true}) {
    CAPTURE(cog);
    const auto path = dir / (cog ? "cog.tif" : "plain.tif");
    formats::GeoTiffOptions o;
    o.cloud_optimized = cog;
    formats::write_geotiff(path, f.grid, f.crs, f.bands, o);
    // TIFF says gray for band 1 only; GDAL keeps band 2's in its sidecar (geotiff.hpp).
    CHECK(std::filesystem::exists(formats::band_sidecar(path)));
    auto ds = open_raster(path);
    REQUIRE(ds);
    for (int b = 1; b <= 2; ++b) {
      CAPTURE(b);
      GDALRasterBand* band = ds->GetRasterBand(b);
      CHECK(band->GetColorInterpretation() == GCI_GrayIndex);
      const auto stored = [&](const char* key) {
        const char* v = band->GetMetadataItem(key);
        REQUIRE(v != nullptr);
        return std::stod(v);
      };
      const double mn = stored("STATISTICS_MINIMUM"), mx = stored("STATISTICS_MAXIMUM"),
                   mean = stored("STATISTICS_MEAN"), sd = stored("STATISTICS_STDDEV");
      // Reference: GDAL's own exact statistics of the band as read back from the file.
      double rmn = 0, rmx = 0, rmean = 0, rsd = 0;
      REQUIRE(band->ComputeStatistics(FALSE, &rmn, &rmx, &rmean, &rsd, nullptr, nullptr) == CE_None);
      // Stored as text with 14 significant digits (GDAL): equal within 1e-12 of the value.
      CHECK(std::abs(mn - rmn) <= 1e-12 * std::max(1.0, std::abs(rmn)));
      CHECK(std::abs(mx - rmx) <= 1e-12 * std::max(1.0, std::abs(rmx)));
      CHECK(std::abs(mean - rmean) <= 1e-12 * std::max(1.0, std::abs(rmean)));
      CHECK(std::abs(sd - rsd) <= 1e-12 * std::max(1.0, std::abs(rsd)));
      // And by hand: band 1 holds 10 r + c (r 0..2, c 0..4): 0..24, mean 12; band 2 holds
      // 100 + 10 r + c without the nodata cell (r 2, c 4, 124): 100..123, mean (1680 − 124) / 14.
      CHECK(mn == (b == 1 ? 0.0 : 100.0));
      CHECK(mx == (b == 1 ? 24.0 : 123.0));
      CHECK(std::abs(mean - (b == 1 ? 12.0 : (1680.0 - 124.0) / 14)) < 1e-9);
    }
  }
}

TEST_CASE("a band without a valid cell is written without statistics") {
  Fixture f;
  f.bands.resize(1);
  std::fill(f.bands[0].values.begin(), f.bands[0].values.end(), std::numeric_limits<float>::quiet_NaN());
  test::TempDir dir("tif-empty");
  formats::write_geotiff(dir / "empty.tif", f.grid, f.crs, f.bands);
  CHECK_FALSE(std::filesystem::exists(formats::band_sidecar(dir / "empty.tif")));  // one band: TIFF says gray
  auto ds = open_raster(dir / "empty.tif");
  REQUIRE(ds);
  CHECK(ds->GetRasterBand(1)->GetColorInterpretation() == GCI_GrayIndex);
  CHECK(ds->GetRasterBand(1)->GetMetadataItem("STATISTICS_MEAN") == nullptr);
}
