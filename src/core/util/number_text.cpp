#include "core/util/number_text.hpp"

#include <sstream>

namespace slipscreen::util {

std::string number_text(double v, int precision) {
  std::ostringstream s;
  s.precision(precision);
  s << v;
  return s.str();
}

}  // namespace slipscreen::util
