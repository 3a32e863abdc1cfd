#pragma once
// GDAL diagnostics as slipscreen errors.
//
// GDAL reports problems through CPLError, which by default prints to stderr. A GdalErrorScope
// installs a handler (for the current thread, for the scope's lifetime) that collects the
// messages instead; the code that called GDAL then throws one typed error naming the file:
//
//   GdalErrorScope errors(path);
//   GDALDataset* ds = GDALDataset::Open(...);
//   if (!ds) errors.throw_io("cannot open as a vector file");
//
// Warnings are collected too (warnings()) and never printed. Debug messages are dropped.
// Scopes nest: the innermost collects.
#include <string>
#include <vector>

namespace slipscreen::formats {

// Registers GDAL/OGR drivers once per process (thread-safe). Every io function that opens or
// creates a dataset calls it; callers need not.
void ensure_gdal_registered();

class GdalErrorScope {
 public:
  explicit GdalErrorScope(std::string context);
  ~GdalErrorScope();
  GdalErrorScope(const GdalErrorScope&) = delete;
  GdalErrorScope& operator=(const GdalErrorScope&) = delete;

  const std::string& context() const noexcept { return context_; }
  bool has_error() const noexcept { return !errors_.empty(); }
  // Failure messages joined with "; " (empty when none).
  std::string message() const;
  const std::vector<std::string>& warnings() const noexcept { return warnings_; }

  // Throws IoError("<context>: <what>: <GDAL message>").
  [[noreturn]] void throw_io(const std::string& what) const;
  // Throws IoError as above when a failure was reported since the scope began (or since clear()).
  void throw_if_error(const std::string& what) const;
  void clear() noexcept;

 private:
  friend struct GdalErrorSink;
  std::string context_;
  std::vector<std::string> errors_;
  std::vector<std::string> warnings_;
};

}  // namespace slipscreen::formats
