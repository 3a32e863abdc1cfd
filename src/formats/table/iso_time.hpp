#pragma once
// ISO 8601 times as seconds since 1970-01-01T00:00:00Z (UTC; leap seconds not counted, as in
// POSIX time). Calendar arithmetic by std::chrono (proleptic Gregorian calendar).
#include <optional>
#include <string>
#include <string_view>

namespace slipscreen::formats {

// Accepts "YYYY-MM-DD", "YYYY-MM-DDThh:mm", "YYYY-MM-DDThh:mm:ss[.f...]", a space instead of
// 'T', and a zone suffix "Z", "+hh:mm", "-hh:mm", "+hhmm" or "+hh" (converted to UTC); no
// suffix means UTC. Throws InputError(field, text, expected) for anything else, including
// impossible dates (2023-02-29) and out-of-range clock fields (24:00 only as 24:00:00 is not
// accepted either). Accuracy: about 1e-7 s for present-day dates (double seconds).
double parse_iso8601_utc(std::string_view text, std::string_view field = "time");

// Why text that starts like a calendar date "YYYY-MM-DD" (month 01 to 12, day from 01) names no
// real day, in words: "February 2027 has 28 days". Nothing when the text does not start with
// that pattern or the day exists. For messages that must not call an impossible day a format
// error.
std::optional<std::string> impossible_date_reason(std::string_view text);

// What a date field expects, for a message about `text`: "a day that exists (February 2027 has
// 28 days)" for a well-formed impossible date, `format_expected` otherwise.
std::string date_expectation(std::string_view text, const std::string& format_expected);

// "YYYY-MM-DDThh:mm:ss.sssZ", rounded to the millisecond (".sss" left out when zero).
std::string format_iso8601_utc(double seconds);

}  // namespace slipscreen::formats
