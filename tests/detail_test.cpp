// Tests of the AGA8 detail characterization method (engine/methods/detail.hpp,
// ISO 12213-2:2006). Every check against an outside value names its source.
#include <gtest/gtest.h>

#include <algorithm>
#include <boost/multiprecision/cpp_bin_float.hpp>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <limits>
#include <string>
#include <utility>
#include <vector>

#include "eval/line_method.hpp"
#include "io/csv.hpp"
#include "methods/detail.hpp"

using namespace zcorr;
using C = Component;
namespace ad = zcorr::aga8_detail;

namespace {

using Gas = std::vector<std::pair<C, double>>;

template <class S = double>
Fractions<S> fractions(const Gas& g, double scale = 1.0) {
  Fractions<S> x{};
  for (const auto& [c, v] : g) x[index(c)] = S(v * scale);
  return x;
}

template <class S = double>
ad::Prepared<S> prepared(const Gas& g, double scale = 1.0) {
  ad::Prepared<S> p;
  const Status s = ad::prepare(fractions<S>(g, scale), p);
  EXPECT_TRUE(s.ok()) << code_name(s.code);
  return p;
}

// ISO 12213-2:2006 Annex C example gases 1-6 (compositions as listed in the
// project's standards notes, from memory: gases 1, 2, 3, 5 high confidence,
// gases 4 and 6 medium).
const std::vector<std::pair<const char*, Gas>>& iso_gases() {
  static const std::vector<std::pair<const char*, Gas>> g{
      {"gas1", {{C::methane, 0.965}, {C::nitrogen, 0.003}, {C::carbon_dioxide, 0.006}, {C::ethane, 0.018}, {C::propane, 0.0045},
                {C::isobutane, 0.001}, {C::n_butane, 0.001}, {C::isopentane, 0.0005}, {C::n_pentane, 0.0003}, {C::n_hexane, 0.0007}}},
      {"gas2", {{C::methane, 0.907}, {C::nitrogen, 0.031}, {C::carbon_dioxide, 0.005}, {C::ethane, 0.045}, {C::propane, 0.0084},
                {C::isobutane, 0.0010}, {C::n_butane, 0.0015}, {C::isopentane, 0.0003}, {C::n_pentane, 0.0004}, {C::n_hexane, 0.0004}}},
      {"gas3", {{C::methane, 0.859}, {C::nitrogen, 0.010}, {C::carbon_dioxide, 0.015}, {C::ethane, 0.085}, {C::propane, 0.023},
                {C::isobutane, 0.0035}, {C::n_butane, 0.0035}, {C::isopentane, 0.0005}, {C::n_pentane, 0.0005}}},
      {"gas4", {{C::methane, 0.735}, {C::nitrogen, 0.100}, {C::carbon_dioxide, 0.016}, {C::ethane, 0.033}, {C::propane, 0.0074},
                {C::isobutane, 0.0012}, {C::n_butane, 0.0012}, {C::isopentane, 0.0004}, {C::n_pentane, 0.0004}, {C::n_hexane, 0.0002},
                {C::hydrogen, 0.095}, {C::carbon_monoxide, 0.010}, {C::n_heptane, 0.0001}, {C::n_octane, 0.0001}}},
      {"gas5", {{C::methane, 0.812}, {C::nitrogen, 0.057}, {C::carbon_dioxide, 0.076}, {C::ethane, 0.043}, {C::propane, 0.009},
                {C::isobutane, 0.0015}, {C::n_butane, 0.0015}}},
      {"gas6", {{C::methane, 0.826}, {C::nitrogen, 0.117}, {C::carbon_dioxide, 0.011}, {C::ethane, 0.035}, {C::propane, 0.0075},
                {C::isobutane, 0.0012}, {C::n_butane, 0.0012}, {C::isopentane, 0.0004}, {C::n_pentane, 0.0004}, {C::n_hexane, 0.0002},
                {C::n_heptane, 0.0001}}},
  };
  return g;
}

// AGA Report No. 8 (1992/1994) example gases, mol % (standards notes, from memory, medium-high).
const std::vector<std::pair<const char*, Gas>>& aga_gases() {
  static const std::vector<std::pair<const char*, Gas>> g{
      {"gulf_coast", {{C::methane, 96.5222}, {C::nitrogen, 0.2595}, {C::carbon_dioxide, 0.5956}, {C::ethane, 1.8186}, {C::propane, 0.4596},
                      {C::isobutane, 0.0977}, {C::n_butane, 0.1007}, {C::isopentane, 0.0473}, {C::n_pentane, 0.0324}, {C::n_hexane, 0.0664}}},
      {"amarillo", {{C::methane, 90.6724}, {C::nitrogen, 3.1284}, {C::carbon_dioxide, 0.4676}, {C::ethane, 4.5279}, {C::propane, 0.8280},
                    {C::isobutane, 0.1037}, {C::n_butane, 0.1563}, {C::isopentane, 0.0321}, {C::n_pentane, 0.0443}, {C::n_hexane, 0.0393}}},
      {"ekofisk", {{C::methane, 85.9063}, {C::nitrogen, 1.0068}, {C::carbon_dioxide, 1.4954}, {C::ethane, 8.4919}, {C::propane, 2.3015},
                   {C::isobutane, 0.3486}, {C::n_butane, 0.3506}, {C::isopentane, 0.0509}, {C::n_pentane, 0.0480}}},
      {"high_n2", {{C::methane, 81.441}, {C::nitrogen, 13.465}, {C::carbon_dioxide, 0.985}, {C::ethane, 3.300}, {C::propane, 0.605},
                   {C::isobutane, 0.100}, {C::n_butane, 0.104}}},
  };
  return g;
}

// The 21-component test mixture of the AGA8 (2017) reference code of the
// detail equation (mole fractions, from memory; see Aga8ReferenceCodeTestMixture_FromMemory).
const Gas& reference_mixture() {
  static const Gas g{{C::methane, 0.77824}, {C::nitrogen, 0.02}, {C::carbon_dioxide, 0.06}, {C::ethane, 0.08}, {C::propane, 0.03},
                     {C::isobutane, 0.0015}, {C::n_butane, 0.003}, {C::isopentane, 0.0005}, {C::n_pentane, 0.00165}, {C::n_hexane, 0.00215},
                     {C::n_heptane, 0.00088}, {C::n_octane, 0.00024}, {C::n_nonane, 0.00015}, {C::n_decane, 0.00009}, {C::hydrogen, 0.004},
                     {C::oxygen, 0.005}, {C::carbon_monoxide, 0.002}, {C::water, 0.0001}, {C::hydrogen_sulfide, 0.0025}, {C::helium, 0.007},
                     {C::argon, 0.001}};
  return g;
}

double rel(double a, double b) { return (a - b) / b; }

}  // namespace

