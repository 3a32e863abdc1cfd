#pragma once
// How this slipscreen was built: version, git commit, compiler and the versions of the
// libraries it uses, as the manifest records them (docs/outputs.md). They differ between builds,
// so only the manifest carries them: no other output holds a build-dependent field.
#include <nlohmann/json.hpp>

namespace slipscreen::formats {

// {"version": kVersion, "git_commit": "<git describe --always --dirty at configure time, or
// 'unknown'>", "compiler": "GNU 12.2.0", "libraries": {"gdal": "3.6.2", "proj": "9.1.1",
// "eigen": "3.4.0", "boost": "1.74.0"}}. GDAL and PROJ as linked (run time); Eigen and Boost,
// header libraries, as compiled.
nlohmann::json build_json();

}  // namespace slipscreen::formats
