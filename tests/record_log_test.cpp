// The interval log: schema creation and migration, refusals, triggers, the
// hash chain and its verification against tampering through the sqlite3
// shell, exact totals, the second writer. Values recorded here come from
// the invented test-double gas (support/virial_test_gas.hpp); the checks are
// of the log's own consistency, not of physical values.
#include <gtest/gtest.h>

#include <cstring>

#include "record/log.hpp"
#include "record/sql.hpp"
#include "record/verify.hpp"
#include "support/record_fixture.hpp"

using namespace zcorr;
using namespace zcorr::record;
using zcorr::testing::scalar;

namespace {

const std::int64_t t0 = *parse_time_utc("2026-03-02T06:00:00Z");

std::filesystem::path recorded_log(const std::string& name, std::int64_t rows = 6 * 60 * 3) {
  auto p = zcorr::testing::temp_log(name);
  Log log(p, {OpenMode::writer});
  zcorr::testing::VirialTestGas gas;
  zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, zcorr::testing::sample_csv(t0, rows),
                              zcorr::testing::analysis_csv(t0));
  return p;
}

}  // namespace

TEST(RecordSchema, FreshLogHasEveryMigrationAndWal) {
  auto p = zcorr::testing::temp_log("fresh");
  Log log(p, {OpenMode::writer});
  EXPECT_EQ(log.schema_version(), latest_schema_version);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM schema_version"), latest_schema_version);
  for (const auto& t : tables)
    EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM sqlite_schema WHERE type='table' AND name='" + std::string(t.name) + "'"), 1) << t.name;
  Stmt jm(log.db(), "PRAGMA journal_mode");
  ASSERT_TRUE(jm.step());
  EXPECT_EQ(jm.text(0), "wal");
  EXPECT_EQ(log.head_seq(), 1);  // the log header
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM log_header"), 1);
}

TEST(RecordSchema, OlderLogIsUpgradedKeepingItsRecords) {
  auto p = zcorr::testing::temp_log("old");
  {
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(p.c_str(), &db), SQLITE_OK);
    apply_migrations(db, 1);
    EXPECT_EQ(read_schema_version(db), 1);
    EXPECT_EQ(scalar(db, "SELECT count(*) FROM sqlite_schema WHERE type='index' AND name='interval_point_start'"), 0);
    sqlite3_close(db);
  }
  {
    Log log(p, {OpenMode::writer});  // upgrades, then writes its header
    EXPECT_EQ(log.schema_version(), latest_schema_version);
    EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM sqlite_schema WHERE type='index' AND name='interval_point_start'"), 1);
    EXPECT_EQ(scalar(log.db(), "SELECT group_concat(version) FROM (SELECT version FROM schema_version ORDER BY version)"), 1);
  }
  Log ro(p, {OpenMode::read_only});
  EXPECT_TRUE(verify_log(ro).findings.empty());
}

TEST(RecordSchema, NewerLogIsRefusedWithAMessage) {
  auto p = zcorr::testing::temp_log("newer");
  { Log log(p, {OpenMode::writer}); }
  ASSERT_EQ(zcorr::testing::run_shell(p, "INSERT INTO schema_version VALUES (999, '999_future.sql', 0, 'zcorr 9')"), 0);
  for (auto mode : {OpenMode::writer, OpenMode::read_only}) {
    try {
      Log log(p, {mode});
      FAIL() << "a log of a newer schema was opened";
    } catch (const LogError& e) {
      EXPECT_NE(std::string(e.what()).find("schema version 999, newer than this zcorr"), std::string::npos) << e.what();
    }
  }
}

TEST(RecordSchema, ForeignAndBrokenFilesAreRefused) {
  auto p = zcorr::testing::temp_log("foreign");
  ASSERT_EQ(zcorr::testing::run_shell(p, "CREATE TABLE t (a); INSERT INTO t VALUES (1)"), 0);
  EXPECT_THROW(Log(p, {OpenMode::read_only}), LogError);
  EXPECT_THROW(Log(p, {OpenMode::writer}), LogError);
  auto g = zcorr::testing::temp_log("garbage");
  { std::ofstream(g) << "this is not an SQLite database, only some text that is long enough to be a header........\n"; }
  EXPECT_THROW(Log(g, {OpenMode::read_only}), LogError);
  EXPECT_THROW(Log(zcorr::testing::temp_log("missing"), {OpenMode::read_only}), LogError);
}

