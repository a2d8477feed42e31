// SGERG-88 (ISO 12213-3) and the AGA8 gross methods 1 and 2: agreement with
// GERG-2008 reference states, the characterization, the virial limit, ranges,
// refusals, double vs 50 digits, and no heap allocation on the compute path.
#include <gtest/gtest.h>

#include "support/allocation_counter.hpp"

#include <algorithm>
#include <atomic>
#include <boost/multiprecision/cpp_bin_float.hpp>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <new>
#include <string>
#include <vector>

#include "eval/line_method.hpp"
#include "io/composition_parse.hpp"
#include "io/csv.hpp"
#include "io/text.hpp"
#include "methods/aga8_gross.hpp"
#include "methods/iso6976.hpp"
#include "methods/sgerg88.hpp"


using namespace zcorr;
using mp50 = boost::multiprecision::cpp_bin_float_50;

namespace {

// ---- the GERG-2008 reference states ----------------------------------------
// Source: GERG-2008 reference states, teqp strict model, shared data set
// gerg2008-reference (tests/data/gerg2008/states.csv, provenance in
// tests/data/gerg2008/README.md).
struct RefState {
  std::string id, gas;
  double T_K = 0, P_kPa = 0, Z = 0, B = 0;
  Fractions<double> x{};
};

const std::vector<RefState>& reference_states() {
  static const std::vector<RefState> states = [] {
    std::vector<RefState> out;
    std::ifstream f(std::string(ZCORR_SOURCE_DIR) + "/tests/data/gerg2008/states.csv");
    io::CsvReader r(f);
    std::vector<std::string> head, row;
    if (!r.next(head)) return out;
    while (r.next(row)) {
      RefState s;
      s.id = row[0];
      s.gas = s.id.substr(0, s.id.find("_T"));
      s.T_K = std::stod(row[1]);
      s.P_kPa = std::stod(row[2]);
      s.Z = std::stod(row[3]);
      s.B = std::stod(row[5]);
      for (std::size_t c = 6; c < head.size(); ++c) {
        auto comp = find_component(head[c]);
        if (comp) s.x[index(*comp)] = std::stod(row[c]);
      }
      out.push_back(s);
    }
    return out;
  }();
  return states;
}

double x_of(const RefState& s, Component c) { return s.x[index(c)]; }
double c3_plus(const RefState& s) {
  double v = 0;
  for (auto c : {Component::propane, Component::n_butane, Component::isobutane, Component::n_pentane, Component::isopentane,
                 Component::n_hexane, Component::n_heptane, Component::n_octane, Component::n_nonane, Component::n_decane})
    v += x_of(s, c);
  return v;
}
// Hydrogen-free pipeline gas (the done-when selection): no H2, some methane
// and a heating value (pure nitrogen is not a natural gas).
bool pipeline_h2_free(const RefState& s) {
  return x_of(s, Component::hydrogen) == 0.0 && x_of(s, Component::methane) >= 0.70;
}

struct Deviation {
  const RefState* s;
  double dev;
  Status st;
};

struct Stats {
  std::size_t n = 0;
  double median = 0, max = 0;
};
Stats stats_of(std::vector<Deviation> d) {
  Stats s;
  s.n = d.size();
  if (d.empty()) return s;
  std::vector<double> a;
  for (auto& e : d) a.push_back(std::abs(e.dev));
  std::sort(a.begin(), a.end());
  s.median = a.size() % 2 ? a[a.size() / 2] : 0.5 * (a[a.size() / 2 - 1] + a[a.size() / 2]);
  s.max = a.back();
  return s;
}

void print_largest(const char* title, std::vector<Deviation> d, std::size_t k) {
  std::sort(d.begin(), d.end(), [](const Deviation& a, const Deviation& b) { return std::abs(a.dev) > std::abs(b.dev); });
  std::printf("%s: largest deviations Z_method/Z_reference - 1\n", title);
  std::printf("  %-22s %9s %8s %10s %8s %8s %8s %8s\n", "state", "dev", "T_K", "P_kPa", "x_C2", "x_C3+", "C2/C3+", "x_CO2");
  for (std::size_t i = 0; i < std::min(k, d.size()); ++i) {
    const auto& s = *d[i].s;
    const double c2 = x_of(s, Component::ethane), c3 = c3_plus(s);
    std::printf("  %-22s %+9.2e %8.2f %10.3f %8.4f %8.4f %8s %8.4f\n", s.id.c_str(), d[i].dev, s.T_K, s.P_kPa, c2, c3,
                c3 > 0 ? std::to_string(c2 / c3).substr(0, 6).c_str() : "-", x_of(s, Component::carbon_dioxide));
  }
}

std::vector<Deviation> run_against_gerg(MethodId m, double T_lo, double T_hi, double p_hi_kPa) {
  auto method = make_line_method(m);
  std::vector<Deviation> out;
  if (!method) return out;
  for (const auto& s : reference_states()) {
    if (!pipeline_h2_free(s) || s.T_K < T_lo || s.T_K > T_hi || s.P_kPa > p_hi_kPa) continue;
    const Status ps = method->prepare(s.x);
    Deviation d{&s, std::nan(""), ps};
    if (ps.ok()) {
      const auto r = method->state(s.T_K, s.P_kPa * 1000.0, EvalOptions{});
      d.st = r.status;
      if (r.status.ok()) d.dev = r[Quantity::Z] / s.Z - 1.0;
    }
    out.push_back(d);
  }
  return out;
}

}  // namespace

