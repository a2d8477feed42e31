// Unit factors and unit text, against their definitions.
#include <gtest/gtest.h>

#include "core/units.hpp"
#include "io/input_error.hpp"
#include "io/units_parse.hpp"

using namespace zcorr;
using io::InputError;

TEST(Units, FactorsMatchTheirDefinitions) {
  // NIST SP 811 (2008) Appendix B.8: 1 psi = 6.894 757 E+03 Pa; 1 ft^3 = 2.831 685 E-02 m^3;
  // 1 Btu_IT = 1.055 056 E+03 J; 1 kWh = 3.6 E+06 J; 1 bar = 1 E+05 Pa.
  EXPECT_NEAR(units::psi, 6894.757, 5e-4);
  EXPECT_DOUBLE_EQ(units::psi, 0.45359237 * 9.80665 / (0.0254 * 0.0254));  // exact definition
  EXPECT_NEAR(units::ft3, 0.02831685, 5e-9);
  EXPECT_DOUBLE_EQ(units::Mcf, 28.316846592);
  EXPECT_NEAR(units::Btu, 1055.056, 5e-4);
  EXPECT_DOUBLE_EQ(units::kWh, 3.6e6);
  EXPECT_DOUBLE_EQ(units::MMBtu, 1055.05585262e6);
}

TEST(Units, PressureText) {
  EXPECT_DOUBLE_EQ(io::parse_pressure_Pa("5 MPa", "p"), 5e6);
  EXPECT_DOUBLE_EQ(io::parse_pressure_Pa("101.325kPa", "p"), 101325.0);
  EXPECT_DOUBLE_EQ(io::parse_pressure_Pa("14.73 psia", "p"), 14.73 * units::psi);
  EXPECT_DOUBLE_EQ(io::parse_pressure_Pa("725 psig", "p", 14.4 * units::psi), 739.4 * units::psi);
  EXPECT_DOUBLE_EQ(io::parse_pressure_Pa("40 barg", "p", 101325.0), 4.0e6 + 101325.0);
  EXPECT_DOUBLE_EQ(io::parse_pressure_Pa("3 bar(a)", "p"), 3e5);
}

TEST(Units, PressureTextRejected) {
  EXPECT_THROW((void)io::parse_pressure_Pa("725 psi", "p"), InputError);      // absolute or gauge?
  EXPECT_THROW((void)io::parse_pressure_Pa("40 bar", "p"), InputError);       // absolute or gauge?
  EXPECT_THROW((void)io::parse_pressure_Pa("725 psig", "p"), InputError);     // no atmospheric pressure
  EXPECT_THROW((void)io::parse_pressure_Pa("-5 kPa", "p"), InputError);       // negative absolute
  EXPECT_THROW((void)io::parse_pressure_Pa("5", "p"), InputError);            // no unit
  EXPECT_THROW((void)io::parse_pressure_Pa("5 atmospheres", "p"), InputError);
  EXPECT_THROW((void)io::parse_pressure_Pa("nan kPa", "p"), InputError);
  EXPECT_THROW((void)io::parse_pressure_Pa("inf kPa", "p"), InputError);
  try {
    (void)io::parse_pressure_Pa("-5 kPa", "P_line");
    FAIL();
  } catch (const InputError& e) {
    EXPECT_EQ(e.field(), "P_line");
    EXPECT_EQ(e.value(), "-5 kPa");
    EXPECT_NE(std::string(e.what()).find(">= 0"), std::string::npos);
  }
}

TEST(Units, TemperatureText) {
  EXPECT_DOUBLE_EQ(io::parse_temperature_K("15 degC", "T"), 288.15);
  EXPECT_DOUBLE_EQ(io::parse_temperature_K("60 degF", "T"), (60.0 + 459.67) / 1.8);
  EXPECT_DOUBLE_EQ(io::parse_temperature_K("60\xC2\xB0" "F", "T"), (60.0 + 459.67) / 1.8);
  EXPECT_DOUBLE_EQ(io::parse_temperature_K("519.67 degR", "T"), 519.67 / 1.8);
  EXPECT_DOUBLE_EQ(io::parse_temperature_K("300 K", "T"), 300.0);
  EXPECT_DOUBLE_EQ(io::parse_temperature_K("-10C", "T"), 263.15);
  EXPECT_THROW((void)io::parse_temperature_K("abc", "T"), InputError);
  EXPECT_THROW((void)io::parse_temperature_K("300", "T"), InputError);
  EXPECT_THROW((void)io::parse_temperature_K("-300 degC", "T"), InputError);
  EXPECT_THROW((void)io::parse_temperature_K("300 kelvins", "T"), InputError);
}

TEST(Units, VolumeAndEnergyText) {
  EXPECT_DOUBLE_EQ(io::parse_volume_m3("2 Mcf", "V"), 2000.0 * units::ft3);
  EXPECT_DOUBLE_EQ(io::parse_volume_m3("1.5 m3", "V"), 1.5);
  EXPECT_DOUBLE_EQ(io::parse_energy_J("1 MMBtu", "E"), 1055.05585262e6);
  EXPECT_DOUBLE_EQ(io::parse_energy_J("2 kWh", "E"), 7.2e6);
  EXPECT_DOUBLE_EQ(io::parse_energy_J("1 therm", "E"), 105505585.262);
  EXPECT_THROW((void)io::parse_volume_m3("3 gallons", "V"), InputError);
  EXPECT_THROW((void)io::parse_energy_J("3 calories", "E"), InputError);
}

// Values that overflow after unit conversion, or volumes no meter measures,
// are refused where they enter, naming the field (never inf downstream).
TEST(Units, OverflowingAndImpossibleValuesAreRefused) {
  EXPECT_THROW((void)io::parse_pressure_Pa("1e308 MPa", "--p"), InputError);
  EXPECT_THROW((void)io::parse_temperature_K("1e309 K", "--T"), InputError);
  EXPECT_THROW((void)io::parse_volume_m3("1e308 Mcf", "--V"), InputError);
  EXPECT_THROW((void)io::parse_volume_m3("2e15 m3", "--V"), InputError);
  EXPECT_THROW((void)io::parse_energy_J("1e308 MMBtu", "E"), InputError);
  EXPECT_DOUBLE_EQ(io::parse_volume_m3("1e15 m3", "--V"), 1e15);
  try {
    (void)io::parse_pressure_Pa("1e308 MPa", "--p");
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("--p"), std::string::npos) << e.what();
  }
}