TEST(RecordLog, TriggersRefuseUpdateAndDelete) {
  auto p = recorded_log("triggers", 60);
  Log log(p, {OpenMode::writer});
  EXPECT_THROW(exec(log.db(), "UPDATE interval SET V_b_m3 = 0 WHERE seq = (SELECT min(seq) FROM interval)"), LogError);
  EXPECT_THROW(exec(log.db(), "DELETE FROM event"), LogError);
  EXPECT_THROW(exec(log.db(), "UPDATE point_config SET meter_factor = 1.1"), LogError);
  EXPECT_THROW(exec(log.db(), "DELETE FROM schema_version"), LogError);
}

TEST(RecordLog, SecondWriterIsRefused) {
  auto p = zcorr::testing::temp_log("two_writers");
  Log first(p, {OpenMode::writer});
  try {
    Log second(p, {OpenMode::writer});
    FAIL() << "a second writer was let in";
  } catch (const LogError& e) {
    EXPECT_NE(std::string(e.what()).find("another writer (pid " + std::to_string(::getpid()) + ")"), std::string::npos) << e.what();
  }
  Log reader(p, {OpenMode::read_only});  // readers are welcome
  EXPECT_TRUE(verify_log(reader).findings.empty());
}

TEST(RecordLog, OneWriterPerFileWhateverThePath) {
  auto p = zcorr::testing::temp_log("one_file");
  { Log create(p, {OpenMode::writer}); }
  // Another name for the same file: a symbolic link (its own -writer.lock path) meets the file's own lock.
  const auto alias = p.parent_path() / ("alias_of_" + p.filename().string());
  std::filesystem::remove(alias);
  std::filesystem::create_symlink(p, alias);
  {
    Log first(p, {OpenMode::writer});
    try {
      Log second(alias, {OpenMode::writer});
      FAIL() << "a second writer through another path was let in";
    } catch (const LogError& e) {
      EXPECT_NE(std::string(e.what()).find("another writer is recording to this log file"), std::string::npos) << e.what();
    }
  }
  { Log again(alias, {OpenMode::writer}); }  // once the first has gone, the other path may write
  // A hard link: two names, two journals; refused for writing (both names), readable.
  const auto link = p.parent_path() / ("link_of_" + p.filename().string());
  std::filesystem::remove(link);
  std::filesystem::create_hard_link(p, link);
  for (const auto& name : {p, link}) {
    try {
      Log w(name, {OpenMode::writer});
      FAIL() << "a writer of a file with two hard links was let in";
    } catch (const LogError& e) {
      EXPECT_NE(std::string(e.what()).find("2 hard links"), std::string::npos) << e.what();
    }
  }
  Log reader(link, {OpenMode::read_only});
  EXPECT_TRUE(verify_log(reader).findings.empty());
  std::filesystem::remove(link);
  std::filesystem::remove(alias);
}

TEST(RecordLog, WhatAWriterAppendedIsReadBackBeforeItReportsSuccess) {
  auto p = zcorr::testing::temp_log("read_back");
  Log w(p, {OpenMode::writer});
  w.begin();
  std::vector<Value> e{Null{}, std::string("P"), std::int64_t{1}, std::string("note"), std::string("info"), std::string("first"),
                       Null{}, Null{}, Null{}, Null{}, Null{}};
  w.append(Table::event, e);
  w.append(Table::event, e);
  w.commit();
  EXPECT_EQ(w.recheck_appended(), 3);  // the log header and the two events
  // Someone changes a committed record behind the writer's back (triggers put back).
  ASSERT_EQ(zcorr::testing::run_shell(p, "DROP TRIGGER event_no_update; UPDATE event SET detail = 'changed' WHERE seq = 2"), 0);
  try {
    (void)w.recheck_appended();
    FAIL() << "a changed record read back as written";
  } catch (const LogError& ex) {
    EXPECT_NE(std::string(ex.what()).find("record seq 2 (event)"), std::string::npos) << ex.what();
  }
}

