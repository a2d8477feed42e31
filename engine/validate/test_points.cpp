#include "validate/test_points.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <stdexcept>

#include "core/components.hpp"
#include "core/units.hpp"
#include "io/csv.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "validate/export_check.hpp"

namespace zcorr::validate {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

// The gases of the point set, mole fractions in canonical component order.
// Sources (as recorded in the project's standards notes; compositions only,
// the expected answers always come from the method; two invented gases at the
// composition limits are marked as such):
//   ISO 12213-2 Annex C example gases 1, 3 and 5 (from memory, high confidence);
//   AGA Report No. 8 example gases Gulf Coast, Ekofisk and High N2
//   (from memory, medium-high), given there in mol %.
struct Gas {
  const char* name;
  const char* source;
  Fractions<double> x;
};

Fractions<double> fractions(std::initializer_list<std::pair<Component, double>> list, double scale) {
  Fractions<double> x{};
  for (const auto& [c, v] : list) x[index(c)] = v * scale;
  return x;
}

using C = Component;
const Gas& gas(int i) {
  static const Gas gases[] = {
      {"methane", "pure methane", fractions({{C::methane, 1.0}}, 1.0)},
      {"iso12213_gas1", "ISO 12213-2 Annex C gas 1 (from memory, high)",
       fractions({{C::methane, 0.965}, {C::nitrogen, 0.003}, {C::carbon_dioxide, 0.006}, {C::ethane, 0.018},
                  {C::propane, 0.0045}, {C::isobutane, 0.001}, {C::n_butane, 0.001}, {C::isopentane, 0.0005},
                  {C::n_pentane, 0.0003}, {C::n_hexane, 0.0007}},
                 1.0)},
      {"iso12213_gas3", "ISO 12213-2 Annex C gas 3 (from memory, high)",
       fractions({{C::methane, 0.859}, {C::nitrogen, 0.010}, {C::carbon_dioxide, 0.015}, {C::ethane, 0.085},
                  {C::propane, 0.023}, {C::isobutane, 0.0035}, {C::n_butane, 0.0035}, {C::isopentane, 0.0005},
                  {C::n_pentane, 0.0005}},
                 1.0)},
      {"iso12213_gas5", "ISO 12213-2 Annex C gas 5 (from memory, high)",
       fractions({{C::methane, 0.812}, {C::nitrogen, 0.057}, {C::carbon_dioxide, 0.076}, {C::ethane, 0.043},
                  {C::propane, 0.009}, {C::isobutane, 0.0015}, {C::n_butane, 0.0015}},
                 1.0)},
      {"aga8_gulf_coast", "AGA Report No. 8 Gulf Coast gas (from memory, medium-high)",
       fractions({{C::methane, 96.5222}, {C::nitrogen, 0.2595}, {C::carbon_dioxide, 0.5956}, {C::ethane, 1.8186},
                  {C::propane, 0.4596}, {C::isobutane, 0.0977}, {C::n_butane, 0.1007}, {C::isopentane, 0.0473},
                  {C::n_pentane, 0.0324}, {C::n_hexane, 0.0664}},
                 0.01)},
      {"aga8_ekofisk", "AGA Report No. 8 Ekofisk gas (from memory, medium-high)",
       fractions({{C::methane, 85.9063}, {C::nitrogen, 1.0068}, {C::carbon_dioxide, 1.4954}, {C::ethane, 8.4919},
                  {C::propane, 2.3015}, {C::isobutane, 0.3486}, {C::n_butane, 0.3506}, {C::isopentane, 0.0509},
                  {C::n_pentane, 0.0480}},
                 0.01)},
      {"aga8_high_n2", "AGA Report No. 8 High N2 gas (from memory, medium-high)",
       fractions({{C::methane, 81.441}, {C::nitrogen, 13.465}, {C::carbon_dioxide, 0.985}, {C::ethane, 3.300},
                  {C::propane, 0.605}, {C::isobutane, 0.100}, {C::n_butane, 0.104}},
                 0.01)},
      // Invented for the point set: at the edges of the ISO 12213-2 pipeline-quality
      // composition limits (methane >= 0.70, ethane <= 0.10, CO2 <= 0.20, H2 <= 0.10;
      // from memory, medium).
      {"edge_lean_methane", "invented at the ISO 12213-2 limits: methane 0.70 (minimum) and ethane 0.10 (maximum); limits from memory",
       fractions({{C::methane, 0.70}, {C::ethane, 0.10}, {C::nitrogen, 0.10}, {C::carbon_dioxide, 0.10}}, 1.0)},
      {"edge_hydrogen", "invented at the ISO 12213-2 hydrogen limit (0.10); limit from memory",
       fractions({{C::methane, 0.85}, {C::hydrogen, 0.10}, {C::nitrogen, 0.03}, {C::ethane, 0.02}}, 1.0)},
  };
  return gases[i];
}
enum GasId { methane, gas1, gas3, gas5, gulf_coast, ekofisk, high_n2, edge_lean, edge_h2 };

struct Box {
  double T_min_K, T_max_K, p_max_Pa;
  const char* source;
};
// The pipeline region every method covers: ISO 12213-1 scope, about 263-338 K
// up to 12 MPa (read in its published abstract).
constexpr Box pipeline{263.15, 338.15, 12e6, "ISO 12213-1 scope: 263-338 K, up to 12 MPa"};

Box method_box(MethodId m) {
  switch (m) {
    case MethodId::gerg2008:
      // Kunz & Wagner 2012 (abstract): normal range 90-450 K, up to 35 MPa.
      return {90.0, 450.0, 35e6, "GERG-2008 normal range: 90-450 K, up to 35 MPa (Kunz & Wagner 2012)"};
    case MethodId::detail:
      // ISO 12213-2 applies the AGA8 detail method in the ISO 12213 scope;
      // the wider AGA 8 ranges are known only from memory, so the points stay
      // inside the ISO box.
      return {pipeline.T_min_K, pipeline.T_max_K, pipeline.p_max_Pa, pipeline.source};
    default:
      throw std::invalid_argument(std::string("test points need a method that takes a detailed analysis (gerg2008 or detail), not ") +
                                  std::string(method_name(m)));
  }
}

constexpr double T60F = (60.0 + 459.67) / 1.8;
constexpr double psia1000 = 1000.0 * units::psi;

}  // namespace

