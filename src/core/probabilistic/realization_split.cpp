// Splitting the realizations across processes; see realization_split.hpp.
#include "core/probabilistic/realization_split.hpp"

#include <string>

#include "core/errors.hpp"
#include "core/util/word_codec.hpp"
#include "core/util/work_share.hpp"

namespace slipscreen::probabilistic {
namespace {

constexpr std::uint64_t kMagic = 0x736c697073706c34ULL;  // "slipspl4": this encoding's version

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

// The weighted accumulators: weight units summed, weighted sketches merged.
void merge_conditioned(ConditionedCounts& a, const ConditionedCounts& b) {
  add_counts(a.slipped_by, b.slipped_by, "weighted slip counts");
  a.already_critical += b.already_critical;
  a.dp_crit.merge(b.dp_crit);
  if (a.dp.size() != b.dp.size())
    throw InputError("weighted Δp sketches", std::to_string(b.dp.size()), std::to_string(a.dp.size()) + " as in part 0");
  for (std::size_t t = 0; t < a.dp.size(); ++t) a.dp[t].merge(b.dp[t]);
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
  w.word(p.columns.begin);
  w.word(p.columns.end);
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
  w.word(p.finished_first);
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
  w.words(p.map_dangerous);
  w.words(p.map_oriented);
  w.word(p.map_dangerous_already_critical);
  w.word(p.map_oriented_already_critical);
  return w.bytes();
}

PartialResult decode_partial(std::span<const std::uint8_t> bytes) {
  Reader r(bytes);
  if (r.word() != kMagic) r.fail("an unknown header");
  PartialResult p;
  p.columns.begin = r.word();
  p.columns.end = r.word();
  if (p.columns.end < p.columns.begin) r.fail("a column range that ends before it begins");
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
  p.finished_first = r.word();
  p.finished.resize(r.count());
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
  p.map_dangerous = r.words();
  p.map_oriented = r.words();
  p.map_dangerous_already_critical = r.word();
  p.map_oriented_already_critical = r.word();
  if (!r.done()) r.fail("words after the end");
  return p;
}

PartialResult merge_partials(std::vector<PartialResult> parts) {
  if (parts.empty()) throw InputError("partial results", "(none)", "at least one part");
  PartialResult m = std::move(parts.front());
  if (m.columns.begin != 0) throw InputError("first part's columns", std::to_string(m.columns.begin), "starting at 0");
  for (std::size_t k = 1; k < parts.size(); ++k) {
    PartialResult& p = parts[k];
    if (p.columns.begin != m.columns.end)
      throw InputError("part " + std::to_string(k) + "'s first column", std::to_string(p.columns.begin),
                       std::to_string(m.columns.end) + ", the end of the parts before it");
    if (p.segments.size() != m.segments.size())
      throw InputError("part " + std::to_string(k) + "'s segments", std::to_string(p.segments.size()),
                       std::to_string(m.segments.size()) + " as in part 0");
    for (std::size_t i = 0; i < m.segments.size(); ++i) {
      SegmentPart& a = m.segments[i];
      SegmentPart& b = p.segments[i];
      add_counts(a.slipped_by, b.slipped_by, "slip counts");
      add_counts(a.first_slip, b.first_slip, "first-slip counts");
      a.already_critical += b.already_critical;
      a.never_critical += b.never_critical;
      a.dp_crit.merge(b.dp_crit);
      if (a.dp.size() != b.dp.size())
        throw InputError("Δp sketches", std::to_string(b.dp.size()), std::to_string(a.dp.size()) + " as in part 0");
      for (std::size_t t = 0; t < a.dp.size(); ++t) a.dp[t].merge(b.dp[t]);
      merge_conditioned(a.conditioned, b.conditioned);
      if (a.what_if.size() != b.what_if.size())
        throw InputError("what-if counts", std::to_string(b.what_if.size()), std::to_string(a.what_if.size()) + " variants as in part 0");
      for (std::size_t v = 0; v < a.what_if.size(); ++v) add_counts(a.what_if[v], b.what_if[v], "what-if counts");
    }
    if (!p.finished.empty()) {
      if (p.finished_first != m.finished_first + m.finished.size())
        throw InputError("part " + std::to_string(k) + "'s first finished segment", std::to_string(p.finished_first),
                         std::to_string(m.finished_first + m.finished.size()) + ", the end of the parts before it");
      for (auto& f : p.finished) m.finished.push_back(std::move(f));
    }
    add_counts(m.map_dangerous, p.map_dangerous, "map counts");
    add_counts(m.map_oriented, p.map_oriented, "oriented map counts");
    m.map_dangerous_already_critical += p.map_dangerous_already_critical;
    m.map_oriented_already_critical += p.map_oriented_already_critical;
    m.columns.end = p.columns.end;
  }
  return m;
}

}  // namespace slipscreen::probabilistic