TEST(RecordLog, AClosedLogIsOneSelfContainedFile) {
  auto p = recorded_log("self_contained");
  // The writer has gone: its WAL was checkpointed into the .db, so the file alone is the log.
  const auto copy = zcorr::testing::temp_log("self_contained_copy");
  std::filesystem::copy_file(p, copy, std::filesystem::copy_options::overwrite_existing);
  EXPECT_FALSE(std::filesystem::exists(copy.string() + "-wal"));
  Log a(p, {OpenMode::read_only}), b(copy, {OpenMode::read_only});
  EXPECT_EQ(a.head_seq(), b.head_seq());
  EXPECT_EQ(a.head_hash(), b.head_hash());
  EXPECT_GT(b.head_seq(), 60);
  EXPECT_TRUE(verify_log(b).findings.empty());
}

TEST(RecordLog, WriterNoticesAppendsBySomeoneElse) {
  auto p = zcorr::testing::temp_log("interleave");
  Log w(p, {OpenMode::writer});
  // Someone bypasses the writer lock and appends a row directly.
  ASSERT_EQ(zcorr::testing::run_shell(p, "INSERT INTO event (seq, point, time_utc_s, kind, severity, detail, prev_hash, hash) "
                                         "VALUES (2, NULL, 0, 'x', 'info', 'x', zeroblob(32), zeroblob(32))"), 0);
  EXPECT_THROW(w.begin(), LogError);
}

TEST(RecordVerify, CleanRecordingVerifiesAndTotalsAddUp) {
  auto p = recorded_log("clean");
  Log log(p, {OpenMode::read_only});
  auto r = verify_log(log);
  for (const auto& f : r.findings) ADD_FAILURE() << f.table << " " << f.seq << " " << f.kind << " " << f.detail;
  EXPECT_EQ(r.records, scalar(log.db(), "SELECT max(seq) FROM (SELECT seq FROM interval UNION ALL SELECT seq FROM qtr UNION ALL "
                                        "SELECT seq FROM event UNION ALL SELECT seq FROM gas_analysis UNION ALL SELECT seq FROM point_config "
                                        "UNION ALL SELECT seq FROM log_header)"));
  EXPECT_EQ(r.per_table["interval"], 180);  // 3 h of 10-s rows in 60-s intervals
  EXPECT_EQ(r.per_table["qtr"], 3);         // 3 hourly records, the contract day is still open
  // Exact totals: the registers are integers and the records sum exactly.
  const auto sum_vb = scalar(log.db(), "SELECT sum(V_b_um3) FROM interval");
  EXPECT_EQ(scalar(log.db(), "SELECT sum(V_b_um3) FROM qtr WHERE period='hour'"), sum_vb);
  EXPECT_EQ(scalar(log.db(), "SELECT cum_V_b_um3 FROM qtr ORDER BY seq DESC LIMIT 1"), sum_vb);
  EXPECT_EQ(r.points["TEST-1"].V_b_um3, sum_vb);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM interval WHERE V_b_um3 != CAST(round(V_b_m3 * 1e6) AS INTEGER)"), 0);
}

TEST(RecordVerify, RowChangedInTheShellIsFoundAndNamed) {
  auto p = recorded_log("changed");
  std::int64_t target = 0;
  {
    Log log(p, {OpenMode::read_only});
    target = scalar(log.db(), "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 77");
  }
  ASSERT_EQ(zcorr::testing::run_shell(p, "DROP TRIGGER interval_no_update; UPDATE interval SET V_b_m3 = V_b_m3 * 1.01, "
                                         "V_b_um3 = V_b_um3 + 1 WHERE seq = " + std::to_string(target)), 0);
  Log log(p, {OpenMode::read_only});
  auto r = verify_log(log);
  ASSERT_FALSE(r.findings.empty());
  EXPECT_EQ(r.findings[0].table, "interval");
  EXPECT_EQ(r.findings[0].seq, target);
  EXPECT_EQ(r.findings[0].kind, "changed");
}

TEST(RecordVerify, EveryColumnOfAnIntervalIsCovered) {
  auto p = recorded_log("each_column", 60);
  std::int64_t target = 0;
  {
    Log log(p, {OpenMode::read_only});
    target = scalar(log.db(), "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 5");
  }
  ASSERT_EQ(zcorr::testing::run_shell(p, "DROP TRIGGER interval_no_update", false), 0);
  for (auto col : cols::interval) {
    if (col == "seq") continue;
    const std::string c(col);
    // Change one column (a NULL becomes a value), check, put it back.
    auto fresh = zcorr::testing::temp_log("each_column_copy");
    std::filesystem::copy_file(p, fresh, std::filesystem::copy_options::overwrite_existing);
    ASSERT_EQ(zcorr::testing::run_shell(fresh, "UPDATE interval SET " + c + " = CASE typeof(" + c + ") WHEN 'integer' THEN " + c +
                                                   " + 1 WHEN 'real' THEN " + c + " * 1.0000001 + 1e-9 WHEN 'text' THEN " + c +
                                                   " || 'x' ELSE 7 END WHERE seq = " + std::to_string(target)),
              0) << c;
    Log log(fresh, {OpenMode::read_only});
    auto r = verify_log(log);
    ASSERT_FALSE(r.findings.empty()) << "a change of " << c << " went unnoticed";
    EXPECT_EQ(r.findings[0].seq, target) << c;
  }
}