PointSet generate_points(LineMethod& method, const BaseConditions& base, const EvalOptions& eval) {
  PointSet set;
  set.method = method.id();
  set.base = base;
  const Box mb = method_box(set.method);
  set.range_note = mb.source;
  struct Spec {
    std::string id, why;
    int gas;
    double T_K, p_Pa;
  };
  std::vector<Spec> specs = {
      {"pipe-01", "typical pipeline gas at a common line state (60 degF and 1000 psia)", gulf_coast, T60F, psia1000},
      {"pipe-02", "lean pipeline gas on a cool line at moderate pressure", gas1, 278.15, 3e6},
      {"pipe-03", "rich pipeline gas (8.5 % ethane and 2.3 % propane) at high line pressure", gas3, 298.15, 9e6},
      {"pipe-04", "high-CO2 gas (7.6 % CO2 and 5.7 % N2)", gas5, 283.15, 5e6},
      {"pipe-05", "high-nitrogen gas (13.5 % N2) at 60 degF and 1000 psia", high_n2, T60F, psia1000},
      {"pipe-06", "rich North Sea gas (8.5 % ethane; 2.3 % propane; 0.7 % butanes)", ekofisk, 288.15, 7e6},
      {"base-01", "state equal to the base conditions: Z_f must equal Z_b and C must be 1", gulf_coast, base.T_K, base.p_Pa},
      {"low-01", "low pressure just above the base: Z close to 1", gas1, 288.15, 0.2e6},
      {"edge-01", "cold high-pressure corner of the pipeline range", gas1, pipeline.T_min_K, pipeline.p_max_Pa},
      {"edge-02", "hot high-pressure corner of the pipeline range", gas1, pipeline.T_max_K, pipeline.p_max_Pa},
      {"edge-03", "cold low-pressure corner of the pipeline range with the rich gas", gas3, pipeline.T_min_K, 0.5e6},
      {"edge-04", "hot low-pressure corner of the pipeline range with the rich gas", gas3, pipeline.T_max_K, 0.5e6},
      {"crit-01",
       "rich gas at the lowest pipeline temperature and mid pressure: Z near its minimum and most sensitive to T and P "
       "(closest to the mixture's critical region inside the pipeline range)",
       gas3, pipeline.T_min_K, 7e6},
      {"crit-02", "as crit-01 for the richest gas of the set", ekofisk, pipeline.T_min_K, 6e6},
      {"comp-01", "composition edge: least methane and most ethane of pipeline quality (with 10 % N2 and 10 % CO2)",
       edge_lean, 288.15, 6e6},
      {"comp-02", "composition edge: hydrogen-blended gas at the pipeline-quality hydrogen limit (10 % H2)", edge_h2,
       288.15, 6e6},
  };
  // States beyond the pipeline region, where the method's own range reaches them.
  if (mb.T_min_K <= 195.0 && mb.p_max_Pa >= 5e6)
    specs.push_back({"wide-01",
                     "pure methane just above its critical point (190.564 K and 4.5992 MPa per Setzmann & Wagner 1991; "
                     "from memory): the steepest Z surface of the set",
                     methane, 195.0, 5e6});
  if (mb.T_min_K <= 150.0)
    specs.push_back({"wide-02", "low-temperature gas state: pure methane at 150 K and 0.5 MPa (below its vapour pressure of about 1 MPa; from memory)",
                     methane, 150.0, 0.5e6});
  if (mb.T_min_K <= 250.0 && mb.p_max_Pa >= 20e6)
    specs.push_back({"wide-03", "lean gas in a high-pressure state below the pipeline temperatures", gas1, 250.0, 20e6});
  if (mb.p_max_Pa > pipeline.p_max_Pa)
    specs.push_back({"wide-04", "highest pressure of the method's normal range at ambient temperature", gas1, 300.0, mb.p_max_Pa});
  if (mb.T_max_K > pipeline.T_max_K && mb.p_max_Pa > pipeline.p_max_Pa)
    specs.push_back({"wide-05", "upper temperature and pressure corner of the method's normal range", gas1, mb.T_max_K, mb.p_max_Pa});

  int prepared = -1;
  Status prep{};
  double Z_b = nan;
  Status base_status{};
  for (const auto& s : specs) {
    const Gas& g = gas(s.gas);
    if (s.gas != prepared) {
      prep = method.prepare(g.x);
      base_status = prep;
      Z_b = nan;
      if (prep.ok()) {
        auto b = method.state(base.T_K, base.p_Pa, eval);
        base_status = b.status;
        if (b.status.ok()) Z_b = b[Quantity::Z];
      }
      prepared = s.gas;
    }
    if (!base_status.ok()) {
      set.skipped.push_back({s.id, s.why, base_status});
      continue;
    }
    auto out = method.state(s.T_K, s.p_Pa, eval);
    if (!out.status.ok()) {
      set.skipped.push_back({s.id, s.why, out.status});
      continue;
    }
    auto f = correction_factors(s.p_Pa, s.T_K, out[Quantity::Z], base.p_Pa, base.T_K, Z_b);
    if (!f.status.ok()) {
      set.skipped.push_back({s.id, s.why, f.status});
      continue;
    }
    TestPoint p;
    p.id = s.id;
    p.why = s.why;
    p.gas = g.name;
    p.gas_source = g.source;
    p.x = g.x;
    p.T_K = s.T_K;
    p.p_Pa = s.p_Pa;
    p.Z_f = out[Quantity::Z];
    p.Z_b = Z_b;
    p.C = f.C;
    p.status = out.status;
    set.points.push_back(std::move(p));
  }
  return set;
}