// ---------------------------------------------------------------------------
// Example gases

// Source: ISO 12213-2:2006 Annex C, results of the example calculation at
// p = 6 MPa, T = 270 K (-3.15 degC), five decimals: 0.84053, 0.83348, 0.79380,
// 0.88550, 0.82609, 0.85380 for gases 1-6. FROM MEMORY (medium confidence):
// recalled, not read. Tolerance: half a unit of the fifth decimal.
TEST(DetailExampleGases, Iso12213Part2AnnexC_6MPa_270K_FromMemory) {
  const double expected[6] = {0.84053, 0.83348, 0.79380, 0.88550, 0.82609, 0.85380};
  for (std::size_t g = 0; g < 6; ++g) {
    const auto p = prepared(iso_gases()[g].second);
    EXPECT_EQ(p.status.range, RangeClass::normal) << iso_gases()[g].first;
    const auto r = ad::evaluate(p, 270.0, 6.0e6);
    ASSERT_TRUE(r.status.ok()) << iso_gases()[g].first;
    EXPECT_NEAR(r.Z, expected[g], 0.5e-5) << iso_gases()[g].first;
    std::printf("ISO 12213-2 %s  6 MPa 270 K  Z = %.6f (from memory %.5f)\n", iso_gases()[g].first, r.Z, expected[g]);
  }
}

// The other published conditions of ISO 12213-2 Annex C (6 and 12 MPa at
// 270 K and 330 K) are not recalled reliably, so they are not asserted here;
// what is known about them: every gas is in the normal range there, and the
// detail method stays within its 0.1 % of a strict GERG-2008 reference (see
// DetailVsGerg2008 below for the gases of the shared reference set).
TEST(DetailExampleGases, Iso12213Part2AnnexC_AllConditionsInNormalRange) {
  for (const auto& [name, gas] : iso_gases()) {
    const auto p = prepared(gas);
    for (double T : {270.0, 330.0})
      for (double P : {6.0e6, 12.0e6}) {
        const auto r = ad::evaluate(p, T, P);
        EXPECT_TRUE(r.status.ok()) << name;
        EXPECT_EQ(r.status.range, RangeClass::normal) << name;
        EXPECT_GT(r.Z, 0.5) << name;
        EXPECT_LT(r.Z, 1.0) << name;
        std::printf("ISO 12213-2 %s  %4.1f MPa %5.1f K  Z = %.6f\n", name, P / 1e6, T, r.Z);
      }
  }
}

