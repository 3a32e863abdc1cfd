#include "formats/gis/gdal_errors.hpp"

#include <cpl_conv.h>
#include <cpl_error.h>
#include <gdal.h>

#include <mutex>

#include "core/errors.hpp"

namespace slipscreen::formats {

struct GdalErrorSink {
  static void CPL_STDCALL handle(CPLErr level, CPLErrorNum /*code*/, const char* msg) {
    auto* scope = static_cast<GdalErrorScope*>(CPLGetErrorHandlerUserData());
    if (!scope) return;
    const std::string text = msg ? msg : "(no message)";
    if (level == CE_Failure || level == CE_Fatal) scope->errors_.push_back(text);
    else if (level == CE_Warning) scope->warnings_.push_back(text);
  }
};

void ensure_gdal_registered() {
  static std::once_flag once;
  std::call_once(once, [] {
    GDALAllRegister();
    // GDAL builds a GeoPackage's spatial index in a background thread when the process may use
    // more than one CPU, which changes the SQLite change counter in the file's header (bytes
    // 24-27 and 92-95): the same run then wrote different bytes when bound to one core (as
    // mpirun binds its ranks). Building it in the writing thread makes screen.gpkg the same for
    // any CPU set (docs/cluster.md); the index itself is the same either way.
    CPLSetConfigOption("OGR_GPKG_ALLOW_THREADED_RTREE", "NO");
  });
}

GdalErrorScope::GdalErrorScope(std::string context) : context_(std::move(context)) {
  ensure_gdal_registered();
  CPLPushErrorHandlerEx(&GdalErrorSink::handle, this);
  CPLErrorReset();
}

GdalErrorScope::~GdalErrorScope() { CPLPopErrorHandler(); }

std::string GdalErrorScope::message() const {
  std::string m;
  for (const auto& e : errors_) m += (m.empty() ? "" : "; ") + e;
  return m;
}

void GdalErrorScope::throw_io(const std::string& what) const {
  std::string m = context_ + ": " + what;
  if (has_error()) m += ": " + message();
  throw IoError(m);
}

void GdalErrorScope::throw_if_error(const std::string& what) const {
  if (has_error()) throw_io(what);
}

void GdalErrorScope::clear() noexcept {
  errors_.clear();
  warnings_.clear();
  CPLErrorReset();
}

}  // namespace slipscreen::formats
