// zcorr CLI: gross-characterization inputs (SGERG-88, AGA8 gross methods 1
// and 2) as options and as batch CSV columns. Parsing only, no physics.
//
// Options / columns (units):
//   --Hs     | Hs_MJ_per_m3    superior (gross) calorific value, real gas, per m3:
//                              sgerg88: 25 degC combustion, 0 degC and 101.325 kPa metering;
//                              gross1:  60 degF combustion, 60 degF and 14.73 psia (HV).
//                              The option takes a unit ("40.66 MJ/m3", "1036 Btu/ft3",
//                              "11.3 kWh/m3"); a bare number is MJ/m3.
//            | HV_Btu_per_ft3  the same quantity in Btu(IT)/ft3 (instead of Hs_MJ_per_m3).
//   --d      | d               real-gas relative density (sgerg88: 0 degC, 101.325 kPa;
//                              gross1/gross2: 60 degF, 14.73 psia).
//   --x-co2  | x_CO2           CO2 mole fraction.
//   --x-h2   | x_H2            H2 mole fraction (optional, default 0; any H2 is refused
//                              with coefficients_missing, see engine/data/sgerg88_data.hpp).
//   --x-n2   | x_N2            N2 mole fraction (gross2 only).
// Input sets: sgerg88 and gross1 need Hs, d, x_CO2; gross2 needs d, x_N2, x_CO2.
#pragma once

#include <CLI/CLI.hpp>

#include <string>
#include <string_view>
#include <vector>

#include "eval/line_method.hpp"

namespace zcorr::cli {

[[nodiscard]] bool is_gross_method(MethodId m) noexcept;

// "40.66 MJ/m3", "1036 Btu/ft3", "11.29 kWh/m3", "40660 kJ/m3", or a bare number (MJ/m3).
[[nodiscard]] double parse_heating_value_MJ_per_m3(std::string_view text, std::string_view field);

// One-line statement of the reference conditions of a gross method's inputs.
[[nodiscard]] std::string_view gross_reference_text(MethodId m) noexcept;
// Short tag appended to the batch status when the inputs came from an analysis.
[[nodiscard]] std::string_view gross_reduction_tag(MethodId m) noexcept;

struct GrossOptions {
  std::string Hs, d, x_co2, x_h2, x_n2;
  void add_to(CLI::App& app);
  [[nodiscard]] bool given() const;
  // Throws io::InputError when a value is malformed or the set does not fit the method.
  [[nodiscard]] GrossInputs load(MethodId m) const;
};

// Batch CSV columns of the gross inputs.
struct GrossColumns {
  int Hs = -1, HV = -1, d = -1, x_CO2 = -1, x_H2 = -1, x_N2 = -1;
  // Records the gross columns of a header (throws on a duplicate).
  void bind(const std::vector<std::string>& header);
  [[nodiscard]] bool any() const;
  // Throws io::InputError when the header lacks a column the method needs.
  void require(MethodId m) const;
  // Reads one row (throws io::InputError naming the field).
  [[nodiscard]] GrossInputs read(const std::vector<std::string>& row, MethodId m) const;
};

}  // namespace zcorr::cli
