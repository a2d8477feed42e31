// zcorr demo: a fictional town-border station, one contract day of hourly
// readings with a fixed gas analysis, converted to base volume and energy.
//
// Everything in this scenario is invented for the demonstration: the station
// ("Hollin Ford", meter run HF-1), its readings and its gas analysis.
#include <cmath>
#include <iomanip>
#include <iostream>
#include <memory>
#include <numbers>
#include <sstream>

#include "base_options.hpp"
#include "commands.hpp"
#include "common.hpp"
#include "eval/conversion.hpp"
#include "io/composition_parse.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "method_options.hpp"

namespace zcorr::cli {
namespace {

// Fictional analysis of the demo (mole fractions, sum 1).
constexpr const char* demo_gas =
    "methane=0.9120, ethane=0.0450, propane=0.0110, isobutane=0.0015, n_butane=0.0018, isopentane=0.0005, "
    "n_pentane=0.0004, n_hexane=0.0003, nitrogen=0.0165, carbon_dioxide=0.0110";
constexpr double demo_atm_kPa = 100.9;  // fictional site barometric pressure

struct Reading {
  int hour;          // hour ending, contract day starting 06:00
  double p_kPag;     // line pressure, gauge
  double T_degC;     // line temperature
  double V_f_m3;     // turbine meter volume in the hour, line conditions
};

// The day's readings: a smooth pressure swing, a daily temperature swing and a
// morning and evening demand peak, rounded as a flow computer would show them.
Reading reading(int h) {
  const double two_pi = 2.0 * std::numbers::pi;
  Reading r;
  r.hour = h;
  r.p_kPag = std::round(10.0 * (4150.0 + 80.0 * std::sin(two_pi * (h - 4) / 24.0))) / 10.0;
  r.T_degC = std::round(100.0 * (9.0 + 3.0 * std::sin(two_pi * (h - 9) / 24.0))) / 100.0;
  const double t = h + 6;  // clock hour
  r.V_f_m3 = std::round(10.0 * (1400.0 + 900.0 * std::exp(-std::pow((t - 8.0) / 1.8, 2)) +
                                 1100.0 * std::exp(-std::pow((t - 18.5) / 2.2, 2)))) / 10.0;
  return r;
}

struct DemoOptions {
  MethodOptions method;
  BaseOptions base;
};

std::string fixed(double v, int decimals) {
  std::ostringstream s;
  s << std::fixed << std::setprecision(decimals) << v;
  return s.str();
}

int run_demo(const DemoOptions& o) {
  const auto comp = io::parse_composition_list(demo_gas, {});
  auto method = o.method.make();
  auto st = method->prepare(comp.x);
  if (!st.ok()) throw io::InputError("demo gas", demo_gas, std::string("refused: ") + status_text(st));
  ConverterSetup setup;
  setup.method = method.get();
  setup.gas = comp.x;
  setup.base = o.base.resolve();
  setup.combustion = default_combustion_for(setup.base.T_K);
  setup.eval = o.method.eval_options(false);
  Converter conv(setup);
  if (!conv.status().ok()) throw io::InputError("demo", std::string(setup.base.name), std::string(conv.setup_message()));

  std::cout << "zcorr demo: Hollin Ford town-border station, meter run HF-1 (a fictional scenario)\n"
            << "Contract day 06:00-06:00, hourly readings, one gas analysis for the whole day.\n"
            << "  method      " << o.method.method << " (Z_f and Z_b)\n"
            << "  base        " << setup.base.name << ": " << setup.base.description << '\n'
            << "  atmosphere  " << demo_atm_kPa << " kPa\n"
            << "  gas         " << demo_gas << '\n'
            << "  Z_b         " << fixed(conv.Z_b(), 6) << "   Hs " << fixed(conv.Hs_MJ_per_m3(), 4)
            << " MJ/m3 (ISO 6976, combustion " << combustion_ref_name(setup.combustion) << ")\n\n";
  std::cout << " hour     p_f kPag  T_f degC    V_f m3      Z_f          C       V_b m3     energy GJ\n";
  double sum_Vf = 0, sum_Vb = 0, sum_E = 0, sum_m = 0;
  int not_computed = 0;
  for (int h = 1; h <= 24; ++h) {
    const auto r = reading(h);
    const double p_f = (r.p_kPag + demo_atm_kPa) * 1000.0;
    const double T_f = r.T_degC + 273.15;
    auto c = conv.convert(r.V_f_m3, T_f, p_f);
    const int start = (r.hour + 5) % 24, end = (r.hour + 6) % 24;
    std::cout << ' ' << std::setfill('0') << std::setw(2) << start << "-" << std::setw(2) << end << std::setfill(' ') << std::setw(9) << fixed(r.p_kPag, 1) << std::setw(10) << fixed(r.T_degC, 2)
              << std::setw(10) << fixed(r.V_f_m3, 1);
    if (!c.status.ok()) {
      ++not_computed;
      std::cout << "   not computed: " << status_text(c.status) << '\n';
      continue;
    }
    std::cout << std::setw(11) << fixed(c.Z_f, 6) << std::setw(11) << fixed(c.factors.C, 5) << std::setw(13)
              << fixed(c.V_b_m3, 1) << std::setw(13) << fixed(c.energy_MJ / 1000.0, 3) << '\n';
    sum_Vf += r.V_f_m3;
    sum_Vb += c.V_b_m3;
    sum_E += c.energy_MJ;
    sum_m += c.mass_kg;
  }
  std::cout << "\n  day total   V_f " << fixed(sum_Vf, 1) << " m3   V_b " << fixed(sum_Vb, 1) << " m3 (" << setup.base.name
            << ")   energy " << fixed(sum_E / 1000.0, 3) << " GJ   mass " << fixed(sum_m / 1000.0, 3) << " t\n";
  if (not_computed) std::cout << "  " << not_computed << " hour(s) not computed\n";
  std::cout << '\n' << caution_text << '\n';
  return not_computed == 0 ? exit_ok : exit_partial;
}

}  // namespace

void setup_demo(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<DemoOptions>();
  auto* sub = app.add_subcommand("demo", "Run the demonstration: a fictional station's day of hourly readings, converted");
  opt->method.add_to(*sub);
  opt->base.add_to(*sub);
  sub->footer("\nExample:\n  zcorr demo --method gerg2008 --base iso15\n");
  sub->callback([opt, &exit_code] { exit_code = guarded("demo", [&] { return run_demo(*opt); }); });
}

}  // namespace zcorr::cli
