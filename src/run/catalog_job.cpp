#include "run/catalog_job.hpp"

#include "core/errors.hpp"
#include "formats/catalog/volume_history_csv.hpp"
#include "formats/files/run_folder.hpp"
#include "outputs/catalog_folder.hpp"
#include "outputs/catalog_summary_json.hpp"

namespace slipscreen::run {

namespace {

// The folder's rules: the catalog and the volume history protect the folders holding them.
formats::RunFolderOptions folder_options(const CatalogJob& job) {
  formats::RunFolderOptions f;
  f.force = job.force;
  f.notice = job.notice;
  f.inputs.push_back(job.file);
  if (!job.volume_history.empty()) f.inputs.push_back(job.volume_history);
  return f;
}

}  // namespace

CatalogJobResult run_catalog_job(const CatalogJob& job) {
  seismo::SummaryOptions so = job.summary;
  if (!job.volume_history.empty()) so.volume_history = formats::read_volume_history_csv(job.volume_history);
  double rt_start = 0.0;
  if (job.rt) {
    if (job.rt->start) rt_start = *job.rt->start;
    else if (so.volume_history) rt_start = so.volume_history->time.front();
    else throw InputError("--start", "", "the injection start time (ISO 8601) for the r-t view, or --volume-history");
  }
  // Refuse the folder before reading (RunFolder checks again when created and when committed).
  const formats::RunFolderOptions folder_rules = folder_options(job);
  if (!job.out.empty()) formats::RunFolder::check_target(job.out, folder_rules);

  CatalogJobResult r;
  r.read = formats::read_catalog(job.file, job.format, job.columns, job.strict);
  r.filtered = seismo::apply_filter(r.read.catalog, job.filter);
  r.summary = seismo::summarize_catalog(r.filtered.catalog, so);
  if (job.rt) r.rt = screening::make_rt_view(r.filtered.catalog, job.rt->well, rt_start, job.rt->diffusivities);
  r.json = outputs::catalog_summary_json(r.read, r.filtered.counts, r.summary);
  r.json["rt_view"] = r.rt ? outputs::rt_view_json(*r.rt) : nlohmann::json(nullptr);
  if (!job.out.empty()) {
    formats::RunFolder folder(job.out, folder_rules);
    outputs::CatalogFolderRecord record{job.command_line, {{"catalog", job.file, ""}}, job.units};
    if (!job.volume_history.empty()) record.inputs.push_back({"volume history", job.volume_history, ""});
    outputs::write_catalog_folder(folder, r.json, r.filtered.catalog, r.rt, record);
    folder.commit();
  }
  return r;
}

}  // namespace slipscreen::run
