// Correction sets (audit/correct.hpp, schema/003): a what-if written to the
// log as new records that name the ones they replace. Each log is recorded
// by the recording code with the invented test-double gas
// (support/virial_test_gas.hpp; the data are invented for the tests).
#include <gtest/gtest.h>

#include <cmath>
#include <span>
#include <stdexcept>

#include "audit/audit.hpp"
#include "audit/correct.hpp"
#include "io/input_error.hpp"
#include "record/interval_calc.hpp"
#include "record/quantities.hpp"
#include "record/tables.hpp"
#include "record/verify.hpp"
#include "support/old_logs.hpp"
#include "support/record_fixture.hpp"

namespace zcorr {
namespace {

// A test double that refuses every composition (as a method refuses a gas
// outside its composition range).
class RefusingGas final : public LineMethod {
 public:
  [[nodiscard]] MethodId id() const noexcept override { return MethodId::gerg2008; }
  Status prepare(const Fractions<double>&) noexcept override { return make_status(Code::invalid_composition); }
  [[nodiscard]] StateOutput state(double, double, const EvalOptions&) const noexcept override {
    StateOutput o;
    o.status = make_status(Code::invalid_composition);
    return o;
  }
};

audit::MethodFactory test_methods() {
  return [](const std::string& name) -> std::unique_ptr<LineMethod> {
    if (name == "virial_test_gas") return std::make_unique<testing::VirialTestGas>();
    if (name == "refusing_test_gas") return std::make_unique<RefusingGas>();
    return nullptr;
  };
}

// Appends a correcting interval (a copy of `original` changed by `edit`) and
// a correction set with totals that add up, with valid hashes: what a forger
// with the file and this code could write.
template <class Edit>
void forge_set(const std::filesystem::path& file, std::vector<std::int64_t> originals, Edit edit) {
  record::Log log(file, {record::OpenMode::writer});
  const std::span<const std::string_view> ic = record::cols::interval;
  auto col = [&](std::string_view n) { return record::column_index(ic, n); };
  std::string sql = "SELECT ";
  for (std::size_t i = 0; i < ic.size(); ++i) sql += (i ? ", " : "") + std::string(ic[i]);
  log.begin();
  std::int64_t first = 0, last = 0, n = 0, vb = 0, e = 0, vb_r = 0, e_r = 0, t_from = 0, t_to = 0;
  for (auto seq : originals) {
    record::Stmt s(log.db(), sql + " FROM interval WHERE seq = " + std::to_string(seq));
    if (!s.step()) throw std::runtime_error("no interval " + std::to_string(seq));
    std::vector<record::Value> v(ic.size());
    for (std::size_t i = 0; i < v.size(); ++i) v[i] = s.value(static_cast<int>(i));
    vb_r += std::get<std::int64_t>(v[col("V_b_um3")]);
    e_r += std::get<std::int64_t>(v[col("E_J")]);
    v[0] = record::Null{};
    v[col("corrects_seq")] = seq;
    v[col("correction_reason")] = std::string("correction set: forged");
    edit(v, col);
    last = log.append(record::Table::interval, v);
    if (!first) first = last;
    ++n;
    vb += std::get<std::int64_t>(v[col("V_b_um3")]);
    e += std::get<std::int64_t>(v[col("E_J")]);
    t_from = std::get<std::int64_t>(v[col("start_utc_s")]);
    t_to = std::get<std::int64_t>(v[col("end_utc_s")]);
  }
  std::vector<record::Value> set{record::Null{}, std::string("TEST-1"), std::int64_t{0}, t_from, t_to, std::string("forged"),
                                 record::Null{}, record::Null{}, 101560.0, record::Null{}, first, last, n, vb_r, e_r, vb, e,
                                 std::string("0"), record::Null{}};
  log.append(record::Table::correction_set, set);
  log.commit();
}

// Two analyses, the second from noon of the first day (invented data).
std::string two_analyses(std::int64_t t0) {
  std::ostringstream s;
  s << "valid_from,source,Hs_MJ_per_m3,methane,ethane,nitrogen,carbon_dioxide\n"
    << t0 << ",GC test,39.5,0.93,0.04,0.02,0.01\n"
    << (t0 + 12 * 3600) << ",GC test,40.6,0.90,0.07,0.02,0.01\n";
  return s.str();
}

class CorrectTest : public ::testing::Test {
 protected:
  void SetUp() override {
    t0 = *record::parse_time_utc("2026-03-02T06:00:00Z");
    file = testing::temp_log(::testing::UnitTest::GetInstance()->current_test_info()->name());
    record::Log log(file, {record::OpenMode::writer});
    testing::VirialTestGas gas;
    testing::record_text(log, testing::test_config(), gas, testing::sample_csv(t0, 6 * 60 * 24), two_analyses(t0));
    head_before = log.head_seq();
    hashes_before = rows_digest(head_before);
  }
  // Every record up to `seq`, hashes included: equal means nothing logged changed.
  std::string rows_digest(std::int64_t seq) {
    record::Log log(file, {record::OpenMode::read_only});
    std::string all;
    for (const char* t : {"interval", "point_config", "gas_analysis", "event", "qtr"}) {
      record::Stmt s(log.db(), std::string("SELECT seq, hex(hash) FROM ") + t + " WHERE seq <= ? ORDER BY seq");
      s.bind(1, seq);
      while (s.step()) all += std::to_string(s.i64(0)) + ":" + s.text(1) + ";";
    }
    return all;
  }
  audit::CorrectionRequest request() {
    audit::CorrectionRequest r;
    r.point = "TEST-1";
    r.reason = "contract base pressure";
    return r;
  }
  audit::AuditResult audit(const audit::AuditOptions& o = {}) {
    record::Log log(file, {record::OpenMode::read_only});
    return audit::run_audit(log, o, test_methods());
  }
  record::VerifyResult verify() {
    record::Log log(file, {record::OpenMode::read_only});
    return record::verify_log(log);
  }
  std::int64_t q(const std::string& sql) {
    record::Log log(file, {record::OpenMode::read_only});
    return testing::scalar(log.db(), sql);
  }
  static void expect_clean(const audit::AuditResult& r) {
    for (const auto& f : r.findings) ADD_FAILURE() << audit::kind_name(f.kind) << ": " << f.detail;
  }

