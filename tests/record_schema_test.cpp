// The log's schema versions and the versions of the canonical encoding:
// logs written by zcorr 0.1.0 (schema 1..3, encoding 1; the fixture in
// tests/data/logs, see support/old_logs.hpp) are read as they are and verify,
// are upgraded without a record being rewritten, and take new records in
// encoding 2 beside the old ones; every record names the encoding it was
// hashed with, and the engine version with the source revision.
// The measurement data are invented (the CLI test samples and the test-double
// gas); the checks are of the log's own consistency, not of physical values.
#include <gtest/gtest.h>

#include <cstring>
#include <memory>
#include <regex>
#include <set>
#include <sstream>

#include "audit/audit.hpp"
#include "audit/report_html.hpp"
#include "eval/line_method.hpp"
#include "record/canonical.hpp"
#include "record/config.hpp"
#include "record/log.hpp"
#include "record/sql.hpp"
#include "record/verify.hpp"
#include "support/old_logs.hpp"
#include "support/record_fixture.hpp"

using namespace zcorr;
using namespace zcorr::record;
using zcorr::testing::scalar;

namespace {

const std::string old_engine = "zcorr 0.1.0 (revision unknown)";  // the fixture's records, as the audit states them
const std::int64_t fixture_end = *parse_time_utc("2026-03-02T07:00:00Z");  // end of the fixture's last interval

bool gerg2008_built_in() { return audit::built_in_methods()("gerg2008") != nullptr; }

// Every record of every chained table the log has, in the columns of
// encoding 1, with prev_hash and hash: equal means no old record changed.
std::string dump_v1_records(const std::filesystem::path& p) {
  Log log(p, {OpenMode::read_only});
  std::string all;
  for (std::size_t t = 0; t < table_count; ++t) {
    if (!has_table(log.schema_version(), static_cast<Table>(t))) continue;
    std::string sql = "SELECT ";
    for (auto c : columns_of(static_cast<Table>(t), 1)) sql += "quote(" + std::string(c) + ") || '|' || ";
    sql += "hex(prev_hash) || '|' || hex(hash) FROM " + std::string(tables[t].name) + " ORDER BY seq";
    Stmt s(log.db(), sql);
    while (s.step()) all += std::string(tables[t].name) + ":" + s.text(0) + "\n";
  }
  return all;
}

std::int64_t count(const std::filesystem::path& p, const std::string& sql) {
  Log log(p, {OpenMode::read_only});
  return scalar(log.db(), sql);
}

std::vector<Finding> verify(const std::filesystem::path& p) {
  Log log(p, {OpenMode::read_only});
  return verify_log(log).findings;
}

void expect_clean(const std::vector<Finding>& f) {
  for (const auto& x : f) ADD_FAILURE() << x.table << " seq " << x.seq << " " << x.kind << ": " << x.detail;
}

// Records another hour after the fixture's end, with the fixture's point
// configuration (GERG-2008), through the recorder of this build.
RecordStats record_next_hour(const std::filesystem::path& p) {
  Log log(p, {OpenMode::writer});
  const auto cfg = load_point_config(std::string(ZCORR_SOURCE_DIR) + "/tests/cli/data/point.conf");
  auto m = make_line_method(MethodId::gerg2008);
  return zcorr::testing::record_text(log, cfg, *m, zcorr::testing::sample_csv(fixture_end, 360), "");
}

// A line method whose Z differs from another's by 20 ppm per MPa: an engine
// after a change of a coefficient, as far as the replay can tell.
class ShiftedZ final : public LineMethod {
 public:
  explicit ShiftedZ(std::unique_ptr<LineMethod> m) : m_(std::move(m)) {}
  [[nodiscard]] MethodId id() const noexcept override { return m_->id(); }
  Status prepare(const Fractions<double>& x) noexcept override { return m_->prepare(x); }
  [[nodiscard]] StateOutput state(double T_K, double p_Pa, const EvalOptions& opt) const noexcept override {
    StateOutput o = m_->state(T_K, p_Pa, opt);
    const double f = 1.0 + 2e-11 * p_Pa;
    if (o.has(Quantity::Z)) o[Quantity::Z] *= f;
    if (o.has(Quantity::rho_mol_per_L)) o[Quantity::rho_mol_per_L] /= f;
    if (o.has(Quantity::rho_kg_per_m3)) o[Quantity::rho_kg_per_m3] /= f;
    return o;
  }

