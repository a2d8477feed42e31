// zcorr z: compressibility factor of a gas at one state, or a batch CSV.
//
// Batch contract (DEVELOPERS.md): input columns T_K, P_kPa (absolute) and one
// column per component by canonical name (mole fractions, missing = 0); output
// is every input column unchanged, then Z, rho_mol_per_L, status (and any
// --columns asked for). A row that cannot be computed keeps its place with an
// empty Z. Exit 0 when every row computed, 1 when some did not, 2 for unusable
// input.
#include <fstream>
#include <iostream>
#include <memory>
#include <sstream>

#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "common.hpp"
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
  std::string T, p, atm;
  std::string input;
  std::vector<std::string> columns;
  bool derived = false;
  Format format = Format::text;
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
  auto method = o.method.make();
  auto comp = o.gas.load();
  std::optional<double> atm;
  if (!o.atm.empty()) atm = io::parse_pressure_Pa(o.atm, "--atm");
  const double T = io::parse_temperature_K(o.T, "--T");
  const double p = io::parse_pressure_Pa(o.p, "--p", atm);
  auto prep = method->prepare(comp.x);
  StateOutput out;
  if (prep.ok()) out = method->state(T, p, o.method.eval_options(true));
  else out.status = prep;
  const bool computed = out.status.ok();
  if (o.format == Format::json) {
    nlohmann::json j;
    j["method"] = o.method.method;
    j["T_K"] = T;
    j["P_kPa"] = p / 1000.0;
    j["composition"] = nlohmann::json::object();
    for (std::size_t i = 0; i < max_components; ++i)
      if (comp.x[i] != 0.0) j["composition"][std::string(component_name(i))] = comp.x[i];
    j["composition_provenance"] = comp.provenance();
    for (std::size_t i = 0; i < out.q.size(); ++i)
      if (out.has(static_cast<Quantity>(i))) j[std::string(quantity_names[i])] = out.q[i];
    j["status"] = status_text(out.status);
    j["range"] = range_name(out.status.range);
    j["iterations"] = out.iterations;
    std::cout << j.dump(2) << '\n';
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
              << "gas      " << comp.provenance() << '\n';
    for (std::size_t i = 0; i < out.q.size(); ++i)
      if (out.has(static_cast<Quantity>(i)))
        std::cout << "  " << quantity_names[i] << std::string(18 - std::min<std::size_t>(17, quantity_names[i].size()), ' ')
                  << io::format_sig(out.q[i], 12) << '\n';
    std::cout << "status   " << status_text(out.status) << " (range: " << range_name(out.status.range) << ")\n";
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
  auto out_header = header;
  out_header.insert(out_header.end(), {"Z", "rho_mol_per_L", "status"});
  for (auto q : extras) out_header.emplace_back(quantity_names[static_cast<std::size_t>(q)]);
  io::write_csv_row(std::cout, out_header);
  const auto copt = o.gas.composition_options();
  const auto eopt = o.method.eval_options(o.derived || !extras.empty());
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
      if (!last_prep.ok()) {
        out.status = last_prep;
        status = status_text(out.status);
      } else {
        out = method->state(T, P * 1000.0, eopt);
        status = status_text(out.status);
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
  sub->add_option("--T", opt->T, "Temperature with unit, e.g. \"15 degC\", \"288.15 K\", \"60 degF\"");
  sub->add_option("--p", opt->p, "Pressure with unit, e.g. \"5 MPa\", \"725 psig\" (gauge needs --atm)");
  sub->add_option("--atm", opt->atm, "Atmospheric pressure for gauge readings, e.g. \"14.4 psia\"");
  sub->add_option("--input", opt->input, "Batch CSV (T_K, P_kPa, component columns); '-' for standard input");
  sub->add_option("--columns", opt->columns, "Extra CSV columns, e.g. B_cm3_per_mol,w_m_per_s,kappa")->delimiter(',');
  sub->add_flag("--derived", opt->derived, "Compute derived properties in batch mode");
  add_format_option(*sub, opt->format);
  sub->footer(
      "\nExamples:\n"
      "  zcorr z --method gerg2008 --T \"15 degC\" --p \"5 MPa\" --gas \"methane=0.95,ethane=0.03,nitrogen=0.02\"\n"
      "  zcorr z --method detail --input states.csv > states_with_z.csv\n"
      "  zcorr z --method gerg2008 --T 300K --p \"725 psig\" --atm \"14.5 psia\" --gas-file analysis.json --format json\n");
  sub->callback([opt, &exit_code] {
    exit_code = guarded("z", [&] { return opt->input.empty() ? run_single(*opt) : run_batch(*opt); });
  });
}

}  // namespace zcorr::cli