// AGA Report No. 8 example gases (compositions from memory, medium-high).
// Their published Z values are not known reliably here, so only what is
// certain is checked: the compositions sum to 100 mol %, lie in the normal
// range, and Z at 60 degF and 14.73 psia (AGA base conditions, common
// practice) agrees with the two-term virial value 1 + B p/(R T) to 1e-5.
TEST(DetailExampleGases, Aga8Report_ExampleGases_WhatIsKnown) {
  const double T = (60.0 + 459.67) / 1.8, P = 14.73 * 6894.757293168361;
  for (const auto& [name, gas] : aga_gases()) {
    double sum = 0;
    for (const auto& e : gas) sum += e.second;
    EXPECT_NEAR(sum, 100.0, 1e-9) << name;
    const auto p = prepared(gas, 0.01);
    EXPECT_EQ(p.status.range, RangeClass::normal) << name;
    const auto r = ad::evaluate(p, T, P);
    ASSERT_TRUE(r.status.ok()) << name;
    const double Zv = 1.0 + r.B_cm3_per_mol * 1e-3 * (P / 1000.0) / (8.31451 * T);
    EXPECT_NEAR(r.Z, Zv, 1e-5) << name;
    std::printf("AGA 8 %-10s 60 degF 14.73 psia  Z = %.7f  M = %.4f g/mol\n", name, r.Z, r.M_g_per_mol);
  }
}

// Source: the example output of the AGA8 (2017) reference code of the
// detail equation, for its 21-component test mixture at 400 K and 50 MPa:
// molar mass 20.54333051 g/mol, molar density 12.80792403648801 mol/L,
// Z = 1.173801364147326. FROM MEMORY, confirmed by reproducing both Z and
// density to 1e-15: with the tables as corrected (g_48 = 0) the deviations
// are 1.3e-15 (Z) and -1.9e-15 (density) in double, and 2e-16 and -8e-16 in
// 50-digit arithmetic, i.e. at the last digit printed. Tolerance 1e-9
// relative for both. (With the former g_48 = 1, Z was 1.1738062, 4.1e-6 off.)
TEST(DetailExampleGases, Aga8ReferenceCodeTestMixture_FromMemory) {
  const auto p = prepared(reference_mixture());
  EXPECT_NEAR(p.M_g_per_mol, 20.54333051, 1e-8);
  const auto r = ad::evaluate(p, 400.0, 50.0e6);
  ASSERT_TRUE(r.status.ok()) << code_name(r.status.code);
  EXPECT_EQ(r.status.range, RangeClass::expanded);
  EXPECT_NEAR(rel(r.Z, 1.173801364147326), 0.0, 1e-9);
  EXPECT_NEAR(rel(r.rho_mol_per_L, 12.80792403648801), 0.0, 1e-9);
  std::printf("AGA8 reference-code mixture 400 K 50 MPa: Z = %.15f (recalled 1.173801364147326, dev %.1e), rho = %.14f mol/L (dev %.1e)\n",
              r.Z, rel(r.Z, 1.173801364147326), r.rho_mol_per_L, rel(r.rho_mol_per_L, 12.80792403648801));
}

// The same state through the LineMethod adapter that zcorr z uses (same source and tolerance).
TEST(DetailExampleGases, Aga8ReferenceCodeTestMixtureThroughTheAdapter_FromMemory) {
  auto m = make_line_method(MethodId::detail);
  ASSERT_NE(m, nullptr);
  ASSERT_TRUE(m->prepare(fractions(reference_mixture())).ok());
  const auto out = m->state(400.0, 50.0e6, EvalOptions{});
  ASSERT_TRUE(out.status.ok()) << code_name(out.status.code);
  EXPECT_NEAR(rel(out[Quantity::Z], 1.173801364147326), 0.0, 1e-9);
  EXPECT_NEAR(rel(out[Quantity::rho_mol_per_L], 12.80792403648801), 0.0, 1e-9);
}

// ---------------------------------------------------------------------------
// Second virial coefficients of pure fluids.
// Source: the project's standards notes, "Second virial coefficients",
// computed from the reference equations of state (Setzmann-Wagner 1991
// methane, Span 2000 nitrogen, Span-Wagner 1996 CO2, Buecker-Wagner 2006
// ethane), +-1-2 %. Tolerance: 2 % of |B| (the method is not expected to do
// better for pure fluids), with a floor of 0.15 cm3/mol because a relative
// tolerance means nothing where B crosses zero: nitrogen at 350 K, B = +3.43,
// is met to 0.11 cm3/mol (3.2 %), the largest relative miss of the table.
TEST(DetailVirial, PureFluidSecondVirialAgainstReferenceEquations) {
  struct Row { C c; double T, B; };
  const Row rows[] = {
      {C::methane, 250, -65.68},        {C::methane, 300, -42.21},        {C::methane, 350, -26.61},
      {C::nitrogen, 250, -16.44},       {C::nitrogen, 300, -4.55},        {C::nitrogen, 350, 3.43},
      {C::carbon_dioxide, 250, -184.0}, {C::carbon_dioxide, 300, -121.3}, {C::carbon_dioxide, 350, -84.4},
      {C::ethane, 250, -264.0},         {C::ethane, 300, -182.6},         {C::ethane, 350, -131.2},
  };
  for (const auto& r : rows) {
    const auto p = prepared({{r.c, 1.0}});
    const double B = ad::second_virial_cm3_per_mol(p, r.T);
    EXPECT_NEAR(B, r.B, std::max(0.02 * std::abs(r.B), 0.15)) << component_name(index(r.c)) << " " << r.T;
  }
}