// Done-when of the method: hydrogen-free pipeline gas, 265-335 K, <= 12 MPa,
// through the composition route (ISO 6976 reduction): median |dZ| <= 0.03 %,
// max <= 0.8 %. Source: GERG-2008 reference states (teqp strict model, shared
// data set gerg2008-reference). The data set's README reports for its larger
// held-back selection max 6.4e-3, median 1.6e-4 for H2-free gases: the
// one-parameter hydrocarbon characterization limits the agreement, with the
// sign and size following the ethane to C3+ ratio.
TEST(Sgerg88, AgreesWithGerg2008ReferenceStatesHydrogenFree) {
  auto d = run_against_gerg(MethodId::sgerg88, 265.0, 335.0, 12000.0);
  ASSERT_GE(d.size(), 100u);
  for (const auto& e : d) ASSERT_TRUE(e.st.ok()) << e.s->id << " " << code_name(e.st.code);
  const auto st = stats_of(d);
  std::printf("sgerg88 vs GERG-2008, H2-free pipeline gas, 265-335 K, <= 12 MPa: n = %zu, median %.2e, max %.2e\n", st.n,
              st.median, st.max);
  print_largest("sgerg88", d, 12);
  EXPECT_LE(st.median, 3e-4);
  EXPECT_LE(st.max, 8e-3);
}

// What the deviations depend on: at 273.15 K / 12 MPa the ethane-rich gas
// (G10: 9.2 % ethane, C2/C3+ = 4) reads high and the ethane-free gas with
// heavy ends (G30) reads low; a lean gas without C2+ (G38) lies in between.
// Same source; the pattern is the one the data set's README describes.
TEST(Sgerg88, DeviationFollowsEthaneToPropaneRatio) {
  auto d = run_against_gerg(MethodId::sgerg88, 273.0, 273.2, 12000.0);
  double g10 = NAN, g30 = NAN, g38 = NAN;
  for (const auto& e : d)
    if (e.s->P_kPa == 12000.0) {
      if (e.s->gas == "G10") g10 = e.dev;
      if (e.s->gas == "G30") g30 = e.dev;
      if (e.s->gas == "G38") g38 = e.dev;
    }
  ASSERT_FALSE(std::isnan(g10) || std::isnan(g30) || std::isnan(g38));
  std::printf("273.15 K / 12 MPa: G10 (C2-rich) %+.2e, G38 (no C2+) %+.2e, G30 (no C2, C6+) %+.2e\n", g10, g38, g30);
  EXPECT_GT(g10, 0.0);
  EXPECT_LT(g30, 0.0);
  EXPECT_GT(g10, g38);
  EXPECT_GT(g38, g30);
}

// AGA8 gross methods 1 and 2 within their stated range (32-130 degF, up to
// 1200 psia = 8274 kPa), composition route (ISO 6976 at 60 degF, 14.73 psia).
// Source: GERG-2008 reference states (shared data set gerg2008-reference).
// Bounds: the same done-when as SGERG-88 (median 0.03 %, max 0.8 %).
TEST(Aga8Gross, BothMethodsAgreeWithGerg2008WithinTheirRange) {
  for (auto m : {MethodId::gross1, MethodId::gross2}) {
    auto d = run_against_gerg(m, 273.15, 327.59, 8274.0);
    ASSERT_GE(d.size(), 60u);
    for (const auto& e : d) ASSERT_TRUE(e.st.ok()) << e.s->id << " " << code_name(e.st.code);
    const auto st = stats_of(d);
    std::printf("%s vs GERG-2008, H2-free, 32-130 degF, <= 1200 psia: n = %zu, median %.2e, max %.2e\n",
                std::string(method_name(m)).c_str(), st.n, st.median, st.max);
    print_largest(std::string(method_name(m)).c_str(), d, 5);
    EXPECT_LE(st.median, 3e-4);
    EXPECT_LE(st.max, 8e-3);
  }
}

