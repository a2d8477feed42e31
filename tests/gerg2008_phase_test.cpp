// Phase equilibrium on GERG-2008 (engine/methods/gerg2008_phase.hpp): fugacity
// coefficients, the stability test, the flash, pure-fluid saturation and the dew point.
// Every check against an outside value names its source beside it; the others are
// identities of thermodynamics or checks of the code against itself (numerical derivatives).
#include <gtest/gtest.h>

#include <boost/multiprecision/cpp_bin_float.hpp>

#include <chrono>
#include <cmath>
#include <fstream>
#include <map>
#include <string>
#include <vector>

#include "io/csv.hpp"
#include "io/text.hpp"

#include "methods/gerg2008.hpp"
#include "methods/gerg2008_phase.hpp"
#include "support/sample_gases.hpp"

using namespace zcorr;
using mp = boost::multiprecision::cpp_bin_float_50;
namespace ph = zcorr::gerg2008::phase;

namespace {

Fractions<double> pure(Component c) {
  Fractions<double> x{};
  x[index(c)] = 1.0;
  return x;
}

// A rich gas (fictional test analysis, no published source) with a marked heavy end.
Fractions<double> rich_gas() {
  Fractions<double> x{};
  x[index(Component::methane)] = 0.80;
  x[index(Component::nitrogen)] = 0.01;
  x[index(Component::carbon_dioxide)] = 0.02;
  x[index(Component::ethane)] = 0.08;
  x[index(Component::propane)] = 0.045;
  x[index(Component::n_butane)] = 0.015;
  x[index(Component::isobutane)] = 0.01;
  x[index(Component::n_pentane)] = 0.006;
  x[index(Component::isopentane)] = 0.005;
  x[index(Component::n_hexane)] = 0.004;
  x[index(Component::n_heptane)] = 0.003;
  x[index(Component::n_octane)] = 0.002;
  return x;
}

// n alpha_r(T, V, n) with V = 1 m^3 (n in mol), for the numerical derivative.
template <class S>
S n_alphar(const Fractions<S>& n, const S& T_K) {
  S N(0);
  for (const auto& v : n) N += v;
  Fractions<S> x{};
  for (std::size_t i = 0; i < max_components; ++i) x[i] = n[i] / N;
  gerg2008::Prepared<S> p;
  EXPECT_TRUE(gerg2008::prepare(x, p).ok());
  const S delta = N / p.rhor_mol_per_m3;  // rho = N / (1 m^3)
  return N * gerg2008::alphar(p, S(p.Tr_K / T_K), delta).a;
}

template <class S>
Fractions<S> analytic_dn(const Fractions<double>& x, const S& T_K, const S& rho) {
  gerg2008::Prepared<S> p;
  EXPECT_TRUE(gerg2008::prepare(convert_fractions<S>(x), p).ok());
  gerg2008::TauCache<S> c;
  gerg2008::fill_temperature_cache(p, T_K, c);
  const S delta = rho / p.rhor_mol_per_m3;
  const auto r = gerg2008::residual(p, c, delta);
  Fractions<S> out;
  ph::dnalphar_dn(p, c, delta, r, out);
  return out;
}

}  // namespace

// The analytic d(n alpha_r)/dn_i (Kunz & Wagner 2012, Table B4 forms) against a central
// difference of n alpha_r in 50 digits (step 1e-20 mol: truncation ~1e-40, rounding ~1e-30).
TEST(Gerg2008Fugacity, DerivativeOfNAlpharMatchesCentralDifference) {
  const std::vector<std::pair<Fractions<double>, std::pair<double, double>>> cases{
      {samples::pipeline_gas_12(), {280.0, 3000.0}},  // T K, rho mol/m^3
      {rich_gas(), {250.0, 9000.0}},
      {rich_gas(), {320.0, 200.0}},
  };
  for (const auto& [x, st] : cases) {
    const mp T(st.first), rho(st.second);
    // n_k = x_k rho (V = 1 m^3): the density of that mixture is rho times the (not exactly 1) sum of x.
    mp sum_x(0);
    for (double v : x) sum_x += mp(v);
    const auto an = analytic_dn<mp>(x, T, mp(rho * sum_x));
    const auto an_d = analytic_dn<double>(x, st.first, st.second);
    const mp h("1e-20");
    for (std::size_t i = 0; i < max_components; ++i) {
      if (x[i] == 0.0) continue;
      Fractions<mp> np{}, nm{};
      for (std::size_t k = 0; k < max_components; ++k) np[k] = nm[k] = mp(x[k]) * rho;
      np[i] += h;
      nm[i] -= h;
      const mp num = (n_alphar(np, T) - n_alphar(nm, T)) / (2 * h);
      const double dev = static_cast<double>(abs(num - an[i]));
      EXPECT_LT(dev, 1e-25) << component_name(i) << " T=" << st.first;
      EXPECT_NEAR(an_d[i], static_cast<double>(an[i]), 1e-12 * (1.0 + std::abs(static_cast<double>(an[i]))))
          << component_name(i);
    }
  }
}

