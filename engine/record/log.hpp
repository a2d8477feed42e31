// zcorr interval log: opening, creating and upgrading a log file, the single
// writer, and appending chained records.
//
// Durability policy: the file is in WAL mode. A writer appends records inside
// explicit transactions (begin() ... commit(); the recorder commits every N
// intervals and at the end of its input). With synchronous = NORMAL (the
// default) a committed transaction survives a killed process; with
// synchronous = FULL (Durability::full) it also survives a power loss.
// A process killed mid-transaction loses only that uncommitted batch.
//
// One writer at a time: a writer holds an exclusive flock() on FILE-writer.lock
// for its whole life (released by the kernel when the process dies, so a
// killed recorder never leaves a stale lock) and checks at every begin() that
// the chain head is still the one it last wrote.
#pragma once

#include <sqlite3.h>

#include <cstdint>
#include <filesystem>
#include <string>
#include <vector>

#include "record/canonical.hpp"
#include "record/schema_migrations.hpp"
#include "record/sql.hpp"
#include "record/tables.hpp"
#include "record/version.hpp"

namespace zcorr::record {

// Fixed-point resolutions of the registers (stated in every log_header).
inline constexpr double volume_quantum_m3 = 1e-6;  // *_um3
inline constexpr double energy_quantum_J = 1.0;     // *_J
inline constexpr double mass_quantum_kg = 1e-6;     // *_mg

enum class OpenMode { read_only, writer };
enum class Durability { normal, full };

struct OpenOptions {
  OpenMode mode = OpenMode::read_only;
  Durability durability = Durability::normal;
  bool create = true;  // writer: create the file when it does not exist
};

// Applies migrations (current version + 1) .. up_to, each in its own transaction.
// Exposed so that tests can build a log of an older version.
void apply_migrations(sqlite3* db, int up_to = latest_schema_version);
// 0 for an empty database; throws LogError when it is not a zcorr log.
[[nodiscard]] int read_schema_version(sqlite3* db);

class Log {
 public:
  explicit Log(const std::filesystem::path& file, const OpenOptions& opt = {});
  ~Log();
  Log(const Log&) = delete;
  Log& operator=(const Log&) = delete;

  [[nodiscard]] sqlite3* db() const noexcept { return db_; }
  [[nodiscard]] const std::filesystem::path& file() const noexcept { return file_; }
  [[nodiscard]] int schema_version() const noexcept { return version_; }
  // The newest canonical encoding whose columns this log has: latest_encoding
  // for a writer (it upgrades the log), older for an older log read as it is.
  [[nodiscard]] int encoding() const noexcept { return encoding_of_schema(version_); }
  // The columns of a table this log has (a prefix of table_info(t).columns):
  // what a reader may SELECT. A column the log has not is NULL in every record.
  [[nodiscard]] std::span<const std::string_view> columns(Table t) const noexcept { return columns_of(t, encoding()); }
  [[nodiscard]] std::int64_t head_seq() const noexcept { return head_seq_; }
  [[nodiscard]] const Digest& head_hash() const noexcept { return head_hash_; }

  // Writer only. begin() opens a write transaction (BEGIN IMMEDIATE) and
  // refuses to go on when someone else has appended since our last commit.
  void begin();
  void commit();
  void rollback() noexcept;
  [[nodiscard]] bool in_transaction() const noexcept { return in_tx_; }

  // Appends one record in the latest encoding: `values` holds every column of
  // table_info(t).columns; sets values[0] (seq) to the next chain position and
  // canon_version to latest_encoding, computes the hash and inserts. Returns
  // the seq. Inside begin()/commit().
  std::int64_t append(Table t, std::vector<Value>& values);

 private:
  void read_head();
  void take_writer_lock();

  std::filesystem::path file_;
  OpenOptions opt_;
  sqlite3* db_ = nullptr;
  int lock_fd_ = -1;
  int version_ = 0;
  bool in_tx_ = false;
  std::int64_t head_seq_ = 0;
  Digest head_hash_{};
  std::array<Stmt, table_count> insert_;
  Hasher hasher_;
  std::vector<std::uint8_t> bytes_;
};

}  // namespace zcorr::record
