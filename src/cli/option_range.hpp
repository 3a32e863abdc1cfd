#pragma once
// Numeric (and named) command-line options are checked by CLI11 while it parses, so an unusable number is a
// usage error naming the option ("--closest: -1 is not in [0, 10000] ..."), never a silently
// empty or wrong result.
#include <CLI/CLI.hpp>
#include <string>

namespace slipscreen::cli {

enum class Ends { closed, open_low };  // [lo, hi] or (lo, hi]

// A validator for a number between lo and hi; `what` says what the number is, for the message.
CLI::Validator in_range(double lo, double hi, const std::string& what, Ends ends = Ends::closed);

// A number strictly between lo and hi: (lo, hi).
CLI::Validator strictly_between(double lo, double hi, const std::string& what);

// A whole number from 0 to 2^64 - 1 written with digits only (a seed): "-1" is refused rather
// than wrapped around to 2^64 - 1.
CLI::Validator whole_number(const std::string& what);

// The name of a unit system of the outputs, "SI" or "oilfield" (core/units), with "did you mean".
CLI::Validator unit_system_name();

}  // namespace slipscreen::cli