// sum_i x_i ln phi_i = ln phi of the mixture = alpha_r + (Z - 1) - ln Z: an identity of
// thermodynamics (ln phi_i are partial molar quantities of g_res/RT; Euler's theorem).
TEST(Gerg2008Fugacity, MoleFractionSumIsTheMixtureFugacityCoefficient) {
  for (const auto& x : {samples::pipeline_gas_12(), rich_gas()}) {
    for (double T : {250.0, 300.0}) {
      for (double p : {1e5, 3e6, 8e6}) {
        ph::PhaseState<double> st;
        ASSERT_TRUE(ph::evaluate_phase(x, T, p, ph::Root::stable, st, SolveOptions{}).ok()) << T << " " << p;
        double sum = 0.0;
        for (std::size_t i = 0; i < max_components; ++i) sum += st.prep.x[i] * st.ln_phi[i];
        EXPECT_NEAR(sum, st.ln_phi_mix, 1e-13 * (1.0 + std::abs(st.ln_phi_mix))) << T << " " << p;
      }
    }
  }
}

namespace {

// Two-phase states of the shared data set gerg2008-reference (tests/data/gerg2008/README.md,
// "Left out as two-phase": G05 at 260 K / 2000 and 5000 kPa, G15 at 260 K / 2000 kPa, G20 at
// 260 K / 2000 and 5000 kPa; two-phase by a tangent-plane test on teqp's GERG-2008 and by
// CoolProp's flash). Compositions: the gases' rows in tests/data/gerg2008/states.csv.
Fractions<double> g05() {
  Fractions<double> x{};
  x[index(Component::methane)] = 0.9250600; x[index(Component::nitrogen)] = 0.0215925;
  x[index(Component::carbon_dioxide)] = 0.0084963; x[index(Component::ethane)] = 0.0376191;
  x[index(Component::propane)] = 0.0024881; x[index(Component::n_butane)] = 0.0001445;
  x[index(Component::isobutane)] = 0.0001874; x[index(Component::n_pentane)] = 0.0005678;
  x[index(Component::isopentane)] = 0.0012766; x[index(Component::n_hexane)] = 0.0003014;
  x[index(Component::n_heptane)] = 0.0001642; x[index(Component::n_octane)] = 0.0000917;
  x[index(Component::n_nonane)] = 0.0000163; x[index(Component::n_decane)] = 0.0000065;
  x[index(Component::oxygen)] = 0.0000803; x[index(Component::hydrogen_sulfide)] = 0.0001765;
  x[index(Component::helium)] = 0.0017308;
  return x;
}

// The hydrocarbon (water-free) basis the phase test works on (ph::prepare_dry).
template <class S>
gerg2008::Prepared<S> prep(const Fractions<double>& x) {
  gerg2008::Prepared<S> p;
  EXPECT_TRUE(ph::prepare_dry(convert_fractions<S>(x), p).ok());
  return p;
}

// tm(w) = sum w_i (ln w_i + ln phi_i(w) - ln z_i - ln phi_i(z)) evaluated directly.
double tpd_at(const Fractions<double>& z_in, const Fractions<double>& w, double T, double p) {
  const auto z = prep<double>(z_in).x;
  ph::PhaseState<double> fz, fw;
  EXPECT_TRUE(ph::evaluate_phase(z, T, p, ph::Root::stable, fz, SolveOptions{}).ok());
  EXPECT_TRUE(ph::evaluate_phase(w, T, p, ph::Root::stable, fw, SolveOptions{}).ok());
  double tm = 0.0;
  for (std::size_t i = 0; i < max_components; ++i)
    if (z[i] > 0.0) tm += w[i] * (std::log(w[i]) + fw.ln_phi[i] - std::log(z[i]) - fz.ln_phi[i]);
  return tm;
}

}  // namespace

