#pragma once
// The region: in-situ stress, pore pressure, the fault map and the injected formation, resolved
// into SI value types (docs/regions.md). Read by region_reader.hpp.
#include <filesystem>
#include <string>
#include <vector>

#include "core/hydro/theis.hpp"
#include "core/poro/rudnicki.hpp"
#include "scenario/unset.hpp"

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
  // poroelastic_path = true: the horizontal stresses follow the pore pressure by
  // κ = α(1−2ν)/(1−ν) (Engelder & Fischer 1994) with α = biot and ν = poisson_ratio (both
  // required keys then for models other than uniaxial_strain, which shares them).
  bool poroelastic_path = false;
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
  std::string top_attribute = "top";                // optional per-fault depth range (3-D model only),
  std::string bottom_attribute = "bottom";          // overriding top and bottom below
  double default_dip = kUnset;  // rad, used where the dip field is absent or null
  // Without a dip direction or dips_to, a trace follows the right-hand rule (dips to the right).
  double friction = 0.6;        // 1
  double cohesion = 0.0;        // Pa
  double segment_length = 2000; // m, longest segment after splitting polylines
  int check_points = 5;         // points per segment where dp is evaluated (max is used)
  bool allow_folded = false;    // accept traces that fold back on themselves (docs/gis.md)
  // Depth range of the faults (model = "poroelastic_3d" only): check points down dip from top to
  // bottom at depth_levels depths; unset: the reference depth alone.
  double top = kUnset, bottom = kUnset;  // m
  int depth_levels = 3;
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
  // model = "leaky": Hantush & Jacob (1955) leaky formation (core/hydro/hantush.hpp), with the
  // leakage factor B given or from the aquitard, B = sqrt(k h b'/k').
  bool leaky = false;
  double leakage_factor = kUnset;          // m, B (given or computed)
  double aquitard_thickness = kUnset;      // m, b'
  double aquitard_permeability = kUnset;   // m^2, k' (vertical)
  // model = "poroelastic_3d": Rudnicki (1986) point sources in an infinite poroelastic solid
  // (core/poro/rudnicki.hpp) with permeability and viscosity above; porosity and total
  // compressibility are implied (φ c_t = the storage κ/c of the solid, docs/physics.md).
  bool poroelastic_3d = false;
  double shear_modulus = kUnset;           // Pa, G
  double poisson_ratio = kUnset;           // 1, drained ν
  double undrained_poisson_ratio = kUnset; // 1, ν_u
  double biot = kUnset;                    // 1, α
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

// The Theis parameters (D and μ/(4π k h)) of a formation (core/hydro/theis.hpp, Theis 1935), and
// for a leaky formation its leakage rate c_L = D/B² (Hantush & Jacob 1955).
// Throws InputError naming the field unless the values are finite and positive.
// For model = "poroelastic_3d" the diffusivity is the solid's c (the storage φ c_t = κ/c).
hydro::TheisParameters theis_parameters_of(const FormationSpec& f);

// The poroelastic medium of a model = "poroelastic_3d" formation (not checked; rudnicki_constants
// checks it).
poro::PoroelasticMedium poroelastic_medium_of(const FormationSpec& f);

}  // namespace slipscreen::scenario
