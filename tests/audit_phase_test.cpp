// The phase of the line state in the recorder and the audit: a log whose line temperature
// goes near the hydrocarbon dew point and below it. The gas is G05 of the shared data set
// gerg2008-reference (composition as in tests/data/gerg2008/states.csv and
// tests/cli/data/phase_states.csv); its dew temperature at the line pressure is zcorr's own
// (gerg2008::phase::dew_temperature, checked against the stability test in
// gerg2008_phase_test.cpp), so the line temperatures below are placed relative to it. The
// sample rows are invented for the test.
#include <gtest/gtest.h>

#include <cmath>
#include <sstream>

#include "audit/audit.hpp"
#include "io/input_error.hpp"
#include "methods/gerg2008_phase.hpp"
#include "support/record_fixture.hpp"

namespace zcorr {
namespace {

using audit::AuditFinding;
using audit::Kind;

constexpr double p_line_Pa = 2.0e6;

const char* g05_columns =
    "methane,nitrogen,carbon_dioxide,ethane,propane,n_butane,isobutane,n_pentane,isopentane,n_hexane,n_heptane,n_octane,n_nonane,"
    "n_decane,oxygen,hydrogen_sulfide,helium";
const char* g05_values =
    "0.9250600,0.0215925,0.0084963,0.0376191,0.0024881,0.0001445,0.0001874,0.0005678,0.0012766,0.0003014,0.0001642,0.0000917,"
    "0.0000163,0.0000065,0.0000803,0.0001765,0.0017308";

Fractions<double> g05() {
  std::istringstream names(g05_columns), values(g05_values);
  Fractions<double> x{};
  std::string n, v;
  while (std::getline(names, n, ',') && std::getline(values, v, ',')) x[index(*find_component(n))] = std::stod(v);
  return x;
}

double dew_T_K() {
  gerg2008::Prepared<double> p;
  EXPECT_TRUE(gerg2008::phase::prepare_dry(g05(), p).ok());
  const auto d = gerg2008::phase::dew_temperature(p, p_line_Pa);
  EXPECT_EQ(d.outcome, gerg2008::phase::DewOutcome::found);
  return d.T_K;
}

record::PointConfig config(const std::string& point, const std::string& method, record::Integration integ) {
  record::PointConfig c = testing::test_config();
  c.point = point;
  c.method = method;
  c.integration = integ;
  c.T_min_K = 240.0;
  return c;
}

// Three hours of rows every 10 s at 2 MPa: hour 1 at T_dew + 12 K, hour 2 at T_dew + 2 K
// (near the dew point), hour 3 first half at T_dew - 4 K (two-phase), then T_dew + 12 K.
// `alternate`: in the two-phase half hour every other row at T_dew + 12 K (per_sample
// intervals partly two-phase).
std::string samples(std::int64_t t0, double T_dew, bool alternate) {
  std::ostringstream s;
  s << "time,p_kPa,T_degC,V_m3\n";
  s.precision(12);
  for (std::int64_t i = 1; i <= 3 * 360; ++i) {
    double T = T_dew + 12.0;
    if (i > 360 && i <= 720) T = T_dew + 2.0;
    if (i > 720 && i <= 900) T = T_dew - 4.0;
    if (alternate && i > 720 && (i % 2) == 0) T = T_dew + 12.0;
    s << (t0 + i * 10) << ',' << p_line_Pa / 1000.0 << ',' << (T - 273.15) << ',' << 0.9 << '\n';
  }
  return s.str();
}

std::string analyses(std::int64_t t0) { return std::string("valid_from,source,") + g05_columns + "\n" + std::to_string(t0) + ",G05," + g05_values + "\n"; }

class AuditPhaseTest : public ::testing::Test {
 protected:
  void SetUp() override {
    t0 = *record::parse_time_utc("2026-03-02T06:00:00Z");
    T_dew = dew_T_K();
    file = testing::temp_log(::testing::UnitTest::GetInstance()->current_test_info()->name());
    record::Log log(file, {record::OpenMode::writer});
    auto gerg = make_line_method(MethodId::gerg2008);
    auto detail = make_line_method(MethodId::detail);
    testing::record_text(log, config("GERG-1", "gerg2008", record::Integration::average_then_correct), *gerg, samples(t0, T_dew, false),
                         analyses(t0));
    testing::record_text(log, config("DET-1", "detail", record::Integration::per_sample), *detail, samples(t0, T_dew, true),
                         analyses(t0));
  }
  audit::AuditResult audit(const audit::AuditOptions& o = {}) {
    record::Log log(file, {record::OpenMode::read_only});
    return audit::run_audit(log, o, audit::built_in_methods());
  }
  std::int64_t q(const std::string& sql) {
    record::Log log(file, {record::OpenMode::read_only});
    return testing::scalar(log.db(), sql);
  }
  static std::vector<AuditFinding> of(const audit::AuditResult& r, Kind k, const std::string& point) {
    std::vector<AuditFinding> v;
    for (const auto& f : r.findings)
      if (f.kind == k && f.point == point) v.push_back(f);
    return v;
  }
  std::int64_t t0 = 0;
  double T_dew = 0;
  std::filesystem::path file;
};

TEST_F(AuditPhaseTest, RecorderFlagsTwoPhaseAsAnAlarmAndNearDewStates) {
  const std::string two = std::to_string(record::iflag::two_phase), near = std::to_string(record::iflag::near_dew_point);
  // average_then_correct: the 30 two-phase intervals convert nothing, their volume is fault volume.
  EXPECT_EQ(q("SELECT count(*) FROM interval WHERE point = 'GERG-1' AND flags & " + two), 30);
  EXPECT_EQ(q("SELECT count(*) FROM interval WHERE point = 'GERG-1' AND flags & " + two + " AND V_b_um3 = 0 AND V_fault_um3 = V_f_um3 "
              "AND flags & 1 AND calc_status = 'two_phase'"), 30);
  EXPECT_EQ(q("SELECT count(*) FROM interval WHERE point = 'GERG-1' AND flags & " + near), 60);
  EXPECT_EQ(q("SELECT count(*) FROM interval WHERE point = 'GERG-1' AND flags & " + near + " AND V_b_um3 > 0 AND NOT flags & 1"), 60);
  // per_sample with the other method: every other sample two-phase, half the volume converted.
  EXPECT_EQ(q("SELECT count(*) FROM interval WHERE point = 'DET-1' AND flags & " + two + " AND V_b_um3 > 0 AND V_fault_um3 > 0"), 30);
  // one two_phase event when it begins, one single_phase when it ends, per point
  EXPECT_EQ(q("SELECT count(*) FROM event WHERE kind = 'two_phase' AND severity = 'alarm'"), 2);
  EXPECT_EQ(q("SELECT count(*) FROM event WHERE kind = 'single_phase'"), 2);
}

TEST_F(AuditPhaseTest, AuditListsTwoPhaseAndNearDewIntervalsWithTheVolumeAtStake) {
  const auto r = audit();
  EXPECT_EQ(r.dew_margin_K, 5.0);
  EXPECT_EQ(r.dew_margin_source, "point configuration (5 K where it states none)");
  for (const auto& f : r.findings) EXPECT_NE(f.kind, Kind::calc_difference) << f.detail;  // the replay reproduces the log
  EXPECT_GT(r.counting(), 0u);

  const auto near = of(r, Kind::near_dew_point, "GERG-1");
  ASSERT_EQ(near.size(), 1u);
  EXPECT_EQ(near[0].severity, audit::Severity::warning);
  EXPECT_EQ(near[0].intervals, 60);
  EXPECT_EQ(near[0].from_utc_s, t0 + 3600);
  EXPECT_GT(near[0].V_b_affected_m3, 0.0);
  EXPECT_GT(near[0].E_affected_MJ, 0.0);
  EXPECT_NEAR(near[0].V_b_affected_m3, static_cast<double>(q("SELECT sum(V_b_um3) FROM interval WHERE point = 'GERG-1' AND start_utc_s >= " +
                                                              std::to_string(t0 + 3600) + " AND end_utc_s <= " + std::to_string(t0 + 7200))) * 1e-6,
              1e-6);

  const auto two = of(r, Kind::two_phase, "GERG-1");
  ASSERT_EQ(two.size(), 1u);
  EXPECT_EQ(two[0].severity, audit::Severity::critical);
  EXPECT_EQ(two[0].intervals, 30);
  EXPECT_EQ(two[0].V_b_affected_m3, 0.0);  // nothing converted
  EXPECT_NEAR(two[0].V_fault_m3, 30 * 6 * 0.9, 1e-6);
  EXPECT_TRUE(two[0].difference_estimated);
  EXPECT_GT(two[0].V_b_difference_m3, 30 * 6 * 0.9);  // the substitution: C > 1 at 2 MPa
  EXPECT_GT(two[0].E_difference_MJ, 0.0);

  // the other method, per_sample: converted half of the volume while partly two-phase
  const auto two_d = of(r, Kind::two_phase, "DET-1");
  ASSERT_EQ(two_d.size(), 1u);
  EXPECT_EQ(two_d[0].intervals, 30);
  EXPECT_GT(two_d[0].V_b_affected_m3, 0.0);
  EXPECT_GT(two_d[0].E_affected_MJ, 0.0);
  EXPECT_NEAR(two_d[0].V_fault_m3, 30 * 3 * 0.9, 1e-6);
  EXPECT_EQ(of(r, Kind::near_dew_point, "DET-1").size(), 1u);  // hour 2

  // the alarm finding names the cause
  bool alarm_named = false;
  for (const auto& f : of(r, Kind::alarm, "GERG-1")) alarm_named = alarm_named || f.detail.find("two-phase") != std::string::npos;
  EXPECT_TRUE(alarm_named);
}

TEST_F(AuditPhaseTest, TheMarginComesFromTheOptionOrTheContract) {
  audit::AuditOptions small;
  small.dew_margin_K = 1.0;  // hour 2 lies 2 K above the dew temperature
  auto r = audit(small);
  EXPECT_EQ(r.dew_margin_source, "option");
  EXPECT_TRUE(of(r, Kind::near_dew_point, "GERG-1").empty());
  EXPECT_EQ(of(r, Kind::two_phase, "GERG-1").size(), 1u);

  audit::AuditOptions wide;
  wide.contract = audit::parse_contract("dew_margin_K = 15\n", "contract.txt");
  ASSERT_TRUE(wide.contract->dew_margin_K);
  r = audit(wide);
  EXPECT_EQ(r.dew_margin_K, 15.0);
  EXPECT_EQ(r.dew_margin_source, "contract");
  std::int64_t near = 0;
  for (const auto& f : of(r, Kind::near_dew_point, "GERG-1")) near += f.intervals;
  EXPECT_EQ(near, 180 - 30);  // every single-phase interval lies within 15 K

  // the contract's margin for its point only
  wide.contract = audit::parse_contract("point = DET-1\ndew_margin_K = 15\n", "contract.txt");
  r = audit(wide);
  near = 0;
  for (const auto& f : of(r, Kind::near_dew_point, "GERG-1")) near += f.intervals;
  EXPECT_EQ(near, 60);

  audit::AuditOptions off;
  off.dew_margin_K = 0.0;
  EXPECT_TRUE(of(audit(off), Kind::near_dew_point, "GERG-1").empty());

  EXPECT_THROW((void)audit::parse_contract("dew_margin_K = 80\n", "c.txt"), io::InputError);
  EXPECT_THROW((void)audit::parse_contract("dew_margin_K = warm\n", "c.txt"), io::InputError);
  audit::AuditOptions bad;
  bad.dew_margin_K = -1.0;
  EXPECT_THROW((void)audit(bad), io::InputError);
}

TEST(AuditPhaseMargin, APointsOwnDewMarginGovernsTheRecorderAndTheAudit) {
  // The same three hours recorded at a point configured with dew_margin 1 K:
  // the hour 2 K above the dew point is not near it there, for the recorder
  // and for the audit (which reads the point's margin from its configuration).
  const std::int64_t t0 = *record::parse_time_utc("2026-03-02T06:00:00Z");
  const double T_dew = dew_T_K();
  const auto file = testing::temp_log("own_dew_margin");
  {
    record::Log log(file, {record::OpenMode::writer});
    auto gerg = make_line_method(MethodId::gerg2008);
    auto c = config("GERG-M", "gerg2008", record::Integration::average_then_correct);
    c.dew_margin_K = 1.0;
    testing::record_text(log, c, *gerg, samples(t0, T_dew, false), analyses(t0));
  }
  record::Log log(file, {record::OpenMode::read_only});
  EXPECT_EQ(testing::scalar(log.db(), "SELECT dew_margin_K FROM point_config"), 1);
  EXPECT_EQ(testing::scalar(log.db(), "SELECT count(*) FROM interval WHERE flags & " + std::to_string(record::iflag::near_dew_point)), 0);
  EXPECT_EQ(testing::scalar(log.db(), "SELECT count(*) FROM interval WHERE flags & " + std::to_string(record::iflag::two_phase)), 30);
  const auto r = audit::run_audit(log, {}, audit::built_in_methods());
  for (const auto& f : r.findings) {
    EXPECT_NE(f.kind, Kind::near_dew_point) << f.detail;
    EXPECT_NE(f.kind, Kind::calc_difference) << f.detail;
  }
  // Asked for 5 K, the audit finds the hour the point's margin let through.
  audit::AuditOptions o;
  o.dew_margin_K = 5.0;
  const auto r5 = audit::run_audit(log, o, audit::built_in_methods());
  bool near = false;
  for (const auto& f : r5.findings) near |= f.kind == Kind::near_dew_point;
  EXPECT_TRUE(near);
}

}  // namespace
}  // namespace zcorr
