#include "formats/files/build_info.hpp"

#include <string>

#include <Eigen/Core>
#include <boost/version.hpp>
#include <gdal.h>
#include <ogr_srs_api.h>

#include "slipscreen/build_info.hpp"
#include "slipscreen/version.hpp"

namespace slipscreen::formats {
namespace {

std::string dotted(int major, int minor, int patch) {
  return std::to_string(major) + "." + std::to_string(minor) + "." + std::to_string(patch);
}

}  // namespace

nlohmann::json build_json() {
  int proj_major = 0, proj_minor = 0, proj_patch = 0;
  OSRGetPROJVersion(&proj_major, &proj_minor, &proj_patch);
  return {{"version", kVersion},
          {"git_commit", kGitCommit},
          {"compiler", std::string(kCompilerId) + " " + kCompilerVersion},
          {"libraries",
           {{"gdal", GDALVersionInfo("RELEASE_NAME")},
            {"proj", dotted(proj_major, proj_minor, proj_patch)},
            {"eigen", dotted(EIGEN_WORLD_VERSION, EIGEN_MAJOR_VERSION, EIGEN_MINOR_VERSION)},
            {"boost", dotted(BOOST_VERSION / 100000, BOOST_VERSION / 100 % 1000, BOOST_VERSION % 100)}}}};
}

}  // namespace slipscreen::formats
