// zcorr convert: one metered volume at line conditions to base conditions,
// with each correction factor, energy and mass.
#include <iostream>
#include <memory>

#include <nlohmann/json.hpp>

#include "base_options.hpp"
#include "commands.hpp"
#include "common.hpp"
#include "eval/conversion.hpp"
#include "io/input_error.hpp"
#include "io/iso6976_refs.hpp"
#include "iso6976_provenance.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"
#include "method_options.hpp"

namespace zcorr::cli {
namespace {

struct ConvertOptions {
  MethodOptions method;
  GasOptions gas;
  BaseOptions base;
  std::string V, T, p, atm;
  std::optional<double> zf, zb;
  std::string zb_from;  // method | iso6976
  std::string combustion;
  std::string energy_unit = "MJ";
  std::string volume_unit = "m3";
  bool method_given = false;
  Format format = Format::text;
};

int run_convert(const ConvertOptions& o) {
  if (o.V.empty() || o.T.empty() || o.p.empty())
    throw io::InputError("--V/--T/--p", o.V + "/" + o.T + "/" + o.p, "give the metered volume and the line temperature and pressure");
  std::optional<double> atm;
  if (!o.atm.empty()) atm = io::parse_pressure_Pa(o.atm, "--atm");
  const double V_f = io::parse_volume_m3(o.V, "--V");
  if (V_f < 0.0) throw io::InputError("--V", o.V, "the metered volume must be >= 0");
  const double T_f = io::parse_temperature_K(o.T, "--T");
  const double p_f = io::parse_pressure_Pa(o.p, "--p", atm);
  if (!(p_f > 0.0)) throw io::InputError("--p", o.p, "the line pressure must be > 0");
  const auto base = o.base.resolve();
  const auto vunit = io::volume_unit_m3(o.volume_unit);
  if (!vunit) throw io::InputError("--volume-unit", o.volume_unit, "use m3, L, ft3 or Mcf");
  const auto eunit = io::energy_unit_J(o.energy_unit);
  if (!eunit) throw io::InputError("--energy-unit", o.energy_unit, "use J, kJ, MJ, GJ, kWh, MWh, Btu, MMBtu, therm or Dth");

  ConverterSetup setup;
  setup.base = base;
  setup.combustion = o.combustion.empty() ? default_combustion_for(base.T_K) : io::parse_combustion_ref(o.combustion, "--combustion-ref");
  setup.eval = o.method.eval_options(false);
  std::optional<io::ParsedComposition> comp;
  if (o.gas.given()) {
    comp = o.gas.load();
    setup.gas = comp->x;
  }
  std::unique_ptr<LineMethod> method;
  if (!o.zf || o.method_given) {
    if (!comp) throw io::InputError("--gas", "", "a line method needs the gas analysis (or give --zf and --zb)");
    method = o.method.make();
    auto st = method->prepare(comp->x);
    if (!st.ok()) throw io::InputError("--gas", comp->provenance(), std::string("refused by ") + o.method.method + ": " + status_text(st));
    setup.method = method.get();
  }
  if (o.zb) {
    setup.zb_source = ZbSource::given;
    setup.Zb_given = *o.zb;
  } else if (o.zb_from == "iso6976" || (!method)) {
    setup.zb_source = ZbSource::iso6976;
  } else {
    setup.zb_source = ZbSource::method;
  }
  Converter conv(setup);
  if (!conv.status().ok())
    throw io::InputError("base conditions", std::string(base.name), std::string(conv.setup_message()) + " (" + status_text(conv.status()) + ")");
  auto c = conv.convert(V_f, T_f, p_f, o.zf);
  if (!c.status.ok()) {
    std::cerr << "zcorr convert: Z_f not computed: " << status_text(c.status) << '\n';
    return exit_partial;
  }
  const double Vb_out = c.V_b_m3 / *vunit;
  const double E_out = c.energy_MJ * 1e6 / *eunit;
  const std::string hs_note = std::isnan(c.Hs_MJ_per_m3)
                                  ? "not available (needs a gas analysis and a base temperature of 0, 15, 15.55 or 20 degC)"
                                  : "ISO 6976, combustion " + std::string(combustion_ref_name(setup.combustion)) + ", metering at base conditions";
  if (o.format == Format::json) {
    nlohmann::json j;
    j["line"] = {{"V_m3", V_f}, {"T_K", T_f}, {"P_kPa", p_f / 1000.0}};
    j["base"] = {{"name", base.name}, {"T_K", base.T_K}, {"P_kPa", base.p_Pa / 1000.0}};
    j["Z_f"] = c.Z_f;
    j["Z_f_source"] = c.z_f_source;
    j["Z_b"] = c.Z_b;
    j["Z_b_source"] = c.z_b_source;
    j["Fp"] = c.factors.Fp;
    j["Ft"] = c.factors.Ft;
    j["Fz"] = c.factors.Fz;
    j["C"] = c.factors.C;
    j["Fpv"] = c.factors.Fpv;
    j["V_b"] = Vb_out;
    j["volume_unit"] = o.volume_unit;
    if (!std::isnan(c.energy_MJ)) { j["energy"] = E_out; j["energy_unit"] = o.energy_unit; j["Hs_MJ_per_m3"] = c.Hs_MJ_per_m3; }
    j["Hs_source"] = hs_note;
    if (comp) j["Hs_doubtful_rows"] = doubtful_rows_text(iso6976::doubtful_components(comp->x, setup.combustion));
    if (!std::isnan(c.mass_kg)) j["mass_kg"] = c.mass_kg;
    j["status"] = status_text(c.status);
    if (comp) j["composition_provenance"] = comp->provenance();
    std::cout << json_text(j) << '\n';
    return exit_ok;
  }
  if (o.format == Format::csv) {
    std::cout << "V_f_m3,T_f_K,P_f_kPa,base,T_b_K,P_b_kPa,Z_f,Z_b,Fp,Ft,Fz,C,Fpv,V_b_" << o.volume_unit << ",energy_" << o.energy_unit
              << ",mass_kg,status\n";
    std::cout << io::format_number(V_f) << ',' << io::format_number(T_f) << ',' << io::format_number(p_f / 1000.0) << ','
              << base.name << ',' << io::format_number(base.T_K) << ',' << io::format_number(base.p_Pa / 1000.0) << ','
              << io::format_number(c.Z_f) << ',' << io::format_number(c.Z_b) << ',' << io::format_number(c.factors.Fp) << ','
              << io::format_number(c.factors.Ft) << ',' << io::format_number(c.factors.Fz) << ','
              << io::format_number(c.factors.C) << ',' << io::format_number(c.factors.Fpv) << ',' << io::format_number(Vb_out)
              << ',' << (std::isnan(E_out) ? "" : io::format_number(E_out)) << ','
              << (std::isnan(c.mass_kg) ? "" : io::format_number(c.mass_kg)) << ',' << status_text(c.status) << '\n';
    return exit_ok;
  }
  auto line = [](const char* k, const std::string& v) { std::cout << "  " << k << std::string(12 - std::string(k).size(), ' ') << v << '\n'; };
  std::cout << "Line-to-base conversion\n";
  line("line", "V_f = " + io::format_sig(V_f, 10) + " m3 at T_f = " + io::format_sig(T_f, 8) + " K, p_f = " +
                   io::format_sig(p_f / 1000.0, 8) + " kPa abs");
  line("base", std::string(base.name) + ": T_b = " + io::format_sig(base.T_K, 8) + " K, p_b = " + io::format_sig(base.p_Pa / 1000.0, 8) +
                   " kPa abs");
  line("Z_f", io::format_sig(c.Z_f, 10) + "  (" + std::string(c.z_f_source) + ")");
  line("Z_b", io::format_sig(c.Z_b, 10) + "  (" + std::string(c.z_b_source) + ")");
  line("Fp", io::format_sig(c.factors.Fp, 10) + "  pressure factor p_f/p_b");
  line("Ft", io::format_sig(c.factors.Ft, 10) + "  temperature factor T_b/T_f");
  line("Fz", io::format_sig(c.factors.Fz, 10) + "  compressibility factor Z_b/Z_f");
  line("C", io::format_sig(c.factors.C, 10) + "  = Fp Ft Fz");
  line("F_pv", io::format_sig(c.factors.Fpv, 10) + "  = sqrt(Z_b/Z_f)");
  line("V_b", io::format_sig(Vb_out, 10) + " " + o.volume_unit + " at base conditions");
  if (!std::isnan(c.energy_MJ)) {
    line("Hs", io::format_sig(c.Hs_MJ_per_m3, 8) + " MJ/m3  (" + hs_note + ")");
    line("energy", io::format_sig(E_out, 10) + " " + o.energy_unit + " (gross)");
  } else {
    line("energy", "not computed: Hs " + hs_note);
  }
  if (!std::isnan(c.mass_kg)) line("mass", io::format_sig(c.mass_kg, 10) + " kg");
  line("status", status_text(c.status));
  if (comp) {
    line("gas", comp->provenance());
    if (!std::isnan(c.energy_MJ))
      line("Hs data", std::string(data_source_text) + "; rows below medium-high confidence: " +
                          doubtful_rows_text(iso6976::doubtful_components(comp->x, setup.combustion)));
  }
  std::cout << caution_line << '\n';
  return exit_ok;
}

}  // namespace

void setup_convert(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<ConvertOptions>();
  auto* sub = app.add_subcommand("convert", "Convert a metered volume at line conditions to base volume, energy and mass");
  opt->method.add_to(*sub);
  opt->gas.add_to(*sub, false);
  opt->base.add_to(*sub);
  sub->add_option("--V", opt->V, "Metered (uncorrected) volume with unit, e.g. \"1250 m3\", \"45 Mcf\"");
  sub->add_option("--T", opt->T, "Line temperature, e.g. \"12 degC\"");
  sub->add_option("--p", opt->p, "Line pressure, e.g. \"4.2 MPa\", \"600 psig\" (gauge needs --atm)");
  sub->add_option("--atm", opt->atm, "Atmospheric pressure for gauge readings, e.g. \"101.0 kPa\"");
  sub->add_option("--zf", opt->zf, "Use this Z at line conditions instead of a method (the output says so)");
  sub->add_option("--zb", opt->zb, "Use this Z at base conditions");
  sub->add_option("--zb-from", opt->zb_from, "Where Z_b comes from: method (default) or iso6976")
      ->check(CLI::IsMember({"method", "iso6976"}));
  sub->add_option("--combustion-ref", opt->combustion,
                  "Combustion reference temperature for Hs in degC: 0, 15, 15.55, 20, 25 (default paired with the base)");
  sub->add_option("--volume-unit", opt->volume_unit, "Unit of the base volume: m3, ft3, Mcf")->capture_default_str();
  sub->add_option("--energy-unit", opt->energy_unit, "Unit of the energy: MJ, GJ, kWh, MMBtu, therm, Dth")->capture_default_str();
  add_format_option(*sub, opt->format);
  sub->footer(
      "\nExamples:\n"
      "  zcorr convert --method gerg2008 --gas-file analysis.txt --V \"1250 m3\" --T \"8 degC\" --p \"4.2 MPa\" --base iso15\n"
      "  zcorr convert --zf 0.9132 --zb 0.9976 --V \"45 Mcf\" --T \"52 degF\" --p \"600 psig\" --atm \"14.4 psia\" --base us60f_14.73\n");
  sub->callback([opt, sub, &exit_code] {
    opt->method_given = sub->count("--method") > 0;
    exit_code = guarded("convert", [&] { return run_convert(*opt); });
  });
}

}  // namespace zcorr::cli
