// Replay and audit of interval logs. Each log is produced by the recording
// code with the invented test-double gas (support/virial_test_gas.hpp; the
// data are invented for the tests), then altered through the sqlite3 shell
// the way a tamperer would, and the audit must find the planted defect with
// its interval range and its figure.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "audit/audit.hpp"
#include "io/input_error.hpp"
#include "support/record_fixture.hpp"

namespace zcorr {
namespace {

using audit::AuditFinding;
using audit::Kind;

audit::MethodFactory test_methods() {
  return [](const std::string& name) -> std::unique_ptr<LineMethod> {
    if (name == "virial_test_gas") return std::make_unique<testing::VirialTestGas>();
    return nullptr;
  };
}

constexpr std::int64_t hours_of_data = 26;

class AuditTest : public ::testing::Test {
 protected:
  void SetUp() override {
    t0 = *record::parse_time_utc("2026-03-02T06:00:00Z");
    file = testing::temp_log(::testing::UnitTest::GetInstance()->current_test_info()->name());
    record::Log log(file, {record::OpenMode::writer});
    testing::VirialTestGas gas;
    testing::record_text(log, testing::test_config(), gas, testing::sample_csv(t0, 6 * 60 * hours_of_data),
                         testing::analysis_csv(t0));
  }
  audit::AuditResult audit(const audit::AuditOptions& o = {}) {
    record::Log log(file, {record::OpenMode::read_only});
    return audit::run_audit(log, o, test_methods());
  }
  std::int64_t q(const std::string& sql) {
    record::Log log(file, {record::OpenMode::read_only});
    return testing::scalar(log.db(), sql);
  }
  double qf(const std::string& sql) {
    record::Log log(file, {record::OpenMode::read_only});
    record::Stmt s(log.db(), sql);
    return s.step() ? s.f64(0) : std::nan("");
  }
  void shell(const std::string& sql) { ASSERT_EQ(testing::run_shell(file, sql), 0) << sql; }
  std::int64_t interval_seq(int offset) {
    return q("SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET " + std::to_string(offset));
  }
  static std::vector<AuditFinding> of_kind(const audit::AuditResult& r, Kind k) {
    std::vector<AuditFinding> v;
    for (const auto& f : r.findings)
      if (f.kind == k) v.push_back(f);
    return v;
  }
  std::int64_t t0 = 0;
  std::filesystem::path file;
};

TEST_F(AuditTest, CleanLogHasNoFindingsAndReplaysExactly) {
  const auto r = audit();
  for (const auto& f : r.findings) ADD_FAILURE() << audit::kind_name(f.kind) << ": " << f.detail;
  EXPECT_TRUE(r.findings.empty());
  EXPECT_EQ(r.replay.intervals, hours_of_data * 60);
  EXPECT_EQ(r.replay.replayed, r.replay.intervals);
  EXPECT_EQ(r.replay.over_bar, 0);
  // Same engine, same inputs: the replay reproduces the registers exactly.
  EXPECT_EQ(r.replay.V_b_um3_logged, r.replay.V_b_um3_replayed);
  EXPECT_EQ(r.replay.E_J_logged, r.replay.E_J_replayed);
  EXPECT_EQ(r.replay.V_b_um3_logged, q("SELECT sum(V_b_um3) FROM interval"));
  EXPECT_LT(r.replay.max_dZ_f_ppm, 1e-6);
  EXPECT_LT(r.replay.max_dV_b_ppm, 1e-6);
  EXPECT_GT(r.replay.V_b_um3_logged, 0);
}

TEST_F(AuditTest, ReplayOfAPointAndATimeRange) {
  record::Log log(file, {record::OpenMode::read_only});
  audit::Replayer rp(log, test_methods());
  audit::Selection sel;
  sel.point = "TEST-1";
  sel.from_utc_s = t0 + 3600;
  sel.to_utc_s = t0 + 7200;
  std::int64_t n = 0, vb = 0;
  rp.run(sel, [&](const audit::LoggedInterval& iv, const audit::IntervalReplay& r) {
    ++n;
    vb += iv.V_b_um3;
    EXPECT_TRUE(r.replayed);
    EXPECT_GE(iv.start_utc_s, t0 + 3600);
    EXPECT_LT(iv.start_utc_s, t0 + 7200);
    EXPECT_NEAR(r.Z_f, iv.Z_f, 1e-15);
    EXPECT_EQ(r.V_b_um3, iv.V_b_um3);
  });
  EXPECT_EQ(n, 60);
  EXPECT_EQ(vb, q("SELECT sum(V_b_um3) FROM interval WHERE start_utc_s >= " + std::to_string(t0 + 3600) +
                  " AND start_utc_s < " + std::to_string(t0 + 7200)));
  sel.point = "OTHER";
  n = 0;
  rp.run(sel, [&](const audit::LoggedInterval&, const audit::IntervalReplay&) { ++n; });
  EXPECT_EQ(n, 0);
}

TEST_F(AuditTest, ChangedBaseVolumeIsABrokenChainAndACalculationDifference) {
  const std::int64_t seq = interval_seq(500);
  const std::int64_t start = q("SELECT start_utc_s FROM interval WHERE seq = " + std::to_string(seq));
  shell("DROP TRIGGER interval_no_update; UPDATE interval SET V_b_m3 = V_b_m3 + 0.5 WHERE seq = " + std::to_string(seq));
  const auto r = audit();
  const auto chain = of_kind(r, Kind::broken_chain);
  ASSERT_EQ(chain.size(), 1u);
  EXPECT_EQ(chain[0].first_seq, seq);
  EXPECT_EQ(chain[0].from_utc_s, start);
  EXPECT_EQ(chain[0].to_utc_s, start + 60);
  const auto calc = of_kind(r, Kind::calc_difference);
  ASSERT_EQ(calc.size(), 1u);
  EXPECT_EQ(calc[0].first_seq, seq);
  EXPECT_EQ(calc[0].intervals, 1);
  EXPECT_NEAR(calc[0].V_b_difference_m3, -0.5, 1e-9);  // recomputed - logged
  EXPECT_TRUE(calc[0].difference_estimated);        // per_sample: from the averages
  EXPECT_EQ(r.replay.over_bar, 1);
  // The register was left alone, so it no longer matches its quantity.
  EXPECT_EQ(of_kind(r, Kind::totals_mismatch).size(), 1u);
}

TEST_F(AuditTest, ZfChangedBeyondTheBarIsFoundAndWithinTheBarIsNot) {
  const std::int64_t a = interval_seq(200), b = interval_seq(201), c = interval_seq(900);
  shell("DROP TRIGGER interval_no_update; UPDATE interval SET Z_f = Z_f * 1.0001 WHERE seq IN (" + std::to_string(a) + "," +
        std::to_string(b) + "); UPDATE interval SET Z_f = Z_f * 1.00001 WHERE seq = " + std::to_string(c));
  const auto r = audit();
  const auto calc = of_kind(r, Kind::calc_difference);
  ASSERT_EQ(calc.size(), 1u);  // the two neighbours form one finding; the 10 ppm change is inside the bar
  EXPECT_EQ(calc[0].first_seq, a);
  EXPECT_EQ(calc[0].last_seq, b);
  EXPECT_EQ(calc[0].intervals, 2);
  EXPECT_NEAR(std::fabs(calc[0].worst_ppm), 1e6 * (1 - 1 / 1.0001), 0.01);  // (re - logged) / logged
  // Only the logged Z_f was altered (its Fz, I and V_b still agree with each
  // other): the volume follows from I, so no volume difference.
  EXPECT_NEAR(calc[0].V_b_difference_m3, 0.0, 1e-9);
  EXPECT_GT(calc[0].V_b_affected_m3, 0.0);
  EXPECT_EQ(r.replay.over_bar, 2);
  EXPECT_NEAR(r.replay.max_dZ_f_ppm, 1e6 * (1 - 1 / 1.0001), 0.01);
  // A tighter tolerance finds the third one too.
  audit::AuditOptions o;
  o.tolerance_ppm = 5;
  EXPECT_EQ(of_kind(audit(o), Kind::calc_difference).size(), 2u);
}

TEST_F(AuditTest, RemovedIntervalsAreAGapWithAnEstimate) {
  const std::int64_t first = interval_seq(100);
  const std::int64_t before = interval_seq(99);
  const std::int64_t start = q("SELECT start_utc_s FROM interval WHERE seq = " + std::to_string(first));
  const double rate = qf("SELECT V_b_um3 * 1e-6 / 60.0 FROM interval WHERE seq = " + std::to_string(before));
  const double rate_after = qf("SELECT V_b_um3 * 1e-6 / 60.0 FROM interval WHERE seq = " + std::to_string(interval_seq(105)));
  shell("DROP TRIGGER interval_no_delete; DELETE FROM interval WHERE start_utc_s >= " + std::to_string(start) +
        " AND start_utc_s < " + std::to_string(start + 300));
  const auto r = audit();
  const auto gaps = of_kind(r, Kind::gap);
  ASSERT_EQ(gaps.size(), 1u);
  EXPECT_EQ(gaps[0].from_utc_s, start);
  EXPECT_EQ(gaps[0].to_utc_s, start + 300);
  EXPECT_EQ(gaps[0].first_seq, before);
  EXPECT_EQ(gaps[0].V_b_affected_m3, 0.0);  // no record concerned
  EXPECT_NEAR(gaps[0].V_b_difference_m3, 0.5 * (rate + rate_after) * 300, 1e-6);  // the flow on either side
  EXPECT_TRUE(gaps[0].difference_estimated);
  EXPECT_GT(gaps[0].E_difference_MJ, 0.0);
  EXPECT_FALSE(of_kind(r, Kind::broken_chain).empty());  // the chain shows the removal too
}

TEST_F(AuditTest, InsertedCopyIsADuplicateAndShiftedCopyAnOverlap) {
  const std::int64_t seq = interval_seq(300), seq2 = interval_seq(700);
  const std::int64_t start = q("SELECT start_utc_s FROM interval WHERE seq = " + std::to_string(seq));
  const std::int64_t start2 = q("SELECT start_utc_s FROM interval WHERE seq = " + std::to_string(seq2));
  const std::int64_t vb = q("SELECT V_b_um3 FROM interval WHERE seq = " + std::to_string(seq));
  const std::int64_t vb2 = q("SELECT V_b_um3 FROM interval WHERE seq = " + std::to_string(seq2));
  shell("CREATE TEMP TABLE c AS SELECT * FROM interval WHERE seq = " + std::to_string(seq) +
        "; UPDATE c SET seq = (SELECT max(seq) FROM interval) + 1; INSERT INTO interval SELECT * FROM c;"
        "CREATE TEMP TABLE d AS SELECT * FROM interval WHERE seq = " + std::to_string(seq2) +
        "; UPDATE d SET seq = (SELECT max(seq) FROM interval) + 1, start_utc_s = start_utc_s + 30, end_utc_s = end_utc_s + 30;"
        " INSERT INTO interval SELECT * FROM d;");
  const auto r = audit();
  const auto dup = of_kind(r, Kind::duplicate);
  ASSERT_EQ(dup.size(), 1u);
  EXPECT_EQ(dup[0].from_utc_s, start);
  EXPECT_EQ(dup[0].to_utc_s, start + 60);
  EXPECT_EQ(dup[0].first_seq, seq);
  EXPECT_NEAR(dup[0].V_b_affected_m3, static_cast<double>(vb) * 1e-6, 1e-9);
  EXPECT_NEAR(dup[0].V_b_difference_m3, -static_cast<double>(vb) * 1e-6, 1e-9);  // counted twice
  EXPECT_NEAR(dup[0].V_b_difference_ppm(), -1e6, 1e-3);
  const auto ov = of_kind(r, Kind::overlap);
  ASSERT_EQ(ov.size(), 2u);  // the copy overlaps the original, and the next interval overlaps the copy
  EXPECT_EQ(ov[0].from_utc_s, start2 + 30);
  EXPECT_EQ(ov[0].to_utc_s, start2 + 60);
  EXPECT_NEAR(ov[0].V_b_affected_m3, static_cast<double>(vb2) * 1e-6, 1e-9);
  EXPECT_NEAR(ov[0].V_b_difference_m3, -static_cast<double>(vb2) * 1e-6 * 0.5, 1e-9);
  EXPECT_EQ(ov[1].from_utc_s, start2 + 60);
  EXPECT_EQ(ov[1].to_utc_s, start2 + 90);
}

TEST_F(AuditTest, StaleAnalysisFromTheAllowedAge) {
  audit::AuditOptions o;
  o.max_analysis_age_h = 12;
  const auto r = audit(o);
  const auto st = of_kind(r, Kind::stale_analysis);
  ASSERT_EQ(st.size(), 1u);
  const std::int64_t last_end = q("SELECT max(end_utc_s) FROM interval");
  EXPECT_EQ(st[0].from_utc_s, t0 + 12 * 3600 + 60);  // the first interval starting more than 12 h after the analysis
  EXPECT_EQ(st[0].to_utc_s, last_end);
  EXPECT_EQ(st[0].intervals, (last_end - (t0 + 12 * 3600 + 60)) / 60);
  EXPECT_TRUE(std::isnan(st[0].V_b_difference_m3));  // not known without a current analysis
  EXPECT_FALSE(st[0].difference_basis.empty());
  EXPECT_NEAR(st[0].V_b_affected_m3,
              static_cast<double>(q("SELECT sum(V_b_um3) FROM interval WHERE start_utc_s > " + std::to_string(t0 + 12 * 3600))) * 1e-6,
              1e-6);
  EXPECT_EQ(r.findings.size(), 1u);
}

TEST_F(AuditTest, ContractBaseConditionsAndMethod) {
  audit::AuditOptions o;
  o.contract = audit::parse_contract("# contract of TEST-1\npoint = TEST-1\nbase_T = 15 degC\nbase_p = 101.56 kPa\n", "c.txt");
  auto r = audit(o);
  auto cm = of_kind(r, Kind::contract_mismatch);
  ASSERT_EQ(cm.size(), 1u);
  EXPECT_EQ(cm[0].from_utc_s, t0);
  EXPECT_EQ(cm[0].to_utc_s, q("SELECT max(end_utc_s) FROM interval"));
  const double total = static_cast<double>(q("SELECT sum(V_b_um3) FROM interval")) * 1e-6;
  EXPECT_NEAR(cm[0].V_b_affected_m3, total, 1e-6);
  // The difference is the log recomputed at the contract's base pressure:
  // the same as a what-if with it, and close to the ideal-gas ratio of the
  // base pressures (Z_b moves by far less).
  audit::AuditOptions w;
  w.what_if.base_p_Pa = 101560;
  const auto wi = audit(w);
  EXPECT_NEAR(cm[0].V_b_difference_m3, static_cast<double>(wi.what_if.V_b_um3_replayed - wi.what_if.V_b_um3_logged) * 1e-6, 1e-3);
  EXPECT_NEAR(cm[0].V_b_difference_ppm(), (101325.0 / 101560.0 - 1) * 1e6, 20.0);
  EXPECT_NEAR(cm[0].E_difference_MJ, 0.0, 1e-6 * cm[0].E_affected_MJ);  // Hs re-based: the energy does not depend on base_p
  EXPECT_NE(cm[0].detail.find("base_p 101325 Pa (contract 101560 Pa)"), std::string::npos) << cm[0].detail;
  EXPECT_EQ(cm[0].detail.find("base_T"), std::string::npos);

  o.contract = audit::parse_contract("method = gerg2008\nbase_T = 288.15 K\nbase_p = 101.325 kPa\n", "c.txt");
  cm = of_kind(audit(o), Kind::contract_mismatch);
  ASSERT_EQ(cm.size(), 1u);
  EXPECT_NE(cm[0].detail.find("method virial_test_gas (contract gerg2008)"), std::string::npos);

  o.contract = audit::parse_contract("base_T = 288.15 K\nbase_p = 101.325 kPa\n", "c.txt");
  EXPECT_TRUE(audit(o).findings.empty());
  o.contract = audit::parse_contract("point = OTHER\nbase_p = 1 bara\n", "c.txt");
  EXPECT_TRUE(audit(o).findings.empty());
  EXPECT_THROW((void)audit::parse_contract("base_q = 1\n", "c.txt"), io::InputError);
  EXPECT_THROW((void)audit::parse_contract("base_p = hot\n", "c.txt"), io::InputError);
}

TEST_F(AuditTest, StateOutsideTheMethodRange) {
  // The test-double gas refuses pressures above 1e9 Pa (out_of_range).
  const std::int64_t seq = interval_seq(400);
  const std::int64_t start = q("SELECT start_utc_s FROM interval WHERE seq = " + std::to_string(seq));
  const std::int64_t vb = q("SELECT V_b_um3 FROM interval WHERE seq = " + std::to_string(seq));
  shell("DROP TRIGGER interval_no_update; UPDATE interval SET p_avg_Pa = 2e9 WHERE seq = " + std::to_string(seq));
  const auto r = audit();
  const auto out = of_kind(r, Kind::outside_method_range);
  ASSERT_EQ(out.size(), 1u);
  EXPECT_EQ(out[0].from_utc_s, start);
  EXPECT_EQ(out[0].to_utc_s, start + 60);
  EXPECT_EQ(out[0].severity, audit::Severity::critical);
  EXPECT_NEAR(out[0].V_b_affected_m3, static_cast<double>(vb) * 1e-6, 1e-9);
  EXPECT_TRUE(std::isnan(out[0].V_b_difference_m3));
  EXPECT_EQ(of_kind(r, Kind::calc_difference).size(), 1u);  // nothing could be recomputed there
}

TEST_F(AuditTest, ConfigurationWithoutItsEvent) {
  const std::int64_t cfg = q("SELECT seq FROM point_config LIMIT 1");
  shell("DROP TRIGGER event_no_delete; DELETE FROM event WHERE kind = 'config_change' AND ref_seq = " + std::to_string(cfg));
  const auto r = audit();
  const auto ce = of_kind(r, Kind::config_without_event);
  ASSERT_EQ(ce.size(), 1u);
  EXPECT_EQ(ce[0].from_utc_s, t0);
  EXPECT_EQ(ce[0].to_utc_s, q("SELECT max(end_utc_s) FROM interval"));
  EXPECT_EQ(ce[0].intervals, hours_of_data * 60);
  EXPECT_NEAR(ce[0].V_b_affected_m3, static_cast<double>(q("SELECT sum(V_b_um3) FROM interval")) * 1e-6, 1e-6);
  EXPECT_TRUE(std::isnan(ce[0].V_b_difference_m3));
}

TEST_F(AuditTest, HourlyTotalThatDoesNotAddUp) {
  const std::int64_t seq = q("SELECT seq FROM qtr WHERE period = 'hour' ORDER BY seq LIMIT 1 OFFSET 3");
  const std::int64_t start = q("SELECT start_utc_s FROM qtr WHERE seq = " + std::to_string(seq));
  shell("DROP TRIGGER qtr_no_update; UPDATE qtr SET V_b_um3 = V_b_um3 - 2000000 WHERE seq = " + std::to_string(seq));
  const auto r = audit();
  const auto tm = of_kind(r, Kind::totals_mismatch);
  ASSERT_EQ(tm.size(), 1u);
  EXPECT_EQ(tm[0].first_seq, seq);
  EXPECT_EQ(tm[0].from_utc_s, start);
  EXPECT_EQ(tm[0].to_utc_s, start + 3600);
  EXPECT_NE(tm[0].detail.find("V_b_um3"), std::string::npos);
}

TEST_F(AuditTest, UnknownMethodIsNotReplayed) {
  record::Log log(file, {record::OpenMode::read_only});
  const auto r = audit::run_audit(log, {}, audit::built_in_methods());
  const auto nr = of_kind(r, Kind::not_replayed);
  ASSERT_EQ(nr.size(), 1u);
  EXPECT_EQ(nr[0].intervals, hours_of_data * 60);
  EXPECT_EQ(r.replay.not_replayed, hours_of_data * 60);
}

TEST(AuditFiles, CorruptAndForeignFilesAreRefused) {
  const auto garbage = testing::temp_log("audit_garbage");
  {
    std::ofstream f(garbage, std::ios::binary);
    f << std::string(4096, 'x');
  }
  EXPECT_THROW(record::Log(garbage, {record::OpenMode::read_only}), record::LogError);
  const auto foreign = testing::temp_log("audit_foreign");
  ASSERT_EQ(testing::run_shell(foreign, "CREATE TABLE customers (id INTEGER, name TEXT); INSERT INTO customers VALUES (1, 'x');"), 0);
  EXPECT_THROW(record::Log(foreign, {record::OpenMode::read_only}), record::LogError);
}

}  // namespace
}  // namespace zcorr