 private:
  std::unique_ptr<LineMethod> m_;
};

audit::MethodFactory shifted(audit::MethodFactory inner) {
  return [inner](const std::string& name) -> std::unique_ptr<LineMethod> {
    auto m = inner(name);
    return m ? std::make_unique<ShiftedZ>(std::move(m)) : nullptr;
  };
}

audit::MethodFactory test_gas_methods() {
  return [](const std::string& name) -> std::unique_ptr<LineMethod> {
    return name == "virial_test_gas" ? std::make_unique<zcorr::testing::VirialTestGas>() : nullptr;
  };
}

audit::AuditResult audit_log(const std::filesystem::path& p, audit::MethodFactory m) {
  Log log(p, {OpenMode::read_only});
  return audit::run_audit(log, {}, std::move(m));
}

std::filesystem::path recorded_test_gas_log(const std::string& name, std::int64_t rows = 6 * 60) {
  const std::int64_t t0 = *parse_time_utc("2026-03-02T06:00:00Z");
  auto p = zcorr::testing::temp_log(name);
  Log log(p, {OpenMode::writer});
  zcorr::testing::VirialTestGas gas;
  zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, zcorr::testing::sample_csv(t0, rows),
                              zcorr::testing::analysis_csv(t0));
  return p;
}

// A copy of `p` with `sql` run on it (through the sqlite3 shell, behind the triggers' back).
std::filesystem::path tampered_copy(const std::filesystem::path& p, const std::string& name, const std::string& sql) {
  auto c = zcorr::testing::temp_log(name);
  std::filesystem::copy_file(p, c, std::filesystem::copy_options::overwrite_existing);
  EXPECT_EQ(zcorr::testing::run_shell(c, sql), 0) << sql;
  return c;
}

}  // namespace

// --- the engine version and the source revision ---------------------------

TEST(EngineVersion, NamesTheReleaseAndTheSourceRevision) {
  EXPECT_EQ(std::string(engine_version()), "zcorr " + std::string(engine_release()) + " (revision " + source_revision() + ")");
  // A short commit hash, "-dirty" when the tree had changes, or unknown (cmake/source_revision.cmake).
  EXPECT_TRUE(std::regex_match(source_revision(), std::regex("[0-9a-f]{7,40}(-dirty)?|unknown|[A-Za-z0-9._+-]+"))) << source_revision();
  EXPECT_TRUE(std::regex_match(engine_release(), std::regex("[0-9]+\\.[0-9]+\\.[0-9]+"))) << engine_release();
  EXPECT_EQ(describe_engine_version("zcorr 0.1.0"), old_engine);
  EXPECT_EQ(describe_engine_version(engine_version()), engine_version());
}

TEST(EngineVersion, EveryNewRecordNamesItsEngineAndEncoding) {
  const auto p = recorded_test_gas_log("new_records");
  Log log(p, {OpenMode::read_only});
  const std::string ev = engine_version();
  auto n = [&](const std::string& sql) { return scalar(log.db(), sql); };
  EXPECT_EQ(n("SELECT count(*) FROM log_header WHERE engine_version = '" + ev + "' AND hash_scheme = 'zcorr.record.v" + std::to_string(latest_encoding) + "/sha256'"), 1);
  EXPECT_EQ(n("SELECT count(*) FROM point_config WHERE engine_version = '" + ev + "'"), 1);
  EXPECT_EQ(n("SELECT count(*) FROM interval WHERE engine_version <> '" + ev + "'"), 0);
  EXPECT_EQ(n("SELECT count(*) FROM interval"), 60);
  EXPECT_EQ(n("SELECT count(*) FROM schema_version WHERE engine_version <> '" + ev + "'"), 0);
  EXPECT_EQ(n("SELECT count(*) FROM schema_version"), latest_schema_version);
  for (const auto& t : tables)
    EXPECT_EQ(n("SELECT count(*) FROM " + std::string(t.name) + " WHERE canon_version IS NOT " + std::to_string(latest_encoding)), 0)
        << t.name;
  EXPECT_GT(n("SELECT count(*) FROM event WHERE kind = 'recording_start' AND instr(detail, '" + ev + "') > 0"), 0);
}

// --- the encodings and the schema versions --------------------------------

