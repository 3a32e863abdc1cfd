#pragma once
// The figures of a conditioned run (docs/report.md, "Conditioning figures"; docs/conditioning.md),
// drawn from its tables in a finished run folder:
//
//   observation_fit_<id>   for each pressure observation point (observation_fit.csv): the
//                          modelled Δp over time as the prior's and the conditioned P5–P95 bands
//                          with their P50 lines, and the observed Δp with ±σ bars
//   posterior_inputs       for each uncertain input (posterior_inputs.csv): the prior's and the
//                          posterior's P5–P95 interval with the P50, side by side, on a scale
//                          where the prior's P5 is 0 and its P95 is 1 (each input has its own unit)
#include <string>
#include <vector>

#include "outputs/report/figure.hpp"

namespace slipscreen::outputs::report {

// Empty for a run that was not conditioned (no observation_fit.csv / posterior_inputs.csv, or
// no rows). Throws InputError naming the file when a table is malformed.
std::vector<Figure> conditioning_figures(const ReportSource& source);

// The figure name of an observation point: "observation_fit_" and the id in lower case with every
// character outside [a-z0-9-] replaced by '_'.
std::string observation_figure_name(const std::string& id);

}  // namespace slipscreen::outputs::report