namespace {
constexpr int answer_digits = 10;  // significant digits of expected values: rounding <= 5e-10 relative
constexpr double expected_agreement_ppm = 0.05;
const std::string mol_pct_suffix = "_mol_pct";
}  // namespace

void write_points_csv(std::ostream& out, const PointSet& set, const Tolerances& tol) {
  std::array<bool, max_components> used{};
  for (const auto& p : set.points)
    for (std::size_t i = 0; i < max_components; ++i)
      if (p.x[i] != 0.0) used[i] = true;
  out << "# zcorr test points 1\n"
      << "# method: " << method_name(set.method) << "; range: " << set.range_note << "\n"
      << "# base conditions: " << set.base.name << " (T_b = " << io::format_sig(set.base.T_K, 10)
      << " K, p_b = " << io::format_sig(set.base.p_Pa / 1000.0, 10) << " kPa)\n"
      << "# Key each point's T, P (absolute) and analysis (mol %) into the flow computer with these base conditions,\n"
      << "# and write what it shows in Z_f_reported, Z_b_reported and C_reported (leave a cell empty if not shown).\n"
      << "# Then run: zcorr validate answers --file <this file>\n"
      << "# Tolerance (ppm, relative): Z_f " << io::format_number(tol[Checked::Z_f]) << ", Z_b "
      << io::format_number(tol[Checked::Z_b]) << ", C " << io::format_number(tol[Checked::C]) << "\n";
  std::vector<std::string_view> listed;
  for (const auto& p : set.points) {
    if (std::find(listed.begin(), listed.end(), p.gas) != listed.end()) continue;
    listed.push_back(p.gas);
    out << "# gas " << p.gas << ": " << p.gas_source << "\n";
  }
  std::vector<std::string> head{"point", "why", "gas", "method", "base_T_K", "base_P_kPa", "T_K", "T_degC",
                                "T_degF", "P_kPa", "P_MPa", "P_psia"};
  for (std::size_t i = 0; i < max_components; ++i)
    if (used[i]) head.push_back(std::string(component_name(i)) + mol_pct_suffix);
  head.insert(head.end(), {"status", "Z_f_expected", "Z_b_expected", "C_expected", "Z_f_reported", "Z_b_reported", "C_reported"});
  io::write_csv_row(out, head);
  for (const auto& p : set.points) {
    std::vector<std::string> row{p.id,
                                 p.why,
                                 p.gas,
                                 std::string(method_name(set.method)),
                                 io::format_number(set.base.T_K),
                                 io::format_number(set.base.p_Pa / 1000.0),
                                 io::format_number(p.T_K),
                                 io::format_sig(units::K_to_celsius(p.T_K), 9),
                                 io::format_sig(units::K_to_fahrenheit(p.T_K), 9),
                                 io::format_number(p.p_Pa / 1000.0),
                                 io::format_sig(p.p_Pa / units::MPa, 9),
                                 io::format_sig(p.p_Pa / units::psi, 9)};
    for (std::size_t i = 0; i < max_components; ++i)
      if (used[i]) row.push_back(io::format_sig(p.x[i] * 100.0, 10));
    row.insert(row.end(), {status_brief(p.status), io::format_sig(p.Z_f, answer_digits), io::format_sig(p.Z_b, answer_digits),
                           io::format_sig(p.C, answer_digits), "", "", ""});
    io::write_csv_row(out, row);
  }
}