TEST(RecordEncoding, EachSchemaVersionHasTheColumnsOfItsEncoding) {
  // What keeps a migration and the column lists of tables.hpp in step: a log
  // of schema version s has exactly the columns of encoding_of_schema(s).
  EXPECT_EQ(encoding_of_schema(0), 0);
  EXPECT_EQ(encoding_of_schema(3), 1);
  EXPECT_EQ(encoding_of_schema(latest_schema_version), latest_encoding);
  for (int s = 1; s <= latest_schema_version; ++s) {
    const auto p = zcorr::testing::temp_log("columns_" + std::to_string(s));
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(p.c_str(), &db), SQLITE_OK);
    apply_migrations(db, s);
    for (std::size_t t = 0; t < table_count; ++t) {
      std::set<std::string> have, want;
      Stmt c(db, "SELECT name FROM pragma_table_info('" + std::string(tables[t].name) + "')");
      while (c.step()) have.insert(c.text(0));
      if (!has_table(s, static_cast<Table>(t))) {
        EXPECT_TRUE(have.empty()) << tables[t].name << " at schema " << s;
        continue;
      }
      for (auto name : columns_of(static_cast<Table>(t), encoding_of_schema(s))) want.insert(std::string(name));
      want.insert("prev_hash");
      want.insert("hash");
      EXPECT_EQ(have, want) << tables[t].name << " at schema " << s;
    }
    sqlite3_close(db);
  }
}

TEST(RecordEncoding, VersionTwoAddsItsColumnsAfterTheBytesOfVersionOne) {
  std::vector<Value> v{std::int64_t{2}, std::string("P"), std::int64_t{-1}, std::string("k"), std::string("info"), std::string(""),
                       Null{}, Null{}, -0.0, 1.5, std::int64_t{2}};
  std::vector<std::uint8_t> b1, b2;
  canonical_bytes(Table::event, 1, std::span<const Value>(v).first(10), b1);
  canonical_bytes(Table::event, 2, v, b2);
  const std::string h1("zcorr.record.v1\0\0\x05" "event\0\x0a", 25), h2("zcorr.record.v2\0\0\x05" "event\0\x0b", 25);
  EXPECT_EQ(std::string(b1.begin(), b1.begin() + 25), h1);
  EXPECT_EQ(std::string(b2.begin(), b2.begin() + 25), h2);
  // The columns of version 1 are encoded alike, then canon_version (INTEGER 2).
  EXPECT_EQ(std::string(b2.begin() + 25, b2.begin() + static_cast<long>(b1.size())), std::string(b1.begin() + 25, b1.end()));
  const std::string tail("\0\x0d" "canon_version\x01\0\0\0\0\0\0\0\x02", 24);
  EXPECT_EQ(std::string(b2.begin() + static_cast<long>(b1.size()), b2.end()), tail);
  EXPECT_EQ(b2.size(), b1.size() + tail.size());
  // The number of values must be that of the version.
  EXPECT_THROW(canonical_bytes(Table::event, 1, v, b1), std::logic_error);
  EXPECT_THROW(canonical_bytes(Table::event, latest_encoding + 1, v, b1), std::logic_error);
}

// --- logs written by zcorr 0.1.0 -------------------------------------------

TEST(OldLog, EverySchemaVersionIsReadAsItIsAndVerifies) {
  for (int s = 1; s <= 3; ++s) {
    SCOPED_TRACE("schema " + std::to_string(s));
    const auto p = zcorr::testing::old_log_copy("old_read_only_" + std::to_string(s), s);
    const std::string before = dump_v1_records(p);
    {
      Log log(p, {OpenMode::read_only});
      EXPECT_EQ(log.schema_version(), s);
      EXPECT_EQ(log.encoding(), 1);
      EXPECT_EQ(column_index(log.columns(Table::interval), "canon_version"), log.columns(Table::interval).size());
      const auto r = verify_log(log);
      expect_clean(r.findings);
      EXPECT_EQ(r.records, s == 3 ? 131 : zcorr::testing::old_log_recording_head_seq);
      EXPECT_EQ(to_hex(r.head_hash), s == 3 ? zcorr::testing::old_log_head_hash : zcorr::testing::old_log_recording_head_hash);
      EXPECT_EQ(to_hex(log.head_hash()), to_hex(r.head_hash));
    }
    if (gerg2008_built_in()) {
      const auto a = audit_log(p, audit::built_in_methods());
      for (const auto& f : a.findings) ADD_FAILURE() << audit::kind_name(f.kind) << ": " << f.detail;
      ASSERT_EQ(a.engine_versions.size(), 1u);
      EXPECT_EQ(a.engine_versions[0].first, old_engine);
      EXPECT_EQ(a.engine_versions[0].second, s == 3 ? 120 : 60);
      EXPECT_TRUE(audit::written_by_another_engine(a));
    }
    // Reading changed nothing, not even the schema version.
    EXPECT_EQ(dump_v1_records(p), before);
    EXPECT_EQ(count(p, "SELECT max(version) FROM schema_version"), s);
  }
}

