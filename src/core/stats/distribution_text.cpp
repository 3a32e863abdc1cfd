#include "core/stats/distribution_text.hpp"

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <limits>
#include <map>
#include <optional>
#include <vector>

#include "core/util/trim.hpp"
#include "core/errors.hpp"
#include "core/util/suggest.hpp"

namespace slipscreen::stats {
namespace {

struct Syntax {
  std::string_view name;
  DistributionKind kind;
  std::vector<std::string> positional;  // parameter names in positional order
  std::vector<std::string> named_only;  // further names accepted only as key=value
  std::string_view usage;
};

const std::vector<Syntax>& syntaxes() {
  static const std::vector<Syntax> table = {
      {"fixed", DistributionKind::fixed, {"value"}, {}, "fixed(value)"},
      {"uniform", DistributionKind::uniform, {"min", "max"}, {}, "uniform(min, max)"},
      {"normal", DistributionKind::normal, {"mean", "sd"}, {}, "normal(mean, sd)"},
      {"truncnormal", DistributionKind::truncated_normal, {"mean", "sd", "min", "max"}, {},
       "truncnormal(mean, sd, min, max)"},
      {"truncated_normal", DistributionKind::truncated_normal, {"mean", "sd", "min", "max"}, {},
       "truncnormal(mean, sd, min, max)"},
      {"lognormal", DistributionKind::lognormal, {"median", "sigma_ln"}, {"p10", "p90"},
       "lognormal(median, sigma_ln) or lognormal(p10=, p90=)"},
      {"triangular", DistributionKind::triangular, {"min", "mode", "max"}, {}, "triangular(min, mode, max)"},
  };
  return table;
}

std::string lower(std::string_view s) {
  std::string out(s);
  std::transform(out.begin(), out.end(), out.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return out;
}

std::vector<std::string> names() {
  std::vector<std::string> out;
  for (const auto& s : syntaxes()) out.emplace_back(s.name);
  return out;
}

const std::string kKnown =
    "a value with a unit or a distribution: fixed, uniform, normal, truncnormal, lognormal or triangular";

std::string number(double v) {
  char buf[32];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

// Splits the text between the parentheses at its commas and binds each argument to a parameter
// name: positional ones in the syntax's order, then named ones (key=value).
std::map<std::string, std::string> bind_arguments(const Syntax& syn, std::string_view inner, const std::string& field,
                                                  const std::string& whole) {
  std::map<std::string, std::string> args;  // parameter name -> value text
  if (util::trim(inner).empty()) throw InputError(field, whole, "parameters: " + std::string(syn.usage));
  std::vector<std::string> accepted = syn.positional;
  accepted.insert(accepted.end(), syn.named_only.begin(), syn.named_only.end());
  std::size_t position = 0;
  bool seen_named = false;
  std::size_t start = 0;
  while (start <= inner.size()) {
    const auto comma = inner.find(',', start);
    const std::string arg_text = util::trim(inner.substr(start, comma == std::string_view::npos ? std::string_view::npos : comma - start));
    const std::string_view arg = arg_text;
    start = comma == std::string_view::npos ? inner.size() + 1 : comma + 1;
    if (arg.empty()) throw InputError(field, whole, "a value between every pair of commas: " + std::string(syn.usage));
    std::string key, value;
    const auto eq = arg.find('=');
    if (eq == std::string_view::npos) {
      if (seen_named) throw InputError(field, whole, "positional parameters before named ones: " + std::string(syn.usage));
      if (position >= syn.positional.size())
        throw InputError(field, whole, "at most " + std::to_string(syn.positional.size()) +
                                           " parameters: " + std::string(syn.usage));
      key = syn.positional[position++];
      value = std::string(arg);
    } else {
      seen_named = true;
      key = lower(util::trim(arg.substr(0, eq)));
      value = util::trim(arg.substr(eq + 1));
      if (std::find(accepted.begin(), accepted.end(), key) == accepted.end())
        throw InputError(field, whole, "parameters of " + std::string(syn.usage) + ", not '" + key + "'" +
                                           util::did_you_mean(key, accepted));
    }
    if (value.empty()) throw InputError(field, whole, "a value for " + key + ": " + std::string(syn.usage));
    if (!args.emplace(key, value).second)
      throw InputError(field, whole, "each parameter once, but '" + key + "' is given twice");
  }
  return args;
}

// The bound arguments of one distribution text, read as quantities when asked for (an error
// names the whole text and the parameter).
struct Arguments {
  const Syntax& syntax;
  std::map<std::string, std::string> text;  // parameter name -> value text
  units::Dimension dimension;
  const std::string& field;
  const std::string& whole;

  bool has(const char* key) const { return text.count(key) != 0; }

  std::optional<double> value_of(const std::string& key) const {
    const auto a = text.find(key);
    if (a == text.end()) return std::nullopt;
    const units::Dimension dim = key == "sigma_ln" ? units::Dimension::dimensionless : dimension;
    try {
      return units::parse(a->second, dim, field + "." + key);
    } catch (const InputError& e) {
      throw InputError(field, whole, "for " + key + " ('" + a->second + "') " + e.expected());
    }
  }

  double required(const std::string& key) const {
    const auto v = value_of(key);
    if (!v) throw InputError(field, whole, "a value for " + key + ": " + std::string(syntax.usage));
    return *v;
  }
};

// The distribution the arguments describe; parameters are read in order, so the first error is
// reported first.
Distribution make_distribution(const Arguments& a) {
  const std::string& field = a.field;
  switch (a.syntax.kind) {
    case DistributionKind::fixed:
      return Distribution::fixed(a.required("value"), field);
    case DistributionKind::uniform: {
      const double min = a.required("min"), max = a.required("max");
      return Distribution::uniform(min, max, field);
    }
    case DistributionKind::normal: {
      const double mean = a.required("mean"), sd = a.required("sd");
      return Distribution::normal(mean, sd, field);
    }
    case DistributionKind::truncated_normal: {
      constexpr double inf = std::numeric_limits<double>::infinity();
      const double mean = a.required("mean"), sd = a.required("sd");
      const auto lo = a.value_of("min"), hi = a.value_of("max");
      if (!lo && !hi) throw InputError(field, a.whole, "min or max (or both) for truncnormal(mean, sd, min, max)");
      return Distribution::truncated_normal(mean, sd, lo.value_or(-inf), hi.value_or(inf), field);
    }
    case DistributionKind::lognormal: {
      const bool by_median = a.has("median") || a.has("sigma_ln");
      const bool by_percentiles = a.has("p10") || a.has("p90");
      if (by_median && by_percentiles)
        throw InputError(field, a.whole, "either median and sigma_ln, or p10 and p90, not a mix");
      if (by_percentiles) {
        const double p10 = a.required("p10"), p90 = a.required("p90");
        return Distribution::lognormal_p10_p90(p10, p90, field);
      }
      const double median = a.required("median"), sigma_ln = a.required("sigma_ln");
      return Distribution::lognormal(median, sigma_ln, field);
    }
    case DistributionKind::triangular: {
      const double min = a.required("min"), mode = a.required("mode"), max = a.required("max");
      return Distribution::triangular(min, mode, max, field);
    }
  }
  throw InputError(field, a.whole, kKnown);
}

}  // namespace

Distribution parse_distribution(std::string_view text_in, units::Dimension dimension, std::string_view field_in) {
  const std::string trimmed = util::trim(text_in);
  const std::string_view text = trimmed;
  const std::string field(field_in);
  const std::string whole(text);
  if (text.empty()) throw InputError(field, whole, kKnown + ", such as 'normal(0.6, 0.05)'");

  const auto open = text.find('(');
  if (open == std::string_view::npos) {
    // A bare word is a distribution name written without its arguments, or a typo.
    if (std::isalpha(static_cast<unsigned char>(text.front())))
      throw InputError(field, whole, kKnown + " written with its parameters in parentheses" +
                                         util::did_you_mean(lower(text), names()));
    return Distribution::fixed(units::parse(text, dimension, field), field);
  }
  if (text.back() != ')' || text.find('(', open + 1) != std::string_view::npos ||
      text.find(')') != text.size() - 1)
    throw InputError(field, whole, "one pair of parentheses around the parameters, as in 'normal(0.6, 0.05)'");

  const std::string name = lower(util::trim(text.substr(0, open)));
  const auto it = std::find_if(syntaxes().begin(), syntaxes().end(), [&](const Syntax& s) { return s.name == name; });
  if (it == syntaxes().end())
    throw InputError(field, whole, kKnown + util::did_you_mean(name, names()));
  const Arguments args{*it, bind_arguments(*it, text.substr(open + 1, text.size() - open - 2), field, whole),
                       dimension, field, whole};
  try {
    return make_distribution(args);
  } catch (const InputError& e) {
    if (e.value() == whole) throw;
    throw InputError(field, whole, e.expected());
  }
}

std::string format_distribution(const Distribution& d, units::Dimension dimension) {
  std::string unit;
  if (dimension != units::Dimension::dimensionless) unit.append(" ").append(units::si_symbol(dimension));
  const auto v = [&](double x) { return number(x) + unit; };
  switch (d.kind()) {
    case DistributionKind::fixed:
      return v(d.a());
    case DistributionKind::uniform:
      return "uniform(min=" + v(d.a()) + ", max=" + v(d.b()) + ")";
    case DistributionKind::normal:
      return "normal(mean=" + v(d.a()) + ", sd=" + v(d.b()) + ")";
    case DistributionKind::truncated_normal: {
      std::string s = "truncnormal(mean=" + v(d.a()) + ", sd=" + v(d.b());
      if (std::isfinite(d.c())) s += ", min=" + v(d.c());
      if (std::isfinite(d.d())) s += ", max=" + v(d.d());
      return s + ")";
    }
    case DistributionKind::lognormal:
      return "lognormal(median=" + v(d.a()) + ", sigma_ln=" + number(d.b()) + ")";
    case DistributionKind::triangular:
      return "triangular(min=" + v(d.a()) + ", mode=" + v(d.b()) + ", max=" + v(d.c()) + ")";
  }
  return v(d.a());
}

}  // namespace slipscreen::stats
