// Splitting the realizations across processes; see realization_split.hpp.
#include "core/probabilistic/realization_split.hpp"

#include <algorithm>
#include <string>

#include "core/errors.hpp"
#include "core/util/word_codec.hpp"
#include "core/util/work_share.hpp"

namespace slipscreen::probabilistic {
namespace {

constexpr std::uint64_t kMagic = 0x736c697073706c35ULL;  // "slipspl5": this encoding's version

// The partial result's words (core/util/word_codec.hpp), with its sketches.
class Writer : public util::WordWriter {
 public:
  using util::WordWriter::words;
  void sketch(const stats::QuantileSketch& s) { words(s.encode()); }
  void sketch(const stats::WeightedSketch& s) { words(s.encode()); }
};

class Reader : public util::WordReader {
 public:
  explicit Reader(std::span<const std::uint8_t> bytes)
      : util::WordReader(bytes, "an encoded block of the probabilistic screen (realization_split.hpp)") {}
  stats::QuantileSketch sketch() { return stats::QuantileSketch::decode(words()); }
  stats::WeightedSketch weighted_sketch() { return stats::WeightedSketch::decode(words()); }
};

void add_counts(std::vector<std::uint64_t>& into, const std::vector<std::uint64_t>& from, const char* what) {
  if (into.size() != from.size())
    throw InputError(what, std::to_string(from.size()) + " entries", std::to_string(into.size()) + " as in part 0");
  for (std::size_t k = 0; k < into.size(); ++k) into[k] += from[k];
}

}  // namespace

ColumnRange split_columns(std::size_t columns, std::size_t part, std::size_t parts) {
  if (parts == 0 || part >= parts)
    throw InputError("part", std::to_string(part) + " of " + std::to_string(parts), "a part index below the part count");
  const std::size_t groups = (columns + kSplitAlign - 1) / kSplitAlign;
  const auto first_group = [&](std::size_t p) { return groups / parts * p + std::min(p, groups % parts); };
  const std::size_t b = std::min(columns, first_group(part) * kSplitAlign);
  const std::size_t e = std::min(columns, first_group(part + 1) * kSplitAlign);
  return {b, e};
}

ColumnRange split_rows(std::size_t n, std::size_t part, std::size_t parts) {
  const auto [first, end] = util::part_range(n, part, parts);
  return {first, end};
}

std::vector<std::uint8_t> encode_partial(const PartialResult& p) {
  Writer w;
  w.word(kMagic);
  w.word(p.first_segment);
  w.word(p.segments.size());
  for (const auto& s : p.segments) {
    w.words(s.slipped_by);
    w.words(s.first_slip);
    w.word(s.already_critical);
    w.word(s.never_critical);
    w.sketch(s.dp_crit);
    w.word(s.dp.size());
    for (const auto& d : s.dp) w.sketch(d);
    w.word(s.what_if.size());
    for (const auto& v : s.what_if) w.words(v);
    w.words(s.conditioned.slipped_by);
    w.word(s.conditioned.already_critical);
    w.sketch(s.conditioned.dp_crit);
    w.word(s.conditioned.dp.size());
    for (const auto& d : s.conditioned.dp) w.sketch(d);
  }
  w.word(p.finished.size());
  for (const auto& f : p.finished) {
    w.doubles(f.sensitivity);
    w.word(f.median.size());
    for (const auto& m : f.median) {
      w.word(m.realization);
      w.doubles(std::span<const double>(&m.dp, 1));
      w.word(m.check_point);
      w.doubles(m.well_dp);
    }
  }
  w.doubles(std::span<const double>(&p.surrogate_error, 1));
  w.word(p.columns.begin);
  w.word(p.columns.end);
  w.words(p.map_dangerous);
  w.words(p.map_oriented);
  w.word(p.map_dangerous_already_critical);
  w.word(p.map_oriented_already_critical);
  return std::move(w).bytes();
}

PartialResult decode_partial(std::span<const std::uint8_t> bytes) {
  Reader r(bytes);
  if (r.word() != kMagic) r.fail("an unknown header");
  PartialResult p;
  p.first_segment = static_cast<std::size_t>(r.word());
  p.segments.resize(r.count());
  for (auto& s : p.segments) {
    s.slipped_by = r.words();
    s.first_slip = r.words();
    s.already_critical = r.word();
    s.never_critical = r.word();
    s.dp_crit = r.sketch();
    s.dp.resize(r.count());
    for (auto& d : s.dp) d = r.sketch();
    s.what_if.resize(r.count());
    for (auto& v : s.what_if) v = r.words();
    s.conditioned.slipped_by = r.words();
    s.conditioned.already_critical = r.word();
    s.conditioned.dp_crit = r.weighted_sketch();
    s.conditioned.dp.resize(r.count());
    for (auto& d : s.conditioned.dp) d = r.weighted_sketch();
  }
  p.finished.resize(r.count());
  if (p.finished.size() != p.segments.size())
    r.fail(std::to_string(p.finished.size()) + " finished segments for " + std::to_string(p.segments.size()) + " tracked");
  for (auto& f : p.finished) {
    f.sensitivity = r.doubles();
    f.median.resize(r.count());
    for (auto& m : f.median) {
      m.realization = r.word();
      const std::vector<double> dp = r.doubles();
      if (dp.size() != 1) r.fail("a median Δp of " + std::to_string(dp.size()) + " values");
      m.dp = dp[0];
      m.check_point = static_cast<std::size_t>(r.word());
      m.well_dp = r.doubles();
    }
  }
  const std::vector<double> error = r.doubles();
  if (error.size() != 1) r.fail("a surrogate error of " + std::to_string(error.size()) + " values");
  p.surrogate_error = error[0];
  p.columns.begin = r.word();
  p.columns.end = r.word();
  if (p.columns.end < p.columns.begin) r.fail("a column range that ends before it begins");
  p.map_dangerous = r.words();
  p.map_oriented = r.words();
  p.map_dangerous_already_critical = r.word();
  p.map_oriented_already_critical = r.word();
  if (!r.done()) r.fail("words after the end");
  return p;
}

PartialResult merge_partials(std::vector<PartialResult> parts) {
  if (parts.empty()) throw InputError("partial results", "(none)", "at least one part");
  for (std::size_t k = 0; k < parts.size(); ++k)
    if (parts[k].finished.size() != parts[k].segments.size())
      throw InputError("part " + std::to_string(k) + "'s finished segments", std::to_string(parts[k].finished.size()),
                       std::to_string(parts[k].segments.size()) + ", one per tracked segment");
  PartialResult m = std::move(parts.front());
  if (m.columns.begin != 0) throw InputError("first part's columns", std::to_string(m.columns.begin), "starting at 0");
  if (m.first_segment != 0) throw InputError("first part's segments", std::to_string(m.first_segment), "starting at 0");
  for (std::size_t k = 1; k < parts.size(); ++k) {
    PartialResult& p = parts[k];
    if (p.columns.begin != m.columns.end)
      throw InputError("part " + std::to_string(k) + "'s first column", std::to_string(p.columns.begin),
                       std::to_string(m.columns.end) + ", the end of the parts before it");
    if (p.first_segment != m.first_segment + m.segments.size())
      throw InputError("part " + std::to_string(k) + "'s first segment", std::to_string(p.first_segment),
                       std::to_string(m.first_segment + m.segments.size()) + ", the end of the parts before it");
    for (auto& s : p.segments) m.segments.push_back(std::move(s));
    for (auto& f : p.finished) m.finished.push_back(std::move(f));
    m.surrogate_error = std::max(m.surrogate_error, p.surrogate_error);
    add_counts(m.map_dangerous, p.map_dangerous, "map counts");
    add_counts(m.map_oriented, p.map_oriented, "oriented map counts");
    m.map_dangerous_already_critical += p.map_dangerous_already_critical;
    m.map_oriented_already_critical += p.map_oriented_already_critical;
    m.columns.end = p.columns.end;
  }
  return m;
}

}  // namespace slipscreen::probabilistic
