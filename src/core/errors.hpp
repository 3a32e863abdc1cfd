#pragma once
// Typed errors shared by every layer. Core functions throw them; the command line maps each
// category to one exit code (src/cli/exit_codes.hpp). Nothing below the CLI calls exit().
#include <stdexcept>
#include <string>

namespace slipscreen {

enum class ErrorCategory {
  input,      // a value, file content or option is not what was expected
  io,         // a file could not be read or written
  refused,    // the request is understood but unsafe (overwrite, path escape, network path)
  numerical,  // a computation could not reach its stated accuracy
};

class Error : public std::runtime_error {
 public:
  Error(ErrorCategory category, const std::string& message)
      : std::runtime_error(message), category_(category) {}
  ErrorCategory category() const noexcept { return category_; }

 private:
  ErrorCategory category_;
};

// Bad input. The message names where (file and line, feature, option), the field, the value
// and what was expected: "wells.csv line 12: field 'rate' = 'abc': expected a number with a
// volume-rate unit such as '2e4 bbl/d'".
class InputError : public Error {
 public:
  InputError(std::string field, std::string value, std::string expected, std::string where = "")
      : Error(ErrorCategory::input, compose(where, field, value, expected)),
        where_(std::move(where)), field_(std::move(field)), value_(std::move(value)),
        expected_(std::move(expected)) {}

  const std::string& where() const noexcept { return where_; }
  const std::string& field() const noexcept { return field_; }
  const std::string& value() const noexcept { return value_; }
  const std::string& expected() const noexcept { return expected_; }

  // The same error with a location prefixed (the I/O layer knows the file and line).
  InputError located(const std::string& where) const {
    return InputError(field_, value_, expected_, where_.empty() ? where : where + ": " + where_);
  }

 private:
  static std::string compose(const std::string& where, const std::string& field,
                             const std::string& value, const std::string& expected) {
    std::string m = where.empty() ? "" : where + ": ";
    m += "field '" + field + "' = '" + value + "': expected " + expected;
    return m;
  }
  std::string where_, field_, value_, expected_;
};

class IoError : public Error {
 public:
  explicit IoError(const std::string& message) : Error(ErrorCategory::io, message) {}
};

class RefusedError : public Error {
 public:
  explicit RefusedError(const std::string& message) : Error(ErrorCategory::refused, message) {}
};

class NumericalError : public Error {
 public:
  explicit NumericalError(const std::string& message) : Error(ErrorCategory::numerical, message) {}
};

}  // namespace slipscreen
