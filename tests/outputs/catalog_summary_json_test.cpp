#include "outputs/catalog_summary_json.hpp"

#include <doctest/doctest.h>

using namespace slipscreen;

TEST_CASE("summary JSON of an empty catalog: nulls with notes, no NaN") {
  formats::CatalogReadResult read;
  read.path = "empty.csv";
  read.format = "csv";
  read.rejected.push_back({4, "field 'time' = 'x': expected ..."});
  const auto s = seismo::summarize_catalog(seismo::Catalog{}, seismo::SummaryOptions{});
  const auto j = outputs::catalog_summary_json(read, seismo::FilterCounts{}, s);
  CHECK(j["caution"].get<std::string>().find("Screening estimate") != std::string::npos);
  CHECK(j["completeness"]["mc"].is_null());
  CHECK(j["completeness"]["note"].get<std::string>().find("no events") != std::string::npos);
  CHECK(j["b_value"]["b"].is_null());
  CHECK(j["catalog"]["rejected_count"] == 1);
  CHECK(j["catalog"]["rejected"][0]["line"] == 4);
  const std::string text = j.dump();
  CHECK(text.find("NaN") == std::string::npos);
  CHECK(text.find("nan") == std::string::npos);
}
