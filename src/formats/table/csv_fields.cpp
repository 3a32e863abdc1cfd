#include "formats/table/csv_fields.hpp"

#include "core/util/trim.hpp"
#include "core/errors.hpp"

namespace slipscreen::formats {
namespace {
}  // namespace

std::vector<std::string> split_csv_record(std::string_view line, char delimiter) {
  std::vector<std::string> fields;
  std::string cur;
  bool quoted = false, was_quoted = false;
  for (std::size_t i = 0; i < line.size(); ++i) {
    const char ch = line[i];
    if (quoted) {
      if (ch == '"') {
        if (i + 1 < line.size() && line[i + 1] == '"') {
          cur += '"';
          ++i;
        } else {
          quoted = false;
        }
      } else {
        cur += ch;
      }
    } else if (ch == '"') {
      quoted = true;
      was_quoted = true;
      cur = util::trim(cur);  // spaces before an opening quote are not content
    } else if (ch == delimiter) {
      fields.push_back(was_quoted ? cur : util::trim(cur));
      cur.clear();
      was_quoted = false;
    } else if (!(was_quoted && (ch == ' ' || ch == '\t' || ch == '\r'))) {
      cur += ch;
    }
  }
  if (quoted) throw InputError("CSV record", std::string(line), "every opening quote closed on the same line");
  fields.push_back(was_quoted ? cur : util::trim(cur));
  return fields;
}

}  // namespace slipscreen::formats
