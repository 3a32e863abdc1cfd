#include "outputs/report/report_text.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <map>

#include "core/caution.hpp"
#include "core/errors.hpp"
#include "core/geomech/coulomb.hpp"
#include "core/geomech/frictional_limit.hpp"
#include "core/util/number_text.hpp"
#include "outputs/report/depth_figures.hpp"
#include "outputs/report/report_tables.hpp"
#include "outputs/report/run_table.hpp"

namespace slipscreen::outputs::report {
namespace {

using Kind = ReportBlock::Kind;
using nlohmann::json;

// manifest[a][b]... or a null json when a key is missing.
const json& at(const json& j, std::initializer_list<const char*> keys) {
  static const json kNull;
  const json* cur = &j;
  for (const char* k : keys) {
    if (!cur->is_object()) return kNull;
    const auto it = cur->find(k);
    if (it == cur->end()) return kNull;
    cur = &*it;
  }
  return *cur;
}

std::string text_of(const json& j, const std::string& fallback = "") {
  if (j.is_string()) return j.get<std::string>();
  if (j.is_number_integer() || j.is_number_unsigned()) return std::to_string(j.get<std::int64_t>());
  if (j.is_number()) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.6g", j.get<double>());
    return buf;
  }
  if (j.is_boolean()) return j.get<bool>() ? "yes" : "no";
  return fallback;
}

std::string fixed(double v, int decimals) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

// Pressures of the manifest (Pa) in the run's units: MPa, or psi for an oilfield run.
std::string pressure(const ReportSource& s, double pa) {
  if (text_of(at(s.manifest, {"parameters", "scenario", "output", "units"})) == "oilfield")
    return fixed(pa / 6894.757293168361, 0) + " psi";
  return fixed(pa / 1e6, 2) + " MPa";
}
std::string depth(const ReportSource& s, double m) {
  if (text_of(at(s.manifest, {"parameters", "scenario", "output", "units"})) == "oilfield")
    return fixed(m / 0.3048, 0) + " ft";
  return fixed(m, 0) + " m";
}

ReportBlock heading(std::string t) { return {.kind = Kind::heading, .text = std::move(t)}; }
ReportBlock paragraph(std::string t) { return {.kind = Kind::paragraph, .text = std::move(t)}; }

void run_facts(const ReportSource& s, const std::string& built, std::vector<ReportBlock>& out) {
  const json& m = s.manifest;
  ReportBlock f{.kind = Kind::facts};
  f.facts.emplace_back("Scenario file", text_of(at(m, {"parameters", "scenario", "scenario"}), "-"));
  f.facts.emplace_back("Run date", text_of(at(m, {"created_utc"}), "not recorded (a reproducible run)"));
  if (!built.empty()) f.facts.emplace_back("Report built", built);
  f.facts.emplace_back("Tool", text_of(at(m, {"tool", "name"}), "slipscreen") + " " +
                                   text_of(at(m, {"tool", "version"}), "?") + " (build " +
                                   text_of(at(m, {"tool", "git_commit"}), "unknown") + ")");
  f.facts.emplace_back("Seed", text_of(at(m, {"seed"}), "-"));
  const json& valid = at(m, {"parameters", "probabilistic", "realizations_valid"});
  const json& asked = at(m, {"parameters", "probabilistic", "uncertainty", "realizations"});
  f.facts.emplace_back("Realizations", valid.is_null() ? "none (deterministic screen only)"
                                                       : text_of(valid) + " valid of " + text_of(asked, "?"));
  std::string screens;
  for (const auto& [name, ran] : at(m, {"screens"}).items())
    if (ran.is_boolean() && ran.get<bool>()) screens += (screens.empty() ? "" : ", ") + name;
  f.facts.emplace_back("Screens run", screens.empty() ? "-" : screens);
  const json& dates = at(m, {"parameters", "scenario", "output", "dates"});
  if (dates.is_array() && !dates.empty())
    f.facts.emplace_back("Output times", std::to_string(dates.size()) + ", from " + text_of(dates.front()) + " to " +
                                             text_of(dates.back()));
  f.facts.emplace_back("Working CRS", text_of(at(m, {"parameters", "scenario", "region", "crs"}), "-"));
  out.push_back(std::move(f));
}

void inputs_table(const ReportSource& s, std::vector<ReportBlock>& out) {
  out.push_back(heading("Inputs and their SHA-256"));
  out.push_back(paragraph("Every file the run read, as its manifest.json records it. A file with another SHA-256 "
                          "is not the file this report was computed from."));
  ReportBlock t{.kind = Kind::table, .header = {"role", "file", "bytes", "SHA-256"}};
  for (const auto& in : at(s.manifest, {"inputs"}))
    t.rows.push_back({text_of(at(in, {"role"})), text_of(at(in, {"path"})), text_of(at(in, {"bytes"})),
                      text_of(at(in, {"sha256"}))});
  out.push_back(std::move(t));
}

bool leaky_formation(const ReportSource& s) {
  return text_of(at(s.manifest, {"parameters", "scenario", "region", "formation", "model"})).rfind("leaky", 0) == 0;
}
bool poroelastic_path(const ReportSource& s) {
  const json& on = at(s.manifest, {"parameters", "scenario", "region", "stress", "poroelastic_path"});
  return on.is_boolean() && on.get<bool>();
}

// The uncertainty of `key` as the scenario wrote it ("" when fixed or without a probabilistic screen).
std::string uncertainty_of(const ReportSource& s, const std::string& key) {
  for (const auto& v : at(s.manifest, {"parameters", "probabilistic", "uncertainty", "inputs"}))
    if (text_of(at(v, {"key"})) == key) return text_of(at(v, {"written"}));
  return "";
}

// Which pore-pressure model and which stress path the run used (the manifest's resolved
// [formation] and [stress]; docs/pressure.md, docs/physics.md).
void models_section(const ReportSource& s, std::vector<ReportBlock>& out) {
  const json& fm = at(s.manifest, {"parameters", "scenario", "region", "formation"});
  const json& st = at(s.manifest, {"parameters", "scenario", "region", "stress"});
  if (!fm.is_object() || !st.is_object()) return;
  out.push_back(heading("Pressure and stress models"));
  ReportBlock f{.kind = Kind::facts};
  const bool probabilistic = !at(s.manifest, {"parameters", "probabilistic"}).is_null();
  std::string model = leaky_formation(s)
                          ? "Hantush & Jacob (1955) leaky formation: line sources with the leaky well function "
                            "W(u, r/B) in place of Theis's E1, superposed over wells and rate changes"
                          : "Theis (1935): line sources in a confined formation, superposed over wells and rate changes";
  const json& bounds = at(fm, {"boundaries"});
  if (bounds.is_array() && !bounds.empty())
    model += "; " + std::to_string(bounds.size()) + (bounds.size() == 1 ? " straight boundary" : " straight boundaries") +
             " by image wells";
  f.facts.emplace_back("Pore-pressure model", model);
  const json& model_name = at(fm, {"model"});
  if (model_name.is_string() && model_name.get<std::string>().rfind("poroelastic_3d", 0) == 0)
    f.facts.emplace_back("Faults in depth",
                         "Rudnicki (1986) point sources on each well's open interval in one infinite poroelastic "
                         "solid (shear modulus " + text_of(at(fm, {"shear_modulus_Pa"})) + " Pa, ν " +
                             text_of(at(fm, {"poisson_ratio"})) + ", ν_u " + text_of(at(fm, {"undrained_poisson_ratio"})) +
                             ", α " + text_of(at(fm, {"biot"})) + "): Δp and the stress change resolved on each "
                             "fault at check points down dip, ΔCFF = Δτ − μ(Δσn − Δp), in fault_depth.csv (the section "
                             "Faults in depth and its figures); the other figures and tables show the injected "
                             "layer's Theis pressure with the solid's diffusivity (docs/physics.md)");
  const json& b = at(fm, {"leakage_factor_m"});
  if (leaky_formation(s) && b.is_number()) {
    std::string v = depth(s, b.get<double>());
    const json& bt = at(fm, {"aquitard_thickness_m"});
    const json& kt = at(fm, {"aquitard_permeability_m2"});
    if (bt.is_number() && kt.is_number())
      v += ", B = √(k h b′/k′) from the aquitard's thickness b′ = " + depth(s, bt.get<double>()) +
           " and permeability k′ = " + text_of(kt) + " m²";
    else
      v += ", as given";
    if (probabilistic) v += "; the leakage rate D/B² is the same in every realization";
    f.facts.emplace_back("Leakage factor B", v);
  }
  if (at(fm, {"diffusivity_m2_per_s"}).is_number())
    f.facts.emplace_back("Hydraulic diffusivity D", text_of(at(fm, {"diffusivity_m2_per_s"})) + " m²/s");
  if (!poroelastic_path(s)) {
    f.facts.emplace_back("Stress path", "pore pressure only: the total stresses stay as they were, and the Coulomb "
                                        "stress changes by μ Δp");
  } else {
    const json& alpha = at(st, {"biot"});
    const json& nu = at(st, {"poisson_ratio"});
    std::string v = "poroelastic (Engelder & Fischer 1994): ΔSh = ΔSH = κ Δp, ΔSv = 0, κ = α(1 − 2ν)/(1 − ν)";
    if (alpha.is_number() && nu.is_number()) {
      try {
        const double kappa = geomech::stress_path_coefficient({alpha.get<double>(), nu.get<double>()});
        v += " = " + fixed(kappa, 3) + " for Biot's α = " + text_of(alpha) + " and Poisson's ratio ν = " + text_of(nu);
      } catch (const InputError& e) {
        v += std::string(" (not computed: ") + e.what() + ")";
      }
    }
    f.facts.emplace_back("Stress path", v + "; Δp_crit is found along the path");
    if (probabilistic) {
      const std::string ua = uncertainty_of(s, "stress.biot"), un = uncertainty_of(s, "stress.poisson_ratio");
      f.facts.emplace_back(
          "Stress path in the probabilistic screen",
          ua.empty() && un.empty()
              ? "the same κ in every realization (α and ν fixed)"
              : "κ from each realization's α (" + (ua.empty() ? "fixed" : ua) + ") and ν (" +
                    (un.empty() ? "fixed" : un) + ")");
    }
  }
  out.push_back(std::move(f));
}

void stress_section(const ReportSource& s, std::vector<ReportBlock>& out) {
  const json& st = at(s.manifest, {"parameters", "run", "stress_at_reference_depth"});
  if (!st.is_object()) return;
  out.push_back(heading("Stress at the reference depth"));
  const double sv = at(st, {"sv_Pa"}).get<double>(), sH = at(st, {"shmax_Pa"}).get<double>();
  const double sh = at(st, {"shmin_Pa"}).get<double>(), p0 = at(st, {"pore_pressure_Pa"}).get<double>();
  const json& depth_m = at(s.manifest, {"parameters", "scenario", "region", "reference_depth_m"});
  ReportBlock f{.kind = Kind::facts};
  if (depth_m.is_number()) f.facts.emplace_back("Reference depth", depth(s, depth_m.get<double>()));
  f.facts.emplace_back("Vertical stress Sv", pressure(s, sv));
  f.facts.emplace_back("Greatest horizontal stress SHmax", pressure(s, sH));
  f.facts.emplace_back("Least horizontal stress Shmin", pressure(s, sh));
  f.facts.emplace_back("Pore pressure p0", pressure(s, p0));
  const json& mu = at(s.manifest, {"parameters", "scenario", "region", "faults", "friction"});
  if (mu.is_number() && mu.get<double>() > 0) {
    const double s1 = std::max({sv, sH, sh}), s3 = std::min({sv, sH, sh});
    try {
      const auto c = geomech::check_frictional_limit(s1, s3, p0, mu.get<double>());
      f.facts.emplace_back("Frictional-limit check (Jaeger & Cook 1979; Zoback 2007)",
                           "(S1 − p0)/(S3 − p0) = " + fixed(c.ratio, 2) + " against the limit [√(μ² + 1) + μ]² = " +
                               fixed(c.limit, 2) + " for μ = " + text_of(mu) + ": " + geomech::to_string(c.status));
    } catch (const InputError& e) {
      f.facts.emplace_back("Frictional-limit check", std::string("not possible: ") + e.what());
    }
  }
  out.push_back(std::move(f));
  const json& beyond = at(s.manifest, {"parameters", "probabilistic", "realizations_beyond_frictional_limit"});
  if (!beyond.is_null())
    out.push_back(paragraph("Realizations of the probabilistic screen whose sampled stress lay beyond the frictional "
                            "limit: " + text_of(beyond) + "."));
}

void segments_section(const ReportSource& s, std::vector<ReportBlock>& out) {
  const auto top = top_segments(s, s.top_segments);
  if (top.ids.empty()) return;
  out.push_back(heading("Segments closest to failure"));
  const RunTable& seg = s.table(segments_file(s));
  const std::string u = seg.quantity_unit("dp_crit");
  ReportBlock t{.kind = Kind::table};
  t.header = {"segment", "status", "Δp_crit [" + u + "]", "peak Δp [" + u + "]", "margin [" + u + "]",
              "first reached"};
  std::optional<RunTable> sum;
  if (top.probabilistic) {
    sum = s.table("segment_probability_summary.csv");
    t.header.push_back("P(slip) final");
    t.header.push_back("95 % interval");
    out.push_back(paragraph("The " + std::to_string(top.ids.size()) +
                            " segments with the highest probability of slip by the last output time "
                            "(segment_probability_summary.csv), with the deterministic screen's values (segments.csv). "
                            "The interval is the Wilson score interval at the run's confidence."));
  } else {
    out.push_back(paragraph("The " + std::to_string(top.ids.size()) +
                            " segments with the smallest margin Δp_crit − peak Δp (segments.csv); a negative margin "
                            "means the pressure change reached the critical value."));
  }
  for (const auto& id : top.ids) {
    const auto r = seg.find_row("segment_id", id);
    if (!r) continue;
    std::vector<std::string> row = {id, seg.text(*r, "status"), seg.text(*r, "dp_crit_" + u),
                                    seg.text(*r, "peak_dp_" + u), seg.text(*r, "margin_" + u),
                                    seg.text(*r, "first_crossing_date").empty() ? "never"
                                                                                : seg.text(*r, "first_crossing_date")};
    if (sum) {
      const auto q = sum->find_row("segment_id", id);
      row.push_back(q ? sum->text(*q, "p_slip_final") : "");
      row.push_back(q ? sum->text(*q, "p_slip_final_ci_low") + " – " + sum->text(*q, "p_slip_final_ci_high") : "");
    }
    t.rows.push_back(std::move(row));
  }
  out.push_back(std::move(t));

  if (!sum) return;
  // Segments whose P(slip) reaches a threshold: the first output date of each threshold.
  std::vector<std::string> threshold_columns;
  ReportBlock c{.kind = Kind::table, .header = {"segment"}};
  for (const auto& h : sum->header())
    if (h.rfind("first_date_p_", 0) == 0) {
      threshold_columns.push_back(h);
      c.header.push_back("P(slip) ≥ " + h.substr(13) + " from");
    }
  c.header.push_back("P(slip) final");
  c.header.push_back("95 % interval");
  std::vector<std::pair<double, std::vector<std::string>>> rows;
  for (std::size_t r = 0; r < sum->rows(); ++r) {
    std::vector<std::string> row = {sum->text(r, "segment_id")};
    bool any = false;
    for (const auto& col : threshold_columns) {
      row.push_back(sum->text(r, col).empty() ? "-" : sum->text(r, col));
      any = any || !sum->text(r, col).empty();
    }
    if (!any) continue;
    row.push_back(sum->text(r, "p_slip_final"));
    row.push_back(sum->text(r, "p_slip_final_ci_low") + " – " + sum->text(r, "p_slip_final_ci_high"));
    rows.emplace_back(-sum->number(r, sum->column("p_slip_final")), std::move(row));
  }
  out.push_back(heading("Segments crossing the thresholds"));
  if (rows.empty()) {
    out.push_back(paragraph("No segment's P(slip) reaches a threshold of the run by its last output time."));
    return;
  }
  std::stable_sort(rows.begin(), rows.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
  for (auto& r : rows) c.rows.push_back(std::move(r.second));
  out.push_back(paragraph(std::to_string(c.rows.size()) +
                          " segments whose P(slip) reaches a threshold of the scenario by the last output time, "
                          "with the first output date at which it does (segment_probability_summary.csv), "
                          "highest final probability first."));
  out.push_back(std::move(c));
}

std::string factor_text(const json& j) {
  return j.is_number() ? util::number_text(j.get<double>(), 3) : "-";
}

// How many names a list holds, and the first three.
std::string names_text(const json& list) {
  if (!list.is_array() || list.empty()) return "none";
  std::string out = std::to_string(list.size()) + ": ";
  for (std::size_t i = 0; i < list.size() && i < 3; ++i) out += (i ? ", " : "") + text_of(list[i]);
  if (list.size() > 3) out += ", ...";
  return out;
}

// One answer of the manifest's capacity block as cells: the allowed f and the binding segment.
void answer_cells(const json& a, const json& f_max, std::vector<std::string>& row) {
  if (!at(a, {"exceeded_up_to_f_max"}).is_boolean() || !a["exceeded_up_to_f_max"].get<bool>()) {
    row.insert(row.end(), {"above " + text_of(f_max, "f_max"), "none up to f = " + text_of(f_max, "f_max")});
    return;
  }
  row.push_back(factor_text(at(a, {"f_allowed"})));
  row.push_back(text_of(at(a, {"binding_segment"}), "-"));
}

// The allowable factor on the group's rates (manifest.json, capacity; docs/decisions.md).
void capacity_section(const ReportSource& s, std::vector<ReportBlock>& out) {
  const json* cap = capacity_block(s);
  if (cap == nullptr) return;
  out.push_back(heading("Allowable rate"));
  std::string wells;
  for (const auto& w : at(*cap, {"wells"})) wells += (wells.empty() ? "" : ", ") + text_of(w);
  const std::string from = text_of(at(*cap, {"from"}));
  const std::string horizon = text_of(at(*cap, {"horizon"}), "the last output time");
  const json& conf = at(*cap, {"confidence"});
  out.push_back(paragraph(
      "The largest factor f on the planned rates of " + wells + (from.empty() ? " (their whole schedule)" : " from " + from) +
      " for which every fault segment's P(slip by " + horizon + " | f) stays at or below each threshold; f = 1 is the "
      "plan. The allowed factor is judged on the upper end of the Wilson interval" +
      (conf.is_number() ? " at confidence " + text_of(conf) : "") +
      " and rounded down to 3 significant digits, below the exact step at which the binding segment's P first "
      "exceeds the threshold (manifest.json, capacity). The answers are exact by linearity of Δp in the rates, on the screen's own "
      "realizations (docs/decisions.md), and are screening estimates like the screen itself. Per segment: "
      "capacity.csv; the curve: figure capacity_curve."));
  const json& f_max = at(*cap, {"f_max"});
  ReportBlock t{.kind = Kind::table,
                .header = {"answer", "allowed f", "binding segment", "point estimate's f",
                           "segments reached without the group"}};
  for (const auto& th : at(*cap, {"thresholds"})) {
    std::vector<std::string> row{"P(slip) ≤ " + text_of(at(th, {"threshold"}))};
    answer_cells(at(th, {"wilson_upper"}), f_max, row);
    const json& pt = at(th, {"point_estimate"});
    row.push_back(at(pt, {"f_allowed"}).is_number() ? factor_text(at(pt, {"f_allowed"})) : "above " + text_of(f_max, "f_max"));
    row.push_back(names_text(at(th, {"reached_without_group"})));
    t.rows.push_back(std::move(row));
  }
  const json& det = at(*cap, {"deterministic"});
  if (det.is_object()) {
    const json& margin = at(det, {"margin_Pa"});
    std::vector<std::string> row{"deterministic: Δp_crit − Δp ≥ " +
                                 (margin.is_number() ? pressure(s, margin.get<double>()) : std::string("the margin"))};
    answer_cells(at(det, {"answer"}), f_max, row);
    row.push_back("-");
    row.push_back(names_text(at(det, {"reached_without_group"})));
    t.rows.push_back(std::move(row));
  }
  out.push_back(std::move(t));
}

// What-if rate changes (manifest.json, what_if; what_if.csv): per variant its wells and the
// segments whose P(slip by the last date) changes most.
void what_if_section(const ReportSource& s, std::vector<ReportBlock>& out) {
  const json& wi = at(s.manifest, {"parameters", "what_if"});
  const std::string file = what_if_file(s);
  if (!wi.is_object() || !RunTable::exists(s.folder, file)) return;
  const RunTable& t = s.table(file);
  std::string last;
  for (std::size_t r = 0; r < t.rows(); ++r) last = std::max(last, t.text(r, "date"));
  out.push_back(heading("What-if rate changes"));
  out.push_back(paragraph(
      "Each variant changes the rates of some wells from a date on and is computed on the same realizations as the "
      "screen, so a change in P(slip) is the change the rates make, not Monte Carlo noise; it is exact by linearity "
      "of Δp in the rates (docs/decisions.md) and a screening estimate like the screen itself. Below, per variant, the "
      "segments whose P(slip by " + last + ") changes most (what_if.csv)."));
  for (const auto& v : at(wi, {"variants"})) {
    const std::string name = text_of(at(v, {"name"}));
    std::string wells;
    for (const auto& w : at(v, {"wells"})) wells += (wells.empty() ? "" : ", ") + text_of(w);
    ReportBlock f{.kind = Kind::facts};
    f.facts.emplace_back("Variant", name);
    f.facts.emplace_back("Wells", wells.empty() ? "none" : wells);
    f.facts.emplace_back("Factor on their rates", text_of(at(v, {"factor"}), "-"));
    f.facts.emplace_back("From", text_of(at(v, {"from"}), "-"));
    out.push_back(std::move(f));
    const std::string pcol = "p_slip_" + name, ccol = "change_" + name;
    if (!t.has_column(pcol) || !t.has_column(ccol))
      throw InputError("column", pcol, "the what-if variant's columns " + pcol + " and " + ccol, t.file());
    std::vector<std::pair<double, std::size_t>> moved;
    for (std::size_t r = 0; r < t.rows(); ++r)
      if (t.text(r, "date") == last) {
        const double change = t.number(r, ccol);
        if (change != 0.0) moved.emplace_back(-std::abs(change), r);
      }
    std::stable_sort(moved.begin(), moved.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
    if (moved.empty()) {
      out.push_back(paragraph("No segment's P(slip by " + last + ") changes."));
      continue;
    }
    ReportBlock c{.kind = Kind::table, .header = {"segment", "P(slip) base", "P(slip) " + name, "change"}};
    for (std::size_t i = 0; i < moved.size() && i < 5; ++i) {
      const std::size_t r = moved[i].second;
      c.rows.push_back({t.text(r, "segment_id"), t.text(r, "p_slip_base"), t.text(r, pcol), t.text(r, ccol)});
    }
    out.push_back(std::move(c));
  }
}

// The screen of faults in depth (3-D poroelastic model; depth_figures.hpp).
void depth_section(const ReportSource& s, std::vector<ReportBlock>& out) {
  const DepthTable t = depth_table(s, s.top_segments);
  if (t.rows.empty()) return;
  out.push_back(heading("Faults in depth"));
  out.push_back(paragraph(
      "The 3-D poroelastic model (Rudnicki 1986) gives Δp and the stress change at check points along strike and down "
      "dip; a segment reaches Coulomb failure when ΔCFF = Δτ − μ(Δσn − Δp) ≥ μΔp_crit at some point (docs/physics.md). " +
      std::string(t.probabilistic ? "P(slip by " + t.last_date + ") is the share of " + t.realizations +
                                        " realizations of the solid, permeability and friction in which some point has "
                                        "failed by then (fault_depth_probability.csv); the other columns are the "
                                        "best-estimate screen's"
                                  : "Without [uncertainty] the screen is the best estimate only") +
      ". The segments most critical in depth (fault_depth.csv): the first crossing's date, the depth of its check point "
      "and ΔCFF there, and the smallest margin μΔp_crit − ΔCFF at the output dates."));
  out.push_back({.kind = Kind::table, .header = t.header, .rows = t.rows});
}

void catalog_section(const ReportSource& s, std::vector<ReportBlock>& out) {
  std::error_code ec;
  const auto path = s.folder / "catalog_summary.json";
  if (!std::filesystem::is_regular_file(path, ec)) return;
  std::ifstream in(path, std::ios::binary);
  const json j = json::parse(in, nullptr, false);
  if (j.is_discarded() || !j.is_object())
    throw InputError("catalog_summary.json", path.string(), "the run's catalog review as JSON");
  out.push_back(heading("Catalog review"));
  ReportBlock f{.kind = Kind::facts};
  f.facts.emplace_back("Catalog", text_of(at(j, {"input", "path"}), text_of(at(s.manifest, {"parameters", "catalog", "file"}), "-")));
  f.facts.emplace_back("Events kept", text_of(at(s.manifest, {"parameters", "catalog", "events_kept"}), "-"));
  f.facts.emplace_back("Time span", text_of(at(j, {"first_time"}), "-") + " to " + text_of(at(j, {"last_time"}), "-"));
  f.facts.emplace_back("Magnitudes", text_of(at(j, {"magnitude_min"}), "-") + " to " + text_of(at(j, {"magnitude_max"}), "-"));
  if (!at(j, {"completeness", "mc"}).is_null())
    f.facts.emplace_back("Magnitude of completeness Mc", text_of(at(j, {"completeness", "mc"})) + " (" +
                                                             text_of(at(j, {"completeness", "method"})) + ", " +
                                                             text_of(at(j, {"completeness", "events_at_or_above_mc"})) +
                                                             " events at or above it)");
  const json& b = at(j, {"b_value"});
  if (!at(b, {"b"}).is_null())
    f.facts.emplace_back("b-value", text_of(at(b, {"b"})) + ", bootstrap interval at confidence " +
                                        text_of(at(b, {"bootstrap", "confidence"})) + ": " +
                                        text_of(at(b, {"bootstrap", "lower"})) + " – " +
                                        text_of(at(b, {"bootstrap", "upper"})));
  if (!at(j, {"seismogenic_index", "sigma"}).is_null())
    f.facts.emplace_back("Seismogenic index Σ", text_of(at(j, {"seismogenic_index", "sigma"})) + " (" +
                                                    text_of(at(j, {"seismogenic_index", "method"})) + ")");
  for (const auto& fc : at(j, {"forecasts"}))
    f.facts.emplace_back("Forecast M ≥ " + text_of(at(fc, {"magnitude"})),
                         text_of(at(fc, {"expected_events"})) + " events expected, P(at least one) = " +
                             text_of(at(fc, {"probability_at_least_one"})));
  if (!at(j, {"mcgarr_bound", "max_mw"}).is_null())
    f.facts.emplace_back("Largest magnitude by injected volume", "Mw " + text_of(at(j, {"mcgarr_bound", "max_mw"})) +
                                                                    " (" + text_of(at(j, {"mcgarr_bound", "method"})) + ")");
  const json& fp = at(j, {"against_model", "footprint"});
  if (fp.is_object())
    f.facts.emplace_back("Events in the Δp footprint",
                         text_of(at(fp, {"inside"})) + " of " + text_of(at(fp, {"events_in_study_area"})) +
                             " with Δp ≥ " + text_of(at(fp, {"threshold_MPa"})) + " MPa; " +
                             text_of(at(fp, {"expected_by_chance"})) + " expected by chance, one-sided p = " +
                             text_of(at(fp, {"p_value"})));
  out.push_back(std::move(f));
  ReportBlock a{.kind = Kind::list};
  for (const auto& x : at(j, {"assumptions"})) a.rows.push_back({text_of(x)});
  if (!a.rows.empty()) {
    out.push_back(paragraph("Assumptions of the review (catalog_summary.json):"));
    out.push_back(std::move(a));
  }
}

void reading_section(const ReportSource& s, std::vector<ReportBlock>& out) {
  out.push_back(heading("How to read this report"));
  ReportBlock l{.kind = Kind::list};
  l.rows = {
      {std::string("Δp is the modelled pore-pressure increase from injection (") +
       (leaky_formation(s) ? "Hantush & Jacob 1955 leaky-formation line sources" : "Theis 1935 line sources") +
       ", superposed over wells and rate changes). Δp_crit is the increase that would bring a fault segment to "
       "Coulomb failure with its best-estimate stress and friction (Hubbert & Rubey 1959)" +
       (poroelastic_path(s) ? ", the horizontal stresses rising with the pressure along the poroelastic path" : "") +
       ". The margin is Δp_crit − Δp."},
      {"P(slip by t) is the fraction of the probabilistic screen's realizations in which the segment has reached "
       "Δp_crit by date t through injection; its 95 % interval is the Wilson score interval, which reflects the "
       "number of realizations, not the uncertainty of the model itself."},
      {"A threshold line marks the probabilities the scenario flags. A segment crossing one is a reason to look "
       "closer, not a forecast of an earthquake; a segment below every threshold is not shown to be safe."},
      {"Every number comes from the run folder: the tables named beside each table and figure, and manifest.json. "
       "Each figure's numbers are in figures/<name>.csv."},
  };
  out.push_back(std::move(l));
}

}  // namespace

ReportDocument report_document(const ReportSource& s, const std::string& built, const std::vector<Figure>& figures) {
  ReportDocument d;
  const std::string title = text_of(at(s.manifest, {"parameters", "scenario", "title"}));
  d.title = title.empty() ? "slipscreen run " + s.folder.filename().string() : title;
  auto& b = d.blocks;
  b.push_back({.kind = Kind::caution, .text = kScreeningCaution});
  run_facts(s, built, b);
  segments_section(s, b);
  capacity_section(s, b);
  what_if_section(s, b);
  depth_section(s, b);
  if (!figures.empty()) {
    b.push_back(heading("Figures"));
    b.push_back({.kind = Kind::figures});
  }
  models_section(s, b);
  stress_section(s, b);
  catalog_section(s, b);
  inputs_table(s, b);
  reading_section(s, b);
  return d;
}

}  // namespace slipscreen::outputs::report
