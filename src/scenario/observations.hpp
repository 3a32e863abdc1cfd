#pragma once
// The scenario's [observations] table and its pressure observations file
// (docs/conditioning.md): observed pore-pressure changes the probabilistic screen is
// conditioned on.
//
// pressure_observations.csv: a "# crs: ..." comment line before the header (or the wells' CRS),
// then columns id, x, y (or lon, lat), date (YYYY-MM-DD), and either dp (the observed pressure
// change) or p and depth (an absolute pressure at a depth below the surface; Δp = p − p0 with
// p0 = the region's pore_pressure_gradient × depth), and sd (the measurement's standard
// deviation). Quantities carry units in the header ("dp [psi]") or the cell ("120 psi").
#include <filesystem>
#include <string>
#include <vector>

#include "core/util/civil_date.hpp"
#include "formats/table/csv.hpp"

namespace slipscreen::scenario {

struct PressureObservationSpec {
  std::string id;          // the monitoring point (well id)
  double x = 0, y = 0;     // in `crs` (lon/lat in degrees when geographic)
  std::string crs;
  util::CivilDate date;
  double time = 0;         // s since 1970-01-01 (the start of `date`)
  double dp = 0;           // Pa, observed pressure change
  double sd = 0;           // Pa, > 0
  std::string source;      // "pressure_observations.csv line 4"
};

struct ObservationsSpec {
  std::string pressure_file;               // display name
  std::filesystem::path pressure_path;
  double model_error = 0;                  // Pa, added to each sd in quadrature
  bool at_injector = false;                // observations at an injection well are allowed
  std::vector<PressureObservationSpec> pressure;
  std::string where;                       // the table's place, for messages
  // seismicity = true: the [catalog] events at or above Mc after the first injection weigh the
  // realizations too (docs/conditioning.md, "Seismicity"), each assigned to the nearest fault
  // segment within seismicity_distance (others: the background pool).
  bool seismicity = false;
  double seismicity_distance = 2000.0;     // m
  std::string seismicity_where;            // the seismicity key's place, for messages
};

// Reads the observations table. `default_crs` applies when the file has no "# crs:" line;
// `pore_pressure_gradient` (Pa/m) turns absolute pressures into Δp. InputError names the file,
// line, column and the value as written.
std::vector<PressureObservationSpec> read_pressure_observations(const formats::CsvTable& t, const std::string& default_crs,
                                                                double pore_pressure_gradient);

}  // namespace slipscreen::scenario
