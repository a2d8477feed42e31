// zcorr interval log: a thin RAII layer over the SQLite C API. Every failure
// becomes a LogError carrying SQLite's message.
#pragma once

#include <sqlite3.h>

#include <cstdint>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>

#include "record/canonical.hpp"

namespace zcorr::record {

// The log cannot be opened, read or written, or is refused (newer schema,
// another writer, not a zcorr log). The message names the file and the reason.
class LogError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

class Stmt {
 public:
  Stmt() = default;
  Stmt(sqlite3* db, std::string_view sql);
  ~Stmt();
  Stmt(Stmt&& o) noexcept : db_(o.db_), s_(o.s_) { o.s_ = nullptr; }
  Stmt& operator=(Stmt&& o) noexcept;
  Stmt(const Stmt&) = delete;
  Stmt& operator=(const Stmt&) = delete;

  Stmt& bind(int i, const Value& v);  // 1-based
  Stmt& bind(int i, std::int64_t v);
  Stmt& bind(int i, std::string_view v);
  Stmt& bind_blob(int i, const void* p, std::size_t n);
  bool step();   // true: a row is available; false: done
  void run();    // step to completion, then reset
  void reset();

  [[nodiscard]] bool is_null(int c) const { return sqlite3_column_type(s_, c) == SQLITE_NULL; }
  [[nodiscard]] std::int64_t i64(int c) const { return sqlite3_column_int64(s_, c); }
  [[nodiscard]] double f64(int c) const { return sqlite3_column_double(s_, c); }
  [[nodiscard]] std::string text(int c) const;
  [[nodiscard]] std::optional<std::int64_t> opt_i64(int c) const { return is_null(c) ? std::nullopt : std::optional(i64(c)); }
  [[nodiscard]] std::optional<double> opt_f64(int c) const { return is_null(c) ? std::nullopt : std::optional(f64(c)); }
  // The column as a canonical Value (by its stored type).
  [[nodiscard]] Value value(int c) const;
  [[nodiscard]] sqlite3_stmt* raw() const noexcept { return s_; }

 private:
  sqlite3* db_ = nullptr;
  sqlite3_stmt* s_ = nullptr;
};

// Runs one or more statements without results.
void exec(sqlite3* db, std::string_view sql);

}  // namespace zcorr::record
