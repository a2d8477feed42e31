// Interval processing: flow-dependent averaging, the integration choice,
// alarms and the fault register, register rounding. The gas is the invented
// test double (support/virial_test_gas.hpp); every expected value is
// computed here by hand from the formulas stated in record/interval_calc.hpp.
#include <gtest/gtest.h>

#include <cmath>
#include <vector>

#include "record/interval_calc.hpp"
#include "record/tables.hpp"
#include "support/record_fixture.hpp"

using namespace zcorr;
using namespace zcorr::record;

namespace {

struct Fixture {
  zcorr::testing::VirialTestGas gas;
  PointConfig cfg = zcorr::testing::test_config();
  GasInForce g;
  EvalOptions eval;
  Fixture() {
    Fractions<double> x{};
    x[0] = 1.0;
    gas.prepare(x);
    g.seq = 1;
    g.usable = true;
    g.Z_b = gas.state(cfg.base_T_K, cfg.base_p_Pa, eval)[Quantity::Z];
    g.Hs_MJ_per_m3 = 40.0;
    g.status = "ok";
  }
  double Z(double p, double T) const { return gas.state(T, p, eval)[Quantity::Z]; }
  double rho(double p, double T) const { return gas.state(T, p, eval)[Quantity::rho_kg_per_m3]; }
  IntervalResult run(const std::vector<Sample>& s) const { return compute_interval(s, cfg, gas, g, eval); }
};

Sample S(std::int64_t dt, double V, double p, double T, bool alarm = false) {
  Sample s;
  s.dt_s = dt;
  s.V_ind_m3 = V;
  s.p_Pa = p;
  s.T_K = T;
  s.alarm = alarm;
  return s;
}

}  // namespace

TEST(IntervalAveraging, TimeAndFlowWeightedLinearAndFormulaic) {
  Fixture f;
  const std::vector<Sample> s{S(20, 1.0, 4e6, 280.0), S(40, 3.0, 6e6, 290.0)};
  f.cfg.averaging = Averaging::time_linear;
  auto r = f.run(s);
  EXPECT_DOUBLE_EQ(r.p_avg_Pa, (20 * 4e6 + 40 * 6e6) / 60.0);
  EXPECT_DOUBLE_EQ(r.T_avg_K, (20 * 280.0 + 40 * 290.0) / 60.0);
  f.cfg.averaging = Averaging::flow_linear;
  r = f.run(s);
  EXPECT_DOUBLE_EQ(r.p_avg_Pa, (1 * 4e6 + 3 * 6e6) / 4.0);
  f.cfg.averaging = Averaging::flow_formulaic;
  r = f.run(s);
  const double m = (1 * std::sqrt(4e6) + 3 * std::sqrt(6e6)) / 4.0;
  EXPECT_NEAR(r.p_avg_Pa, m * m, 1e-6);
  f.cfg.averaging = Averaging::time_formulaic;
  r = f.run(s);
  const double mt = (20 * std::sqrt(280.0) + 40 * std::sqrt(290.0)) / 60.0;
  EXPECT_NEAR(r.T_avg_K, mt * mt, 1e-9);
}

TEST(IntervalAveraging, NoFlowSamplesAreExcluded) {
  Fixture f;
  f.cfg.averaging = Averaging::time_linear;
  auto r = f.run({S(30, 0.0, 2e6, 270.0), S(30, 1.0, 5e6, 285.0)});
  EXPECT_DOUBLE_EQ(r.p_avg_Pa, 5e6);
  EXPECT_DOUBLE_EQ(r.T_avg_K, 285.0);
  EXPECT_EQ(r.flow_time_s, 30);
  EXPECT_EQ(r.samples_used, 1);
  EXPECT_EQ(r.flags & iflag::no_flow, 0);
}

TEST(IntervalAveraging, WholeIntervalWithoutFlowKeepsATimeAverage) {
  Fixture f;
  auto r = f.run({S(30, 0.0, 2e6, 270.0), S(30, 0.0, 4e6, 290.0)});
  EXPECT_DOUBLE_EQ(r.p_avg_Pa, 3e6);
  EXPECT_DOUBLE_EQ(r.T_avg_K, 280.0);
  EXPECT_NE(r.flags & iflag::no_flow, 0);
  EXPECT_EQ(r.V_b_um3, 0);
  EXPECT_EQ(r.flow_time_s, 0);
}

TEST(IntervalIntegration, ConstantConditionsGiveTheSameVolumeBothWays) {
  Fixture f;
  const std::vector<Sample> s{S(30, 1.25, 5e6, 288.0), S(30, 0.75, 5e6, 288.0)};
  f.cfg.integration = Integration::per_sample;
  const auto a = f.run(s);
  f.cfg.integration = Integration::average_then_correct;
  const auto b = f.run(s);
  EXPECT_NEAR(a.V_b_m3, b.V_b_m3, 1e-12 * b.V_b_m3);
  const double C = (5e6 / f.cfg.base_p_Pa) * (f.cfg.base_T_K / 288.0) * (f.g.Z_b / f.Z(5e6, 288.0));
  EXPECT_NEAR(b.C, C, 1e-14 * C);
  EXPECT_NEAR(b.C, b.Fp * b.Ft * b.Fz, 1e-14 * C);
  EXPECT_NEAR(b.V_b_m3, 2.0 * C, 1e-12);
}

