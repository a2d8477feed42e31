#include "record/sql.hpp"

namespace zcorr::record {

namespace {
[[noreturn]] void fail(sqlite3* db, std::string_view what) {
  throw LogError(std::string(what) + ": " + (db ? sqlite3_errmsg(db) : "no database"));
}
}  // namespace

Stmt::Stmt(sqlite3* db, std::string_view sql) : db_(db) {
  if (sqlite3_prepare_v3(db, sql.data(), static_cast<int>(sql.size()), SQLITE_PREPARE_PERSISTENT, &s_, nullptr) != SQLITE_OK)
    fail(db, "SQLite prepare '" + std::string(sql.substr(0, 60)) + "'");
}

Stmt::~Stmt() {
  if (s_) sqlite3_finalize(s_);
}

Stmt& Stmt::operator=(Stmt&& o) noexcept {
  if (this != &o) {
    if (s_) sqlite3_finalize(s_);
    db_ = o.db_;
    s_ = o.s_;
    o.s_ = nullptr;
  }
  return *this;
}

Stmt& Stmt::bind(int i, const Value& v) {
  int rc = SQLITE_OK;
  switch (v.index()) {
    case 0: rc = sqlite3_bind_null(s_, i); break;
    case 1: rc = sqlite3_bind_int64(s_, i, std::get<std::int64_t>(v)); break;
    case 2: rc = sqlite3_bind_double(s_, i, std::get<double>(v)); break;
    case 3: {
      const auto& s = std::get<std::string>(v);
      rc = sqlite3_bind_text(s_, i, s.data(), static_cast<int>(s.size()), SQLITE_TRANSIENT);
      break;
    }
    default: {
      const auto& b = std::get<Blob>(v);
      rc = sqlite3_bind_blob(s_, i, b.data(), static_cast<int>(b.size()), SQLITE_TRANSIENT);
      break;
    }
  }
  if (rc != SQLITE_OK) fail(db_, "SQLite bind");
  return *this;
}

Stmt& Stmt::bind(int i, std::int64_t v) {
  if (sqlite3_bind_int64(s_, i, v) != SQLITE_OK) fail(db_, "SQLite bind");
  return *this;
}

Stmt& Stmt::bind(int i, std::string_view v) {
  if (sqlite3_bind_text(s_, i, v.data(), static_cast<int>(v.size()), SQLITE_TRANSIENT) != SQLITE_OK) fail(db_, "SQLite bind");
  return *this;
}

Stmt& Stmt::bind_blob(int i, const void* p, std::size_t n) {
  if (sqlite3_bind_blob(s_, i, p, static_cast<int>(n), SQLITE_TRANSIENT) != SQLITE_OK) fail(db_, "SQLite bind");
  return *this;
}

bool Stmt::step() {
  const int rc = sqlite3_step(s_);
  if (rc == SQLITE_ROW) return true;
  if (rc == SQLITE_DONE) return false;
  const std::string msg = sqlite3_errmsg(db_);
  sqlite3_reset(s_);
  throw LogError("SQLite: " + msg);
}

void Stmt::run() {
  while (step()) {
  }
  reset();
}

void Stmt::reset() {
  sqlite3_reset(s_);
  sqlite3_clear_bindings(s_);
}

std::string Stmt::text(int c) const {
  const auto* p = sqlite3_column_text(s_, c);
  return p ? std::string(reinterpret_cast<const char*>(p), static_cast<std::size_t>(sqlite3_column_bytes(s_, c))) : std::string();
}

Value Stmt::value(int c) const {
  switch (sqlite3_column_type(s_, c)) {
    case SQLITE_NULL: return Null{};
    case SQLITE_INTEGER: return i64(c);
    case SQLITE_FLOAT: return f64(c);
    case SQLITE_TEXT: return text(c);
    default: {
      const auto* p = static_cast<const std::uint8_t*>(sqlite3_column_blob(s_, c));
      const auto n = static_cast<std::size_t>(sqlite3_column_bytes(s_, c));
      return p ? Blob(p, p + n) : Blob{};
    }
  }
}

void exec(sqlite3* db, std::string_view sql) {
  char* err = nullptr;
  const std::string s(sql);
  if (sqlite3_exec(db, s.c_str(), nullptr, nullptr, &err) != SQLITE_OK) {
    std::string msg = err ? err : sqlite3_errmsg(db);
    sqlite3_free(err);
    throw LogError("SQLite: " + msg);
  }
}

}  // namespace zcorr::record
