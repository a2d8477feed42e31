// zcorr dewpoint: the hydrocarbon dew temperature of a gas at a pressure (the highest
// one: the upper dew point of the isobar), and the gas's cricondentherm and cricondenbar,
// from the GERG-2008 equation of state (engine/methods/gerg2008_phase.hpp).
//
// Batch contract (DEVELOPERS.md): input columns P_kPa (absolute) and the component
// columns by canonical name (as zcorr z; missing = 0); output is every input column
// unchanged, then T_dew_K (empty where there is no dew point at that pressure, i.e. above
// the cricondenbar) and status. Exit 0 when every row was computed (a row above the
// cricondenbar is computed: its answer is "no dew point"), 1 when some were not, 2 for
// unusable input.
//
// The dew point is that of the water-free gas: water is removed and the rest normalised
// (status tag water_excluded); the water dew point is not assessed.
#include <cmath>
#include <fstream>
#include <iostream>
#include <memory>

#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "common.hpp"
#include "io/csv.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"
#include "methods/gerg2008_phase.hpp"

namespace zcorr::cli {
namespace {

namespace ph = gerg2008::phase;

struct DewOptionsCli {
  std::string method = "gerg2008";
  GasOptions gas;
  std::string p, atm;
  std::string input;
  bool no_bounds = false;
  Format format = Format::text;
};

void require_gerg(const DewOptionsCli& o) {
  if (o.method != "gerg2008")
    throw io::InputError("--method", o.method, "the dew point is computed with gerg2008 only");
}

std::string dew_status(const ph::DewPoint<double>& d, bool water) {
  std::string s;
  switch (d.outcome) {
    case ph::DewOutcome::found: s = "ok"; break;
    case ph::DewOutcome::none_at_pressure: s = "no_dew_point;above_cricondenbar"; break;
    case ph::DewOutcome::no_hydrocarbon: s = "invalid_composition;no_hydrocarbon"; break;
    case ph::DewOutcome::failed: s = status_text(d.status); break;
  }
  if (water) s += ";water_excluded";
  return s;
}

bool computed(const ph::DewPoint<double>& d) {
  return d.outcome == ph::DewOutcome::found || d.outcome == ph::DewOutcome::none_at_pressure;
}

int run_single(const DewOptionsCli& o) {
  require_gerg(o);
  const auto comp = o.gas.load();
  gerg2008::Prepared<double> dry;
  const Status ps = ph::prepare_dry(comp.x, dry);
  if (!ps.ok()) throw io::InputError("--gas", comp.provenance(), "the water-free gas must be a valid analysis");
  const bool water = comp.x[index(Component::water)] > 0.0;
  std::optional<double> atm;
  if (!o.atm.empty()) atm = io::parse_pressure_Pa(o.atm, "--atm");
  std::optional<ph::DewPoint<double>> dew;
  double p = 0.0;
  if (!o.p.empty()) {
    p = io::parse_pressure_Pa(o.p, "--p", atm);
    if (!(p > 0.0)) throw io::InputError("--p", o.p, "the absolute pressure must be above 0");
    dew = ph::dew_temperature(dry, p);
  }
  ph::EnvelopeBounds<double> env{};
  const bool bounds = !o.no_bounds && dry.n_active >= 2 && ph::has_hydrocarbon_active(dry.active, dry.n_active);
  if (bounds) env = ph::envelope_bounds(dry);
  int rc = exit_ok;
  if (dew && !computed(*dew)) rc = exit_partial;
  if (bounds && !env.status.ok()) rc = exit_partial;
  if (o.format == Format::json) {
    nlohmann::json j;
    j["method"] = o.method;
    j["composition_provenance"] = comp.provenance();
    j["water_excluded"] = water;
    if (dew) {
      j["P_kPa"] = p / 1000.0;
      if (dew->outcome == ph::DewOutcome::found) j["T_dew_K"] = dew->T_K;
      else j["T_dew_K"] = nullptr;
      j["status"] = dew_status(*dew, water);
    }
    if (bounds) {
      if (env.status.ok() && env.found) {
        j["cricondentherm_K"] = env.cricondentherm_T_K;
        j["cricondentherm_P_kPa"] = env.cricondentherm_p_Pa / 1000.0;
        j["cricondenbar_P_kPa"] = env.cricondenbar_p_Pa / 1000.0;
        j["cricondenbar_K"] = env.cricondenbar_T_K;
      }
      j["envelope_status"] = env.status.ok() ? (env.found ? "ok" : "no_dew_point") : status_text(env.status);
    }
    j["caution"] = caution_text;
    std::cout << json_text(j) << '\n';
  } else {
    std::cout << "method   " << o.method << " (phase equilibrium of the water-free gas)\n"
              << "gas      " << comp.provenance() << (water ? "; water excluded (the water dew point is not assessed)" : "")
              << '\n';
    if (dew) {
      std::cout << "p        " << io::format_sig(p / 1000.0, 10) << " kPa (absolute)\n";
      if (dew->outcome == ph::DewOutcome::found)
        std::cout << "T_dew    " << io::format_sig(dew->T_K, 9) << " K (" << io::format_sig(dew->T_K - 273.15, 7)
                  << " degC), the highest hydrocarbon dew temperature at this pressure\n";
      else if (dew->outcome == ph::DewOutcome::none_at_pressure)
        std::cout << "T_dew    none: no dew point at this pressure (above the cricondenbar)\n";
      std::cout << "status   " << dew_status(*dew, water) << '\n';
    }
    if (bounds) {
      if (env.status.ok() && env.found) {
        std::cout << "cricondentherm  " << io::format_sig(env.cricondentherm_T_K, 8) << " K at "
                  << io::format_sig(env.cricondentherm_p_Pa / 1000.0, 6) << " kPa\n"
                  << "cricondenbar    " << io::format_sig(env.cricondenbar_p_Pa / 1000.0, 7) << " kPa at "
                  << io::format_sig(env.cricondenbar_T_K, 6) << " K\n";
      } else if (env.status.ok()) {
        std::cout << "envelope        no dew point between 0.1 and 30 MPa\n";
      } else {
        std::cout << "envelope        not computed: " << status_text(env.status) << '\n';
      }
    }
    std::cout << "note     a state at or below the dew temperature is not single-phase gas: its metered volume\n"
                 "         and energy are not those of the gas, and liquid in the line is a hazard.\n\n"
              << caution_text << '\n';
  }
  if (rc != exit_ok) std::cerr << "zcorr dewpoint: not every quantity was computed\n";
  return rc;
}

int run_batch(const DewOptionsCli& o) {
  require_gerg(o);
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
  int col_P = -1;
  std::array<int, max_components> col_x;
  col_x.fill(-1);
  bool any_component = false;
  for (std::size_t c = 0; c < header.size(); ++c) {
    const auto name = std::string(io::trim(header[c]));
    if (name == "P_kPa") col_P = static_cast<int>(c);
    else if (auto comp = find_component(name); comp && name == component_name(index(*comp))) {
      if (col_x[index(*comp)] >= 0) throw io::InputError("--input header", name, "the column appears twice");
      col_x[index(*comp)] = static_cast<int>(c);
      any_component = true;
    }
  }
  if (col_P < 0) throw io::InputError("--input header", o.input, "the header must have a P_kPa column");
  if (!any_component)
    throw io::InputError("--input header", o.input, "the header must have component columns (canonical names, as zcorr z)");
  auto out_header = header;
  out_header.insert(out_header.end(), {"T_dew_K", "status"});
  io::write_csv_row(std::cout, out_header);
  const auto copt = o.gas.composition_options();
  Fractions<double> last{};
  bool have_last = false;
  Status last_prep{};
  gerg2008::Prepared<double> dry;
  int failed = 0;
  std::vector<std::string> out_row;
  while (reader.next(row)) {
    out_row = row;
    out_row.resize(header.size());
    std::string status, T_text;
    bool ok = false;
    try {
      if (row.size() != header.size())
        throw io::InputError("row at line " + std::to_string(reader.line()), std::to_string(row.size()) + " fields",
                             "expected " + std::to_string(header.size()));
      const double P = io::parse_number(row[static_cast<std::size_t>(col_P)], "P_kPa");
      if (!(P > 0.0) || !std::isfinite(P))
        throw io::InputError("P_kPa", row[static_cast<std::size_t>(col_P)], "the absolute pressure must be a number above 0 kPa");
      Fractions<double> x{};
      for (std::size_t i = 0; i < max_components; ++i)
        if (col_x[i] >= 0 && !io::trim(row[static_cast<std::size_t>(col_x[i])]).empty())
          x[i] = io::parse_number(row[static_cast<std::size_t>(col_x[i])], component_name(i));
      auto comp = io::finish_composition(x, copt, "composition");
      if (!have_last || comp.x != last) {
        last_prep = ph::prepare_dry(comp.x, dry);
        last = comp.x;
        have_last = true;
      }
      const bool water = comp.x[index(Component::water)] > 0.0;
      if (!last_prep.ok()) {
        status = status_text(last_prep);
      } else {
        const auto d = ph::dew_temperature(dry, P * 1000.0);
        status = dew_status(d, water);
        ok = computed(d);
        if (d.outcome == ph::DewOutcome::found) T_text = io::format_number(d.T_K);
      }
    } catch (const io::InputError& e) {
      const auto& f = e.field();
      const char* code = f == "P_kPa" ? "invalid_pressure"
                         : (f.rfind("composition", 0) == 0 || find_component(f)) ? "invalid_composition"
                                                                                  : "invalid_input";
      status = std::string(code) + ";" + e.what();
    }
    if (!ok) ++failed;
    out_row.push_back(T_text);
    out_row.push_back(status);
    io::write_csv_row(std::cout, out_row);
  }
  return failed == 0 ? exit_ok : exit_partial;
}

}  // namespace

void setup_dewpoint(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<DewOptionsCli>();
  auto* sub = app.add_subcommand(
      "dewpoint", "Hydrocarbon dew temperature at a pressure, cricondentherm and cricondenbar (GERG-2008)");
  sub->add_option("--method", opt->method, "Equation of state (gerg2008 only)");
  opt->gas.add_to(*sub, false);
  sub->add_option("--p", opt->p, "Pressure with unit, e.g. \"5 MPa\", \"725 psig\" (gauge needs --atm)");
  sub->add_option("--atm", opt->atm, "Atmospheric pressure for gauge readings, e.g. \"14.4 psia\"");
  sub->add_option("--input", opt->input, "Batch CSV (P_kPa and component columns); '-' for standard input");
  sub->add_flag("--no-bounds", opt->no_bounds, "One analysis: skip the cricondentherm and cricondenbar");
  add_format_option(*sub, opt->format);
  sub->footer(std::string("\nThe dew temperature is the highest one at the pressure (the upper dew point of the isobar);\n"
                          "above the cricondenbar there is none (batch: empty T_dew_K, status no_dew_point). Water is\n"
                          "removed from the analysis first: the water dew point is not assessed. Computed from the\n"
                          "GERG-2008 equation of state with a tangent-plane stability test; its uncertainty near the\n"
                          "dew line is that of the equation for the heavy end of the analysis.\n"
                          "Examples:\n"
                          "  zcorr dewpoint --gas \"methane=0.9,ethane=0.06,propane=0.03,n_hexane=0.01\" --p \"5 MPa\"\n"
                          "  zcorr dewpoint --method gerg2008 --input analyses.csv > dew_points.csv\n\n") +
              caution_text);
  sub->callback([opt, &exit_code] {
    exit_code = guarded("dewpoint", [&] { return opt->input.empty() ? run_single(*opt) : run_batch(*opt); });
  });
}

}  // namespace zcorr::cli
