#pragma once
// "Did you mean" support: the nearest candidate by Levenshtein edit distance.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace slipscreen::util {

// Edit distance (insertions, deletions, substitutions), case-sensitive.
std::size_t edit_distance(std::string_view a, std::string_view b);

// The candidate closest to `word`, if it is within max(2, |word|/3) edits; nothing otherwise.
std::optional<std::string> nearest(std::string_view word, const std::vector<std::string>& candidates);

// " (did you mean 'x'?)" or "" — ready to append to a message.
std::string did_you_mean(std::string_view word, const std::vector<std::string>& candidates);

}  // namespace slipscreen::util