// B from the mixing rule equals the low-density limit of (Z - 1)/rho, and C
// the limit of (Z - 1 - B rho)/rho^2 (definition of the virial coefficients).
TEST(DetailVirial, VirialCoefficientsAreTheLowDensityLimits) {
  for (const auto& [name, gas] : iso_gases()) {
    const auto p = prepared(gas);
    for (double T : {250.0, 300.0, 350.0}) {
      const double B = ad::second_virial_cm3_per_mol(p, T) * 1e-3;  // dm3/mol
      const double Cv = ad::third_virial_cm6_per_mol2(p, T) * 1e-6;
      for (double rho : {1e-3, 1e-4}) {
        const double Z = ad::z_from_density(p, T, rho);
        EXPECT_NEAR((Z - 1.0) / rho, B, std::abs(B) * 1e-4 + std::abs(Cv) * rho * 1.01) << name;
      }
      const double rho = 1e-3;
      const double Z = ad::z_from_density(p, T, rho);
      EXPECT_NEAR((Z - 1.0 - B * rho) / (rho * rho), Cv, std::abs(Cv) * 2e-2) << name << " " << T;
    }
  }
}

TEST(DetailLimits, ZTendsToOneAsPressureTendsToZero) {
  for (const auto& [name, gas] : iso_gases()) {
    const auto p = prepared(gas);
    double prev = ad::evaluate(p, 300.0, 1.0e6).Z;
    for (double P : {1.0e5, 1.0e4, 1.0e3, 1.0e2, 1.0}) {
      const auto r = ad::evaluate(p, 300.0, P);
      ASSERT_TRUE(r.status.ok());
      EXPECT_LT(std::abs(r.Z - 1.0), std::abs(prev - 1.0) + 1e-15) << name;
      prev = r.Z;
    }
    EXPECT_NEAR(prev, 1.0, 1e-7) << name;
    const auto zero = ad::evaluate(p, 300.0, 0.0);
    ASSERT_TRUE(zero.status.ok());
    EXPECT_EQ(zero.Z, 1.0);
    EXPECT_EQ(zero.rho_mol_per_L, 0.0);
    // At p -> 0: dZ/dp = B / (R T).
    EXPECT_NEAR(zero.dZdp_per_kPa, zero.B_cm3_per_mol * 1e-3 / (8.31451 * 300.0), 1e-15);
  }
}

// The solved density reproduces the pressure: p = Z rho R T with the standard's R.
TEST(DetailSolve, DensityReproducesPressure) {
  const auto p = prepared(iso_gases()[2].second);
  for (double T : {265.0, 300.0, 335.0, 450.0})
    for (double P : {1e5, 2e6, 6e6, 12e6, 30e6, 70e6}) {
      const auto r = ad::evaluate(p, T, P);
      ASSERT_TRUE(r.status.ok()) << T << " " << P << " " << code_name(r.status.code);
      EXPECT_NEAR(r.Z * r.rho_mol_per_L * 8.31451 * T * 1000.0 / P, 1.0, 1e-13);
      EXPECT_NEAR(r.Z, ad::z_from_density(p, T, r.rho_mol_per_L), 1e-15);
      EXPECT_NEAR(r.rho_kg_per_m3, r.rho_mol_per_L * r.M_g_per_mol, 1e-12 * r.rho_kg_per_m3);
      EXPECT_LE(r.iterations, 12);
    }
}

// The fast path (z_factor: Z = p / (rho R T) at the converged density, no
// further evaluation) agrees with the equation at that density.
TEST(DetailSolve, FastPathAgreesWithTheEquation) {
  for (const auto& [name, gas] : iso_gases()) {
    const auto p = prepared(gas);
    for (double T : {263.0, 290.0, 338.0})
      for (double P : {101325.0, 3e6, 8e6, 12e6}) {
        const auto z = ad::z_factor(p, T, P);
        ASSERT_TRUE(z.status.ok()) << name;
        EXPECT_NEAR(z.Z, ad::z_from_density(p, T, z.rho_mol_per_L), 1e-13) << name << " " << T << " " << P;
        EXPECT_NEAR(z.Z, ad::evaluate(p, T, P).Z, 1e-13) << name;
      }
  }
}

