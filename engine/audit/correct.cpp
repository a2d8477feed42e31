#include "audit/correct.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <limits>
#include <map>
#include <set>
#include <span>
#include <sstream>

#include "io/input_error.hpp"
#include "io/units_parse.hpp"
#include "record/canonical.hpp"
#include "record/interval_calc.hpp"
#include "record/sql.hpp"
#include "record/tables.hpp"
#include "record/quantities.hpp"
#include "record/timeutil.hpp"
#include "record/verify.hpp"

namespace zcorr::audit {
namespace {

std::size_t col(std::span<const std::string_view> c, std::string_view name) {
  const std::size_t i = record::column_index(c, name);
  if (i == c.size()) throw std::logic_error("correction set: no column " + std::string(name));
  return i;
}

std::string num(double v) {
  std::ostringstream s;
  s.precision(10);
  s << v;
  return s.str();
}

std::int64_t now_utc_s() {
  return std::chrono::duration_cast<std::chrono::seconds>(std::chrono::system_clock::now().time_since_epoch()).count();
}

// Bits that follow from the method and the gas; the rest (alarms, input) stay as logged.
constexpr std::int64_t method_bits = record::iflag::calc_failed | record::iflag::no_analysis | record::iflag::energy_missing |
                                     record::iflag::mass_missing | record::iflag::extrapolated | record::iflag::expanded_range |
                                     record::iflag::two_phase | record::iflag::near_dew_point;

}  // namespace

std::string describe_change(const WhatIf& w) {
  std::string d;
  auto add = [&](const std::string& s) { d += (d.empty() ? "" : "; ") + s; };
  if (w.method) add("method " + *w.method);
  if (w.base_T_K) add("base_T " + num(*w.base_T_K) + " K");
  if (w.base_p_Pa) add("base_p " + num(*w.base_p_Pa) + " Pa");
  if (w.analysis_seq) add("analysis seq " + std::to_string(*w.analysis_seq));
  return d;
}

CorrectionOutcome write_correction_set(const std::filesystem::path& file, const CorrectionRequest& req, MethodFactory methods) {
  using record::Null;
  using record::Stmt;
  using record::Table;
  using record::Value;
  if (req.point.empty()) throw io::InputError("--point", "", "the measurement point to correct");
  if (req.reason.find_first_not_of(" \t\r\n") == std::string::npos)
    throw io::InputError("--reason", req.reason, "a reason for the correction (it goes into every correcting record)");
  if (!req.change.any())
    throw io::InputError("correction", "no change", "at least one of --method, --base-T, --base-p, --analysis");
  if (req.change.method && !(methods ? methods(*req.change.method) : nullptr))
    throw io::InputError("--method", *req.change.method, "a line method of this build (zcorr z --help lists them)");
  if (req.change.base_T_K) io::check_base_T(*req.change.base_T_K, "--base-T");
  if (req.change.base_p_Pa) io::check_base_p(*req.change.base_p_Pa, "--base-p");
  if (!std::filesystem::exists(file)) throw io::InputError("--db", file.string(), "an existing interval log");

  // The writer first (it upgrades the schema), then a reader for the replay:
  // its snapshot does not see the set while it is being written.
  record::Log writer(file, {record::OpenMode::writer, record::Durability::full, false});
  if (!req.seal_key.empty()) writer.set_seal_key(req.seal_key);
  record::Log reader(file, {record::OpenMode::read_only});
  {  // never on top of a broken chain or totals that do not add up
    const auto v = record::verify_log(reader, 1);
    if (v.findings_total > 0) {
      const auto& f = v.findings.front();
      throw io::InputError("--db", file.string(),
                           "a log that verifies (zcorr verify finds " + std::to_string(v.findings_total) + " problem(s), first " +
                               f.kind + " at " + f.table + " seq " + std::to_string(f.seq) + "); a correction set is not written onto it");
    }
  }
  Replayer rp(reader, methods, {}, req.change);

  if (req.change.analysis_seq) {
    Stmt a(reader.db(), "SELECT point FROM gas_analysis WHERE seq = ?");
    a.bind(1, *req.change.analysis_seq);
    if (!a.step())
      throw io::InputError("--analysis", std::to_string(*req.change.analysis_seq), "the seq of a gas_analysis record of the log");
    if (a.text(0) != req.point)
      throw io::InputError("--analysis", std::to_string(*req.change.analysis_seq),
                           "an analysis of point " + req.point + " (this one is of point " + a.text(0) + ")");
  }

  std::set<std::int64_t> replaced;
  {
    Stmt s(reader.db(), "SELECT corrects_seq FROM interval WHERE corrects_seq IS NOT NULL AND point = ?");
    s.bind(1, std::string_view(req.point));
    while (s.step()) replaced.insert(s.i64(0));
  }
  const auto lo = req.from_utc_s.value_or(std::numeric_limits<std::int64_t>::min());
  const auto hi = req.to_utc_s.value_or(std::numeric_limits<std::int64_t>::max());
  std::int64_t total = 0;
  {
    Stmt s(reader.db(), "SELECT count(*) FROM interval WHERE point = ?1 AND end_utc_s > ?2 AND start_utc_s < ?3");
    s.bind(1, std::string_view(req.point)).bind(2, lo).bind(3, hi);
    if (s.step()) total = s.i64(0);
  }
  if (total == 0)
    throw io::InputError("--point/--from/--to", req.point, "a point and time range with recorded intervals");
  if (req.progress) req.progress(0, total);

  const std::span<const std::string_view> ic = record::cols::interval;
  const std::span<const std::string_view> pc = record::cols::point_config;
  const std::size_t i_config = col(ic, "config_seq"), i_analysis = col(ic, "analysis_seq"), i_Z_f = col(ic, "Z_f"),
                    i_Z_b = col(ic, "Z_b"), i_Fp = col(ic, "Fp"), i_Ft = col(ic, "Ft"), i_Fz = col(ic, "Fz"), i_C = col(ic, "C"),
                    i_I = col(ic, "I_m3_Pa_per_K"), i_V_b = col(ic, "V_b_m3"), i_Hs = col(ic, "Hs_MJ_per_m3"), i_E = col(ic, "E_MJ"),
                    i_rho = col(ic, "rho_f_kg_per_m3"), i_mass = col(ic, "mass_kg"), i_rV_b = col(ic, "V_b_um3"),
                    i_rE = col(ic, "E_J"), i_rm = col(ic, "mass_mg"), i_flags = col(ic, "flags"), i_status = col(ic, "calc_status"),
                    i_method = col(ic, "method"), i_version = col(ic, "engine_version"), i_corr = col(ic, "corrects_seq"),
                    i_reason = col(ic, "correction_reason");
  const std::string why = "correction set: " + req.reason;
  const bool config_changes = req.change.method || req.change.base_T_K || req.change.base_p_Pa;

  std::string sql = "SELECT " + logged_interval_columns();
  for (auto c : ic) sql += ", " + std::string(c);
  Stmt s(reader.db(), sql + " FROM interval WHERE point = ?1 AND end_utc_s > ?2 AND start_utc_s < ?3 ORDER BY start_utc_s, seq");
  s.bind(1, std::string_view(req.point)).bind(2, lo).bind(3, hi);
  const std::string lcols = logged_interval_columns();
  const int offset = static_cast<int>(std::count(lcols.begin(), lcols.end(), ',')) + 1;

  CorrectionOutcome out;
  CorrectionSetSummary& set = out.set;
  set.point = req.point;
  set.reason = req.reason;
  set.change = describe_change(req.change);
  set.created_utc_s = now_utc_s();
  std::map<std::int64_t, std::int64_t> new_config;  // config in force -> its correcting configuration
  std::int64_t last_seq = 0, done = 0;
  LoggedInterval iv;
  std::vector<Value> row(ic.size());

  writer.begin();
  try {
    while (s.step()) {
      if (req.progress && (++done & 4095) == 0) req.progress(done, total);
      read_logged_interval(s, iv);
      if (replaced.count(iv.seq)) continue;  // a later correction replaces it: correct that one
      const IntervalReplay r = rp.replay(iv);
      if (!r.replayed)
        throw io::InputError("interval seq " + std::to_string(iv.seq), record::format_time_utc(iv.start_utc_s),
                             "an interval the replay can recompute (" + r.why_not + ")");
      const std::string where = "interval seq " + std::to_string(iv.seq) + " (" + record::format_time_utc(iv.start_utc_s) + ")";
      if ((r.flags & record::iflag::calc_failed) && !(iv.flags & record::iflag::calc_failed))
        throw io::InputError(where, r.calc_status, "a state the method computes (it refuses the averaged state)");
      if ((r.flags & record::iflag::no_analysis) && !(iv.flags & record::iflag::no_analysis))
        throw io::InputError(where, r.calc_status, "a gas analysis the method can use (the recomputation would convert nothing)");
      if (iv.V_b_um3 > 0 && r.V_b_um3 == 0)
        throw io::InputError(where, r.calc_status,
                             "a recomputation that converts volume (the record converted " + record::decimal(iv.V_b_um3, 6) +
                                 " m3, the recomputation none)");

      std::int64_t config_seq = iv.config_seq;
      if (config_changes) {
        auto it = new_config.find(iv.config_seq);
        if (it == new_config.end()) {
          Stmt c(reader.db(), [&] {
            std::string q = "SELECT ";
            for (std::size_t i = 0; i < pc.size(); ++i) q += (i ? ", " : "") + std::string(pc[i]);
            return q + " FROM point_config WHERE seq = ?";
          }());
          c.bind(1, iv.config_seq);
          if (!c.step()) throw io::InputError("interval seq " + std::to_string(iv.seq), std::to_string(iv.config_seq), "a logged configuration");
          std::vector<Value> v(pc.size());
          for (std::size_t i = 0; i < v.size(); ++i) v[i] = c.value(static_cast<int>(i));
          v[0] = Null{};
          if (req.change.method) v[col(pc, "method")] = *req.change.method;
          if (req.change.base_T_K || req.change.base_p_Pa) v[col(pc, "base_name")] = std::string("custom");
          if (req.change.base_T_K) v[col(pc, "base_T_K")] = *req.change.base_T_K;
          if (req.change.base_p_Pa) v[col(pc, "base_p_Pa")] = *req.change.base_p_Pa;
          v[col(pc, "note")] = why;
          v[col(pc, "corrects_seq")] = iv.config_seq;
          v[col(pc, "correction_reason")] = why;
          v[col(pc, "engine_version")] = std::string(record::engine_version());
          const std::int64_t seq = writer.append(Table::point_config, v);
          if (!out.first_seq) out.first_seq = seq;
          std::vector<Value> e{Null{}, req.point, c.i64(2), std::string("config_change"), std::string("info"),
                               "correcting configuration seq " + std::to_string(iv.config_seq) + " (" + set.change + "): " + req.reason,
                               Null{}, seq, Null{}, Null{}, Null{}};
          last_seq = writer.append(Table::event, e);
          ++out.configs;
          it = new_config.emplace(iv.config_seq, seq).first;
        }
        config_seq = it->second;
      }

      for (std::size_t i = 0; i < row.size(); ++i) row[i] = s.value(offset + static_cast<int>(i));
      row[0] = Null{};
      row[i_config] = config_seq;
      if (req.change.analysis_seq) row[i_analysis] = *req.change.analysis_seq;
      row[i_Z_f] = record::real(r.Z_f);
      row[i_Z_b] = record::real(r.Z_b);
      row[i_Fp] = record::real(r.Fp);
      row[i_Ft] = record::real(r.Ft);
      row[i_Fz] = record::real(r.Fz);
      row[i_C] = record::real(r.C);
      row[i_I] = record::real(r.I);
      row[i_V_b] = r.V_b_m3;
      row[i_Hs] = record::real(r.Hs);
      row[i_E] = record::real(r.E_MJ);
      row[i_rho] = record::real(r.rho_f);
      row[i_mass] = record::real(r.mass_kg);
      row[i_rV_b] = r.V_b_um3;
      row[i_rE] = r.E_J;
      row[i_rm] = r.mass_mg;
      // The fault volume stays as logged, and so do the bits that say why.
      const std::int64_t kept = iv.V_fault_um3 > 0 ? (iv.flags & (record::iflag::calc_failed | record::iflag::no_analysis | record::iflag::two_phase)) : 0;
      row[i_flags] = (iv.flags & ~method_bits) | (r.flags & method_bits) | kept;
      if (r.V_b_um3 == 0 && iv.V_f_um3 > 0) ++out.unconverted;
      row[i_status] = r.calc_status;
      row[i_method] = req.change.method.value_or(iv.method);
      row[i_version] = std::string(record::engine_version());
      row[i_corr] = iv.seq;
      row[i_reason] = why;
      last_seq = writer.append(Table::interval, row);
      if (!out.first_seq) out.first_seq = last_seq;
      if (set.intervals == 0) set.from_utc_s = iv.start_utc_s;
      set.to_utc_s = std::max(set.to_utc_s, iv.end_utc_s);
      ++set.intervals;
      set.V_b_um3_replaced += iv.V_b_um3;
      set.E_J_replaced += iv.E_J;
      set.V_b_um3_corrected += r.V_b_um3;
      set.E_J_corrected += r.E_J;
    }
    if (set.intervals == 0)
      throw io::InputError("--point/--from/--to", req.point, "a range with intervals that no correction replaces yet");
    std::vector<Value> v{Null{},
                         req.point,
                         set.created_utc_s,
                         set.from_utc_s,
                         set.to_utc_s,
                         req.reason,
                         req.change.method ? Value{*req.change.method} : Value{Null{}},
                         req.change.base_T_K ? Value{*req.change.base_T_K} : Value{Null{}},
                         req.change.base_p_Pa ? Value{*req.change.base_p_Pa} : Value{Null{}},
                         req.change.analysis_seq ? Value{*req.change.analysis_seq} : Value{Null{}},
                         out.first_seq,
                         last_seq,
                         set.intervals,
                         set.V_b_um3_replaced,
                         set.E_J_replaced,
                         set.V_b_um3_corrected,
                         set.E_J_corrected,
                         std::string(record::engine_version()),
                         Null{}};  // canon_version (set by append)
    set.seq = writer.append(Table::correction_set, v);
    s.reset();
    writer.commit();
  } catch (...) {
    writer.rollback();
    throw;
  }
  (void)writer.recheck_appended();  // the correction set reads back as written (throws LogError otherwise)
  if (req.progress) req.progress(total, total);
  return out;
}

}  // namespace zcorr::audit
