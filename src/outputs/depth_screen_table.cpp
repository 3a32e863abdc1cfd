#include "outputs/depth_screen_table.hpp"

#include <filesystem>
#include <string>

#include "core/stats/wilson_interval.hpp"
#include "core/util/civil_date.hpp"
#include "core/util/number_text.hpp"
#include "formats/files/text_file.hpp"
#include "outputs/output_units.hpp"

namespace slipscreen::outputs {
namespace {

// fault_depth.csv, beside segment_times.csv.
std::string depth_table_path(const scenario::ResolvedScenario& s) {
  return (std::filesystem::path(s.output.files.segment_times).parent_path() / "fault_depth.csv").generic_string();
}

std::string depth_probability_path(const scenario::ResolvedScenario& s) {
  return (std::filesystem::path(s.output.files.segment_times).parent_path() / "fault_depth_probability.csv")
      .generic_string();
}

}  // namespace

ReadmeFile depth_probability_readme(const scenario::ResolvedScenario& s) {
  return {depth_probability_path(s),
          "3-D poroelastic model, Monte Carlo over [uncertainty]: one row per fault segment and output time, the "
          "realizations and how many had the segment at failure by then (some check point in depth with dcff >= "
          "mu dp_crit, or already critical), p_slip = their ratio and its Wilson interval at the [uncertainty] "
          "confidence (dimensionless), and the thresholds p_slip reaches"};
}

void write_depth_probability_table(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                                   const screening::PreparedRun& p, const screening::DepthProbability& d) {
  formats::TextFileWriter t(folder.output("output.files.segment_times", depth_probability_path(s)));
  t.row({"segment_id", "fault_id", "date", "realizations", "realizations_slipped", "p_slip", "p_slip_ci_low",
         "p_slip_ci_high", "thresholds_reached"});
  for (std::size_t i = 0; i < d.slipped.size(); ++i)
    for (std::size_t k = 0; k < d.slipped[i].size(); ++k) {
      const auto ci = stats::wilson_interval(d.slipped[i][k], d.realizations, d.z);
      std::string reached;
      for (double th : s.uncertainty.thresholds)
        if (ci.estimate >= th) {
          if (!reached.empty()) reached += ';';
          reached += util::fixed_decimals(th, 3);
        }
      t.row({p.segments[i].segment_id, p.segments[i].fault_id, util::format_iso_date(s.output.dates[k]),
             std::to_string(d.realizations), std::to_string(d.slipped[i][k]), util::fixed_decimals(ci.estimate, 4),
             util::fixed_decimals(ci.lower, 4), util::fixed_decimals(ci.upper, 4), reached});
    }
  t.close();
}

nlohmann::json depth_probability_manifest(const scenario::ResolvedScenario& s, const screening::DepthProbability& d) {
  return {{"uncertainty", scenario::to_json(s.uncertainty)},
          {"realizations", d.realizations},
          {"sampler", std::string(stats::sampling_method_name(d.sampler.method))},
          {"stream", std::string(d.sampler.stream)},
          {"inputs", d.input_names},
          {"method", "one deterministic screen in depth per realization (core/poro/depth_monte_carlo.hpp)"}};
}

ReadmeFile depth_screen_readme(const scenario::ResolvedScenario& s) {
  const std::string pressure(OutputUnits(s.output.units).symbol(Quantity::pressure));
  return {depth_table_path(s),
          "3-D poroelastic model (Rudnicki 1986), faults in depth: one row per fault segment and output time, at the "
          "check point closest to failure: its position and depth, dp, the stress changes on the plane "
          "(dtau in the slip direction, dsigma_n compression positive), dcff = dtau - mu (dsigma_n - dp), the "
          "point's dp_crit and the Coulomb margin mu dp_crit - dcff (" + pressure + "), and the segment's first "
          "crossing (dcff >= mu dp_crit at some check point) with that point's depth and dcff there"};
}

void write_depth_screen_table(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                              const screening::PreparedRun& p, const screening::DepthScreen& d) {
  const OutputUnits u(s.output.units);
  constexpr Quantity P = Quantity::pressure;
  constexpr Quantity L = Quantity::length;
  formats::TextFileWriter t(folder.output("output.files.segment_times", depth_table_path(s)));
  t.row({"segment_id", "fault_id", "date", "check_point", "x_m", "y_m", u.column("depth", L), u.column("dp", P),
         u.column("dtau", P), u.column("dsigma_n", P), u.column("dcff", P), u.column("dp_crit", P),
         u.column("coulomb_margin", P), "first_crossing_date", u.column("first_crossing_depth", L),
         u.column("first_crossing_dcff", P)});
  for (std::size_t i = 0; i < d.result.segments.size(); ++i) {
    const poro::DepthSegmentScreen& g = d.result.segments[i];
    const std::string crossing =
        g.first_crossing ? util::format_iso_date(util::date_at(*g.first_crossing)) : "";
    // the crossing point's depth and ΔCFF at the crossing time (empty when the segment does not cross)
    const bool crossed = g.first_crossing && g.crossing_point && g.crossing_change;
    const std::string crossing_depth = crossed ? u.text(d.points[i][*g.crossing_point].z(), L, 1) : "";
    const std::string crossing_dcff = crossed ? u.text(g.crossing_change->dcff, P, 6) : "";
    for (std::size_t k = 0; k < g.change.size(); ++k) {
      const std::size_t j = g.point[k];
      const poro::CoulombChange& c = g.change[k];
      const Eigen::Vector3d& x = d.points[i][j];
      t.row({p.segments[i].segment_id, p.segments[i].fault_id, util::format_iso_date(s.output.dates[k]),
             std::to_string(j), util::fixed_decimals(x.x(), 2), util::fixed_decimals(x.y(), 2), u.text(x.z(), L, 1),
             u.text(c.dp, P, 6), u.text(c.dtau, P, 6), u.text(c.dsigma_n, P, 6), u.text(c.dcff, P, 6),
             u.text(g.dp_crit[j], P, 6), u.text(g.friction * g.dp_crit[j] - c.dcff, P, 6), crossing, crossing_depth,
             crossing_dcff});
    }
  }
  t.close();
}

}  // namespace slipscreen::outputs