TEST(Gerg2008Stability, SharedDataTwoPhaseStatesAreUnstable) {
  // Source: tests/data/gerg2008/README.md (shared data set gerg2008-reference), see g05().
  const auto p = prep<double>(g05());
  for (double P : {2000e3, 5000e3}) {
    const auto s = ph::stability(p, 260.0, P);
    ASSERT_TRUE(s.status.ok()) << P;
    EXPECT_TRUE(s.unstable) << P;
    EXPECT_LT(s.tpd_min, 0.0);
    // the trial composition, evaluated on its own, has a negative tangent-plane distance
    EXPECT_LT(tpd_at(g05(), s.trial, 260.0, P), 0.0);
  }
}

namespace {

struct RefState {
  std::string id;
  double T_K, p_Pa;
  Fractions<double> x{};
};

// tests/data/gerg2008/states.csv (shared data set gerg2008-reference; README there).
std::vector<RefState> reference_states() {
  std::ifstream in(std::string(ZCORR_SOURCE_DIR) + "/tests/data/gerg2008/states.csv");
  EXPECT_TRUE(in.good());
  io::CsvReader r(in);
  std::vector<std::string> head, row;
  r.next(head);
  auto col = [&](const std::string& n) {
    for (std::size_t i = 0; i < head.size(); ++i)
      if (head[i] == n) return i;
    ADD_FAILURE() << n;
    return std::size_t{0};
  };
  std::vector<RefState> out;
  while (r.next(row)) {
    RefState s;
    s.id = row[col("case_id")];
    s.T_K = io::parse_number(row[col("T_K")], "T_K");
    s.p_Pa = io::parse_number(row[col("P_kPa")], "P_kPa") * 1000.0;
    for (std::size_t i = 0; i < max_components; ++i) s.x[i] = io::parse_number(row[col(std::string(component_name(i)))], "x");
    out.push_back(s);
  }
  return out;
}

// The composition of a gas of the reference set by its id prefix (e.g. "G15").
Fractions<double> reference_gas(const std::string& gas) {
  for (const auto& s : reference_states())
    if (s.id.rfind(gas + "_", 0) == 0) return s.x;
  ADD_FAILURE() << gas;
  return {};
}

struct TwoPhaseState {
  const char* gas;
  double T_K, p_Pa;
};
// tests/data/gerg2008/README.md, "Left out as two-phase (heavy-end dew points)".
const std::vector<TwoPhaseState> shared_two_phase{
    {"G05", 260.0, 2000e3}, {"G05", 260.0, 5000e3}, {"G15", 260.0, 2000e3}, {"G20", 260.0, 2000e3}, {"G20", 260.0, 5000e3}};

}  // namespace

// Every one of the 305 states of the reference set is single-phase (source: the data
// set's README: kept only where teqp's tangent-plane test and CoolProp's flash agree).
TEST(Gerg2008Stability, ReferenceStatesAreStableWithNonNegativeTpd) {
  int n = 0;
  for (const auto& s : reference_states()) {
    const auto p = prep<double>(s.x);
    const auto st = ph::stability(p, s.T_K, s.p_Pa);
    EXPECT_TRUE(st.status.ok()) << s.id << " " << code_name(st.status.code);
    EXPECT_FALSE(st.unstable) << s.id << " tpd " << st.tpd_min;
    EXPECT_GE(st.tpd_min, -1e-10) << s.id;
    ++n;
  }
  EXPECT_EQ(n, 305);
}

