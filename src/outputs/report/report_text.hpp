#pragma once
// The report's text as a small document (docs/report.md, "Sections"): headings, paragraphs,
// label-value facts, tables and figure places, built from the run folder's manifest and tables
// and drawn alike as HTML and PDF (report.hpp). Numbers are the tables' own text where a table
// holds them (so the report shows exactly what the run wrote), with the table's unit.
#include <string>
#include <utility>
#include <vector>

#include "outputs/report/figure.hpp"

namespace slipscreen::outputs::report {

struct ReportBlock {
  enum class Kind { heading, paragraph, caution, facts, table, figures, list };
  Kind kind = Kind::paragraph;
  std::string text = {};                                     // heading, paragraph, caution (plain text)
  std::vector<std::pair<std::string, std::string>> facts = {};  // label, value
  std::vector<std::string> header = {};                      // table
  std::vector<std::vector<std::string>> rows = {};           // table rows; list items in rows[i][0]
};

struct ReportDocument {
  std::string title;
  std::vector<ReportBlock> blocks;  // a `figures` block marks where the figures go
};

// The report's text. `built_utc` ("" when reproducible) is the time the report is built.
ReportDocument report_document(const ReportSource& source, const std::string& built_utc,
                               const std::vector<Figure>& figures);

}  // namespace slipscreen::outputs::report
