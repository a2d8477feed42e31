// Logs written by earlier versions of zcorr, for the tests of reading and
// upgrading them: copies of tests/data/logs/zcorr-0.1.0-schema3.db (written
// by zcorr 0.1.0, see the README there), as they are or reduced to an older
// schema version.
//
// The fixture's records seq 1..68 are the recording, seq 69..131 the
// correction set written on top of it. A log of schema version 2 or 1 is the
// fixture without its newest records (the correction set; the chain of what
// is left is exactly what the recorder wrote and committed, head seq 68) and
// without the tables and indexes of the later migrations.
#pragma once

#include <sqlite3.h>

#include <filesystem>
#include <stdexcept>
#include <string>

#include "support/record_fixture.hpp"

namespace zcorr::testing {

inline constexpr const char* old_log_head_hash = "8fb67ba1aeaf238ad03601e8c4e12ae9d39e35445d1f1dff4ba94a17f5673f32";           // seq 131
inline constexpr const char* old_log_recording_head_hash = "8c90803fae24394feaa863b917ddd109d2ab7399687893fb1dbc1d22517650ed";  // seq 68
inline constexpr std::int64_t old_log_recording_head_seq = 68;

inline std::filesystem::path old_log_fixture() {
  return std::filesystem::path(ZCORR_SOURCE_DIR) / "tests" / "data" / "logs" / "zcorr-0.1.0-schema3.db";
}

// A copy of the fixture in a temporary folder, of schema version 3 (as
// written), 2 or 1.
inline std::filesystem::path old_log_copy(const std::string& name, int schema_version = 3) {
  const auto p = temp_log(name);
  std::filesystem::copy_file(old_log_fixture(), p, std::filesystem::copy_options::overwrite_existing);
  if (schema_version >= 3) return p;
  sqlite3* db = nullptr;
  if (sqlite3_open(p.c_str(), &db) != SQLITE_OK) throw std::runtime_error("cannot open " + p.string());
  std::string sql = "BEGIN;";
  for (const char* t : {"point_config", "interval", "event"})
    sql += std::string("DROP TRIGGER ") + t + "_no_delete; DELETE FROM " + t + " WHERE seq > " +
           std::to_string(old_log_recording_head_seq) + "; CREATE TRIGGER " + t + "_no_delete BEFORE DELETE ON " + t +
           " BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never deleted'); END;";
  sql += "DROP TABLE correction_set; DROP INDEX interval_corrects;"
         "DROP TRIGGER schema_version_no_delete; DELETE FROM schema_version WHERE version >= 3;";
  if (schema_version <= 1)
    sql += "DROP INDEX interval_point_start; DROP INDEX qtr_point_period_end; DROP INDEX gas_analysis_point_valid;"
           "DELETE FROM schema_version WHERE version >= 2;";
  sql += "CREATE TRIGGER schema_version_no_delete BEFORE DELETE ON schema_version BEGIN SELECT RAISE(ABORT, "
         "'zcorr log: schema_version rows are never deleted'); END; COMMIT;";
  char* err = nullptr;
  const int rc = sqlite3_exec(db, sql.c_str(), nullptr, nullptr, &err);
  const std::string msg = err ? err : "";
  sqlite3_free(err);
  sqlite3_close(db);
  if (rc != SQLITE_OK) throw std::runtime_error("reducing " + p.string() + " to schema " + std::to_string(schema_version) + ": " + msg);
  return p;
}

}  // namespace zcorr::testing
