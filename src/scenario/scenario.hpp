#pragma once
// The scenario: one TOML file naming a region, wells, injection histories, proposed wells with
// planned schedules, output times, the output grid, the outputs wanted and the run folder.
// Everything is resolved into plain value structs in SI (docs/scenario.md, docs/regions.md).
//
// Times are seconds since 1970-01-01T00:00Z (util::to_seconds); a date names the start of that
// day, so a period "from 2027-01-01 to 2028-01-01" covers all of 2027.
// Well coordinates are kept in the CRS they were given in; the run reprojects them into the
// working CRS (the region's `crs`).
#include <array>
#include <cstdint>
#include <filesystem>
#include <limits>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json_fwd.hpp>
#include <toml++/toml.h>

#include "core/util/civil_date.hpp"
#include "scenario/catalog_spec.hpp"
#include "scenario/unset.hpp"
#include "scenario/wells.hpp"

namespace slipscreen::scenario {


enum class StressModel { gradients, uniaxial_strain, a_phi };

// In-situ stress at the reference depth; the three forms of the geomechanics engine.
struct StressSpec {
  StressModel model = StressModel::gradients;
  double vertical_gradient = kUnset;   // Pa/m, dSv/dz (or overburden density x g); unset with layers
  struct DensityLayer {
    double top;      // m
    double density;  // kg/m^3
  };
  std::vector<DensityLayer> density_layers;  // Sv = g sum(rho dz), when given instead of a gradient
  double shmax_azimuth = kUnset;       // rad, clockwise from north
  // model = gradients
  double shmax_gradient = kUnset;      // Pa/m
  double shmin_gradient = kUnset;      // Pa/m
  // model = uniaxial_strain: Shmin = nu/(1-nu) (Sv - alpha p0) + alpha p0, plus optional
  // tectonic strains (with Young's modulus) and stresses, as geomech::UniaxialStrainModel
  double poisson_ratio = kUnset;       // 1
  double biot = 1.0;                   // 1
  double young_modulus = 0;            // Pa (needed only with non-zero strains)
  double strain_shmin = 0, strain_shmax = 0;  // 1, tectonic strains (extension negative)
  double tectonic_shmin = 0, tectonic_shmax = 0;  // Pa, added stresses
  // model = a_phi (Simpson 1997): magnitudes from frictional equilibrium at this friction
  double a_phi = kUnset;               // 0..3
  double equilibrium_friction = kUnset;  // 1, defaults to the fault friction
};

struct FaultMapSpec {
  std::filesystem::path path;   // absolute or relative to the working directory
  std::string file;             // display name
  std::string layer;            // empty: the first layer
  std::string crs;              // empty: the file's own CRS
  // attribute mapping (field names in the fault file; "" disables an optional field)
  std::string id_attribute = "fault_id";
  std::string dip_attribute = "dip";
  std::string dip_direction_attribute = "dip_dir";  // azimuth or compass point
  std::string dips_to_attribute = "dips_to";        // "right"/"left" of the digitising direction
  std::string friction_attribute = "friction";      // optional per-fault friction
  double default_dip = kUnset;  // rad, used where the dip field is absent or null
  // Without a dip direction or dips_to, a trace follows the right-hand rule (dips to the right).
  double friction = 0.6;        // 1
  double cohesion = 0.0;        // Pa
  double segment_length = 2000; // m, longest segment after splitting polylines
  int check_points = 5;         // points per segment where dp is evaluated (max is used)
};

struct BoundarySpec {
  enum class Kind { no_flow, constant_pressure } kind = Kind::no_flow;
  double x1 = 0, y1 = 0, x2 = 0, y2 = 0;  // working CRS, a straight line through two points
};

// Hydrogeology of the injected formation. Either (k, h, phi, c_t, mu) or (T, S) with a fluid
// density; both give the two numbers the Theis solution needs.
struct FormationSpec {
  std::string name;
  bool from_transmissivity = false;
  double permeability = kUnset;           // m^2
  double thickness = kUnset;              // m
  double porosity = kUnset;               // 1
  double total_compressibility = kUnset;  // 1/Pa
  double viscosity = kUnset;              // Pa.s
  double transmissivity = kUnset;         // m^2/s
  double storativity = kUnset;            // 1
  double fluid_density = 1000.0;          // kg/m^3
  std::vector<BoundarySpec> boundaries;

  // Hydraulic diffusivity D = k/(mu phi c_t), or T/S (m^2/s).
  double diffusivity() const;
  // Mobility-thickness k h / mu (m^3/(Pa.s)), or T/(rho g); dp = q/(4 pi kh/mu) E1(u).
  double mobility_thickness() const;
};

struct RegionSpec {
  std::string name;
  std::filesystem::path path;   // region.toml
  std::string file;             // display name
  std::string crs;              // working CRS (projected)
  double reference_depth = kUnset;          // m, depth of the faults and stress evaluation
  double pore_pressure_gradient = kUnset;   // Pa/m
  StressSpec stress;
  FaultMapSpec faults;
  FormationSpec formation;
};

struct OutputGrid {
  bool automatic_extent = true;  // around wells and faults
  double xmin = 0, ymin = 0, xmax = 0, ymax = 0;  // in `crs`
  double margin = 5000;          // m, for the automatic extent
  double cell_size = 1000;       // m
  std::string crs;               // empty: the working CRS
};

struct OutputFiles {
  std::string segment_times = "segment_times.csv";
  std::string segments = "segments.csv";
  std::string pressure_raster = "pressure_change.tif";
  std::string geopackage = "screen.gpkg";
  std::string manifest = "manifest.json";
};

struct OutputSpec {
  std::string folder;            // run folder as written (relative to the working directory)
  bool tables = true, rasters = true, geopackage = true, cog = false;
  std::vector<util::CivilDate> dates;
  std::vector<double> times;     // seconds, strictly increasing
  OutputGrid grid;
  OutputFiles files;
};


struct ResolvedScenario {
  std::filesystem::path path;    // the scenario file
  std::string file;              // its display name
  std::string title;
  std::uint64_t seed = 1;
  RegionSpec region;
  std::string wells_file, histories_file;  // display names (empty if none)
  std::filesystem::path wells_path, histories_path;
  std::vector<WellSpec> wells;   // existing wells, then proposed wells
  OutputSpec output;
  std::vector<std::filesystem::path> inputs;  // every file read (for the manifest hashes)
  std::optional<CatalogSpec> catalog;           // [catalog]: the review runs with the screen
  // The [uncertainty] table, parsed and validated by the probabilistic screen (issue 5).
  std::shared_ptr<const toml::table> document;
  const toml::table* uncertainty = nullptr;
};

// Loads and resolves a scenario. `file` is the display name (defaults to the path as given).
// Throws InputError / Error(input) for bad content, IoError for unreadable files.
ResolvedScenario load_scenario(const std::filesystem::path& path);

// Resolves only a region file (docs/regions.md), optionally with an override table.
RegionSpec load_region(const std::filesystem::path& path, const std::string& file,
                       const toml::table* override_table = nullptr, const std::string& override_file = "",
                       const std::string& override_prefix = "", const std::filesystem::path& override_dir = {});

// Every resolved value, in SI with units in the key names, for the manifest.
nlohmann::json to_json(const ResolvedScenario& s);


}  // namespace slipscreen::scenario
