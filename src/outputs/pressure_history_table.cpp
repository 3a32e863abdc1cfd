#include "outputs/pressure_history_table.hpp"

#include "core/util/number_text.hpp"
#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"
#include "outputs/output_text.hpp"
#include "outputs/output_units.hpp"

namespace slipscreen::outputs {

std::string pressure_history_path(const scenario::ResolvedScenario& s) {
  return (std::filesystem::path(s.output.files.segment_times).parent_path() / "segment_pressure_history.csv")
      .generic_string();
}

ReadmeFile pressure_history_readme(const scenario::ResolvedScenario& s, std::size_t segments) {
  return {pressure_history_path(s),
          "deterministic screen: the " + std::to_string(segments) +
              " segments closest to failure (smallest dp_crit - peak dp), one row per segment, month (and output "
              "time) and well: the well's part of the segment's dp (" +
              std::string(OutputUnits(s.output.units).symbol(Quantity::pressure)) + ")"};
}

void write_pressure_history(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                            const screening::PreparedRun& p, const screening::SegmentPressureHistory& h) {
  formats::TextFileWriter t(folder.output("output.files.segment_times", pressure_history_path(s)));
  const OutputUnits u(s.output.units);
  constexpr Quantity P = Quantity::pressure;
  t.row({"rank", "segment_id", "date", "check_point", "well_id", u.column("dp", P), u.column("segment_dp", P)});
  const std::size_t T = h.time_count(), W = h.wells.size();
  std::string buf;
  for (std::size_t i = 0; i < h.segments.size(); ++i) {
    const std::string head = std::to_string(i + 1) + ',' + formats::csv_field(p.segments[h.segments[i]].segment_id) + ',';
    for (std::size_t k = 0; k < T; ++k) {
      const std::string when = date_of(h.times[k]) + ',' + std::to_string(h.check_point[i * T + k]) + ',';
      for (std::size_t w = 0; w < W; ++w) {
        buf += head;
        buf += when;
        buf += formats::csv_field(h.wells[w]);
        buf += ',';
        u.append(buf, h.contribution[(i * T + k) * W + w], P, 6);
        buf += ',';
        u.append(buf, h.dp[i * T + k], P, 6);
        buf += '\n';
      }
    }
    t.write(buf);
    buf.clear();
  }
  t.close();
}

}  // namespace slipscreen::outputs