TEST(RecordVerify, RowDeletedInTheShellIsFoundAndLocated) {
  auto p = recorded_log("deleted");
  std::int64_t target = 0;
  {
    Log log(p, {OpenMode::read_only});
    target = scalar(log.db(), "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 100");
  }
  ASSERT_EQ(zcorr::testing::run_shell(p, "DROP TRIGGER interval_no_delete; DELETE FROM interval WHERE seq = " + std::to_string(target)), 0);
  Log log(p, {OpenMode::read_only});
  auto r = verify_log(log);
  ASSERT_FALSE(r.findings.empty());
  EXPECT_EQ(r.findings[0].kind, "removed");
  EXPECT_EQ(r.findings[0].seq, target + 1);  // the record after the gap
  EXPECT_NE(r.findings[0].detail.find("seq " + std::to_string(target) + ".." + std::to_string(target)), std::string::npos)
      << r.findings[0].detail;
}

TEST(RecordVerify, RowInsertedInTheShellIsFoundAndLocated) {
  auto p = recorded_log("inserted");
  std::int64_t ev = 0, src = 0;
  {
    Log log(p, {OpenMode::read_only});
    ev = scalar(log.db(), "SELECT seq FROM event ORDER BY seq LIMIT 1 OFFSET 1");
    src = scalar(log.db(), "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 10");
  }
  std::string cols;
  for (std::size_t i = 1; i < std::size(cols::interval); ++i) cols += ", " + std::string(cols::interval[i]);
  // A forged interval copied from a real one, slipped in at a free seq of the interval table.
  ASSERT_EQ(zcorr::testing::run_shell(p, "INSERT INTO interval (seq" + cols + ", prev_hash, hash) SELECT " + std::to_string(ev) + cols +
                                             ", prev_hash, hash FROM interval WHERE seq = " + std::to_string(src)),
            0);
  Log log(p, {OpenMode::read_only});
  auto r = verify_log(log);
  ASSERT_FALSE(r.findings.empty());
  EXPECT_EQ(r.findings[0].kind, "inserted");
  EXPECT_EQ(r.findings[0].table, "interval");
  EXPECT_EQ(r.findings[0].seq, ev);
  // Appended at the end instead: its hash cannot match.
  ASSERT_EQ(zcorr::testing::run_shell(p, "INSERT INTO interval (seq" + cols + ", prev_hash, hash) SELECT (SELECT max(seq) + 1000 FROM qtr)" +
                                             cols + ", prev_hash, hash FROM interval WHERE seq = " + std::to_string(src)),
            0);
  auto r2 = verify_log(log);
  EXPECT_GE(r2.findings_total, 2);
}

