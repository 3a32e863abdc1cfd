#include "formats/toml/toml_section.hpp"

#include <algorithm>
#include <cmath>
#include <fstream>
#include <sstream>

#include "core/errors.hpp"
#include "core/util/suggest.hpp"
#include "core/util/utf8.hpp"
#include "formats/table/iso_time.hpp"
#include "formats/files/input_file.hpp"
#include "formats/files/path_policy.hpp"

namespace slipscreen::formats {

std::string toml_where(const std::string& file, const toml::source_region& src) {
  if (src.begin.line == 0) return file;
  return file + " line " + std::to_string(src.begin.line) + ", column " + std::to_string(src.begin.column);
}

namespace {

std::string join_key(const std::string& prefix, std::string_view key) {
  return prefix.empty() ? std::string(key) : prefix + "." + std::string(key);
}

}  // namespace

namespace {

// Line `line` (1-based) of `text`, without its line end.
std::string_view line_of(std::string_view text, std::size_t line) {
  std::size_t start = 0;
  for (std::size_t l = 1; l < line && start != std::string_view::npos; ++l) {
    start = text.find('\n', start);
    if (start != std::string_view::npos) ++start;
  }
  if (start == std::string_view::npos || start > text.size()) return {};
  const std::size_t end = text.find('\n', start);
  std::string_view l = text.substr(start, end == std::string_view::npos ? std::string_view::npos : end - start);
  if (!l.empty() && l.back() == '\r') l.remove_suffix(1);
  return l;
}

// The first date "YYYY-MM-DD" on the line that names no real day, and why.
std::optional<std::string> impossible_date_on(std::string_view line) {
  for (std::size_t i = 0; i + 10 <= line.size(); ++i)
    if (const auto reason = impossible_date_reason(line.substr(i, 10)))
      return "the date " + std::string(line.substr(i, 10)) + " does not exist: " + *reason;
  return std::nullopt;
}

// toml++'s description of a syntax error in plain words where a common slip is recognised
// (a string left open, a day that does not exist), else as toml++ words it.
std::string plain_words(std::string_view description, std::string_view line) {
  const bool in_string = description.find("parsing string") != std::string_view::npos;
  if (in_string && description.find("end-of-file") != std::string_view::npos)
    return "a string is not closed: its closing quote is missing before the end of the file";
  if (in_string && description.find("control characters") != std::string_view::npos)
    return "a string is not closed on its line: its closing quote is missing (a string on several lines "
           "needs triple quotes)";
  if (description.find("parsing date") != std::string_view::npos)
    if (const auto date = impossible_date_on(line)) return *date;
  std::string d(description);
  if (d.rfind("Error while parsing ", 0) == 0) {
    const auto colon = d.find(": ");
    if (colon != std::string::npos) d = d.substr(colon + 2) + " (in a " + d.substr(20, colon - 20) + ")";
  }
  return "not valid TOML: " + d;
}

Error syntax_error(const std::string& file, std::string_view text, const toml::parse_error& e) {
  const toml::source_position at = e.source().begin;
  const std::string_view line = line_of(text, at.line);
  std::string m = toml_where(file, e.source()) + ": " + plain_words(e.description(), line);
  if (!line.empty() && at.column >= 1) {
    std::string shown = util::printable(line);
    std::replace(shown.begin(), shown.end(), '\t', ' ');
    m += "\n    " + shown + "\n    " + std::string(std::min<std::size_t>(at.column - 1, shown.size()), ' ') + "^";
  }
  return Error(ErrorCategory::input, m);
}

}  // namespace

TomlDocument parse_toml_file(const std::filesystem::path& path, const std::string& file) {
  require_input_file(path, file);
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  if (!in || in.bad()) throw IoError(file + ": read error");
  TomlDocument doc = parse_toml_text(text.str(), file);
  doc.path = path;
  return doc;
}

TomlDocument parse_toml_text(std::string_view text, const std::string& file) {
  try {
    return {file, file, std::make_shared<toml::table>(toml::parse(text, std::string_view(file)))};
  } catch (const toml::parse_error& e) {
    throw syntax_error(file, text, e);
  }
}

std::string toml_value_text(const toml::node& n) {
  if (auto s = n.as_string()) return s->get();
  std::ostringstream os;
  n.visit([&os](const auto& v) { os << v; });
  return os.str();
}

Section Section::child(std::string_view key) const {
  std::vector<Layer> out;
  for (const auto& l : layers_) {
    Layer c{nullptr, l.file, join_key(l.prefix, key), l.dir};
    if (l.table) {
      if (const toml::node* n = l.table->get(key)) {
        if (!n->is_table())
          throw Error(ErrorCategory::input, toml_where(l.file, n->source()) + ": key '" + c.prefix +
                                                "': expected a table ([" + c.prefix + "])");
        c.table = n->as_table();
      }
    }
    out.push_back(std::move(c));
  }
  return Section(std::move(out));
}

bool Section::empty() const {
  for (const auto& l : layers_)
    if (l.table && !l.table->empty()) return false;
  return true;
}

bool Section::has(std::string_view key) const { return find(key).has_value(); }

std::optional<Section::Found> Section::find(std::string_view key) const {
  for (auto it = layers_.rbegin(); it != layers_.rend(); ++it)
    if (it->table)
      if (const toml::node* n = it->table->get(key)) return Found{n, &*it};
  return std::nullopt;
}

void Section::allow(std::initializer_list<std::string_view> allowed) const {
  allow(std::vector<std::string_view>(allowed.begin(), allowed.end()));
}

void Section::allow(const std::vector<std::string_view>& allowed) const {
  std::vector<std::string> names(allowed.begin(), allowed.end());
  for (const auto& l : layers_) {
    if (!l.table) continue;
    for (const auto& [k, v] : *l.table) {
      bool ok = false;
      for (const auto& a : names) ok = ok || a == k.str();
      if (ok) continue;
      const auto& src = k.source().begin.line ? k.source() : v.source();
      throw Error(ErrorCategory::input, toml_where(l.file, src) + ": key '" + join_key(l.prefix, k.str()) +
                                            "': unknown key" + util::did_you_mean(k.str(), names));
    }
  }
}

std::string Section::where(const Found& f) const { return toml_where(f.layer->file, f.node->source()); }

std::string Section::key_path(const Found& f, std::string_view key) const { return join_key(f.layer->prefix, key); }

std::string Section::where_missing(std::string_view key) const {
  for (const auto& l : layers_)
    if (l.table) return toml_where(l.file, l.table->source()) + ": key '" + join_key(l.prefix, key) + "'";
  const auto& l = layers_.front();
  return l.file + ": key '" + join_key(l.prefix, key) + "'";
}

void Section::fail(std::string_view key, const std::string& value, const std::string& expected) const {
  if (auto f = find(key)) throw InputError(key_path(*f, key), value, expected, where(*f));
  throw InputError(layers_.empty() ? std::string(key) : join_key(layers_.front().prefix, key), value, expected,
                   layers_.empty() ? "" : layers_.front().file);
}

Section::Found Section::require(std::string_view key, std::string_view what) const {
  if (auto f = find(key)) return *f;
  throw Error(ErrorCategory::input, where_missing(key) + ": missing (expected " + std::string(what) + ")");
}

double Section::quantity(std::string_view key, units::Dimension d) const {
  const std::string what = "a " + std::string(units::dimension_name(d)) + " value";
  const Found f = require(key, what);
  const std::string path = key_path(f, key);
  std::string text;
  if (auto s = f.node->as_string()) text = s->get();
  else if (f.node->is_number()) text = toml_value_text(*f.node);
  else throw InputError(path, toml_value_text(*f.node), what + " written as a string, e.g. '0.7 psi/ft'", where(f));
  try {
    return units::parse(text, d, path);
  } catch (const InputError& e) {
    throw e.located(where(f));
  }
}

std::optional<double> Section::optional_quantity(std::string_view key, units::Dimension d) const {
  if (!has(key)) return std::nullopt;
  return quantity(key, d);
}

double Section::quantity_or(std::string_view key, units::Dimension d, double fallback) const {
  return has(key) ? quantity(key, d) : fallback;
}

std::string Section::string(std::string_view key) const {
  const Found f = require(key, "a string");
  if (auto s = f.node->as_string()) return s->get();
  throw InputError(key_path(f, key), toml_value_text(*f.node), "a string in quotes", where(f));
}

std::optional<std::string> Section::optional_string(std::string_view key) const {
  if (!has(key)) return std::nullopt;
  return string(key);
}

bool Section::boolean_or(std::string_view key, bool fallback) const {
  const auto f = find(key);
  if (!f) return fallback;
  if (auto b = f->node->as_boolean()) return b->get();
  throw InputError(key_path(*f, key), toml_value_text(*f->node), "true or false", where(*f));
}

std::int64_t Section::integer(std::string_view key) const {
  const Found f = require(key, "an integer");
  if (auto i = f.node->as_integer()) return i->get();
  throw InputError(key_path(f, key), toml_value_text(*f.node), "an integer", where(f));
}

std::optional<std::int64_t> Section::optional_integer(std::string_view key) const {
  if (!has(key)) return std::nullopt;
  return integer(key);
}

std::optional<double> toml_number(const toml::node& n) {
  if (auto i = n.as_integer()) return static_cast<double>(i->get());
  if (auto x = n.as_floating_point())
    if (std::isfinite(x->get())) return x->get();  // TOML's nan and inf are no coordinate or magnitude
  return std::nullopt;
}

double Section::number(std::string_view key) const {
  const Found f = require(key, "a number");
  if (const auto v = toml_number(*f.node)) return *v;
  throw InputError(key_path(f, key), toml_value_text(*f.node), "a finite number (without quotes)", where(f));
}

std::vector<std::pair<std::string, std::string>> Section::string_list(std::string_view key) const {
  const Found f = require(key, "a list of strings");
  std::vector<std::pair<std::string, std::string>> out;
  if (auto s = f.node->as_string()) {
    out.emplace_back(s->get(), where(f));
    return out;
  }
  const toml::array* arr = f.node->as_array();
  if (!arr) throw InputError(key_path(f, key), toml_value_text(*f.node), "a list of strings [\"...\", ...]", where(f));
  for (std::size_t i = 0; i < arr->size(); ++i) {
    const toml::node& n = *arr->get(i);
    const std::string w = toml_where(f.layer->file, n.source());
    if (auto s = n.as_string()) out.emplace_back(s->get(), w);
    else throw InputError(key_path(f, key) + "[" + std::to_string(i) + "]", toml_value_text(n), "a string", w);
  }
  return out;
}

std::vector<Section> Section::table_array(std::string_view key, const std::string& expected,
                                          TableArrayCheck check) const {
  std::vector<Section> out;
  const auto f = find(key);
  if (!f) return out;
  const toml::array* arr = f->node->as_array();
  const std::string path = key_path(*f, key);
  if (check == TableArrayCheck::whole && (!arr || !arr->is_array_of_tables()))
    fail(key, toml_value_text(*f->node), expected);
  if (!arr) fail(key, f->node->is_table() ? "[" + path + "]" : toml_value_text(*f->node), expected);
  for (std::size_t i = 0; i < arr->size(); ++i) {
    const toml::node& n = *arr->get(i);
    const std::string entry = path + "[" + std::to_string(i) + "]";
    if (!n.is_table()) throw InputError(entry, toml_value_text(n), expected, toml_where(f->layer->file, n.source()));
    out.emplace_back(std::vector<Layer>{{n.as_table(), f->layer->file, entry, f->layer->dir}});
  }
  return out;
}

std::filesystem::path Section::path(std::string_view key) const {
  const std::string rel = string(key);
  const Found f = *find(key);
  if (rel.empty()) throw InputError(key_path(f, key), rel, "a file path", where(f));
  return (f.layer->dir / rel).lexically_normal();
}

std::filesystem::path Section::input_path(std::string_view key) const {
  if (is_network_path(string(key))) {
    const Found f = *find(key);
    throw RefusedError(where(f) + ": refused: key '" + key_path(f, key) + "' = '" + string(key) +
                       "': scenario inputs are local files (network paths are never read)");
  }
  const std::filesystem::path p = path(key);
  if (const auto problem = input_file_problem(p)) {
    const Found f = *find(key);
    throw IoError(where(f) + ": key '" + key_path(f, key) + "' = '" + string(key) + "': " + *problem + " (" +
                  p.generic_string() + ")");
  }
  return p;
}

}  // namespace slipscreen::formats
