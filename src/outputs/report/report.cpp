#include "outputs/report/report.hpp"

#include <algorithm>
#include <sstream>

#include "core/caution.hpp"
#include "core/errors.hpp"
#include "core/util/parallel_errors.hpp"
#include "formats/files/text_file.hpp"
#include "outputs/report/area_map.hpp"
#include "outputs/report/catalog_figures.hpp"
#include "outputs/report/conditioning_figures.hpp"
#include "outputs/report/decision_figures.hpp"
#include "outputs/report/depth_figures.hpp"
#include "outputs/report/report_text.hpp"
#include "outputs/report/screen_figures.hpp"
#include "outputs/report/stress_figures.hpp"

namespace slipscreen::outputs::report {
namespace fs = std::filesystem;
using formats::Box;
using formats::Canvas;
using formats::HAlign;
using formats::TextStyle;
using formats::VAlign;
using Kind = ReportBlock::Kind;

const std::vector<FigureBuilder>& report_figure_builders() {
  static const std::vector<FigureBuilder> builders = {
      &area_map_figures,
      &slip_probability_figures,
      &pressure_history_figures,
      &capacity_curve_figures,
      &conditioning_figures,
      &stress_figures,
      &catalog_figures,
      &depth_figures,
  };
  return builders;
}

std::pair<double, double> page_size(const std::string& page) {
  if (page == "Letter") return {612.0, 792.0};
  if (page == "A4") return {595.2756, 841.8898};
  throw InputError("page", page, "\"A4\" or \"Letter\"");
}

namespace {

// ---- HTML ----

// HTML text: the characters Pango markup escapes (&, <, >, ', ") are exactly those HTML needs.
std::string html_escape(std::string_view t) { return formats::markup_escape(t); }

// The figure's SVG document without its XML declaration, to sit inside HTML.
std::string inline_svg(const Figure& f, std::string svg) {
  if (svg.rfind("<?xml", 0) == 0) svg.erase(0, svg.find("?>") + 2);
  while (!svg.empty() && (svg.front() == '\n' || svg.front() == '\r')) svg.erase(0, 1);
  const auto open = svg.find("<svg");
  if (open != std::string::npos)
    svg.insert(open + 4, " role=\"img\" aria-label=\"" + html_escape(f.title) + "\"");
  return svg;
}

constexpr const char* kCss = R"(
:root { --ink: #1f2328; --muted: #57606a; --rule: #d8dde3; --warn: #fff4e0; --warn-edge: #c27c0e; }
* { box-sizing: border-box; }
body { margin: 0; color: var(--ink); background: #fff; font: 15px/1.5 "DejaVu Sans", "Helvetica Neue", Arial, sans-serif; }
main { max-width: 60rem; margin: 0 auto; padding: 1.5rem 1.25rem 3rem; }
h1 { font-size: 1.6rem; margin: 0 0 .75rem; }
h2 { font-size: 1.2rem; margin: 2rem 0 .5rem; border-bottom: 1px solid var(--rule); padding-bottom: .2rem; }
.caution { background: var(--warn); border-left: 4px solid var(--warn-edge); padding: .6rem .9rem; margin: 0 0 1rem; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: .15rem 1rem; margin: .5rem 0; }
dl.facts dt { color: var(--muted); }
dl.facts dd { margin: 0; }
table { border-collapse: collapse; width: 100%; font-size: .85rem; margin: .5rem 0 1rem; }
th, td { text-align: left; padding: .25rem .5rem; border-bottom: 1px solid var(--rule); vertical-align: top; }
th { border-bottom: 2px solid var(--ink); }
td.hash { font-family: "DejaVu Sans Mono", monospace; font-size: .75rem; word-break: break-all; }
figure { margin: 1.5rem 0; }
figure svg { width: 100%; height: auto; max-width: 48rem; display: block; }
figcaption { color: var(--muted); font-size: .9rem; margin-top: .3rem; }
footer { color: var(--muted); font-size: .8rem; margin-top: 3rem; border-top: 1px solid var(--rule); padding-top: .5rem; }
@media print {
  @page { size: %PAGE%; margin: 16mm; }
  body { font-size: 10pt; }
  main { max-width: none; padding: 0; }
  h2 { break-after: avoid; }
  figure, table, dl.facts, .caution { break-inside: avoid; }
  figure svg { max-width: 100%; }
}
)";

std::string html_report(const ReportDocument& d, const std::vector<Figure>& figures, const std::vector<std::string>& svgs,
                        const std::string& page) {
  std::ostringstream h;
  std::string css = kCss;
  css.replace(css.find("%PAGE%"), 6, page == "Letter" ? "letter" : "A4");
  h << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
    << "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
    << "<link rel=\"icon\" href=\"data:,\">\n"
    << "<title>" << html_escape(d.title) << "</title>\n<style>" << css << "</style>\n</head>\n<body>\n<main>\n"
    << "<h1>" << html_escape(d.title) << "</h1>\n";
  for (const auto& b : d.blocks) {
    switch (b.kind) {
      case Kind::heading: h << "<h2>" << html_escape(b.text) << "</h2>\n"; break;
      case Kind::paragraph: h << "<p>" << html_escape(b.text) << "</p>\n"; break;
      case Kind::caution: h << "<p class=\"caution\"><strong>Screening caution.</strong> " << html_escape(b.text) << "</p>\n"; break;
      case Kind::facts:
        h << "<dl class=\"facts\">\n";
        for (const auto& [k, v] : b.facts) h << "<dt>" << html_escape(k) << "</dt><dd>" << html_escape(v) << "</dd>\n";
        h << "</dl>\n";
        break;
      case Kind::list:
        h << "<ul>\n";
        for (const auto& r : b.rows) h << "<li>" << html_escape(r.empty() ? "" : r[0]) << "</li>\n";
        h << "</ul>\n";
        break;
      case Kind::table: {
        h << "<table>\n<thead><tr>";
        for (const auto& c : b.header) h << "<th>" << html_escape(c) << "</th>";
        h << "</tr></thead>\n<tbody>\n";
        for (const auto& r : b.rows) {
          h << "<tr>";
          for (std::size_t i = 0; i < r.size(); ++i)
            h << (i < b.header.size() && b.header[i] == "SHA-256" ? "<td class=\"hash\">" : "<td>") << html_escape(r[i])
              << "</td>";
          h << "</tr>\n";
        }
        h << "</tbody>\n</table>\n";
        break;
      }
      case Kind::figures:
        for (std::size_t i = 0; i < figures.size(); ++i) {
          const auto& f = figures[i];
          h << "<figure id=\"figure-" << f.name << "\">\n" << inline_svg(f, svgs[i]) << "\n<figcaption><strong>Figure " << i + 1
            << ".</strong> " << html_escape(f.title) << ". " << html_escape(f.reading) << " Data: figures/" << f.name
            << ".csv.</figcaption>\n</figure>\n";
        }
        break;
    }
  }
  h << "<footer>" << html_escape(kScreeningCaution) << "</footer>\n</main>\n</body>\n</html>\n";
  return h.str();
}

// ---- PDF ----

class PdfFlow {
 public:
  PdfFlow(Canvas& c, std::string title) : c_(c), title_(std::move(title)) { y_ = kTop; }
  double width() const { return c_.width() - 2 * kSide; }

  void need(double h) {
    if (y_ + h > c_.height() - kBottom && y_ > kTop + 1) new_page();
  }
  void new_page() {
    page_footer();
    c_.next_page();
    y_ = kTop;
  }
  void finish() { page_footer(); }

  void title(const std::string& t) {
    const Box b = c_.text({kSide, y_}, formats::markup_escape(t), {.size = 17, .bold = true, .v = VAlign::top, .wrap_width = width()});
    y_ += b.h + 8;
  }
  void heading(const std::string& t) {
    need(50);
    y_ += 8;
    const Box b = c_.text({kSide, y_}, formats::markup_escape(t), {.size = 12.5, .bold = true, .v = VAlign::top, .wrap_width = width()});
    y_ += b.h + 2;
    c_.line({{kSide, y_}, {kSide + width(), y_}}, {.colour = formats::rgb(0xd8dde3), .width = 0.6});
    y_ += 5;
  }
  void paragraph(const std::string& markup, double size = 9.5, double indent = 0) {
    const TextStyle st{.size = size, .v = VAlign::top, .wrap_width = width() - indent};
    const Box m = c_.measure(markup, st);
    need(m.h);
    const Box b = c_.text({kSide + indent, y_}, markup, st);
    y_ += b.h + 5;
  }
  void caution(const std::string& t) {
    const std::string markup = "<b>Screening caution.</b> " + formats::markup_escape(t);
    const TextStyle st{.size = 9.5, .v = VAlign::top, .wrap_width = width() - 16};
    const Box m = c_.measure(markup, st);
    need(m.h + 12);
    c_.rectangle({kSide, y_, width(), m.h + 12}, formats::rgb(0xfff4e0), std::nullopt);
    c_.rectangle({kSide, y_, 3, m.h + 12}, formats::rgb(0xc27c0e), std::nullopt);
    c_.text({kSide + 10, y_ + 6}, markup, st);
    y_ += m.h + 20;
  }
  void facts(const std::vector<std::pair<std::string, std::string>>& f) {
    const double label_w = width() * 0.32;
    for (const auto& [k, v] : f) {
      const TextStyle ls{.size = 9, .colour = formats::rgb(0x57606a), .v = VAlign::top, .wrap_width = label_w - 6};
      const TextStyle vs{.size = 9, .v = VAlign::top, .wrap_width = width() - label_w};
      const double h = std::max(c_.measure(formats::markup_escape(k), ls).h, c_.measure(formats::markup_escape(v), vs).h);
      need(h);
      c_.text({kSide, y_}, formats::markup_escape(k), ls);
      c_.text({kSide + label_w, y_}, formats::markup_escape(v), vs);
      y_ += h + 2;
    }
    y_ += 4;
  }
  void table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows) {
    const std::size_t n = header.size();
    if (n == 0) return;
    const double size = 7.5;
    // Column widths from the widest cell (capped), scaled to the text width.
    std::vector<double> w(n, 0.0);
    const auto cell_w = [&](const std::string& t, bool bold) {
      return c_.measure(formats::markup_escape(t), {.size = size, .bold = bold}).w;
    };
    for (std::size_t i = 0; i < n; ++i) w[i] = std::min(cell_w(header[i], true), 160.0);
    for (const auto& r : rows)
      for (std::size_t i = 0; i < n && i < r.size(); ++i) w[i] = std::max(w[i], std::min(cell_w(r[i], false), 160.0));
    double total = 0;
    for (double& x : w) total += (x += 8);
    for (double& x : w) x *= width() / total;
    const auto draw_row = [&](const std::vector<std::string>& r, bool bold) {
      double h = 0;
      for (std::size_t i = 0; i < n && i < r.size(); ++i)
        h = std::max(h, c_.measure(formats::markup_escape(r[i]), {.size = size, .bold = bold, .wrap_width = w[i] - 6}).h);
      need(h + 4);
      double x = kSide;
      for (std::size_t i = 0; i < n && i < r.size(); ++i) {
        c_.text({x + 2, y_ + 2}, formats::markup_escape(r[i]),
                {.size = size, .bold = bold, .v = VAlign::top, .wrap_width = w[i] - 6});
        x += w[i];
      }
      y_ += h + 4;
      c_.line({{kSide, y_}, {kSide + width(), y_}},
              {.colour = bold ? formats::kInk : formats::rgb(0xd8dde3), .width = bold ? 0.8 : 0.4});
    };
    draw_row(header, true);
    for (const auto& r : rows) draw_row(r, false);
    y_ += 8;
  }
  void figure(const Figure& f, std::size_t number) {
    const double scale = std::min(1.0, width() / f.width);
    const std::string caption = "<b>Figure " + std::to_string(number) + ".</b> " + formats::markup_escape(f.title) +
                                ". " + formats::markup_escape(f.reading) + " Data: figures/" +
                                formats::markup_escape(f.name) + ".csv.";
    const TextStyle cs{.size = 8.5, .colour = formats::rgb(0x57606a), .v = VAlign::top, .wrap_width = width()};
    const double ch = c_.measure(caption, cs).h;
    need(f.height * scale + ch + 8);
    c_.begin_group({kSide + (width() - f.width * scale) / 2, y_}, scale, f.width, f.height);
    f.draw(c_);
    c_.end_group();
    y_ += f.height * scale + 4;
    c_.text({kSide, y_}, caption, cs);
    y_ += ch + 14;
  }

 private:
  void page_footer() {
    c_.text({c_.width() / 2, c_.height() - 24},
            formats::markup_escape(title_) + " · page " + std::to_string(c_.pages()),
            {.size = 7, .colour = formats::rgb(0x57606a), .h = HAlign::centre, .v = VAlign::baseline});
  }
  static constexpr double kTop = 48, kBottom = 50, kSide = 50;
  Canvas& c_;
  std::string title_;
  double y_;
};

std::string pdf_report(const ReportDocument& d, const std::vector<Figure>& figures, const ReportOptions& o) {
  const auto [w, h] = page_size(o.page);
  Canvas c(formats::DrawingFormat::pdf, w, h, 150.0, o.built_utc);
  PdfFlow flow(c, d.title);
  flow.title(d.title);
  for (const auto& b : d.blocks) {
    switch (b.kind) {
      case Kind::heading: flow.heading(b.text); break;
      case Kind::paragraph: flow.paragraph(formats::markup_escape(b.text)); break;
      case Kind::caution: flow.caution(b.text); break;
      case Kind::facts: flow.facts(b.facts); break;
      case Kind::list:
        for (const auto& r : b.rows) flow.paragraph("•  " + formats::markup_escape(r.empty() ? "" : r[0]), 9.5, 8);
        break;
      case Kind::table: flow.table(b.header, b.rows); break;
      case Kind::figures:
        for (std::size_t i = 0; i < figures.size(); ++i) flow.figure(figures[i], i + 1);
        break;
    }
  }
  flow.finish();
  return c.finish();
}

}  // namespace

std::vector<std::string> write_report(const ReportSource& source, const ReportOptions& o,
                                      const std::vector<FigureBuilder>& builders, const fs::path& into) {
  page_size(o.page);  // refuses an unknown page before anything is drawn
  // The builders read the run's files (each once, source's cache) and are independent of each
  // other: they run in parallel, and their figures are kept in the builders' order.
  std::vector<std::vector<Figure>> families(builders.size());
  {
    util::ParallelErrors errors;
#pragma omp parallel for schedule(dynamic, 1)
    for (std::size_t i = 0; i < builders.size(); ++i) errors.iteration(i, [&] { families[i] = builders[i](source); });
    errors.rethrow();
  }
  std::vector<Figure> figures;
  for (auto& family : families)
    for (auto& f : family) figures.push_back(std::move(f));
  const ReportDocument doc = report_document(source, o.built_utc, figures);

  std::vector<std::string> written;
  const fs::path dir = into / "figures";
  std::error_code ec;
  fs::create_directories(dir, ec);
  if (ec) throw IoError(dir.string() + ": cannot create the figures folder: " + ec.message());
  for (const auto& f : figures) {
    if (std::any_of(figures.begin(), figures.end(), [&](const Figure& g) { return &g != &f && g.name == f.name; }))
      throw std::logic_error("two report figures are named " + f.name);
    for (const char* ext : {".csv", ".png", ".svg"}) written.push_back("figures/" + f.name + ext);
  }
  // The PDF and each figure's files are drawn on their own canvases, independent of each other,
  // so they are drawn in parallel (the PDF, the longest, first); the bytes do not depend on the
  // thread that draws them (docs/report.md, "Speed").
  std::vector<std::string> svgs(figures.size());
  std::string pdf;
  util::ParallelErrors errors;
  const std::size_t jobs = figures.size() + 1;
#pragma omp parallel for schedule(dynamic, 1)
  for (std::size_t i = 0; i < jobs; ++i)
    errors.iteration(i, [&] {
      if (i == 0) pdf = pdf_report(doc, figures, o);
      else svgs[i - 1] = write_figure_files(figures[i - 1], dir);
    });
  errors.rethrow();
  formats::write_text_file(into / "report.html", html_report(doc, figures, svgs, o.page));
  formats::write_text_file(into / "report.pdf", pdf);
  written.push_back("report.html");
  written.push_back("report.pdf");
  std::sort(written.begin(), written.end());
  return written;
}

}  // namespace slipscreen::outputs::report
