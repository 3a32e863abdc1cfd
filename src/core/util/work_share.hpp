#pragma once
// Work shared between processes (docs/cluster.md): this process's part of `parts`, and the
// exchange that gives every part every part's piece. The engines in src/core build their piece
// (a range of wells' tables, a range of points' surrogate) and call all_gather; the run layer
// implements it with MPI (run/mpi_cluster.hpp). No I/O here.
#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <functional>
#include <string>
#include <utility>
#include <vector>

#include "core/errors.hpp"

namespace slipscreen::util {

struct WorkShare {
  std::size_t part = 0, parts = 1;
  // Called by every part, in the same order, with its piece; returns every part's piece, in part
  // order, on every part.
  std::function<std::vector<std::vector<std::uint8_t>>(std::vector<std::uint8_t>)> all_gather;
  bool active() const { return parts > 1 && static_cast<bool>(all_gather); }
};

// Items [first, second) of `n` for part `part` of `parts`: near-equal runs, in order.
inline std::pair<std::size_t, std::size_t> part_range(std::size_t n, std::size_t part, std::size_t parts) {
  if (parts == 0 || part >= parts)
    throw InputError("part", std::to_string(part) + " of " + std::to_string(parts), "a part index below the part count");
  const auto first = [&](std::size_t p) { return n / parts * p + std::min(p, n % parts); };
  return {first(part), first(part + 1)};
}

}  // namespace slipscreen::util
