#pragma once
// The text syntax of distributions with units, as written in scenario files (TOML strings).
//
//   "10 mD"                                          fixed value (a bare value with its unit)
//   "fixed(10 mD)"                                   the same, spelled out
//   "uniform(20 MPa/km, 24 MPa/km)"                  uniform(min, max)
//   "uniform(min=20 MPa/km, max=24 MPa/km)"
//   "normal(0.6, 0.05)"                              normal(mean, sd)
//   "normal(mean=0 deg, sd=5 deg)"
//   "truncnormal(mean=0.6, sd=0.1, min=0.3, max=0.9)" truncnormal(mean, sd, min, max); one of
//                                                     min, max may be left out when named
//   "lognormal(median=10 mD, sigma_ln=0.8)"          lognormal(median, sigma_ln)
//   "lognormal(p10=2 mD, p90=50 mD)"                 lognormal from its P10 and P90
//   "triangular(min=0.5, mode=0.6, max=0.8)"         triangular(min, mode, max)
//
// Rules: distribution names and parameter names are case-insensitive ("truncated_normal" is
// accepted for "truncnormal"); arguments are all positional in the order shown, or named
// (positional arguments may come first, then named ones); every value carries a unit of the
// field's dimension (units.hpp), except sigma_ln which is a plain number and dimensionless
// fields where a unit is optional ("0.6" or "60 %"). sd is written in the same unit as the mean.
#include <string>
#include <string_view>

#include "core/stats/distribution.hpp"
#include "core/units/units.hpp"

namespace slipscreen::stats {

// Parse a distribution written in the syntax above into SI. Throws InputError naming `field`,
// the whole text and what was expected: unknown distribution name (with "did you mean"),
// unknown or repeated parameter, missing parameter, missing or wrong unit, and the parameter
// checks of Distribution (min > max, sd ≤ 0, median ≤ 0, ...).
Distribution parse_distribution(std::string_view text, units::Dimension dimension, std::string_view field);

// Canonical text of a distribution in SI units (named parameters, shortest round-trip
// numbers), e.g. "lognormal(median=9.869233e-15 m2, sigma_ln=0.8)". parse_distribution of
// this text gives back an equal Distribution. Used in manifests.
std::string format_distribution(const Distribution& distribution, units::Dimension dimension);

}  // namespace slipscreen::stats
