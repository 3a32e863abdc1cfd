#include "outputs/report/figure.hpp"

#include <sstream>

#include "formats/files/text_file.hpp"
#include "formats/table/csv.hpp"

namespace slipscreen::outputs::report {

std::string figure_svg(const Figure& f) {
  formats::Canvas c(formats::DrawingFormat::svg, f.width, f.height);
  f.draw(c);
  return c.finish();
}

void write_figure_files(const Figure& f, const std::filesystem::path& dir) {
  formats::write_text_file(dir / (f.name + ".svg"), figure_svg(f));
  {
    formats::Canvas png(formats::DrawingFormat::png, f.width, f.height, 150.0);
    f.draw(png);
    png.save(dir / (f.name + ".png"));
  }
  std::ostringstream csv;
  for (std::size_t i = 0; i < f.data.header.size(); ++i) csv << (i ? "," : "") << formats::csv_field(f.data.header[i]);
  csv << '\n';
  for (const auto& row : f.data.rows) {
    for (std::size_t i = 0; i < row.size(); ++i) csv << (i ? "," : "") << formats::csv_field(row[i]);
    csv << '\n';
  }
  formats::write_text_file(dir / (f.name + ".csv"), csv.str());
}

}  // namespace slipscreen::outputs::report