TEST(OldLog, UpgradeRewritesNoRecord) {
  for (int s = 1; s <= 3; ++s) {
    SCOPED_TRACE("schema " + std::to_string(s));
    const auto p = zcorr::testing::old_log_copy("old_upgrade_" + std::to_string(s), s);
    const std::string before = dump_v1_records(p);
    {
      Log log(p, {OpenMode::writer});  // upgrades
      EXPECT_EQ(log.schema_version(), latest_schema_version);
      EXPECT_EQ(log.encoding(), latest_encoding);
      EXPECT_EQ(log.head_seq(), s == 3 ? 131 : zcorr::testing::old_log_recording_head_seq);
    }
    EXPECT_EQ(dump_v1_records(p), before);
    for (const auto& t : tables)  // (correction_set, created by the upgrade of a schema-1 or -2 log, is empty)
      EXPECT_EQ(count(p, "SELECT count(*) FROM " + std::string(t.name) + " WHERE canon_version IS NOT NULL"), 0) << t.name;
    EXPECT_EQ(count(p, "SELECT count(*) FROM point_config WHERE engine_version IS NOT NULL"), 0);
    EXPECT_EQ(count(p, "SELECT count(*) FROM schema_version WHERE version > " + std::to_string(s) + " AND engine_version = '" +
                           std::string(engine_version()) + "'"),
              latest_schema_version - s);
    expect_clean(verify(p));
    // The no-update triggers still hold after the upgrade.
    Log w(p, {OpenMode::writer});
    EXPECT_THROW(exec(w.db(), "UPDATE interval SET canon_version = 2 WHERE seq = (SELECT min(seq) FROM interval)"), LogError);
    EXPECT_THROW(exec(w.db(), "UPDATE point_config SET engine_version = 'x'"), LogError);
  }
}

TEST(OldLog, AMixedLogVerifiesAndAuditsClean) {
  if (!gerg2008_built_in()) GTEST_SKIP() << "GERG-2008 is not built in";
  const auto p = zcorr::testing::old_log_copy("old_mixed");
  const std::string before = dump_v1_records(p);
  const auto st = record_next_hour(p);
  EXPECT_EQ(st.intervals, 60);
  EXPECT_EQ(st.configs, 0);  // the same configuration: resumed, not re-issued
  {
    Log log(p, {OpenMode::read_only});
    const auto r = verify_log(log);
    expect_clean(r.findings);
    EXPECT_EQ(r.per_encoding.size(), 2u);
    EXPECT_EQ(r.per_encoding.at(1), 131);
    EXPECT_EQ(r.per_encoding.at(latest_encoding), r.records - 131);
    EXPECT_GE(r.records - 131, 61);  // 60 intervals, their hourly record, events
    EXPECT_EQ(r.created_by, old_engine);
  }
  // Records of both encodings, the old ones as they were.
  EXPECT_EQ(count(p, "SELECT count(*) FROM interval WHERE canon_version IS NULL AND engine_version = 'zcorr 0.1.0'"), 120);
  EXPECT_EQ(count(p, "SELECT count(*) FROM interval WHERE canon_version = " + std::to_string(latest_encoding) + " AND engine_version = '" +
                     std::string(engine_version()) + "'"),
            60);
  EXPECT_GT(count(p, "SELECT count(*) FROM qtr WHERE canon_version = " + std::to_string(latest_encoding)), 0);
  {
    const std::string after = dump_v1_records(p);
    // Every old record is still there, byte for byte (the dump lists them table by table).
    std::istringstream in(before);
    std::string line;
    while (std::getline(in, line)) EXPECT_NE(after.find(line + "\n"), std::string::npos) << line;
  }
  const auto a = audit_log(p, audit::built_in_methods());
  for (const auto& f : a.findings) ADD_FAILURE() << audit::kind_name(f.kind) << ": " << f.detail;
  ASSERT_EQ(a.engine_versions.size(), 2u);
  EXPECT_EQ(a.engine_versions[0], (std::pair<std::string, std::int64_t>{old_engine, 120}));
  EXPECT_EQ(a.engine_versions[1], (std::pair<std::string, std::int64_t>{engine_version(), 60}));
  EXPECT_TRUE(audit::written_by_another_engine(a));
}