// dZ/dp at constant T and dZ/dT at constant p against central differences.
TEST(DetailSolve, DerivativesMatchFiniteDifferences) {
  for (const auto& [name, gas] : iso_gases()) {
    const auto p = prepared(gas);
    for (double T : {270.0, 330.0})
      for (double P : {1e6, 6e6, 12e6}) {
        const auto r = ad::evaluate(p, T, P);
        const double hp = P * 1e-4, hT = 1e-3;
        const double dZdp = (ad::evaluate(p, T, P + hp).Z - ad::evaluate(p, T, P - hp).Z) / (2 * hp / 1000.0);
        const double dZdT = (ad::evaluate(p, T + hT, P).Z - ad::evaluate(p, T - hT, P).Z) / (2 * hT);
        EXPECT_NEAR(r.dZdp_per_kPa, dZdp, 1e-6 * std::abs(dZdp) + 1e-13) << name;
        EXPECT_NEAR(r.dZdT_per_K, dZdT, 1e-6 * std::abs(dZdT) + 1e-11) << name;
      }
  }
}

// Robustness sweep over the expanded T and p range (and beyond, allowed) for
// pure fluids and a natural gas: every state ends in ok or no_gas_root (the
// two-phase and liquid-like states, where no gas-branch root reaches the
// pressure), within the iteration cap, and an ok state reproduces p. The
// slow build (ZCORR_SLOW_TESTS) runs a grid ten times finer.
TEST(DetailSolve, SweepEndsInAStatusWithinTheCap) {
  const int fine = ZCORR_SLOW_TESTS ? 10 : 1;
  const std::vector<Gas> gases{{{C::methane, 1.0}}, iso_gases()[2].second, {{C::carbon_dioxide, 1.0}},
                               {{C::hydrogen, 1.0}}, {{C::ethane, 1.0}},   {{C::nitrogen, 1.0}}};
  SolveOptions o;
  o.allow_outside_range = true;
  int n_ok = 0, n_none = 0;
  for (const auto& g : gases) {
    const auto p = prepared(g);
    for (int iT = 0; iT <= 34 * fine; ++iT)
      for (int ip = 0; ip <= 45 * fine; ++ip) {
        const double T = 145.0 + 10.0 * iT / fine, P = std::pow(10.0, 4.0 + 0.1 * ip / fine);
        const auto r = ad::evaluate(p, T, P, o);
        ASSERT_TRUE(r.status.ok() || r.status.code == Code::no_gas_root) << code_name(r.status.code) << " T=" << T << " P=" << P;
        ASSERT_LE(r.iterations, o.max_iter);
        if (r.status.ok()) {
          ++n_ok;
          EXPECT_NEAR(r.Z * r.rho_mol_per_L * 8.31451 * T * 1000.0 / P, 1.0, 1e-12) << T << " " << P;
        } else {
          ++n_none;
        }
      }
  }
  EXPECT_GT(n_ok, 4 * n_none);
}

// Pure CO2 at 150 K and 12 MPa is far below its triple point (216.6 K,
// common practice): p(rho) of the equation has a loop there, and the root
// the Newton iteration reaches from the ideal-gas start lies beyond the first
// maximum. Regression: that root was once returned as a gas state (Z = 0.926, ok, range expanded).
TEST(DetailSolve, RootBeyondTheFirstMaximumIsNotAGasRoot) {
  const auto p = prepared({{C::carbon_dioxide, 1.0}});
  const auto r = ad::evaluate(p, 150.0, 12.0e6);
  EXPECT_EQ(r.status.code, Code::no_gas_root);
}

TEST(DetailSolve, TruncatedVirialZIsCloseAtLowDensity) {
  const auto p = prepared(iso_gases()[0].second);
  const auto r = ad::evaluate(p, 300.0, 1.0e5);
  EXPECT_NEAR(r.Z_virial2, r.Z, 1e-8);
}

