#include "formats/gis/crs.hpp"

#include <ogr_spatialref.h>

#include <cmath>
#include <numbers>
#include <sstream>

#include "core/util/trim.hpp"
#include "core/errors.hpp"
#include "core/geometry/azimuth.hpp"
#include "formats/gis/gdal_errors.hpp"

namespace slipscreen::formats {

namespace {

constexpr const char* kCrsExpected =
    "a coordinate reference system as 'EPSG:<code>', OGC WKT or a PROJ string (e.g. 'EPSG:32614')";

std::string shorten(const std::string& s) { return s.size() > 80 ? s.substr(0, 77) + "..." : s; }

std::string point_text(geometry::Point2 p) {
  std::ostringstream o;
  o.precision(12);
  o << "(" << p.x << ", " << p.y << ")";
  return o.str();
}

}  // namespace

Crs Crs::from_user_string(std::string_view text, std::string_view field) {
  const std::string t = util::trim(text);
  if (t.empty()) throw InputError(std::string(field), "", kCrsExpected);
  GdalErrorScope errors{std::string(field)};
  auto srs = std::make_shared<OGRSpatialReference>();
  // No file or network look-ups: a scenario may only read the files it names as inputs.
  if (srs->SetFromUserInput(t.c_str(), OGRSpatialReference::SET_FROM_USER_INPUT_LIMITATIONS_get()) !=
      OGRERR_NONE) {
    std::string expected = kCrsExpected;
    if (errors.has_error()) expected += " (GDAL: " + errors.message() + ")";
    throw InputError(std::string(field), shorten(t), expected);
  }
  srs->SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
  return Crs(std::move(srs));
}

Crs Crs::from_osr(const OGRSpatialReference& srs) {
  auto copy = std::shared_ptr<OGRSpatialReference>(srs.Clone(), [](OGRSpatialReference* s) {
    if (s) s->Release();
  });
  copy->SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
  return Crs(std::move(copy));
}

std::string Crs::name() const {
  const char* n = srs_->GetName();
  return n ? n : "(unnamed CRS)";
}

std::string Crs::wkt() const {
  const char* const options[] = {"FORMAT=WKT2_2019", "MULTILINE=NO", nullptr};
  char* w = nullptr;
  srs_->exportToWkt(&w, options);
  std::string out = w ? w : "";
  CPLFree(w);
  return out;
}

std::string Crs::authority() const {
  const char* name = srs_->GetAuthorityName(nullptr);
  const char* code = srs_->GetAuthorityCode(nullptr);
  if (!name || !code) return {};
  return std::string(name) + ":" + code;
}

bool Crs::is_projected() const { return srs_->IsProjected() != 0; }
bool Crs::is_geographic() const { return srs_->IsGeographic() != 0; }

double Crs::linear_unit_m() const { return is_projected() ? srs_->GetLinearUnits(nullptr) : 0.0; }

bool Crs::same_as(const Crs& other) const { return srs_->IsSame(other.srs_.get()) != 0; }

Crs working_crs(std::string_view text, std::string_view field) {
  Crs crs = Crs::from_user_string(text, field);
  const std::string shown = shorten(util::trim(text)) + "' (" + crs.name();
  if (!crs.is_projected())
    throw InputError(std::string(field), shown + ", not projected)",
                     "a projected working CRS with metre units, e.g. a UTM zone 'EPSG:326<zone>'");
  if (std::abs(crs.linear_unit_m() - 1.0) > 1e-12) {
    std::ostringstream u;
    u << crs.linear_unit_m();
    throw InputError(std::string(field), shown + ", unit = " + u.str() + " m)",
                     "a projected working CRS with metre units (choose the metre variant of the projection)");
  }
  return crs;
}

Transformer::Transformer(const Crs& from, const Crs& to) : from_name_(from.name()), to_name_(to.name()) {
  if (from.same_as(to)) return;
  GdalErrorScope errors(from_name_ + " -> " + to_name_);
  ct_.reset(OGRCreateCoordinateTransformation(&from.osr(), &to.osr()));
  if (!ct_)
    throw InputError("crs", from_name_ + " -> " + to_name_,
                     "a pair of CRSs PROJ can transform between" +
                         (errors.has_error() ? " (GDAL: " + errors.message() + ")" : std::string()));
}

Transformer::~Transformer() = default;
Transformer::Transformer(Transformer&&) noexcept = default;
Transformer& Transformer::operator=(Transformer&&) noexcept = default;

geometry::Point2 Transformer::operator()(geometry::Point2 p, std::string_view field) const {
  if (!ct_) return p;
  GdalErrorScope errors{std::string(field)};
  const geometry::Point2 in = p;
  if (!ct_->Transform(1, &p.x, &p.y) || !std::isfinite(p.x) || !std::isfinite(p.y))
    throw InputError(std::string(field), point_text(in) + " in " + from_name_,
                     "a point that can be transformed to " + to_name_ + " (inside its area of use)");
  return p;
}

void Transformer::apply(std::vector<geometry::Point2>& points, std::string_view field) const {
  if (!ct_ || points.empty()) return;
  std::vector<double> xs(points.size()), ys(points.size());
  for (std::size_t i = 0; i < points.size(); ++i) xs[i] = points[i].x, ys[i] = points[i].y;
  std::vector<int> ok(points.size(), 0);
  GdalErrorScope errors{std::string(field)};
  ct_->Transform(static_cast<int>(points.size()), xs.data(), ys.data(), nullptr, ok.data());
  for (std::size_t i = 0; i < points.size(); ++i) {
    if (!ok[i] || !std::isfinite(xs[i]) || !std::isfinite(ys[i]))
      throw InputError(std::string(field), point_text(points[i]) + " in " + from_name_,
                       "a point that can be transformed to " + to_name_ + " (inside its area of use)");
  }
  for (std::size_t i = 0; i < points.size(); ++i) points[i] = {xs[i], ys[i]};
}

namespace {
Crs geographic_of(const Crs& crs) {
  if (!crs.is_projected())
    throw InputError("crs", crs.name(), "a projected CRS to compute the meridian convergence");
  OGRSpatialReference geog;
  geog.CopyGeogCSFrom(&crs.osr());
  return Crs::from_osr(geog);
}
}  // namespace

MeridianConvergence::MeridianConvergence(const Crs& crs) : MeridianConvergence(crs, geographic_of(crs)) {}

MeridianConvergence::MeridianConvergence(const Crs& crs, const Crs& geographic)
    : to_geo_(crs, geographic), to_grid_(geographic, crs) {}

double MeridianConvergence::operator()(geometry::Point2 p) const {
  geometry::Point2 ll = to_geo_(p, "convergence point");
  ll.y += 1e-5;  // degrees north along the meridian
  const geometry::Point2 q = to_grid_(ll, "convergence point");
  double a = geometry::azimuth(p, q);
  if (a > std::numbers::pi) a -= 2.0 * std::numbers::pi;
  return a;
}

double grid_convergence_rad(const Crs& crs, geometry::Point2 p) { return MeridianConvergence(crs)(p); }

}  // namespace slipscreen::formats
