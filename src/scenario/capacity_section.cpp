// The scenario's [capacity] table (docs/scenario.md, "[capacity]").
#include "scenario/capacity_section.hpp"

#include <algorithm>
#include <cmath>

#include "core/errors.hpp"
#include "core/units/units.hpp"
#include "core/util/suggest.hpp"
#include "formats/table/iso_time.hpp"
#include "scenario/plausibility.hpp"

namespace slipscreen::scenario {

CapacitySpec read_capacity_spec(const formats::Section& s, const std::vector<WellSpec>& wells) {
  s.allow({"wells", "from", "margin", "up_to"});
  CapacitySpec c;
  if (s.has("wells")) {
    std::vector<std::string> ids;
    for (const auto& w : wells) ids.push_back(w.id);
    for (const auto& [id, where] : s.string_list("wells")) {
      if (std::find(ids.begin(), ids.end(), id) == ids.end()) {
        throw InputError(s.key_path(*s.find("wells"), "wells"), id,
                         "the id of a well of the scenario" + util::did_you_mean(id, ids), where);
      }
      if (std::find(c.wells.begin(), c.wells.end(), id) != c.wells.end())
        throw InputError(s.key_path(*s.find("wells"), "wells"), id, "each well once", where);
      c.wells.push_back(id);
    }
    if (c.wells.empty()) s.fail("wells", "[]", "at least one well id (or no key: the proposed wells)");
  } else {
    for (const auto& w : wells)
      if (w.proposed) c.wells.push_back(w.id);
    if (c.wells.empty())
      s.fail("wells", "(not given)", "the group's well ids: the scenario has no [[proposed_well]] to default to");
  }
  if (const auto f = s.find("from")) {
    const std::string text = s.string("from");
    try {
      c.from = formats::parse_iso8601_utc(text, s.key_path(*f, "from"));
    } catch (const InputError&) {
      throw InputError(s.key_path(*f, "from"), text, "a date such as 2029-01-01 (ISO 8601, UTC)", s.where(*f));
    }
  }
  if (s.has("margin")) {
    c.margin = s.quantity("margin", units::Dimension::pressure);
    if (!(c.margin >= 0.0 && std::isfinite(c.margin)))
      s.fail("margin", plausible::written(s, "margin"), "a pressure margin >= 0, such as \"0.5 MPa\"");
  }
  if (s.has("up_to")) {
    c.up_to = s.quantity("up_to", units::Dimension::dimensionless);
    if (!(c.up_to >= 1.0 && c.up_to <= 1000.0))
      s.fail("up_to", plausible::written(s, "up_to"), "a factor on the planned rates from 1 to 1000");
  }
  return c;
}

}  // namespace slipscreen::scenario