// AGA8 detail method as a second reference (when it is built into this
// binary): the same selection and bounds. Source: the detail method of this
// project (AGA Report No. 8 / ISO 12213-2), itself checked against GERG-2008.
TEST(Sgerg88, AgreesWithDetailMethod) {
  auto detail = make_line_method(MethodId::detail);
  if (!detail) GTEST_SKIP() << "the detail method is not built into this binary";
  auto sg = make_line_method(MethodId::sgerg88);
  std::vector<Deviation> d;
  for (const auto& s : reference_states()) {
    if (!pipeline_h2_free(s) || s.T_K < 265.0 || s.T_K > 335.0 || s.P_kPa > 12000.0) continue;
    ASSERT_TRUE(sg->prepare(s.x).ok());
    ASSERT_TRUE(detail->prepare(s.x).ok()) << s.id;
    const auto a = sg->state(s.T_K, s.P_kPa * 1e3, EvalOptions{});
    const auto b = detail->state(s.T_K, s.P_kPa * 1e3, EvalOptions{});
    ASSERT_TRUE(a.status.ok() && b.status.ok()) << s.id;
    d.push_back({&s, a[Quantity::Z] / b[Quantity::Z] - 1.0, a.status});
  }
  const auto st = stats_of(d);
  std::printf("sgerg88 vs detail: n = %zu, median %.2e, max %.2e\n", st.n, st.median, st.max);
  print_largest("sgerg88 vs detail", d, 5);
  EXPECT_LE(st.median, 3e-4);
  EXPECT_LE(st.max, 8e-3);
}

// The mixture B of SGERG-88 against the GERG-2008 mixture B of the reference
// data (H2-free gases, 265-335 K). Source: shared data set gerg2008-reference
// (B_cm3_per_mol column). Bound 2 cm3/mol: the data set's README finds the
// components within 0.3 cm3/mol (hydrocarbon), 1.4 cm3/mol (CO2), and the
// characterization adds up to 0.5 cm3/mol for unusual hydrocarbon make-up.
TEST(Sgerg88, SecondVirialCoefficientNearGerg2008) {
  auto m = make_line_method(MethodId::sgerg88);
  double worst = 0;
  std::string where;
  for (const auto& s : reference_states()) {
    if (!pipeline_h2_free(s) || s.T_K < 265.0 || s.T_K > 335.0 || s.P_kPa > 102.0) continue;
    ASSERT_TRUE(m->prepare(s.x).ok());
    const auto r = m->state(s.T_K, s.P_kPa * 1e3, EvalOptions{});
    ASSERT_TRUE(r.status.ok());
    const double dB = r[Quantity::B_cm3_per_mol] - s.B;
    if (std::abs(dB) > std::abs(worst)) { worst = dB; where = s.id; }
  }
  std::printf("largest |B_SGERG - B_GERG| = %.3f cm3/mol at %s\n", worst, where.c_str());
  EXPECT_LE(std::abs(worst), 2.0);
}

// (Z - 1) / rho -> B as rho -> 0 (a property of every virial form; for
// SGERG-88 (Z - 1)/rho = B + C rho exactly). Source: definition of the
// virial coefficients.
TEST(Sgerg88, LowDensityLimitGivesB) {
  auto m = sgerg88::prepare(sgerg88::GrossInput<double>{40.66, 0.581, 0.006, 0.0});
  ASSERT_TRUE(m.status.ok());
  for (double T : {265.0, 300.0, 335.0}) {
    const auto lo = sgerg88::z_factor(m, T, 10.0);
    const auto mid = sgerg88::z_factor(m, T, 1000.0);
    ASSERT_TRUE(lo.status.ok() && mid.status.ok());
    const double lim = (lo.Z - 1.0) / (lo.rho_mol_per_L * 1e-3);  // cm3/mol
    EXPECT_NEAR(lim, lo.B_cm3_per_mol, 1e-4 * std::abs(lo.B_cm3_per_mol)) << T;
    const double slope = ((mid.Z - 1.0) / (mid.rho_mol_per_L * 1e-3) - mid.B_cm3_per_mol) / (mid.rho_mol_per_L * 1e-3);
    EXPECT_NEAR(slope, mid.C_cm6_per_mol2, 1e-6 * mid.C_cm6_per_mol2) << T;  // the C term
    EXPECT_NEAR(mid.Z_virial2, mid.Z, 1e-13);
  }
  const auto zero = sgerg88::z_factor(m, 300.0, 0.0);
  EXPECT_TRUE(zero.status.ok());
  EXPECT_EQ(zero.Z, 1.0);
  // Pressures so small that the density underflows (the smallest subnormal,
  // 1e-300 Pa): the ideal-gas limit, finite, never 0/0. The gross methods
  // share the solver.
  const auto g1 = aga8_gross::prepare_method1(aga8_gross::Method1Input<double>{38.0, 0.6, 0.01, 0.0});
  ASSERT_TRUE(g1.status.ok());
  for (double p : {4.9e-324, 1e-300, 1e-90}) {
    for (const auto& st : {sgerg88::z_factor(m, 300.0, p), aga8_gross::z_factor(g1, 290.0, p)}) {
      EXPECT_TRUE(st.status.ok()) << p;
      EXPECT_EQ(st.Z, 1.0) << p;
      EXPECT_TRUE(std::isfinite(st.rho_mol_per_L) && st.rho_mol_per_L >= 0.0) << p;
    }
  }
}

