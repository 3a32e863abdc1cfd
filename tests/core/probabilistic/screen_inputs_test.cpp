#include "core/probabilistic/screen_inputs.hpp"

#include <doctest/doctest.h>

using namespace slipscreen;
using namespace slipscreen::probabilistic;
using stats::Distribution;

TEST_CASE("sampled inputs: sampler order, per-fault friction and per-well rate factors named by id") {
  UncertainModel m;
  m.from_transmissivity = true;
  m.model = HorizontalStressModel::a_phi;
  m.fault_ids = {"F-1", "F-2"};
  m.fault_friction = {std::nullopt, Distribution::uniform(0.5, 0.7)};
  m.well_rate_factor = {Distribution::uniform(0.9, 1.1)};
  const std::vector<WellInput> wells{WellInput{"W-9", 0.0, 0.0, 0.1, {}}};
  const std::vector<std::string> expected{"transmissivity", "storativity", "vertical_gradient",
                                          "pore_pressure_gradient", "shmax_azimuth", "a_phi", "friction",
                                          "cohesion", "friction[F-2]", "rate_factor", "rate_factor[W-9]",
                                          "strike_perturbation", "dip_perturbation"};
  CHECK(sampled_input_names(m, wells, 2) == expected);
  const InputList l = make_inputs(m, wells, 2);
  CHECK(l.fault_friction[0] == InputList::npos);
  CHECK(l.fault_friction[1] == 8);
  CHECK(l.well_rate[0] == 10);
  CHECK(l.inputs[l.t].name == "transmissivity");
  CHECK(l.inputs[l.aphi].name == "a_phi");
}
