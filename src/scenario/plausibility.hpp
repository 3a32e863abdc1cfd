#pragma once
// Physical ranges of the scenario's quantities: a value outside its range is refused when the
// scenario is read, with the value as the user wrote it (docs/scenario.md, "Plausible ranges").
// A typo must never become a reassuring answer: 1e30 bbl/d, a northing with one digit too many or
// a depth above ground is an error, not an input.
//
// Each range is in SI and carries the whole "expected ..." text of its message (bounds in the
// units people write, and why). The reasons are facts of the trade ("common practice"); the
// bounds are deliberately wide, an order of magnitude or more beyond what real wells and
// formations show, so that they catch slips (units, digits, signs) and never a real value.
#include <string>
#include <string_view>

#include "core/util/civil_date.hpp"

namespace slipscreen::formats {
class Section;
}

namespace slipscreen::scenario::plausible {

struct Range {
  double lo = 0.0, hi = 0.0;  // SI
  bool lo_open = false, hi_open = false;
  const char* expected = "";  // the message's "expected ..." text

  // False for NaN and infinities outside the bounds.
  bool contains(double v) const {
    return (lo_open ? v > lo : v >= lo) && (hi_open ? v < hi : v <= hi);
  }
};

// Injection: 1e6 bbl/d = 1.84 m³/s for one well. The largest single injection wells report some
// 1e4 bbl/d (disposal) to a few 1e4 bbl/d equivalent (CO2 storage, geothermal reinjection): common
// practice. A rate 20 to 100 times larger is a unit or digit slip.
inline constexpr double kMaxRate = 1.0e6 * 0.158987294928 / 86400.0;  // m³/s
inline constexpr Range kInjectionRate{0.0, kMaxRate, false, false,
                                      "an injection rate from 0 to 1e6 bbl/d (1.84 m3/s): a larger rate is not one "
                                      "injection well (the largest report a few 1e4 bbl/d)"};

// Depths below the surface: wells and faults within the upper 15 km of the crust (the deepest
// boreholes reach about 12 km: common practice).
inline constexpr double kMaxDepth = 15000.0;  // m
inline constexpr Range kWellTop{0.0, kMaxDepth, false, false,
                                "a depth below the surface from 0 to 15 km (a well top cannot lie above the ground)"};
inline constexpr Range kWellBottom{0.0, kMaxDepth, true, false, "a depth below the surface from 0 to 15 km"};
inline constexpr Range kReferenceDepth{0.0, kMaxDepth, true, false, "a depth below the surface in (0, 15 km]"};
inline constexpr Range kLayerTop{0.0, kMaxDepth, false, false, "a depth from 0 to 15 km"};
// Wellbores are 0.1 to 0.5 m across (common practice); a radius above 1 m is a unit slip.
inline constexpr Range kWellRadius{0.0, 1.0, true, false, "a well radius in (0, 1 m] (wellbores are 0.1 to 0.5 m across)"};

// The injected formation. Permeability of rocks spans about 1e-20 m² (intact shale) to 1e-9 m²
// (gravel) (Bear 1972, Dynamics of Fluids in Porous Media, table of permeability ranges; from
// memory); the bounds add a decade each side.
inline constexpr Range kPermeability{1e-7 * 9.869233e-16, 1e6 * 9.869233e-16, false, false,
                                     "a permeability from 1e-7 mD to 1e6 mD (about 1e-22 to 1e-9 m2)"};
inline constexpr Range kThickness{0.1, 5000.0, false, false, "a formation thickness from 0.1 m to 5 km"};
inline constexpr Range kPorosity{1e-4, 0.6, false, false, "a porosity from 0.0001 to 0.6"};
// Water 4.5e-10 1/Pa, pore volume 1e-10 to 1e-8 1/Pa, gas up to about 1e-7 1/Pa (common practice).
inline constexpr Range kCompressibility{1e-11, 1e-6, false, false,
                                        "a total compressibility from 1e-11 to 1e-6 1/Pa (7e-8 to 7e-3 1/psi)"};
// Supercritical CO2 about 0.05 cP, brines 0.3 to 2 cP, heavy fluids up to 1e3 cP (common practice).
inline constexpr Range kViscosity{1e-5, 1.0, false, false, "a viscosity from 0.01 cP to 1000 cP (1e-5 to 1 Pa s)"};
inline constexpr Range kTransmissivity{1e-12, 10.0, false, false, "a transmissivity from 1e-12 to 10 m2/s"};
inline constexpr Range kStorativity{1e-8, 0.5, false, false, "a storativity from 1e-8 to 0.5"};
inline constexpr Range kFluidDensity{100.0, 2000.0, false, false,
                                     "a fluid density from 100 to 2000 kg/m3 (CO2 to dense brine)"};

// Stress and pore pressure. Rock densities of 1000 to 3500 kg/m³ bound the overburden gradient
// (9.8 to 34 MPa/km, common practice); horizontal stresses stay below about twice Sv.
inline constexpr Range kRockDensity{1000.0, 3500.0, false, false, "a rock density from 1000 to 3500 kg/m3"};
inline constexpr Range kVerticalGradient{9.8e3, 35e3, false, false,
                                         "a vertical stress gradient from 9.8 to 35 MPa/km (0.43 to 1.55 psi/ft)"};
inline constexpr Range kHorizontalGradient{0.0, 60e3, true, false,
                                           "a horizontal stress gradient in (0, 60 MPa/km] (up to 2.65 psi/ft)"};
inline constexpr Range kPorePressureGradient{0.0, 35e3, true, false,
                                             "a pore-pressure gradient in (0, 35 MPa/km] (hydrostatic is 9.8 MPa/km, "
                                             "0.433 psi/ft; it cannot exceed the overburden)"};
inline constexpr Range kAzimuth{-6.283185307179586, 6.283185307179586, false, false,
                                "an azimuth from -360 to 360 deg"};
inline constexpr Range kYoungModulus{0.0, 200e9, true, false, "a Young's modulus in (0, 200 GPa]"};
inline constexpr Range kTectonicStress{-100e6, 100e6, false, false, "an added stress from -100 to 100 MPa"};
inline constexpr Range kTectonicStrain{-0.01, 0.01, false, false, "a tectonic strain from -0.01 to 0.01"};
inline constexpr Range kCohesion{0.0, 100e6, false, false, "a cohesion from 0 to 100 MPa"};

// Faults and the output grid.
inline constexpr Range kSegmentLength{10.0, 100e3, false, false, "a segment length from 10 m to 100 km"};
inline constexpr Range kCellSize{1.0, 100e3, false, false, "a cell size from 1 m to 100 km"};
inline constexpr Range kGridMargin{0.0, 500e3, false, false, "a margin from 0 to 500 km"};

// Coordinates. Geographic: longitude [-180, 180], latitude [-90, 90]. Projected: every point of
// the Earth lies within ±2e7 m of a projection's origin (half the equator) plus false eastings
// and northings of at most 1e7 m (common practice), so |x|, |y| ≤ 4e7 (in the CRS's unit).
inline constexpr double kMaxProjected = 4e7;
inline constexpr Range kProjectedCoordinate{-kMaxProjected, kMaxProjected, false, false,
                                            "a projected coordinate within +-4e7 (no place on Earth is farther "
                                            "from a projection's origin)"};
inline constexpr Range kLongitude{-180.0, 180.0, false, false, "a longitude from -180 to 180 degrees"};
inline constexpr Range kLatitude{-90.0, 90.0, false, false, "a latitude from -90 to 90 degrees"};

// Study area (docs/scenario.md, "Plausible ranges"): wells lie within the fault map's extent plus
// this margin, or inside an explicit output grid, unless [wells] allow_outside = true. Pressure
// from a well reaches tens of km over decades; a well farther than 50 km from the box around
// every mapped fault is far more often a coordinate slip than a contributor.
inline constexpr double kStudyAreaMargin = 50e3;  // m

// Dates of injection and of output times: 1900-01-01 to 2200-12-31 (injection wells are a
// twentieth-century technique; permits look decades ahead, not centuries).
inline constexpr util::CivilDate kFirstDate{1900, 1, 1};
inline constexpr util::CivilDate kLastDate{2200, 12, 31};
inline constexpr const char* kDateExpected = "a date from 1900-01-01 to 2200-12-31";
bool plausible_date(const util::CivilDate& d);

// Degrees under a projected CRS: a point with |x| ≤ 180 and |y| ≤ 90 is a longitude and latitude
// written as if they were metres (or feet).
bool looks_like_degrees(double x, double y);

// The shortest text that reads back as v ("501500", "1e+30", "-35.1"), for values known only
// as numbers: fixed notation from 1e-4 to 1e16, scientific beyond.
std::string number_as_read(double v);

// The value of `key` as the user wrote it: a string's text, an integer's digits, a float's
// shortest text ("-35.1", where the TOML library prints -35.100000000000001); "(missing)".
std::string written(const formats::Section& s, std::string_view key);

// Reads nothing: checks the value of `key` (already read, in SI) and refuses it with the key's
// place and its value as written in the TOML file.
void check(const formats::Section& s, std::string_view key, double si_value, const Range& range);

}  // namespace slipscreen::scenario::plausible
