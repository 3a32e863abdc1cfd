#include "run/run_scenario.hpp"

#include <algorithm>
#include <memory>

#include "core/errors.hpp"
#include "core/probabilistic/realization_split.hpp"
#include "core/screen/screen_split.hpp"
#include "formats/files/run_folder.hpp"
#include "outputs/run_outputs.hpp"
#include "run/mpi_cluster.hpp"
#include "run/report_job.hpp"
#include "scenario/uncertainty.hpp"
#include "screening/capacity.hpp"
#include "screening/what_if.hpp"
#include "screening/catalog_review.hpp"
#include "screening/conditioning.hpp"
#include "screening/seismicity_likelihood.hpp"
#include "screening/prepare.hpp"
#include "screening/pressure_history.hpp"
#include "screening/pressure_map.hpp"
#include "screening/depth_probability.hpp"
#include "screening/probabilistic_screen.hpp"

namespace slipscreen::run {

std::filesystem::path run_folder_of(const scenario::ResolvedScenario& s, const RunOptions& o) {
  if (!o.out.empty()) return o.out;
  if (s.output.folder.empty())
    throw RefusedError(s.file + ": no run folder: set [output] folder in the scenario or give --out");
  return std::filesystem::path(s.output.folder);
}

namespace {

// Segments whose monthly Δp by well the run writes (segment_pressure_history.csv); the report
// draws the first three.
constexpr std::size_t kHistorySegments = 5;

struct ProgressBridge {
  const RunOptions* options;
};

void report(double fraction, void* user) {
  const auto* b = static_cast<ProgressBridge*>(user);
  if (b->options->progress) b->options->progress("pressure at fault segments", fraction);
}

// The run folder's rules for this run: every input read protects the folders holding it.
formats::RunFolderOptions folder_options(const scenario::ResolvedScenario& s, const screening::PreparedRun& p,
                                         const RunOptions& o) {
  formats::RunFolderOptions f;
  f.force = o.force;
  f.notice = o.notice;
  f.inputs.push_back(s.path);
  f.inputs.insert(f.inputs.end(), s.inputs.begin(), s.inputs.end());
  for (const auto& in : p.manifest_inputs) f.inputs.push_back(in.path);
  return f;
}

std::vector<std::string> files_in(const std::filesystem::path& folder) {
  std::vector<std::string> files;
  for (const auto& e : std::filesystem::recursive_directory_iterator(folder))
    if (e.is_regular_file()) files.push_back(e.path().lexically_relative(folder).generic_string());
  std::sort(files.begin(), files.end());
  return files;
}

// This part's segments of the deterministic screen (screen_split.hpp), gathered: on part 0 the
// whole screen, equal to the unsplit one; elsewhere only this part's segments (unused).
screen::ScreenResult deterministic_part(const screening::PreparedRun& prepared, const probabilistic::RealizationSplit& split,
                                        ProgressBridge* bridge) {
  const screen::SegmentRange mine = screen::split_segments(prepared.inputs.segments.size(), split.part, split.parts);
  const util::WorkShare share = split.work_share();
  screen::ScreenResult result =
      screen::deterministic_screen(prepared.inputs, bridge ? &report : nullptr, bridge, mine, &share);
  const auto all = split.gather(screen::encode_screen_part(result, mine));
  if (!all) return result;
  if (all->size() != split.parts)
    throw InputError("deterministic screen parts", std::to_string(all->size()), std::to_string(split.parts) + ", one per part");
  for (std::size_t p = 1; p < all->size(); ++p) screen::merge_screen_part(result, (*all)[p]);
  return result;
}

}  // namespace

RunSummary run_scenario(const scenario::ResolvedScenario& s, const RunOptions& o) {
  const std::filesystem::path target = run_folder_of(s, o);
  const auto stage = [&](const char* name) {
    if (o.progress) o.progress(name, -1.0);
  };
  stage("reading faults and wells");
  const screening::PreparedRun prepared = screening::prepare_run(s, o.allow_network);
  if (o.split && o.split->parts > 1 && s.region.formation.poroelastic_3d && s.uncertainty.given)
    throw InputError("uncertainty", "[uncertainty]",
                     "a run in one process: the screen in depth (model = 'poroelastic_3d') is not split across "
                     "processes (docs/cluster.md)",
                     s.file);
  const bool split = o.split && o.split->parts > 1;
  if (split && o.split->part != 0) {  // a helper part: its segments of the deterministic screen, then its block
    stage("pressure at fault segments");
    deterministic_part(prepared, *o.split, nullptr);
    if (s.uncertainty.given) {
      stage("probabilistic screen");
      screening::run_probabilistic_screen(s, prepared, s.uncertainty, {}, {}, o.split);
    }
    return RunSummary{};
  }
  // Refuse the folder before computing (RunFolder checks again when created and when committed).
  for (const auto& w : s.what_if) screening::what_if_wells(w, prepared);  // refuses a bad entry before computing
  screening::observation_inputs(s, prepared);  // refuses an observation at an injector before computing
  screening::seismicity_use(s, prepared);      // refuses a catalog the seismicity likelihood cannot use
  const formats::RunFolderOptions folder_rules = folder_options(s, prepared, o);
  formats::RunFolder::check_target(target, folder_rules);
  const screening::RunCost cost = screening::estimate_run_cost(s, prepared);
  const double memory_limit = screening::memory_limit_bytes(s);
  screening::refuse_beyond_memory(cost, memory_limit, s.file);
  if (o.cost) o.cost(cost, memory_limit);
  const scenario::UncertaintySpec& spec = s.uncertainty;

  ProgressBridge bridge{&o};
  // The screen in depth first: it checks its own inputs (dips, intervals) before it computes.
  // The 3-D model's realizations are drawn and checked before any computing.
  const std::optional<screening::DepthDraws> draws = screening::depth_draws(s, prepared);
  std::optional<screening::DepthScreen> depth;
  if (s.region.formation.poroelastic_3d) {
    stage("faults in depth (3-D poroelastic model)");
    depth = screening::depth_screen(s, prepared);
  }
  std::optional<screening::DepthProbability> depth_prob;
  if (depth && draws) {
    stage("faults in depth, Monte Carlo");
    depth_prob = screening::depth_probability(s, *depth, *draws);
  }
  stage("pressure at fault segments");
  const screen::ScreenResult result =
      split ? deterministic_part(prepared, *o.split, &bridge) : screen::deterministic_screen(prepared.inputs, &report, &bridge);
  std::optional<screening::ProbabilisticRun> prob;
  if (spec.given && !depth) {  // the 3-D model's [uncertainty] drives the screen in depth only
    stage("probabilistic screen");
    prob = screening::run_probabilistic_screen(s, prepared, spec, {}, {}, o.split);
  }
  if (split) cluster_root_takes_idle_cores();  // every split stage has merged: the other ranks only wait
  std::shared_ptr<const screening::CapacityResult> capacity;
  if (s.capacity && prob) {
    stage("allowable rate");
    capacity = std::make_shared<const screening::CapacityResult>(screening::capacity_answer(s, prepared, result, *prob));
  }
  std::shared_ptr<const screening::WhatIfResult> what_if;
  if (!s.what_if.empty() && prob)
    what_if = std::make_shared<const screening::WhatIfResult>(screening::what_if_result(s, prepared, *prob));
  std::optional<screening::CatalogReview> review;
  if (s.catalog) {
    stage("catalog review");
    review = screening::review_catalog(s, prepared, result, prob ? &*prob : nullptr);
  }

  std::optional<screening::PressureMap> pressure;
  if (s.output.rasters) {
    stage("pressure map");
    pressure = screening::pressure_map(s, prepared);
  }

  std::optional<screening::SegmentPressureHistory> history;
  if (s.output.tables) {
    stage("pressure history at the segments closest to failure");
    history = screening::segment_pressure_history(prepared, result, kHistorySegments);
  }

  stage("writing outputs");
  formats::RunFolder folder(target, folder_rules);
  outputs::write_run_outputs(folder, s,
                             {prepared, result, pressure ? &*pressure : nullptr, prob ? &*prob : nullptr,
                              review ? &*review : nullptr, history ? &*history : nullptr, capacity.get(), what_if.get(),
                              depth ? &*depth : nullptr, depth_prob ? &*depth_prob : nullptr},
                             {o.command_line, o.reproducible});
  if (s.output.report) {
    stage("report");
    write_report_into(folder.staging(), {.page = s.output.page, .reproducible = o.reproducible},
                      s.output.files.manifest);
  }
  folder.commit();

  RunSummary summary = screening::summarize_run(s, prepared, result, prob ? &*prob : nullptr, std::move(review));
  summary.capacity = capacity;
  summary.what_if = what_if;
  if (depth) summary.depth = screening::summarize_depth(prepared, *depth, depth_prob ? &*depth_prob : nullptr);
  summary.folder = target;
  summary.files = files_in(target);
  return summary;
}

}  // namespace slipscreen::run