// Characterization round trip: the characterized gas reproduces Hs and d
// (identity of the method's balance equations), and an analysis reduced by
// ISO 6976 and characterized reproduces the ISO 6976 Hs and d. Source: the
// balance equations of ISO 12213-3 Annex B (as in engine/methods/sgerg88.hpp).
TEST(Sgerg88, CharacterizationRoundTrip) {
  for (auto in : {sgerg88::GrossInput<double>{40.66, 0.581, 0.006, 0.0}, sgerg88::GrossInput<double>{36.64, 0.686, 0.076, 0.0},
                  sgerg88::GrossInput<double>{43.53, 0.650, 0.015, 0.0}, sgerg88::GrossInput<double>{31.0, 0.62, 0.01, 0.0}}) {
    const auto m = sgerg88::prepare(in);
    ASSERT_TRUE(m.status.ok());
    EXPECT_LE(m.iterations, 12);
    const auto back = sgerg88::gross_of(m);
    EXPECT_NEAR(back.Hs_MJ_per_m3, in.Hs_MJ_per_m3, 1e-10);
    EXPECT_NEAR(back.d, in.d, 1e-12);
    EXPECT_NEAR(m.x[0] + m.x[1] + m.x[2] + m.x[3] + m.x[4], 1.0, 1e-15);
    EXPECT_NEAR(m.Z_ref, 1.0 + sgerg88::virial(m, 273.15).B * 101.325 / (8.31451 * 273.15), 1e-12);
  }
  // Through an analysis: G25 of the reference data.
  for (const auto& s : reference_states()) {
    if (s.gas != "G25") continue;
    const auto pr = iso6976::properties(s.x, iso6976::CombustionRef::t25C, iso6976::MeteringRef::t0C);
    ASSERT_TRUE(pr.status.ok());
    auto lm = make_line_method(MethodId::sgerg88);
    ASSERT_TRUE(lm->prepare(s.x).ok());
    const auto g = lm->gross_inputs();
    EXPECT_DOUBLE_EQ(g.Hs_MJ_per_m3, pr.Hs_MJ_per_m3);
    EXPECT_DOUBLE_EQ(g.d, pr.d);
    EXPECT_DOUBLE_EQ(g.x_CO2, x_of(s, Component::carbon_dioxide));
    const auto m = sgerg88::prepare(sgerg88::GrossInput<double>{pr.Hs_MJ_per_m3, pr.d, g.x_CO2, 0.0});
    const auto back = sgerg88::gross_of(m);
    EXPECT_NEAR(back.Hs_MJ_per_m3, pr.Hs_MJ_per_m3, 1e-10);
    EXPECT_NEAR(back.d, pr.d, 1e-12);
    // The derived N2 is the analysis N2 plus what the lumping puts there (He,
    // and the correlation's M_CH error): close to the analysis value.
    EXPECT_NEAR(m.x[1], x_of(s, Component::nitrogen), 0.01);
    break;
  }
  // Gross method 2: the molar mass it derives reproduces Gr.
  const auto m2 = aga8_gross::prepare_method2(aga8_gross::Method2Input<double>{0.60, 0.02, 0.01, 0.0});
  ASSERT_TRUE(m2.status.ok());
  const aga8_gross::ReferenceConditions rc;
  const double M = m2.x[0] * m2.M_CH_kg_per_kmol + m2.x[1] * 28.0135 + m2.x[2] * 44.010;
  const double V = m2.Z_ref * 8.31451 * rc.T_d_K / rc.p_d_kPa;
  EXPECT_NEAR(M / V / aga8_gross::detail::rho_air<double>(rc), 0.60, 1e-12);
}