namespace zcorr {
namespace {

// Samples out of the configured pressure range stop the conversion for part
// of an interval (V_fault > 0); the replay of such intervals, with either
// integration, agrees with the log.
class AuditAlarmTest : public ::testing::TestWithParam<record::Integration> {};

TEST_P(AuditAlarmTest, IntervalsPartlyInAlarmReplayClean) {
  const std::int64_t t0 = *record::parse_time_utc("2026-03-02T06:00:00Z");
  const auto file = testing::temp_log(std::string("audit_alarm_") + std::string(record::integration_name(GetParam())));
  std::string csv = testing::sample_csv(t0, 6 * 60 * 3);
  // Rows 100 to 104 (one interval mostly, and the next partly): 9 MPa, above p_max = 8 MPa.
  std::istringstream in(csv);
  std::ostringstream out;
  std::string line;
  int n = 0;
  while (std::getline(in, line)) {
    if (n >= 100 && n <= 104) line = line.substr(0, line.find(',')) + ",9000" + line.substr(line.find(',', line.find(',') + 1));
    out << line << '\n';
    ++n;
  }
  auto cfg = testing::test_config();
  cfg.integration = GetParam();
  {
    record::Log log(file, {record::OpenMode::writer});
    testing::VirialTestGas gas;
    testing::record_text(log, cfg, gas, out.str(), testing::analysis_csv(t0));
  }
  record::Log log(file, {record::OpenMode::read_only});
  ASSERT_GT(testing::scalar(log.db(), "SELECT count(*) FROM interval WHERE V_fault_um3 > 0 AND V_b_um3 > 0"), 0);
  const auto r = audit::run_audit(log, {}, test_methods());
  // The only finding is the alarm, a notice: the configuration stopped the
  // converted register as designed. It carries the alarm's duration, its
  // fault volume and the base volume a substitution at the last converting
  // interval's factor would give.
  ASSERT_EQ(r.findings.size(), 1u);
  const auto& a = r.findings[0];
  EXPECT_EQ(a.kind, Kind::alarm) << a.detail;
  EXPECT_EQ(a.severity, audit::Severity::notice);
  EXPECT_EQ(r.counting(), 0u);
  const double fault = static_cast<double>(testing::scalar(log.db(), "SELECT sum(V_fault_um3) FROM interval")) * 1e-6;
  EXPECT_NEAR(a.V_fault_m3, fault, 1e-9);
  EXPECT_EQ(a.alarm_time_s, testing::scalar(log.db(), "SELECT sum(alarm_time_s) FROM interval"));
  EXPECT_EQ(a.alarm_time_s, 50);  // five 10-second rows
  record::Stmt c(log.db(), "SELECT C FROM interval WHERE V_fault_um3 = 0 AND V_b_um3 > 0 AND end_utc_s <= " + std::to_string(a.from_utc_s) +
                               " ORDER BY start_utc_s DESC LIMIT 1");
  ASSERT_TRUE(c.step());
  EXPECT_NEAR(a.V_b_difference_m3, fault * c.f64(0), 1e-9 * fault * c.f64(0));
  EXPECT_TRUE(a.difference_estimated);
  EXPECT_NEAR(a.E_difference_MJ, a.V_b_difference_m3 * 39.5, 1e-9 * a.E_difference_MJ);  // Hs of the analysis
  EXPECT_EQ(r.replay.V_b_um3_logged, r.replay.V_b_um3_replayed);
  EXPECT_EQ(r.replay.E_J_logged, r.replay.E_J_replayed);
}

INSTANTIATE_TEST_SUITE_P(BothIntegrations, AuditAlarmTest,
                         ::testing::Values(record::Integration::per_sample, record::Integration::average_then_correct));

}  // namespace
}  // namespace zcorr

