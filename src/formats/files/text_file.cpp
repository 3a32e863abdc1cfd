#include "formats/files/text_file.hpp"

#include "core/errors.hpp"
#include "formats/table/csv.hpp"

namespace slipscreen::formats {

void write_text_file(const std::filesystem::path& path, std::string_view text) {
  TextFileWriter f(path);
  f.write(text);
  f.close();
}

TextFileWriter::TextFileWriter(std::filesystem::path path) : path_(std::move(path)), out_(path_, std::ios::binary) {
  if (!out_) throw IoError("cannot create '" + path_.string() + "'");
}

void TextFileWriter::check(const char* what) {
  if (!out_) throw IoError("cannot write '" + path_.string() + "' (" + what + ")");
}

void TextFileWriter::write(std::string_view text) {
  out_.write(text.data(), static_cast<std::streamsize>(text.size()));
  check("write");
}

void TextFileWriter::row(const std::vector<std::string>& fields) {
  std::string line;
  for (std::size_t i = 0; i < fields.size(); ++i) {
    if (i) line += ',';
    line += csv_field(fields[i]);
  }
  line += '\n';
  write(line);
}

void TextFileWriter::close() {
  out_.close();
  check("close");
}

}  // namespace slipscreen::formats