TEST(RecordVerify, ACorrectlyHashedForgeryAtAnEventsSeqIsTheOneCalledInserted) {
  // A forged interval at the seq an event holds, linked to the same previous
  // record and correctly hashed: both records at that seq are intact, and the
  // genuine one is the one the next record links to.
  auto p = recorded_log("forged_at_event");
  std::int64_t ev = 0, src = 0;
  {
    Log log(p, {OpenMode::read_only});
    ev = scalar(log.db(), "SELECT seq FROM event ORDER BY seq LIMIT 1 OFFSET 1");
    src = scalar(log.db(), "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 10");
  }
  ASSERT_LT(ev, scalar(Log(p, {OpenMode::read_only}).db(), "SELECT max(seq) FROM interval"));
  std::string sel;
  for (std::size_t i = 0; i < std::size(cols::interval); ++i) sel += (i ? ", " : "") + std::string(cols::interval[i]);
  std::vector<Value> v(std::size(cols::interval));
  Digest prev{};
  {
    Log log(p, {OpenMode::read_only});
    Stmt s(log.db(), "SELECT " + sel + " FROM interval WHERE seq = " + std::to_string(src));
    ASSERT_TRUE(s.step());
    for (std::size_t i = 0; i < v.size(); ++i) v[i] = s.value(static_cast<int>(i));
    Stmt e(log.db(), "SELECT prev_hash FROM event WHERE seq = " + std::to_string(ev));
    ASSERT_TRUE(e.step());
    std::memcpy(prev.data(), sqlite3_column_blob(e.raw(), 0), 32);
  }
  v[0] = ev;
  v[column_index(cols::interval, "V_b_m3")] = 1234.5;  // what the forger wants counted
  std::vector<std::uint8_t> bytes;
  canonical_bytes(Table::interval, latest_encoding, v, bytes);
  Hasher h;
  const auto d = h.chain(prev, bytes);
  std::string vals;
  for (std::size_t i = 0; i < v.size(); ++i) {
    const auto& x = v[i];
    vals += i ? ", " : "";
    if (std::holds_alternative<Null>(x)) vals += "NULL";
    else if (x.index() == 1) vals += std::to_string(std::get<std::int64_t>(x));
    else if (x.index() == 2) {
      char buf[40];
      std::snprintf(buf, sizeof buf, "%.17g", std::get<double>(x));
      vals += buf;
    } else vals += "'" + std::get<std::string>(x) + "'";
  }
  ASSERT_EQ(zcorr::testing::run_shell(p, "INSERT INTO interval (" + sel + ", prev_hash, hash) VALUES (" + vals + ", X'" + to_hex(prev) +
                                             "', X'" + to_hex(d) + "')"),
            0);
  Log log(p, {OpenMode::read_only});
  auto r = verify_log(log);
  ASSERT_EQ(r.findings.size(), 1u) << r.findings[0].table << " " << r.findings[0].kind << " " << r.findings[0].detail;
  EXPECT_EQ(r.findings[0].kind, "inserted");
  EXPECT_EQ(r.findings[0].table, "interval");
  EXPECT_EQ(r.findings[0].seq, ev);
}

TEST(RecordVerify, ReHashedChangeBreaksTheNextLink) {
  // A tamperer who recomputes the changed row's own hash (here: through the
  // log API, as if with the program itself) still breaks the link of the next
  // record; the finding names the changed record.
  auto p = zcorr::testing::temp_log("rehash");
  std::int64_t forged = 0;
  {
    Log log(p, {OpenMode::writer});
    log.begin();
    std::vector<Value> e1{Null{}, std::string("P"), std::int64_t{1}, std::string("note"), std::string("info"), std::string("first"),
                          Null{}, Null{}, Null{}, Null{}, Null{}};
    forged = log.append(Table::event, e1);
    auto e2 = e1;
    e2[5] = std::string("second");
    log.append(Table::event, e2);
    log.commit();
  }
  // Rebuild record `forged` with other contents and its own correct hash.
  {
    Log log(p, {OpenMode::read_only});
    Stmt s(log.db(), "SELECT prev_hash FROM event WHERE seq = " + std::to_string(forged));
    ASSERT_TRUE(s.step());
    Digest prev{};
    std::memcpy(prev.data(), sqlite3_column_blob(s.raw(), 0), 32);
    std::vector<Value> e{forged, std::string("P"), std::int64_t{1}, std::string("note"), std::string("info"), std::string("FORGED"),
                         Null{}, Null{}, Null{}, Null{}, std::int64_t{latest_encoding}};
    std::vector<std::uint8_t> bytes;
    canonical_bytes(Table::event, latest_encoding, e, bytes);
    Hasher h;
    const auto d = h.chain(prev, bytes);
    ASSERT_EQ(zcorr::testing::run_shell(p, "DROP TRIGGER event_no_update; UPDATE event SET detail = 'FORGED', hash = X'" + to_hex(d) +
                                               "' WHERE seq = " + std::to_string(forged)),
              0);
  }
  Log log(p, {OpenMode::read_only});
  auto r = verify_log(log);
  ASSERT_EQ(r.findings.size(), 1u);
  EXPECT_EQ(r.findings[0].kind, "link_broken");
  EXPECT_EQ(r.findings[0].seq, forged);
}

