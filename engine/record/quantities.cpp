#include "record/quantities.hpp"

#include <cstdlib>

namespace zcorr::record {

std::vector<QuantityRecord> read_quantities(const Log& log, const std::string& point, const std::string& period) {
  Stmt s(log.db(),
         "SELECT q.seq, q.point, q.period, q.contract_day, q.start_utc_s, q.end_utc_s, q.intervals, q.flow_time_s, q.alarm_time_s, "
         "q.flags, q.p_avg_Pa, q.T_avg_K, q.Hs_avg_MJ_per_m3, q.V_f_um3, q.V_b_um3, q.V_fault_um3, q.E_J, q.mass_mg, q.cum_V_b_um3, "
         "q.cum_E_J, c.volume_unit, c.energy_unit FROM qtr q LEFT JOIN point_config c ON c.seq = q.config_seq "
         "WHERE q.period = ?1 AND (?2 = '' OR q.point = ?2) AND q.corrects_seq IS NULL ORDER BY q.seq");
  s.bind(1, std::string_view(period)).bind(2, std::string_view(point));
  std::vector<QuantityRecord> out;
  bool any_correction = false;
  {
    Stmt c(log.db(), "SELECT 1 FROM interval WHERE corrects_seq IS NOT NULL LIMIT 1");
    any_correction = c.step();
  }
  Stmt eff(log.db(),
           "SELECT coalesce(sum(V_b_um3), 0), coalesce(sum(E_J), 0), coalesce(sum(mass_mg), 0) FROM interval i WHERE point = ?1 AND "
           "start_utc_s >= ?2 AND start_utc_s < ?3 AND end_utc_s <= ?3 AND NOT EXISTS (SELECT 1 FROM interval c WHERE c.corrects_seq = i.seq)");
  while (s.step()) {
    QuantityRecord q;
    q.seq = s.i64(0);
    q.point = s.text(1);
    q.period = s.text(2);
    q.contract_day = s.text(3);
    q.start_utc_s = s.i64(4);
    q.end_utc_s = s.i64(5);
    q.intervals = s.i64(6);
    q.flow_time_s = s.i64(7);
    q.alarm_time_s = s.i64(8);
    q.flags = s.i64(9);
    q.p_avg_Pa = s.opt_f64(10);
    q.T_avg_K = s.opt_f64(11);
    q.Hs_avg_MJ_per_m3 = s.opt_f64(12);
    q.V_f_um3 = s.i64(13);
    q.V_b_um3 = s.i64(14);
    q.V_fault_um3 = s.i64(15);
    q.E_J = s.i64(16);
    q.mass_mg = s.i64(17);
    q.cum_V_b_um3 = s.i64(18);
    q.cum_E_J = s.i64(19);
    if (!s.is_null(20)) q.volume_unit = s.text(20);
    if (!s.is_null(21)) q.energy_unit = s.text(21);
    if (any_correction) {
      eff.bind(1, std::string_view(q.point)).bind(2, q.start_utc_s).bind(3, q.end_utc_s);
      if (eff.step()) {
        q.corrected = true;
        q.V_b_um3_corrected = eff.i64(0);
        q.E_J_corrected = eff.i64(1);
        q.mass_mg_corrected = eff.i64(2);
      }
      eff.reset();
    }
    out.push_back(std::move(q));
  }
  return out;
}

std::string decimal(std::int64_t v, int decimals) {
  const bool neg = v < 0;
  // Work on the magnitude as unsigned to cover INT64_MIN.
  std::uint64_t m = neg ? std::uint64_t(0) - static_cast<std::uint64_t>(v) : static_cast<std::uint64_t>(v);
  std::string digits = std::to_string(m);
  if (decimals > 0) {
    const auto d = static_cast<std::size_t>(decimals);
    if (digits.size() <= d) digits.insert(0, d + 1 - digits.size(), '0');
    digits.insert(digits.size() - d, 1, '.');
  }
  return neg ? "-" + digits : digits;
}

}  // namespace zcorr::record
