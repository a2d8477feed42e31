// zcorr z: compressibility factor of a gas at one state, or a batch CSV.
//
// Batch contract (DEVELOPERS.md): input columns T_K, P_kPa (absolute) and one
// column per component by canonical name (mole fractions, missing = 0); output
// is every input column unchanged, then Z, rho_mol_per_L, status (and any
// --columns asked for). A row that cannot be computed keeps its place with an
// empty Z. Exit 0 when every row computed, 1 when some did not, 2 for unusable
// input.
//
// GERG-2008 mixture states are checked for phase stability (eval/phase_check.hpp); a
// two-phase state gets status two_phase and no Z; a single-phase state less than the dew
// margin (--dew-margin, default 5 K) above the dew temperature at its pressure carries
// near_dew_point in its status (every method, when a full analysis is given).
//
// Gross-characterization methods (sgerg88, gross1, gross2) also take their
// gross inputs: as options in single-state mode (--Hs, --d, --x-co2, --x-h2,
// --x-n2) and as batch columns (Hs_MJ_per_m3 or HV_Btu_per_ft3, d, x_CO2,
// x_H2, x_N2; see gross_options.hpp for units and reference conditions).
// Given a full analysis instead, they reduce it through ISO 6976 and say so
// (single state: a "gross" line; batch: a gross_from=... tag in the status).
#include <cmath>
#include <fstream>
#include <iostream>
#include <memory>
#include <sstream>

#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "common.hpp"
#include "gross_options.hpp"
#include "io/csv.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"
#include "method_options.hpp"

