#include "outputs/output_units.hpp"

#include <doctest/doctest.h>

#include <cmath>

using namespace slipscreen;
using outputs::column_unit;
using outputs::OutputUnits;
using outputs::Quantity;

namespace {
// NIST SP 811 (2008), Appendix B (exact definitions): psi = 6894.757293168361 Pa,
// ft = 0.3048 m, bbl = 0.158987294928 m3; mD = 9.869233e-16 m2 (common practice).
constexpr double kPsi = 6894.757293168361;
constexpr double kFt = 0.3048;
constexpr double kBbl = 0.158987294928;
}  // namespace

TEST_CASE("SI tables keep their names, values and decimals") {
  const OutputUnits si;
  CHECK(si.column("dp", Quantity::pressure) == "dp_MPa");
  CHECK(si.column("depth", Quantity::length) == "depth_m");
  CHECK(si.decimals(Quantity::pressure, 6) == 6);
  // The same bytes as the writers' former "fixed_decimals(v / 1e6, 6)".
  CHECK(si.text(1234567.0, Quantity::pressure, 6) == "1.234567");
  CHECK(si.text(2000.04, Quantity::length, 1) == "2000.0");
}

TEST_CASE("oilfield names, factors and decimals") {
  const OutputUnits of(units::UnitSystem::oilfield);
  CHECK(of.system_name() == "oilfield");
  CHECK(of.column("dp_crit", Quantity::pressure) == "dp_crit_psi");
  CHECK(of.column("distance", Quantity::length) == "distance_ft");
  CHECK(of.column("volume", Quantity::volume) == "volume_bbl");
  CHECK(of.column("rate", Quantity::volume_rate) == "rate_bbl_per_d");
  CHECK(of.column("pore_pressure_gradient", Quantity::pressure_gradient) == "pore_pressure_gradient_psi_per_ft");
  CHECK(of.column("permeability", Quantity::permeability) == "permeability_mD");
  CHECK(of.symbol(Quantity::volume_rate) == "bbl/d");
  // 1000 psi in Pa, 3000 ft in m, 1e4 bbl/d in m3/s back to their own units (exact factors).
  CHECK(std::abs(of.value(1000 * kPsi, Quantity::pressure) - 1000) < 1e-10);
  CHECK(std::abs(of.value(3000 * kFt, Quantity::length) - 3000) < 1e-10);
  CHECK(std::abs(of.value(1e4 * kBbl / 86400, Quantity::volume_rate) - 1e4) < 1e-8);
  CHECK(std::abs(of.value(0.433 * kPsi / kFt, Quantity::pressure_gradient) - 0.433) < 1e-14);
  CHECK(std::abs(of.value(10 * 9.869233e-16, Quantity::permeability) - 10) < 1e-12);
  // Decimals: psi = 6.894757e-3 MPa, so 6 decimals of MPa (1 Pa) become 4 of psi (0.69 Pa) and
  // 4 (100 Pa) become 2 (69 Pa); ft = 0.3048 m keeps 1 decimal (0.03 m <= 0.1 m).
  CHECK(of.decimals(Quantity::pressure, 6) == 4);
  CHECK(of.decimals(Quantity::pressure, 4) == 2);
  CHECK(of.decimals(Quantity::length, 1) == 1);
  CHECK(of.decimals(Quantity::volume, 1) == 1);
  CHECK(of.decimals(Quantity::distance_long, 2) == 3);  // mi = 1.609 km
  // psi/ft = 22.62 MPa/km: 2 decimals of MPa/km become 4 of psi/ft.
  CHECK(of.decimals(Quantity::pressure_gradient, 2) == 4);
  // Never coarser than the SI column: one step of the oilfield column is at most one of the SI column.
  for (Quantity q : {Quantity::pressure, Quantity::length, Quantity::distance_long, Quantity::volume,
                     Quantity::volume_rate, Quantity::pressure_gradient, Quantity::permeability})
    for (int d = 0; d <= 8; ++d) {
      const double si_step = std::pow(10.0, -d) * OutputUnits().size_in_si(q);
      const double of_step = std::pow(10.0, -of.decimals(q, d)) * of.size_in_si(q);
      CHECK(of_step <= si_step * (1 + 1e-12));
    }
  CHECK(of.text(1000 * kPsi, Quantity::pressure, 6) == "1000.0000");
}

TEST_CASE("a header cell gives its base name and the factor to SI, in either system") {
  const auto dp_psi = column_unit("dp_psi");
  CHECK(dp_psi.base == "dp");
  CHECK(dp_psi.suffix == "psi");
  CHECK(dp_psi.to_si == kPsi);
  const auto dp_mpa = column_unit("dp_crit_MPa");
  CHECK(dp_mpa.base == "dp_crit");
  CHECK(dp_mpa.to_si == 1e6);
  CHECK(column_unit("depth_ft").to_si == kFt);
  CHECK(column_unit("distance_m").base == "distance");
  CHECK(column_unit("rate_bbl_per_d").to_si == kBbl / 86400);
  CHECK(column_unit("rate_bbl_per_d").base == "rate");
  CHECK(column_unit("gradient_psi_per_ft").to_si == kPsi / kFt);
  CHECK(column_unit("permeability_mD").to_si == 9.869233e-16);
  // The longest suffix wins.
  CHECK(column_unit("diffusivity_m2_per_s").suffix == "m2_per_s");
  CHECK(column_unit("diffusivity_m2_per_s").base == "diffusivity");
  CHECK(column_unit("pressure_per_rate_Pa_s_per_m3").suffix == "Pa_s_per_m3");
  CHECK(column_unit("time_since_start_days").to_si == 86400);
  CHECK(column_unit("time_since_start_days").base == "time_since_start");
  CHECK(column_unit("rate_per_year").suffix == "per_year");
  // Names with no unit stay whole.
  for (const char* name : {"p_slip", "share", "leading_well_share", "segment_id", "wells", "m", "_psi"}) {
    CAPTURE(name);
    CHECK(column_unit(name).base == name);
    CHECK(column_unit(name).suffix.empty());
    CHECK(column_unit(name).to_si == 1.0);
  }
}
