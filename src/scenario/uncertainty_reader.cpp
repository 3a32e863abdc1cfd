#include "scenario/uncertainty_reader.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <limits>
#include <optional>

#include <nlohmann/json.hpp>

#include "core/errors.hpp"
#include "core/stats/distribution_text.hpp"
#include "core/stats/random_stream.hpp"
#include "core/util/number_text.hpp"
#include "core/util/suggest.hpp"
#include "formats/toml/toml_section.hpp"
#include "scenario/plausibility.hpp"

namespace slipscreen::scenario {
namespace {

using units::Dimension;
constexpr double kInf = std::numeric_limits<double>::infinity();
// Largest probability a distribution may put outside its quantity's physical range.
constexpr double kOutsideLimit = 1e-9;

// The physical range of a quantity: (lo, hi] or [lo, hi] etc.
struct Range {
  double lo = -kInf, hi = kInf;
  bool lo_open = false, hi_open = false;
  const char* what = "";  // "positive values", for messages
};
constexpr Range kAny{};
constexpr Range kPositive{0.0, kInf, true, false, "positive values"};
constexpr Range kPoisson{0.0, 0.5, true, true, "values in (0, 0.5)"};
constexpr Range kAPhi{0.0, 3.0, false, false, "values in [0, 3]"};
constexpr Range kBiot{0.0, 1.0, true, false, "values in (0, 1]"};
// The physical ranges of scenario/plausibility.hpp (docs/scenario.md, "Plausible ranges").
constexpr Range of(const plausible::Range& r, const char* what) { return {r.lo, r.hi, r.lo_open, r.hi_open, what}; }
constexpr Range kPermeability = of(plausible::kPermeability, "permeabilities from 1e-7 mD to 1e6 mD");
constexpr Range kThickness = of(plausible::kThickness, "thicknesses from 0.1 m to 5 km");
constexpr Range kPorosityRange = of(plausible::kPorosity, "porosities from 0.0001 to 0.6");
constexpr Range kCompressibility = of(plausible::kCompressibility, "compressibilities from 1e-11 to 1e-6 1/Pa");
constexpr Range kViscosity = of(plausible::kViscosity, "viscosities from 0.01 cP to 1000 cP");
constexpr Range kTransmissivity = of(plausible::kTransmissivity, "transmissivities from 1e-12 to 10 m2/s");
constexpr Range kStorativity = of(plausible::kStorativity, "storativities from 1e-8 to 0.5");
constexpr Range kPoreGradient = of(plausible::kPorePressureGradient, "pore-pressure gradients in (0, 35 MPa/km]");
constexpr Range kVerticalGradient = of(plausible::kVerticalGradient, "vertical stress gradients from 9.8 to 35 MPa/km");
constexpr Range kHorizontalGradient = of(plausible::kHorizontalGradient, "horizontal stress gradients in (0, 60 MPa/km]");
constexpr Range kCohesion = of(plausible::kCohesion, "cohesions from 0 to 100 MPa");
// A rate factor scales reported or planned rates: a factor above 10 is no longer an uncertainty
// of the same well.
constexpr Range kRateFactor{0.0, 10.0, false, false, "rate factors from 0 to 10"};

using Model = probabilistic::UncertainModel;

// A distribution-valued key: its unit dimension, physical range and the model input it replaces.
struct KeySpec {
  std::string_view key;
  Dimension dimension;
  Range range;
  UncertainField field = nullptr;  // null: per-fault friction or per-well rate factor
};

// The distribution-valued keys of [uncertainty], table by table: the one place that names them
// (docs/uncertainty.md). The stress keys, which depend on the region's stress model, are in
// read_stress below.
const std::vector<KeySpec> kTopKeys = {
    {"pore_pressure_gradient", Dimension::pressure_gradient, kPoreGradient, &Model::pore_pressure_gradient},
    {"rate_factor", Dimension::dimensionless, kRateFactor, &Model::rate_factor},
};
const std::vector<KeySpec> kPermeabilityFormKeys = {
    {"permeability", Dimension::permeability, kPermeability, &Model::permeability},
    {"thickness", Dimension::length, kThickness, &Model::thickness},
    {"porosity", Dimension::dimensionless, kPorosityRange, &Model::porosity},
    {"total_compressibility", Dimension::compressibility, kCompressibility, &Model::total_compressibility},
    {"viscosity", Dimension::viscosity, kViscosity, &Model::viscosity},
};
const std::vector<KeySpec> kTransmissivityFormKeys = {
    {"transmissivity", Dimension::diffusivity, kTransmissivity, &Model::transmissivity},
    {"storativity", Dimension::dimensionless, kStorativity, &Model::storativity},
};
const std::vector<KeySpec> kFaultKeys = {
    {"friction", Dimension::dimensionless, kPositive, &Model::friction},
    {"cohesion", Dimension::pressure, kCohesion, &Model::cohesion},
    {"strike_perturbation", Dimension::angle, kAny, &Model::strike_perturbation},
    {"dip_perturbation", Dimension::angle, kAny, &Model::dip_perturbation},
};
// [uncertainty.seismicity]: the Dieterich (1994) inputs of the seismicity likelihood
// ([observations] seismicity = true; docs/conditioning.md).
const std::vector<KeySpec> kSeismicityKeys = {
    {"a_sigma", Dimension::pressure, kPositive, &Model::a_sigma},
    {"background_rate_per_km", Dimension::inverse_time, kPositive, &Model::background_rate_per_km},
};
// [formation] model = "poroelastic_3d": the solid's constants and the permeability (the ranges of
// [formation] in region_reader.cpp; ν < ν_u is checked per realization before any screen:
// screening/depth_probability.hpp).
constexpr Range kShearModulus{1e8, 1e11, false, false, "shear moduli from 0.1 GPa to 100 GPa"};
constexpr Range kDrainedPoisson{0.0, 0.5, false, true, "drained Poisson's ratios in [0, 0.5)"};
constexpr Range kUndrainedPoisson{0.0, 0.5, true, true, "undrained Poisson's ratios in (0, 0.5)"};
const std::vector<KeySpec> kPoro3dFormationKeys = {
    {"permeability", Dimension::permeability, kPermeability},
    {"shear_modulus", Dimension::pressure, kShearModulus},
    {"poisson_ratio", Dimension::dimensionless, kDrainedPoisson},
    {"undrained_poisson_ratio", Dimension::dimensionless, kUndrainedPoisson},
    {"biot", Dimension::dimensionless, kBiot},
};
const KeySpec kPoro3dFriction{"friction", Dimension::dimensionless, kPositive};  // [uncertainty.faults], every fault
const KeySpec kOneFaultFriction{"friction", Dimension::dimensionless, kPositive};  // [uncertainty.fault."id"]
const KeySpec kOneWellRateFactor{"rate_factor", Dimension::dimensionless, kRateFactor};  // [uncertainty.well."id"]

std::vector<std::string_view> key_names(const std::vector<KeySpec>& keys,
                                        std::initializer_list<std::string_view> more = {}) {
  std::vector<std::string_view> names;
  for (const auto& k : keys) names.push_back(k.key);
  names.insert(names.end(), more.begin(), more.end());
  return names;
}

// Reads one distribution-valued key of `section`, if present, into `spec` under `out_key`
// (`id`: the fault or well of a per-fault or per-well key).
void read_value(const formats::Section& section, const KeySpec& k, const std::string& out_key, UncertaintySpec& spec,
                UncertainScope scope = UncertainScope::model, const std::string& id = "") {
  const auto f = section.find(k.key);
  if (!f) return;
  const std::string path = section.key_path(*f, k.key);
  const std::string where = section.where(*f);
  std::string text;
  if (auto s = f->node->as_string())
    text = s->get();
  else if (f->node->is_number())
    text = formats::toml_value_text(*f->node);
  else
    throw InputError(path, formats::toml_value_text(*f->node), "a value or a distribution written as a string, e.g. 'normal(0.6, 0.05)'", where);
  std::optional<stats::Distribution> d;
  try {
    d = stats::parse_distribution(text, k.dimension, path);
  } catch (const InputError& e) {
    throw e.located(where);
  }
  // Physical range: a fixed value must lie inside; a distribution may put at most 1e-9 of its
  // probability outside (so that no realization of a feasible count leaves the range).
  const Range& r = k.range;
  if (d->is_fixed()) {
    const double v = d->a();
    const bool ok = (r.lo_open ? v > r.lo : v >= r.lo) && (r.hi_open ? v < r.hi : v <= r.hi);
    if (!ok) throw InputError(path, text, std::string("a value among ") + r.what, where);
  } else {
    const double below = std::isinf(r.lo) ? 0.0 : d->cdf(r.lo);
    const double above = std::isinf(r.hi) ? 0.0 : 1.0 - d->cdf(r.hi);
    if (below > kOutsideLimit || above > kOutsideLimit)
      throw InputError(path, text,
                       std::string("a distribution of ") + r.what + " (this one puts " + util::number_text(below + above, 3) +
                           " of its probability outside; truncnormal or lognormal keep a quantity in range)",
                       where);
  }
  spec.values.push_back(UncertainValue{out_key, k.dimension, *d, text, where, scope, k.field, id});
}

void read_keys(const formats::Section& section, const std::vector<KeySpec>& keys, const std::string& prefix,
               UncertaintySpec& spec) {
  for (const auto& k : keys) read_value(section, k, prefix + std::string(k.key), spec);
}

std::string stress_model_name(StressModel m) {
  switch (m) {
    case StressModel::gradients: return "gradients";
    case StressModel::uniaxial_strain: return "uniaxial_strain";
    case StressModel::a_phi: return "a_phi";
  }
  return "?";
}

void read_stress(const formats::Section& stress, const UncertaintyContext& ctx, UncertaintySpec& spec) {
  struct StressKey {
    KeySpec spec;
    int models;  // bit mask of StressModel values where the key applies
  };
  // kPath: the keys of the poroelastic stress path ([stress] poroelastic_path = true), any model.
  constexpr int kAll = 7, kPath = 8, kGrad = 1 << static_cast<int>(StressModel::gradients),
                kUni = 1 << static_cast<int>(StressModel::uniaxial_strain), kAphi = 1 << static_cast<int>(StressModel::a_phi);
  const std::vector<StressKey> keys = {
      {{"vertical_gradient", Dimension::pressure_gradient, kVerticalGradient, &Model::vertical_gradient}, kAll},
      {{"shmax_azimuth", Dimension::angle, kAny, &Model::shmax_azimuth}, kAll},
      {{"shmax_gradient", Dimension::pressure_gradient, kHorizontalGradient, &Model::shmax_gradient}, kGrad},
      {{"shmin_gradient", Dimension::pressure_gradient, kHorizontalGradient, &Model::shmin_gradient}, kGrad},
      {{"poisson_ratio", Dimension::dimensionless, kPoisson, &Model::poisson_ratio}, kUni | kPath},
      {{"biot", Dimension::dimensionless, kBiot, &Model::biot}, kPath},
      {{"a_phi", Dimension::dimensionless, kAPhi, &Model::a_phi}, kAphi},
  };
  const int model = (1 << static_cast<int>(ctx.stress_model)) | (ctx.poroelastic_path ? kPath : 0);
  std::vector<std::string> applicable;
  for (const auto& k : keys)
    if (k.models & model) applicable.emplace_back(k.spec.key);
  std::string list;
  for (const auto& a : applicable) list += (list.empty() ? "" : ", ") + a;
  for (const auto& layer : stress.layers()) {
    if (!layer.table) continue;
    for (const auto& [name, node] : *layer.table) {
      const std::string_view key = name.str();  // clang 15 cannot capture a structured binding
      const auto it = std::find_if(keys.begin(), keys.end(), [&](const StressKey& k) { return k.spec.key == key; });
      const std::string path = "uncertainty.stress." + std::string(name.str());
      const std::string where = formats::toml_where(layer.file, node.source());
      if (it == keys.end())
        throw InputError(path, formats::toml_value_text(node),
                         "a key of [uncertainty.stress]: " + list + util::did_you_mean(name.str(), applicable), where);
      if (!(it->models & model))
        throw InputError(path, formats::toml_value_text(node),
                         "a key of the region's stress model '" + stress_model_name(ctx.stress_model) + "'" +
                             (ctx.poroelastic_path ? " with its poroelastic path" : "") + ": " + list +
                             (it->models == kPath ? " (biot needs [stress] poroelastic_path = true)" : ""),
                         where);
      if (it->spec.key == "vertical_gradient" && ctx.density_layers)
        throw InputError(path, formats::toml_value_text(node),
                         "no vertical_gradient: the region gives Sv by a density table", where);
    }
  }
  for (const auto& k : keys)
    if (k.models & model) read_value(stress, k.spec, "stress." + std::string(k.spec.key), spec);
}

// Ids of the sub-tables of [uncertainty.fault] or [uncertainty.well], each a table.
std::vector<std::string> sub_table_ids(const formats::Section& s, const std::string& prefix) {
  std::vector<std::string> ids;
  for (const auto& layer : s.layers()) {
    if (!layer.table) continue;
    for (const auto& [name, node] : *layer.table) {
      if (!node.is_table())
        throw InputError(prefix + "." + std::string(name.str()), formats::toml_value_text(node),
                         "a table [" + prefix + ".\"" + std::string(name.str()) + "\"]", formats::toml_where(layer.file, node.source()));
      ids.emplace_back(name.str());
    }
  }
  return ids;
}

// realizations, sampler, confidence and thresholds.
void read_settings(const formats::Section& top, const UncertaintyContext& ctx, UncertaintySpec& spec) {
  if (const auto n = top.optional_integer("realizations")) {
    if (*n < 1 || *n > stats::RealizationCount::kMax)
      top.fail("realizations", std::to_string(*n), "a whole number of realizations from 1 to 100000000");
    spec.realizations = stats::RealizationCount(*n, "uncertainty.realizations");
  }
  if (const auto s = top.optional_string("sampler")) {
    try {
      spec.sampler = stats::parse_sampling_method(*s, "uncertainty.sampler");
    } catch (const InputError& e) {
      throw e.located(top.where(*top.find("sampler")));
    }
  }
  if (top.has("confidence")) {
    spec.confidence = top.quantity("confidence", Dimension::dimensionless);
    if (!(spec.confidence > 0.0 && spec.confidence < 1.0))
      top.fail("confidence", formats::toml_value_text(*top.find("confidence")->node), "a level between 0 and 1, such as 0.95");
  }
  if (const auto f = top.find("thresholds")) {
    spec.thresholds.clear();
    const auto take = [&](const toml::node& n) {
      const auto v = n.value<double>();
      if (!n.is_number() || !v || !(*v > 0.0 && *v < 1.0))
        throw InputError("uncertainty.thresholds", formats::toml_value_text(n), "probabilities between 0 and 1, such as [0.05, 0.2]",
                         formats::toml_where(ctx.file, n.source()));
      spec.thresholds.push_back(*v);
    };
    if (const auto* arr = f->node->as_array()) {
      for (const auto& n : *arr) take(n);
    } else {
      take(*f->node);
    }
    std::sort(spec.thresholds.begin(), spec.thresholds.end());
    spec.thresholds.erase(std::unique(spec.thresholds.begin(), spec.thresholds.end()), spec.thresholds.end());
    if (spec.thresholds.empty())
      top.fail("thresholds", "[]", "at least one probability, such as [0.05]");
  }

}

void read_formation(const formats::Section& formation, const UncertaintyContext& ctx, UncertaintySpec& spec) {
  const std::vector<KeySpec>& keys = ctx.from_transmissivity ? kTransmissivityFormKeys : kPermeabilityFormKeys;
  formation.allow(key_names(keys));
  const std::size_t before = spec.values.size();
  read_keys(formation, keys, "formation.", spec);
  // A leaky formation keeps c_L = D/B² fixed across realizations (docs/pressure.md), which holds
  // for an uncertain k (or T) alone: B² ∝ k and D ∝ k.
  if (ctx.leaky)
    for (std::size_t i = before; i < spec.values.size(); ++i) {
      const UncertainValue& v = spec.values[i];
      if (v.key != "formation.permeability" && v.key != "formation.transmissivity")
        throw InputError("uncertainty." + v.key, v.text,
                         "a fixed value: with [formation] model = 'leaky' only the permeability (or transmissivity) "
                         "may be uncertain",
                         v.where);
    }
}

// [uncertainty.faults] (every fault) and [uncertainty.fault."id"] (the friction of one fault;
// its id is checked against the fault map when the map is read: check_fault_ids).
void read_faults(const formats::Section& top, UncertaintySpec& spec) {
  const formats::Section faults = top.child("faults");
  faults.allow(key_names(kFaultKeys));
  read_keys(faults, kFaultKeys, "faults.", spec);
  const formats::Section fault = top.child("fault");
  for (const auto& id : sub_table_ids(fault, "uncertainty.fault")) {
    const formats::Section one = fault.child(id);
    one.allow({kOneFaultFriction.key});
    read_value(one, kOneFaultFriction, "fault." + id + "." + std::string(kOneFaultFriction.key), spec,
               UncertainScope::fault_friction, id);
    spec.fault_ids.push_back(id);
  }
}

// [uncertainty.well."id"]: the rate factor of one well of the scenario.
void read_wells(const formats::Section& top, const UncertaintyContext& ctx, UncertaintySpec& spec) {
  const formats::Section well = top.child("well");
  for (const auto& id : sub_table_ids(well, "uncertainty.well")) {
    if (std::find(ctx.well_ids.begin(), ctx.well_ids.end(), id) == ctx.well_ids.end())
      throw InputError("uncertainty.well", id,
                       "the id of a well of the scenario" + util::did_you_mean(id, ctx.well_ids),
                       formats::toml_where(ctx.file, well.layers().front().table->get(id)->source()));
    const formats::Section one = well.child(id);
    one.allow({kOneWellRateFactor.key});
    read_value(one, kOneWellRateFactor, "well." + id + "." + std::string(kOneWellRateFactor.key), spec,
               UncertainScope::well_rate_factor, id);
  }
}

// [uncertainty.maps]: probability maps for unmapped faults, a cell size and an optional orientation.
void read_maps(const formats::Section& maps, UncertaintySpec& spec) {
  maps.allow({"cell_size", "strike", "dip"});
  spec.map_cell_size = maps.quantity_or("cell_size", units::Dimension::length, 0.0);
  if (maps.has("cell_size")) plausible::check(maps, "cell_size", spec.map_cell_size, plausible::kCellSize);
  if (maps.has("strike") != maps.has("dip"))
    maps.fail(maps.has("strike") ? "dip" : "strike", "(missing)", "both the strike and the dip of the map orientation");
  if (maps.has("strike")) {
    spec.map_strike = maps.quantity("strike", units::Dimension::angle);
    plausible::check(maps, "strike", *spec.map_strike, plausible::kAzimuth);
    spec.map_dip = maps.quantity("dip", units::Dimension::angle);
    plausible::check(maps, "dip", *spec.map_dip, {0.0, 1.5707963267948966 + 1e-12, false, false, "a dip from 0 to 90 deg"});
  }
}

// The screen in depth (docs/uncertainty.md, "The 3-D poroelastic model"): the solid's constants,
// the permeability and one friction for every fault; every other key is refused.
void read_poro3d(const formats::Section& top, UncertaintySpec& spec) {
  const char* takes =
      "no such key with [formation] model = 'poroelastic_3d': the screen in depth takes [uncertainty.formation] "
      "shear_modulus, poisson_ratio, undrained_poisson_ratio, biot, permeability and [uncertainty.faults] friction";
  for (const char* k : {"pore_pressure_gradient", "rate_factor", "stress", "fault", "well", "maps"})
    if (top.has(k)) top.fail(k, plausible::written(top, k), takes);
  top.allow({"realizations", "sampler", "confidence", "thresholds", "formation", "faults"});
  const formats::Section formation = top.child("formation");
  for (const auto& k : kPermeabilityFormKeys)
    if (k.key != "permeability" && formation.has(k.key)) formation.fail(k.key, plausible::written(formation, k.key), takes);
  formation.allow(key_names(kPoro3dFormationKeys));
  for (const auto& k : kPoro3dFormationKeys)
    read_value(formation, k, "formation." + std::string(k.key), spec, UncertainScope::poro3d);
  const formats::Section faults = top.child("faults");
  for (const auto& k : kFaultKeys)
    if (k.key != "friction" && faults.has(k.key)) faults.fail(k.key, plausible::written(faults, k.key), takes);
  faults.allow({kPoro3dFriction.key});
  read_value(faults, kPoro3dFriction, "faults.friction", spec, UncertainScope::poro3d);
}

}  // namespace

UncertaintySpec read_uncertainty(const toml::table* table, const UncertaintyContext& ctx) {
  UncertaintySpec spec;
  spec.seed = ctx.seed;
  if (!table) return spec;
  spec.given = true;
  const formats::Section top({formats::Section::Layer{table, ctx.file, "uncertainty", {}}});
  if (ctx.poroelastic_3d) {
    read_settings(top, ctx, spec);
    read_poro3d(top, spec);
    std::sort(spec.values.begin(), spec.values.end(), [](const UncertainValue& a, const UncertainValue& b) { return a.key < b.key; });
    return spec;
  }
  top.allow(key_names(kTopKeys, {"realizations", "sampler", "confidence", "thresholds", "stress", "formation", "faults",
                                 "fault", "well", "maps", "seismicity"}));
  read_settings(top, ctx, spec);
  read_keys(top, kTopKeys, "", spec);
  read_stress(top.child("stress"), ctx, spec);
  read_formation(top.child("formation"), ctx, spec);
  read_faults(top, spec);
  read_wells(top, ctx, spec);
  const formats::Section seismicity = top.child("seismicity");
  seismicity.allow(key_names(kSeismicityKeys));
  read_keys(seismicity, kSeismicityKeys, "seismicity.", spec);
  std::sort(spec.values.begin(), spec.values.end(), [](const UncertainValue& a, const UncertainValue& b) { return a.key < b.key; });
  read_maps(top.child("maps"), spec);
  return spec;
}

}  // namespace slipscreen::scenario
