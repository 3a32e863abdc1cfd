#pragma once
// Cumulative injected-volume history as CSV, for the seismogenic index:
//   time,cumulative_volume
//   2023-01-01T00:00:00Z,0 m3
//   2023-07-01,1.2e5 m3
//   2024-01-01,1.5e6 bbl
// Times are ISO 8601 UTC; volumes carry their unit (any volume unit of `slipscreen units`).
// Comment lines start with '#'. The first sample is the start of injection.
#include <string>

#include "core/seismo/seismogenic_index.hpp"

namespace slipscreen::formats {

// Throws IoError if unreadable, InputError naming file and line for a bad row or header, and
// the validation errors of seismo::validate (non-increasing times, decreasing volume).
seismo::VolumeHistory read_volume_history_csv(const std::string& path);

}  // namespace slipscreen::formats
