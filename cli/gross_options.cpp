#include "gross_options.hpp"

#include <cmath>
#include <limits>

#include "data/sgerg88_data.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"

namespace zcorr::cli {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

double parse_fraction(std::string_view text, std::string_view field) {
  const double v = io::parse_number(io::trim(text), field);
  if (v < 0.0 || v >= 1.0) throw io::InputError(std::string(field), std::string(text), "a mole fraction in [0, 1)");
  return v;
}

double parse_density(std::string_view text, std::string_view field) {
  const double v = io::parse_number(io::trim(text), field);
  if (!(v > 0.0)) throw io::InputError(std::string(field), std::string(text), "a relative density > 0");
  return v;
}

// Which inputs each method takes.
struct InputSet {
  bool Hs, d, x_CO2, x_N2;
};
InputSet input_set(MethodId m) {
  if (m == MethodId::gross2) return {false, true, true, true};
  return {true, true, true, false};
}

void check_set(MethodId m, const GrossInputs& g, const std::string& where) {
  const auto set = input_set(m);
  const std::string name(method_name(m));
  auto need = [&](bool want, double v, const char* what) {
    if (want && std::isnan(v)) throw io::InputError(where, what, name + " needs " + what);
    if (!want && !std::isnan(v))
      throw io::InputError(where, what,
                           name + " does not take " + std::string(what) +
                               (m == MethodId::gross2 ? " (gross2 takes d, x_N2, x_CO2)" : " (it takes Hs, d, x_CO2 and x_H2)"));
  };
  need(set.Hs, g.Hs_MJ_per_m3, "Hs");
  need(set.d, g.d, "d");
  need(set.x_CO2, g.x_CO2, "x_CO2");
  need(set.x_N2, g.x_N2, "x_N2");
}

}  // namespace

bool is_gross_method(MethodId m) noexcept { return m == MethodId::sgerg88 || m == MethodId::gross1 || m == MethodId::gross2; }

double parse_heating_value_MJ_per_m3(std::string_view text, std::string_view field) {
  const auto nu = io::split_unit(text, field);
  std::string u;
  for (char c : nu.unit)
    if (c != ' ' && c != '^') u += static_cast<char>((c >= 'A' && c <= 'Z') ? c - 'A' + 'a' : c);
  if (u == "m³") u = "m3";
  double f = 0.0;
  if (u.empty() || u == "mj/m3" || u == "mj/m³") f = 1.0;
  else if (u == "kj/m3" || u == "kj/m³") f = 1e-3;
  else if (u == "kwh/m3" || u == "kwh/m³") f = 3.6;
  else if (u == "btu/ft3" || u == "btu/scf" || u == "btu/cf") f = aga8_gross::data::btu_per_ft3_in_MJ_per_m3;
  else throw io::InputError(std::string(field), std::string(text), "a heating value per volume: MJ/m3, kJ/m3, kWh/m3 or Btu/ft3 (bare number = MJ/m3)");
  const double v = nu.value * f;
  if (!(v > 0.0)) throw io::InputError(std::string(field), std::string(text), "a heating value > 0");
  return v;
}

std::string_view gross_reference_text(MethodId m) noexcept {
  switch (m) {
    case MethodId::sgerg88:
      return "Hs: 25 degC combustion, 0 degC and 101.325 kPa metering; d: 0 degC, 101.325 kPa (ISO 12213-3)";
    case MethodId::gross1:
      return "HV: 60 degF combustion, 60 degF and 14.73 psia metering; Gr: 60 degF, 14.73 psia (AGA 8 gross method 1)";
    case MethodId::gross2:
      return "Gr: 60 degF, 14.73 psia (AGA 8 gross method 2)";
    default:
      return {};
  }
}

std::string_view gross_reduction_tag(MethodId m) noexcept {
  switch (m) {
    case MethodId::sgerg88: return "gross_from=iso6976_Hs25C/0C_d0C";
    case MethodId::gross1: return "gross_from=iso6976_HV60F/60F_Gr60F_14.73psia";
    case MethodId::gross2: return "gross_from=iso6976_Gr60F_14.73psia";
    default: return {};
  }
}

