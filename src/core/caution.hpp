#pragma once
// The screening caution that every report, table header, raster and console summary carries.
namespace slipscreen {

inline constexpr const char* kScreeningCaution =
    "Screening estimate from simplified physics and uncertain inputs. It does not replace a "
    "site-specific study, monitoring, or the judgement of a licensed professional geoscientist or "
    "engineer; local regulations and the permitting authority govern.";

}  // namespace slipscreen
