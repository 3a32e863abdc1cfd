#pragma once
// Shared checks of the report figures' tests: the figure source of a run folder, a figure's SVG
// as parsed XML, its data CSV by column name, and run tables read back plainly.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>
#include <pugixml.hpp>

#include "formats/table/csv.hpp"
#include "outputs/report/figure.hpp"

namespace slipscreen::test {

inline nlohmann::json read_json_file(const std::filesystem::path& p) {
  std::ifstream in(p);
  return nlohmann::json::parse(in);
}

inline outputs::report::ReportSource source_of(const std::filesystem::path& folder) {
  return {folder, read_json_file(folder / "manifest.json"), 5};
}

// A run table, every cell as text, by column name.
struct Rows {
  formats::CsvTable table;
  std::size_t size() const { return table.rows.size(); }
  const std::string& at(std::size_t row, const std::string& column) const {
    const auto c = table.column(column);
    REQUIRE_MESSAGE(c.has_value(), table.file << " has no column " << column);
    return table.rows[row].fields[*c];
  }
  double number(std::size_t row, const std::string& column) const { return std::stod(at(row, column)); }
};

inline Rows read_rows(const std::filesystem::path& folder, const std::string& file) {
  return {formats::read_csv(folder / file, file)};
}

// A figure's data CSV by column name.
struct FigureRows {
  const outputs::report::FigureData& data;
  std::size_t column(const std::string& name) const {
    for (std::size_t i = 0; i < data.header.size(); ++i)
      if (data.header[i] == name) return i;
    FAIL("figure data has no column " << name);
    return 0;
  }
  const std::string& at(std::size_t row, const std::string& name) const { return data.rows[row].at(column(name)); }
  double number(std::size_t row, const std::string& name) const { return std::stod(at(row, name)); }
  // Rows whose column `name` is `value`, in order.
  std::vector<std::size_t> where(const std::string& name, const std::string& value) const {
    std::vector<std::size_t> out;
    for (std::size_t i = 0; i < data.rows.size(); ++i)
      if (data.rows[i].at(column(name)) == value) out.push_back(i);
    return out;
  }
};

// Parses the figure's SVG (the test fails when it is not XML).
inline void parse_svg(const outputs::report::Figure& f, pugi::xml_document& doc) {
  const std::string svg = outputs::report::figure_svg(f);
  REQUIRE_MESSAGE(doc.load_string(svg.c_str()), f.name << ".svg is not XML");
  REQUIRE(doc.child("svg"));
}

// Paths drawn with the given fill (Cairo's SVG style text, e.g. "fill:rgb(0%,44.705882%,69.803922%)").
inline int paths_with(const pugi::xml_document& doc, const std::string& style_part) {
  int n = 0;
  for (auto p : doc.select_nodes("//path"))
    if (std::string(p.node().attribute("style").value()).find(style_part) != std::string::npos) ++n;
  return n;
}

// Writes every figure's SVG, PNG and CSV into $SLIPSCREEN_FIGURES_OUT when it is set (to look
// at them: SLIPSCREEN_FIGURES_OUT=/tmp/figs build/test_outputs -tc='*figures*').
inline void write_for_viewing(const std::vector<outputs::report::Figure>& figures) {
  const char* dir = std::getenv("SLIPSCREEN_FIGURES_OUT");
  if (!dir || !*dir) return;
  std::filesystem::create_directories(dir);
  for (const auto& f : figures) outputs::report::write_figure_files(f, dir);
}

}  // namespace slipscreen::test