void GrossOptions::add_to(CLI::App& app) {
  app.add_option("--Hs", Hs,
                 "Gross calorific value per volume for sgerg88 (25/0 degC, 101.325 kPa) or gross1 (HV at 60/60 degF, "
                 "14.73 psia), e.g. \"40.66 MJ/m3\", \"1036 Btu/ft3\" (bare number = MJ/m3)");
  app.add_option("--d", d, "Real-gas relative density (sgerg88: 0 degC, 101.325 kPa; gross1/gross2: 60 degF, 14.73 psia)");
  app.add_option("--x-co2", x_co2, "CO2 mole fraction (sgerg88, gross1, gross2)");
  app.add_option("--x-h2", x_h2, "H2 mole fraction (default 0; hydrogen is refused: coefficients_missing)");
  app.add_option("--x-n2", x_n2, "N2 mole fraction (gross2)");
}

bool GrossOptions::given() const { return !Hs.empty() || !d.empty() || !x_co2.empty() || !x_h2.empty() || !x_n2.empty(); }

GrossInputs GrossOptions::load(MethodId m) const {
  GrossInputs g;
  if (!Hs.empty()) g.Hs_MJ_per_m3 = parse_heating_value_MJ_per_m3(Hs, "--Hs");
  if (!d.empty()) g.d = parse_density(d, "--d");
  if (!x_co2.empty()) g.x_CO2 = parse_fraction(x_co2, "--x-co2");
  if (!x_h2.empty()) g.x_H2 = parse_fraction(x_h2, "--x-h2");
  if (!x_n2.empty()) g.x_N2 = parse_fraction(x_n2, "--x-n2");
  check_set(m, g, "gross inputs");
  return g;
}

void GrossColumns::bind(const std::vector<std::string>& header) {
  for (std::size_t c = 0; c < header.size(); ++c) {
    const auto name = io::trim(header[c]);
    int* slot = name == "Hs_MJ_per_m3"     ? &Hs
                : name == "HV_Btu_per_ft3" ? &HV
                : name == "d"              ? &d
                : name == "x_CO2"          ? &x_CO2
                : name == "x_H2"           ? &x_H2
                : name == "x_N2"           ? &x_N2
                                           : nullptr;
    if (slot == nullptr) continue;
    if (*slot >= 0) throw io::InputError("--input header", std::string(name), "the column appears twice");
    *slot = static_cast<int>(c);
  }
  if (Hs >= 0 && HV >= 0) throw io::InputError("--input header", "Hs_MJ_per_m3 and HV_Btu_per_ft3", "give one of the two");
}

bool GrossColumns::any() const { return Hs >= 0 || HV >= 0 || d >= 0 || x_CO2 >= 0 || x_H2 >= 0 || x_N2 >= 0; }

void GrossColumns::require(MethodId m) const {
  const auto set = input_set(m);
  const std::string name(method_name(m));
  auto need = [&](bool want, bool have, const char* col) {
    if (want && !have) throw io::InputError("--input header", col, name + " needs a " + col + " column");
    if (!want && have) throw io::InputError("--input header", col, name + " does not take a " + col + " column");
  };
  need(set.Hs, Hs >= 0 || HV >= 0, "Hs_MJ_per_m3 (or HV_Btu_per_ft3)");
  need(set.d, d >= 0, "d");
  need(set.x_CO2, x_CO2 >= 0, "x_CO2");
  need(set.x_N2, x_N2 >= 0, "x_N2");
}

GrossInputs GrossColumns::read(const std::vector<std::string>& row, MethodId m) const {
  GrossInputs g;
  auto cell = [&](int c) { return io::trim(row[static_cast<std::size_t>(c)]); };
  if (Hs >= 0) g.Hs_MJ_per_m3 = parse_heating_value_MJ_per_m3(cell(Hs), "Hs_MJ_per_m3");
  if (HV >= 0) g.Hs_MJ_per_m3 = io::parse_number(cell(HV), "HV_Btu_per_ft3") * aga8_gross::data::btu_per_ft3_in_MJ_per_m3;
  if (d >= 0) g.d = parse_density(cell(d), "d");
  if (x_CO2 >= 0) g.x_CO2 = parse_fraction(cell(x_CO2), "x_CO2");
  if (x_H2 >= 0 && !cell(x_H2).empty()) g.x_H2 = parse_fraction(cell(x_H2), "x_H2");
  if (x_N2 >= 0) g.x_N2 = parse_fraction(cell(x_N2), "x_N2");
  (void)m;
  return g;
}

}  // namespace zcorr::cli
