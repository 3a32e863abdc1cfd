#include "formats/catalog/catalog_columns.hpp"

#include <doctest/doctest.h>

#include "core/errors.hpp"
#include "formats/catalog/catalog_csv.hpp"

using namespace slipscreen;

namespace {
const std::string kDir = std::string(SLIPSCREEN_TEST_DATA) + "/catalog/";

formats::CatalogTableLayout layout_of(const std::vector<std::string>& header, const formats::CatalogColumns& c = {}) {
  return formats::CatalogTableLayout(header, "(header)", c, formats::kCommonSpellings, "t.csv line 1");
}
}  // namespace

TEST_CASE("column mapping text") {
  const auto c = formats::parse_catalog_columns("id=event_id;time=origin_time;depth=depth_km;depth_unit=km");
  CHECK(c.time.name == "origin_time");
  CHECK(c.id.name == "event_id");
  CHECK(c.depth.named());
  CHECK_FALSE(c.magnitude.named());  // left to the common spellings
  CHECK(c.text == "id=event_id;time=origin_time;depth=depth_km;depth_unit=km");
  const auto p = formats::parse_catalog_columns("x=easting,y=northing,crs=EPSG:32614,magtype=-,magtype_default=ML");
  CHECK(p.x.name == "easting");
  CHECK(p.projected());
  CHECK(p.crs == "EPSG:32614");
  CHECK(p.magnitude_type.absent);
  CHECK(p.magnitude_type_default == "ML");
  CHECK_THROWS_WITH_AS(formats::parse_catalog_columns("tme=origin"), doctest::Contains("did you mean 'time'"), InputError);
  CHECK_THROWS_WITH_AS(formats::parse_catalog_columns("x=e;y=n"), doctest::Contains("crs"), InputError);
  CHECK_THROWS_AS(formats::parse_catalog_columns("x=e"), InputError);
  CHECK_THROWS_AS(formats::parse_catalog_columns("depth_unit=furlong"), InputError);
  CHECK_THROWS_WITH_AS(formats::parse_catalog_columns("mag=-"), doctest::Contains("cannot be absent"), InputError);
  CHECK(formats::CatalogColumns{}.text.empty());
}

TEST_CASE("common header spellings are found in any case, in any order") {
  const auto a = layout_of({"Time", "LATITUDE", "Long", "Depth", "Mag", "magType", "place", "Event_ID"});
  CHECK(a.columns_used() == "time=Time; lat=LATITUDE; lon=Long; depth=Depth (km); mag=Mag; magtype=magType; id=Event_ID");
  CHECK(a.notes().empty());
  const auto b = layout_of({"id", "time", "lat", "lon", "depth_km", "magnitude", "mag_type"});
  CHECK(b.columns_used() == "time=time; lat=lat; lon=lon; depth=depth_km (km); mag=magnitude; magtype=mag_type; id=id");
  // Optional columns missing: noted (depth) or simply absent (type, id).
  const auto c = layout_of({"time", "longitude", "latitude", "mag"});
  CHECK(c.columns_used() == "time=time; lat=latitude; lon=longitude; depth=-; mag=mag; magtype=-; id=-");
  REQUIRE(c.notes().size() == 1);
  CHECK(c.notes()[0].find("depths unknown") != std::string::npos);
  // A mapped column wins over a spelling elsewhere in the header.
  const auto d = layout_of({"time", "lat", "lon", "mag", "mw"}, formats::parse_catalog_columns("mag=mw"));
  CHECK(d.columns_used().find("mag=mw") != std::string::npos);
}

TEST_CASE("a missing or ambiguous column names the header and the mapping that fixes it") {
  CHECK_THROWS_WITH_AS(
      formats::read_catalog_csv(kDir + "no_magnitude_column.csv", formats::CatalogColumns{}),
      doctest::Contains("no_magnitude_column.csv line 2: field 'header' = 'id,time,lat,lon,depth,ml': expected a "
                        "magnitude column ('mag' or 'magnitude', in any case); name yours with --columns "
                        "'mag=COLUMN' (in a scenario: [catalog] columns = \"mag=COLUMN\")"),
      InputError);
  CHECK_THROWS_WITH_AS(formats::read_catalog_csv(kDir + "two_magnitude_columns.csv", formats::CatalogColumns{}),
                       doctest::Contains("expected one magnitude column, not both 'mag' and 'magnitude'; name yours "
                                         "with --columns 'mag=COLUMN'"),
                       InputError);
  // The mapping resolves the ambiguity.
  const auto r = formats::read_catalog_csv(kDir + "two_magnitude_columns.csv", formats::parse_catalog_columns("mag=magnitude"));
  REQUIRE(r.catalog.events.size() == 1);
  CHECK(r.catalog.events[0].magnitude == 1.3);
  // A column named twice under one spelling: the first wins (not ambiguous).
  CHECK(layout_of({"time", "lat", "lon", "mag", "mag"}).columns_used().find("mag=mag") != std::string::npos);
}

TEST_CASE("a row reads into an event; depth in km unless the mapping says otherwise") {
  const auto a = layout_of({"time", "lat", "lon", "depth", "mag"});
  seismo::Event e;
  REQUIRE_FALSE(a.read_event({"2024-01-03T00:00:00Z", "35.5", "-98.2", "4.1", "1.2"}, e));
  REQUIRE(e.depth);
  CHECK(*e.depth == doctest::Approx(4100.0).epsilon(1e-12));  // 4.1 km
  CHECK(e.y == 35.5);
  CHECK(e.x == -98.2);
  CHECK(e.magnitude_type.empty());
  const auto m = layout_of({"time", "lat", "lon", "depth", "mag"}, formats::parse_catalog_columns("depth_unit=m;magtype_default=ML"));
  REQUIRE_FALSE(m.read_event({"2024-01-03T00:00:00Z", "35.5", "-98.2", "4100", "1.2"}, e));
  CHECK(*e.depth == 4100.0);
  CHECK(e.magnitude_type == "ML");
  // Reasons name the header's own spelling.
  const auto why = a.read_event({"2024-01-03T00:00:00Z", "35.5", "-98.2", "4.1", "big"}, e);
  REQUIRE(why);
  CHECK(*why == "field 'mag' = 'big': expected a magnitude between -5 and 10.5");
  const auto short_row = a.read_event({"2024-01-03T00:00:00Z", "35.5"}, e);
  REQUIRE(short_row);
  CHECK(*short_row == "2 fields where the header has 5");
}

TEST_CASE("the common-spelling fixtures hold the events of the mapped fixture") {
  const auto mapped = formats::read_catalog_csv(kDir + "fixture_catalog.csv",
                                                formats::parse_catalog_columns("id=event_id;time=origin_time;depth=depth_km"));
  for (const char* f : {"spellings_short.csv", "spellings_mixed.csv"}) {
    CAPTURE(f);
    const auto r = formats::read_catalog_csv(kDir + f, formats::CatalogColumns{});
    CHECK(r.rejected.empty());
    REQUIRE(r.catalog.events.size() == mapped.catalog.events.size());
    for (std::size_t i = 0; i < r.catalog.events.size(); ++i) {
      const auto& x = r.catalog.events[i];
      const auto& y = mapped.catalog.events[i];
      CHECK(x.id == y.id);
      CHECK(x.time == y.time);
      CHECK(x.x == y.x);
      CHECK(x.y == y.y);
      CHECK(*x.depth == *y.depth);
      CHECK(x.magnitude == y.magnitude);
      CHECK(x.magnitude_type == y.magnitude_type);
    }
  }
}
