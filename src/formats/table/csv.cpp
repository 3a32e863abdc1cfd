#include "formats/table/csv.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <fstream>
#include <sstream>

#include "core/util/trim.hpp"
#include "core/util/utf8.hpp"
#include "core/errors.hpp"
#include "formats/files/input_file.hpp"

namespace slipscreen::formats {

namespace {

std::string lower(std::string_view s) {
  std::string out(s);
  std::transform(out.begin(), out.end(), out.begin(),
                 [](unsigned char c) { return static_cast<char>(c >= 'A' && c <= 'Z' ? c + 32 : c); });
  return out;
}

InputError csv_error(const std::string& file, std::size_t line, const std::string& field,
                     const std::string& value, const std::string& expected) {
  return InputError(field, util::printable(value), expected, file + " line " + std::to_string(line));
}

constexpr const char* kTextExpected = "UTF-8 text without control characters";

// Text read from the file is checked where it is read: valid UTF-8, no NUL or other control
// character (core/util/utf8.hpp), so nothing later meets a byte it cannot show.
void check_text(std::string_view text, const std::string& where, const std::string& field) {
  const auto problem = util::text_problem(text);
  if (!problem) return;
  const bool encoding = problem->find("UTF-8") != std::string::npos;
  throw InputError(field, util::printable(text),
                   std::string(kTextExpected) + " (" + *problem + "; " +
                       (encoding ? "save the file as UTF-8" : "the file may be damaged, or not a text file") + ")",
                   where);
}

// A position in the text being parsed, with its 1-based line number.
struct Cursor {
  std::string_view text;
  std::size_t i = 0;
  std::size_t line = 1;
  bool at(char ch) const { return i < text.size() && text[i] == ch; }
  bool at_field_end() const { return i >= text.size() || text[i] == ',' || text[i] == '\n' || text[i] == '\r'; }
};

// At the start of a record: skips a blank line, or a comment line (its text goes to `comments`).
// False when a record starts here.
bool skip_blank_or_comment(Cursor& c, std::vector<std::string>& comments, const std::string& file) {
  const std::string_view text = c.text;
  if (text[c.i] == '\n' || (text[c.i] == '\r' && c.i + 1 < text.size() && text[c.i + 1] == '\n')) {
    c.i += text[c.i] == '\r' ? 2 : 1;
    ++c.line;
    return true;
  }
  if (text[c.i] != '#') return false;
  const auto end = text.find('\n', c.i);
  comments.push_back(util::trim(text.substr(c.i + 1, (end == std::string_view::npos ? text.size() : end) - c.i - 1)));
  check_text(comments.back(), file + " line " + std::to_string(c.line), "comment");
  if (end == std::string_view::npos) {
    c.i = text.size();  // a comment on the last line, without a line end
  } else {
    c.i = end + 1;
    ++c.line;
  }
  return true;
}

// A field in double quotes: a doubled quote stands for one; line ends are kept.
std::string quoted_field(Cursor& c, const std::string& file) {
  const std::string_view text = c.text;
  std::string field;
  const std::size_t open_line = c.line;
  ++c.i;
  for (;;) {
    if (c.i >= text.size())
      throw csv_error(file, open_line, "quoted field", field.substr(0, 20), "a closing '\"'");
    if (text[c.i] == '"') {
      if (c.i + 1 < text.size() && text[c.i + 1] == '"') {
        field += '"';
        c.i += 2;
        continue;
      }
      ++c.i;
      break;
    }
    if (text[c.i] == '\n') ++c.line;
    field += text[c.i++];
  }
  if (!c.at_field_end())
    throw csv_error(file, c.line, "quoted field", field, "',' or the end of the line after the closing quote");
  return field;
}

// One record from its first field to past its line end.
CsvRow read_record(Cursor& c, const std::string& file) {
  CsvRow row;
  row.line = c.line;
  for (;;) {
    if (c.at('"')) {
      row.fields.push_back(quoted_field(c, file));
    } else {
      std::string field;
      while (!c.at_field_end()) field += c.text[c.i++];
      row.fields.push_back(std::move(field));
    }
    if (c.at(',')) {
      ++c.i;
      continue;
    }
    if (c.at('\r')) ++c.i;
    if (c.at('\n')) ++c.i;
    ++c.line;
    return row;
  }
}

// Every header column has a name, and no name (without its unit, case aside) is used twice.
void check_header(const CsvRow& row, const std::string& file) {
  for (std::size_t c = 0; c < row.fields.size(); ++c) {
    const std::string name = split_header_unit(row.fields[c]).name;
    if (name.empty())
      throw csv_error(file, row.line, "header column " + std::to_string(c + 1), row.fields[c], "a column name");
    for (std::size_t p = 0; p < c; ++p)
      if (lower(split_header_unit(row.fields[p]).name) == lower(name))
        throw csv_error(file, row.line, "header column " + std::to_string(c + 1), row.fields[c],
                        "a column name not used before");
  }
}

}  // namespace

std::optional<std::size_t> CsvTable::column(std::string_view name) const {
  const std::string want = lower(util::trim(name));
  for (std::size_t i = 0; i < header.size(); ++i)
    if (lower(split_header_unit(header[i]).name) == want) return i;
  return std::nullopt;
}

std::string CsvTable::where(const CsvRow& row, std::size_t col) const {
  std::string w = file + " line " + std::to_string(row.line) + ", column " + std::to_string(col + 1);
  if (col < header.size()) w += " ('" + util::trim(header[col]) + "')";
  return w;
}

std::string CsvTable::where(const CsvRow& row) const { return file + " line " + std::to_string(row.line); }

std::optional<std::string> CsvTable::comment_value(std::string_view key) const {
  const std::string want = lower(key);
  for (const auto& c : comments) {
    const auto sep = c.find_first_of(":=");
    if (sep == std::string::npos) continue;
    if (lower(util::trim(c.substr(0, sep))) == want) return util::trim(c.substr(sep + 1));
  }
  return std::nullopt;
}

HeaderName split_header_unit(std::string_view cell) {
  const std::string t = util::trim(cell);
  for (const auto& [open, close] : {std::pair{'[', ']'}, std::pair{'(', ')'}}) {
    const auto b = t.find(open);
    if (b != std::string::npos && !t.empty() && t.back() == close && b > 0)
      return {util::trim(std::string_view(t).substr(0, b)), util::trim(std::string_view(t).substr(b + 1, t.size() - b - 2))};
  }
  return {t, ""};
}

CsvTable parse_csv(std::string_view text, const std::string& file) {
  CsvTable table;
  table.file = file;
  if (text.size() >= 3 && text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);

  Cursor c{text};
  bool have_header = false;
  while (c.i < text.size()) {
    if (skip_blank_or_comment(c, table.comments, file)) continue;
    CsvRow row = read_record(c, file);
    if (!have_header) {
      for (std::size_t col = 0; col < row.fields.size(); ++col)
        check_text(row.fields[col], file + " line " + std::to_string(row.line) + ", column " + std::to_string(col + 1),
                   "header column " + std::to_string(col + 1));
      check_header(row, file);
      table.header = std::move(row.fields);
      table.header_line = row.line;
      have_header = true;
    } else {
      if (row.fields.size() != table.header.size())
        throw csv_error(file, row.line, "row", std::to_string(row.fields.size()) + " fields",
                        std::to_string(table.header.size()) + " fields, as in the header");
      for (std::size_t col = 0; col < row.fields.size(); ++col)
        if (util::text_problem(row.fields[col]))  // the location is spelt out only for a bad cell
          check_text(row.fields[col], table.where(row, col), split_header_unit(table.header[col]).name);
      table.rows.push_back(std::move(row));
    }
  }
  if (!have_header) throw csv_error(file, c.line, "header", "", "a header line naming the columns");
  return table;
}

CsvTable read_csv(const std::filesystem::path& path, const std::string& file) {
  require_input_file(path, file);
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError(file + ": cannot open the file for reading");
  std::ostringstream ss;
  ss << in.rdbuf();
  if (in.bad()) throw IoError(file + ": read error");
  return parse_csv(ss.str(), file);
}

std::string csv_field(const std::string& s) {
  if (s.find_first_of(",\"\n\r") == std::string::npos) return s;
  std::string q = "\"";
  for (char c : s) q += c == '"' ? std::string("\"\"") : std::string(1, c);
  return q + "\"";
}

double cell_quantity(const CsvTable& t, const CsvRow& row, std::size_t col, units::Dimension d) {
  const HeaderName h = split_header_unit(t.header[col]);
  const std::string cell = util::trim(row.fields[col]);
  try {
    if (!h.unit.empty()) {
      // The unit is in the header: a bare number takes it; a cell may still state its own unit.
      double v = 0;
      const auto [ptr, ec] = std::from_chars(cell.data(), cell.data() + cell.size(), v);
      if (ec == std::errc{} && ptr == cell.data() + cell.size() && !cell.empty() && std::isfinite(v))
        return v * units::lookup(h.unit, d, h.name).to_si;
    }
    return units::parse(cell, d, h.name);
  } catch (const InputError& e) {
    throw e.located(t.where(row, col));
  }
}


}  // namespace slipscreen::formats