  std::int64_t t0 = 0, head_before = 0;
  std::filesystem::path file;
  std::string hashes_before;
};

// Another base pressure for the whole log. The base volume scales as the
// audit's what-if says (same replay); the energy stays: Hs per base volume
// is re-based with the molar density p_b / (Z_b T_b) (replay.hpp), so
// E = I T_b Z_b / p_b * Hs does not depend on the base conditions.
TEST_F(CorrectTest, AnotherBasePressureForTheWholeLog) {
  audit::AuditOptions wi;
  wi.what_if.base_p_Pa = 101560.0;
  const auto before = audit(wi);
  expect_clean(before);

  auto req = request();
  req.change.base_p_Pa = 101560.0;
  const auto out = audit::write_correction_set(file, req, test_methods());
  EXPECT_EQ(out.set.intervals, 24 * 60);
  EXPECT_EQ(out.configs, 1);  // one configuration in force
  EXPECT_EQ(out.set.V_b_um3_replaced, before.replay.V_b_um3_logged);
  EXPECT_EQ(out.set.V_b_um3_corrected, before.what_if.V_b_um3_replayed);  // the what-if, written
  EXPECT_LT(out.set.V_b_um3_corrected, out.set.V_b_um3_replaced);
  EXPECT_NEAR(static_cast<double>(out.set.E_J_corrected), static_cast<double>(out.set.E_J_replaced), 24 * 60);  // 1 J per interval

  // Nothing logged changed; the chain and every total hold.
  EXPECT_EQ(rows_digest(head_before), hashes_before);
  const auto v = verify();
  for (const auto& f : v.findings) ADD_FAILURE() << f.table << " " << f.seq << " " << f.kind << " " << f.detail;
  EXPECT_EQ(v.per_table.at("correction_set"), 1);

  // The audit replays the corrections clean and shows both totals.
  const auto after = audit();
  expect_clean(after);
  EXPECT_EQ(after.replay.intervals, 24 * 60);  // the corrections stand in for the originals
  EXPECT_EQ(after.replay.over_bar, 0);
  EXPECT_EQ(after.V_b_um3_as_recorded, out.set.V_b_um3_replaced);
  EXPECT_EQ(after.V_b_um3, out.set.V_b_um3_corrected);
  EXPECT_EQ(after.E_J, out.set.E_J_corrected);
  ASSERT_EQ(after.corrections.size(), 1u);
  EXPECT_EQ(after.corrections[0].seq, out.set.seq);
  EXPECT_EQ(after.corrections[0].intervals, 24 * 60);
  EXPECT_EQ(after.corrections[0].V_b_um3_corrected, out.set.V_b_um3_corrected);
  EXPECT_EQ(after.corrections[0].change, "base_p 101560 Pa");
  EXPECT_EQ(q("SELECT count(*) FROM point_config WHERE corrects_seq IS NOT NULL AND base_p_Pa = 101560"), 1);
  EXPECT_EQ(q("SELECT count(*) FROM event e JOIN point_config c ON e.ref_seq = c.seq WHERE e.kind = 'config_change' AND "
              "c.corrects_seq IS NOT NULL"),
            1);
}

// "What if the afternoon had used the morning's analysis": one range, one analysis.
TEST_F(CorrectTest, TheAnalysisOfTheMorningForTheAfternoon) {
  const std::int64_t first = q("SELECT min(seq) FROM gas_analysis");
  const std::int64_t from = t0 + 12 * 3600, to = t0 + 18 * 3600;
  audit::AuditOptions wi;
  wi.selection.from_utc_s = from;
  wi.selection.to_utc_s = to;
  wi.what_if.analysis_seq = first;
  const auto before = audit(wi);
  const auto whole_before = audit();

  auto req = request();
  req.reason = "the afternoon's analysis was not representative";
  req.from_utc_s = from;
  req.to_utc_s = to;
  req.change.analysis_seq = first;
  const auto out = audit::write_correction_set(file, req, test_methods());
  EXPECT_EQ(out.set.intervals, 6 * 60);
  EXPECT_EQ(out.configs, 0);  // the configuration is unchanged
  EXPECT_EQ(out.set.from_utc_s, from);
  EXPECT_EQ(out.set.to_utc_s, to);
  EXPECT_EQ(out.set.V_b_um3_corrected, before.what_if.V_b_um3_replayed);
  EXPECT_EQ(out.set.E_J_corrected, before.what_if.E_J_replayed);
  EXPECT_NE(out.set.E_J_corrected, out.set.E_J_replaced);  // another Hs (39.5 instead of 40.6 MJ/m3)
  EXPECT_EQ(q("SELECT count(*) FROM interval WHERE corrects_seq IS NOT NULL AND analysis_seq = " + std::to_string(first)), 6 * 60);
  EXPECT_EQ(rows_digest(head_before), hashes_before);

  const auto after = audit();
  expect_clean(after);
  EXPECT_EQ(after.V_b_um3_as_recorded, whole_before.V_b_um3);
  EXPECT_EQ(after.V_b_um3 - after.V_b_um3_as_recorded, out.set.V_b_um3_corrected - out.set.V_b_um3_replaced);
  EXPECT_EQ(after.E_J - after.E_J_as_recorded, out.set.E_J_corrected - out.set.E_J_replaced);
  // Hourly records stay as recorded; their corrected sums differ only in the corrected hours.
  {
    record::Log log(file, {record::OpenMode::read_only});
    const auto hours = record::read_quantities(log, "TEST-1", "hour");
    ASSERT_FALSE(hours.empty());
    std::int64_t delta = 0;
    for (const auto& h : hours) {
      ASSERT_TRUE(h.corrected);
      const bool inside = h.start_utc_s >= from && h.end_utc_s <= to;
      if (!inside) EXPECT_EQ(h.V_b_um3_corrected, h.V_b_um3) << h.start_utc_s;
      if (inside) EXPECT_NE(h.E_J_corrected, h.E_J) << h.start_utc_s;
      delta += h.V_b_um3_corrected - h.V_b_um3;
    }
    EXPECT_EQ(delta, out.set.V_b_um3_corrected - out.set.V_b_um3_replaced);
  }
  // An audit of a range outside the set sees no correction there.
  audit::AuditOptions morning;
  morning.selection.to_utc_s = t0 + 6 * 3600;
  EXPECT_TRUE(audit(morning).corrections.empty());
}

// A second set over the same intervals replaces the first set's records.
TEST_F(CorrectTest, ACorrectionOfACorrection) {
  auto req = request();
  req.change.base_p_Pa = 101560.0;
  const auto first = audit::write_correction_set(file, req, test_methods());
  req.change.base_p_Pa = 101325.0;  // back to the recorded base pressure
  req.reason = "the contract was read wrong";
  const auto second = audit::write_correction_set(file, req, test_methods());
  EXPECT_EQ(second.set.V_b_um3_replaced, first.set.V_b_um3_corrected);
  // Back at the recorded base conditions: the recorded figures again, to
  // the register resolution of each interval.
  EXPECT_NEAR(static_cast<double>(second.set.V_b_um3_corrected), static_cast<double>(first.set.V_b_um3_replaced), 24 * 60);
  EXPECT_NEAR(static_cast<double>(second.set.E_J_corrected), static_cast<double>(first.set.E_J_replaced), 2 * 24 * 60);
  const auto v = verify();
  for (const auto& f : v.findings) ADD_FAILURE() << f.table << " " << f.seq << " " << f.kind << " " << f.detail;
  const auto after = audit();
  expect_clean(after);
  ASSERT_EQ(after.corrections.size(), 2u);
  EXPECT_EQ(after.V_b_um3, second.set.V_b_um3_corrected);
  EXPECT_EQ(after.replay.intervals, 24 * 60);
}

// Recording goes on after a correction set, under the recorded configuration.
TEST_F(CorrectTest, RecordingResumesAfterASet) {
  auto req = request();
  req.change.base_p_Pa = 101560.0;
  (void)audit::write_correction_set(file, req, test_methods());
  const std::int64_t configs = q("SELECT count(*) FROM point_config");
  {
    record::Log log(file, {record::OpenMode::writer});
    testing::VirialTestGas gas;
    const auto stats = testing::record_text(log, testing::test_config(), gas, testing::sample_csv(t0, 6 * 60 * 26), "");
    EXPECT_EQ(stats.intervals, 2 * 60);
    EXPECT_EQ(stats.configs, 0);  // the recorded configuration is still the one in force
  }
  EXPECT_EQ(q("SELECT count(*) FROM point_config"), configs);
  const auto v = verify();
  for (const auto& f : v.findings) ADD_FAILURE() << f.table << " " << f.seq << " " << f.kind << " " << f.detail;
  const auto after = audit();
  expect_clean(after);
  EXPECT_EQ(after.replay.intervals, 26 * 60);
}

// Refused requests name the field and write nothing.
TEST_F(CorrectTest, RefusedRequestsWriteNothing) {
  auto expect_refused = [&](audit::CorrectionRequest r, const std::string& field) {
    try {
      (void)audit::write_correction_set(file, r, test_methods());
      ADD_FAILURE() << "accepted, expected a refusal naming " << field;
    } catch (const io::InputError& e) {
      EXPECT_NE(std::string(e.what()).find(field), std::string::npos) << e.what();
    }
  };
  auto r = request();
  r.change.base_p_Pa = 101560.0;
  auto no_reason = r;
  no_reason.reason = "  ";
  expect_refused(no_reason, "--reason");
  expect_refused(request(), "at least one of");
  auto bad_method = r;
  bad_method.change.method = "no_such_method";
  expect_refused(bad_method, "--method");
  auto bad_analysis = r;
  bad_analysis.change.analysis_seq = 999999;
  expect_refused(bad_analysis, "--analysis");
  auto empty_range = r;
  empty_range.from_utc_s = t0 + 100 * 86400;
  expect_refused(empty_range, "--point/--from/--to");
  auto other_point = r;
  other_point.point = "NOT-THERE";
  expect_refused(other_point, "--point/--from/--to");
  EXPECT_EQ(q("SELECT max(seq) FROM (SELECT seq FROM interval UNION ALL SELECT seq FROM event UNION ALL SELECT seq FROM qtr "
              "UNION ALL SELECT seq FROM point_config UNION ALL SELECT seq FROM gas_analysis)"),
            head_before);
  EXPECT_EQ(rows_digest(head_before), hashes_before);
}

// A failure half-way (here: the progress callback throws after 4096
// intervals) rolls the whole set back.
TEST_F(CorrectTest, AFailureHalfWayLeavesTheLogAsItWas) {
  auto r = request();
  r.change.base_p_Pa = 101560.0;
  int calls = 0;
  r.progress = [&](std::int64_t done, std::int64_t) {
    ++calls;
    if (done > 0) throw std::runtime_error("stopped");
  };
  // 24 h of 1-minute intervals is fewer than 4096: record more first.
  {
    record::Log log(file, {record::OpenMode::writer});
    testing::VirialTestGas gas;
    (void)testing::record_text(log, testing::test_config(), gas, testing::sample_csv(t0, 6 * 60 * 80), "");
  }
  const std::int64_t head = [&] {
    record::Log log(file, {record::OpenMode::read_only});
    return log.head_seq();
  }();
  const std::string digest = rows_digest(head);
  EXPECT_THROW((void)audit::write_correction_set(file, r, test_methods()), std::runtime_error);
  EXPECT_GE(calls, 2);
  record::Log log(file, {record::OpenMode::read_only});
  EXPECT_EQ(log.head_seq(), head);
  EXPECT_EQ(testing::scalar(log.db(), "SELECT count(*) FROM interval WHERE corrects_seq IS NOT NULL"), 0);
  EXPECT_EQ(rows_digest(head), digest);
}

// A changed correcting record, or a set whose totals were altered, is found.
TEST_F(CorrectTest, AlteredSetsAreFound) {
  auto req = request();
  req.change.base_p_Pa = 101560.0;
  const auto out = audit::write_correction_set(file, req, test_methods());
  ASSERT_EQ(testing::run_shell(file, "DROP TRIGGER correction_set_no_update; UPDATE correction_set SET V_b_um3_corrected = "
                                         "V_b_um3_corrected + 5000000, hash = hash WHERE seq = " +
                                         std::to_string(out.set.seq)),
            0);
  const auto v = verify();
  bool changed = false, totals = false;
  for (const auto& f : v.findings) {
    changed |= f.kind == "changed" && f.table == "correction_set";
    totals |= f.kind == "total_mismatch" && f.table == "correction_set";
  }
  EXPECT_TRUE(changed);
  EXPECT_TRUE(totals);
  const auto r = audit();
  bool chain = false;
  for (const auto& f : r.findings) chain |= f.kind == audit::Kind::broken_chain || f.kind == audit::Kind::totals_mismatch;
  EXPECT_TRUE(chain);
}

// A log written before correction sets existed (schema version 2) is read as
// it is -- head, chain, audit -- and upgraded only when opened for writing.
// The log is zcorr 0.1.0's own (support/old_logs.hpp), recorded with
// GERG-2008, so the replay needs that method built in.
TEST_F(CorrectTest, ALogOfSchemaVersionTwoIsReadAndThenUpgraded) {
  if (!audit::built_in_methods()("gerg2008")) GTEST_SKIP() << "GERG-2008 is not built in";
  file = testing::old_log_copy("schema2_correct", 2);
  auto audit_built_in = [&] {
    record::Log log(file, {record::OpenMode::read_only});
    return audit::run_audit(log, {}, audit::built_in_methods());
  };
  {
    record::Log log(file, {record::OpenMode::read_only});
    EXPECT_EQ(log.schema_version(), 2);
    EXPECT_EQ(log.head_seq(), testing::old_log_recording_head_seq);
    const auto v = record::verify_log(log);
    EXPECT_TRUE(v.findings.empty());
    EXPECT_EQ(v.records, testing::old_log_recording_head_seq);
  }
  const auto r = audit_built_in();
  expect_clean(r);
  EXPECT_TRUE(r.corrections.empty());
  auto req = request();
  req.point = "TEST-CLI";
  req.change.base_p_Pa = 101560.0;
  const auto out = audit::write_correction_set(file, req, audit::built_in_methods());  // opens for writing: upgrades
  EXPECT_EQ(q("SELECT max(version) FROM schema_version"), record::latest_schema_version);
  EXPECT_EQ(out.set.intervals, 60);
  expect_clean(audit_built_in());
  EXPECT_TRUE(verify().findings.empty());
  // The correcting configuration names the engine that wrote it; the recorded one (schema 2) does not.
  EXPECT_EQ(q("SELECT count(*) FROM point_config WHERE engine_version = '" + std::string(record::engine_version()) +
              "' AND corrects_seq IS NOT NULL AND canon_version = " + std::to_string(record::latest_encoding)),
            1);
  EXPECT_EQ(q("SELECT count(*) FROM point_config WHERE engine_version IS NULL AND canon_version IS NULL AND corrects_seq IS NULL"), 1);
}

// Correcting intervals that no set accounts for (here the set record was
// deleted) are found, beside the removed record itself.
TEST_F(CorrectTest, ACorrectionWithoutItsSetIsFound) {
  auto req = request();
  req.change.base_p_Pa = 101560.0;
  const auto out = audit::write_correction_set(file, req, test_methods());
  ASSERT_EQ(testing::run_shell(file, "DROP TRIGGER correction_set_no_delete; DELETE FROM correction_set WHERE seq = " +
                                         std::to_string(out.set.seq)),
            0);
  const auto v = verify();
  bool orphan = false;
  for (const auto& f : v.findings) orphan |= f.kind == "bad_correction" && f.table == "interval" && f.seq == out.first_seq + 2;
  EXPECT_TRUE(orphan);  // first_seq is the correcting configuration, then its event, then the intervals
}

// A correction recomputes; it cannot change what was measured. A forged
// set that scales a record's line volume (registers and set totals made to
// add up, hashes valid) is found.
TEST_F(CorrectTest, ACorrectionThatChangesTheMeasuredVolumeIsFound) {
  const std::int64_t seq = q("SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 10");
  forge_set(file, {seq}, [](std::vector<record::Value>& v, auto col) {
    for (const char* c : {"V_ind_m3", "V_f_m3", "I_m3_Pa_per_K", "V_b_m3", "E_MJ", "mass_kg"})
      v[col(c)] = std::get<double>(v[col(c)]) * 1.01;
    v[col("V_f_um3")] = record::to_register(std::get<double>(v[col("V_f_m3")]), record::volume_quantum_m3);
    v[col("V_b_um3")] = record::to_register(std::get<double>(v[col("V_b_m3")]), record::volume_quantum_m3);
    v[col("E_J")] = record::to_register(std::get<double>(v[col("E_MJ")]), 1e-6);
    v[col("mass_mg")] = record::to_register(std::get<double>(v[col("mass_kg")]), record::mass_quantum_kg);
  });
  const auto v = verify();
  bool found = false;
  for (const auto& f : v.findings) {
    found |= f.kind == "bad_correction" && f.detail.find("differs from the record it replaces") != std::string::npos;
    EXPECT_NE(f.kind, "changed") << f.detail;  // the chain itself holds: only the content check finds it
  }
  EXPECT_TRUE(found);
}

// Two corrections of one record would count it twice in every corrected total.
TEST_F(CorrectTest, TwoCorrectionsOfOneRecordAreFound) {
  const std::int64_t seq = q("SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 10");
  forge_set(file, {seq, seq}, [](std::vector<record::Value>&, auto) {});
  const auto v = verify();
  bool found = false;
  for (const auto& f : v.findings) found |= f.kind == "bad_correction" && f.detail.find("replaced by 2 corrections") != std::string::npos;
  EXPECT_TRUE(found);
}

// A change that would stop the conversion (the method refuses the gas) is
// refused, not written as intervals with no converted volume.
TEST_F(CorrectTest, AChangeThatConvertsNothingIsRefused) {
  auto r = request();
  r.change.method = "refusing_test_gas";
  try {
    (void)audit::write_correction_set(file, r, test_methods());
    ADD_FAILURE() << "a correction that converts nothing was written";
  } catch (const io::InputError& e) {
    EXPECT_NE(std::string(e.what()).find("interval seq"), std::string::npos) << e.what();
  }
  EXPECT_EQ(rows_digest(head_before), hashes_before);
  EXPECT_EQ(q("SELECT count(*) FROM interval WHERE corrects_seq IS NOT NULL"), 0);
}

// Never on top of a broken chain.
TEST_F(CorrectTest, ALogThatDoesNotVerifyIsNotCorrected) {
  ASSERT_EQ(testing::run_shell(file, "DROP TRIGGER interval_no_update; UPDATE interval SET V_b_m3 = V_b_m3 + 1 WHERE seq = (SELECT "
                                     "min(seq) + 5 FROM interval)"),
            0);
  auto r = request();
  r.change.base_p_Pa = 101560.0;
  try {
    (void)audit::write_correction_set(file, r, test_methods());
    ADD_FAILURE() << "a correction set was written onto a broken chain";
  } catch (const io::InputError& e) {
    EXPECT_NE(std::string(e.what()).find("a log that verifies"), std::string::npos) << e.what();
  }
  EXPECT_EQ(q("SELECT count(*) FROM interval WHERE corrects_seq IS NOT NULL"), 0);
}

}  // namespace
}  // namespace zcorr