namespace zcorr::cli {
namespace {

struct ZOptions {
  MethodOptions method;
  GasOptions gas;
  GrossOptions gross;
  std::string T, p, atm;
  std::string input;
  std::vector<std::string> columns;
  bool derived = false;
  std::string dew_margin;  // kelvin; empty = EvalOptions::default_dew_margin_K
  Format format = Format::text;
  // The evaluation options with the dew margin asked for.
  [[nodiscard]] EvalOptions eval(bool with_derived) const {
    EvalOptions e = method.eval_options(with_derived);
    if (!dew_margin.empty()) {
      std::string t(io::trim(dew_margin));
      if (t.size() > 1 && t.back() == 'K') t = std::string(io::trim(std::string_view(t).substr(0, t.size() - 1)));
      const double v = io::parse_number(t, "--dew-margin");
      if (!(v >= 0.0 && v <= 50.0)) throw io::InputError("--dew-margin", dew_margin, "a temperature difference from 0 K to 50 K");
      e.dew_margin_K = v;
    }
    return e;
  }
};

std::optional<Quantity> quantity_from_name(const std::string& n) {
  for (std::size_t i = 0; i < quantity_names.size(); ++i)
    if (quantity_names[i] == n) return static_cast<Quantity>(i);
  return std::nullopt;
}

std::vector<Quantity> extra_columns(const ZOptions& o) {
  std::vector<Quantity> out;
  for (const auto& c : o.columns) {
    auto q = quantity_from_name(c);
    if (!q || *q == Quantity::Z || *q == Quantity::rho_mol_per_L) {
      std::string allowed = "extra columns are:";
      for (std::size_t i = 2; i < quantity_names.size(); ++i) allowed += " " + std::string(quantity_names[i]);
      throw io::InputError("--columns", c, allowed);
    }
    out.push_back(*q);
  }
  return out;
}

int run_single(const ZOptions& o) {
  if (o.T.empty() || o.p.empty()) throw io::InputError("--T/--p", o.T + "/" + o.p, "give both --T and --p (or --input FILE.csv)");
  const bool gross_route = o.gross.given();
  if (const auto named = method_from_name(o.method.method); gross_route && named && !is_gross_method(*named))
    throw io::InputError("--method", o.method.method, "gross inputs (--Hs, --d, --x-...) need sgerg88, gross1 or gross2");
  auto method = o.method.make();
  const MethodId id = method->id();
  if (gross_route && o.gas.given())
    throw io::InputError("--gas", "with gross inputs", "give either a gas analysis or gross inputs, not both");
  io::ParsedComposition comp{};
  if (!gross_route) comp = o.gas.load();
  std::optional<double> atm;
  if (!o.atm.empty()) atm = io::parse_pressure_Pa(o.atm, "--atm");
  const double T = io::parse_temperature_K(o.T, "--T");
  const double p = io::parse_pressure_Pa(o.p, "--p", atm);
  const Status prep = gross_route ? method->prepare_gross(o.gross.load(id)) : method->prepare(comp.x);
  const GrossInputs gi = method->gross_inputs();
  const std::string note(method->reduction_note());
  const std::string refs(gross_reference_text(id));
  std::vector<std::pair<std::string, double>> gross_shown;
  for (auto [name, v] : {std::pair<const char*, double>{id == MethodId::sgerg88 ? "Hs_MJ_per_m3" : "HV_MJ_per_m3", gi.Hs_MJ_per_m3},
                         {"d", gi.d}, {"x_CO2", gi.x_CO2}, {"x_H2", gi.x_H2}, {"x_N2", gi.x_N2}})
    if (!std::isnan(v)) gross_shown.emplace_back(name, v);
  StateOutput out;
  const EvalOptions eopt = o.eval(true);
  if (prep.ok()) out = method->state(T, p, eopt);
  else out.status = prep;
  const bool computed = out.status.ok();
  if (o.format == Format::json) {
    nlohmann::json j;
    j["method"] = o.method.method;
    j["T_K"] = T;
    j["P_kPa"] = p / 1000.0;
    if (!gross_route) {
      j["composition"] = nlohmann::json::object();
      for (std::size_t i = 0; i < max_components; ++i)
        if (comp.x[i] != 0.0) j["composition"][std::string(component_name(i))] = comp.x[i];
      j["composition_provenance"] = comp.provenance();
    }
    if (is_gross_method(id)) {
      j["gross_inputs"] = nlohmann::json::object();
      for (const auto& [name, v] : gross_shown) j["gross_inputs"][name] = v;
      j["gross_reference_conditions"] = refs;
      if (!note.empty()) j["gross_reduction"] = note;
    }
    for (std::size_t i = 0; i < out.q.size(); ++i)
      if (out.has(static_cast<Quantity>(i))) j[std::string(quantity_names[i])] = out.q[i];
    j["status"] = status_text(out.status);
    j["range"] = range_name(out.status.range);
    j["iterations"] = out.iterations;
    std::cout << json_text(j) << '\n';
  } else if (o.format == Format::csv) {
    std::vector<std::string> head{"T_K", "P_kPa"}, row{io::format_number(T), io::format_number(p / 1000.0)};
    for (std::size_t i = 0; i < out.q.size(); ++i)
      if (out.has(static_cast<Quantity>(i))) {
        head.emplace_back(quantity_names[i]);
        row.push_back(io::format_number(out.q[i]));
      }
    head.emplace_back("status");
    row.push_back(status_text(out.status));
    io::write_csv_row(std::cout, head);
    io::write_csv_row(std::cout, row);
  } else {
    std::cout << "method   " << o.method.method << '\n'
              << "state    T = " << io::format_sig(T, 10) << " K, p = " << io::format_sig(p / 1000.0, 10) << " kPa (absolute)\n"
              << "gas      " << (gross_route ? std::string("gross inputs") : comp.provenance()) << '\n';
    if (is_gross_method(id)) {
      std::cout << "gross   ";
      for (const auto& [name, v] : gross_shown) std::cout << ' ' << name << " = " << io::format_sig(v, 8);
      std::cout << (gross_shown.empty() ? " (not characterized)\n" : "\n") << "         at " << refs << '\n';
      if (!note.empty()) std::cout << "         " << note << '\n';
    }
    for (std::size_t i = 0; i < out.q.size(); ++i)
      if (out.has(static_cast<Quantity>(i)))
        std::cout << "  " << quantity_names[i] << std::string(18 - std::min<std::size_t>(17, quantity_names[i].size()), ' ')
                  << io::format_sig(out.q[i], 12) << '\n';
    std::cout << "status   " << status_text(out.status) << " (range: " << range_name(out.status.range) << ")\n";
    if (out.status.code == Code::two_phase && id == MethodId::gerg2008)
      std::cout << "note     not single-phase gas at this state (below its dew point; see zcorr dewpoint):\n"
                   "         no Z is given, the metered volume and energy are not those of the gas\n";
    if (out.status.has(flag::near_dew_point))
      std::cout << "note     single-phase, but less than " << io::format_sig(eopt.dew_margin_K, 6)
                << " K above the hydrocarbon dew temperature at this pressure\n"
                   "         (near_dew_point; see zcorr dewpoint, --dew-margin sets the margin)\n";
  }
  if (!computed) {
    std::cerr << "zcorr z: not computed: " << status_text(out.status) << '\n';
    return exit_partial;
  }
  return exit_ok;
}

int run_batch(const ZOptions& o) {
  auto method = o.method.make();
  const auto extras = extra_columns(o);
  std::ifstream file;
  std::istream* in = &std::cin;
  if (o.input != "-") {
    file.open(o.input, std::ios::binary);
    if (!file) throw io::InputError("--input", o.input, "the file cannot be opened");
    in = &file;
  }
  io::CsvReader reader(*in);
  std::vector<std::string> header, row;
  if (!reader.next(header)) throw io::InputError("--input", o.input, "the file is empty (a header line is required)");
  int col_T = -1, col_P = -1;
  std::array<int, max_components> col_x;
  col_x.fill(-1);
  const MethodId id = method->id();
  GrossColumns gcol;
  if (is_gross_method(id)) gcol.bind(header);
  for (std::size_t c = 0; c < header.size(); ++c) {
    const auto name = std::string(io::trim(header[c]));
    if (name == "T_K") col_T = static_cast<int>(c);
    else if (name == "P_kPa") col_P = static_cast<int>(c);
    else if (auto comp = find_component(name); comp && name == component_name(index(*comp))) {
      if (col_x[index(*comp)] >= 0) throw io::InputError("--input header", name, "the column appears twice");
      col_x[index(*comp)] = static_cast<int>(c);
    }
  }
  if (col_T < 0 || col_P < 0) throw io::InputError("--input header", io::trim(o.input).empty() ? "-" : o.input,
                                                   "the header must have T_K and P_kPa columns");
  const bool gross_route = gcol.any();
  if (gross_route) {
    for (std::size_t i = 0; i < max_components; ++i)
      if (col_x[i] >= 0)
        throw io::InputError("--input header", std::string(component_name(i)),
                             "give either gross-input columns or component columns, not both");
    gcol.require(id);
  }
  const std::string reduction_tag = is_gross_method(id) && !gross_route ? ";" + std::string(gross_reduction_tag(id)) : "";
  GrossInputs last_gross{};
  auto same_gross = [](const GrossInputs& a, const GrossInputs& b) {
    auto eq = [](double u, double v) { return (std::isnan(u) && std::isnan(v)) || u == v; };
    return eq(a.Hs_MJ_per_m3, b.Hs_MJ_per_m3) && eq(a.d, b.d) && eq(a.x_CO2, b.x_CO2) && eq(a.x_H2, b.x_H2) &&
           eq(a.x_N2, b.x_N2);
  };
  auto out_header = header;
  out_header.insert(out_header.end(), {"Z", "rho_mol_per_L", "status"});
  for (auto q : extras) out_header.emplace_back(quantity_names[static_cast<std::size_t>(q)]);
  io::write_csv_row(std::cout, out_header);
  const auto copt = o.gas.composition_options();
  const auto eopt = o.eval(o.derived || !extras.empty());
  Fractions<double> last{};
  bool have_last = false;
  Status last_prep{};
  int failed = 0;
  std::vector<std::string> out_row;
  while (reader.next(row)) {
    out_row = row;
    out_row.resize(header.size());
    std::string status;
    StateOutput out;
    try {
      if (row.size() != header.size())
        throw io::InputError("row at line " + std::to_string(reader.line()), std::to_string(row.size()) + " fields",
                             "expected " + std::to_string(header.size()));
      const double T = io::parse_number(row[static_cast<std::size_t>(col_T)], "T_K");
      const double P = io::parse_number(row[static_cast<std::size_t>(col_P)], "P_kPa");
      if (!(T > 0.0)) throw io::InputError("T_K", row[static_cast<std::size_t>(col_T)], "the temperature must be above 0 K");
      if (!(P >= 0.0)) throw io::InputError("P_kPa", row[static_cast<std::size_t>(col_P)], "the absolute pressure must be >= 0 kPa");
      if (gross_route) {
        const GrossInputs g = gcol.read(row, id);
        if (!have_last || !same_gross(g, last_gross)) {
          last_prep = method->prepare_gross(g);
          last_gross = g;
          have_last = true;
        }
      } else {
        Fractions<double> x{};
        for (std::size_t i = 0; i < max_components; ++i)
          if (col_x[i] >= 0 && !io::trim(row[static_cast<std::size_t>(col_x[i])]).empty())
            x[i] = io::parse_number(row[static_cast<std::size_t>(col_x[i])], component_name(i));
        auto comp = io::finish_composition(x, copt, "composition");
        if (!have_last || comp.x != last) {
          last_prep = method->prepare(comp.x);
          last = comp.x;
          have_last = true;
        }
      }
      if (!last_prep.ok()) {
        out.status = last_prep;
        status = status_text(out.status);
      } else {
        out = method->state(T, P * 1000.0, eopt);
        status = status_text(out.status) + reduction_tag;
      }
    } catch (const io::InputError& e) {
      const auto& f = e.field();
      const char* code = f == "T_K" ? "invalid_temperature"
                         : f == "P_kPa" ? "invalid_pressure"
                         : (f.rfind("composition", 0) == 0 || find_component(f)) ? "invalid_composition"
                                                                          : "invalid_input";
      status = std::string(code) + ";" + e.what();
      out.status = make_status(Code::invalid_input);
    }
    const bool ok = out.status.ok();
    if (!ok) ++failed;
    out_row.push_back(ok ? io::format_number(out[Quantity::Z]) : "");
    out_row.push_back(ok ? io::format_number(out[Quantity::rho_mol_per_L]) : "");
    out_row.push_back(status);
    for (auto q : extras) out_row.push_back(ok && out.has(q) ? io::format_number(out[q]) : "");
    io::write_csv_row(std::cout, out_row);
  }
  return failed == 0 ? exit_ok : exit_partial;
}

}  // namespace

void setup_z(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<ZOptions>();
  auto* sub = app.add_subcommand("z", "Compressibility factor Z and density at one state, or for every row of a CSV");
  opt->method.add_to(*sub);
  opt->gas.add_to(*sub, false);
  opt->gross.add_to(*sub);
  sub->add_option("--T", opt->T, "Temperature with unit, e.g. \"15 degC\", \"288.15 K\", \"60 degF\"");
  sub->add_option("--p", opt->p, "Pressure with unit, e.g. \"5 MPa\", \"725 psig\" (gauge needs --atm)");
  sub->add_option("--atm", opt->atm, "Atmospheric pressure for gauge readings, e.g. \"14.4 psia\"");
  sub->add_option("--input", opt->input, "Batch CSV (T_K, P_kPa, component columns); '-' for standard input");
  sub->add_option("--columns", opt->columns, "Extra CSV columns, e.g. B_cm3_per_mol,w_m_per_s,kappa")->delimiter(',');
  sub->add_flag("--derived", opt->derived, "Compute derived properties in batch mode");
  sub->add_option("--dew-margin", opt->dew_margin,
                  "Flag near_dew_point on a single-phase state less than this many kelvin above the hydrocarbon "
                  "dew temperature at its pressure (GERG-2008 test of a full analysis; default 5 K, 0 = off)");
  add_format_option(*sub, opt->format);
  sub->footer(
      "\nExamples:\n"
      "  zcorr z --method gerg2008 --T \"15 degC\" --p \"5 MPa\" --gas \"methane=0.95,ethane=0.03,nitrogen=0.02\"\n"
      "  zcorr z --method detail --input states.csv > states_with_z.csv\n"
      "  zcorr z --method sgerg88 --T \"5 degC\" --p \"6 MPa\" --Hs \"40.66 MJ/m3\" --d 0.581 --x-co2 0.006\n"
      "  zcorr z --method gross2 --T 60F --p \"800 psia\" --d 0.6 --x-n2 0.02 --x-co2 0.01\n"
      "Gross methods in batch mode take columns Hs_MJ_per_m3 (or HV_Btu_per_ft3), d, x_CO2, x_H2 (sgerg88,\n"
      "gross1) or d, x_N2, x_CO2 (gross2) instead of component columns; with component columns the\n"
      "analysis is reduced through ISO 6976 (sgerg88: Hs 25/0 degC, d 0 degC, 101.325 kPa; gross1/2:\n"
      "60 degF, 14.73 psia) and the status says gross_from=... Hydrogen-bearing gases are refused\n"
      "(coefficients_missing): the CH-H2 third virial coefficients are not in this build.\n"
      "  zcorr z --method gerg2008 --T 300K --p \"725 psig\" --atm \"14.5 psia\" --gas-file analysis.json --format json\n");
  sub->callback([opt, &exit_code] {
    exit_code = guarded("z", [&] { return opt->input.empty() ? run_single(*opt) : run_batch(*opt); });
  });
}

}  // namespace zcorr::cli