// The ISO 12213-2/-3 Annex C example gases: their SGERG-88 inputs (Hs, d,
// x_CO2, x_H2) and compositions are FROM MEMORY (project standards notes;
// gases 1, 2, 3, 5 high confidence, 6 medium; the inputs were computed with
// ISO 6976:1995 data and rounded to 0.01 MJ/m3 and 0.001). We compare (a) the
// gross inputs our composition route derives (ISO 6976:2016) with the recalled
// ones and (b) Z from the recalled inputs with Z from the analysis. (b) is
// bounded by the inputs' rounding: dZ/dHs and dZ/dd at 6 MPa give about
// 5e-5 per 0.005 MJ/m3 and 1.5e-4 per 0.0005 in d; bound 5e-4.
TEST(Sgerg88, Iso12213ExampleGases) {
  struct Gas {
    const char* name;
    const char* composition;
    double Hs, d, x_CO2;
  };
  const Gas gases[] = {
      {"gas1", "methane=0.965,nitrogen=0.003,carbon_dioxide=0.006,ethane=0.018,propane=0.0045,isobutane=0.001,n_butane=0.001,isopentane=0.0005,n_pentane=0.0003,n_hexane=0.0007", 40.66, 0.581, 0.006},
      {"gas2", "methane=0.907,nitrogen=0.031,carbon_dioxide=0.005,ethane=0.045,propane=0.0084,isobutane=0.0010,n_butane=0.0015,isopentane=0.0003,n_pentane=0.0004,n_hexane=0.0004", 40.62, 0.609, 0.005},
      {"gas3", "methane=0.859,nitrogen=0.010,carbon_dioxide=0.015,ethane=0.085,propane=0.023,isobutane=0.0035,n_butane=0.0035,isopentane=0.0005,n_pentane=0.0005", 43.53, 0.650, 0.015},
      {"gas5", "methane=0.812,nitrogen=0.057,carbon_dioxide=0.076,ethane=0.043,propane=0.009,isobutane=0.0015,n_butane=0.0015", 36.64, 0.686, 0.076},
      {"gas6", "methane=0.826,nitrogen=0.117,carbon_dioxide=0.011,ethane=0.035,propane=0.0075,isobutane=0.0012,n_butane=0.0012,isopentane=0.0004,n_pentane=0.0004,n_hexane=0.0002,n_heptane=0.0001", 36.58, 0.644, 0.011},
  };
  auto by_comp = make_line_method(MethodId::sgerg88);
  auto by_gross = make_line_method(MethodId::sgerg88);
  for (const auto& g : gases) {
    const auto comp = io::parse_composition_list(g.composition, io::CompositionOptions{});
    ASSERT_TRUE(by_comp->prepare(comp.x).ok()) << g.name;
    const auto gi = by_comp->gross_inputs();
    std::printf("%s: Hs %.3f (recalled %.2f), d %.4f (recalled %.3f)\n", g.name, gi.Hs_MJ_per_m3, g.Hs, gi.d, g.d);
    EXPECT_NEAR(gi.Hs_MJ_per_m3, g.Hs, 0.01) << g.name;
    EXPECT_NEAR(gi.d, g.d, 0.001) << g.name;
    GrossInputs in;
    in.Hs_MJ_per_m3 = g.Hs;
    in.d = g.d;
    in.x_CO2 = g.x_CO2;
    ASSERT_TRUE(by_gross->prepare_gross(in).ok()) << g.name;
    for (double T : {270.0, 290.0, 330.0}) {
      const auto a = by_comp->state(T, 6e6, EvalOptions{});
      const auto b = by_gross->state(T, 6e6, EvalOptions{});
      ASSERT_TRUE(a.status.ok() && b.status.ok());
      EXPECT_NEAR(a[Quantity::Z] / b[Quantity::Z], 1.0, 5e-4) << g.name << " " << T;
    }
  }
}

// The same example gases (compositions from memory, as above) against the
// project's GERG-2008 method (Kunz & Wagner 2012; itself checked against the
// teqp reference states to ~1e-12), 270-330 K, 2-12 MPa. Bounds: the ISO 12213
// stated +-0.1 % up to 6 MPa (ISO 12213-1 scope, published abstract), and the
// done-when max 0.8 % up to 12 MPa. Observed: max 5.8e-4 up to 6 MPa, 3.6e-3 at
// 12 MPa (gas 3, 8.5 % ethane, 270 K: the ethane-rich gas reads high).
TEST(Sgerg88, Iso12213ExampleGasesAgainstGerg2008Method) {
  auto gerg = make_line_method(MethodId::gerg2008);
  if (!gerg) GTEST_SKIP() << "GERG-2008 is not built into this binary";
  auto sg = make_line_method(MethodId::sgerg88);
  const char* gases[] = {
      "methane=0.965,nitrogen=0.003,carbon_dioxide=0.006,ethane=0.018,propane=0.0045,isobutane=0.001,n_butane=0.001,isopentane=0.0005,n_pentane=0.0003,n_hexane=0.0007",
      "methane=0.907,nitrogen=0.031,carbon_dioxide=0.005,ethane=0.045,propane=0.0084,isobutane=0.0010,n_butane=0.0015,isopentane=0.0003,n_pentane=0.0004,n_hexane=0.0004",
      "methane=0.859,nitrogen=0.010,carbon_dioxide=0.015,ethane=0.085,propane=0.023,isobutane=0.0035,n_butane=0.0035,isopentane=0.0005,n_pentane=0.0005",
      "methane=0.812,nitrogen=0.057,carbon_dioxide=0.076,ethane=0.043,propane=0.009,isobutane=0.0015,n_butane=0.0015",
      "methane=0.826,nitrogen=0.117,carbon_dioxide=0.011,ethane=0.035,propane=0.0075,isobutane=0.0012,n_butane=0.0012,isopentane=0.0004,n_pentane=0.0004,n_hexane=0.0002,n_heptane=0.0001",
  };
  double max_low = 0, max_all = 0;
  for (const char* g : gases) {
    const auto comp = io::parse_composition_list(g, io::CompositionOptions{});
    ASSERT_TRUE(sg->prepare(comp.x).ok());
    ASSERT_TRUE(gerg->prepare(comp.x).ok());
    for (double T : {270.0, 290.0, 330.0})
      for (double p : {2e6, 6e6, 12e6}) {
        const auto a = sg->state(T, p, EvalOptions{});
        const auto b = gerg->state(T, p, EvalOptions{});
        ASSERT_TRUE(a.status.ok() && b.status.ok());
        const double dev = std::abs(a[Quantity::Z] / b[Quantity::Z] - 1.0);
        max_all = std::max(max_all, dev);
        if (p <= 6e6) max_low = std::max(max_low, dev);
      }
  }
  std::printf("ISO 12213 example gases, sgerg88 vs gerg2008: max %.2e up to 6 MPa, %.2e up to 12 MPa\n", max_low, max_all);
  EXPECT_LE(max_low, 1e-3);
  EXPECT_LE(max_all, 8e-3);
}

