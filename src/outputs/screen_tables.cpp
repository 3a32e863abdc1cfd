#include "outputs/screen_tables.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <functional>

#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"
#include "core/util/number_text.hpp"
#include "outputs/output_text.hpp"

namespace slipscreen::outputs {

using util::append_fixed;
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
  return {{s.output.files.segment_times,
           "deterministic screen: one row per fault segment and output time: dp, dp_crit and their margin (MPa), "
           "the leading well"},
          {well_shares_path(s), "deterministic screen: one row per fault segment, output time and well: the well's "
                                "part of dp (MPa) and its share"},
          {s.output.files.segments, "deterministic screen: one row per fault segment: the principal stresses, "
                                    "pore pressure, friction and cohesion it is resolved with, stress on its plane, "
                                    "slip tendency, dp_crit, peak dp and the first date dp reaches dp_crit"}};
}

void write_screen_tables(const RunFolder& folder, const ResolvedScenario& s, const PreparedRun& p,
                  const screen::ScreenResult& r) {
  const std::size_t W = p.wells.size(), K = s.output.times.size();
  {
    formats::TextFileWriter t(folder.output("output.files.segment_times", s.output.files.segment_times));
    t.row({"segment_id", "fault_id", "date", "dp_MPa", "dp_crit_MPa", "margin_MPa", "dp_reaches_dp_crit",
           "check_point", "leading_well", "leading_well_share"});
    for (std::size_t i = 0; i < r.segments.size(); ++i) {
      const auto& g = r.segments[i];
      for (std::size_t k = 0; k < K; ++k) {
        std::size_t lead = 0;
        for (std::size_t w = 1; w < W; ++w)
          if (g.well_share[k * W + w] > g.well_share[k * W + lead]) lead = w;
        const bool has = W > 0 && g.dp[k] > 0;
        t.row({p.segments[i].segment_id, p.segments[i].fault_id, util::format_iso_date(s.output.dates[k]),
               fixed_decimals(g.dp[k] / kMPa, 6), fixed_decimals(g.dp_crit / kMPa, 6),
               fixed_decimals((g.dp_crit - g.dp[k]) / kMPa, 6), g.dp[k] >= g.dp_crit ? "yes" : "no",
               std::to_string(g.dp_point[k]), has ? p.wells[lead].id : "",
               has ? fixed_decimals(g.well_share[k * W + lead], 6) : ""});
      }
    }
    t.close();
  }
  {
    formats::TextFileWriter t(folder.output("output.files.segment_times", well_shares_path(s)));
    t.row({"segment_id", "date", "well_id", "dp_MPa", "share"});
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
          append_fixed(buf, g.dp[k] * g.well_share[k * W + w] / kMPa, 6);
          buf += ',';
          append_fixed(buf, g.well_share[k * W + w], 6);
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
    t.row({"segment_id", "fault_id", "segment_index", "length_m", "centre_x_m", "centre_y_m", "strike_deg",
           "dip_deg", "depth_m", "s1_MPa", "s2_MPa", "s3_MPa", "pore_pressure_MPa", "friction", "cohesion_MPa",
           "sigma_n_MPa", "sigma_n_eff_MPa", "tau_MPa", "slip_tendency", "dilation_tendency",
           "slip_sense", "dp_crit_MPa", "status", "dp_final_MPa", "peak_dp_MPa", "peak_date", "margin_MPa",
           "first_crossing_date"});
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
      t.row({seg.segment_id, seg.fault_id, std::to_string(seg.index), fixed_decimals(seg.trace.length_m, 1),
             fixed_decimals(seg.trace.centre.x, 1), fixed_decimals(seg.trace.centre.y, 1), fixed_decimals(strike, 2),
             fixed_decimals(seg.dip_rad * kRadToDeg, 2), fixed_decimals(s.region.reference_depth, 1),
             fixed_decimals(principal[0] / kMPa, 4), fixed_decimals(principal[1] / kMPa, 4),
             fixed_decimals(principal[2] / kMPa, 4), fixed_decimals(st.pore_pressure / kMPa, 4),
             fixed_decimals(g.friction, 3), fixed_decimals(p.inputs.friction.cohesion / kMPa, 4),
             fixed_decimals(g.normal_stress / kMPa, 4), fixed_decimals(g.effective_normal_stress / kMPa, 4),
             fixed_decimals(g.shear_stress / kMPa, 4), fixed_decimals(g.slip_tendency, 4),
             fixed_decimals(g.dilation_tendency, 4), geomech::to_string(g.sense), fixed_decimals(g.dp_crit / kMPa, 6),
             status_text(g.status), fixed_decimals(g.dp.back() / kMPa, 6), fixed_decimals(g.peak_dp / kMPa, 6),
             g.peak_dp > 0 ? date_of(g.peak_time) : "", fixed_decimals((g.dp_crit - g.peak_dp) / kMPa, 6),
             g.first_crossing ? date_of(*g.first_crossing) : ""});
    }
    t.close();
  }
}

}  // namespace slipscreen::outputs
