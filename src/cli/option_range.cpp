#include "cli/option_range.hpp"

#include <charconv>
#include <cmath>
#include <cstdint>
#include <limits>

#include "core/units/units.hpp"
#include "core/util/number_text.hpp"
#include "core/util/suggest.hpp"

namespace slipscreen::cli {

namespace {

CLI::Validator range_validator(double lo, double hi, bool open_low, bool open_high, const std::string& what) {
  const std::string range = std::string(open_low ? "(" : "[") + util::number_text(lo) + ", " +
                            util::number_text(hi) + (open_high ? ")" : "]");
  return CLI::Validator(
      [=](std::string& input) -> std::string {
        double v = 0.0;
        const bool number = CLI::detail::lexical_cast(input, v) && std::isfinite(v);
        const bool inside = number && (open_low ? v > lo : v >= lo) && (open_high ? v < hi : v <= hi);
        if (inside) return {};
        return input + " is not " + (number ? "in " + range : "a number") + ": expected " + what + " in " + range;
      },
      "in " + range);
}

}  // namespace

CLI::Validator in_range(double lo, double hi, const std::string& what, Ends ends) {
  return range_validator(lo, hi, ends == Ends::open_low, false, what);
}

CLI::Validator strictly_between(double lo, double hi, const std::string& what) {
  return range_validator(lo, hi, true, true, what);
}

CLI::Validator whole_number(const std::string& what) {
  return CLI::Validator(
      [=](std::string& input) -> std::string {
        std::uint64_t v = 0;
        const bool digits = !input.empty() && input.find_first_not_of("0123456789") == std::string::npos;
        const auto [end, ec] = std::from_chars(input.data(), input.data() + input.size(), v);
        if (digits && ec == std::errc() && end == input.data() + input.size()) return {};
        return input + " is not a whole number from 0 to " +
               std::to_string(std::numeric_limits<std::uint64_t>::max()) + ": expected " + what;
      },
      "a whole number >= 0");
}

CLI::Validator unit_system_name() {
  return CLI::Validator(
      [](std::string& input) -> std::string {
        if (units::unit_system_named(input)) return {};
        return "'" + input + "' is not a unit system: expected SI or oilfield" +
               util::did_you_mean(input, units::unit_system_names());
      },
      "SI|oilfield");
}

}  // namespace slipscreen::cli