// Hydrogen-bearing gases are refused: the CH-H2 third virial coefficients
// C114 and C144 are not known (engine/data/sgerg88_data.hpp; the shared data
// set's uncertain_terms.csv). ISO 12213 example gas 4 (9.5 % H2, from memory)
// and the H2-bearing reference gases G15, G20, G33.
TEST(Sgerg88, HydrogenRefusedAsCoefficientsMissing) {
  const auto m = sgerg88::prepare(sgerg88::GrossInput<double>{34.16, 0.599, 0.016, 0.095});
  EXPECT_EQ(m.status.code, Code::coefficients_missing);
  const auto s = sgerg88::z_factor(m, 290.0, 5e6);
  EXPECT_EQ(s.status.code, Code::coefficients_missing);
  EXPECT_EQ(sgerg88::prepare(sgerg88::GrossInput<double>{40.0, 0.6, 0.01, 1e-6}).status.code, Code::coefficients_missing);
  EXPECT_EQ(aga8_gross::prepare_method1(aga8_gross::Method1Input<double>{38.0, 0.6, 0.01, 0.02}).status.code,
            Code::coefficients_missing);
  EXPECT_EQ(aga8_gross::prepare_method2(aga8_gross::Method2Input<double>{0.6, 0.02, 0.01, 0.02}).status.code,
            Code::coefficients_missing);
  for (auto id : {MethodId::sgerg88, MethodId::gross1, MethodId::gross2}) {
    auto lm = make_line_method(id);
    int refused = 0;
    for (const auto& st : reference_states()) {
      if (x_of(st, Component::hydrogen) == 0.0) continue;
      const Status ps = lm->prepare(st.x);
      EXPECT_EQ(ps.code, Code::coefficients_missing) << st.id;
      EXPECT_EQ(ps.component, index(Component::hydrogen));
      ++refused;
    }
    EXPECT_GT(refused, 90);
    GrossInputs g;
    g.Hs_MJ_per_m3 = 38.0;
    g.d = 0.6;
    g.x_CO2 = 0.01;
    g.x_N2 = 0.02;
    g.x_H2 = 0.05;
    EXPECT_EQ(lm->prepare_gross(g).code, Code::coefficients_missing);
    // A refused gas leaves nothing prepared.
    EXPECT_EQ(lm->state(290.0, 5e6, EvalOptions{}).status.code, Code::invalid_input);
  }
  static_assert(!sgerg88::data::hydrogen_terms.known, "update this test when C114/C144 are entered");
}