TEST(RecordVerify, TotalsThatDoNotAddUpAreFound) {
  // A quantity record with a correct hash but a wrong total (as a faulty
  // writer would produce it) is found by the totals check.
  auto p = recorded_log("bad_total", 6 * 60);
  {
    Log log(p, {OpenMode::writer});
    log.begin();
    std::vector<Value> q{Null{}, std::string("TEST-1"), std::string("hour"), t0 + 3600, t0 + 7200, std::string("2026-03-02"),
                         std::int64_t{2}, std::int64_t{0}, std::int64_t{0}, std::int64_t{0}, Null{}, Null{}, Null{},
                         std::int64_t{5}, std::int64_t{5}, std::int64_t{0}, std::int64_t{0}, std::int64_t{0}, std::int64_t{0},
                         std::int64_t{0}, std::int64_t{0}, std::int64_t{0}, std::int64_t{0}, std::int64_t{0}, Null{}, Null{}, Null{}};
    log.append(Table::qtr, q);
    log.commit();
  }
  Log log(p, {OpenMode::read_only});
  auto r = verify_log(log);
  ASSERT_EQ(r.findings.size(), 1u);
  EXPECT_EQ(r.findings[0].kind, "total_mismatch");
  EXPECT_EQ(r.findings[0].table, "qtr");
}

TEST(RecordCanonical, EncodingIsStableAndDocumented) {
  // The layout stated in canonical.hpp, byte for byte, for a small record (version 1).
  std::vector<Value> v{std::int64_t{2}, std::string("P"), std::int64_t{-1}, std::string("k"), std::string("info"), std::string(""),
                       Null{}, Null{}, -0.0, 1.5};
  std::vector<std::uint8_t> b;
  canonical_bytes(Table::event, 1, v, b);
  const std::string head("zcorr.record.v1\0\0\x05" "event\0\x0a", 25);
  ASSERT_GE(b.size(), head.size());
  EXPECT_EQ(std::string(b.begin(), b.begin() + static_cast<long>(head.size())), head);
  const std::string seq_field("\0\x03seq\x01\0\0\0\0\0\0\0\x02", 14);
  EXPECT_EQ(std::string(b.begin() + 25, b.begin() + 39), seq_field);
  // -0.0 is encoded as +0.0; 1.5 = 0x3FF8000000000000.
  const std::string tail("\0\x0blimit_value\x02\x3f\xf8\0\0\0\0\0\0", 22);
  EXPECT_EQ(std::string(b.end() - 22, b.end()), tail);
}

TEST(RecordVerify, CorrectionsNameAnEarlierRecordOfTheirTable) {
  auto p = recorded_log("corrections", 60);
  std::int64_t original = 0;
  {
    Log log(p, {OpenMode::writer});
    original = scalar(log.db(), "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 3");
    std::string sql = "SELECT ";
    for (std::size_t i = 0; i < std::size(cols::interval); ++i) sql += (i ? ", " : "") + std::string(cols::interval[i]);
    Stmt s(log.db(), sql + " FROM interval WHERE seq = " + std::to_string(original));
    ASSERT_TRUE(s.step());
    std::vector<Value> v;
    for (std::size_t i = 0; i < std::size(cols::interval); ++i) v.push_back(s.value(static_cast<int>(i)));
    const auto i_corr = column_index(cols::interval, "corrects_seq");
    v[i_corr] = original;
    v[column_index(cols::interval, "correction_reason")] = std::string("meter factor entered late");
    log.begin();
    log.append(Table::interval, v);
    auto bad = v;
    bad[i_corr] = std::int64_t{999999};
    log.append(Table::interval, bad);
    log.commit();
  }
  Log log(p, {OpenMode::read_only});
  auto r = verify_log(log);
  // The correction naming a record that does not exist, then both
  // corrections together: correcting intervals come with a correction set
  // (schema/003), and these two were written without one.
  ASSERT_EQ(r.findings.size(), 2u);
  EXPECT_EQ(r.findings[0].kind, "bad_correction");
  EXPECT_EQ(r.findings[0].seq, r.last_seq);
  EXPECT_EQ(r.findings[1].kind, "bad_correction");
  EXPECT_EQ(r.findings[1].seq, r.last_seq - 1);
  EXPECT_NE(r.findings[1].detail.find("2 correcting interval(s)"), std::string::npos) << r.findings[1].detail;
  EXPECT_NE(r.findings[1].detail.find("no correction set"), std::string::npos) << r.findings[1].detail;
}
