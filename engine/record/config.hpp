// zcorr interval log: a measurement point's configuration, its file format,
// and its record in the log.
//
// Point configuration file (our own format): `key = value` lines, '#' starts
// a comment, blank lines ignored, unknown keys refused. Quantities carry units
// (engine/io/units_parse.hpp).
//   point          = id of the measurement point                    (required)
//   method         = gerg2008 | detail | sgerg88 | gross1 | gross2  (required)
//   base           = iso15 | normal0 | us60f_14.73 | us60f_14.696   (or base_T and base_p)
//   base_T, base_p = custom base conditions, e.g. "15 degC", "101.325 kPa"
//   atm            = atmospheric pressure for gauge readings (default "101.325 kPa")
//   pressure       = absolute | gauge      how the P column is read (default absolute)
//   meter          = volume | pulses       V increments or pulse counts (default volume)
//   k_factor       = pulses per m3 of indicated volume (meter = pulses), e.g. "1000"
//   meter_factor   = dimensionless, default 1
//   interval       = interval length in s, dividing 3600 (default 60; the hourly records close on whole intervals)
//   contract_hour  = 0..23 local hour the contract day starts (default 6)
//   utc_offset     = local clock offset, "+01:00" or minutes (default 0; no daylight saving)
//   averaging      = time_linear | flow_linear | time_formulaic | flow_formulaic (default flow_linear)
//   integration    = per_sample | average_then_correct (default per_sample)
//   p_min, p_max   = valid line pressure range, absolute (required), e.g. "1 MPa", "8 MPa"
//   T_min, T_max   = valid line temperature range (required), e.g. "-10 degC", "50 degC"
//   max_flow       = the largest indicated flow rate the meter passes, m3/h after the meter factor
//                    (default 1e6, above the largest gas meters in use; common practice);
//                    a sample whose increment is above max_flow over the time it covers (the interval,
//                    or the time since the previous sample when longer) is an alarm of its interval
//                    (event bad_input, flags bad_input + alarm) and enters no register
//   dew_margin     = K above the hydrocarbon dew temperature under which a converted line state is
//                    flagged near_dew_point (default 5 K, 0 to 50; 0 turns the flag off)
//   volume_unit    = m3 | ft3 | Mcf for reports (default m3)
//   energy_unit    = MJ | GJ | kWh | MWh | MMBtu | therm for reports (default MJ)
//   note           = free text
// Refused at load (exit 2, field named): base_T outside 200..400 K, base_p
// outside 10 kPa..1 MPa (base conditions are near the atmosphere: every
// preset is 0..20 degC and about 101 kPa; common practice), a point id that is
// not valid UTF-8 or holds a control character, max_flow not in (0, 1e9] m3/h.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

#include "record/canonical.hpp"

namespace zcorr::record {

enum class Averaging { time_linear, flow_linear, time_formulaic, flow_formulaic };
enum class Integration { per_sample, average_then_correct };

[[nodiscard]] std::string_view averaging_name(Averaging a) noexcept;
[[nodiscard]] std::string_view integration_name(Integration i) noexcept;

inline constexpr double default_max_flow_m3_per_h = 1e6;
inline constexpr double default_dew_margin_K = 5.0;  // as EvalOptions::default_dew_margin_K

// Throws io::InputError naming `field` when `s` is not valid UTF-8 or holds a control character.
void check_identifier(std::string_view s, std::string_view field);

struct PointConfig {
  std::string point;
  std::string method;
  std::string base_name = "custom";
  double base_T_K = 288.15;
  double base_p_Pa = 101325.0;
  double atm_p_Pa = 101325.0;
  bool gauge = false;
  bool pulses = false;
  double k_factor_per_m3 = 0.0;
  double meter_factor = 1.0;
  std::int64_t interval_s = 60;
  int contract_hour = 6;
  int utc_offset_min = 0;
  Averaging averaging = Averaging::flow_linear;
  Integration integration = Integration::per_sample;
  double p_min_Pa = 0.0, p_max_Pa = 0.0, T_min_K = 0.0, T_max_K = 0.0;
  std::string volume_unit = "m3";
  std::string energy_unit = "MJ";
  std::string note;
  double max_flow_m3_per_h = default_max_flow_m3_per_h;
  double dew_margin_K = default_dew_margin_K;


  // Names of the settings that differ (empty: the same configuration).
  [[nodiscard]] std::vector<std::string> differences(const PointConfig& o) const;
};

// Parses a configuration file's text; throws io::InputError naming the line.
[[nodiscard]] PointConfig parse_point_config(std::string_view text, std::string_view source);
[[nodiscard]] PointConfig load_point_config(const std::string& path);

// The record's values (cols::point_config order), engine_version this
// engine's; seq and canon_version left NULL (Log::append sets them).
[[nodiscard]] std::vector<Value> config_values(const PointConfig& c, std::int64_t valid_from_utc_s);
// From a point_config row read with the column list cols::point_config, or
// the prefix of it an older log has (Log::columns).
[[nodiscard]] PointConfig config_from_values(const std::vector<Value>& v);

}  // namespace zcorr::record
