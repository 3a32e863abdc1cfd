#include "cli/commands.hpp"

namespace slipscreen::cli {

const std::vector<Registrar>& registrars() {
  static const std::vector<Registrar> list = {
      &register_units_command,
      &register_pressure_command,
      &register_catalog_command,
      &register_validate_command,
      &register_fault_stress_command,
      &register_run_command,
      &register_demo_command,
      &register_report_command,
      &register_compare_command,
  };
  return list;
}

}  // namespace slipscreen::cli
