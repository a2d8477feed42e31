#include "cases/case_kinds.hpp"

#include <vector>
#include <utility>

#include "core/base_conditions.hpp"
#include "eval/line_method.hpp"
#include "methods/gerg2008_phase.hpp"
#include "methods/iso6976.hpp"
#include "io/composition_parse.hpp"
#include "io/input_error.hpp"
#include "io/iso6976_refs.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"

namespace zcorr::cases {
namespace {

io::CompositionOptions composition_options(const RefCase& c) {
  io::CompositionOptions opt;
  if (c.has("fraction_unit") && c.input("fraction_unit") == "mol%") opt.unit = io::FractionUnit::mol_percent;
  if (c.has("normalise") && c.input("normalise") == "yes") opt.normalise = true;
  return opt;
}

// kind = unit: `text` parsed as `quantity` (pressure | temperature | volume |
// energy), result `SI` (Pa, K, m3, J). Optional `atm` for gauge pressures.
std::map<std::string, double> kind_unit(const RefCase& c) {
  const auto& q = c.input("quantity");
  const auto& text = c.input("text");
  double v = 0.0;
  if (q == "pressure") {
    std::optional<double> atm;
    if (c.has("atm")) atm = io::parse_pressure_Pa(c.input("atm"), "atm");
    v = io::parse_pressure_Pa(text, "text", atm);
  } else if (q == "temperature") {
    v = io::parse_temperature_K(text, "text");
  } else if (q == "volume") {
    v = io::parse_volume_m3(text, "text");
  } else if (q == "energy") {
    v = io::parse_energy_J(text, "text");
  } else {
    throw io::InputError("quantity", q, "use pressure, temperature, volume or energy");
  }
  return {{"SI", v}};
}

// Evaluates a prepared method at the case's `T` and `p` (with units) and
// returns every quantity it provides, by name.
std::map<std::string, double> state_quantities(const RefCase& c, const LineMethod& method) {
  const double T = io::parse_temperature_K(c.input("T"), "T");
  const double p = io::parse_pressure_Pa(c.input("p"), "p");
  EvalOptions opt;
  opt.derived = true;
  auto out = method.state(T, p, opt);
  if (!out.status.ok()) throw io::InputError("state", c.input("T") + ", " + c.input("p"), std::string("not computed: ") + code_name(out.status.code));
  std::map<std::string, double> r;
  for (std::size_t i = 0; i < out.q.size(); ++i)
    if (out.has(static_cast<Quantity>(i))) r[std::string(quantity_names[i])] = out.q[i];
  return r;
}

// kind = state: `method`, `T`, `p` (with units), `composition`; results are
// the method's quantities by name (Z, rho_mol_per_L, B_cm3_per_mol, ...).
std::map<std::string, double> kind_state(const RefCase& c) {
  auto m = method_from_name(c.input("method"));
  if (!m) throw io::InputError("method", c.input("method"), "use gerg2008, detail, sgerg88, gross1, gross2 or iso6976 (reference conditions only)");
  auto method = make_line_method(*m);
  if (!method) throw io::InputError("method", c.input("method"), "this method is not built into this binary");
  auto comp = io::parse_composition_list(c.input("composition"), composition_options(c));
  auto st = method->prepare(comp.x);
  if (!st.ok()) throw io::InputError("composition", c.input("composition"), std::string("refused by the method: ") + code_name(st.code));
  return state_quantities(c, *method);
}

// kind = gross: `method` (sgerg88 | gross1 | gross2), gross inputs `Hs`
// (MJ/m3), `d`, `x_CO2`, `x_H2`, `x_N2` (as the method needs), `T`, `p`
// (with units); results as for kind = state.
std::map<std::string, double> kind_gross(const RefCase& c) {
  auto m = method_from_name(c.input("method"));
  if (!m || (*m != MethodId::sgerg88 && *m != MethodId::gross1 && *m != MethodId::gross2))
    throw io::InputError("method", c.input("method"), "use sgerg88, gross1 or gross2");
  auto method = make_line_method(*m);
  if (!method) throw io::InputError("method", c.input("method"), "this method is not built into this binary");
  GrossInputs g;
  auto opt_number = [&](const char* key, double& v) {
    if (c.has(key)) v = io::parse_number(c.input(key), key);
  };
  opt_number("Hs", g.Hs_MJ_per_m3);
  opt_number("d", g.d);
  opt_number("x_CO2", g.x_CO2);
  opt_number("x_H2", g.x_H2);
  opt_number("x_N2", g.x_N2);
  auto st = method->prepare_gross(g);
  if (!st.ok()) throw io::InputError("gross inputs", c.id, std::string("refused by the method: ") + code_name(st.code));
  return state_quantities(c, *method);
}

// kind = correction: line `p_f`, `T_f`, `Z_f`, base `p_b`, `T_b`, `Z_b`.
std::map<std::string, double> kind_correction(const RefCase& c) {
  const double pf = io::parse_pressure_Pa(c.input("p_f"), "p_f");
  const double Tf = io::parse_temperature_K(c.input("T_f"), "T_f");
  const double pb = io::parse_pressure_Pa(c.input("p_b"), "p_b");
  const double Tb = io::parse_temperature_K(c.input("T_b"), "T_b");
  const double Zf = io::parse_number(c.input("Z_f"), "Z_f");
  const double Zb = io::parse_number(c.input("Z_b"), "Z_b");
  auto f = correction_factors(pf, Tf, Zf, pb, Tb, Zb);
  if (!f.status.ok()) throw io::InputError("correction", c.id, code_name(f.status.code));
  return {{"Fp", f.Fp}, {"Ft", f.Ft}, {"Fz", f.Fz}, {"C", f.C}, {"Fpv", f.Fpv}};
}

// kind = iso6976: `composition`, `combustion_T`, `metering_T` (ISO 6976
// reference temperatures, e.g. "25 degC", "60 degF"), optional `metering_p`
// (default 101.325 kPa). Results are the fields of iso6976::Properties by
// name, plus doubtful_data (1 when the status carries the flag, else 0).
std::map<std::string, double> kind_iso6976(const RefCase& c) {
  auto comp = io::parse_composition_list(c.input("composition"), composition_options(c));
  const auto t1 = io::parse_combustion_ref(c.input("combustion_T"), "combustion_T");
  const auto t2 = io::parse_metering_ref(c.input("metering_T"), "metering_T");
  const double p2 = c.has("metering_p") ? io::parse_pressure_Pa(c.input("metering_p"), "metering_p") : 101325.0;
  const auto r = iso6976::properties(comp.x, t1, t2, p2);
  if (!r.status.ok()) throw io::InputError("iso6976", c.id, std::string("not computed: ") + code_name(r.status.code));
  return {{"M_g_per_mol", r.M_g_per_mol},     {"Z", r.Z},
          {"G_ideal", r.G_ideal},             {"d", r.d},
          {"rho_kg_per_m3", r.rho_kg_per_m3}, {"Hs_kJ_per_mol", r.Hs_kJ_per_mol},
          {"Hi_kJ_per_mol", r.Hi_kJ_per_mol}, {"Hs_MJ_per_kg", r.Hs_MJ_per_kg},
          {"Hi_MJ_per_kg", r.Hi_MJ_per_kg},   {"Hs_MJ_per_m3", r.Hs_MJ_per_m3},
          {"Hi_MJ_per_m3", r.Hi_MJ_per_m3},   {"Ws_MJ_per_m3", r.Ws_MJ_per_m3},
          {"Wi_MJ_per_m3", r.Wi_MJ_per_m3},   {"doubtful_data", r.status.has(flag::doubtful_data) ? 1.0 : 0.0}};
}

// kind = dew_point: `composition`, `p` (with unit); result T_dew_K, the highest hydrocarbon
// dew temperature at p of the water-free gas by GERG-2008 (methods/gerg2008_phase.hpp).
// A state above the cricondenbar (no dew point) or a failed search is an error of the case.
std::map<std::string, double> kind_dew_point(const RefCase& c) {
  auto comp = io::parse_composition_list(c.input("composition"), composition_options(c));
  const double p = io::parse_pressure_Pa(c.input("p"), "p");
  gerg2008::Prepared<double> dry;
  const auto st = gerg2008::phase::prepare_dry(comp.x, dry);
  if (!st.ok()) throw io::InputError("composition", c.input("composition"), std::string("refused: ") + code_name(st.code));
  const auto d = gerg2008::phase::dew_temperature(dry, p);
  if (d.outcome != gerg2008::phase::DewOutcome::found)
    throw io::InputError("p", c.input("p"), "a pressure with a dew point (none found: above the cricondenbar or no convergence)");
  return {{"T_dew_K", d.T_K}};
}

// The registry: one line per kind.
const std::vector<std::pair<std::string_view, KindFn>>& kinds() {
  static const std::vector<std::pair<std::string_view, KindFn>> table{
      {"unit", kind_unit},
      {"state", kind_state},
      {"gross", kind_gross},
      {"correction", kind_correction},
      {"iso6976", kind_iso6976},
      {"dew_point", kind_dew_point},
  };
  return table;
}

}  // namespace

const KindFn* find_kind(std::string_view name) {
  for (const auto& [n, f] : kinds())
    if (n == name) return &f;
  return nullptr;
}

}  // namespace zcorr::cases
