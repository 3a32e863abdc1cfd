// `slipscreen report RUN_FOLDER`: (re)builds report.html, report.pdf and figures/ of a finished run
// folder from its files (run/report_job.hpp), all or nothing, and prints what it wrote.
#include <CLI/CLI.hpp>
#include <memory>
#include <ostream>

#include "cli/commands.hpp"
#include "cli/option_range.hpp"
#include "core/caution.hpp"
#include "run/report_job.hpp"

namespace slipscreen::cli {

namespace {

struct ReportCommandOptions {
  std::string folder;
  std::string page;
  bool reproducible = false;
  int top = 5;
  std::string maps;
};

int build(const ReportCommandOptions& o, Context& ctx) {
  const run::ReportJobResult r =
      run::rebuild_report(o.folder, {.page = o.page, .reproducible = o.reproducible, .top = static_cast<std::size_t>(o.top), .maps = o.maps});
  ctx.out << "Report of " << r.folder.generic_string() << " written (" << r.files.size() << " files):\n";
  for (const auto& f : r.files)
    if (f.rfind("figures/", 0) != 0) ctx.out << "  " << f << "\n";
  ctx.out << "  figures/ (" << (r.files.size() - 2) / 3 << " figures as SVG, PNG and CSV)\n";
  ctx.out << "\nScreening caution: " << kScreeningCaution << "\n";
  return 0;
}

}  // namespace

void register_report_command(CLI::App& app, Context& ctx) {
  auto opts = std::make_shared<ReportCommandOptions>();
  CLI::App* sub = app.add_subcommand(
      "report", "Build the report of a finished run folder: report.html, report.pdf and figures/ (docs/report.md)");
  sub->footer("The report is drawn from the run folder's tables, rasters, GeoPackage and manifest; nothing is\n"
              "computed again. It is written into a staging subfolder and moved into place only when complete.\n"
              "`run` and `demo` write it themselves unless the scenario sets [output] report = false.");
  sub->add_option("folder", opts->folder, "Run folder written by `slipscreen run` or `slipscreen demo`")->required();
  sub->add_option("--page", opts->page, "PDF page size (default: the scenario's [output] page, else A4)")
      ->check(CLI::IsMember({"A4", "Letter"}));
  sub->add_flag("--reproducible", opts->reproducible,
                "Leave the build time out of the report (a rebuild gives byte-identical files)");
  sub->add_option("--top", opts->top, "Number of segments in the top-segment tables and figures")
      ->default_val(5)
      ->check(in_range(1, 50, "a number of segments"));
  sub->add_option("--maps", opts->maps,
                  "Area maps: at the last output time, or one at each output time (default: the scenario's "
                  "[output] report_maps, else last)")
      ->check(CLI::IsMember({"last", "each"}));
  sub->callback([opts, &ctx] { ctx.action = [opts, &ctx] { return build(*opts, ctx); }; });
}

}  // namespace slipscreen::cli
