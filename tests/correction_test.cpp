// Base conditions and the line-to-base correction.
#include <gtest/gtest.h>

#include <boost/multiprecision/cpp_bin_float.hpp>
#include <cmath>

#include "core/base_conditions.hpp"

using namespace zcorr;

TEST(BaseConditions, PresetsHoldTheirDefiningValues) {
  // Common practice (ISO 13443; US contracts; GPA): see standards-notes.
  const auto* iso = find_base_preset("iso15");
  ASSERT_NE(iso, nullptr);
  EXPECT_DOUBLE_EQ(iso->T_K, 288.15);
  EXPECT_DOUBLE_EQ(iso->p_Pa, 101325.0);
  const auto* us = find_base_preset("us60f_14.73");
  ASSERT_NE(us, nullptr);
  EXPECT_NEAR(us->T_K, 288.705555555, 1e-8);
  EXPECT_NEAR(us->p_Pa, 101559.7749, 1e-3);  // 14.73 * 6894.757293168 Pa
  EXPECT_EQ(find_base_preset("nonsense"), nullptr);
}

TEST(Correction, FactorsMultiplyAndFpvIsTheRootOfFz) {
  auto f = correction_factors(4.3e6, 281.15, 0.9132, 101325.0, 288.15, 0.9976);
  ASSERT_TRUE(f.status.ok());
  EXPECT_NEAR(f.C, f.Fp * f.Ft * f.Fz, 1e-13 * f.C);
  EXPECT_NEAR(f.Fpv * f.Fpv, f.Fz, 1e-15);
  // Ideal gas at base conditions: C reduces to the pressure and temperature ratios.
  auto ideal = correction_factors(101325.0, 288.15, 1.0, 101325.0, 288.15, 1.0);
  EXPECT_DOUBLE_EQ(ideal.C, 1.0);
}

TEST(Correction, BadInputGivesAStatus) {
  const double nan = std::nan("");
  EXPECT_EQ(correction_factors(nan, 281.15, 0.9, 101325.0, 288.15, 0.99).status.code, Code::invalid_pressure);
  EXPECT_EQ(correction_factors(4e6, -1.0, 0.9, 101325.0, 288.15, 0.99).status.code, Code::invalid_temperature);
  EXPECT_EQ(correction_factors(4e6, 281.15, 0.0, 101325.0, 288.15, 0.99).status.code, Code::invalid_input);
  EXPECT_EQ(correction_factors(4e6, 281.15, 0.9, 0.0, 288.15, 0.99).status.code, Code::invalid_pressure);
}

TEST(Correction, SameInDoubleAndFiftyDigits) {
  using mp = boost::multiprecision::cpp_bin_float_50;
  auto d = correction_factors(4.3e6, 281.15, 0.9132, 101325.0, 288.15, 0.9976);
  auto m = correction_factors<mp>(mp(4.3e6), mp(281.15), mp(0.9132), mp(101325.0), mp(288.15), mp(0.9976));
  EXPECT_NEAR(d.C, static_cast<double>(m.C), 1e-14 * d.C);
}
