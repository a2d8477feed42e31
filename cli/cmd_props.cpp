// zcorr props: ISO 6976:2016 properties of a gas analysis at a pair of
// reference conditions (molar mass, Z, relative density, density, gross and net
// calorific values on molar, mass and volume bases, Wobbe indices), with a
// provenance line naming the component data of lower confidence.
// Parsing and formatting only; the physics is engine/methods/iso6976.hpp.
#include <iostream>
#include <memory>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "common.hpp"
#include "io/csv.hpp"
#include "io/input_error.hpp"
#include "io/iso6976_refs.hpp"
#include "iso6976_provenance.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"
#include "methods/iso6976.hpp"

namespace zcorr::cli {
namespace {

struct PropsOptions {
  GasOptions gas;
  std::string combustion_ref;
  std::string metering_ref;
  std::string metering_p = "101.325 kPa";
  Format format = Format::text;
};

struct Field {
  const char* name;
  const char* unit;
  const char* what;
  double iso6976::Properties<double>::*member;
};

using P = iso6976::Properties<double>;
const std::vector<Field>& field_table() {
  static const std::vector<Field> f{
      {"M_g_per_mol", "g/mol", "molar mass", &P::M_g_per_mol},
      {"Z", "", "compression factor at metering conditions", &P::Z},
      {"G_ideal", "", "relative density, ideal gas", &P::G_ideal},
      {"d", "", "relative density, real gas", &P::d},
      {"rho_kg_per_m3", "kg/m3", "density at metering conditions", &P::rho_kg_per_m3},
      {"Hs_kJ_per_mol", "kJ/mol", "gross calorific value, molar", &P::Hs_kJ_per_mol},
      {"Hi_kJ_per_mol", "kJ/mol", "net calorific value, molar", &P::Hi_kJ_per_mol},
      {"Hs_MJ_per_kg", "MJ/kg", "gross calorific value, mass basis", &P::Hs_MJ_per_kg},
      {"Hi_MJ_per_kg", "MJ/kg", "net calorific value, mass basis", &P::Hi_MJ_per_kg},
      {"Hs_MJ_per_m3", "MJ/m3", "gross calorific value, volume basis (real gas)", &P::Hs_MJ_per_m3},
      {"Hi_MJ_per_m3", "MJ/m3", "net calorific value, volume basis (real gas)", &P::Hi_MJ_per_m3},
      {"Ws_MJ_per_m3", "MJ/m3", "gross Wobbe index", &P::Ws_MJ_per_m3},
      {"Wi_MJ_per_m3", "MJ/m3", "net Wobbe index", &P::Wi_MJ_per_m3},
  };
  return f;
}

int run_props(const PropsOptions& o) {
  if (!o.gas.given()) throw io::InputError("--gas", "", "give the gas analysis with --gas or --gas-file");
  const auto t1 = io::parse_combustion_ref(o.combustion_ref, "--combustion-ref");
  const auto t2 = io::parse_metering_ref(o.metering_ref, "--metering-ref");
  const double p2 = io::parse_pressure_Pa(o.metering_p, "--metering-p");
  const auto comp = o.gas.load();
  const auto r = iso6976::properties(comp.x, t1, t2, p2);
  if (!r.status.ok()) {
    std::string why = status_text(r.status);
    if (r.status.code == Code::out_of_range)
      why += ": the metering pressure must lie within " + io::format_sig(iso6976::p2_min_Pa / 1000.0, 4) + " to " +
             io::format_sig(iso6976::p2_max_Pa / 1000.0, 4) + " kPa for the summation-factor method";
    const bool pressure = r.status.code == Code::out_of_range || r.status.code == Code::invalid_pressure;
    throw io::InputError(pressure ? "--metering-p" : "--gas", pressure ? o.metering_p : comp.provenance(), "not computed: " + why);
  }
  const auto doubt = iso6976::doubtful_components(comp.x, t1);
  const auto consts = iso6976::doubtful_constants(t1);
  const std::string t1s(iso6976::label(t1)), t2s(iso6976::label(t2));
  const std::string rows = doubtful_rows_text(doubt), ctext = constants_text(consts);

  if (o.format == Format::json) {
    nlohmann::json j;
    j["method"] = "iso6976";
    j["combustion_ref_C"] = t1s;
    j["metering_ref_C"] = t2s;
    j["metering_p_kPa"] = p2 / 1000.0;
    j["composition"] = nlohmann::json::object();
    for (std::size_t i = 0; i < max_components; ++i)
      if (comp.x[i] != 0.0) j["composition"][std::string(component_name(i))] = comp.x[i];
    j["composition_provenance"] = comp.provenance();
    for (const auto& f : field_table()) j[f.name] = r.*(f.member);
    j["status"] = status_text(r.status);
    j["data_source"] = data_source_text;
    auto arr = nlohmann::json::array();
    for (std::size_t i = 0; i < doubt.count; ++i) {
      const auto& d = doubt.rows[i];
      arr.push_back({{"component", std::string(component_name(index(d.component)))},
                     {"zs_confidence", std::string(iso6976::data::confidence_name(d.zs))},
                     {"hs_confidence", std::string(iso6976::data::confidence_name(d.hs))},
                     {"zs_doubtful", d.zs_doubtful},
                     {"hs_doubtful", d.hs_doubtful}});
    }
    j["doubtful_rows"] = arr;
    j["doubtful_constants"] = ctext;
    j["caution"] = caution_line;
    std::cout << json_text(j) << '\n';
  } else if (o.format == Format::csv) {
    std::vector<std::string> head{"combustion_ref_C", "metering_ref_C", "metering_p_kPa"};
    std::vector<std::string> row{t1s, t2s, io::format_number(p2 / 1000.0)};
    for (const auto& f : field_table()) {
      head.emplace_back(f.name);
      row.push_back(io::format_number(r.*(f.member)));
    }
    head.insert(head.end(), {"status", "doubtful_rows", "doubtful_constants"});
    row.insert(row.end(), {status_text(r.status), rows, ctext});
    io::write_csv_row(std::cout, head);
    io::write_csv_row(std::cout, row);
  } else {
    std::cout << "ISO 6976:2016 properties: combustion " << t1s << " degC; metering " << t2s << " degC, "
              << io::format_sig(p2 / 1000.0, 8) << " kPa\n"
              << "gas         " << comp.provenance() << '\n';
    for (const auto& f : field_table()) {
      std::string name = f.name;
      name.resize(16, ' ');
      std::string value = io::format_sig(r.*(f.member), 9);
      if (value.size() < 14) value.resize(14, ' ');
      std::string unit = f.unit;
      unit.resize(8, ' ');
      std::cout << "  " << name << value << ' ' << unit << f.what << '\n';
    }
    std::cout << "status      " << status_text(r.status) << '\n'
              << "provenance  data: " << data_source_text << "; doubtful rows (below medium-high): " << rows
              << "; doubtful constants: " << ctext << '\n' << caution_line << '\n';
  }
  return exit_ok;
}

}  // namespace

void setup_props(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<PropsOptions>();
  auto* sub = app.add_subcommand("props", "ISO 6976:2016 calorific values, density, relative density and Wobbe index of a gas analysis");
  opt->gas.add_to(*sub, true);
  sub->add_option("--combustion-ref", opt->combustion_ref, "Combustion reference temperature: 0, 15, 15.55, 20 or 25 (degC)")
      ->required();
  sub->add_option("--metering-ref", opt->metering_ref, "Metering reference temperature: 0, 15, 15.55 or 20 (degC)")->required();
  sub->add_option("--metering-p", opt->metering_p,
                  "Metering reference pressure with unit (default 101.325 kPa; accepted 90-110 kPa), e.g. \"14.73 psia\"");
  add_format_option(*sub, opt->format);
  sub->footer(
      "\nExamples:\n"
      "  zcorr props --gas \"methane=0.965,ethane=0.018,propane=0.0045,nitrogen=0.003,carbon_dioxide=0.006,"
      "isobutane=0.001,n_butane=0.001,isopentane=0.0005,n_pentane=0.0003,n_hexane=0.0007\" --combustion-ref 25 --metering-ref 0\n"
      "  zcorr props --gas-file analysis.json --combustion-ref 15.55 --metering-ref 15.55 --metering-p \"14.73 psia\" --format json\n"
      "\n15.55 means 60 degF. The US customary route (GPA 2172 / GPA 2145) is not implemented; for 60 degF base\n"
      "conditions this command uses ISO 6976 data at 15.55 degC with the given pressure. The provenance line names\n"
      "component data below medium-high confidence (see engine/data/iso6976_data.hpp).\n");
  sub->callback([opt, &exit_code] { exit_code = guarded("props", [&] { return run_props(*opt); }); });
}

}  // namespace zcorr::cli
