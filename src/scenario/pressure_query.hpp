#pragma once
// The settings file of `slipscreen pressure --file` (format in docs/pressure.md, "The settings
// file"), read strictly: an unknown table or key is refused with "did you mean", and a value of
// the wrong type or dimension is an InputError naming the file, line, column and key path.
//
// The values stay as the text the user wrote ("25 mD", "3 yr"), checked for their dimension:
// the command shows them as written and lets its options replace them one by one.
#include <filesystem>
#include <string>
#include <vector>

namespace slipscreen::scenario {

struct PressureRateStep {
  std::string rate;          // volume rate, e.g. "15000 bbl/d"
  std::string from = "0 s";  // start time since the schedules' zero
};

struct PressureWell {
  std::string name;
  std::string x = "0 m", y = "0 m";
  std::string radius;  // empty: the command's default well radius
  std::vector<PressureRateStep> schedule;
};

struct PressureBoundary {
  std::string kind;  // "no-flow" or "constant-pressure"
  std::string x = "0 m", y = "0 m";
  std::string azimuth = "0 deg";  // clockwise from north
};

// Every field is empty when the file does not set it.
struct PressureQuery {
  // [formation]: (k, h, mu, phi, c_t) or (T, S, rho); the file may give either set or parts of it
  std::string permeability, thickness, viscosity, porosity, total_compressibility;
  std::string transmissivity, storativity, fluid_density;
  std::vector<PressureWell> wells;          // [[well]]
  std::vector<PressureBoundary> boundaries;  // [[boundary]]
  // [output]
  std::vector<std::string> distances;  // from the first well along +x
  std::vector<std::string> points;     // "x, y"
  std::vector<std::string> times;      // since the schedules' zero
  std::string unit;                    // pressure unit of the output
  std::string length_unit;             // length unit of the output
};

// Reads a pressure settings file. Throws IoError when it cannot be read and InputError (or an
// input-category Error for TOML syntax and unknown keys) for bad content.
PressureQuery read_pressure_query(const std::filesystem::path& path);

}  // namespace slipscreen::scenario
