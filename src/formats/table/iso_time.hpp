#pragma once
// ISO 8601 times as seconds since 1970-01-01T00:00:00Z (UTC; leap seconds not counted, as in
// POSIX time). Calendar arithmetic by std::chrono (proleptic Gregorian calendar).
#include <string>
#include <string_view>

namespace slipscreen::formats {

// Accepts "YYYY-MM-DD", "YYYY-MM-DDThh:mm", "YYYY-MM-DDThh:mm:ss[.f...]", a space instead of
// 'T', and a zone suffix "Z", "+hh:mm", "-hh:mm", "+hhmm" or "+hh" (converted to UTC); no
// suffix means UTC. Throws InputError(field, text, expected) for anything else, including
// impossible dates (2023-02-29) and out-of-range clock fields (24:00 only as 24:00:00 is not
// accepted either). Accuracy: about 1e-7 s for present-day dates (double seconds).
double parse_iso8601_utc(std::string_view text, std::string_view field = "time");

// "YYYY-MM-DDThh:mm:ss.sssZ", rounded to the millisecond (".sss" left out when zero).
std::string format_iso8601_utc(double seconds);

}  // namespace slipscreen::formats
