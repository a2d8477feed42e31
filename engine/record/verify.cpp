#include "record/verify.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstring>
#include <optional>

#include "io/input_error.hpp"
#include "io/text.hpp"
#include "record/checked.hpp"
#include "record/interval_calc.hpp"
#include "record/seal.hpp"

namespace zcorr::record {
namespace {

constexpr std::size_t col_index(std::span<const std::string_view> c, std::string_view name) { return column_index(c, name); }

struct Cursor {
  Table table;
  Stmt stmt;
  bool has = false;
  std::int64_t seq = 0;
};

struct Row {
  Table table;
  std::int64_t seq;
  std::vector<Value> values;  // every column of the latest encoding (NULL where the log has no such column)
  Digest prev{}, hash{};
  bool prev_ok_len = false, hash_ok_len = false;
};

// The canonical encoding a record names (canon_version; NULL = 1), or 0 when
// it names none this log can hold.
int record_encoding(const Row& r, int log_encoding) {
  const Value& v = r.values[canon_version_index(r.table)];
  if (std::holds_alternative<Null>(v)) return 1;
  if (v.index() != 1) return 0;
  const auto k = std::get<std::int64_t>(v);
  return k >= 1 && k <= log_encoding ? static_cast<int>(k) : 0;
}

bool read_digest(const Stmt& s, int c, Digest& d) {
  const auto* p = static_cast<const std::uint8_t*>(sqlite3_column_blob(s.raw(), c));
  if (sqlite3_column_type(s.raw(), c) != SQLITE_BLOB || sqlite3_column_bytes(s.raw(), c) != 32 || !p) return false;
  std::memcpy(d.data(), p, 32);
  return true;
}

std::int64_t as_i64(const Value& v) { return v.index() == 1 ? std::get<std::int64_t>(v) : 0; }
std::optional<double> as_f64(const Value& v) {
  if (v.index() == 2) return std::get<double>(v);
  if (v.index() == 1) return static_cast<double>(std::get<std::int64_t>(v));
  return std::nullopt;
}
std::string as_text(const Value& v) { return v.index() == 3 ? std::get<std::string>(v) : std::string(); }

std::int64_t row_time(const Row& r) {
  const auto& c = table_info(r.table).columns;
  for (auto name : {"start_utc_s", "time_utc_s", "valid_from_utc_s", "from_utc_s", "created_utc_s"}) {
    auto i = col_index(c, name);
    if (i < c.size()) return as_i64(r.values[i]);
  }
  return 0;
}

struct Sums {
  std::int64_t n = 0, V_f = 0, V_b = 0, V_fault = 0, E = 0, m = 0;
  std::int64_t min_start = INT64_MAX, max_end = INT64_MIN;
  bool overflow = false;
  void add(std::int64_t vf, std::int64_t vb, std::int64_t vx, std::int64_t e, std::int64_t mm, std::int64_t s, std::int64_t en) {
    ++n;
    overflow |= sat_add(V_f, vf) | sat_add(V_b, vb) | sat_add(V_fault, vx) | sat_add(E, e) | sat_add(m, mm);
    min_start = std::min(min_start, s);
    max_end = std::max(max_end, en);
  }
};

struct PointState {
  PointTotals cum;
  Sums hour, day;
};

}  // namespace

std::int64_t head_seq(const Log& log) {
  std::int64_t head = 0;
  for (std::size_t t = 0; t < table_count; ++t) {
    if (!has_table(log.schema_version(), static_cast<Table>(t))) continue;
    Stmt s(log.db(), "SELECT max(seq) FROM " + std::string(tables[t].name));
    if (s.step() && !s.is_null(0)) head = std::max(head, s.i64(0));
  }
  return head;
}

Anchor parse_anchor(std::string_view text, std::string_view field) {
  const std::string allowed = "SEQ:HASH, a chain position and the 64 hex digits of its record's hash, as `zcorr verify` prints them";
  const auto colon = text.find(':');
  if (colon == std::string_view::npos || colon == 0) throw io::InputError(std::string(field), std::string(text), allowed);
  Anchor a;
  const auto seq = text.substr(0, colon), hex = text.substr(colon + 1);
  for (const char c : seq)
    if (c < '0' || c > '9') throw io::InputError(std::string(field), std::string(text), allowed);
  if (seq.size() > 18 || hex.size() != 64) throw io::InputError(std::string(field), std::string(text), allowed);
  a.seq = std::stoll(std::string(seq));
  for (std::size_t i = 0; i < 32; ++i) {
    int v = 0;
    for (const char c : hex.substr(2 * i, 2)) {
      const int d = c >= '0' && c <= '9' ? c - '0' : c >= 'a' && c <= 'f' ? c - 'a' + 10 : c >= 'A' && c <= 'F' ? c - 'A' + 10 : -1;
      if (d < 0) throw io::InputError(std::string(field), std::string(text), allowed);
      v = v * 16 + d;
    }
    a.hash[i] = static_cast<std::uint8_t>(v);
  }
  if (a.seq < 1) throw io::InputError(std::string(field), std::string(text), allowed);
  return a;
}

VerifyResult verify_log(const Log& log, std::size_t max_findings, std::int64_t head_seq, const std::optional<Anchor>& anchor,
                        std::span<const std::uint8_t> seal_key) {
  VerifyResult out;
  sqlite3* db = log.db();
  exec(db, "BEGIN");  // one consistent snapshot while a writer may be appending
  struct EndTx {
    sqlite3* db;
    ~EndTx() { sqlite3_exec(db, "COMMIT", nullptr, nullptr, nullptr); }
  } end_tx{db};
  // The schema version of the snapshot: a writer may have upgraded the log
  // since it was opened, and its tables and columns are what is read.
  out.schema_version = read_schema_version(db);
  if (out.schema_version > latest_schema_version)
    throw LogError(log.file().string() + ": the log was upgraded to schema version " + std::to_string(out.schema_version) +
                   " while being read, newer than this zcorr understands (" + std::to_string(latest_schema_version) + ")");
  const int log_encoding = encoding_of_schema(out.schema_version);
  auto log_columns = [&](Table t) { return columns_of(t, log_encoding); };

  auto report = [&](const Row& r, std::string kind, std::string detail, std::optional<std::int64_t> dV = std::nullopt,
                    std::optional<std::int64_t> dE = std::nullopt) {
    ++out.findings_total;
    if (out.findings.size() < max_findings)
      out.findings.push_back({std::string(table_info(r.table).name), r.seq, row_time(r), std::move(kind), std::move(detail), dV, dE});
  };

  std::vector<Cursor> cursors;
  for (std::size_t t = 0; t < table_count; ++t) {
    const auto& info = tables[t];
    if (!has_table(out.schema_version, static_cast<Table>(t))) continue;  // an older log: no such table yet
    std::string sql = "SELECT ";
    for (auto c : log_columns(static_cast<Table>(t))) sql += std::string(c) + ", ";  // those the log has
    sql += "prev_hash, hash FROM " + std::string(info.name) + " WHERE seq <= ?1 ORDER BY seq";
    Cursor c{static_cast<Table>(t), Stmt(db, sql)};
    c.stmt.bind(1, head_seq);
    c.has = c.stmt.step();
    if (c.has) c.seq = c.stmt.i64(0);
    cursors.push_back(std::move(c));
  }

  Hasher hasher;
  std::vector<std::uint8_t> bytes;
  std::int64_t prev_seq = 0;
  Digest prev_hash = zero_digest;
  std::string prev_where = "the start of the log";
  Table prev_table = Table::log_header;
  std::int64_t prev_time = 0;
  std::map<std::string, PointState> points;

  const auto& ic = cols::interval;
  const std::size_t i_point = col_index(ic, "point"), i_start = col_index(ic, "start_utc_s"), i_end = col_index(ic, "end_utc_s"),
                    i_vf = col_index(ic, "V_f_m3"), i_vb = col_index(ic, "V_b_m3"), i_e = col_index(ic, "E_MJ"),
                    i_m = col_index(ic, "mass_kg"), i_rvf = col_index(ic, "V_f_um3"), i_rvb = col_index(ic, "V_b_um3"),
                    i_rvx = col_index(ic, "V_fault_um3"), i_re = col_index(ic, "E_J"), i_rm = col_index(ic, "mass_mg"),
                    i_corr = col_index(ic, "corrects_seq"), i_iflags = col_index(ic, "flags");
  const auto& qc = cols::qtr;
  const std::size_t q_point = col_index(qc, "point"), q_period = col_index(qc, "period"), q_start = col_index(qc, "start_utc_s"),
                    q_end = col_index(qc, "end_utc_s"), q_n = col_index(qc, "intervals"), q_vf = col_index(qc, "V_f_um3"),
                    q_vb = col_index(qc, "V_b_um3"), q_vx = col_index(qc, "V_fault_um3"), q_e = col_index(qc, "E_J"),
                    q_m = col_index(qc, "mass_mg"), q_cvf = col_index(qc, "cum_V_f_um3"), q_cvb = col_index(qc, "cum_V_b_um3"),
                    q_cvx = col_index(qc, "cum_V_fault_um3"), q_ce = col_index(qc, "cum_E_J"), q_cm = col_index(qc, "cum_mass_mg"),
                    q_corr = col_index(qc, "corrects_seq");

  auto read_row = [&](Cursor& c) {
    Row r{c.table, c.seq, {}};
    const auto n = log_columns(c.table).size();
    r.values.reserve(table_info(c.table).columns.size());
    for (std::size_t i = 0; i < n; ++i) r.values.push_back(c.stmt.value(static_cast<int>(i)));
    r.values.resize(table_info(c.table).columns.size());  // columns of later encodings: NULL
    r.prev_ok_len = read_digest(c.stmt, static_cast<int>(n), r.prev);
    r.hash_ok_len = read_digest(c.stmt, static_cast<int>(n) + 1, r.hash);
    c.has = c.stmt.step();
    if (c.has) c.seq = c.stmt.i64(0);
    return r;
  };

  // Why the record's hash does not stand for its contents ("" when it does):
  // it is rebuilt in the encoding the record names, over the columns that
  // encoding covers; a column it does not cover must be NULL (it did not
  // exist when the record was hashed).
  auto content_problem = [&](const Row& r) -> std::string {
    if (!r.hash_ok_len || !r.prev_ok_len) return "its prev_hash or hash is not 32 bytes: the row was changed";
    const int k = record_encoding(r, log_encoding);
    if (k == 0)
      return "it names a canonical encoding (canon_version) this log cannot hold (versions 1.." + std::to_string(log_encoding) +
             "): the row was changed";
    const std::size_t n = column_count(r.table, k);
    for (std::size_t i = n; i < r.values.size(); ++i)
      if (!std::holds_alternative<Null>(r.values[i]))
        return "its column " + std::string(table_info(r.table).columns[i]) + " holds a value, but the encoding it names (version " +
               std::to_string(k) + ") does not cover that column: the row was changed";
    canonical_bytes(r.table, k, std::span<const Value>(r.values).first(n), bytes);
    if (hasher.chain(r.prev, bytes) != r.hash) return "the stored hash does not match the record's contents: the row was changed";
    return {};
  };
  auto content_ok = [&](const Row& r) { return content_problem(r).empty(); };

  auto where = [](const Row& r) { return std::string(table_info(r.table).name) + " seq " + std::to_string(r.seq); };

  // A correction must name an earlier record of its own table.
  std::array<Stmt, table_count> exists;
  for (std::size_t t = 0; t < table_count; ++t)
    if (has_table(out.schema_version, static_cast<Table>(t)))
      exists[t] = Stmt(db, "SELECT 1 FROM " + std::string(tables[t].name) + " WHERE seq = ?");
  // A correction set's totals against the correcting intervals written since
  // the set before it (a set's records come just before it, in one transaction).
  struct SetSums {
    std::int64_t first = 0, n = 0, V_b = 0, E = 0, V_b_replaced = 0, E_replaced = 0;
  } set_sums;
  // What a correcting interval must carry over from the record it replaces:
  // the measured inputs (only the calculation may change).
  static constexpr std::string_view carried[] = {"point", "start_utc_s", "end_utc_s", "flow_time_s", "alarm_time_s", "samples",
                                                 "samples_used", "averaging", "integration", "p_avg_Pa", "T_avg_K", "pulses",
                                                 "V_ind_m3", "V_f_m3", "V_f_um3", "V_fault_um3"};
  std::string replaced_sql = "SELECT V_b_um3, E_J";
  for (auto c : carried) replaced_sql += ", " + std::string(c);
  Stmt replaced_q(db, replaced_sql + " FROM interval WHERE seq = ?");
  std::string set_point;
  const auto& cc = cols::correction_set;
  const std::size_t c_first = col_index(cc, "first_seq"), c_last = col_index(cc, "last_seq"), c_n = col_index(cc, "intervals"),
                    c_vbr = col_index(cc, "V_b_um3_replaced"), c_er = col_index(cc, "E_J_replaced"),
                    c_vbc = col_index(cc, "V_b_um3_corrected"), c_ec = col_index(cc, "E_J_corrected"),
                    c_reason = col_index(cc, "reason");
  auto check_correction = [&](const Row& r) {
    const auto& c = table_info(r.table).columns;
    const auto i = col_index(c, "corrects_seq");
    if (i >= c.size() || std::holds_alternative<Null>(r.values[i])) return;
    const auto target = as_i64(r.values[i]);
    auto& q = exists[static_cast<std::size_t>(r.table)];
    q.bind(1, target);
    const bool found = q.step();
    q.reset();
    if (!found || target >= r.seq)
      report(r, "bad_correction", "corrects_seq " + std::to_string(target) + " is not an earlier " + std::string(table_info(r.table).name) +
                                      " record");
    const auto j = col_index(c, "correction_reason");
    if (j < c.size() && as_text(r.values[j]).empty()) report(r, "bad_correction", "a correction without a correction_reason");
  };

  auto check_totals = [&](const Row& r) {
    if (r.table == Table::interval) {
      const bool correction = !std::holds_alternative<Null>(r.values[i_corr]);
      const auto vf = as_i64(r.values[i_rvf]), vb = as_i64(r.values[i_rvb]), vx = as_i64(r.values[i_rvx]),
                 e = as_i64(r.values[i_re]), m = as_i64(r.values[i_rm]);
      auto q = [](std::optional<double> v, double quantum) { return v ? to_register(*v, quantum) : std::int64_t{0}; };
      // Every stored value the totals sum: finite, not negative, inside a register's range.
      for (const std::size_t k : {i_vf, i_vb, i_e, i_m}) {
        const auto v = as_f64(r.values[k]);
        if (v && !(std::isfinite(*v) && *v >= 0 && *v < 1e15 * 1e3))
          report(r, "impossible_value", std::string(ic[k]) + " = " + io::format_sig(*v, 6) + ": not a finite, non-negative quantity a register holds");
      }
      bool bad_register = false;
      for (const std::int64_t reg : {vf, vb, vx, e, m}) bad_register |= reg < 0 || static_cast<double>(reg) > register_limit;
      if (bad_register)
        report(r, "impossible_value", "a register (V_f_um3, V_b_um3, V_fault_um3, E_J, mass_mg) is negative or beyond the register range");
      const std::int64_t dvb = bad_register ? 0 : q(as_f64(r.values[i_vb]), volume_quantum_m3) - vb,
                         de = bad_register ? 0 : q(as_f64(r.values[i_e]), 1e-6) - e;
      if (bad_register) {
        // reported above; the comparisons below would overflow
      } else if (q(as_f64(r.values[i_vf]), volume_quantum_m3) != vf)
        report(r, "register_mismatch", "V_f_um3 does not equal V_f_m3 at 1e-6 m3", dvb, de);
      else if (dvb != 0)
        report(r, "register_mismatch", "V_b_um3 does not equal V_b_m3 at 1e-6 m3", dvb, de);
      else if (de != 0)  // E_MJ in MJ, E_J in J
        report(r, "register_mismatch", "E_J does not equal E_MJ at 1 J", dvb, de);
      else if (q(as_f64(r.values[i_m]), mass_quantum_kg) != m)
        report(r, "register_mismatch", "mass_mg does not equal mass_kg at 1e-6 kg");
      else if (vx < 0 || vx > vf || vb < 0)
        report(r, "register_mismatch", "V_fault_um3 outside [0, V_f_um3] or negative V_b_um3");
      if (correction) {  // not in the recorded running totals; counted for its correction set
        if (set_sums.n == 0) set_sums.first = r.seq;
        ++set_sums.n;
        (void)(sat_add(set_sums.V_b, vb) | sat_add(set_sums.E, e));
        if (set_sums.n == 1) set_point = as_text(r.values[i_point]);
        else if (as_text(r.values[i_point]) != set_point)
          report(r, "bad_correction", "a correction set's intervals are of more than one point");
        replaced_q.bind(1, as_i64(r.values[i_corr]));
        if (replaced_q.step()) {
          (void)(sat_add(set_sums.V_b_replaced, replaced_q.i64(0)) | sat_add(set_sums.E_replaced, replaced_q.i64(1)));
          for (std::size_t k = 0; k < std::size(carried); ++k)
            if (replaced_q.value(static_cast<int>(2 + k)) != r.values[col_index(ic, carried[k])]) {
              report(r, "bad_correction", std::string(carried[k]) + " differs from the record it replaces (seq " +
                                              std::to_string(as_i64(r.values[i_corr])) + "): a correction recomputes, it does not change what was measured");
              break;
            }
        }
        replaced_q.reset();
        return;
      }
      auto& p = points[as_text(r.values[i_point])];
      const auto s = as_i64(r.values[i_start]), en = as_i64(r.values[i_end]);
      p.cum.intervals++;
      // The running sums saturate as the recorder's registers do; the recorder
      // flags every interval whose addition saturates them (iflag::overflow).
      const bool saturated = sat_add(p.cum.V_f_um3, vf) | sat_add(p.cum.V_b_um3, vb) | sat_add(p.cum.V_fault_um3, vx) |
                             sat_add(p.cum.E_J, e) | sat_add(p.cum.mass_mg, m);
      if (saturated && !(as_i64(r.values[i_iflags]) & iflag::overflow))
        report(r, "register_overflow", "the running sums of the point's intervals reach the int64 limit here, and the interval is not "
                                       "flagged overflow");
      p.hour.add(vf, vb, vx, e, m, s, en);
      p.day.add(vf, vb, vx, e, m, s, en);
    } else if (r.table == Table::qtr) {
      if (!std::holds_alternative<Null>(r.values[q_corr])) return;
      auto& p = points[as_text(r.values[q_point])];
      const bool hour = as_text(r.values[q_period]) == "hour";
      Sums& s = hour ? p.hour : p.day;
      const auto start = as_i64(r.values[q_start]), end = as_i64(r.values[q_end]);
      std::string d;
      if (as_i64(r.values[q_n]) != s.n) d = "intervals = " + std::to_string(as_i64(r.values[q_n])) + ", the log has " + std::to_string(s.n);
      else if (as_i64(r.values[q_vf]) != s.V_f) d = "V_f_um3 = " + std::to_string(as_i64(r.values[q_vf])) + ", intervals sum to " + std::to_string(s.V_f);
      else if (as_i64(r.values[q_vb]) != s.V_b) d = "V_b_um3 = " + std::to_string(as_i64(r.values[q_vb])) + ", intervals sum to " + std::to_string(s.V_b);
      else if (as_i64(r.values[q_vx]) != s.V_fault) d = "V_fault_um3 = " + std::to_string(as_i64(r.values[q_vx])) + ", intervals sum to " + std::to_string(s.V_fault);
      else if (as_i64(r.values[q_e]) != s.E) d = "E_J = " + std::to_string(as_i64(r.values[q_e])) + ", intervals sum to " + std::to_string(s.E);
      else if (as_i64(r.values[q_m]) != s.m) d = "mass_mg = " + std::to_string(as_i64(r.values[q_m])) + ", intervals sum to " + std::to_string(s.m);
      else if (as_i64(r.values[q_cvf]) != p.cum.V_f_um3 || as_i64(r.values[q_cvb]) != p.cum.V_b_um3 ||
               as_i64(r.values[q_cvx]) != p.cum.V_fault_um3 || as_i64(r.values[q_ce]) != p.cum.E_J ||
               as_i64(r.values[q_cm]) != p.cum.mass_mg)
        d = "register readings (cum_*) differ from the running sums of the intervals (cum_V_b_um3 = " +
            std::to_string(as_i64(r.values[q_cvb])) + ", intervals sum to " + std::to_string(p.cum.V_b_um3) + ")";
      else if (s.n > 0 && (s.min_start < start || s.max_end > end))
        d = "intervals since the previous " + std::string(hour ? "hourly" : "daily") + " record lie outside its period";
      const bool cum = d.rfind("register readings", 0) == 0;
      if (!d.empty())
        report(r, "total_mismatch", d, (cum ? p.cum.V_b_um3 : s.V_b) - as_i64(r.values[cum ? q_cvb : q_vb]),
               (cum ? p.cum.E_J : s.E) - as_i64(r.values[cum ? q_ce : q_e]));
      s = Sums{};
    } else if (r.table == Table::correction_set) {
      std::string d;
      const auto first = as_i64(r.values[c_first]), last = as_i64(r.values[c_last]);
      if (as_text(r.values[c_reason]).empty()) d = "a correction set without a reason";
      else if (set_sums.n > 0 && as_text(r.values[col_index(cc, "point")]) != set_point)
        d = "its point " + as_text(r.values[col_index(cc, "point")]) + " is not the point of its intervals (" + set_point + ")";
      else if (first < 1 || first > last || last >= r.seq || (set_sums.n > 0 && set_sums.first < first))
        d = "its record range " + std::to_string(first) + ".." + std::to_string(last) + " does not hold the corrections before it";
      else if (as_i64(r.values[c_n]) != set_sums.n)
        d = "intervals = " + std::to_string(as_i64(r.values[c_n])) + ", the log has " + std::to_string(set_sums.n) +
            " correcting intervals before it";
      else if (as_i64(r.values[c_vbc]) != set_sums.V_b || as_i64(r.values[c_ec]) != set_sums.E)
        d = "corrected totals V_b_um3 = " + std::to_string(as_i64(r.values[c_vbc])) + ", E_J = " + std::to_string(as_i64(r.values[c_ec])) +
            "; its intervals sum to " + std::to_string(set_sums.V_b) + ", " + std::to_string(set_sums.E);
      else if (as_i64(r.values[c_vbr]) != set_sums.V_b_replaced || as_i64(r.values[c_er]) != set_sums.E_replaced)
        d = "replaced totals V_b_um3 = " + std::to_string(as_i64(r.values[c_vbr])) + ", E_J = " + std::to_string(as_i64(r.values[c_er])) +
            "; the records it replaces sum to " + std::to_string(set_sums.V_b_replaced) + ", " + std::to_string(set_sums.E_replaced);
      if (!d.empty())
        report(r, "total_mismatch", d, set_sums.V_b - as_i64(r.values[c_vbc]), set_sums.E - as_i64(r.values[c_ec]));
      set_sums = SetSums{};
    }
  };

  for (;;) {
    // Next seq over all tables; gather every record claiming it.
    std::int64_t next = INT64_MAX;
    for (const auto& c : cursors)
      if (c.has) next = std::min(next, c.seq);
    if (next == INT64_MAX) break;
    std::vector<Row> group;
    for (auto& c : cursors)
      while (c.has && c.seq == next) group.push_back(read_row(c));
    out.records += static_cast<std::int64_t>(group.size());
    for (const auto& r : group) out.per_table[std::string(table_info(r.table).name)]++;

    // The genuine record links to the previous one and matches its hash; when
    // more than one does (a correctly hashed forgery at a seq a record holds),
    // the genuine one is the one the next record links to.
    std::size_t pick = 0;
    bool found_good = false;
    std::vector<Digest> next_prevs;
    bool next_read = false;
    for (std::size_t i = 0; i < group.size(); ++i) {
      if (!(group[i].prev == prev_hash && content_ok(group[i]))) continue;
      if (!found_good) {
        pick = i;
        found_good = true;
        continue;
      }
      if (!next_read) {  // the prev_hash of every record at the next seq, read in place
        next_read = true;
        std::int64_t after = INT64_MAX;
        for (const auto& c : cursors)
          if (c.has) after = std::min(after, c.seq);
        for (const auto& c : cursors) {
          Digest d{};
          if (c.has && c.seq == after && read_digest(c.stmt, static_cast<int>(log_columns(c.table).size()), d)) next_prevs.push_back(d);
        }
      }
      const auto linked = [&](const Row& x) { return std::find(next_prevs.begin(), next_prevs.end(), x.hash) != next_prevs.end(); };
      if (!linked(group[pick]) && linked(group[i])) pick = i;
    }
    const Row& r = group[pick];
    for (std::size_t i = 0; i < group.size(); ++i)
      if (i != pick)
        report(group[i], "inserted", "a second record claims seq " + std::to_string(next) + " (the other is " + where(r) +
                                         "): a record was inserted");
    if (next != prev_seq + 1) {
      report(r, "removed", "records seq " + std::to_string(prev_seq + 1) + ".." + std::to_string(next - 1) +
                               " are missing between " + prev_where + " and " + where(r) + ": removed");
    } else if (!found_good) {
      if (auto why = content_problem(r); !why.empty()) report(r, "changed", why);
      else {
        // The record itself is intact but does not link: the one before it was
        // changed and re-hashed. Name that one.
        ++out.findings_total;
        if (out.findings.size() < max_findings)
          out.findings.push_back({std::string(table_info(prev_table).name), prev_seq, prev_time, "link_broken",
                                  "its hash is not the prev_hash stored in " + where(r) +
                                      ": the record was changed and re-hashed, or replaced", {}, {}});
      }
    }
    if (r.table == Table::seal) {
      const auto& sc = cols::seal;
      ++out.seals;
      out.last_seal_seq = r.seq;
      out.last_seal_utc_s = as_i64(r.values[col_index(sc, "time_utc_s")]);
      const auto sealed = as_i64(r.values[col_index(sc, "sealed_seq")]);
      const Value& m = r.values[col_index(sc, "mac")];
      if (sealed != r.seq - 1) report(r, "seal_mismatch", "it seals seq " + std::to_string(sealed) + ", not the record before it");
      else if (!seal_key.empty()) {
        const std::string id = as_text(r.values[col_index(sc, "key_id")]);
        const bool mac_ok = m.index() == 4 && std::get<Blob>(m).size() == 32 &&
                            std::equal(std::get<Blob>(m).begin(), std::get<Blob>(m).end(), seal_mac(seal_key, sealed, prev_hash).begin());
        if (id != seal_key_id(seal_key))
          report(r, "seal_mismatch", "sealed under another key (key id " + id + ", the key given is " + seal_key_id(seal_key) + ")");
        else if (!mac_ok)
          report(r, "seal_mismatch", "its MAC is not that of the chain head it seals (seq " + std::to_string(sealed) +
                                         "): the records up to it were re-hashed or replaced, or the seal forged");
      }
    }
    if (anchor && next == anchor->seq && r.hash != anchor->hash)
      report(r, "anchor_mismatch", "its hash " + to_hex(r.hash) + " is not the expected " + to_hex(anchor->hash) +
                                       ": the log was re-hashed from this record or before, or replaced");
    check_totals(r);
    check_correction(r);
    prev_seq = next;
    prev_hash = r.hash;
    prev_where = where(r);
    prev_table = r.table;
    prev_time = row_time(r);
    if (r.table == Table::log_header && r.seq == 1) {
      out.log_id = as_text(r.values[1]);
      out.created_by = describe_engine_version(as_text(r.values[col_index(cols::log_header, "engine_version")]));
    }
    out.per_encoding[record_encoding(r, log_encoding)]++;
  }
  {  // a record replaced by more than one correction is counted twice in any corrected total
    Stmt d(db, "SELECT corrects_seq, count(*), max(seq) FROM interval WHERE corrects_seq IS NOT NULL AND seq <= ?1 GROUP BY corrects_seq "
               "HAVING count(*) > 1 ORDER BY corrects_seq");
    d.bind(1, head_seq);
    while (d.step()) {
      ++out.findings_total;
      if (out.findings.size() < max_findings)
        out.findings.push_back({"interval", d.i64(2), 0, "bad_correction",
                                "interval seq " + std::to_string(d.i64(0)) + " is replaced by " + std::to_string(d.i64(1)) +
                                    " corrections (a correction of a correction names the correction)", {}, {}});
    }
  }
  if (set_sums.n > 0 && has_table(out.schema_version, Table::correction_set)) {  // correcting intervals no correction set accounts for
    ++out.findings_total;
    if (out.findings.size() < max_findings)
      out.findings.push_back({"interval", set_sums.first, 0, "bad_correction",
                              std::to_string(set_sums.n) + " correcting interval(s) from seq " + std::to_string(set_sums.first) +
                                  " on belong to no correction set (a set is written last, with its records)", {}, {}});
  }
  // The no-update / no-delete triggers of every table the log has: a missing one is a finding
  // (after the records: a record changed while they were gone is the finding that names a row).
  for (std::size_t t = 0; t < table_count; ++t) {
    if (!has_table(out.schema_version, static_cast<Table>(t))) continue;
    for (const char* what : {"_no_update", "_no_delete"}) {
      const std::string name = std::string(tables[t].name) + what;
      Stmt trig(db, "SELECT 1 FROM sqlite_schema WHERE type = 'trigger' AND name = ?");
      trig.bind(1, std::string_view(name));
      if (!trig.step()) {
        ++out.findings_total;
        if (out.findings.size() < max_findings)
          out.findings.push_back({std::string(tables[t].name), 0, 0, "missing_trigger",
                                  "the trigger " + name + " is missing: the table's records can be " +
                                      (std::string_view(what) == "_no_update" ? "changed in place" : "deleted"), std::nullopt,
                                  std::nullopt});
      }
    }
  }
  out.seals_checked = !seal_key.empty();
  if (!seal_key.empty() && out.seals == 0) {
    ++out.findings_total;
    if (out.findings.size() < max_findings)
      out.findings.push_back({std::string(table_info(prev_table).name), prev_seq, prev_time, "unsealed",
                              "the log holds no seal: it was not written with this key, or it was forged", {}, {}});
  } else if (!seal_key.empty() && out.last_seal_seq != prev_seq) {
    ++out.findings_total;
    if (out.findings.size() < max_findings)
      out.findings.push_back({std::string(table_info(prev_table).name), prev_seq, prev_time, "unsealed_head",
                              "records seq " + std::to_string(out.last_seal_seq + 1) + ".." + std::to_string(prev_seq) +
                                  " follow the last seal (seq " + std::to_string(out.last_seal_seq) +
                                  "): a writer seals every transaction it commits, so records after the last seal were added "
                                  "by someone else, or newer records and their seals were removed", {}, {}});
  }
  if (anchor && prev_seq < anchor->seq) {
    ++out.findings_total;
    if (out.findings.size() < max_findings)
      out.findings.push_back({std::string(table_info(prev_table).name), prev_seq, prev_time, "removed",
                              "the log ends at seq " + std::to_string(prev_seq) + ", before the expected seq " + std::to_string(anchor->seq) +
                                  ": records " + std::to_string(prev_seq + 1) + ".." + std::to_string(anchor->seq) +
                                  " at least were removed from its end", {}, {}});
  }
  if (out.records == 0) {
    ++out.findings_total;
    out.findings.push_back({"log_header", 1, 0, "removed", "the log holds no records (the log header is missing)", {}, {}});
  }
  out.last_seq = prev_seq;
  out.head_hash = prev_hash;
  for (auto& [name, p] : points) out.points[name] = p.cum;
  return out;
}

}  // namespace zcorr::record
