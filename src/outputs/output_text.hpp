#pragma once
// Small text conventions shared by the run's writers: dates of times, the status words of the
// deterministic screen, and the unit factors of the tables (values in MPa and degrees).
#include <string>

#include "core/geomech/coulomb.hpp"
#include "core/util/civil_date.hpp"

namespace slipscreen::outputs {

inline constexpr double kMPa = 1e6;
inline constexpr double kRadToDeg = 180.0 / 3.14159265358979323846;

// ISO date (YYYY-MM-DD) of a time in s since 1970-01-01T00:00Z.
inline std::string date_of(double t) { return util::format_iso_date(util::date_at(t)); }

inline std::string status_text(geomech::CriticalStatus s) {
  switch (s) {
    case geomech::CriticalStatus::below_failure: return "below_failure";
    case geomech::CriticalStatus::already_critical: return "already_critical";
    case geomech::CriticalStatus::never: return "never";
  }
  return "?";
}

}  // namespace slipscreen::outputs
