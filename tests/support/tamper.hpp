// Helpers for the audit tests that plant a consistent forgery: rows of a log
// changed the way a careful tamperer would change them (every dependent
// figure made to agree, the quantity records summed again), then the whole
// hash chain recomputed with the log's own encoding, so that the verifier
// finds nothing and only the audit's recomputation can.
#pragma once

#include <sqlite3.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <stdexcept>
#include <string>
#include <tuple>
#include <vector>

#include "record/canonical.hpp"
#include "record/interval_calc.hpp"
#include "record/log.hpp"
#include "record/sql.hpp"
#include "record/tables.hpp"

namespace zcorr::testing {

inline void exec_sql(sqlite3* db, const std::string& sql) {
  char* err = nullptr;
  if (sqlite3_exec(db, sql.c_str(), nullptr, nullptr, &err) != SQLITE_OK) {
    const std::string m = err ? err : "?";
    sqlite3_free(err);
    throw std::runtime_error(m + " in: " + sql);
  }
}

// The log file opened directly through SQLite (closed at scope end).
struct OpenDb {
  sqlite3* db = nullptr;
  explicit OpenDb(const std::filesystem::path& file) {
    if (sqlite3_open(file.string().c_str(), &db) != SQLITE_OK) throw std::runtime_error("cannot open " + file.string());
  }
  ~OpenDb() { sqlite3_close(db); }
  OpenDb(const OpenDb&) = delete;
  OpenDb& operator=(const OpenDb&) = delete;
};

// Drops every trigger (the no-update / no-delete guards) of the file and
// returns their CREATE statements.
inline std::vector<std::string> drop_triggers(sqlite3* db) {
  std::vector<std::string> names, creates;
  {
    record::Stmt s(db, "SELECT name, sql FROM sqlite_master WHERE type = 'trigger'");
    while (s.step()) {
      names.push_back(s.text(0));
      creates.push_back(s.text(1));
    }
  }
  for (const auto& n : names) exec_sql(db, "DROP TRIGGER " + n);
  return creates;
}

// The triggers set aside for an edit and put back after it, as a careful
// forger would (the verifier reports a missing trigger on its own).
struct TriggersAside {
  sqlite3* db;
  std::vector<std::string> creates;
  explicit TriggersAside(sqlite3* d) : db(d), creates(drop_triggers(d)) {}
  ~TriggersAside() {
    for (const auto& c : creates) sqlite3_exec(db, c.c_str(), nullptr, nullptr, nullptr);
  }
  TriggersAside(const TriggersAside&) = delete;
  TriggersAside& operator=(const TriggersAside&) = delete;
};

// Sums every quantity transaction record again from the intervals (period
// totals over the intervals inside its period, register readings over the
// point's intervals before it), and its average Hs as the recorder forms it.
inline void resum_quantity_records(sqlite3* db) {
  exec_sql(db,
           "UPDATE qtr SET "
           "V_f_um3 = (SELECT coalesce(sum(i.V_f_um3), 0) FROM interval i WHERE i.point = qtr.point AND i.corrects_seq IS NULL AND "
           "  i.start_utc_s >= qtr.start_utc_s AND i.end_utc_s <= qtr.end_utc_s), "
           "V_b_um3 = (SELECT coalesce(sum(i.V_b_um3), 0) FROM interval i WHERE i.point = qtr.point AND i.corrects_seq IS NULL AND "
           "  i.start_utc_s >= qtr.start_utc_s AND i.end_utc_s <= qtr.end_utc_s), "
           "E_J = (SELECT coalesce(sum(i.E_J), 0) FROM interval i WHERE i.point = qtr.point AND i.corrects_seq IS NULL AND "
           "  i.start_utc_s >= qtr.start_utc_s AND i.end_utc_s <= qtr.end_utc_s), "
           "mass_mg = (SELECT coalesce(sum(i.mass_mg), 0) FROM interval i WHERE i.point = qtr.point AND i.corrects_seq IS NULL AND "
           "  i.start_utc_s >= qtr.start_utc_s AND i.end_utc_s <= qtr.end_utc_s), "
           "cum_V_b_um3 = (SELECT coalesce(sum(i.V_b_um3), 0) FROM interval i WHERE i.point = qtr.point AND i.corrects_seq IS NULL AND i.seq < qtr.seq), "
           "cum_E_J = (SELECT coalesce(sum(i.E_J), 0) FROM interval i WHERE i.point = qtr.point AND i.corrects_seq IS NULL AND i.seq < qtr.seq), "
           "cum_mass_mg = (SELECT coalesce(sum(i.mass_mg), 0) FROM interval i WHERE i.point = qtr.point AND i.corrects_seq IS NULL AND i.seq < qtr.seq) "
           "WHERE corrects_seq IS NULL");
  exec_sql(db, "UPDATE qtr SET Hs_avg_MJ_per_m3 = CAST(E_J AS REAL) / V_b_um3 WHERE V_b_um3 > 0 AND Hs_avg_MJ_per_m3 IS NOT NULL");
}

// Recomputes prev_hash and hash of every chained record, in seq order, each
// in the canonical encoding it names (canon_version; NULL or absent = 1).
inline void rehash_chain(sqlite3* db) {
  struct Rec {
    std::int64_t seq;
    record::Table table;
    int encoding;
    std::vector<record::Value> values;
  };
  std::vector<Rec> recs;
  for (std::size_t t = 0; t < record::table_count; ++t) {
    const auto& info = record::tables[t];
    {
      record::Stmt e(db, "SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = ?");
      e.bind(1, info.name);
      if (!e.step() || e.i64(0) == 0) continue;
    }
    bool versioned = false;  // a log of schema 4 or later: its records name their encoding
    {
      record::Stmt c(db, "SELECT count(*) FROM pragma_table_info(?) WHERE name = 'canon_version'");
      c.bind(1, info.name);
      versioned = c.step() && c.i64(0) > 0;
    }
    const auto cols = record::columns_of(static_cast<record::Table>(t), versioned ? record::latest_encoding : 1);
    const std::size_t ci = record::canon_version_index(static_cast<record::Table>(t));
    std::string sql = "SELECT ";
    for (std::size_t i = 0; i < cols.size(); ++i) sql += (i ? ", " : "") + std::string(cols[i]);
    record::Stmt s(db, sql + " FROM " + std::string(info.name));
    while (s.step()) {
      Rec r{s.i64(0), static_cast<record::Table>(t), 1, {}};
      if (versioned && ci < cols.size() && !s.is_null(static_cast<int>(ci))) r.encoding = static_cast<int>(s.i64(static_cast<int>(ci)));
      const std::size_t n = record::column_count(r.table, r.encoding);
      for (std::size_t i = 0; i < n; ++i) r.values.push_back(s.value(static_cast<int>(i)));
      recs.push_back(std::move(r));
    }
  }
  std::sort(recs.begin(), recs.end(), [](const Rec& a, const Rec& b) { return a.seq < b.seq; });
  record::Hasher h;
  record::Digest prev = record::zero_digest;
  std::vector<std::uint8_t> bytes;
  for (const auto& r : recs) {
    record::canonical_bytes(r.table, r.encoding, r.values, bytes);
    const record::Digest d = h.chain(prev, bytes);
    record::Stmt u(db, "UPDATE " + std::string(record::table_info(r.table).name) + " SET prev_hash = ?, hash = ? WHERE seq = ?");
    u.bind_blob(1, prev.data(), 32);
    u.bind_blob(2, d.data(), 32);
    u.bind(3, r.seq);
    u.step();
    prev = d;
  }
}

// Scales the logged Z_f of the intervals starting in [from, to) by `factor`
// and makes every figure that follows from it agree: Fz, C, the integral
// value, base volume, energy, mass and line density (all proportional to
// 1 / Z_f), each register from its quantity as the recorder rounds it, the
// quantity records summed again, and the chain re-hashed.
inline void forge_consistent_Z_f(const std::filesystem::path& file, std::int64_t from, std::int64_t to, double factor) {
  const OpenDb open(file);
  sqlite3* db = open.db;
  const TriggersAside aside(db);
  exec_sql(db, "BEGIN");
  std::vector<std::tuple<std::int64_t, double, double, double, double, double, double, double, double>> rows;
  {
    record::Stmt s(db,
                   "SELECT seq, Z_f, Fz, C, I_m3_Pa_per_K, V_b_m3, E_MJ, mass_kg, rho_f_kg_per_m3 FROM interval "
                   "WHERE start_utc_s >= ? AND start_utc_s < ? AND V_b_um3 > 0");
    s.bind(1, from).bind(2, to);
    while (s.step())
      rows.emplace_back(s.i64(0), s.f64(1), s.f64(2), s.f64(3), s.f64(4), s.f64(5), s.f64(6), s.f64(7), s.f64(8));
  }
  record::Stmt u(db,
                 "UPDATE interval SET Z_f = ?, Fz = ?, C = ?, I_m3_Pa_per_K = ?, V_b_m3 = ?, E_MJ = ?, mass_kg = ?, rho_f_kg_per_m3 = ?, "
                 "V_b_um3 = ?, E_J = ?, mass_mg = ? WHERE seq = ?");
  for (const auto& [seq, Zf, Fz, C, I, Vb, E, m, rho] : rows) {
    const double Vb2 = Vb / factor, E2 = E / factor, m2 = m / factor;
    u.bind(1, record::real(Zf * factor)).bind(2, record::real(Fz / factor)).bind(3, record::real(C / factor))
        .bind(4, record::real(I / factor)).bind(5, record::real(Vb2)).bind(6, record::real(E2)).bind(7, record::real(m2))
        .bind(8, record::real(rho / factor))
        .bind(9, record::to_register(Vb2, record::volume_quantum_m3))
        .bind(10, record::to_register(E2, 1e-6))
        .bind(11, record::to_register(m2, record::mass_quantum_kg))
        .bind(12, seq);
    u.step();
    u.reset();
  }
  resum_quantity_records(db);
  rehash_chain(db);
  exec_sql(db, "COMMIT");
}

// Changes the composition of a gas analysis record (methane for nitrogen by
// `dx` mole fraction) and re-hashes the chain.
inline void forge_analysis(const std::filesystem::path& file, std::int64_t analysis_seq, double dx) {
  const OpenDb open(file);
  sqlite3* db = open.db;
  const TriggersAside aside(db);
  exec_sql(db, "BEGIN");
  exec_sql(db, "UPDATE gas_analysis SET x_methane = x_methane - " + std::to_string(dx) + ", x_nitrogen = x_nitrogen + " +
                   std::to_string(dx) + " WHERE seq = " + std::to_string(analysis_seq));
  rehash_chain(db);
  exec_sql(db, "COMMIT");
}

}  // namespace zcorr::testing
