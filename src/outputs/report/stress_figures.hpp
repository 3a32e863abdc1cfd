#pragma once
// The stress figures of the report (docs/report.md, "Stress and catalog figures"), drawn from a
// finished run folder's tables only:
//
//   mohr_<fault>            Mohr (1900) diagram per most-critical fault: the three principal
//                           circles in effective stress at the reference depth, the Coulomb line
//                           τ = c + μσn′, each segment's (σn′, τ) before injection and at its peak
//                           Δp, and Δp_crit marked as the distance to the line (segments.csv)
//   dp_crit_distribution    the distribution (CDF) of Δp_crit over the realizations for the top
//                           segments, with the median modelled Δp at the last output time
//                           (dp_crit_quantiles.csv, segment_probability.csv)
//   sensitivity             Spearman's ρ of each sampled input against the slip margin at the
//                           faults with the highest final P(slip) (sensitivity.csv)
//
// The most critical faults are those whose segments come closest to failure: the smallest
// margin Δp_crit − peak Δp over the fault's segments (ties: the smallest Δp_crit, then file order).
#include <vector>

#include "outputs/report/figure.hpp"

namespace slipscreen::outputs::report {

// The figures the run's tables allow: the Mohr diagrams from a deterministic screen, the other
// two only when the run had a probabilistic screen. Throws InputError naming the table and
// line when a table the figures need is malformed.
std::vector<Figure> stress_figures(const ReportSource& source);

}  // namespace slipscreen::outputs::report