TEST(Gerg2008Stability, AllSharedTwoPhaseStatesAreUnstableAndFlash) {
  for (const auto& t : shared_two_phase) {
    const auto z = reference_gas(t.gas);
    const auto p = prep<double>(z);
    const auto st = ph::stability(p, t.T_K, t.p_Pa);
    ASSERT_TRUE(st.status.ok()) << t.gas;
    EXPECT_TRUE(st.unstable) << t.gas << " " << t.p_Pa;
    EXPECT_LT(st.tpd_min, 0.0);
    EXPECT_LT(tpd_at(z, st.trial, t.T_K, t.p_Pa), 0.0) << t.gas;
    // the flash: exact material balance, equal fugacities, a vapour fraction in (0, 1)
    const auto f = ph::flash(p, t.T_K, t.p_Pa, st);
    ASSERT_TRUE(f.status.ok()) << t.gas << " " << code_name(f.status.code);
    EXPECT_TRUE(f.two_phase);
    EXPECT_GT(f.beta, 0.0);
    EXPECT_LT(f.beta, 1.0);
    EXPECT_LT(f.balance, 1e-15) << t.gas;
    double sx = 0, sy = 0;
    for (std::size_t i = 0; i < max_components; ++i) { sx += f.x[i]; sy += f.y[i]; }
    EXPECT_NEAR(sx, 1.0, 1e-13);
    EXPECT_NEAR(sy, 1.0, 1e-13);
    ph::PhaseState<double> L, V;
    ASSERT_TRUE(ph::evaluate_phase(f.x, t.T_K, t.p_Pa, ph::Root::stable, L, SolveOptions{}).ok());
    ASSERT_TRUE(ph::evaluate_phase(f.y, t.T_K, t.p_Pa, ph::Root::stable, V, SolveOptions{}).ok());
    for (std::size_t i = 0; i < max_components; ++i)
      // equal fugacities to the flash tolerance (|delta ln K| < 1e-10, PhaseOptions::flash_tol)
      if (p.x[i] > 0.0) EXPECT_NEAR(std::log(f.x[i]) + L.ln_phi[i], std::log(f.y[i]) + V.ln_phi[i], 1e-9) << component_name(i);
    EXPECT_LT(f.Z_liquid, f.Z_vapour);
    EXPECT_NEAR(f.Z_liquid, L.Z, 1e-12);
    // the two phases are each stable (a second split would lower the Gibbs energy further)
    EXPECT_FALSE(ph::stability(prep<double>(f.y), t.T_K, t.p_Pa).unstable) << t.gas;
    std::printf("%s %.2f K %.0f kPa: tpd %.3e beta %.8f Z_V %.6f Z_L %.6f it %d/%d\n", t.gas, t.T_K, t.p_Pa / 1e3,
                st.tpd_min, f.beta, f.Z_vapour, f.Z_liquid, st.iterations, f.iterations);
  }
}

// The same test in double and in 50 digits: same verdict, TPD and trial phase agree.
TEST(Gerg2008Stability, DoubleAgreesWith50Digits) {
  const std::vector<std::pair<const char*, std::pair<double, double>>> states{
      {"G05", {260.0, 2000e3}}, {"G20", {260.0, 5000e3}}, {"G05", {288.15, 5000e3}}, {"G10", {260.0, 8000e3}}};
  for (const auto& [gas, tp] : states) {
    const auto z = reference_gas(gas);
    const auto sd = ph::stability(prep<double>(z), tp.first, tp.second);
    const auto sm = ph::stability(prep<mp>(z), mp(tp.first), mp(tp.second));
    ASSERT_TRUE(sd.status.ok());
    ASSERT_TRUE(sm.status.ok());
    EXPECT_EQ(sd.unstable, sm.unstable) << gas;
    EXPECT_NEAR(sd.tpd_min, static_cast<double>(sm.tpd_min), 1e-9 * (1.0 + std::abs(sd.tpd_min))) << gas;
    if (sd.unstable)
      for (std::size_t i = 0; i < max_components; ++i)
        EXPECT_NEAR(sd.trial[i], static_cast<double>(sm.trial[i]), 1e-8 * (1e-6 + sd.trial[i])) << gas << component_name(i);
  }
}
