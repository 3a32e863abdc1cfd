#pragma once
// Shared pieces of the libFuzzer harnesses (docs/fuzzing.md).
//
// The contract every harness checks: whatever the bytes, a reader either succeeds or throws one
// of slipscreen's typed errors (core/errors.hpp: InputError, IoError, RefusedError, ...), which
// the command line turns into a message and an exit code. Anything else is a finding: another
// exception type (it would reach the user as "internal error"), a crash, a sanitizer report, a
// timeout or runaway memory. A harness may add checks of a reader's documented promises; a
// broken promise aborts through `require`.
#include <unistd.h>

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>
#include <string_view>
#include <vector>

#include "core/errors.hpp"
#include "core/seismo/catalog.hpp"
#include "core/units/units.hpp"

namespace slipscreen::fuzz {

inline std::string_view as_text(const std::uint8_t* data, std::size_t size) {
  return {reinterpret_cast<const char*>(data), size};
}

// Runs `read` on one input. slipscreen's typed errors are the expected answer to bad input
// (printed when SLIPSCREEN_FUZZ_VERBOSE is set, to see what an input reaches).
template <class Read>
int expect_typed_errors(Read&& read) {
  try {
    read();
  } catch (const slipscreen::Error& e) {
    static const bool verbose = std::getenv("SLIPSCREEN_FUZZ_VERBOSE") != nullptr;
    if (verbose) std::fprintf(stderr, "fuzz: typed error: %s\n", e.what());
    if (std::string_view(e.what()).empty()) {
      std::fprintf(stderr, "fuzz: a typed error with an empty message\n");
      std::abort();
    }
  }
  return 0;
}

// The dimension chosen by an input's first byte (units::Dimension in declaration order).
inline units::Dimension dimension_of(std::uint8_t byte) {
  constexpr int kDimensions = static_cast<int>(units::Dimension::inverse_time) + 1;
  return static_cast<units::Dimension>(byte % kDimensions);
}

// A documented promise of a reader; a broken one is a finding.
inline void require(bool ok, const char* promise) {
  if (ok) return;
  std::fprintf(stderr, "fuzz: broken promise: %s\n", promise);
  std::abort();
}

// The catalog readers' promise: they reject with its line what they cannot use, so every
// accepted event has a finite time, coordinates, magnitude and (if given) depth.
inline void require_finite_events(const seismo::Catalog& catalog) {
  for (const auto& e : catalog.events)
    require(std::isfinite(e.time) && std::isfinite(e.x) && std::isfinite(e.y) && std::isfinite(e.magnitude) &&
                (!e.depth || std::isfinite(*e.depth)),
            "an accepted catalog event has finite time, coordinates, depth and magnitude");
}

// This process's own folder for the files a reader must open by path (under $TMPDIR), removed
// when the process exits normally. A crashed run leaves it for inspection.
inline const std::filesystem::path& scratch_dir() {
  static const std::filesystem::path dir = [] {
    std::filesystem::path base = std::filesystem::temp_directory_path() / "slipscreen-fuzz-XXXXXX";
    std::string pattern = base.string();
    if (!::mkdtemp(pattern.data())) {
      std::perror("fuzz: mkdtemp");
      std::abort();
    }
    std::atexit([] {
      std::error_code ec;
      std::filesystem::remove_all(scratch_dir(), ec);
    });
    return std::filesystem::path(pattern);
  }();
  return dir;
}

// Writes `bytes` to `name` in the scratch folder and returns the path.
inline std::filesystem::path write_scratch(const std::string& name, std::string_view bytes) {
  const std::filesystem::path p = scratch_dir() / name;
  std::ofstream out(p, std::ios::binary | std::ios::trunc);
  out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
  out.close();
  if (!out) {
    std::perror("fuzz: cannot write a scratch file");
    std::abort();
  }
  return p;
}

// The separator between the files of a multi-file input (a line of its own, unlikely in any of
// the formats): "scenario.toml text\n%%%%\nregion.toml text\n%%%%\n...".
inline constexpr std::string_view kPartSeparator = "\n%%%%\n";

// Splits `text` at every `separator`, into at most `max_parts` parts (the last one keeps any
// further separators).
inline std::vector<std::string_view> split_parts(std::string_view text, std::string_view separator,
                                                 std::size_t max_parts) {
  std::vector<std::string_view> parts;
  while (parts.size() + 1 < max_parts) {
    const std::size_t at = text.find(separator);
    if (at == std::string_view::npos) break;
    parts.push_back(text.substr(0, at));
    text.remove_prefix(at + separator.size());
  }
  parts.push_back(text);
  return parts;
}

}  // namespace slipscreen::fuzz
