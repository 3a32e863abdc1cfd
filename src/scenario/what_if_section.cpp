// The scenario's [[what_if]] entries (docs/scenario.md, "[[what_if]]").
#include "scenario/what_if_section.hpp"

#include <algorithm>
#include <cmath>

#include "core/errors.hpp"
#include "core/units/units.hpp"
#include "core/util/suggest.hpp"
#include "formats/table/iso_time.hpp"
#include "scenario/plausibility.hpp"

namespace slipscreen::scenario {

WhatIfSpec read_what_if(const formats::Section& s, const std::vector<WellSpec>& wells) {
  s.allow({"name", "wells", "fault", "radius", "factor", "from"});
  WhatIfSpec w;
  w.where = s.where_missing("name");
  w.name = s.string("name");
  if (w.name.empty() || w.name.find_first_of(",\"\n") != std::string::npos)
    s.fail("name", w.name, "a short name without commas or quotes (it names columns of what_if.csv)");
  const int ways = int(s.has("wells")) + int(s.has("fault"));
  if (ways != 1)
    s.fail("wells", ways == 0 ? "(not given)" : "(several)",
           "exactly one of: wells = [ids], or fault = \"id\" with radius");
  if (s.has("wells")) {
    std::vector<std::string> ids;
    for (const auto& well : wells) ids.push_back(well.id);
    for (const auto& [id, where] : s.string_list("wells")) {
      if (std::find(ids.begin(), ids.end(), id) == ids.end())
        throw InputError(s.key_path(*s.find("wells"), "wells"), id,
                         "the id of a well of the scenario" + util::did_you_mean(id, ids), where);
      if (std::find(w.wells.begin(), w.wells.end(), id) == w.wells.end()) w.wells.push_back(id);
    }
    if (w.wells.empty()) s.fail("wells", "[]", "at least one well id");
  } else {
    w.fault = s.string("fault");
    w.radius = s.quantity("radius", units::Dimension::length);
    if (!(w.radius > 0.0 && w.radius <= 1e6)) s.fail("radius", plausible::written(s, "radius"), "a distance from 0 to 1000 km");
  }
  w.factor = s.quantity("factor", units::Dimension::dimensionless);
  if (!(w.factor >= 0.0 && w.factor <= 100.0)) s.fail("factor", plausible::written(s, "factor"), "a factor on the rates from 0 to 100");
  const auto f = s.find("from");
  if (!f) s.fail("from", "(not given)", "the date the change starts, such as 2027-02-01");
  const std::string text = s.string("from");
  try {
    w.from = formats::parse_iso8601_utc(text, s.key_path(*f, "from"));
  } catch (const InputError&) {
    throw InputError(s.key_path(*f, "from"), text, "a date such as 2027-02-01 (ISO 8601, UTC)", s.where(*f));
  }
  return w;
}

}  // namespace slipscreen::scenario
