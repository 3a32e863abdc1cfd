#include "formats/gis/fault_table.hpp"

#include <algorithm>
#include <cmath>
#include <map>

#include "core/errors.hpp"
#include "core/util/trim.hpp"
#include "core/geometry/trace_segments.hpp"
#include "formats/table/csv.hpp"

namespace slipscreen::formats {

bool is_fault_table(const std::filesystem::path& path) {
  std::string ext = path.extension().string();
  std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return ext == ".csv";
}

namespace {

std::size_t need(const CsvTable& t, const std::string& name) {
  if (auto c = t.column(name)) return *c;
  throw InputError("column '" + name + "'", "(missing)", "a header column named '" + name + "'",
                   t.file + " line " + std::to_string(t.header_line));
}

double plain_number(const CsvTable& t, const CsvRow& row, std::size_t col) {
  try {
    return units::parse(row.fields[col], units::Dimension::dimensionless, split_header_unit(t.header[col]).name);
  } catch (const InputError& e) {
    throw e.located(t.where(row, col));
  }
}

}  // namespace

std::vector<FaultSegment> read_fault_table(const std::filesystem::path& path, const std::string& file,
                                           const Crs& working, const std::string& default_crs,
                                           double max_segment_length_m, int check_points, double max_depth_m) {
  const CsvTable t = read_csv(path, file);
  const bool lonlat = t.column("lon").has_value();
  const std::size_t c_id = need(t, "id"), c_x = need(t, lonlat ? "lon" : "x"), c_y = need(t, lonlat ? "lat" : "y");
  const std::size_t c_strike = need(t, "strike"), c_dip = need(t, "dip"), c_len = need(t, "length");
  const auto c_mu = t.column("friction");
  const auto c_top = t.column("top"), c_bottom = t.column("bottom");
  std::string crs = t.comment_value("crs").value_or(default_crs);
  if (crs.empty() && lonlat) crs = "EPSG:4326";
  if (crs.empty())
    throw InputError("crs", "(missing)", "a '# crs: EPSG:....' line before the header, or faults.crs in the region", file);
  const Transformer to_working = [&] {
    try {
      return Transformer(Crs::from_user_string(crs, "crs"), working);
    } catch (const InputError& e) {
      throw e.located(file);
    }
  }();

  std::vector<FaultSegment> out;
  std::map<std::string, std::size_t> seen;
  for (const auto& row : t.rows) {
    const std::string id = util::trim(row.fields[c_id]);
    if (id.empty()) throw InputError("id", "", "a fault id", t.where(row, c_id));
    if (const auto [first, fresh] = seen.emplace(id, row.line); !fresh)
      throw InputError("id", id, "a fault id not used before in the table (line " + std::to_string(first->second) +
                                     " has it)", t.where(row, c_id));
    geometry::Point2 centre{plain_number(t, row, c_x), plain_number(t, row, c_y)};
    try {
      centre = to_working(centre, "fault centre");
      if (std::abs(centre.x) > geometry::kMaxCoordinateM || std::abs(centre.y) > geometry::kMaxCoordinateM)
        throw InputError("fault centre", geometry::point_text(centre) + " in the working CRS",
                         "projected coordinates within 1e8 m of the origin (no place on Earth is farther)");
    } catch (const InputError& e) {
      throw e.located(t.where(row));
    }
    const double strike_true = cell_quantity(t, row, c_strike, units::Dimension::angle);
    const double dip = cell_quantity(t, row, c_dip, units::Dimension::angle);
    if (!(dip > 0 && dip <= 1.5707963267948966 + 1e-12))
      throw InputError("dip", util::trim(row.fields[c_dip]), "a dip in (0, 90] degrees", t.where(row, c_dip));
    const double length = cell_quantity(t, row, c_len, units::Dimension::length);
    if (!(length > 0 && length <= geometry::kMaxTraceLengthM))
      throw InputError("length", util::trim(row.fields[c_len]), "a fault length > 0 and at most 1000 km",
                       t.where(row, c_len));
    std::optional<double> mu;
    if (c_mu && !util::trim(row.fields[*c_mu]).empty()) {
      mu = plain_number(t, row, *c_mu);
      if (!(*mu > 0)) throw InputError("friction", util::trim(row.fields[*c_mu]), "a friction > 0", t.where(row, *c_mu));
    }
    // the fault's own depth range, lengths with their units (empty cells: the region's)
    const auto depth = [&](const std::optional<std::size_t>& c) -> std::optional<double> {
      if (!c || util::trim(row.fields[*c]).empty()) return std::nullopt;
      return cell_quantity(t, row, *c, units::Dimension::length);
    };
    const std::optional<double> top = depth(c_top), bottom = depth(c_bottom);
    try {
      check_fault_depth_range(top, bottom, "top", c_top ? util::trim(row.fields[*c_top]) : "", "bottom",
                              c_bottom ? util::trim(row.fields[*c_bottom]) : "", max_depth_m);
    } catch (const InputError& e) {
      throw e.located(t.where(row));
    }
    // The table's strike is a true azimuth; the map works in grid azimuths (+ convergence).
    std::vector<geometry::TraceSegment> pieces;
    double strike_grid = 0.0;
    try {
      strike_grid = strike_true + grid_convergence_rad(working, centre);
      const std::vector<geometry::Point2> trace = geometry::straight_trace(centre, strike_grid, length);
      if (out.size() + geometry::segment_count(trace, max_segment_length_m) > kMaxSegmentsPerMap)
        throw InputError("segments", "more than " + std::to_string(kMaxSegmentsPerMap) + " by this fault",
                         "at most " + std::to_string(kMaxSegmentsPerMap) +
                             " segments in a fault map (a longer segment_length gives fewer)");
      pieces = geometry::split_trace(trace, max_segment_length_m, check_points);
    } catch (const InputError& e) {
      throw e.located(t.where(row) + " (fault '" + id + "')");
    }
    for (auto& piece : pieces) {
      FaultSegment s;
      s.fault_id = id;
      s.index = piece.index;
      s.segment_id = id + ":" + std::to_string(piece.index);
      s.layer = "table";
      s.fid = static_cast<long long>(row.line);
      s.strike_rad = std::fmod(strike_grid + 2 * 3.14159265358979323846, 2 * 3.14159265358979323846);
      s.dip_rad = dip;
      s.friction = mu;
      s.top_m = top;
      s.bottom_m = bottom;
      s.trace = std::move(piece);
      out.push_back(std::move(s));
    }
  }
  if (out.empty()) throw InputError("rows", "(none)", "at least one fault", file);
  return out;
}

}  // namespace slipscreen::formats
