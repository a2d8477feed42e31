// The audit's difference figures on planted logs. Each log is recorded by the
// recording code (the invented test-double gas of support/virial_test_gas.hpp,
// or the detail method where the gas must matter), then forged the way a
// careful tamperer would forge it (support/tamper.hpp: every dependent figure
// made consistent, the quantity records summed again, the chain re-hashed), so
// that the verifier finds nothing and the audit's recomputation must put the
// right signed volume on it. The data are invented for the tests.
#include <gtest/gtest.h>

#include <cmath>
#include <sstream>

#include "audit/audit.hpp"
#include "record/verify.hpp"
#include "support/record_fixture.hpp"
#include "support/tamper.hpp"

namespace zcorr {
namespace {

using audit::Kind;

audit::MethodFactory test_methods() {
  return [](const std::string& name) -> std::unique_ptr<LineMethod> {
    if (name == "virial_test_gas") return std::make_unique<testing::VirialTestGas>();
    return audit::built_in_methods()(name);
  };
}

std::vector<audit::AuditFinding> of_kind(const audit::AuditResult& r, Kind k) {
  std::vector<audit::AuditFinding> v;
  for (const auto& f : r.findings)
    if (f.kind == k) v.push_back(f);
  return v;
}

std::int64_t scalar(const std::filesystem::path& file, const std::string& sql) {
  record::Log log(file, {record::OpenMode::read_only});
  return testing::scalar(log.db(), sql);
}

audit::AuditResult audit_of(const std::filesystem::path& file, const audit::AuditOptions& o = {}) {
  record::Log log(file, {record::OpenMode::read_only});
  return audit::run_audit(log, o, test_methods());
}

record::VerifyResult verify_of(const std::filesystem::path& file) {
  record::Log log(file, {record::OpenMode::read_only});
  return record::verify_log(log);
}

const std::int64_t t0 = *record::parse_time_utc("2026-03-02T06:00:00Z");

std::filesystem::path recorded(const std::string& name, record::PointConfig cfg, LineMethod& m, std::int64_t rows,
                               const std::string& analyses, const std::string& samples = {}) {
  const auto file = testing::temp_log(name);
  record::Log log(file, {record::OpenMode::writer});
  testing::record_text(log, cfg, m, samples.empty() ? testing::sample_csv(t0, rows) : samples, analyses);
  return file;
}

// One hour of intervals with Z_f raised by 500 ppm and everything that
// follows from it made consistent (Fz, C, I, V_b, energy, mass, density,
// every register, the hourly and daily records and all later register
// readings), the chain re-hashed: verify is clean, and the audit's signed
// base-volume difference is within 1 % of the true shortfall (the volume the
// forgery removed). For per_sample intervals the difference is an estimate
// from the averages; for average_then_correct a recomputation.
class ConsistentForgery : public ::testing::TestWithParam<record::Integration> {};

TEST_P(ConsistentForgery, OneHourOfZfRaised500ppmShowsItsShortfall) {
  auto cfg = testing::test_config();
  cfg.integration = GetParam();
  testing::VirialTestGas gas;
  const auto file = recorded(std::string("forged_zf_") + std::string(record::integration_name(GetParam())), cfg, gas, 6 * 60 * 5,
                             testing::analysis_csv(t0));
  const std::int64_t from = t0 + 2 * 3600, to = t0 + 3 * 3600;
  const std::string hour = " WHERE start_utc_s >= " + std::to_string(from) + " AND start_utc_s < " + std::to_string(to);
  const std::int64_t V_before = scalar(file, "SELECT sum(V_b_um3) FROM interval" + hour);
  const std::int64_t E_before = scalar(file, "SELECT sum(E_J) FROM interval" + hour);
  const std::int64_t cum_before = scalar(file, "SELECT max(cum_V_b_um3) FROM qtr");
  testing::forge_consistent_Z_f(file, from, to, 1.0005);
  const double shortfall = static_cast<double>(V_before - scalar(file, "SELECT sum(V_b_um3) FROM interval" + hour)) * 1e-6;
  const double E_shortfall = static_cast<double>(E_before - scalar(file, "SELECT sum(E_J) FROM interval" + hour)) * 1e-6;
  ASSERT_GT(shortfall, 0.0);
  EXPECT_NEAR(shortfall / (static_cast<double>(V_before) * 1e-6), 1 - 1 / 1.0005, 1e-9);
  EXPECT_LT(scalar(file, "SELECT max(cum_V_b_um3) FROM qtr"), cum_before);  // later readings follow the forgery

  const auto v = verify_of(file);
  for (const auto& f : v.findings) ADD_FAILURE() << "the forgery should verify: " << f.kind << " " << f.table << " " << f.detail;

  const auto r = audit_of(file);
  const auto calc = of_kind(r, Kind::calc_difference);
  ASSERT_EQ(calc.size(), 1u);
  EXPECT_EQ(calc[0].from_utc_s, from);
  EXPECT_EQ(calc[0].to_utc_s, to);
  EXPECT_EQ(calc[0].intervals, 60);
  EXPECT_NEAR(calc[0].V_b_difference_m3, shortfall, 0.01 * shortfall);
  EXPECT_NEAR(calc[0].E_difference_MJ, E_shortfall, 0.01 * E_shortfall);
  EXPECT_NEAR(calc[0].V_b_difference_ppm(), 500.0, 5.0);
  EXPECT_NEAR(calc[0].V_b_affected_m3, static_cast<double>(V_before) * 1e-6 - shortfall, 1e-6);
  EXPECT_EQ(calc[0].difference_estimated, GetParam() == record::Integration::per_sample);
  EXPECT_EQ(calc[0].severity, audit::Severity::critical);
  EXPECT_EQ(r.counting(), r.findings.size());
}

INSTANTIATE_TEST_SUITE_P(BothIntegrations, ConsistentForgery,
                         ::testing::Values(record::Integration::per_sample, record::Integration::average_then_correct),
                         [](const auto& info) { return std::string(record::integration_name(info.param)); });

// A gas analysis whose composition was changed after the recording (1 % of
// methane made nitrogen, chain re-hashed): the difference is what a
// recording with the changed analysis gives minus the log, within 1 % (the
// detail method, so that the composition matters; the second log is
// computed sample by sample, the audit's estimate from the averages).
TEST(AuditDifference, ForgedAnalysisMatchesARecordingWithIt) {
  auto cfg = testing::test_config();
  cfg.method = "detail";
  auto m = make_line_method(MethodId::detail);
  const std::string a = testing::analysis_csv(t0);
  const std::string forged_csv =
      "valid_from,source,Hs_MJ_per_m3,methane,ethane,nitrogen,carbon_dioxide\n" + std::to_string(t0) + ",GC test,39.5,0.92,0.04,0.03,0.01\n";
  const auto file = recorded("forged_analysis", cfg, *m, 6 * 60 * 3, a);
  const auto truth = recorded("forged_analysis_truth", cfg, *m, 6 * 60 * 3, forged_csv);
  const double V_log = static_cast<double>(scalar(file, "SELECT sum(V_b_um3) FROM interval")) * 1e-6;
  const double V_true = static_cast<double>(scalar(truth, "SELECT sum(V_b_um3) FROM interval")) * 1e-6;
  const double true_difference = V_true - V_log;
  ASSERT_GT(std::fabs(true_difference), 1e-4 * V_log);  // the change matters at the 1e-4 level

  testing::forge_analysis(file, scalar(file, "SELECT seq FROM gas_analysis LIMIT 1"), 0.01);
  EXPECT_TRUE(verify_of(file).findings.empty());
  const auto r = audit_of(file);
  const auto calc = of_kind(r, Kind::calc_difference);
  ASSERT_EQ(calc.size(), 1u);
  EXPECT_EQ(calc[0].intervals, 180);
  EXPECT_NEAR(calc[0].V_b_difference_m3, true_difference, 0.01 * std::fabs(true_difference));
  EXPECT_TRUE(calc[0].difference_estimated);
  EXPECT_NE(calc[0].difference_basis.find("estimated from their averages"), std::string::npos);
}

// Samples missing for five minutes: the row after the hole carries the
// meter's volume for the missing time, so the gap's volume is in the log.
// One gap finding names that interval, with a difference of 0, and the
// recorder's event says the same times.
TEST(AuditDifference, RecorderGapIsCarriedByTheIntervalAfterIt) {
  std::istringstream in(testing::sample_csv(t0, 6 * 60 * 2));
  std::ostringstream out;
  std::string line;
  std::int64_t n = 0;
  while (std::getline(in, line)) {
    if (n < 1 || n <= 300 || n > 330) out << line << '\n';  // rows 301..330 (5 minutes of 10 s rows) are missing
    ++n;
  }
  testing::VirialTestGas gas;
  const auto file = recorded("gap_carried", testing::test_config(), gas, 0, testing::analysis_csv(t0), out.str());
  const auto r = audit_of(file);
  const auto gaps = of_kind(r, Kind::gap);
  ASSERT_EQ(gaps.size(), 1u);
  const auto& g = gaps[0];
  // Row 300 ends at t0 + 3000 s; the next row (331) at t0 + 3310 s closes the interval [t0 + 3300, t0 + 3360).
  EXPECT_EQ(g.from_utc_s, t0 + 3000);
  EXPECT_EQ(g.to_utc_s, t0 + 3300);
  EXPECT_EQ(g.V_b_difference_m3, 0.0);
  EXPECT_FALSE(g.difference_estimated);
  EXPECT_GT(g.V_b_affected_m3, 0.0);
  EXPECT_EQ(g.last_seq, scalar(file, "SELECT seq FROM interval WHERE start_utc_s = " + std::to_string(t0 + 3300)));
  record::Log log(file, {record::OpenMode::read_only});
  record::Stmt e(log.db(), "SELECT detail FROM event WHERE kind = 'gap'");
  ASSERT_TRUE(e.step());
  const std::string d = e.text(0);
  EXPECT_NE(d.find("no sample between 2026-03-02T06:50:00Z and 2026-03-02T06:55:10Z"), std::string::npos) << d;
  EXPECT_NE(d.find("covers 310 s"), std::string::npos) << d;
}

// An hourly record's base-volume total raised by 12.2 m3 (chain re-hashed):
// the finding's affected volume is the record's own total, its difference
// the sum of the intervals minus that total, -12.2 m3.
TEST(AuditDifference, QuantityRecordTotalHasItsOwnDifference) {
  testing::VirialTestGas gas;
  const auto file = recorded("qtr_total", testing::test_config(), gas, 6 * 60 * 3, testing::analysis_csv(t0));
  const std::int64_t seq = scalar(file, "SELECT seq FROM qtr WHERE period = 'hour' ORDER BY seq LIMIT 1 OFFSET 1");
  const std::int64_t total = scalar(file, "SELECT V_b_um3 FROM qtr WHERE seq = " + std::to_string(seq));
  {
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(file.string().c_str(), &db), SQLITE_OK);
    {
      const testing::TriggersAside aside(db);
      testing::exec_sql(db, "UPDATE qtr SET V_b_um3 = V_b_um3 + 12200000 WHERE seq = " + std::to_string(seq));
      testing::rehash_chain(db);
    }
    sqlite3_close(db);
  }
  const auto r = audit_of(file);
  const auto tm = of_kind(r, Kind::totals_mismatch);
  ASSERT_EQ(tm.size(), 1u);
  EXPECT_EQ(tm[0].first_seq, seq);
  EXPECT_NEAR(tm[0].V_b_affected_m3, static_cast<double>(total) * 1e-6 + 12.2, 1e-9);
  EXPECT_NEAR(tm[0].V_b_difference_m3, -12.2, 1e-9);
  EXPECT_NEAR(tm[0].E_difference_MJ, 0.0, 1e-12);
  EXPECT_TRUE(of_kind(r, Kind::broken_chain).empty());
}

// A base-temperature what-if on a log whose analysis states no Hs (ISO 6976
// computes it): the combustion reference is named, and the energy change is
// split into the base-condition step (combustion reference held) and the
// combustion-reference step. Held, the energy moves only by the first; an
// explicit 60 degF reference gives the default's totals (the pairing usual
// with a 60 degF base, common practice).
TEST(AuditDifference, WhatIfStatesAndSplitsTheCombustionReference) {
  testing::VirialTestGas gas;
  const std::string no_hs = "valid_from,source,methane,ethane,nitrogen,carbon_dioxide\n" + std::to_string(t0) + ",GC test,0.93,0.04,0.02,0.01\n";
  const auto file = recorded("what_if_combustion", testing::test_config(), gas, 6 * 60 * 2, no_hs);
  audit::AuditOptions o;
  o.what_if.base_T_K = 288.705555555555556;  // 60 degF
  const auto d = audit_of(file, o);
  ASSERT_EQ(d.what_if_steps.size(), 2u);
  EXPECT_EQ(d.what_if_steps[0].cause, "base conditions (combustion reference held)");
  EXPECT_EQ(d.what_if_steps[1].cause, "combustion reference");
  EXPECT_EQ(d.what_if_steps[1].V_b_um3, 0);  // the combustion reference moves energy only
  EXPECT_LT(d.what_if_steps[1].E_J, 0);      // Hs at 15.55 degC is below Hs at 15 degC (ISO 6976)
  EXPECT_EQ(d.what_if_steps[0].V_b_um3 + d.what_if_steps[1].V_b_um3, d.what_if.V_b_um3_replayed - d.what_if.V_b_um3_logged);
  EXPECT_EQ(d.what_if_steps[0].E_J + d.what_if_steps[1].E_J, d.what_if.E_J_replayed - d.what_if.E_J_logged);
  EXPECT_NE(d.what_if_combustion.find("15.55 degC (60 degF) for analyses without a stated Hs"), std::string::npos) << d.what_if_combustion;

  o.what_if.combustion_hold = true;
  const auto h = audit_of(file, o);
  ASSERT_EQ(h.what_if_steps.size(), 1u);
  EXPECT_EQ(h.what_if.E_J_replayed - h.what_if.E_J_logged, d.what_if_steps[0].E_J);
  EXPECT_EQ(h.what_if.V_b_um3_replayed, d.what_if.V_b_um3_replayed);
  EXPECT_NE(h.what_if_combustion.find("15 degC for every Hs (held as recorded)"), std::string::npos) << h.what_if_combustion;

  o.what_if.combustion_hold = false;
  o.what_if.combustion = iso6976::CombustionRef::t15_55C;
  const auto e = audit_of(file, o);
  EXPECT_EQ(e.what_if.E_J_replayed, d.what_if.E_J_replayed);
  EXPECT_EQ(e.what_if.V_b_um3_replayed, d.what_if.V_b_um3_replayed);
}

// A stated Hs moved to another combustion reference by the molar calorific
// values of ISO 6976: the energy scales by their ratio, the volume does not move.
TEST(AuditDifference, StatedHsConvertedToAnotherCombustionReference) {
  testing::VirialTestGas gas;
  const auto file = recorded("what_if_stated_hs", testing::test_config(), gas, 6 * 60 * 2, testing::analysis_csv(t0));
  audit::AuditOptions o;
  o.what_if.combustion = iso6976::CombustionRef::t25C;
  const auto r = audit_of(file, o);
  Fractions<double> x{};
  x[index(Component::methane)] = 0.93;
  x[index(Component::ethane)] = 0.04;
  x[index(Component::nitrogen)] = 0.02;
  x[index(Component::carbon_dioxide)] = 0.01;
  const auto a = iso6976::properties(x, iso6976::CombustionRef::t25C, iso6976::MeteringRef::t15C);
  const auto b = iso6976::properties(x, iso6976::CombustionRef::t15C, iso6976::MeteringRef::t15C);
  const double ratio = a.Hs_MJ_per_m3 / b.Hs_MJ_per_m3;
  EXPECT_LT(ratio, 1.0);
  EXPECT_EQ(r.what_if.V_b_um3_replayed, r.what_if.V_b_um3_logged);
  EXPECT_NEAR(static_cast<double>(r.what_if.E_J_replayed) / static_cast<double>(r.what_if.E_J_logged), ratio, 1e-9);
}

}  // namespace
}  // namespace zcorr

