#include "record/log.hpp"

#include <fcntl.h>
#include <sys/file.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstring>
#include <fstream>
#include <random>

#include "record/seal.hpp"

namespace zcorr::record {

static_assert(encoding_schema[latest_encoding] <= latest_schema_version,
              "the columns of the latest canonical encoding need their schema migration (schema/NNN_*.sql)");

namespace {

std::int64_t now_utc_s() {
  return std::chrono::duration_cast<std::chrono::seconds>(std::chrono::system_clock::now().time_since_epoch()).count();
}

// A path as the path part of an SQLite file: URI (%, ?, # and non-ASCII
// bytes percent-encoded).
std::string uri_path(const std::filesystem::path& file) {
  static constexpr char hex[] = "0123456789ABCDEF";
  std::string out;
  for (const unsigned char c : std::filesystem::absolute(file).string()) {
    if (c == '%' || c == '?' || c == '#' || c < 0x21 || c >= 0x7f) {
      out += '%';
      out += hex[c >> 4];
      out += hex[c & 15];
    } else out += static_cast<char>(c);
  }
  return out;
}

bool has_table(sqlite3* db, std::string_view name) {
  Stmt s(db, "SELECT 1 FROM sqlite_schema WHERE type = 'table' AND name = ?");
  s.bind(1, name);
  return s.step();
}

std::string random_id() {
  std::random_device rd;
  std::array<std::uint8_t, 16> b{};
  for (auto& x : b) x = static_cast<std::uint8_t>(rd());
  return to_hex(b);
}

}  // namespace

int read_schema_version(sqlite3* db) {
  if (!has_table(db, "schema_version")) {
    Stmt any(db, "SELECT count(*) FROM sqlite_schema");
    any.step();
    if (any.i64(0) != 0) throw LogError("not a zcorr log (no schema_version table)");
    return 0;
  }
  Stmt s(db, "SELECT coalesce(max(version), 0) FROM schema_version");
  s.step();
  return static_cast<int>(s.i64(0));
}

void apply_migrations(sqlite3* db, int up_to) {
  const int current = read_schema_version(db);
  for (const auto& m : migrations) {
    if (m.version <= current || m.version > up_to) continue;
    exec(db, "BEGIN IMMEDIATE");
    try {
      exec(db, m.sql);
      Stmt ins(db, "INSERT INTO schema_version (version, name, applied_utc_s, engine_version) VALUES (?, ?, ?, ?)");
      ins.bind(1, std::int64_t{m.version}).bind(2, std::string_view(m.name)).bind(3, now_utc_s()).bind(4, std::string_view(engine_version()));
      ins.run();
      exec(db, "COMMIT");
    } catch (...) {
      sqlite3_exec(db, "ROLLBACK", nullptr, nullptr, nullptr);
      throw;
    }
  }
}

Log::Log(const std::filesystem::path& file, const OpenOptions& opt) : file_(file), opt_(opt) {
  const bool writer = opt.mode == OpenMode::writer;
  const bool exists = std::filesystem::exists(file);
  if (!exists && (!writer || !opt.create)) throw LogError(file.string() + ": no such log file");
  if (exists && !std::filesystem::is_regular_file(file)) throw LogError(file.string() + ": not a regular file");
  if (writer) {
    take_writer_lock();
    try {
      take_file_lock(!exists);
    } catch (...) {
      release_locks();
      throw;
    }
  }
  const int flags = writer ? (SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE) : SQLITE_OPEN_READONLY;
  auto open_as = [&](bool immutable) {
    const std::string uri = "file:" + uri_path(file) + (immutable ? "?immutable=1" : "");
    const int rc = sqlite3_open_v2(uri.c_str(), &db_, flags | SQLITE_OPEN_NOMUTEX | SQLITE_OPEN_URI, nullptr);
    std::string msg;
    if (rc == SQLITE_OK) {
      // Reading the schema is what needs the -shm of a WAL file: fail here, not later.
      const int q = sqlite3_exec(db_, "SELECT count(*) FROM sqlite_schema", nullptr, nullptr, nullptr);
      if (q == SQLITE_OK) return std::string();
      msg = sqlite3_errmsg(db_);
    } else msg = db_ ? sqlite3_errmsg(db_) : "out of memory";
    sqlite3_close(db_);
    db_ = nullptr;
    return msg.empty() ? std::string("unknown error") : msg;
  };
  std::string msg = open_as(false);
  if (!msg.empty() && !writer) {
    // A reader where it cannot create the -shm a WAL file needs (read-only
    // media, a folder it cannot write): when no committed record waits in a
    // -wal file, the .db alone is the whole log, opened as immutable
    // (nobody can be writing it there).
    std::error_code ec;
    const auto wal = std::filesystem::path(file.string() + "-wal");
    const auto wal_size = std::filesystem::exists(wal, ec) ? std::filesystem::file_size(wal, ec) : 0;
    if (wal_size > 0)
      msg += " (and " + wal.string() + " holds records not yet in the .db file: read the log where its -wal can be opened, "
             "or have its writer close it first)";
    else if (open_as(true).empty()) {
      immutable_ = true;
      msg.clear();
    }
  }
  if (!msg.empty()) {
    release_locks();
    throw LogError(file.string() + ": cannot open: " + msg);
  }
  try {
    sqlite3_busy_timeout(db_, 5000);
    sqlite3_extended_result_codes(db_, 1);
    try {
      version_ = read_schema_version(db_);
    } catch (const LogError& e) {
      throw LogError(file.string() + ": " + e.what());
    }
    if (version_ > latest_schema_version)
      throw LogError(file.string() + ": the log has schema version " + std::to_string(version_) +
                     ", newer than this zcorr understands (" + std::to_string(latest_schema_version) +
                     "); use a newer zcorr to read or write it");
    if (!writer && version_ == 0) throw LogError(file.string() + ": not a zcorr log (empty database)");
    if (writer) {
      exec(db_, "PRAGMA journal_mode = WAL");
      exec(db_, opt.durability == Durability::full ? "PRAGMA synchronous = FULL" : "PRAGMA synchronous = NORMAL");
      if (version_ < latest_schema_version) {
        apply_migrations(db_);
        version_ = read_schema_version(db_);
      }
      for (std::size_t t = 0; t < table_count; ++t) {
        const auto& info = tables[t];
        std::string sql = "INSERT INTO " + std::string(info.name) + " (";
        std::string qs;
        for (auto c : info.columns) {
          sql += std::string(c) + ", ";
          qs += "?, ";
        }
        sql += "prev_hash, hash) VALUES (" + qs + "?, ?)";
        insert_[t] = Stmt(db_, sql);
      }
    }
    read_head();
    if (writer && head_seq_ == 0) {
      begin();
      std::vector<Value> v{Null{},
                           random_id(),
                           now_utc_s(),
                           std::string(engine_version()),
                           "zcorr.record.v" + std::to_string(latest_encoding) + "/sha256",
                           volume_quantum_m3,
                           energy_quantum_J,
                           mass_quantum_kg,
                           Null{}};  // canon_version (set by append)
      append(Table::log_header, v);
      commit();
    }
  } catch (...) {
    for (auto& st : insert_) st = Stmt();
    sqlite3_close_v2(db_);
    db_ = nullptr;
    release_locks();
    throw;
  }
}

Log::~Log() {
  if (in_tx_) rollback();
  for (auto& s : insert_) s = Stmt();
  if (db_ && opt_.mode == OpenMode::writer) {
    // Leave a self-contained .db: every committed record moved from the WAL
    // into the file and the WAL emptied (a reader still holding the log only
    // makes this a partial checkpoint; the records stay committed either way).
    // The file stays in WAL mode (readers never block the next writer); a
    // reader on read-only media opens the self-contained .db as immutable.
    sqlite3_wal_checkpoint_v2(db_, nullptr, SQLITE_CHECKPOINT_TRUNCATE, nullptr, nullptr);
  }
  if (db_) sqlite3_close_v2(db_);
  db_ = nullptr;
  release_locks();  // after SQLite closed the file: closing our descriptor earlier would drop SQLite's locks
}

void Log::release_locks() noexcept {
  if (file_lock_fd_ >= 0) ::close(file_lock_fd_);
  file_lock_fd_ = -1;
  if (lock_fd_ >= 0) ::close(lock_fd_);
  lock_fd_ = -1;
}

void Log::take_file_lock(bool create) {
  file_lock_fd_ = ::open(file_.c_str(), O_RDWR | O_CLOEXEC | (create ? O_CREAT : 0), 0644);
  if (file_lock_fd_ < 0) throw LogError(file_.string() + ": cannot open for writing: " + std::strerror(errno));
  struct stat st {};
  if (::fstat(file_lock_fd_, &st) != 0) throw LogError(file_.string() + ": cannot stat: " + std::strerror(errno));
  if (!S_ISREG(st.st_mode)) throw LogError(file_.string() + ": not a regular file");
  if (st.st_nlink > 1)
    throw LogError(file_.string() + ": the log file has " + std::to_string(st.st_nlink) +
                   " hard links; a log is written through one name only (its journal is named after the path): "
                   "copy it, or remove the other links");
  if (::flock(file_lock_fd_, LOCK_EX | LOCK_NB) != 0)
    throw LogError(file_.string() + ": another writer is recording to this log file (through another path to the same file); "
                                    "a log has one writer at a time");
}

void Log::take_writer_lock() {
  const std::string lock_path = file_.string() + "-writer.lock";
  lock_fd_ = ::open(lock_path.c_str(), O_RDWR | O_CREAT | O_CLOEXEC, 0644);
  if (lock_fd_ < 0) throw LogError(lock_path + ": cannot open the writer lock: " + std::strerror(errno));
  if (::flock(lock_fd_, LOCK_EX | LOCK_NB) != 0) {
    char buf[32] = {};
    const auto n = ::pread(lock_fd_, buf, sizeof buf - 1, 0);
    std::string holder = n > 0 ? std::string(buf, static_cast<std::size_t>(n)) : std::string("unknown");
    while (!holder.empty() && (holder.back() == '\n' || holder.back() == ' ')) holder.pop_back();
    ::close(lock_fd_);
    lock_fd_ = -1;
    throw LogError(file_.string() + ": another writer (pid " + holder +
                   ") is recording to this log; a log has one writer at a time");
  }
  const std::string pid = std::to_string(::getpid()) + "\n";
  if (::ftruncate(lock_fd_, 0) != 0 || ::pwrite(lock_fd_, pid.data(), pid.size(), 0) < 0) {
    // The pid is only for the message; the lock itself is held.
  }
}

void Log::read_head() {
  head_seq_ = 0;
  head_hash_ = zero_digest;
  for (std::size_t t = 0; t < table_count; ++t) {
    const auto& info = tables[t];
    if (!has_table(version_, static_cast<Table>(t))) continue;  // an older log read as it is
    Stmt s(db_, "SELECT seq, hash FROM " + std::string(info.name) + " ORDER BY seq DESC LIMIT 1");
    if (s.step() && s.i64(0) > head_seq_) {
      head_seq_ = s.i64(0);
      const auto* p = static_cast<const std::uint8_t*>(sqlite3_column_blob(s.raw(), 1));
      if (p && sqlite3_column_bytes(s.raw(), 1) == 32) std::memcpy(head_hash_.data(), p, 32);
      else head_hash_ = zero_digest;
    }
  }
}

void Log::begin() {
  if (opt_.mode != OpenMode::writer) throw LogError(file_.string() + ": opened read-only");
  if (in_tx_) throw LogError("zcorr log: a transaction is already open");
  exec(db_, "BEGIN IMMEDIATE");
  in_tx_ = true;
  tx_start_head_ = head_seq_;
  const auto seq = head_seq_;
  const auto hash = head_hash_;
  read_head();
  if (seq != head_seq_ || hash != head_hash_) {
    rollback();
    throw LogError(file_.string() + ": the log was appended to by someone else (head seq " + std::to_string(head_seq_) +
                   ", expected " + std::to_string(seq) + "); refusing to interleave writers");
  }
}

void Log::set_seal_key(std::vector<std::uint8_t> key) {
  if (opt_.mode != OpenMode::writer) throw LogError(file_.string() + ": opened read-only");
  seal_key_id_ = seal_key_id(key);
  seal_key_ = std::move(key);
}

void Log::commit() {
  if (!in_tx_) return;
  if (!seal_key_.empty() && head_seq_ > tx_start_head_) {  // the transaction's last record: a seal of its head
    std::vector<Value> v{Null{}, now_utc_s(), head_seq_, seal_key_id_, Null{}, std::string(engine_version()), Null{}};
    const Digest mac = seal_mac(seal_key_, head_seq_, head_hash_);
    v[4] = Blob(mac.begin(), mac.end());
    append(Table::seal, v);
    ++seals_written_;
  }
  exec(db_, "COMMIT");
  in_tx_ = false;
}

void Log::rollback() noexcept {
  if (!in_tx_) return;
  sqlite3_exec(db_, "ROLLBACK", nullptr, nullptr, nullptr);
  in_tx_ = false;
  if (first_appended_seq_ > head_seq_) first_appended_seq_ = 0;  // nothing of ours was committed yet
  try {
    read_head();
  } catch (...) {
  }
}

std::int64_t Log::append(Table t, std::vector<Value>& values) {
  if (!in_tx_) throw LogError("zcorr log: append outside a transaction");
  const auto& info = table_info(t);
  if (values.size() != info.columns.size()) throw std::logic_error("zcorr log: wrong number of values for " + std::string(info.name));
  const std::int64_t seq = head_seq_ + 1;
  if (first_appended_seq_ == 0) {
    first_appended_seq_ = seq;
    first_appended_prev_ = head_hash_;
  }
  values[0] = seq;
  values[canon_version_index(t)] = std::int64_t{latest_encoding};
  canonical_bytes(t, latest_encoding, values, bytes_);
  const Digest h = hasher_.chain(head_hash_, bytes_);
  auto& s = insert_[static_cast<std::size_t>(t)];
  int i = 1;
  for (const auto& v : values) s.bind(i++, v);
  s.bind_blob(i++, head_hash_.data(), head_hash_.size());
  s.bind_blob(i, h.data(), h.size());
  s.run();
  head_seq_ = seq;
  head_hash_ = h;
  return seq;
}

std::int64_t Log::recheck_appended() {
  if (opt_.mode != OpenMode::writer) throw LogError(file_.string() + ": opened read-only");
  if (in_tx_) throw LogError("zcorr log: recheck_appended inside a transaction");
  if (first_appended_seq_ == 0) return 0;
  struct Rec {
    std::int64_t seq;
    Table t;
    std::vector<Value> values;
    Digest prev, hash;
  };
  std::vector<Rec> recs;
  for (std::size_t t = 0; t < table_count; ++t) {
    const auto& info = tables[t];
    std::string sql = "SELECT ";
    for (auto c : info.columns) sql += std::string(c) + ", ";
    Stmt s(db_, sql + "prev_hash, hash FROM " + std::string(info.name) + " WHERE seq >= ? ORDER BY seq");
    s.bind(1, first_appended_seq_);
    const int n = static_cast<int>(info.columns.size());
    while (s.step()) {
      Rec r{s.i64(0), static_cast<Table>(t), {}, {}, {}};
      for (int i = 0; i < n; ++i) r.values.push_back(s.value(i));
      for (int k = 0; k < 2; ++k) {
        const auto* b = static_cast<const std::uint8_t*>(sqlite3_column_blob(s.raw(), n + k));
        Digest& d = k == 0 ? r.prev : r.hash;
        if (b && sqlite3_column_bytes(s.raw(), n + k) == 32) std::memcpy(d.data(), b, 32);
        else d.fill(0xff);
      }
      recs.push_back(std::move(r));
    }
  }
  std::sort(recs.begin(), recs.end(), [](const Rec& a, const Rec& b) { return a.seq < b.seq; });
  Digest prev = first_appended_prev_;
  std::int64_t expect = first_appended_seq_;
  for (const auto& r : recs) {
    const std::string where = file_.string() + ": record seq " + std::to_string(r.seq) + " (" + std::string(table_info(r.t).name) + ")";
    if (r.seq != expect)
      throw LogError(where + ": after this writer's records seq " + std::to_string(first_appended_seq_) + ".." +
                     std::to_string(expect - 1) + " the log holds seq " + std::to_string(r.seq) + "; what was written does not read back");
    const Value& cv = r.values[canon_version_index(r.t)];
    const int k = cv.index() == 1 ? static_cast<int>(std::get<std::int64_t>(cv)) : 0;
    if (k != latest_encoding || r.prev != prev) throw LogError(where + ": does not read back as written (link or encoding)");
    canonical_bytes(r.t, latest_encoding, r.values, bytes_);
    if (hasher_.chain(prev, bytes_) != r.hash) throw LogError(where + ": does not read back as written (its hash)");
    prev = r.hash;
    ++expect;
  }
  if (expect - 1 != head_seq_ || prev != head_hash_)
    throw LogError(file_.string() + ": the records read back end at seq " + std::to_string(expect - 1) + ", this writer's head is seq " +
                   std::to_string(head_seq_));
  return static_cast<std::int64_t>(recs.size());
}

}  // namespace zcorr::record