// --- tampering with what the encodings cover ----------------------------

TEST(RecordEncoding, AChangedNewColumnBreaksTheChainAtThatRow) {
  const auto p = recorded_test_gas_log("new_column");
  const auto cfg = count(p, "SELECT seq FROM point_config");
  const auto c = tampered_copy(p, "new_column_changed",
                               "DROP TRIGGER point_config_no_update; UPDATE point_config SET engine_version = 'zcorr 0.1.0 (revision 0000000)'");
  const auto f = verify(c);
  ASSERT_FALSE(f.empty());
  EXPECT_EQ(f[0].table, "point_config");
  EXPECT_EQ(f[0].seq, cfg);
  EXPECT_EQ(f[0].kind, "changed");
  // Every column of the latest encoding is covered (the columns of version 1 are checked in record_log_test).
  const auto iv = count(p, "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 3");
  for (const auto& t : tables) {
    if (t.name != "interval") continue;
    for (std::size_t i = 0; i < t.versions.size(); ++i) {
      if (t.versions[i].since < 2) continue;
      const std::string col(t.versions[i].name);
      const auto x = tampered_copy(p, "new_column_" + col,
                                   "DROP TRIGGER interval_no_update; UPDATE interval SET " + col + " = " + col +
                                       " + 1 WHERE seq = " + std::to_string(iv));
      const auto g = verify(x);
      ASSERT_FALSE(g.empty()) << col;
      EXPECT_EQ(g[0].seq, iv) << col;
      EXPECT_EQ(g[0].kind, "changed") << col;
    }
  }
}

TEST(RecordEncoding, AValueInAColumnItsEncodingDoesNotCoverBreaksTheChain) {
  // An old record (encoding 1) holds NULL in the columns added later; a value
  // there is a change its hash cannot show, so the verifier refuses it.
  const auto p = zcorr::testing::old_log_copy("old_not_covered");
  { Log w(p, {OpenMode::writer}); }  // upgraded, nothing written
  const auto c = tampered_copy(p, "old_not_covered_changed",
                               "DROP TRIGGER point_config_no_update; UPDATE point_config SET engine_version = 'zcorr 9.9.9' WHERE seq = 2");
  const auto f = verify(c);
  ASSERT_EQ(f.size(), 1u);
  EXPECT_EQ(f[0].table, "point_config");
  EXPECT_EQ(f[0].seq, 2);
  EXPECT_EQ(f[0].kind, "changed");
  EXPECT_NE(f[0].detail.find("engine_version holds a value"), std::string::npos) << f[0].detail;
}

TEST(RecordEncoding, ARecordClaimingAnotherEncodingBreaksTheChain) {
  const auto p = recorded_test_gas_log("claims");
  const auto iv = count(p, "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 7");
  // A record of the latest encoding that says 1 (NULL) or 2, or names a version this log cannot hold.
  static_assert(latest_encoding == 4, "claim the versions around the latest one");
  for (const char* claim : {"NULL", "3", "5", "99"}) {
    SCOPED_TRACE(claim);
    const auto c = tampered_copy(p, "claims_copy", "DROP TRIGGER interval_no_update; UPDATE interval SET canon_version = " +
                                                        std::string(claim) + " WHERE seq = " + std::to_string(iv));
    const auto f = verify(c);
    ASSERT_EQ(f.size(), 1u);
    EXPECT_EQ(f[0].seq, iv);
    EXPECT_EQ(f[0].kind, "changed");
  }
  // A record of encoding 1 that says 2.
  const auto o = zcorr::testing::old_log_copy("old_claims");
  { Log w(o, {OpenMode::writer}); }
  const auto old_iv = count(o, "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 5");
  const auto c = tampered_copy(o, "old_claims_copy", "DROP TRIGGER interval_no_update; UPDATE interval SET canon_version = 2 WHERE seq = " +
                                                         std::to_string(old_iv));
  const auto f = verify(c);
  ASSERT_EQ(f.size(), 1u);
  EXPECT_EQ(f[0].table, "interval");
  EXPECT_EQ(f[0].seq, old_iv);
  EXPECT_EQ(f[0].kind, "changed");
  // A record re-hashed in another encoding than the one it names is found as well.
  const auto cfg = count(p, "SELECT seq FROM point_config");
  std::vector<Value> v;
  Digest prev{};
  {
    Log log(p, {OpenMode::read_only});
    std::string sql = "SELECT ";
    for (auto col : cols::point_config) sql += std::string(col) + ", ";
    Stmt s(log.db(), sql + "prev_hash FROM point_config WHERE seq = " + std::to_string(cfg));
    ASSERT_TRUE(s.step());
    for (std::size_t i = 0; i < std::size(cols::point_config); ++i) v.push_back(s.value(static_cast<int>(i)));
    std::memcpy(prev.data(), sqlite3_column_blob(s.raw(), static_cast<int>(std::size(cols::point_config))), 32);
  }
  std::vector<std::uint8_t> bytes;
  canonical_bytes(Table::point_config, 1, std::span<const Value>(v).first(column_count(Table::point_config, 1)), bytes);
  Hasher h;
  const auto d = h.chain(prev, bytes);  // hashed in encoding 1, still naming 2
  const auto r = tampered_copy(p, "claims_rehashed", "DROP TRIGGER point_config_no_update; UPDATE point_config SET hash = X'" + to_hex(d) +
                                                          "' WHERE seq = " + std::to_string(cfg));
  const auto g = verify(r);
  ASSERT_FALSE(g.empty());
  EXPECT_EQ(g[0].seq, cfg);
  EXPECT_EQ(g[0].kind, "changed");
}