// Bad inputs and the range rules (ranges: ISO 12213-3 as transcribed in
// engine/data/sgerg88_data.hpp; T 263-338 K, p <= 12 MPa; Hs 30-45 normal,
// 20-48 wider; d 0.55-0.80 / 0.90; x_CO2 0.20 / 0.30).
TEST(Sgerg88, BadInputsAndRanges) {
  using sgerg88::GrossInput;
  const double nan = std::nan("");
  for (auto in : {GrossInput<double>{nan, 0.6, 0.01, 0}, GrossInput<double>{40, -0.6, 0.01, 0}, GrossInput<double>{-1, 0.6, 0.01, 0},
                  GrossInput<double>{40, 0.6, 1.0, 0}, GrossInput<double>{40, 0.6, -0.01, 0}, GrossInput<double>{40, 0.6, 0.01, -0.1},
                  GrossInput<double>{40, INFINITY, 0.01, 0}})
    EXPECT_EQ(sgerg88::prepare(in).status.code, Code::invalid_input);
  // More heating value than the density allows: the derived N2 is negative.
  EXPECT_EQ(sgerg88::prepare(GrossInput<double>{45.0, 0.56, 0.0, 0}).status.code, Code::invalid_input);
  // Pure methane's slightly negative derived N2 (correlation M_CH) is accepted.
  const auto ch4 = sgerg88::prepare(GrossInput<double>{39.828, 0.5548, 0.0, 0});
  EXPECT_TRUE(ch4.status.ok());
  EXPECT_LT(ch4.x[1], 0.0);
  EXPECT_EQ(ch4.status.range, RangeClass::normal);

  const auto m = sgerg88::prepare(GrossInput<double>{40.66, 0.581, 0.006, 0});
  ASSERT_TRUE(m.status.ok());
  EXPECT_EQ(m.status.range, RangeClass::normal);
  EXPECT_EQ(sgerg88::z_factor(m, -1.0, 1e6).status.code, Code::invalid_temperature);
  EXPECT_EQ(sgerg88::z_factor(m, nan, 1e6).status.code, Code::invalid_temperature);
  EXPECT_EQ(sgerg88::z_factor(m, 290.0, -1.0).status.code, Code::invalid_pressure);
  EXPECT_EQ(sgerg88::z_factor(m, 290.0, nan).status.code, Code::invalid_pressure);
  // State outside 263-338 K / 12 MPa: refused, or computed and flagged on request.
  for (auto [T, p] : {std::pair{250.0, 5e6}, std::pair{350.0, 5e6}, std::pair{290.0, 13e6}}) {
    const auto r = sgerg88::z_factor(m, T, p);
    EXPECT_EQ(r.status.code, Code::out_of_range);
    EXPECT_TRUE(std::isnan(r.Z) || r.Z == 0.0);
    SolveOptions allow;
    allow.allow_outside_range = true;
    const auto a = sgerg88::z_factor(m, T, p, allow);
    EXPECT_TRUE(a.status.ok());
    EXPECT_EQ(a.status.range, RangeClass::outside);
    EXPECT_TRUE(a.status.has(flag::extrapolated));
  }
  // Wider range: computed, classed expanded.
  const auto wide = sgerg88::prepare(GrossInput<double>{46.5, 0.75, 0.02, 0});
  ASSERT_TRUE(wide.status.ok());
  EXPECT_EQ(wide.status.range, RangeClass::expanded);
  const auto ws = sgerg88::z_factor(wide, 290.0, 5e6);
  EXPECT_TRUE(ws.status.ok());
  EXPECT_EQ(ws.status.range, RangeClass::expanded);
  // Outside every range (x_CO2 = 0.35): refused at evaluation unless allowed.
  const auto far = sgerg88::prepare(GrossInput<double>{25.0, 0.925, 0.35, 0});
  ASSERT_TRUE(far.status.ok());
  EXPECT_EQ(far.status.range, RangeClass::outside);
  EXPECT_EQ(sgerg88::z_factor(far, 290.0, 5e6).status.code, Code::out_of_range);
  // Iteration caps are reported, with the last iterate.
  sgerg88::CharacterizationOptions one;
  one.max_iter = 1;
  const auto capped = sgerg88::prepare(GrossInput<double>{40.66, 0.581, 0.006, 0}, one);
  EXPECT_EQ(capped.status.code, Code::no_convergence);
  EXPECT_TRUE(capped.status.has(flag::iteration_cap));
  SolveOptions so;
  so.max_iter = 1;
  so.rel_tol = 1e-300;
  const auto sc = sgerg88::z_factor(m, 290.0, 10e6, so);
  EXPECT_EQ(sc.status.code, Code::no_convergence);
  EXPECT_GT(sc.Z, 0.5);
  // The line method: state before prepare, and missing gross inputs.
  auto lm = make_line_method(MethodId::sgerg88);
  EXPECT_EQ(lm->state(290.0, 5e6, EvalOptions{}).status.code, Code::invalid_input);
  GrossInputs g;
  g.Hs_MJ_per_m3 = 40.0;
  g.d = 0.6;  // x_CO2 missing
  EXPECT_EQ(lm->prepare_gross(g).code, Code::invalid_input);
  // Gross methods: bad reference conditions, out-of-range states.
  aga8_gross::ReferenceConditions bad;
  bad.p_d_kPa = 0.0;
  EXPECT_EQ(aga8_gross::prepare_method1(aga8_gross::Method1Input<double>{38.0, 0.6, 0.01, 0.0}, bad).status.code,
            Code::invalid_input);
  EXPECT_EQ(aga8_gross::prepare_method2(aga8_gross::Method2Input<double>{0.6, 0.7, 0.4, 0.0}).status.code, Code::invalid_input);
  const auto g1 = aga8_gross::prepare_method1(aga8_gross::Method1Input<double>{38.0, 0.6, 0.01, 0.0});
  ASSERT_TRUE(g1.status.ok());
  EXPECT_TRUE(g1.status.has(flag::doubtful_data));  // HV temperature conversion (not the Report's)
  EXPECT_EQ(aga8_gross::z_factor(g1, 290.0, 9e6).status.code, Code::out_of_range);  // > 1200 psia
  EXPECT_TRUE(aga8_gross::z_factor(g1, 290.0, 8e6).status.ok());
}