// ---------------------------------------------------------------------------
// Agreement with GERG-2008.
// Source: GERG-2008 reference states, teqp strict model, shared data set
// gerg2008-reference (tests/data/gerg2008/states.csv). Window:
// pipeline-quality states, x_H2 <= 0.10, 265 K <= T <= 335 K, p <= 12 MPa.
// Limits: median |dZ/Z| <= 0.02 %, max <= 0.4 % (the two equations part most
// near the hydrocarbon dew point at low T and high p).
TEST(DetailVsGerg2008, PipelineQualityStates) {
  const auto path = std::filesystem::path(ZCORR_SOURCE_DIR) / "tests/data/gerg2008/states.csv";
  std::ifstream in(path);
  ASSERT_TRUE(in) << path;
  io::CsvReader reader(in);
  std::vector<std::string> head, row;
  ASSERT_TRUE(reader.next(head));
  auto col = [&](const std::string& n) {
    const auto it = std::find(head.begin(), head.end(), n);
    EXPECT_NE(it, head.end()) << n;
    return static_cast<std::size_t>(it - head.begin());
  };
  const std::size_t cT = col("T_K"), cP = col("P_kPa"), cZ = col("Z"), cB = col("B_cm3_per_mol"), cId = col("case_id");
  std::array<std::size_t, max_components> cx{};
  for (std::size_t i = 0; i < max_components; ++i) cx[i] = col(std::string(component_name(i)));
  struct Dev { double d, dB; std::string id; };
  std::vector<Dev> devs;
  std::size_t n_all = 0;
  while (reader.next(row)) {
    ++n_all;
    Fractions<double> x{};
    for (std::size_t i = 0; i < max_components; ++i) x[i] = std::stod(row[cx[i]]);
    const double T = std::stod(row[cT]), P = std::stod(row[cP]) * 1000.0;
    if (x[index(C::hydrogen)] > 0.10 || T < 265.0 || T > 335.0 || P > 12.0e6) continue;
    ad::Prepared<double> p;
    ASSERT_TRUE(ad::prepare(x, p).ok()) << row[cId];
    const auto r = ad::evaluate(p, T, P);
    ASSERT_TRUE(r.status.ok()) << row[cId] << " " << code_name(r.status.code);
    devs.push_back({rel(r.Z, std::stod(row[cZ])), r.B_cm3_per_mol - std::stod(row[cB]), row[cId]});
  }
  ASSERT_GE(devs.size(), 150u);
  std::vector<double> a;
  for (const auto& d : devs) a.push_back(std::abs(d.d));
  std::sort(a.begin(), a.end());
  const double median = a.size() % 2 ? a[a.size() / 2] : 0.5 * (a[a.size() / 2 - 1] + a[a.size() / 2]);
  const double maxdev = a.back();
  std::sort(devs.begin(), devs.end(), [](const Dev& l, const Dev& r) { return std::abs(l.d) > std::abs(r.d); });
  double maxB = 0;
  for (const auto& d : devs) maxB = std::max(maxB, std::abs(d.dB));
  std::printf("detail vs GERG-2008 reference: %zu of %zu states in window; median |dZ/Z| = %.4f %%, max = %.4f %%, max |dB| = %.3f cm3/mol\n",
              devs.size(), n_all, 100 * median, 100 * maxdev, maxB);
  std::printf("largest deviations (Z_detail - Z_GERG)/Z_GERG:\n");
  for (std::size_t k = 0; k < std::min<std::size_t>(12, devs.size()); ++k)
    std::printf("  %-24s %+8.4f %%   dB = %+7.3f cm3/mol\n", devs[k].id.c_str(), 100 * devs[k].d, devs[k].dB);
  EXPECT_LE(median, 2e-4);
  EXPECT_LE(maxdev, 4e-3);
  // Mixing-rule B against GERG-2008 B (the data set reports <= 0.6 cm3/mol in this window).
  EXPECT_LE(maxB, 1.0);
}

// ---------------------------------------------------------------------------
// double against 50-digit arithmetic: the same template, the same decimal
// table values; relative difference in Z <= 1e-12.
TEST(DetailPrecision, DoubleAgreesWithCppBinFloat50) {
  using mp = boost::multiprecision::cpp_bin_float_50;
  SolveOptions mopt;
  mopt.rel_tol = 1e-40;
  mopt.max_iter = 80;
  for (const auto& [name, gas] : iso_gases()) {
    const auto pd = prepared<double>(gas);
    const auto pm = prepared<mp>(gas);
    for (double T : {270.0, 330.0})
      for (double P : {1e5, 6e6, 12e6}) {
        const auto rd = ad::evaluate(pd, T, P);
        const auto rm = ad::evaluate(pm, mp(T), mp(P), mopt);
        ASSERT_TRUE(rd.status.ok() && rm.status.ok()) << name;
        const double zm = static_cast<double>(rm.Z);
        EXPECT_NEAR(rel(rd.Z, zm), 0.0, 1e-12) << name << " " << T << " " << P;
        EXPECT_NEAR(rel(rd.B_cm3_per_mol, static_cast<double>(rm.B_cm3_per_mol)), 0.0, 1e-12) << name;
        // the 50-digit solve reproduces the pressure far beyond double precision
        const mp back = rm.Z * rm.rho_mol_per_L * ad::gas_constant<mp>() * mp(T) * mp(1000) / mp(P) - mp(1);
        EXPECT_LT(std::abs(static_cast<double>(back)), 1e-35) << name;
      }
  }
}

