#pragma once
// The time grid on which the deterministic and probabilistic screens look for the first time a
// fault reaches failure: the first day of every calendar month, plus every rate-change time of
// every well, plus every output time, from the first rate change to the last output time.
//
// Why this grid (this project's choice, stated in docs/outputs.md): with piecewise-constant
// rates, the pressure at a fault rises while injection goes on and peaks some time after a rate
// drop or shut-in (the diffusion delay, of order r²/(4D)); a monthly grid resolves that peak to
// within a month for the distances and diffusivities of regional screening, and including every
// rate-change time catches the state just before each drop.
#include <span>
#include <vector>

namespace slipscreen::screen {

// Sorted, unique times (s since 1970-01-01) as described above. `change_times` are the wells'
// rate-change times (any order, duplicates allowed). Empty when there is no change before the
// last output time.
std::vector<double> tracking_grid(std::span<const double> change_times, std::span<const double> output_times);

}  // namespace slipscreen::screen
