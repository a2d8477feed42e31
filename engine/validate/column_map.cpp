#include "validate/column_map.hpp"

#include <fstream>
#include <set>
#include <sstream>

#include "core/components.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"

namespace zcorr::validate {
namespace {

struct Where {
  std::string_view source;
  int line;
  std::string field(std::string_view key) const {
    return "map " + std::string(source) + " line " + std::to_string(line) + " " + std::string(key);
  }
};

// "Flow Temp [degF]" -> column "Flow Temp", unit "degF".
ColumnRef column_ref(std::string_view key, std::string_view value, const Where& w) {
  ColumnRef r;
  r.key = std::string(key);
  r.map_line = w.line;
  auto v = io::trim(value);
  if (!v.empty() && v.back() == ']') {
    auto open = v.rfind('[');
    if (open == std::string_view::npos)
      throw io::InputError(w.field(key), std::string(value), "write the unit in brackets after the column, e.g. \"Temp [degF]\"");
    r.unit = std::string(io::trim(v.substr(open + 1, v.size() - open - 2)));
    v = io::trim(v.substr(0, open));
  }
  if (v.empty()) throw io::InputError(w.field(key), std::string(value), "name the column of the data file");
  r.column = std::string(v);
  return r;
}

void require_unit(const ColumnRef& r, const Where& w, std::string_view kind, std::string_view example) {
  if (r.unit.empty())
    throw io::InputError(w.field(r.key), r.column,
                         "give the " + std::string(kind) + " unit in brackets, e.g. \"" + r.column + " [" +
                             std::string(example) + "]\"");
}

bool parse_yes_no(std::string_view v, const Where& w, std::string_view key) {
  if (v == "yes" || v == "true" || v == "1") return true;
  if (v == "no" || v == "false" || v == "0") return false;
  throw io::InputError(w.field(key), std::string(v), "use yes or no");
}

double parse_ppm(std::string_view v, const Where& w, std::string_view key) {
  double x = io::parse_number(v, w.field(key));
  if (!(x >= 0.0) || x > 1e6) throw io::InputError(w.field(key), std::string(v), "a tolerance in ppm, 0 to 1000000");
  return x;
}

}  // namespace

bool ColumnMap::has_components() const noexcept {
  for (const auto& c : component)
    if (c) return true;
  return false;
}

ColumnMap parse_column_map(std::string_view text, std::string_view source) {
  ColumnMap m;
  m.source = std::string(source);
  std::set<std::string> seen;
  std::optional<ColumnRef> T, P;
  std::string analysis_text, base_T, base_p, base_preset;
  int analysis_line = 0, base_line = 0;
  bool analysis_mol_percent = false;
  Tolerances tol;
  bool any_tol = false;
  std::istringstream in{std::string(text)};
  std::string raw;
  int line = 0;
  while (std::getline(in, raw)) {
    ++line;
    const Where w{source, line};
    std::string_view s = raw;
    if (!s.empty() && s.back() == '\r') s.remove_suffix(1);
    s = io::trim(s);
    if (s.empty() || s.front() == '#') continue;
    if (auto hash = s.find(" #"); hash != std::string_view::npos) s = io::trim(s.substr(0, hash));
    const auto eq = s.find('=');
    if (eq == std::string_view::npos)
      throw io::InputError("map " + std::string(source) + " line " + std::to_string(line), std::string(s),
                           "expected key = value, e.g. \"T = Flow Temp [degF]\"");
    const std::string key(io::trim(s.substr(0, eq)));
    const std::string_view value = io::trim(s.substr(eq + 1));
    if (key.empty()) throw io::InputError(w.field("(key)"), std::string(s), "the key before '=' is empty");
    if (!seen.insert(key).second) throw io::InputError(w.field(key), std::string(value), "the key appears twice in the map");
    if (value.empty()) throw io::InputError(w.field(key), "", "the value after '=' is empty");

    if (key == "time") {
      m.time = column_ref(key, value, w);
    } else if (key == "T") {
      T = column_ref(key, value, w);
      require_unit(*T, w, "temperature", "degC");
      (void)io::parse_temperature_K("300 " + T->unit, w.field("T unit"));
    } else if (key == "P") {
      P = column_ref(key, value, w);
      require_unit(*P, w, "pressure", "psia");
      try {
        (void)io::parse_pressure_Pa("1 " + P->unit, w.field("P unit"), 0.0);
      } catch (const io::InputError&) {
        throw io::InputError(w.field("P unit"), P->unit,
                             "use Pa, kPa, MPa (absolute), kPag, MPag, bara, barg, psia or psig");
      }
    } else if (key == "atmospheric") {
      m.atmospheric_Pa = io::parse_pressure_Pa(value, w.field(key));
      if (!(*m.atmospheric_Pa > 0.0)) throw io::InputError(w.field(key), std::string(value), "must be > 0");
    } else if (key.rfind("component.", 0) == 0) {
      const auto name = key.substr(10);
      auto c = find_component(name);
      if (!c)
        throw io::InputError(w.field(key), name, "unknown component; use a canonical name or formula (methane, CO2, nC4, ...)");
      const auto i = index(*c);
      if (m.component[i])
        throw io::InputError(w.field(key), std::string(value),
                             std::string(component_name(i)) + " is already mapped (line " +
                                 std::to_string(m.component[i]->map_line) + ")");
      auto r = column_ref(key, value, w);
      if (!r.unit.empty() && r.unit != "fraction" && r.unit != "mol%")
        throw io::InputError(w.field(key + " unit"), r.unit, "use [fraction] or [mol%]");
      m.component[i] = r;
    } else if (key == "analysis") {
      analysis_text = std::string(value);
      analysis_line = line;
    } else if (key == "analysis_unit") {
      if (value == "mol%") analysis_mol_percent = true;
      else if (value != "fraction") throw io::InputError(w.field(key), std::string(value), "use fraction or mol%");
    } else if (key == "normalise") {
      m.composition.normalise = parse_yes_no(value, w, key);
    } else if (key == "sum_tolerance") {
      const double t = io::parse_number(value, w.field(key));
      if (!(t >= 0.0 && t <= 0.05)) throw io::InputError(w.field(key), std::string(value), "0 to 0.05 (mole fraction)");
      m.composition.sum_tolerance = t;
    } else if (auto q = checked_from_name(key)) {
      auto r = column_ref(key, value, w);
      if (*q == Checked::V_b) {
        require_unit(r, w, "volume", "m3");
        (void)io::parse_volume_m3("1 " + r.unit, w.field("V_b unit"));
      } else if (!r.unit.empty()) {
        throw io::InputError(w.field(key), std::string(value), "Z and C are dimensionless: give only the column");
      }
      m.reported[static_cast<std::size_t>(*q)] = r;
    } else if (key == "V_f") {
      auto r = column_ref(key, value, w);
      require_unit(r, w, "volume", "m3");
      (void)io::parse_volume_m3("1 " + r.unit, w.field("V_f unit"));
      m.V_f = r;
    } else if (key == "method") {
      m.method = std::string(value);
    } else if (key == "base") {
      base_preset = std::string(value);
      base_line = line;
    } else if (key == "base_T") {
      base_T = std::string(value);
      base_line = line;
    } else if (key == "base_p") {
      base_p = std::string(value);
      base_line = line;
    } else if (key == "tolerance_ppm") {
      const double t = parse_ppm(value, w, key);
      for (auto& v : tol.ppm) v = t;
      any_tol = true;
    } else if (key.rfind("tolerance_ppm.", 0) == 0) {
      if (!checked_from_name(key.substr(14))) throw io::InputError(w.field(key), key.substr(14), "quantities are Z_f, Z_b, C, V_b");
      any_tol = true;
    } else if (key == "format") {
      if (value != "zcorr-map 1") throw io::InputError(w.field(key), std::string(value), "this zcorr reads \"zcorr-map 1\"");
    } else {
      throw io::InputError(w.field(key), std::string(value),
                           "unknown key; keys are time, T, P, atmospheric, component.<name>, analysis, analysis_unit, "
                           "normalise, sum_tolerance, Z_f, Z_b, C, V_f, V_b, method, base, base_T, base_p, "
                           "tolerance_ppm, tolerance_ppm.<quantity>, format");
    }
  }
  // Per-quantity tolerances override the common one whatever their order.
  if (any_tol) {
    std::istringstream again{std::string(text)};
    line = 0;
    while (std::getline(again, raw)) {
      ++line;
      std::string_view s = io::trim(raw);
      if (s.empty() || s.front() == '#') continue;
      if (auto hash = s.find(" #"); hash != std::string_view::npos) s = io::trim(s.substr(0, hash));
      const auto eq = s.find('=');
      const std::string key(io::trim(s.substr(0, eq)));
      if (key.rfind("tolerance_ppm.", 0) == 0)
        tol[*checked_from_name(key.substr(14))] = parse_ppm(io::trim(s.substr(eq + 1)), Where{source, line}, key);
    }
    m.tolerances = tol;
  }

  const Where end{source, line};
  if (!T) throw io::InputError("map " + std::string(source) + " T", "(missing)", "name the temperature column, e.g. \"T = Flow Temp [degF]\"");
  if (!P) throw io::InputError("map " + std::string(source) + " P", "(missing)", "name the pressure column, e.g. \"P = Static Press [psia]\"");
  m.T = *T;
  m.P = *P;
  // A gauge unit needs the atmospheric pressure.
  try {
    (void)io::parse_pressure_Pa("1 " + m.P.unit, "P", std::nullopt);
  } catch (const io::InputError&) {
    if (!m.atmospheric_Pa)
      throw io::InputError("map " + std::string(source) + " line " + std::to_string(m.P.map_line) + " P unit", m.P.unit,
                           "a gauge pressure needs \"atmospheric = <pressure>\" in the map");
  }

  const bool any_reported = [&] {
    for (const auto& r : m.reported)
      if (r) return true;
    return false;
  }();
  if (!any_reported)
    throw io::InputError("map " + std::string(source), "(no reported figure)", "map at least one of Z_f, Z_b, C, V_b");
  if (m.reported[static_cast<std::size_t>(Checked::V_b)] && !m.V_f)
    throw io::InputError("map " + std::string(source) + " V_f", "(missing)", "checking V_b needs the line volume column V_f");

  if (!analysis_text.empty() && m.has_components())
    throw io::InputError("map " + std::string(source) + " line " + std::to_string(analysis_line) + " analysis", analysis_text,
                         "give either a fixed analysis or component columns, not both");
  if (analysis_text.empty() && !m.has_components())
    throw io::InputError("map " + std::string(source) + " composition", "(missing)",
                         "map the component columns (component.<name> = column [mol%]) or give \"analysis = ...\"");
  for (std::size_t i = 0; i < max_components; ++i)
    if (m.component[i]) {
      const auto& u = m.component[i]->unit;
      m.component_mol_percent[i] = u.empty() ? analysis_mol_percent : u == "mol%";
    }
  if (!analysis_text.empty()) {
    auto opt = m.composition;
    opt.unit = analysis_mol_percent ? io::FractionUnit::mol_percent : io::FractionUnit::mole_fraction;
    try {
      m.analysis = io::parse_composition_list(analysis_text, opt).x;
    } catch (const io::InputError& e) {
      throw io::InputError("map " + std::string(source) + " line " + std::to_string(analysis_line) + " analysis " + e.field(),
                           e.value(), e.allowed());
    }
  }

  if (!base_preset.empty() && (!base_T.empty() || !base_p.empty()))
    throw io::InputError(end.field("base"), base_preset, "give either a base preset or base_T and base_p, not both");
  if (!base_preset.empty()) {
    const auto* b = find_base_preset(base_preset);
    if (!b) {
      std::string names;
      for (const auto& x : base_presets) {
        names += ' ';
        names += x.name;
      }
      throw io::InputError(Where{source, base_line}.field("base"), base_preset, "presets are:" + names);
    }
    m.base = *b;
  } else if (!base_T.empty() || !base_p.empty()) {
    if (base_T.empty() || base_p.empty())
      throw io::InputError(Where{source, base_line}.field("base_T/base_p"), base_T + "/" + base_p, "give both");
    BaseConditions b{"custom", io::parse_temperature_K(base_T, "map base_T"), io::parse_pressure_Pa(base_p, "map base_p"), "custom"};
    if (!(b.p_Pa > 0.0)) throw io::InputError("map base_p", base_p, "must be > 0");
    m.base = b;
  }
  return m;
}

ColumnMap load_column_map(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw io::InputError("--map", path, "the file cannot be opened");
  std::stringstream ss;
  ss << in.rdbuf();
  return parse_column_map(ss.str(), path);
}

}  // namespace zcorr::validate
