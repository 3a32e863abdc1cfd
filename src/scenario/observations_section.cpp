// The scenario's [observations] table (docs/conditioning.md); see observations_section.hpp.
#include "scenario/observations_section.hpp"

#include "core/units/units.hpp"
#include "formats/files/path_policy.hpp"
#include "formats/table/csv.hpp"
#include "scenario/plausibility.hpp"

namespace slipscreen::scenario {

ObservationsSpec read_observations_spec(const formats::Section& s, const std::string& wells_crs,
                                        double pore_pressure_gradient) {
  s.allow({"pressure", "model_error", "at_injector", "seismicity", "seismicity_distance"});
  ObservationsSpec o;
  o.seismicity = s.boolean_or("seismicity", false);
  if (s.has("seismicity")) o.seismicity_where = s.where(*s.find("seismicity"));
  if (s.has("seismicity_distance")) {
    if (!o.seismicity)
      s.fail("seismicity_distance", plausible::written(s, "seismicity_distance"),
             "seismicity = true under [observations] too (the distance assigns the catalog's events to fault segments)");
    o.seismicity_distance = s.quantity("seismicity_distance", units::Dimension::length);
    if (!(o.seismicity_distance > 0.0 && o.seismicity_distance <= 50e3))
      s.fail("seismicity_distance", plausible::written(s, "seismicity_distance"),
             "a distance above 0 and at most 50 km, such as \"2 km\"");
  }
  if (!s.has("pressure")) {
    if (o.seismicity) {
      for (const char* k : {"model_error", "at_injector"})
        if (s.has(k))
          s.fail(k, plausible::written(s, k), "a pressure = \"...\" file too: this key applies to pressure observations");
      o.where = o.seismicity_where;
      return o;
    }
    s.fail("pressure", "(not given)",
           "the observed pressures file, e.g. pressure = \"pressure_observations.csv\", or seismicity = true");
  }
  o.pressure_path = s.input_path("pressure");
  o.pressure_file = formats::display_name(o.pressure_path);
  o.where = s.where(*s.find("pressure"));
  if (s.has("model_error")) {
    o.model_error = s.quantity("model_error", units::Dimension::pressure);
    if (!(o.model_error >= 0.0 && o.model_error <= 200e6))
      s.fail("model_error", plausible::written(s, "model_error"), "a pressure from 0 to 200 MPa, such as \"0.3 MPa\"");
  }
  o.at_injector = s.boolean_or("at_injector", false);
  o.pressure = read_pressure_observations(formats::read_csv(o.pressure_path, o.pressure_file), wells_crs,
                                          pore_pressure_gradient);
  return o;
}

}  // namespace slipscreen::scenario
