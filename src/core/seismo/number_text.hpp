#pragma once
// Short text for a number in error messages of the seismo module ("%.6g").
#include <cstdio>
#include <string>

namespace slipscreen::seismo {

inline std::string number_text(double v, int digits = 6) {
  char buf[40];
  std::snprintf(buf, sizeof buf, "%.*g", digits, v);
  return buf;
}

}  // namespace slipscreen::seismo
