#include "core/util/suggest.hpp"

#include <doctest/doctest.h>

using namespace slipscreen::util;

TEST_CASE("edit distance") {
  // Classic textbook pair: kitten -> sitting needs 3 edits (Levenshtein 1966 definition).
  CHECK(edit_distance("kitten", "sitting") == 3);
  CHECK(edit_distance("", "abc") == 3);
  CHECK(edit_distance("same", "same") == 0);
}

TEST_CASE("nearest suggestion only when close") {
  const std::vector<std::string> keys = {"permeability", "porosity", "thickness"};
  CHECK(nearest("permeabilty", keys).value() == "permeability");
  CHECK_FALSE(nearest("xyz", keys).has_value());
  CHECK(did_you_mean("porosty", keys) == " (did you mean 'porosity'?)");
}
