#include "formats/catalog/volume_history_csv.hpp"

#include <fstream>

#include "core/errors.hpp"
#include "formats/files/input_file.hpp"
#include "core/units/units.hpp"
#include "formats/table/csv_fields.hpp"
#include "formats/table/iso_time.hpp"

namespace slipscreen::formats {

seismo::VolumeHistory read_volume_history_csv(const std::string& path) {
  if (auto problem = input_file_problem(path)) throw IoError("cannot read volume history '" + path + "': " + *problem);
  std::ifstream in(path);
  if (!in) throw IoError("cannot read volume history '" + path + "'");
  seismo::VolumeHistory h;
  std::string line;
  std::size_t lineno = 0;
  bool header = false;
  std::size_t c_time = 0, c_vol = 1;
  while (std::getline(in, line)) {
    ++lineno;
    const auto b = line.find_first_not_of(" \t\r");
    if (b == std::string::npos || line[b] == '#') continue;
    const std::string where = path + " line " + std::to_string(lineno);
    try {
      const auto f = split_csv_record(line);
      if (!header) {
        header = true;
        bool t = false, v = false;
        for (std::size_t i = 0; i < f.size(); ++i) {
          if (f[i] == "time") { c_time = i; t = true; }
          if (f[i] == "cumulative_volume") { c_vol = i; v = true; }
        }
        if (!t || !v) throw InputError("header", line, "columns 'time' and 'cumulative_volume'");
        continue;
      }
      if (f.size() <= std::max(c_time, c_vol)) throw InputError("row", line, "a time and a cumulative volume");
      h.time.push_back(parse_iso8601_utc(f[c_time], "time"));
      h.volume.push_back(units::parse(f[c_vol], units::Dimension::volume, "cumulative_volume"));
    } catch (const InputError& e) {
      throw e.located(where);
    }
  }
  try {
    seismo::validate(h);
  } catch (const InputError& e) {
    throw e.located(path);
  }
  return h;
}

}  // namespace slipscreen::formats
