// zcorr interval log: the chained tables and the columns that enter each
// record's canonical bytes (every column except prev_hash and hash), in the
// order they are encoded. Writer and verifier both use these lists, so the
// encoding does not depend on the physical column order in the file.
//
// Versions of the canonical encoding (canonical.hpp). Every column states the
// encoding version that introduced it; the encoding of version k covers
// exactly the columns introduced at versions <= k, in the order listed, and
// its bytes start with "zcorr.record.vK". A column is only ever appended at
// the end of its table's list, so the columns of version k are a prefix of
// the list. Each chained record names the version it was hashed with in
// canon_version (NULL: version 1, the records written before schema 4); a
// column its version does not cover holds NULL. The columns of encoding k
// exist in a log from schema version encoding_schema[k] on.
//
// Adding a column (schema/README.md, "Adding to the log"): a migration
// schema/NNN_*.sql that adds it to the table, an entry {"name", K} at the end
// of the table's list below with K = latest_encoding + 1 (one new version per
// migration that adds columns: raise latest_encoding and append NNN to
// encoding_schema), and its value at the end of the writers' value lists.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <span>
#include <string_view>

namespace zcorr::record {

enum class Table : std::size_t { log_header, point_config, gas_analysis, interval, event, qtr, correction_set, seal };
inline constexpr std::size_t table_count = 8;

// The canonical encoding new records are written with.
inline constexpr int latest_encoding = 4;
// encoding_schema[k]: the schema migration that added the columns of encoding k.
inline constexpr std::array<int, latest_encoding + 1> encoding_schema{0, 1, 4, 5, 7};

struct Column {
  std::string_view name;
  int since;  // the canonical encoding version that introduced the column
};

namespace versioned {
inline constexpr Column log_header[] = {
    {"seq", 1}, {"log_id", 1}, {"created_utc_s", 1}, {"engine_version", 1}, {"hash_scheme", 1}, {"volume_quantum_m3", 1},
    {"energy_quantum_J", 1}, {"mass_quantum_kg", 1},
    {"canon_version", 2}};
inline constexpr Column point_config[] = {
    {"seq", 1}, {"point", 1}, {"valid_from_utc_s", 1}, {"method", 1}, {"base_name", 1}, {"base_T_K", 1}, {"base_p_Pa", 1},
    {"atm_p_Pa", 1}, {"pressure_input", 1}, {"meter_input", 1}, {"k_factor_per_m3", 1}, {"meter_factor", 1},
    {"interval_s", 1}, {"contract_hour", 1}, {"utc_offset_min", 1}, {"averaging", 1}, {"integration", 1}, {"p_min_Pa", 1},
    {"p_max_Pa", 1}, {"T_min_K", 1}, {"T_max_K", 1}, {"volume_unit", 1}, {"energy_unit", 1}, {"note", 1},
    {"corrects_seq", 1}, {"correction_reason", 1},
    {"engine_version", 2}, {"canon_version", 2},
    {"max_flow_m3_per_h", 3},
    {"dew_margin_K", 4}};
inline constexpr Column gas_analysis[] = {
    {"seq", 1}, {"point", 1}, {"valid_from_utc_s", 1}, {"sampled_utc_s", 1}, {"source", 1}, {"x_methane", 1},
    {"x_nitrogen", 1}, {"x_carbon_dioxide", 1}, {"x_ethane", 1}, {"x_propane", 1}, {"x_n_butane", 1}, {"x_isobutane", 1},
    {"x_n_pentane", 1}, {"x_isopentane", 1}, {"x_n_hexane", 1}, {"x_n_heptane", 1}, {"x_n_octane", 1}, {"x_n_nonane", 1},
    {"x_n_decane", 1}, {"x_hydrogen", 1}, {"x_oxygen", 1}, {"x_carbon_monoxide", 1}, {"x_water", 1},
    {"x_hydrogen_sulfide", 1}, {"x_helium", 1}, {"x_argon", 1}, {"sum_as_given", 1}, {"normalised", 1},
    {"Hs_MJ_per_m3", 1}, {"hs_ref", 1}, {"corrects_seq", 1}, {"correction_reason", 1},
    {"canon_version", 2}};
inline constexpr Column interval[] = {
    {"seq", 1}, {"point", 1}, {"config_seq", 1}, {"analysis_seq", 1}, {"start_utc_s", 1}, {"end_utc_s", 1},
    {"flow_time_s", 1}, {"alarm_time_s", 1}, {"samples", 1}, {"samples_used", 1}, {"averaging", 1}, {"integration", 1},
    {"p_avg_Pa", 1}, {"T_avg_K", 1}, {"pulses", 1}, {"V_ind_m3", 1}, {"V_f_m3", 1}, {"Z_f", 1}, {"Z_b", 1}, {"Fp", 1},
    {"Ft", 1}, {"Fz", 1}, {"C", 1}, {"I_m3_Pa_per_K", 1}, {"V_b_m3", 1}, {"Hs_MJ_per_m3", 1}, {"E_MJ", 1},
    {"rho_f_kg_per_m3", 1}, {"mass_kg", 1}, {"V_f_um3", 1}, {"V_b_um3", 1}, {"V_fault_um3", 1}, {"E_J", 1},
    {"mass_mg", 1}, {"flags", 1}, {"calc_status", 1}, {"method", 1}, {"engine_version", 1}, {"corrects_seq", 1},
    {"correction_reason", 1},
    {"canon_version", 2}};
inline constexpr Column event[] = {
    {"seq", 1}, {"point", 1}, {"time_utc_s", 1}, {"kind", 1}, {"severity", 1}, {"detail", 1}, {"input_line", 1},
    {"ref_seq", 1}, {"value", 1}, {"limit_value", 1},
    {"canon_version", 2}};
inline constexpr Column qtr[] = {
    {"seq", 1}, {"point", 1}, {"period", 1}, {"start_utc_s", 1}, {"end_utc_s", 1}, {"contract_day", 1},
    {"config_seq", 1}, {"intervals", 1}, {"flow_time_s", 1}, {"alarm_time_s", 1}, {"p_avg_Pa", 1}, {"T_avg_K", 1},
    {"Hs_avg_MJ_per_m3", 1}, {"V_f_um3", 1}, {"V_b_um3", 1}, {"V_fault_um3", 1}, {"E_J", 1}, {"mass_mg", 1},
    {"cum_V_f_um3", 1}, {"cum_V_b_um3", 1}, {"cum_V_fault_um3", 1}, {"cum_E_J", 1}, {"cum_mass_mg", 1}, {"flags", 1},
    {"corrects_seq", 1}, {"correction_reason", 1},
    {"canon_version", 2}};
inline constexpr Column correction_set[] = {
    {"seq", 1}, {"point", 1}, {"created_utc_s", 1}, {"from_utc_s", 1}, {"to_utc_s", 1}, {"reason", 1}, {"method", 1},
    {"base_T_K", 1}, {"base_p_Pa", 1}, {"analysis_seq", 1}, {"first_seq", 1}, {"last_seq", 1}, {"intervals", 1},
    {"V_b_um3_replaced", 1}, {"E_J_replaced", 1}, {"V_b_um3_corrected", 1}, {"E_J_corrected", 1},
    {"engine_version", 1},
    {"canon_version", 2}};
// Created by migration 006 with every column: every seal is in an encoding that covers them all.
inline constexpr Column seal[] = {
    {"seq", 1}, {"time_utc_s", 1}, {"sealed_seq", 1}, {"key_id", 1}, {"mac", 1}, {"engine_version", 1}, {"canon_version", 2}};
}  // namespace versioned

namespace detail {
template <std::size_t N>
constexpr std::array<std::string_view, N> names_of(const Column (&c)[N]) {
  std::array<std::string_view, N> a{};
  for (std::size_t i = 0; i < N; ++i) a[i] = c[i].name;
  return a;
}
}  // namespace detail

// The names alone (every column of the latest encoding), for the code that
// builds SQL or value lists by name.
namespace cols {
inline constexpr auto log_header = detail::names_of(versioned::log_header);
inline constexpr auto point_config = detail::names_of(versioned::point_config);
inline constexpr auto gas_analysis = detail::names_of(versioned::gas_analysis);
inline constexpr auto interval = detail::names_of(versioned::interval);
inline constexpr auto event = detail::names_of(versioned::event);
inline constexpr auto qtr = detail::names_of(versioned::qtr);
inline constexpr auto correction_set = detail::names_of(versioned::correction_set);
inline constexpr auto seal = detail::names_of(versioned::seal);
}  // namespace cols

struct TableInfo {
  std::string_view name;
  std::span<const std::string_view> columns;  // every column of the latest encoding; columns[0] is always "seq"
  std::span<const Column> versions;           // the same columns with the encoding version that introduced each
  int since_version = 1;                      // the schema migration that created the table
};

inline constexpr std::array<TableInfo, table_count> tables{{
    {"log_header", cols::log_header, versioned::log_header},
    {"point_config", cols::point_config, versioned::point_config},
    {"gas_analysis", cols::gas_analysis, versioned::gas_analysis},
    {"interval", cols::interval, versioned::interval},
    {"event", cols::event, versioned::event},
    {"qtr", cols::qtr, versioned::qtr},
    {"correction_set", cols::correction_set, versioned::correction_set, 3},
    {"seal", cols::seal, versioned::seal, 6},
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

// The newest canonical encoding whose columns a log of schema version
// `schema_version` has (0 for an empty database).
[[nodiscard]] constexpr int encoding_of_schema(int schema_version) noexcept {
  int k = 0;
  for (int v = 1; v <= latest_encoding; ++v)
    if (encoding_schema[static_cast<std::size_t>(v)] <= schema_version) k = v;
  return k;
}

// How many columns (a prefix of the table's list) the encoding of version
// `encoding` covers.
[[nodiscard]] constexpr std::size_t column_count(Table t, int encoding) noexcept {
  std::size_t n = 0;
  for (const auto& c : table_info(t).versions)
    if (c.since <= encoding) ++n;
  return n;
}

// The columns of the encoding of version `encoding` (for a log: the columns
// its schema has, encoding_of_schema(schema_version)).
[[nodiscard]] constexpr std::span<const std::string_view> columns_of(Table t, int encoding) noexcept {
  return table_info(t).columns.first(column_count(t, encoding));
}

// Where a table's canon_version column is.
[[nodiscard]] constexpr std::size_t canon_version_index(Table t) noexcept {
  return column_index(table_info(t).columns, "canon_version");
}

namespace detail {
constexpr bool well_formed() {
  if (encoding_schema[1] != 1) return false;
  for (int k = 2; k <= latest_encoding; ++k)
    if (encoding_schema[static_cast<std::size_t>(k)] <= encoding_schema[static_cast<std::size_t>(k) - 1]) return false;
  for (const auto& t : tables) {
    if (t.columns.size() != t.versions.size() || t.versions.empty() || t.versions[0].name != "seq") return false;
    int last = 1;
    for (std::size_t i = 0; i < t.versions.size(); ++i) {
      const auto& c = t.versions[i];
      // Appended only, at a known version; one name once.
      if (c.since < last || c.since > latest_encoding || t.columns[i] != c.name) return false;
      if (column_index(t.columns, c.name) != i) return false;
      last = c.since;
    }
    const auto k = column_index(t.columns, "canon_version");
    if (k == t.columns.size() || t.versions[k].since != 2) return false;
  }
  return true;
}
}  // namespace detail
static_assert(detail::well_formed(),
              "tables.hpp: columns are appended with non-decreasing versions 1..latest_encoding, each name once, and every "
              "chained table has canon_version from version 2");

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
inline constexpr std::int64_t two_phase = 1 << 12;       // a line state two-phase by the GERG-2008 phase test (alarm)
inline constexpr std::int64_t near_dew_point = 1 << 13;  // a line state within the dew margin above the dew point
inline constexpr std::int64_t overflow = 1 << 14;        // a quantity beyond its register's range: the register saturated
}  // namespace iflag

}  // namespace zcorr::record
