#pragma once
// A report figure (docs/report.md): what it is called, how it draws itself on any canvas, and the
// numbers behind it. One Figure becomes figures/<name>.svg, figures/<name>.png and
// figures/<name>.csv, is inlined as SVG in report.html and drawn on a page of report.pdf.
//
// A figure is built from the run folder's files only (run_table.hpp); it computes nothing the run
// did not write, so every number it shows can be checked against a table of the run.
#include <filesystem>
#include <functional>
#include <memory>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "formats/drawing/canvas.hpp"
#include "formats/gis/run_layers.hpp"
#include "outputs/report/plot.hpp"

namespace slipscreen::outputs::report {

class RunTable;
// The run files a report has read (figure.cpp), kept so that each is read once however many
// figures and tables use it.
struct RunFileCache;
std::shared_ptr<RunFileCache> new_run_file_cache();

// What every figure builder reads: the finished run folder and its manifest.
struct ReportSource {
  std::filesystem::path folder;  // the run folder (or its staging folder while a run finishes)
  nlohmann::json manifest;       // its manifest.json
  std::size_t top_segments = 5;  // how many segments the "top segments" figures show
  bool maps_each = false;        // an area map at each output time (area_map_<date>), else one at the last
  std::shared_ptr<RunFileCache> cache = new_run_file_cache();

  // The run's table `file` (RunTable::read), read once per report.
  const RunTable& table(const std::string& file) const;
  // Whether the GeoPackage `file` of the run holds `layer`, and that layer's features, read once.
  bool has_layer(const std::string& file, const std::string& layer) const;
  const std::vector<formats::LayerFeature>& layer(const std::string& file, const std::string& layer) const;
  // The last band (the last output time) of the run's raster `file`, read once.
  const formats::RasterBandData& last_band(const std::string& file) const;
};

// figures/<name>.csv: a header and rows of text fields, as they will be written.
struct FigureData {
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
};

struct Figure {
  std::string name;     // file stem, [a-z0-9_-]+ ("area_map", "area_map_2032-01-01")
  std::string title;    // plain text, for the report's caption and the HTML alt text
  std::string reading;  // one or two sentences: how to read it (plain text)
  double width = kFigureWidth, height = kFigureHeight;  // points
  // Draws the whole figure page (title, plot, legend, footer with the caution) on a canvas of
  // width × height points, from the top-left corner.
  std::function<void(formats::Canvas&)> draw;
  FigureData data;
};

// Writes figures/<name>.svg, .png and .csv into `figures_dir` (checked writes); returns the SVG
// written (figure_svg), for a caller that inlines it too.
std::string write_figure_files(const Figure& f, const std::filesystem::path& figures_dir);

// The figure as an SVG document (for inlining in HTML), its element ids renumbered as
// "<name>-1", "<name>-2", ... in order of appearance (renumber_svg_ids): the same figure gives the
// same bytes in any process, and figures inlined in one page keep their ids apart.
std::string figure_svg(const Figure& f);

// `svg` with every id (and its href="#..." and url(#...) references) renamed `prefix` + 1, 2, ...
std::string renumber_svg_ids(std::string_view svg, const std::string& prefix);

// The numbers of a figure as figures/<name>.csv holds them (RFC 4180, a header line).
std::string figure_csv(const Figure& f);

}  // namespace slipscreen::outputs::report
