#include "cli/scenario_summary.hpp"

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <limits>
#include <ostream>
#include <sstream>

#include "core/units/units.hpp"
#include "formats/files/path_policy.hpp"
#include "outputs/output_units.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::cli {
namespace {

std::string fixed(double v, int digits) {
  std::ostringstream os;
  os << std::fixed << std::setprecision(digits) << v;
  return os.str();
}

const char* model_name(scenario::StressModel m) {
  switch (m) {
    case scenario::StressModel::gradients: return "gradients";
    case scenario::StressModel::uniaxial_strain: return "uniaxial strain";
    case scenario::StressModel::a_phi: return "A_phi";
  }
  return "?";
}

// A quantity in the scenario's [output] units with its unit, `si_decimals` decimals in SI.
std::string quantity(const outputs::OutputUnits& u, double si, outputs::Quantity q, int si_decimals) {
  return fixed(u.value(si, q), u.decimals(q, si_decimals)) + " " + std::string(u.symbol(q));
}

}  // namespace

void print_scenario_summary(const scenario::ResolvedScenario& s, std::ostream& out) {
  const auto& r = s.region;
  const outputs::OutputUnits u(s.output.units);
  using Q = outputs::Quantity;
  out << "Scenario   " << s.file << (s.title.empty() ? "" : "  (" + s.title + ")") << "\n";
  out << "Region     " << r.name << "  [" << r.file << "]\n";
  out << "  working CRS " << r.crs << ", reference depth " << quantity(u, r.reference_depth, Q::length, 0)
      << ", pore-pressure gradient " << quantity(u, r.pore_pressure_gradient, Q::pressure_gradient, 2) << "\n";
  out << "  stress: " << model_name(r.stress.model);
  if (r.stress.model == scenario::StressModel::a_phi) out << " = " << fixed(r.stress.a_phi, 2);
  out << ", SHmax azimuth " << fixed(r.stress.shmax_azimuth * 180 / 3.14159265358979323846, 1) << " deg\n";
  if (r.stress.poroelastic_path) out << "  stress path: " << screening::stress_path_statement(r.stress) << "\n";
  out << "  faults: " << formats::display_name(r.faults.path) << ", friction " << fixed(r.faults.friction, 2)
      << ", cohesion " << quantity(u, r.faults.cohesion, Q::pressure, 2) << ", segments <= "
      << quantity(u, r.faults.segment_length, Q::length, 0) << ", " << r.faults.check_points << " check points each\n";
  const auto& f = r.formation;
  out << "  formation: " << (f.name.empty() ? "(unnamed)" : f.name) << ", diffusivity " << std::setprecision(3)
      << scenario::theis_parameters_of(f).diffusivity << " m2/s";
  if (f.leaky) {
    const auto tp = scenario::theis_parameters_of(f);
    out << ", leaky (Hantush & Jacob 1955), leakage factor B = "
        << quantity(u, std::sqrt(tp.diffusivity / tp.leakage_rate), Q::length, 0);
  }
  if (f.poroelastic_3d)
    out << ", poroelastic_3d (Rudnicki 1986): faults in depth " << quantity(u, std::isnan(r.faults.top) ? r.reference_depth : r.faults.top, Q::length, 0)
        << " to " << quantity(u, std::isnan(r.faults.bottom) ? r.reference_depth : r.faults.bottom, Q::length, 0);
  out << "\n";

  int existing = 0, proposed = 0, shut = 0;
  double first = std::numeric_limits<double>::infinity(), last = -first, volume = 0;
  for (const auto& w : s.wells) {
    (w.proposed ? proposed : existing)++;
    shut += w.status == scenario::WellStatus::shut_in;
    for (const auto& p : w.periods) {
      first = std::min(first, p.start);
      last = std::max(last, p.end);
      volume += p.rate * (p.end - p.start);
    }
  }
  out << "Wells      " << existing << " existing (" << shut << " shut in), " << proposed << " proposed\n";
  if (std::isfinite(first))
    out << "  injection from " << util::format_iso_date(util::date_at(first)) << " to "
        << util::format_iso_date(util::date_at(last)) << ", " << std::setprecision(4)
        << volume / units::kBarrel / 1e6 << " million bbl in total (histories and plans)\n";
  const auto& o = s.output;
  out << "Output     " << o.dates.size() << (o.dates.size() == 1 ? " time from " : " times from ") << util::format_iso_date(o.dates.front()) << " to "
      << util::format_iso_date(o.dates.back()) << "\n";
  out << "  grid: " << (o.grid.automatic_extent ? "automatic extent (margin " + quantity(u, o.grid.margin, Q::length, 0) + ")"
                                                 : "extent [" + fixed(o.grid.xmin, 0) + ", " + fixed(o.grid.ymin, 0) +
                                                       ", " + fixed(o.grid.xmax, 0) + ", " + fixed(o.grid.ymax, 0) + "]")
      << ", cell " << quantity(u, o.grid.cell_size, Q::length, 0) << ", CRS " << (o.grid.crs.empty() ? r.crs : o.grid.crs) << "\n";
  out << "  writes:" << (o.tables ? " tables" : "") << (o.rasters ? (o.cog ? " raster (COG)" : " raster") : "")
      << (o.geopackage ? " geopackage" : "") << " manifest (tables in " << u.system_name() << " units), into " << (o.folder.empty() ? "(--out)" : o.folder) << "\n";
  out << "  seed " << s.seed << (s.uncertainty.given ? ", [uncertainty] given" : ", no [uncertainty] (deterministic screen)")
      << "\n";
  if (s.catalog)
    out << "Catalog    " << s.catalog->file << " (reviewed with the run; footprint threshold "
        << quantity(u, s.catalog->footprint_threshold, Q::pressure, 3)
        << (s.catalog->rate_state ? ", seismicity-rate response" : "") << ")\n";
}

}  // namespace slipscreen::cli
