#include "outputs/what_if_table.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "core/util/civil_date.hpp"
#include "core/util/number_text.hpp"
#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"

namespace slipscreen::outputs {
namespace {
std::string date_of(double t) { return util::format_iso_date(util::date_at(t)); }
std::string f4(double v) { return util::fixed_decimals(v, 4); }
double share(std::uint64_t k, std::uint64_t n) { return static_cast<double>(k) / static_cast<double>(n); }
std::string list_text(const std::vector<std::string>& v) {
  std::string t;
  for (const auto& x : v) t += (t.empty() ? "" : " ") + x;
  return t;
}
}  // namespace

void write_what_if_table(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                         const screening::WhatIfResult& w) {
  std::ostringstream t;
  t << "segment_id,fault_id,date,p_slip_base";
  for (const auto& n : w.names) t << ',' << formats::csv_field("p_slip_" + n) << ',' << formats::csv_field("change_" + n);
  t << '\n';
  for (std::size_t i = 0; i < w.base.size(); ++i)
    for (std::size_t k = 0; k < w.base[i].size(); ++k) {
      const double base = share(w.base[i][k], w.realizations);
      t << formats::csv_field(w.segment_ids[i]) << ',' << formats::csv_field(w.fault_ids[i]) << ','
        << util::format_iso_date(s.output.dates[k]) << ',' << f4(base);
      for (std::size_t v = 0; v < w.names.size(); ++v) {
        const double p = share(w.variant[v][i][k], w.realizations);
        t << ',' << f4(p) << ',' << f4(p - base);
      }
      t << '\n';
    }
  formats::write_text_file(folder.output("output.files.what_if", "what_if.csv"), t.str());
}

std::vector<ReadmeFile> what_if_readme(const screening::WhatIfResult& w) {
  const std::size_t n = w.names.size();
  return {{"what_if.csv", "what-if rate changes (" + std::to_string(n) + (n == 1 ? " variant" : " variants") +
                              "): per fault segment and output time, P(slip) of the base and of each variant "
                              "and the change, on the same realizations"}};
}

nlohmann::json what_if_manifest(const screening::WhatIfResult& w) {
  nlohmann::json v = nlohmann::json::array();
  for (std::size_t i = 0; i < w.names.size(); ++i)
    v.push_back({{"name", w.names[i]}, {"wells", w.wells[i]}, {"factor", w.factors[i]}, {"from", date_of(w.from[i])}});
  return {{"variants", v},
          {"method", "superposition of the variant's wells' pressure on the probabilistic screen's realizations "
                     "(common random numbers; docs/decisions.md, What-if)"}};
}

std::vector<std::string> what_if_console(const scenario::ResolvedScenario& s, const screening::WhatIfResult& w) {
  std::vector<std::string> out{"What-if rate changes (the same realizations as the screen; P(slip) by " +
                               util::format_iso_date(s.output.dates.back()) + "):"};
  for (std::size_t v = 0; v < w.names.size(); ++v) {
    out.push_back("  " + w.names[v] + ": " + list_text(w.wells[v]) + " x " + util::number_text(w.factors[v], 4) +
                  " from " + date_of(w.from[v]));
    std::vector<std::size_t> order(w.base.size());
    for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
    const auto change = [&](std::size_t i) {
      return std::abs(static_cast<double>(w.variant[v][i].back()) - static_cast<double>(w.base[i].back()));
    };
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return change(a) > change(b); });
    std::size_t shown = 0;
    for (std::size_t i : order) {
      if (shown++ == kWhatIfConsoleSegments || change(i) == 0.0) break;
      const double base = share(w.base[i].back(), w.realizations), p = share(w.variant[v][i].back(), w.realizations);
      out.push_back("    " + w.segment_ids[i] + ": " + util::fixed_decimals(base, 3) + " -> " + util::fixed_decimals(p, 3));
    }
    if (shown == 0 || change(order.front()) == 0.0) out.push_back("    no segment's P(slip) changes");
  }
  out.push_back("  Details: what_if.csv");
  return out;
}

}  // namespace slipscreen::outputs
