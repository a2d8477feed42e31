#include "record/config.hpp"

#include <cmath>
#include <fstream>
#include <sstream>

#include "core/base_conditions.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"
#include "record/version.hpp"

namespace zcorr::record {

std::string_view averaging_name(Averaging a) noexcept {
  switch (a) {
    case Averaging::time_linear: return "time_linear";
    case Averaging::flow_linear: return "flow_linear";
    case Averaging::time_formulaic: return "time_formulaic";
    case Averaging::flow_formulaic: return "flow_formulaic";
  }
  return "flow_linear";
}

std::string_view integration_name(Integration i) noexcept {
  return i == Integration::per_sample ? "per_sample" : "average_then_correct";
}

std::vector<std::string> PointConfig::differences(const PointConfig& o) const {
  std::vector<std::string> d;
  auto cmp = [&](const char* name, bool same) {
    if (!same) d.emplace_back(name);
  };
  cmp("point", point == o.point);
  cmp("method", method == o.method);
  cmp("base", base_name == o.base_name && base_T_K == o.base_T_K && base_p_Pa == o.base_p_Pa);
  cmp("atm", atm_p_Pa == o.atm_p_Pa);
  cmp("pressure", gauge == o.gauge);
  cmp("meter", pulses == o.pulses);
  cmp("k_factor", k_factor_per_m3 == o.k_factor_per_m3);
  cmp("meter_factor", meter_factor == o.meter_factor);
  cmp("interval", interval_s == o.interval_s);
  cmp("contract_hour", contract_hour == o.contract_hour);
  cmp("utc_offset", utc_offset_min == o.utc_offset_min);
  cmp("averaging", averaging == o.averaging);
  cmp("integration", integration == o.integration);
  cmp("p_range", p_min_Pa == o.p_min_Pa && p_max_Pa == o.p_max_Pa);
  cmp("T_range", T_min_K == o.T_min_K && T_max_K == o.T_max_K);
  cmp("volume_unit", volume_unit == o.volume_unit);
  cmp("energy_unit", energy_unit == o.energy_unit);
  cmp("note", note == o.note);
  cmp("max_flow", max_flow_m3_per_h == o.max_flow_m3_per_h);
  cmp("dew_margin", dew_margin_K == o.dew_margin_K);
  return d;
}

namespace {

template <class E>
E pick(std::string_view field, std::string_view v, std::initializer_list<std::pair<std::string_view, E>> options) {
  std::string allowed = "use";
  for (const auto& [n, e] : options) {
    if (n == v) return e;
    allowed.append(" ").append(n);
  }
  throw io::InputError(std::string(field), std::string(v), allowed);
}

}  // namespace

void check_identifier(std::string_view s, std::string_view field) {
  bool ok = io::valid_utf8(s);
  for (const char c : s) ok = ok && !(static_cast<unsigned char>(c) < 0x20 || c == 0x7f);
  if (!ok) throw io::InputError(std::string(field), std::string(s), "valid UTF-8 text without control characters");
}

PointConfig parse_point_config(std::string_view text, std::string_view source) {
  PointConfig c;
  bool have_base_T = false, have_base_p = false, have_base = false;
  bool have[4] = {false, false, false, false};
  std::string base_T_text, base_p_text;
  long line_no = 0;
  std::istringstream in{std::string(text)};
  std::string line;
  while (std::getline(in, line)) {
    ++line_no;
    const auto hash = line.find('#');
    std::string_view l = io::trim(std::string_view(line).substr(0, hash));
    if (l.empty()) continue;
    const auto eq = l.find('=');
    const std::string where = std::string(source) + ":" + std::to_string(line_no);
    if (eq == std::string_view::npos) throw io::InputError(where, std::string(l), "write key = value");
    const std::string key(io::trim(l.substr(0, eq)));
    const std::string val(io::trim(l.substr(eq + 1)));
    const std::string field = where + " " + key;
    if (key == "point") c.point = val;
    else if (key == "method") c.method = val;
    else if (key == "base") {
      const auto* b = find_base_preset(val);
      if (!b) throw io::InputError(field, val, "use iso15, normal0, us60f_14.73 or us60f_14.696 (or base_T and base_p)");
      c.base_name = std::string(b->name);
      c.base_T_K = b->T_K;
      c.base_p_Pa = b->p_Pa;
      have_base = true;
    } else if (key == "base_T") { c.base_T_K = io::parse_temperature_K(val, field); have_base_T = true; }
    else if (key == "base_p") { c.base_p_Pa = io::parse_pressure_Pa(val, field); have_base_p = true; }
    else if (key == "atm") c.atm_p_Pa = io::parse_pressure_Pa(val, field);
    else if (key == "pressure") c.gauge = pick<bool>(field, val, {{"absolute", false}, {"gauge", true}});
    else if (key == "meter") c.pulses = pick<bool>(field, val, {{"volume", false}, {"pulses", true}});
    else if (key == "k_factor") c.k_factor_per_m3 = io::parse_number(val, field);
    else if (key == "meter_factor") c.meter_factor = io::parse_number(val, field);
    else if (key == "interval") {
      std::string_view v = val;
      if (v.ends_with("s")) v = io::trim(v.substr(0, v.size() - 1));
      const double s = io::parse_number(v, field);
      // At most an hour: every hourly quantity transaction record closes on whole intervals.
      if (!(s >= 1 && s <= 3600 && s == std::floor(s) && 3600 % static_cast<std::int64_t>(s) == 0))
        throw io::InputError(field, val, "a whole number of seconds dividing 3600 (e.g. 10, 60, 300, 900, 3600)");
      c.interval_s = static_cast<std::int64_t>(s);
    } else if (key == "contract_hour") {
      const double h = io::parse_number(val, field);
      if (!(h >= 0 && h <= 23 && h == std::floor(h))) throw io::InputError(field, val, "a whole hour 0..23");
      c.contract_hour = static_cast<int>(h);
    } else if (key == "utc_offset") {
      int minutes = 0;
      if (val.size() == 6 && (val[0] == '+' || val[0] == '-') && val[3] == ':') {
        const double hh = io::parse_number(val.substr(1, 2), field), mm = io::parse_number(val.substr(4, 2), field);
        minutes = static_cast<int>(hh * 60 + mm) * (val[0] == '-' ? -1 : 1);
      } else {
        const double m = io::parse_number(val, field);
        if (m != std::floor(m)) throw io::InputError(field, val, "whole minutes or +HH:MM");
        minutes = static_cast<int>(m);
      }
      if (minutes < -14 * 60 || minutes > 14 * 60) throw io::InputError(field, val, "between -14:00 and +14:00");
      c.utc_offset_min = minutes;
    } else if (key == "averaging")
      c.averaging = pick<Averaging>(field, val, {{"time_linear", Averaging::time_linear}, {"flow_linear", Averaging::flow_linear},
                                                 {"time_formulaic", Averaging::time_formulaic},
                                                 {"flow_formulaic", Averaging::flow_formulaic}});
    else if (key == "integration")
      c.integration = pick<Integration>(field, val, {{"per_sample", Integration::per_sample},
                                                     {"average_then_correct", Integration::average_then_correct}});
    else if (key == "p_min") { c.p_min_Pa = io::parse_pressure_Pa(val, field, c.atm_p_Pa); have[0] = true; }
    else if (key == "p_max") { c.p_max_Pa = io::parse_pressure_Pa(val, field, c.atm_p_Pa); have[1] = true; }
    else if (key == "T_min") { c.T_min_K = io::parse_temperature_K(val, field); have[2] = true; }
    else if (key == "T_max") { c.T_max_K = io::parse_temperature_K(val, field); have[3] = true; }
    else if (key == "volume_unit") {
      if (!io::volume_unit_m3(val)) throw io::InputError(field, val, "a volume unit: m3, ft3, Mcf");
      c.volume_unit = val;
    } else if (key == "energy_unit") {
      if (!io::energy_unit_J(val)) throw io::InputError(field, val, "an energy unit: MJ, GJ, kWh, MWh, MMBtu, therm");
      c.energy_unit = val;
    } else if (key == "note") c.note = val;
    else if (key == "max_flow") {
      std::string_view v = val;
      if (v.ends_with("m3/h")) v = io::trim(v.substr(0, v.size() - 4));
      const double f = io::parse_number(v, field);
      if (!(f > 0 && f <= 1e9)) throw io::InputError(field, val, "a flow rate above 0 and at most 1e9 m3/h");
      c.max_flow_m3_per_h = f;
    } else if (key == "dew_margin") {
      std::string_view v = val;
      if (v.ends_with("K")) v = io::trim(v.substr(0, v.size() - 1));
      const double m = io::parse_number(v, field);
      if (!(m >= 0 && m <= 50)) throw io::InputError(field, val, "a temperature difference from 0 K to 50 K");
      c.dew_margin_K = m;
    } else throw io::InputError(where, key, "unknown key (see the point configuration format in `zcorr record --help`)");
  }
  const std::string src(source);
  if (c.point.empty()) throw io::InputError(src, "point", "the configuration must name the point");
  check_identifier(c.point, src + " point");
  if (c.method.empty()) throw io::InputError(src, "method", "the configuration must name the method");
  if (have_base && (have_base_T || have_base_p)) throw io::InputError(src, "base", "give either base or base_T and base_p");
  if (have_base_T != have_base_p) throw io::InputError(src, "base_T/base_p", "give both base_T and base_p");
  if (!have_base && !have_base_T) throw io::InputError(src, "base", "the configuration must state the base conditions");
  io::check_base_T(c.base_T_K, src + " base_T");
  io::check_base_p(c.base_p_Pa, src + " base_p");
  if (!(have[0] && have[1] && have[2] && have[3]))
    throw io::InputError(src, "p_min/p_max/T_min/T_max", "state the valid pressure and temperature ranges");
  if (!(c.p_min_Pa < c.p_max_Pa) || !(c.T_min_K < c.T_max_K)) throw io::InputError(src, "ranges", "min must be below max");
  if (!(c.p_min_Pa > 0) || !(c.T_min_K > 0) || !std::isfinite(c.p_max_Pa) || !std::isfinite(c.T_max_K))
    throw io::InputError(src, "p_min/T_min", "the valid ranges must be above 0 Pa and 0 K, absolute, and finite");
  if (c.pulses && !(c.k_factor_per_m3 > 0 && c.k_factor_per_m3 <= 1e9))
    throw io::InputError(src, "k_factor", "meter = pulses needs a k_factor above 0 and at most 1e9 pulses per m3");
  if (!(c.meter_factor > 0.5 && c.meter_factor < 1.5)) throw io::InputError(src, "meter_factor", "between 0.5 and 1.5");
  if (!(c.atm_p_Pa > 50e3 && c.atm_p_Pa < 110e3)) throw io::InputError(src, "atm", "between 50 kPa and 110 kPa");
  return c;
}

PointConfig load_point_config(const std::string& path) {
  std::ifstream f(path, std::ios::binary);
  if (!f) throw io::InputError("--config", path, "the file cannot be opened");
  std::ostringstream ss;
  ss << f.rdbuf();
  return parse_point_config(ss.str(), path);
}

std::vector<Value> config_values(const PointConfig& c, std::int64_t valid_from) {
  auto opt_text = [](const std::string& s) { return s.empty() ? Value{Null{}} : Value{s}; };
  return {Null{},
          c.point,
          valid_from,
          c.method,
          c.base_name,
          real(c.base_T_K),
          real(c.base_p_Pa),
          real(c.atm_p_Pa),
          std::string(c.gauge ? "gauge" : "absolute"),
          std::string(c.pulses ? "pulses" : "volume"),
          opt_real(c.pulses, c.k_factor_per_m3),
          real(c.meter_factor),
          c.interval_s,
          std::int64_t{c.contract_hour},
          std::int64_t{c.utc_offset_min},
          std::string(averaging_name(c.averaging)),
          std::string(integration_name(c.integration)),
          real(c.p_min_Pa),
          real(c.p_max_Pa),
          real(c.T_min_K),
          real(c.T_max_K),
          c.volume_unit,
          c.energy_unit,
          opt_text(c.note),
          Null{},
          Null{},
          std::string(engine_version()),
          Null{},   // canon_version (set by Log::append)
          real(c.max_flow_m3_per_h),
          real(c.dew_margin_K)};
}

PointConfig config_from_values(const std::vector<Value>& v) {
  auto t = [&](std::size_t i) { return v[i].index() == 3 ? std::get<std::string>(v[i]) : std::string(); };
  auto f = [&](std::size_t i) {
    return v[i].index() == 2 ? std::get<double>(v[i]) : v[i].index() == 1 ? static_cast<double>(std::get<std::int64_t>(v[i])) : 0.0;
  };
  auto n = [&](std::size_t i) { return v[i].index() == 1 ? std::get<std::int64_t>(v[i]) : 0; };
  PointConfig c;
  c.point = t(1);
  c.method = t(3);
  c.base_name = t(4);
  c.base_T_K = f(5);
  c.base_p_Pa = f(6);
  c.atm_p_Pa = f(7);
  c.gauge = t(8) == "gauge";
  c.pulses = t(9) == "pulses";
  c.k_factor_per_m3 = f(10);
  c.meter_factor = f(11);
  c.interval_s = n(12);
  c.contract_hour = static_cast<int>(n(13));
  c.utc_offset_min = static_cast<int>(n(14));
  const auto a = t(15);
  c.averaging = a == "time_linear" ? Averaging::time_linear : a == "time_formulaic" ? Averaging::time_formulaic
              : a == "flow_formulaic" ? Averaging::flow_formulaic : Averaging::flow_linear;
  c.integration = t(16) == "average_then_correct" ? Integration::average_then_correct : Integration::per_sample;
  c.p_min_Pa = f(17);
  c.p_max_Pa = f(18);
  c.T_min_K = f(19);
  c.T_max_K = f(20);
  c.volume_unit = t(21);
  c.energy_unit = t(22);
  c.note = t(23);
  // max_flow_m3_per_h (encoding 3): NULL in a configuration written before schema 5.
  c.max_flow_m3_per_h = v.size() > 28 && v[28].index() == 2 ? std::get<double>(v[28]) : default_max_flow_m3_per_h;
  // dew_margin_K (encoding 4): NULL in a configuration written before schema 7.
  c.dew_margin_K = v.size() > 29 && v[29].index() == 2 ? std::get<double>(v[29]) : default_dew_margin_K;
  return c;
}

}  // namespace zcorr::record