namespace zcorr {
namespace {

// What-if with another base pressure: the integral value I does not depend
// on the base conditions, so each interval's base volume becomes
// I * T_b * Z_b(p_b') / p_b' (interval_calc.hpp), i.e. the logged one times
// (Z_b' / Z_b) (p_b / p_b'); Z_b from the test-double gas itself.
TEST(AuditWhatIf, AnotherBasePressureRescalesEveryInterval) {
  const std::int64_t t0 = *record::parse_time_utc("2026-03-02T06:00:00Z");
  const auto file = testing::temp_log("audit_what_if");
  {
    record::Log log(file, {record::OpenMode::writer});
    testing::VirialTestGas gas;
    testing::record_text(log, testing::test_config(), gas, testing::sample_csv(t0, 6 * 60 * 4), testing::analysis_csv(t0));
  }
  testing::VirialTestGas gas;
  Fractions<double> x{};
  x[index(Component::methane)] = 0.93;
  x[index(Component::ethane)] = 0.04;
  x[index(Component::nitrogen)] = 0.02;
  x[index(Component::carbon_dioxide)] = 0.01;
  ASSERT_TRUE(gas.prepare(x).ok());
  const double pb = 101325.0, pb2 = 101560.0, Tb = 288.15;
  const double Zb = gas.state(Tb, pb, {})[Quantity::Z], Zb2 = gas.state(Tb, pb2, {})[Quantity::Z];
  record::Log log(file, {record::OpenMode::read_only});
  record::Stmt s(log.db(), "SELECT total(V_b_m3) FROM interval");
  ASSERT_TRUE(s.step());
  const double expected = s.f64(0) * (Zb2 / Zb) * (pb / pb2);
  audit::AuditOptions o;
  o.what_if.base_p_Pa = pb2;
  const auto r = audit::run_audit(log, o, test_methods());
  EXPECT_TRUE(r.findings.empty());  // the audit itself compares with the log's own configuration
  ASSERT_TRUE(r.what_if_run);
  EXPECT_EQ(r.what_if.replayed, 4 * 60);
  EXPECT_EQ(r.what_if.V_b_um3_logged, r.replay.V_b_um3_logged);
  EXPECT_NEAR(static_cast<double>(r.what_if.V_b_um3_replayed) * 1e-6, expected, 4 * 60 * 1e-6);
  EXPECT_LT(r.what_if.V_b_um3_replayed, r.what_if.V_b_um3_logged);  // a higher base pressure, a smaller base volume
}

}  // namespace
}  // namespace zcorr
