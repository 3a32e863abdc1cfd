#pragma once
// Strict, layered reading of TOML tables for the scenario and region files (toml++).
//
// A Section is one table seen through one or more layers: the region file's [stress] table and
// the scenario's [region.override.stress] table, say. Later layers win. Every message names the
// file, the line and column (toml++ source regions) and the full key path, e.g.
//   scenario.toml line 14, column 1: key 'output.cel_size': unknown key (did you mean 'cell_size'?)
#include <cstdint>
#include <filesystem>
#include <initializer_list>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <toml++/toml.h>

#include "core/units/units.hpp"

namespace slipscreen::formats {

// A parsed TOML document that keeps its display name. Throws InputError for a syntax error
// (with line and column) and IoError when the file cannot be read.
struct TomlDocument {
  std::string file;  // display name for messages
  std::filesystem::path path;
  std::shared_ptr<toml::table> root;
};
TomlDocument parse_toml_file(const std::filesystem::path& path, const std::string& file);
TomlDocument parse_toml_text(std::string_view text, const std::string& file);

// "scenario.toml line 3, column 7" (or just the file name when the position is unknown).
std::string toml_where(const std::string& file, const toml::source_region& src);

class Section {
 public:
  struct Layer {
    const toml::table* table = nullptr;  // may be null: the layer has no such table
    std::string file;                     // display name
    std::string prefix;                   // key path of this table in its file, e.g. "output.grid"
    std::filesystem::path dir;            // relative paths in this layer resolve against it
  };
  struct Found {
    const toml::node* node;
    const Layer* layer;
  };

  Section() = default;
  explicit Section(std::vector<Layer> layers) : layers_(std::move(layers)) {}

  // The sub-table `key` in every layer. A non-table value under that key is an error.
  Section child(std::string_view key) const;
  // True when some layer has the key.
  bool has(std::string_view key) const;
  std::optional<Found> find(std::string_view key) const;

  // Refuses keys outside `allowed` in every layer, with "did you mean".
  void allow(std::initializer_list<std::string_view> allowed) const;
  void allow(const std::vector<std::string_view>& allowed) const;

  // A quantity with a unit, written as a string ("0.7 psi/ft"); a bare TOML number is accepted
  // only for dimensionless values. Returns SI.
  double quantity(std::string_view key, units::Dimension d) const;
  std::optional<double> optional_quantity(std::string_view key, units::Dimension d) const;
  double quantity_or(std::string_view key, units::Dimension d, double fallback) const;

  std::string string(std::string_view key) const;
  std::optional<std::string> optional_string(std::string_view key) const;
  bool boolean_or(std::string_view key, bool fallback) const;
  std::int64_t integer(std::string_view key) const;
  std::optional<std::int64_t> optional_integer(std::string_view key) const;
  double number(std::string_view key) const;  // a plain, finite TOML number (coordinates)
  // An array of strings (a single string is taken as an array of one).
  std::vector<std::pair<std::string, std::string>> string_list(std::string_view key) const;  // (value, where)
  // A path string resolved against the directory of the layer that sets it.
  std::filesystem::path path(std::string_view key) const;
  // The same, for an input file that must exist: IoError naming the key, its place and the path.
  std::filesystem::path input_path(std::string_view key) const;

  // The entries of an array of tables ([[key]], or key = [{ ... }, ...]), each a Section with the
  // key path "key[i]" in the layer that sets the key; none when no layer has the key. What else is
  // refused, with `expected` at the key (InputError, located):
  //   whole:      anything but a non-empty array of tables, the value as written;
  //   each_entry: a value that is not an array (a table shown as its header "[key]"), and an entry
  //               that is not a table, at that entry; an empty array has no entries.
  enum class TableArrayCheck { whole, each_entry };
  std::vector<Section> table_array(std::string_view key, const std::string& expected,
                                   TableArrayCheck check = TableArrayCheck::whole) const;

  // "file line L, column C" of a found value, and its full key path.
  std::string where(const Found& f) const;
  std::string key_path(const Found& f, std::string_view key) const;
  // The location of the section itself (first layer that has it), for "missing key" messages.
  std::string where_missing(std::string_view key) const;

  // Throws InputError naming the value's place: for checks made by the caller.
  [[noreturn]] void fail(std::string_view key, const std::string& value, const std::string& expected) const;

  bool empty() const;
  const std::vector<Layer>& layers() const { return layers_; }

 private:
  Found require(std::string_view key, std::string_view what) const;
  std::vector<Layer> layers_;
};

// The text of a scalar TOML value for messages.
std::string toml_value_text(const toml::node& n);

// A TOML integer or finite float as a double; empty for any other node (nan and inf too).
std::optional<double> toml_number(const toml::node& n);

}  // namespace slipscreen::formats