namespace zcorr {
namespace {

// The audit reads one snapshot: a recording that appends intervals under a
// new analysis while the audit runs (here: from the audit's first progress
// call, after it fixed its head) changes nothing in the result, and the
// result names the head it read up to.
TEST(AuditSnapshot, AppendsDuringTheAuditAreNotRead) {
  testing::VirialTestGas gas;
  const auto file = recorded("snapshot", testing::test_config(), gas, 6 * 60 * 2, testing::analysis_csv(t0));
  const std::int64_t head_before = scalar(file, "SELECT max(seq) FROM (SELECT seq FROM interval UNION ALL SELECT seq FROM event "
                                                "UNION ALL SELECT seq FROM qtr UNION ALL SELECT seq FROM gas_analysis)");
  const std::int64_t intervals_before = scalar(file, "SELECT count(*) FROM interval");
  audit::AuditOptions o;
  bool appended = false;
  o.progress = [&](std::int64_t done, std::int64_t) {
    if (done != 0 || appended) return;
    appended = true;
    record::Log w(file, {record::OpenMode::writer});
    const std::string later = "valid_from,source,Hs_MJ_per_m3,methane,ethane,nitrogen,carbon_dioxide\n" + std::to_string(t0 + 7200) +
                              ",GC test,39.9,0.92,0.05,0.02,0.01\n";
    testing::record_text(w, testing::test_config(), gas, testing::sample_csv(t0 + 7200, 6 * 60), later);
  };
  const auto r = audit_of(file, o);
  ASSERT_TRUE(appended);
  EXPECT_GT(scalar(file, "SELECT count(*) FROM interval"), intervals_before);  // the recording did append
  for (const auto& f : r.findings) ADD_FAILURE() << audit::kind_name(f.kind) << ": " << f.detail;
  EXPECT_EQ(r.head_seq, head_before);
  EXPECT_EQ(r.replay.intervals, intervals_before);
}

// An interval naming an analysis the log does not hold is not recomputed,
// and the finding says why; it is not a calculation difference.
TEST(AuditSnapshot, MissingAnalysisIsNotRecomputed) {
  testing::VirialTestGas gas;
  const auto file = recorded("missing_analysis", testing::test_config(), gas, 6 * 60, testing::analysis_csv(t0));
  const std::int64_t seq = scalar(file, "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 10");
  ASSERT_EQ(testing::run_shell(file, "DROP TRIGGER interval_no_update; UPDATE interval SET analysis_seq = 999999 WHERE seq = " +
                                         std::to_string(seq)),
            0);
  const auto r = audit_of(file);
  const auto nr = of_kind(r, Kind::not_replayed);
  ASSERT_EQ(nr.size(), 1u);
  EXPECT_EQ(nr[0].first_seq, seq);
  EXPECT_NE(nr[0].detail.find("gas analysis record seq 999999 is not in the log"), std::string::npos) << nr[0].detail;
  EXPECT_TRUE(std::isnan(nr[0].V_b_difference_m3));
  EXPECT_TRUE(of_kind(r, Kind::calc_difference).empty());
}

}  // namespace
}  // namespace zcorr
