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
// One writer at a time, whatever the path: a writer holds an exclusive
// flock() on the database file itself (its inode: a hard link, a symlink or a
// bind mount of the same file meets the same lock; SQLite's own POSIX locks
// are not used for this, they are dropped on any close of the file) and one
// on FILE-writer.lock (it holds the writer's pid for the message, and keeps
// out writers of earlier versions). Both are released by the kernel when the
// process dies, so a killed recorder never leaves a stale lock. A log file
// with more than one hard link is refused for writing (SQLite names its -wal
// and -shm files after the path, so two names would be two journals). The
// writer checks at every begin() that the chain head is still the one it last
// wrote, and recheck_appended() re-reads what it appended before it reports
// success.
//
// Archiving: when the last writer closes, the WAL is checkpointed and
// truncated, so the .db file alone holds every committed record and can be
// copied (see schema/README.md); it stays in WAL mode. Readers open read-only; a log on read-only media, or in a folder the
// reader cannot write, with no -wal holding records, is opened as immutable.
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
  // A reader that opened the file as immutable (read-only media).
  [[nodiscard]] bool immutable() const noexcept { return immutable_; }
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

  // Writer only: from now on every commit() that appended records first
  // appends a seal of the head (record/seal.hpp) under this key.
  void set_seal_key(std::vector<std::uint8_t> key);
  [[nodiscard]] std::int64_t seals_written() const noexcept { return seals_written_; }

  // Writer only, outside a transaction: reads back every record this writer
  // appended (from the first one to the head) and checks that the seqs run on
  // one by one, each links to the one before and its hash stands for its
  // contents. Throws LogError naming the first record that does not. Returns
  // the number of records checked.
  std::int64_t recheck_appended();
  // The first seq this writer appended (0: none yet).
  [[nodiscard]] std::int64_t first_appended_seq() const noexcept { return first_appended_seq_; }

 private:
  void read_head();
  void take_writer_lock();
  void take_file_lock(bool create);
  void release_locks() noexcept;

  std::filesystem::path file_;
  OpenOptions opt_;
  sqlite3* db_ = nullptr;
  int lock_fd_ = -1;
  int file_lock_fd_ = -1;  // the database file itself, flock()ed; closed only after SQLite closed the file
  std::int64_t first_appended_seq_ = 0;
  std::vector<std::uint8_t> seal_key_;
  std::string seal_key_id_;
  std::int64_t seals_written_ = 0;
  std::int64_t tx_start_head_ = 0;
  Digest first_appended_prev_{};
  int version_ = 0;
  bool in_tx_ = false;
  bool immutable_ = false;
  std::int64_t head_seq_ = 0;
  Digest head_hash_{};
  std::array<Stmt, table_count> insert_;
  Hasher hasher_;
  std::vector<std::uint8_t> bytes_;
};

}  // namespace zcorr::record
