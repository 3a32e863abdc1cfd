#pragma once
// Exit codes of the slipscreen command line (documented in docs/exit-codes.md).
namespace slipscreen::cli {

inline constexpr int kExitOk = 0;           // success
inline constexpr int kExitUsage = 2;        // bad command line (unknown option, missing value)
inline constexpr int kExitInput = 3;        // bad input data: scenario, CSV, units, fault file
inline constexpr int kExitIo = 4;           // a file could not be read or written
inline constexpr int kExitRefused = 5;      // refused as unsafe: overwrite, path escape, network path
inline constexpr int kExitNumerical = 6;    // a computation could not reach its stated accuracy
inline constexpr int kExitInternal = 70;    // a bug: please report it with the command line

}  // namespace slipscreen::cli