// ---------------------------------------------------------------------------
// Bad input: a status, never a crash or a hang.
TEST(DetailBadInput, StatusesForBadStates) {
  const auto p = prepared(iso_gases()[0].second);
  const double nan = std::numeric_limits<double>::quiet_NaN(), inf = std::numeric_limits<double>::infinity();
  EXPECT_EQ(ad::evaluate(p, nan, 1e6).status.code, Code::invalid_temperature);
  EXPECT_EQ(ad::evaluate(p, 0.0, 1e6).status.code, Code::invalid_temperature);
  EXPECT_EQ(ad::evaluate(p, -10.0, 1e6).status.code, Code::invalid_temperature);
  EXPECT_EQ(ad::evaluate(p, inf, 1e6).status.code, Code::invalid_temperature);
  EXPECT_EQ(ad::evaluate(p, 300.0, nan).status.code, Code::invalid_pressure);
  EXPECT_EQ(ad::evaluate(p, 300.0, -1.0).status.code, Code::invalid_pressure);
  EXPECT_EQ(ad::evaluate(p, 300.0, inf).status.code, Code::invalid_pressure);
}

TEST(DetailBadInput, StatusesForBadCompositions) {
  ad::Prepared<double> p;
  Fractions<double> x{};
  EXPECT_EQ(ad::prepare(x, p).code, Code::invalid_composition);  // empty
  EXPECT_FALSE(p.ready);
  EXPECT_EQ(ad::evaluate(p, 300.0, 1e6).status.code, Code::invalid_composition);  // not prepared: refused
  x[0] = 0.5;
  EXPECT_EQ(ad::prepare(x, p).code, Code::invalid_composition);  // sum 0.5
  x[0] = 1.1;
  x[1] = -0.1;
  const Status neg = ad::prepare(x, p);
  EXPECT_EQ(neg.code, Code::invalid_composition);
  EXPECT_EQ(neg.component, index(C::nitrogen));
  x[1] = std::numeric_limits<double>::quiet_NaN();
  EXPECT_EQ(ad::prepare(x, p).code, Code::invalid_composition);
  ad::Prepared<double> fresh;
  EXPECT_EQ(ad::evaluate(fresh, 300.0, 1e6).status.code, Code::invalid_composition);
}

TEST(DetailBadInput, SmallSumDeviationIsNormalisedAndFlagged) {
  const auto a = prepared(iso_gases()[0].second);
  ad::Prepared<double> b;
  const Status s = ad::prepare(fractions(iso_gases()[0].second, 1.00005), b);
  ASSERT_TRUE(s.ok());
  EXPECT_TRUE(s.has(flag::sum_not_unity));
  EXPECT_NEAR(ad::evaluate(a, 300.0, 6e6).Z, ad::evaluate(b, 300.0, 6e6).Z, 1e-14);
}

TEST(DetailBadInput, IterationCapGivesItsStatus) {
  const auto p = prepared(iso_gases()[2].second);
  SolveOptions o;
  o.max_iter = 1;
  const auto r = ad::evaluate(p, 270.0, 12e6, o);
  EXPECT_EQ(r.status.code, Code::no_convergence);
  EXPECT_TRUE(r.status.has(flag::iteration_cap));
  EXPECT_EQ(r.iterations, 1);
  EXPECT_GT(r.rho_mol_per_L, 0.0);  // the last iterate is returned
  o.max_iter = 0;                   // nonsense limit: still one bounded step, then the status
  EXPECT_EQ(ad::evaluate(p, 270.0, 12e6, o).status.code, Code::no_convergence);
}

// A state where the gas branch cannot reach the pressure: pure n-butane at
// 300 K and 5 MPa (far above its vapour pressure of about 0.26 MPa, common
// practice). Outside the expanded composition range, so it must be allowed
// explicitly; then no gas root is reported (never a liquid root), without a hang.
TEST(DetailBadInput, NoGasRootIsAStatus) {
  const auto p = prepared({{C::n_butane, 1.0}});
  EXPECT_EQ(p.status.range, RangeClass::outside);
  EXPECT_EQ(ad::evaluate(p, 300.0, 5e6).status.code, Code::out_of_range);
  SolveOptions o;
  o.allow_outside_range = true;
  const auto r = ad::evaluate(p, 300.0, 5e6, o);
  EXPECT_TRUE(r.status.code == Code::no_gas_root || r.status.code == Code::no_convergence) << code_name(r.status.code);
  EXPECT_LE(r.iterations, o.max_iter);
}

