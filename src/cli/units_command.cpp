// `slipscreen units`: lists the units accepted for each kind of value, or converts one value.
#include <CLI/CLI.hpp>
#include <algorithm>
#include <iomanip>
#include <memory>
#include <ostream>

#include "cli/commands.hpp"
#include "cli/exit_codes.hpp"
#include "core/errors.hpp"
#include "core/units/units.hpp"

namespace slipscreen::cli {
namespace {

struct UnitsOptions {
  std::string value;
  std::string to;
  std::string kind;
};

units::Dimension dimension_from_name(const std::string& name) {
  for (int i = 0; i <= static_cast<int>(units::Dimension::inverse_time); ++i) {
    const auto d = static_cast<units::Dimension>(i);
    std::string n(units::dimension_name(d));
    std::replace(n.begin(), n.end(), ' ', '-');
    if (n == name) return d;
  }
  throw InputError("--kind", name, "one of the kinds listed by 'slipscreen units'");
}

int run_units(const UnitsOptions& o, Context& ctx) {
  if (o.value.empty()) {
    ctx.out << "Units accepted in values (write the unit after the number, e.g. '2e4 bbl/d'):\n";
    for (int i = 0; i <= static_cast<int>(units::Dimension::inverse_time); ++i) {
      const auto d = static_cast<units::Dimension>(i);
      std::string n(units::dimension_name(d));
      std::replace(n.begin(), n.end(), ' ', '-');
      ctx.out << "  " << std::left << std::setw(18) << n << " [SI " << units::si_symbol(d) << "]  ";
      bool first = true;
      for (const auto& s : units::symbols_for(d)) {
        ctx.out << (first ? "" : ", ") << s;
        first = false;
      }
      ctx.out << "\n";
    }
    return kExitOk;
  }
  const auto d = dimension_from_name(o.kind);
  const double si = units::parse(o.value, d, "value");
  const std::string to = o.to.empty() ? std::string(units::si_symbol(d)) : o.to;
  ctx.out << std::setprecision(10) << units::to_unit(si, to, d) << " " << to << "\n";
  return kExitOk;
}

}  // namespace

void register_units_command(CLI::App& app, Context& ctx) {
  auto opts = std::make_shared<UnitsOptions>();
  CLI::App* sub = app.add_subcommand("units", "List accepted units, or convert a value: units --kind pressure '3500 psi' --to MPa");
  sub->add_option("value", opts->value, "A value with its unit, e.g. '3500 psi'");
  sub->add_option("--kind", opts->kind, "Kind of value (names as listed, e.g. pressure, volume-rate)")->default_val("pressure");
  sub->add_option("--to", opts->to, "Unit to express the value in (default: SI)");
  sub->callback([opts, &ctx] { ctx.action = [opts, &ctx] { return run_units(*opts, ctx); }; });
}

}  // namespace slipscreen::cli
