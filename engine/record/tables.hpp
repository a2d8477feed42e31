// zcorr interval log: the chained tables and the columns that enter each
// record's canonical bytes (every column except prev_hash and hash), in the
// order they are encoded. Writer and verifier both use these lists, so the
// encoding does not depend on the physical column order in the file.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <span>
#include <string_view>

namespace zcorr::record {

enum class Table : std::size_t { log_header, point_config, gas_analysis, interval, event, qtr, correction_set };
inline constexpr std::size_t table_count = 7;

namespace cols {
inline constexpr std::string_view log_header[] = {
    "seq", "log_id", "created_utc_s", "engine_version", "hash_scheme", "volume_quantum_m3", "energy_quantum_J",
    "mass_quantum_kg"};
inline constexpr std::string_view point_config[] = {
    "seq", "point", "valid_from_utc_s", "method", "base_name", "base_T_K", "base_p_Pa", "atm_p_Pa",
    "pressure_input", "meter_input", "k_factor_per_m3", "meter_factor", "interval_s", "contract_hour",
    "utc_offset_min", "averaging", "integration", "p_min_Pa", "p_max_Pa", "T_min_K", "T_max_K", "volume_unit",
    "energy_unit", "note", "corrects_seq", "correction_reason"};
inline constexpr std::string_view gas_analysis[] = {
    "seq", "point", "valid_from_utc_s", "sampled_utc_s", "source", "x_methane", "x_nitrogen", "x_carbon_dioxide",
    "x_ethane", "x_propane", "x_n_butane", "x_isobutane", "x_n_pentane", "x_isopentane", "x_n_hexane",
    "x_n_heptane", "x_n_octane", "x_n_nonane", "x_n_decane", "x_hydrogen", "x_oxygen", "x_carbon_monoxide",
    "x_water", "x_hydrogen_sulfide", "x_helium", "x_argon", "sum_as_given", "normalised", "Hs_MJ_per_m3",
    "hs_ref", "corrects_seq", "correction_reason"};
inline constexpr std::string_view interval[] = {
    "seq", "point", "config_seq", "analysis_seq", "start_utc_s", "end_utc_s", "flow_time_s", "alarm_time_s",
    "samples", "samples_used", "averaging", "integration", "p_avg_Pa", "T_avg_K", "pulses", "V_ind_m3", "V_f_m3",
    "Z_f", "Z_b", "Fp", "Ft", "Fz", "C", "I_m3_Pa_per_K", "V_b_m3", "Hs_MJ_per_m3", "E_MJ", "rho_f_kg_per_m3",
    "mass_kg", "V_f_um3", "V_b_um3", "V_fault_um3", "E_J", "mass_mg", "flags", "calc_status", "method",
    "engine_version", "corrects_seq", "correction_reason"};
inline constexpr std::string_view event[] = {
    "seq", "point", "time_utc_s", "kind", "severity", "detail", "input_line", "ref_seq", "value", "limit_value"};
inline constexpr std::string_view qtr[] = {
    "seq", "point", "period", "start_utc_s", "end_utc_s", "contract_day", "config_seq", "intervals", "flow_time_s",
    "alarm_time_s", "p_avg_Pa", "T_avg_K", "Hs_avg_MJ_per_m3", "V_f_um3", "V_b_um3", "V_fault_um3", "E_J",
    "mass_mg", "cum_V_f_um3", "cum_V_b_um3", "cum_V_fault_um3", "cum_E_J", "cum_mass_mg", "flags", "corrects_seq",
    "correction_reason"};
inline constexpr std::string_view correction_set[] = {
    "seq", "point", "created_utc_s", "from_utc_s", "to_utc_s", "reason", "method", "base_T_K", "base_p_Pa",
    "analysis_seq", "first_seq", "last_seq", "intervals", "V_b_um3_replaced", "E_J_replaced", "V_b_um3_corrected",
    "E_J_corrected", "engine_version"};
}  // namespace cols

struct TableInfo {
  std::string_view name;
  std::span<const std::string_view> columns;  // columns[0] is always "seq"
  int since_version = 1;                      // the schema migration that created the table
};

inline constexpr std::array<TableInfo, table_count> tables{{
    {"log_header", cols::log_header},
    {"point_config", cols::point_config},
    {"gas_analysis", cols::gas_analysis},
    {"interval", cols::interval},
    {"event", cols::event},
    {"qtr", cols::qtr},
    {"correction_set", cols::correction_set, 3},
}};

// Position of a column in a table's list (columns.size() when absent).
[[nodiscard]] constexpr std::size_t column_index(std::span<const std::string_view> columns, std::string_view name) noexcept {
  for (std::size_t i = 0; i < columns.size(); ++i)
    if (columns[i] == name) return i;
  return columns.size();
}

// Whether a log of schema version `version` has the table.
[[nodiscard]] constexpr bool has_table(int version, Table t) noexcept {
  return version >= tables[static_cast<std::size_t>(t)].since_version;
}

[[nodiscard]] constexpr const TableInfo& table_info(Table t) noexcept { return tables[static_cast<std::size_t>(t)]; }

// Interval (and period) status bits, stored in interval.flags / qtr.flags.
namespace iflag {
inline constexpr std::int64_t alarm = 1 << 0;            // some of the interval had the conversion stopped
inline constexpr std::int64_t p_out_of_range = 1 << 1;   // a pressure sample outside [p_min, p_max] or unreadable
inline constexpr std::int64_t T_out_of_range = 1 << 2;   // a temperature sample outside [T_min, T_max] or unreadable
inline constexpr std::int64_t no_flow = 1 << 3;          // no sample with flow: averages are flow-independent
inline constexpr std::int64_t calc_failed = 1 << 4;      // the method refused a state (see calc_status)
inline constexpr std::int64_t no_analysis = 1 << 5;      // no gas analysis in force: nothing converted
inline constexpr std::int64_t energy_missing = 1 << 6;   // no Hs in the analysis: energy not computed
inline constexpr std::int64_t mass_missing = 1 << 7;     // the method gives no mass density: mass not computed
inline constexpr std::int64_t bad_input = 1 << 8;        // an input row could not be read (see events)
inline constexpr std::int64_t gap = 1 << 9;              // a sample covered more than one interval (data gap)
inline constexpr std::int64_t extrapolated = 1 << 10;    // the method computed outside its range on request
inline constexpr std::int64_t expanded_range = 1 << 11;  // a state in the method's expanded range only
}  // namespace iflag

}  // namespace zcorr::record