TEST(IntervalIntegration, PerSampleSumsCorrectedSamplesAverageThenCorrectUsesTheAverages) {
  Fixture f;
  f.cfg.averaging = Averaging::flow_linear;
  const std::vector<Sample> s{S(20, 1.0, 2e6, 275.0), S(20, 2.0, 7e6, 300.0), S(20, 1.5, 4e6, 285.0)};
  const double Tb = f.cfg.base_T_K, pb = f.cfg.base_p_Pa, Zb = f.g.Z_b;
  double per = 0, V = 0, wp = 0, wT = 0;
  for (const auto& x : s) {
    per += x.V_ind_m3 * x.p_Pa / (x.T_K * f.Z(x.p_Pa, x.T_K)) * Tb * Zb / pb;
    V += x.V_ind_m3;
    wp += x.V_ind_m3 * x.p_Pa;
    wT += x.V_ind_m3 * x.T_K;
  }
  const double pa = wp / V, Ta = wT / V;
  const double avg = V * pa / (Ta * f.Z(pa, Ta)) * Tb * Zb / pb;
  f.cfg.integration = Integration::per_sample;
  const auto a = f.run(s);
  f.cfg.integration = Integration::average_then_correct;
  const auto b = f.run(s);
  EXPECT_NEAR(a.V_b_m3, per, 1e-12 * per);
  EXPECT_NEAR(b.V_b_m3, avg, 1e-12 * avg);
  // The two differ (second order in the swing) and both report the same averages.
  EXPECT_GT(std::abs(a.V_b_m3 - b.V_b_m3), 1e-6 * per);
  EXPECT_DOUBLE_EQ(a.p_avg_Pa, b.p_avg_Pa);
  EXPECT_DOUBLE_EQ(a.Z_f, b.Z_f);
  // Mass: per sample sum of rho_i V_i, or rho at the averages times V.
  double mass = 0;
  for (const auto& x : s) mass += f.rho(x.p_Pa, x.T_K) * x.V_ind_m3;
  EXPECT_NEAR(a.mass_kg, mass, 1e-12 * mass);
  EXPECT_NEAR(b.mass_kg, f.rho(pa, Ta) * V, 1e-12 * mass);
  // The integral value rescales to the base volume in both modes.
  EXPECT_NEAR(a.I_m3_Pa_per_K * Tb * Zb / pb, a.V_b_m3, 1e-12 * per);
  EXPECT_NEAR(b.E_MJ, b.V_b_m3 * 40.0, 1e-12 * b.E_MJ);
}

TEST(IntervalAlarm, AlarmedSampleCountsInTheFaultRegisterOnly) {
  Fixture f;
  auto s = std::vector<Sample>{S(30, 1.0, 5e6, 288.0), S(30, 2.0, 9e6, 288.0, true)};
  const auto r = f.run(s);
  const auto ok = f.run({s[0]});
  EXPECT_EQ(r.V_f_um3, 3000000);
  EXPECT_EQ(r.V_fault_um3, 2000000);
  EXPECT_EQ(r.V_b_um3, ok.V_b_um3);
  EXPECT_EQ(r.alarm_time_s, 30);
  EXPECT_NE(r.flags & iflag::alarm, 0);
  EXPECT_DOUBLE_EQ(r.p_avg_Pa, 5e6);  // the alarmed reading is not averaged
}

TEST(IntervalAlarm, StateRefusedByTheMethodStopsConversion) {
  Fixture f;
  f.gas.refuse_above_Pa = 6e6;
  f.cfg.integration = Integration::per_sample;
  auto r = f.run({S(30, 1.0, 5e6, 288.0), S(30, 1.0, 7e6, 288.0)});
  EXPECT_NE(r.flags & iflag::calc_failed, 0);
  EXPECT_EQ(r.V_fault_um3, 1000000);
  EXPECT_EQ(r.calc_status, "out_of_range");
  f.cfg.integration = Integration::average_then_correct;
  r = f.run({S(30, 1.0, 5e6, 288.0), S(30, 1.0, 8e6, 288.0)});  // average 6.5 MPa refused
  EXPECT_NE(r.flags & iflag::calc_failed, 0);
  EXPECT_EQ(r.V_b_um3, 0);
  EXPECT_EQ(r.V_fault_um3, 2000000);
}

TEST(IntervalAlarm, NoUsableAnalysisConvertsNothing) {
  Fixture f;
  f.g = GasInForce{};
  auto r = f.run({S(60, 1.0, 5e6, 288.0)});
  EXPECT_EQ(r.V_b_um3, 0);
  EXPECT_EQ(r.V_fault_um3, 1000000);
  EXPECT_NE(r.flags & iflag::no_analysis, 0);
}

TEST(IntervalRegisters, RoundHalfAwayFromZeroOnce) {
  EXPECT_EQ(to_register(0.5, 1.0), 1);
  EXPECT_EQ(to_register(1.5, 1.0), 2);
  EXPECT_EQ(to_register(2.5, 1.0), 3);
  EXPECT_EQ(to_register(-0.5, 1.0), -1);
  EXPECT_EQ(to_register(std::nan(""), 1.0), 0);
  Fixture f;
  auto r = f.run({S(60, 1.2345678, 5e6, 288.0)});
  EXPECT_EQ(r.V_f_um3, 1234568);
  EXPECT_EQ(r.V_b_um3, std::llround(r.V_b_m3 * 1e6));
  EXPECT_EQ(r.E_J, std::llround(r.E_MJ * 1e6));
}
