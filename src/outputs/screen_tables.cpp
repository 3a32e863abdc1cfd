#include "outputs/screen_tables.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <functional>

#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"
#include "core/util/number_text.hpp"
#include "outputs/output_text.hpp"
#include "outputs/output_units.hpp"

namespace slipscreen::outputs {

using formats::csv_field;
using util::fixed_decimals;
using formats::RunFolder;
using scenario::ResolvedScenario;
using screening::PreparedRun;

namespace {

// well_shares.csv, beside segment_times.csv.
std::string well_shares_path(const ResolvedScenario& s) {
  return (std::filesystem::path(s.output.files.segment_times).parent_path() / "well_shares.csv").generic_string();
}

}  // namespace

std::vector<ReadmeFile> screen_tables_readme(const ResolvedScenario& s) {
  const std::string pressure(OutputUnits(s.output.units).symbol(Quantity::pressure));
  return {{s.output.files.segment_times,
           "deterministic screen: one row per fault segment and output time: dp, dp_crit and their margin (" +
               pressure + "), the leading well"},
          {well_shares_path(s), "deterministic screen: one row per fault segment, output time and well: the well's "
                                "part of dp (" + pressure + ") and its share"},
          {s.output.files.segments, "deterministic screen: one row per fault segment: the principal stresses, "
                                    "pore pressure, friction and cohesion it is resolved with, stress on its plane, "
                                    "slip tendency, dp_crit, peak dp and the first date dp reaches dp_crit"}};
}

void write_screen_tables(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p,
                  const screen::ScreenResult& r) {
  const std::size_t W = p.wells.size(), K = s.output.times.size();
  const OutputUnits u(s.output.units);
  constexpr Quantity P = Quantity::pressure;
  constexpr Quantity L = Quantity::length;
  {
    formats::TextFileWriter t(folder.output("output.files.segment_times", s.output.files.segment_times));
    t.row({"segment_id", "fault_id", "date", u.column("dp", P), u.column("dp_crit", P), u.column("margin", P),
           "dp_reaches_dp_crit",
           "check_point", "leading_well", "leading_well_share"});
    for (std::size_t i = 0; i < r.segments.size(); ++i) {
      const auto& g = r.segments[i];
      for (std::size_t k = 0; k < K; ++k) {
        const std::size_t lead = g.leading_well[k];
        const bool has = W > 0 && g.dp[k] > 0;
        t.row({p.segments[i].segment_id, p.segments[i].fault_id, util::format_iso_date(s.output.dates[k]),
               u.text(g.dp[k], P, 6), u.text(g.dp_crit, P, 6), u.text(g.dp_crit - g.dp[k], P, 6),
               g.dp[k] >= g.dp_crit ? "yes" : "no",
               std::to_string(g.dp_point[k]), has ? p.wells[lead].id : "",
               has ? fixed_decimals(g.leading_share[k], 6) : ""});
      }
    }
    t.close();
  }
  {
    formats::TextFileWriter t(folder.output("output.files.segment_times", well_shares_path(s)));
    t.row({"segment_id", "date", "well_id", u.column("dp", P), "share"});
    // W rows per segment and time (8 million in a regional screen): formatted into one buffer.
    std::vector<std::string> dates, wells;
    for (const auto& d : s.output.dates) dates.push_back(csv_field(util::format_iso_date(d)) + ',');
    for (const auto& w : p.wells) wells.push_back(csv_field(w.id) + ',');
    std::string buf;
    for (std::size_t i = 0; i < r.segments.size(); ++i) {
      const auto& g = r.segments[i];
      const std::string seg = csv_field(p.segments[i].segment_id) + ',';
      for (std::size_t k = 0; k < K; ++k)
        for (std::size_t w = 0; w < W; ++w) {
          buf += seg;
          buf += dates[k];
          buf += wells[w];
          u.append(buf, g.dp[k] * g.well_share[k * W + w], P, 6);
          buf += ',';
          util::append_fixed(buf, g.well_share[k * W + w], 6);
          buf += '\n';
        }
      if (buf.size() > (1u << 20)) {
        t.write(buf);
        buf.clear();
      }
    }
    t.write(buf);
    t.close();
  }
  {
    formats::TextFileWriter t(folder.output("output.files.segments", s.output.files.segments));
    // centre_x_m, centre_y_m: working-CRS coordinates, in the CRS's unit in either system.
    t.row({"segment_id", "fault_id", "segment_index", u.column("length", L), "centre_x_m", "centre_y_m",
           "strike_deg", "dip_deg", u.column("depth", L), u.column("s1", P), u.column("s2", P), u.column("s3", P),
           u.column("pore_pressure", P), "friction", u.column("cohesion", P), u.column("sigma_n", P),
           u.column("sigma_n_eff", P), u.column("tau", P), "slip_tendency", "dilation_tendency", "slip_sense",
           u.column("dp_crit", P), "status", u.column("dp_final", P), u.column("peak_dp", P), "peak_date",
           u.column("margin", P), "first_crossing_date"});
    // The Mohr circles' stresses (docs/outputs.md): the Andersonian principal stresses at the
    // reference depth, where every segment's stress is resolved, sorted S1 >= S2 >= S3.
    const auto& st = p.inputs.stress;
    std::array<double, 3> principal = {st.sv, st.shmax, st.shmin};
    std::sort(principal.begin(), principal.end(), std::greater<>());
    for (std::size_t i = 0; i < r.segments.size(); ++i) {
      const auto& g = r.segments[i];
      const auto& seg = p.segments[i];
      double strike = p.inputs.segments[i].strike * kRadToDeg;
      strike = std::fmod(strike + 360.0, 360.0);
      t.row({seg.segment_id, seg.fault_id, std::to_string(seg.index), u.text(seg.trace.length_m, L, 1),
             fixed_decimals(seg.trace.centre.x, 1), fixed_decimals(seg.trace.centre.y, 1), fixed_decimals(strike, 2),
             fixed_decimals(seg.dip_rad * kRadToDeg, 2), u.text(s.region.reference_depth, L, 1),
             u.text(principal[0], P, 4), u.text(principal[1], P, 4), u.text(principal[2], P, 4),
             u.text(st.pore_pressure, P, 4), fixed_decimals(g.friction, 3), u.text(p.inputs.friction.cohesion, P, 4),
             u.text(g.normal_stress, P, 4), u.text(g.effective_normal_stress, P, 4), u.text(g.shear_stress, P, 4),
             fixed_decimals(g.slip_tendency, 4), fixed_decimals(g.dilation_tendency, 4), geomech::to_string(g.sense),
             u.text(g.dp_crit, P, 6), status_text(g.status), u.text(g.dp.back(), P, 6), u.text(g.peak_dp, P, 6),
             g.peak_dp > 0 ? date_of(g.peak_time) : "", u.text(g.dp_crit - g.peak_dp, P, 6),
             g.first_crossing ? date_of(*g.first_crossing) : ""});
    }
    t.close();
  }
}

}  // namespace slipscreen::outputs