// The three methods share the correlations: for one analysis, each reduced
// at its own reference conditions, they agree closely (the differences come
// from the reference conditions, the air model and the HV temperature
// conversion). Source: construction of AGA Report No. 8 gross methods.
TEST(Aga8Gross, ConsistentWithSgerg88) {
  const auto comp = io::parse_composition_list(
      "methane=0.907,nitrogen=0.031,carbon_dioxide=0.005,ethane=0.045,propane=0.0084,isobutane=0.0010,n_butane=0.0015,"
      "isopentane=0.0003,n_pentane=0.0004,n_hexane=0.0004",
      io::CompositionOptions{});
  auto sg = make_line_method(MethodId::sgerg88), g1 = make_line_method(MethodId::gross1),
       g2 = make_line_method(MethodId::gross2);
  ASSERT_TRUE(sg->prepare(comp.x).ok());
  ASSERT_TRUE(g1->prepare(comp.x).ok());
  ASSERT_TRUE(g2->prepare(comp.x).ok());
  for (double p : {1e6, 4e6, 8e6}) {
    const double z0 = sg->state(300.0, p, EvalOptions{})[Quantity::Z];
    const double z1 = g1->state(300.0, p, EvalOptions{})[Quantity::Z];
    const double z2 = g2->state(300.0, p, EvalOptions{})[Quantity::Z];
    EXPECT_NEAR(z1 / z0, 1.0, 5e-4) << p;
    EXPECT_NEAR(z2 / z0, 1.0, 1e-3) << p;
  }
  EXPECT_NEAR(g2->gross_inputs().x_N2, 0.031, 1e-15);
}

// double and cpp_bin_float_50 run the same code: Z, B, C agree to the
// double's precision (the 50-digit run with tight tolerances).
TEST(Sgerg88, DoubleMatchesFiftyDigits) {
  sgerg88::CharacterizationOptions tight;
  tight.tol = 1e-40;
  tight.max_iter = 60;
  SolveOptions so;
  so.rel_tol = 1e-40;
  const auto md = sgerg88::prepare(sgerg88::GrossInput<double>{36.64, 0.686, 0.076, 0.0});
  const auto mm = sgerg88::prepare(sgerg88::GrossInput<mp50>{mp50("36.64"), mp50("0.686"), mp50("0.076"), mp50(0)}, tight);
  ASSERT_TRUE(md.status.ok());
  ASSERT_TRUE(mm.status.ok());
  for (double T : {265.0, 300.0, 335.0})
    for (double p : {1e5, 5e6, 12e6}) {
      const auto a = sgerg88::z_factor(md, T, p);
      const auto b = sgerg88::z_factor(mm, mp50(T), mp50(p), so);
      ASSERT_TRUE(a.status.ok() && b.status.ok());
      EXPECT_NEAR(a.Z, static_cast<double>(b.Z), 1e-13 * a.Z) << T << " " << p;
      EXPECT_NEAR(a.B_cm3_per_mol, static_cast<double>(b.B_cm3_per_mol), 1e-11) << T;
      EXPECT_NEAR(a.C_cm6_per_mol2, static_cast<double>(b.C_cm6_per_mol2), 1e-9) << T;
      // The 50-digit root satisfies the cubic to its own precision.
      const mp50 resid = b.Z_virial2 - b.Z;
      EXPECT_LT(static_cast<double>(boost::multiprecision::abs(resid)), 1e-35);
    }
  const auto g2 = aga8_gross::prepare_method2(aga8_gross::Method2Input<mp50>{mp50("0.6"), mp50("0.02"), mp50("0.01"), mp50(0)},
                                             aga8_gross::ReferenceConditions{}, tight);
  const auto g2d = aga8_gross::prepare_method2(aga8_gross::Method2Input<double>{0.6, 0.02, 0.01, 0.0});
  ASSERT_TRUE(g2.status.ok());
  EXPECT_NEAR(g2d.H_CH_MJ_per_kmol, static_cast<double>(g2.H_CH_MJ_per_kmol), 1e-9);
}

// Zero heap allocations on the compute path: the templated functions and the
// LineMethod's state() after prepare (the benchmark measures speed).
TEST(Sgerg88, NoHeapAllocationOnComputePath) {
  auto lm = make_line_method(MethodId::sgerg88);
  auto g2 = make_line_method(MethodId::gross2);
  GrossInputs g;
  g.Hs_MJ_per_m3 = 40.66;
  g.d = 0.581;
  g.x_CO2 = 0.006;
  GrossInputs h;
  h.d = 0.6;
  h.x_N2 = 0.02;
  h.x_CO2 = 0.01;
  EvalOptions opt;
  opt.derived = true;
  double sink = 0;
  const long before = zcorr::heap::allocations();
  const Status a = lm->prepare_gross(g);
  const Status b = g2->prepare_gross(h);
  for (int i = 0; i < 1000; ++i) {
    const double T = 275.0 + 0.05 * i, p = 1e5 + 1.1e4 * i;  // inside every range
    sink += lm->state(T, p, opt)[Quantity::Z] + g2->state(T, p / 2, opt)[Quantity::Z];
    const auto m = sgerg88::prepare(sgerg88::GrossInput<double>{40.0 + 0.001 * i, 0.6, 0.01, 0.0});
    sink += sgerg88::z_factor(m, T, p).Z;
  }
  const long after = zcorr::heap::allocations();
  EXPECT_TRUE(a.ok() && b.ok());
  EXPECT_EQ(after - before, 0);
  EXPECT_GT(sink, 0.0);
}
