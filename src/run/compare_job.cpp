#include "run/compare_job.hpp"

#include "core/errors.hpp"
#include "formats/files/run_folder.hpp"
#include "outputs/comparison_files.hpp"
#include "outputs/comparison_read.hpp"

namespace slipscreen::run {
namespace fs = std::filesystem;

namespace {

std::string folder_name(const fs::path& p) {
  const fs::path n = p.lexically_normal();
  const fs::path name = n.has_filename() ? n.filename() : n.parent_path().filename();
  return name.empty() || name == "." || name == ".." ? std::string("run") : name.string();
}

}  // namespace

fs::path compare_default_folder(const fs::path& old_run, const fs::path& new_run) {
  const fs::path n = new_run.lexically_normal();
  const fs::path parent = (n.has_filename() ? n : n.parent_path()).parent_path();
  return parent / ("compare-" + folder_name(old_run) + "-" + folder_name(new_run));
}

CompareJobResult run_compare_job(const CompareJob& job) {
  CompareJobResult r;
  r.folder = job.out.empty() ? compare_default_folder(job.old_run, job.new_run) : job.out;
  formats::RunFolderOptions rules;
  rules.force = job.force;
  rules.notice = job.notice;
  rules.inputs = {job.old_run / "manifest.json", job.new_run / "manifest.json"};
  rules.replaceable = [](const fs::path& f) { return outputs::not_a_comparison(f); };

  r.old_run = outputs::read_run_record(job.old_run, job.old_run.generic_string());
  r.new_run = outputs::read_run_record(job.new_run, job.new_run.generic_string());
  if (const auto why = screening::incomparable(r.old_run, r.new_run))
    throw InputError("runs", *why, "two runs of the same region in the same working CRS (compare refuses others)");
  // Refuse the folder before comparing (RunFolder checks again when created and when committed).
  formats::RunFolder::check_target(r.folder, rules);
  r.comparison = screening::compare_runs(r.old_run, r.new_run);
  if (job.units) r.units = *job.units;
  else r.units = units::unit_system_named(outputs::run_units(job.new_run)).value_or(units::UnitSystem::si);

  formats::RunFolder folder(r.folder, rules);
  outputs::ComparisonRecord record{job.command_line,
                                   {{"earlier run manifest", job.old_run / "manifest.json", ""},
                                    {"later run manifest", job.new_run / "manifest.json", ""}},
                                   r.units,
                                   job.reproducible};
  outputs::write_comparison_folder(folder, r.comparison, r.old_run, r.new_run, record);
  folder.commit();
  return r;
}

}  // namespace slipscreen::run