// --- the audit names the engines that wrote the log -----------------------

TEST(AuditEngineVersions, ADifferenceOnIntervalsOfAnotherRevisionSaysSo) {
  if (!gerg2008_built_in()) GTEST_SKIP() << "GERG-2008 is not built in";
  // The fixture replayed by an engine whose GERG-2008 differs (ShiftedZ).
  const auto p = zcorr::testing::old_log_copy("old_shifted");
  const auto a = audit_log(p, shifted(audit::built_in_methods()));
  bool found = false;
  for (const auto& f : a.findings) {
    if (f.kind != audit::Kind::calc_difference) continue;
    found = true;
    EXPECT_NE(f.detail.find("the intervals were written by " + old_engine + ", not by this " + std::string(engine_version()) +
                            ": the difference may be due to the change of engine version or revision"),
              std::string::npos)
        << f.detail;
  }
  EXPECT_TRUE(found);
  // After another hour recorded by this engine: one run of differences, half of it the old engine's.
  record_next_hour(p);
  const auto b = audit_log(p, shifted(audit::built_in_methods()));
  std::int64_t n = 0;
  for (const auto& f : b.findings) {
    if (f.kind != audit::Kind::calc_difference) continue;
    ++n;
    EXPECT_EQ(f.intervals, 120);
    EXPECT_NE(f.detail.find("60 of its 120 intervals were written by " + old_engine), std::string::npos) << f.detail;
  }
  EXPECT_EQ(n, 1);
  // The HTML report's header names both engines and the one replaying.
  audit::ReportCollector charts;
  audit::ReportHeader h;
  h.log_file = "old.db";
  std::ostringstream html;
  audit::write_html_report(html, b, charts, h);
  EXPECT_NE(html.str().find("<dt>written by</dt><dd>" + old_engine + ": 120 intervals; " + std::string(engine_version()) + ": 60 intervals</dd>"),
            std::string::npos);
  EXPECT_NE(html.str().find("<dt>replayed by</dt><dd>" + audit::html_escape(engine_version()) + " <strong>(another engine version"),
            std::string::npos);
}

TEST(AuditEngineVersions, ADifferenceOnIntervalsOfThisEngineSaysNothingOfRevisions) {
  const auto p = recorded_test_gas_log("this_engine_shifted");
  const auto clean = audit_log(p, test_gas_methods());
  EXPECT_TRUE(clean.findings.empty());
  ASSERT_EQ(clean.engine_versions.size(), 1u);
  EXPECT_EQ(clean.engine_versions[0].first, engine_version());
  EXPECT_FALSE(audit::written_by_another_engine(clean));
  const auto a = audit_log(p, shifted(test_gas_methods()));
  bool found = false;
  for (const auto& f : a.findings) {
    if (f.kind != audit::Kind::calc_difference) continue;
    found = true;
    EXPECT_EQ(f.detail.find("written by"), std::string::npos) << f.detail;
  }
  EXPECT_TRUE(found);
  audit::ReportCollector charts;
  std::ostringstream html;
  audit::write_html_report(html, a, charts, audit::ReportHeader{});
  EXPECT_NE(html.str().find("<dt>written by</dt><dd>" + audit::html_escape(engine_version()) + ": 60 intervals</dd>"), std::string::npos);
  EXPECT_EQ(html.str().find("another engine version"), std::string::npos);
}
