// zcorr interval log: reading the quantity transaction records back.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "record/log.hpp"

namespace zcorr::record {

struct QuantityRecord {
  std::int64_t seq = 0;
  std::string point, period, contract_day;
  std::int64_t start_utc_s = 0, end_utc_s = 0, intervals = 0, flow_time_s = 0, alarm_time_s = 0, flags = 0;
  std::optional<double> p_avg_Pa, T_avg_K, Hs_avg_MJ_per_m3;
  std::int64_t V_f_um3 = 0, V_b_um3 = 0, V_fault_um3 = 0, E_J = 0, mass_mg = 0;
  std::int64_t cum_V_b_um3 = 0, cum_E_J = 0;
  std::string volume_unit = "m3", energy_unit = "MJ";  // of the configuration in force
  // With correction sets in the log: the period's totals over the intervals
  // no correction replaces (the record itself stays as recorded).
  bool corrected = false;
  std::int64_t V_b_um3_corrected = 0, E_J_corrected = 0, mass_mg_corrected = 0;
};

// Records of `period` ("hour" or "day"), in chain order; all points when point
// is empty. When any interval of the log is a correction, every record also
// carries its corrected totals.
[[nodiscard]] std::vector<QuantityRecord> read_quantities(const Log& log, const std::string& point, const std::string& period);

// An integer register as a decimal text of its SI quantity, exactly:
// decimal(123456789, 6) = "123.456789".
[[nodiscard]] std::string decimal(std::int64_t v, int decimals);

}  // namespace zcorr::record