// ---------------------------------------------------------------------------
// Range classification (limits: see methods/detail.hpp; from memory as marked there).
TEST(DetailRange, StateAndCompositionClasses) {
  const auto p = prepared(iso_gases()[0].second);
  EXPECT_EQ(ad::evaluate(p, 300.0, 6e6).status.range, RangeClass::normal);
  EXPECT_EQ(ad::evaluate(p, 250.0, 6e6).status.range, RangeClass::expanded);
  EXPECT_EQ(ad::evaluate(p, 300.0, 20e6).status.range, RangeClass::expanded);
  const auto out = ad::evaluate(p, 100.0, 6e6);
  EXPECT_EQ(out.status.code, Code::out_of_range);
  EXPECT_EQ(out.status.range, RangeClass::outside);
  SolveOptions o;
  o.allow_outside_range = true;
  const auto ext = ad::evaluate(p, 600.0, 6e6, o);
  EXPECT_TRUE(ext.status.ok());
  EXPECT_TRUE(ext.status.has(flag::extrapolated));
  EXPECT_EQ(ext.status.range, RangeClass::outside);
  EXPECT_EQ(ad::evaluate(p, 300.0, 300e6).status.code, Code::out_of_range);
}

TEST(DetailRange, ComponentClassNamesTheComponent) {
  // 5 % CO: outside the 0-3 % of both ranges.
  ad::Prepared<double> p;
  ASSERT_TRUE(ad::prepare(fractions({{C::methane, 0.95}, {C::carbon_monoxide, 0.05}}), p).ok());
  EXPECT_EQ(p.status.range, RangeClass::outside);
  EXPECT_EQ(p.status.component, index(C::carbon_monoxide));
  const auto r = ad::evaluate(p, 300.0, 1e6);
  EXPECT_EQ(r.status.code, Code::out_of_range);
  EXPECT_EQ(r.status.component, index(C::carbon_monoxide));
  // Argon: not in the normal range at all.
  ASSERT_TRUE(ad::prepare(fractions({{C::methane, 0.999}, {C::argon, 0.001}}), p).ok());
  EXPECT_EQ(p.status.range, RangeClass::expanded);
  EXPECT_EQ(p.status.component, index(C::argon));
  // Butanes as a group: 1 % + 1 % = 2 % > 1.5 %.
  ASSERT_TRUE(ad::prepare(fractions({{C::methane, 0.98}, {C::n_butane, 0.011}, {C::isobutane, 0.009}}), p).ok());
  EXPECT_EQ(p.status.range, RangeClass::expanded);
  EXPECT_EQ(p.status.component, index(C::n_butane));
  // Hexanes and heavier beyond 0.1 %: expanded "to the dew point", flagged.
  ASSERT_TRUE(ad::prepare(fractions({{C::methane, 0.995}, {C::n_hexane, 0.005}}), p).ok());
  EXPECT_EQ(p.status.range, RangeClass::expanded);
  EXPECT_TRUE(p.status.has(flag::dew_point_suspected));
  // Water above the threshold of unconfirmed table values: doubtful_data.
  ASSERT_TRUE(ad::prepare(fractions({{C::methane, 0.995}, {C::water, 0.005}}), p).ok());
  EXPECT_TRUE(p.status.has(flag::doubtful_data));
}

// ---------------------------------------------------------------------------
// The LineMethod adapter (what zcorr z uses).
TEST(DetailAdapter, RegistryProvidesTheMethod) {
  auto m = make_line_method(MethodId::detail);
  ASSERT_NE(m, nullptr);
  EXPECT_EQ(m->id(), MethodId::detail);
  ASSERT_TRUE(m->prepare(fractions(iso_gases()[0].second)).ok());
  EvalOptions opt;
  opt.derived = true;
  const auto out = m->state(270.0, 6.0e6, opt);
  ASSERT_TRUE(out.status.ok());
  const auto direct = ad::evaluate(prepared(iso_gases()[0].second), 270.0, 6.0e6);
  EXPECT_EQ(out[Quantity::Z], direct.Z);
  for (auto q : {Quantity::rho_mol_per_L, Quantity::rho_kg_per_m3, Quantity::M_g_per_mol, Quantity::B_cm3_per_mol,
                 Quantity::C_cm6_per_mol2, Quantity::Z_virial2, Quantity::dZdP_per_kPa, Quantity::dZdT_per_K})
    EXPECT_TRUE(out.has(q)) << quantity_names[static_cast<std::size_t>(q)];
  EXPECT_FALSE(out.has(Quantity::w_m_per_s));
  const auto bad = m->state(-1.0, 6.0e6, opt);
  EXPECT_EQ(bad.status.code, Code::invalid_temperature);
  EXPECT_FALSE(bad.has(Quantity::Z));
}