AnswerReport compare_answers(std::istream& in, std::string_view name, const Tolerances& tol,
                             const MethodProvider& provider, const EvalOptions& eval) {
  AnswerReport rep;
  rep.tolerances = tol;
  rep.expected_checked = static_cast<bool>(provider);
  io::CsvReader reader(in);
  std::vector<std::string> header, row;
  for (;;) {
    if (!reader.next(header)) throw io::InputError("--file", std::string(name), "the file is empty (a header line is required)");
    if (!header.empty() && !io::trim(header[0]).empty() && io::trim(header[0]).front() == '#') continue;
    break;
  }
  std::map<std::string, int> col;
  for (std::size_t c = 0; c < header.size(); ++c) {
    const std::string h(io::trim(header[c]));
    if (!col.emplace(h, static_cast<int>(c)).second)
      throw io::InputError("--file " + std::string(name) + " header", h, "the column appears twice");
  }
  auto need = [&](const std::string& h) {
    auto it = col.find(h);
    if (it == col.end())
      throw io::InputError("--file " + std::string(name) + " header", h,
                           "this column is missing; the file must be a points file written by 'zcorr validate points'");
    return it->second;
  };
  const int c_point = need("point"), c_method = need("method"), c_bT = need("base_T_K"), c_bP = need("base_P_kPa"),
            c_T = need("T_K"), c_P = need("P_kPa");
  std::array<int, checked_count> c_exp{}, c_rep{};
  c_exp.fill(-1);
  c_rep.fill(-1);
  for (std::size_t k = 0; k < 3; ++k) {
    c_exp[k] = need(std::string(checked_names[k]) + "_expected");
    c_rep[k] = need(std::string(checked_names[k]) + "_reported");
  }
  std::array<int, max_components> c_x;
  c_x.fill(-1);
  for (std::size_t i = 0; i < max_components; ++i)
    if (auto it = col.find(std::string(component_name(i)) + mol_pct_suffix); it != col.end()) c_x[i] = it->second;

  std::size_t n = 0;
  while (reader.next(row)) {
    RowResult r;
    r.row = ++n;
    r.line = reader.line();
    const std::string where = "row " + std::to_string(n) + " (line " + std::to_string(r.line) + ")";
    try {
      if (row.size() != header.size())
        throw io::InputError(where, std::to_string(row.size()) + " fields", "expected " + std::to_string(header.size()));
      auto at = [&](int c) -> const std::string& { return row[static_cast<std::size_t>(c)]; };
      r.label = std::string(io::trim(at(c_point)));
      std::array<double, 3> expected{}, reported{};
      for (std::size_t k = 0; k < 3; ++k) {
        expected[k] = io::parse_number(at(c_exp[k]), where + " " + std::string(checked_names[k]) + "_expected");
        reported[k] = io::trim(at(c_rep[k])).empty()
                          ? nan
                          : io::parse_number(at(c_rep[k]), where + " " + std::string(checked_names[k]) + "_reported");
      }
      if (provider) {
        const std::string mname(io::trim(at(c_method)));
        auto id = method_from_name(mname);
        if (!id) throw io::InputError(where + " method", mname, "not a zcorr method name");
        LineMethod* m = provider(*id);
        if (!m) throw io::InputError(where + " method", mname, "this method is not available in this build of zcorr");
        const double T = io::parse_number(at(c_T), where + " T_K");
        const double P = io::parse_number(at(c_P), where + " P_kPa") * 1000.0;
        const double bT = io::parse_number(at(c_bT), where + " base_T_K");
        const double bP = io::parse_number(at(c_bP), where + " base_P_kPa") * 1000.0;
        Fractions<double> x{};
        for (std::size_t i = 0; i < max_components; ++i)
          if (c_x[i] >= 0 && !io::trim(at(c_x[i])).empty())
            x[i] = io::parse_number(at(c_x[i]), where + " " + std::string(component_name(i)) + mol_pct_suffix) * 0.01;
        auto prep = m->prepare(x);
        if (!prep.ok()) throw io::InputError(where + " analysis", status_brief(prep), "the method refuses this analysis");
        auto b = m->state(bT, bP, eval);
        auto s = m->state(T, P, eval);
        r.status = s.status;
        if (!b.status.ok() || !s.status.ok())
          throw io::InputError(where + " state", status_brief(s.status.ok() ? b.status : s.status),
                               "the method cannot compute this point");
        auto f = correction_factors(P, T, s[Quantity::Z], bP, bT, b[Quantity::Z]);
        const std::array<double, 3> again{s[Quantity::Z], b[Quantity::Z], f.C};
        for (std::size_t k = 0; k < 3; ++k)
          if (!(std::abs(expected[k] - again[k]) <= expected_agreement_ppm * 1e-6 * std::abs(again[k])))
            throw io::InputError(where + " " + std::string(checked_names[k]) + "_expected", at(c_exp[k]),
                                 "it differs from a recomputation (" + io::format_sig(again[k], answer_digits) +
                                     "): the file was altered or made by another version; regenerate the points");
      }
      r.recomputed = true;
      for (std::size_t k = 0; k < 3; ++k) r.q[k] = compare_value(reported[k], expected[k], tol.ppm[k]);
    } catch (const io::InputError& e) {
      r.recomputed = false;
      r.status = make_status(Code::invalid_input);
      r.problem = e.what();
    }
    rep.rows.push_back(std::move(r));
  }
  if (rep.rows.empty()) throw io::InputError("--file", std::string(name), "the file has a header but no points");
  summarise(rep);
  return rep;
}

}  // namespace zcorr::validate
