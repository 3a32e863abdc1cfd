#include "outputs/report/figure.hpp"

#include <map>
#include <mutex>
#include <sstream>
#include <string_view>

#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs::report {

struct RunFileCache {
  std::mutex mutex;
  std::map<std::string, RunTable> tables;
  std::map<std::pair<std::string, std::string>, std::vector<formats::LayerFeature>> layers;
  std::map<std::pair<std::string, std::string>, bool> has_layers;
  std::map<std::string, formats::RasterBandData> last_bands;
};

std::shared_ptr<RunFileCache> new_run_file_cache() { return std::make_shared<RunFileCache>(); }

namespace {

// The cached value of `key` in `map`, read by `read()` on first use. The read runs outside the
// lock, so builders on other threads read other files meanwhile; when two read the same file at
// once, the first value stored is kept (both are the same file's).
template <class Map, class Key, class Read>
const typename Map::mapped_type& cached(std::mutex& mutex, Map& map, const Key& key, Read&& read) {
  {
    std::lock_guard lock(mutex);
    if (const auto it = map.find(key); it != map.end()) return it->second;
  }
  auto value = read();
  std::lock_guard lock(mutex);
  return map.emplace(key, std::move(value)).first->second;
}

}  // namespace

const RunTable& ReportSource::table(const std::string& file) const {
  return cached(cache->mutex, cache->tables, file, [&] { return RunTable::read(folder, file); });
}

bool ReportSource::has_layer(const std::string& file, const std::string& layer) const {
  return cached(cache->mutex, cache->has_layers, std::pair{file, layer},
                [&] { return formats::has_layer(folder / file, layer); });
}

const std::vector<formats::LayerFeature>& ReportSource::layer(const std::string& file, const std::string& layer) const {
  return cached(cache->mutex, cache->layers, std::pair{file, layer}, [&] { return formats::read_layer(folder / file, layer); });
}

const formats::RasterBandData& ReportSource::last_band(const std::string& file) const {
  return cached(cache->mutex, cache->last_bands, file, [&] { return formats::read_raster_band(folder / file, 0); });
}

std::string renumber_svg_ids(std::string_view svg, const std::string& prefix) {
  // Cairo numbers glyphs, clips, images and surfaces with counters that can run across the
  // drawings of one process, so the same figure could come out with other ids; ids are given again
  // in order of first appearance, which also keeps several figures apart in one HTML page.
  std::map<std::string, std::string, std::less<>> ids;
  const auto renamed = [&](std::string_view id) -> const std::string& {
    auto it = ids.find(id);
    if (it == ids.end()) it = ids.emplace(std::string(id), prefix + std::to_string(ids.size() + 1)).first;
    return it->second;
  };
  std::string out;
  out.reserve(svg.size() + svg.size() / 16);
  static constexpr std::string_view kOpeners[] = {" id=\"", "href=\"#", "url(#"};
  std::size_t i = 0;
  std::size_t next[3] = {0, 0, 0};  // where each opener is next found at or after i (searched once each)
  for (std::size_t k = 0; k < 3; ++k) next[k] = svg.find(kOpeners[k]);
  while (i < svg.size()) {
    std::size_t best = std::string_view::npos, which = 0;
    for (std::size_t k = 0; k < 3; ++k) {
      if (next[k] != std::string_view::npos && next[k] < i) next[k] = svg.find(kOpeners[k], i);
      if (next[k] < best) best = next[k], which = k;
    }
    if (best == std::string_view::npos) {
      out.append(svg.substr(i));
      break;
    }
    const std::size_t start = best + kOpeners[which].size();
    const std::size_t end = svg.find_first_of(which == 2 ? ")" : "\"", start);
    if (end == std::string_view::npos) {
      out.append(svg.substr(i));
      break;
    }
    out.append(svg.substr(i, start - i));
    out += renamed(svg.substr(start, end - start));
    i = end;
  }
  return out;
}

std::string figure_svg(const Figure& f) {
  formats::Canvas c(formats::DrawingFormat::svg, f.width, f.height);
  f.draw(c);
  return renumber_svg_ids(c.finish(), f.name + "-");
}

std::string write_figure_files(const Figure& f, const std::filesystem::path& dir) {
  std::string svg = figure_svg(f);
  formats::write_text_file(dir / (f.name + ".svg"), svg);
  {
    formats::Canvas png(formats::DrawingFormat::png, f.width, f.height, 150.0);
    f.draw(png);
    png.save(dir / (f.name + ".png"));
  }
  formats::write_text_file(dir / (f.name + ".csv"), figure_csv(f));
  return svg;
}

std::string figure_csv(const Figure& f) {
  std::ostringstream csv;
  for (std::size_t i = 0; i < f.data.header.size(); ++i) csv << (i ? "," : "") << formats::csv_field(f.data.header[i]);
  csv << '\n';
  for (const auto& row : f.data.rows) {
    for (std::size_t i = 0; i < row.size(); ++i) csv << (i ? "," : "") << formats::csv_field(row[i]);
    csv << '\n';
  }
  return csv.str();
}

}  // namespace slipscreen::outputs::report
