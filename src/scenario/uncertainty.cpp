#include "scenario/uncertainty.hpp"

#include <algorithm>

#include <nlohmann/json.hpp>

#include "core/errors.hpp"
#include "core/stats/distribution_text.hpp"
#include "core/stats/random_stream.hpp"
#include "core/util/suggest.hpp"

namespace slipscreen::scenario {

const UncertainValue* UncertaintySpec::find(std::string_view key) const {
  for (const auto& v : values)
    if (v.key == key) return &v;
  return nullptr;
}

const UncertainValue* seismicity_value(const UncertaintySpec& spec) {
  for (const auto& v : spec.values)
    if (v.key.starts_with("seismicity.")) return &v;
  return nullptr;
}

void check_fault_ids(const UncertaintySpec& spec, const std::vector<std::string>& fault_ids) {
  for (const auto& id : spec.fault_ids) {
    if (std::find(fault_ids.begin(), fault_ids.end(), id) != fault_ids.end()) continue;
    std::string where;
    for (const auto& v : spec.values)
      if (v.key.rfind("fault." + id + ".", 0) == 0) where = v.where;
    throw InputError("uncertainty.fault", id, "the id of a fault of the fault map" + util::did_you_mean(id, fault_ids), where);
  }
}

nlohmann::json to_json(const UncertaintySpec& spec) {
  nlohmann::json inputs = nlohmann::json::array();
  for (const auto& v : spec.values)
    inputs.push_back({{"key", v.key},
                      {"written", v.text},
                      {"distribution_si", stats::format_distribution(v.distribution, v.dimension)}});
  return {{"given", spec.given},
          {"sampler", std::string(stats::sampling_method_name(spec.sampler))},
          {"seed", spec.seed},
          {"realizations", spec.realizations.value()},
          {"stream", std::string(stats::kStreamVersion)},
          {"confidence", spec.confidence},
          {"thresholds", spec.thresholds},
          {"map_cell_size_m", spec.map_cell_size},
          {"map_orientation_rad", spec.map_strike ? nlohmann::json{*spec.map_strike, *spec.map_dip} : nlohmann::json()},
          {"inputs", inputs}};
}

}  // namespace slipscreen::scenario
