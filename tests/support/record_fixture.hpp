// Helpers for the interval-log tests: temporary log files, generated sample
// files (invented data for the tests), and recording a CSV through the
// record layer with the test-double method.
#pragma once

#include <sqlite3.h>
#include <unistd.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include "record/config.hpp"
#include "record/input.hpp"
#include "record/log.hpp"
#include "record/recorder.hpp"
#include "record/timeutil.hpp"
#include "support/virial_test_gas.hpp"

namespace zcorr::testing {

inline std::filesystem::path temp_log(const std::string& name) {
  auto dir = std::filesystem::temp_directory_path() / ("zcorr_test_" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  auto p = dir / (name + ".db");
  for (auto suffix : {"", "-wal", "-shm", "-writer.lock"}) std::filesystem::remove(p.string() + suffix);
  return p;
}

inline record::PointConfig test_config() {
  record::PointConfig c;
  c.point = "TEST-1";
  c.method = "virial_test_gas";
  c.base_name = "iso15";
  c.base_T_K = 288.15;
  c.base_p_Pa = 101325.0;
  c.interval_s = 60;
  c.contract_hour = 6;
  c.p_min_Pa = 1e6;
  c.p_max_Pa = 8e6;
  c.T_min_K = 263.15;
  c.T_max_K = 323.15;
  return c;
}

// Rows every `step_s` from t0 (exclusive) for n rows: smooth invented swings of P and T.
inline std::string sample_csv(std::int64_t t0, std::int64_t n, std::int64_t step_s = 10) {
  std::ostringstream s;
  s << "time,p_kPa,T_degC,V_m3\n";
  s.precision(10);
  for (std::int64_t i = 1; i <= n; ++i) {
    const double ph = static_cast<double>(i) / 360.0;
    const double p = 5000.0 + 400.0 * std::sin(ph);
    const double T = 12.0 + 4.0 * std::cos(ph * 0.7);
    const double v = 0.8 + 0.3 * std::sin(ph * 1.3);
    s << (t0 + i * step_s) << ',' << p << ',' << T << ',' << v << '\n';
  }
  return s.str();
}

inline std::string analysis_csv(std::int64_t valid_from) {
  std::ostringstream s;
  s << "valid_from,source,Hs_MJ_per_m3,methane,ethane,nitrogen,carbon_dioxide\n"
    << valid_from << ",GC test,39.5,0.93,0.04,0.02,0.01\n";
  return s.str();
}

inline record::RecordStats record_text(record::Log& log, const record::PointConfig& cfg, LineMethod& m, const std::string& csv,
                                       const std::string& analyses, std::int64_t batch = 50) {
  record::RecordOptions opt;
  opt.batch_intervals = batch;
  opt.input_name = "test.csv";
  record::Recorder rec(log, cfg, m, opt);
  if (!analyses.empty()) {
    std::istringstream a(analyses);
    auto af = record::read_analyses(a, "analyses.csv", io::CompositionOptions{});
    for (const auto& b : af.bad) rec.add_bad_analysis(b);
    rec.add_analyses(af.analyses);
  }
  std::istringstream in(csv);
  record::SampleReader reader(in, "test.csv", cfg);
  rec.feed(reader);
  rec.finish();
  return rec.stats();
}

inline std::int64_t scalar(sqlite3* db, const std::string& sql) {
  record::Stmt s(db, sql);
  return s.step() ? s.i64(0) : -1;
}

// Runs `sql` on the file through the sqlite3 shell, as someone editing a log
// behind zcorr's back would. A careful forger puts back the no-update /
// no-delete triggers the edit needed to drop: by default so does this (pass
// restore_triggers = false to leave them dropped), so a test of the chain is
// not helped by the verifier's check of the triggers.
inline int run_shell(const std::filesystem::path& db, const std::string& sql, bool restore_triggers = true) {
  std::vector<std::pair<std::string, std::string>> triggers;  // name, CREATE statement
  auto open = [&] {
    sqlite3* h = nullptr;
    if (sqlite3_open(db.c_str(), &h) != SQLITE_OK) {
      sqlite3_close(h);
      return static_cast<sqlite3*>(nullptr);
    }
    return h;
  };
  if (restore_triggers) {
    if (sqlite3* h = open()) {
      sqlite3_stmt* st = nullptr;
      if (sqlite3_prepare_v2(h, "SELECT name, sql FROM sqlite_schema WHERE type = 'trigger'", -1, &st, nullptr) == SQLITE_OK)
        while (sqlite3_step(st) == SQLITE_ROW)
          triggers.emplace_back(reinterpret_cast<const char*>(sqlite3_column_text(st, 0)),
                                reinterpret_cast<const char*>(sqlite3_column_text(st, 1)));
      sqlite3_finalize(st);
      sqlite3_close(h);
    }
  }
  const std::string cmd = "sqlite3 '" + db.string() + "' \"" + sql + "\" >/dev/null 2>&1";
  const int rc = std::system(cmd.c_str());
  if (!triggers.empty()) {
    if (sqlite3* h = open()) {
      for (const auto& [name, create] : triggers) {
        sqlite3_stmt* st = nullptr;
        bool present = false;
        if (sqlite3_prepare_v2(h, "SELECT 1 FROM sqlite_schema WHERE type = 'trigger' AND name = ?", -1, &st, nullptr) == SQLITE_OK) {
          sqlite3_bind_text(st, 1, name.c_str(), -1, SQLITE_TRANSIENT);
          present = sqlite3_step(st) == SQLITE_ROW;
        }
        sqlite3_finalize(st);
        if (!present) sqlite3_exec(h, create.c_str(), nullptr, nullptr, nullptr);
      }
      sqlite3_close(h);
    }
  }
  return rc;
}

}  // namespace zcorr::testing
