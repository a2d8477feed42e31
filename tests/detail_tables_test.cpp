// How far the AGA8 detail method's term table (engine/data/detail_data.hpp,
// ISO 12213-2:2006 Annex B) is pinned by the AGA8 reference-code test mixture.
//
// The table was transcribed from memory (engine/data/detail_source/README.md).
// Its README lists, under "Values not confirmed by the checks", item 3, the
// terms whose exponents and flags the earlier checks could not confirm:
// 8-13, 16 (u), 18 (k), 24-28, 30, 35-37, 42, 47-49, 52, 54, 56 and 58.
// Since then the 21-component test mixture of the AGA8 (2017) reference code
// at 400 K / 50 MPa (Z = 1.173801364147326, molar density
// 12.80792403648801 mol/L, from memory) is reproduced to 2e-15 with the
// tables as they are (tests/detail_test.cpp). A one-step alteration of a row
// that moves that Z by more than about 1e-13 would have broken the agreement,
// so the reproduction confirms the row against that alteration. The tests
// below make every such alteration, measure the change in Z, and assert
// which alterations move Z by more than 1e-12 (pinned) and which do not.
//
// Alterations of one row at a time: u_n +- 0.5; for n >= 13, b_n +- 1
// (b_n >= 1) and, where c_n = 1, k_n +- 1 (k_n >= 1, c_n = 0 exactly when
// k_n = 0); the row's flag replaced by each other choice (no flag, g, q, f,
// and for n <= 12, where the term acts in B only, s and w as well).
//
// The method cannot be run with an altered table (its tables are constexpr
// data), so the tests carry a plain second implementation of the equations
// of ISO 12213-2 (detail_source/README.md, "Equations") that takes the term
// table as a value; DetailTables.TestEquationMatchesTheProductionCode checks
// that it equals the production code on the unaltered table (double and
// 50-digit arithmetic).
//
// Result (2026-12-02, corrected tables, g_48 = 0), |dZ| of the reference
// mixture at 400 K / 50 MPa (the test prints every figure):
// - Pinned (every alteration moves Z by more than 1e-12): terms 8, 9, 10,
//   11, 12, 16, 18, 24, 25, 26, 27, 28, 30, 36, 37, 42, 47, 48, 49, 52, 54,
//   56 and 58, exponents and flags, so also u_16 and k_18. The water and H2S
//   terms 8-12 are pinned although the mixture holds only 0.01 % water and
//   0.25 % H2S (their B contributions are large; smallest |dZ| 2.4e-9). The
//   smallest margins: terms 26, 25 and 49 (smallest |dZ| 2.3e-12, 5.4e-12
//   and 5.7e-12).
// - Term 13 (f flag, acts through hydrogen only, x_H2 = 0.4 %): u_13 and its
//   flag are pinned; b_13 + 1 and k_13 +- 1 move Z by only 2.5e-13 to
//   3.6e-13. That is a hundred times the residual of the reproduction
//   (1.3e-15), so probably excluded as well, but below this test's 1e-12
//   margin: not pinned here.
// - Term 35 (a_35 = -5.99905e-17, f flag, u = -13): not pinned at all. Its
//   whole contribution to Z of the mixture is 8.7e-13 (removing the flag),
//   every exponent step moves Z by less than 1e-17. It rests on recall alone.
// The ISO 12213-2 example gases (no water, no H2S, hydrogen in gas 4 only)
// are far less sensitive; their largest change at 270 K / 6 MPa (Annex C,
// five decimals) and for gas 3 at 263 K / 11 MPa is printed beside each.
//
// DetailTables.CoefficientsOfTheListedRowsArePinned does the same for the
// coefficients a_n of these rows: a relative change of 1e-3 in a_n moves Z
// of the mixture by more than 1e-12 for every listed row except 25, 26, 35
// and 49 (a change of 1e-12 in Z takes about 3 %, 7 %, -- and 3 % in a_n
// there; a_35 does not move Z at all). Most a_n of the rows are pinned far
// better: a_18, a_28, a_52, a_54, a_56 and a_58 to 5e-8 relative or better,
// a_47 and a_48 to 2e-7 (1e-12 in Z; the test prints each figure).
#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <boost/multiprecision/cpp_bin_float.hpp>
#include <cmath>
#include <cstdio>
#include <set>
#include <string>
#include <utility>
#include <vector>

#include "methods/detail.hpp"

using namespace zcorr;
using C = Component;
namespace ad = zcorr::aga8_detail;
namespace dd = zcorr::detail_data;

namespace {

using Terms = std::array<dd::Term, 58>;
using Gas = std::vector<std::pair<C, double>>;

// ---------------------------------------------------------------------------
// The equations of ISO 12213-2 written out plainly, table as a parameter.

template <class S>
struct Plain {
  Terms t{};
  S T{}, RT{}, K3{}, B{}, S1{};
  std::array<S, 58> Cs{};  // C*_n at T, n = 13..58 (index n - 1)
};

// Mixture parameters, B and C*_n at T for composition x (mole fractions summing to 1).
template <class S>
Plain<S> plain_setup(const Terms& t, const Fractions<S>& x, const S& T) {
  using std::pow;
  using std::sqrt;
  Plain<S> e;
  e.t = t;
  e.T = T;
  e.RT = ad::gas_constant<S>() * T;
  std::array<S, max_components> E{}, K{}, G{}, Q{}, F{}, Sd{}, W{};
  for (std::size_t i = 0; i < max_components; ++i) {
    const auto& c = dd::components[i];
    E[i] = ad::value<S>(c.E);
    K[i] = ad::value<S>(c.K);
    G[i] = ad::value<S>(c.G);
    Q[i] = ad::value<S>(c.Q);
    F[i] = ad::value<S>(c.F);
    Sd[i] = ad::value<S>(c.S);
    W[i] = ad::value<S>(c.W);
  }
  struct Bin { S E{1}, U{1}, K{1}, G{1}; };
  std::array<std::array<Bin, max_components>, max_components> bin{};
  for (const auto& b : dd::binaries) {
    const Bin v{ad::value<S>(b.E), ad::value<S>(b.U), ad::value<S>(b.K), ad::value<S>(b.G)};
    bin[index(b.i)][index(b.j)] = v;
    bin[index(b.j)][index(b.i)] = v;
  }
  const S half(0.5), two_half(2.5);
  S ka(0), ua(0), Gm(0), Qm(0), Fm(0);
  for (std::size_t i = 0; i < max_components; ++i) {
    ka += x[i] * pow(K[i], two_half);
    ua += x[i] * pow(E[i], two_half);
    Gm += x[i] * G[i];
    Qm += x[i] * Q[i];
    Fm += x[i] * x[i] * F[i];
  }
  S K5 = ka * ka, U5 = ua * ua;
  for (std::size_t i = 0; i < max_components; ++i)
    for (std::size_t j = i + 1; j < max_components; ++j) {
      const S xx = x[i] * x[j];
      K5 += S(2) * xx * (pow(bin[i][j].K, 5) - S(1)) * pow(S(K[i] * K[j]), two_half);
      U5 += S(2) * xx * (pow(bin[i][j].U, 5) - S(1)) * pow(S(E[i] * E[j]), two_half);
      Gm += xx * (bin[i][j].G - S(1)) * (G[i] + G[j]);
    }
  e.K3 = pow(K5, S(S(3) / S(5)));
  const S U = pow(U5, S(S(1) / S(5)));
  // B: double sum over all i and j.
  S B(0);
  for (std::size_t n = 0; n < 18; ++n) {
    const S u = S(t[n].u2) * half;
    S sum(0);
    for (std::size_t i = 0; i < max_components; ++i) {
      if (x[i] == S(0)) continue;
      for (std::size_t j = 0; j < max_components; ++j) {
        if (x[j] == S(0)) continue;
        const S Eij = bin[i][j].E * sqrt(S(E[i] * E[j]));
        const S Gij = bin[i][j].G * (G[i] + G[j]) / S(2);
        S Bs(1);
        if (t[n].g) Bs *= Gij;
        if (t[n].q) Bs *= Q[i] * Q[j];
        if (t[n].f) Bs *= sqrt(F[i]) * sqrt(F[j]);
        if (t[n].s) Bs *= Sd[i] * Sd[j];
        if (t[n].w) Bs *= W[i] * W[j];
        sum += x[i] * x[j] * pow(Eij, u) * pow(S(K[i] * K[j]), S(1.5)) * Bs;
      }
    }
    B += ad::value<S>(t[n].a) * pow(T, S(-u)) * sum;
  }
  e.B = B;
  e.S1 = S(0);
  for (std::size_t n = 12; n < 58; ++n) {
    const S u = S(t[n].u2) * half;
    S c = ad::value<S>(t[n].a) * pow(U, u) * pow(T, S(-u));
    if (t[n].g) c *= Gm;
    if (t[n].q) c *= Qm * Qm;
    if (t[n].f) c *= Fm;
    // s_n and w_n act in B only.
    e.Cs[n] = c;
    if (n < 18) e.S1 += c;
  }
  return e;
}

// Z and dZ/dD at reduced density D.
template <class S>
std::pair<S, S> plain_z(const Plain<S>& e, const S& D) {
  using std::exp;
  using std::pow;
  S z = S(1) + e.B * D / e.K3 - D * e.S1;
  S dz = e.B / e.K3 - e.S1;
  for (std::size_t n = 12; n < 58; ++n) {
    const auto& tm = e.t[n];
    const S b(tm.b), c(tm.c), k(tm.k);
    const S Dk = pow(D, k), ex = exp(S(-c * Dk));
    const S br = b - c * k * Dk;
    z += e.Cs[n] * br * pow(D, b) * ex;
    dz += e.Cs[n] * pow(D, S(b - S(1))) * ex * (br * br - c * k * k * Dk);
  }
  return {z, dz};
}

// Density (mol/dm^3) at p (kPa) by Newton's method from rho0 (close to the root).
template <class S>
S plain_rho(const Plain<S>& e, const S& p_kPa, S rho, const S& tol) {
  using std::abs;
  for (int it = 0; it < 100; ++it) {
    const auto [z, dz] = plain_z(e, S(e.K3 * rho));
    const S f = z * rho * e.RT - p_kPa;
    const S df = e.RT * (z + rho * e.K3 * dz);
    const S step = f / df;
    rho -= step;
    if (abs(S(step / rho)) < tol) return rho;
  }
  ADD_FAILURE() << "plain density solve did not converge";
  return rho;
}

template <class S>
S plain_Z_at(const Terms& t, const Fractions<S>& x, const S& T, const S& p_Pa, const S& rho0, const S& tol) {
  const auto e = plain_setup(t, x, T);
  const S rho = plain_rho(e, S(p_Pa / S(1000)), rho0, tol);
  return plain_z(e, S(e.K3 * rho)).first;
}

Terms table() {
  Terms t{};
  for (std::size_t n = 0; n < 58; ++n) t[n] = dd::terms[n];
  return t;
}

// ---------------------------------------------------------------------------
// Gases.

// The 21-component test mixture of the AGA8 (2017) reference code (from memory;
// tests/detail_test.cpp).
const Gas& reference_mixture() {
  static const Gas g{{C::methane, 0.77824}, {C::nitrogen, 0.02}, {C::carbon_dioxide, 0.06}, {C::ethane, 0.08}, {C::propane, 0.03},
                     {C::isobutane, 0.0015}, {C::n_butane, 0.003}, {C::isopentane, 0.0005}, {C::n_pentane, 0.00165}, {C::n_hexane, 0.00215},
                     {C::n_heptane, 0.00088}, {C::n_octane, 0.00024}, {C::n_nonane, 0.00015}, {C::n_decane, 0.00009}, {C::hydrogen, 0.004},
                     {C::oxygen, 0.005}, {C::carbon_monoxide, 0.002}, {C::water, 0.0001}, {C::hydrogen_sulfide, 0.0025}, {C::helium, 0.007},
                     {C::argon, 0.001}};
  return g;
}

// ISO 12213-2:2006 Annex C example gases 1-6 (compositions from memory, as in
// tests/detail_test.cpp and reference_cases/detail_iso12213_2.zcase).
const std::vector<Gas>& iso_gases() {
  static const std::vector<Gas> g{
      {{C::methane, 0.965}, {C::nitrogen, 0.003}, {C::carbon_dioxide, 0.006}, {C::ethane, 0.018}, {C::propane, 0.0045},
       {C::isobutane, 0.001}, {C::n_butane, 0.001}, {C::isopentane, 0.0005}, {C::n_pentane, 0.0003}, {C::n_hexane, 0.0007}},
      {{C::methane, 0.907}, {C::nitrogen, 0.031}, {C::carbon_dioxide, 0.005}, {C::ethane, 0.045}, {C::propane, 0.0084},
       {C::isobutane, 0.0010}, {C::n_butane, 0.0015}, {C::isopentane, 0.0003}, {C::n_pentane, 0.0004}, {C::n_hexane, 0.0004}},
      {{C::methane, 0.859}, {C::nitrogen, 0.010}, {C::carbon_dioxide, 0.015}, {C::ethane, 0.085}, {C::propane, 0.023},
       {C::isobutane, 0.0035}, {C::n_butane, 0.0035}, {C::isopentane, 0.0005}, {C::n_pentane, 0.0005}},
      {{C::methane, 0.735}, {C::nitrogen, 0.100}, {C::carbon_dioxide, 0.016}, {C::ethane, 0.033}, {C::propane, 0.0074},
       {C::isobutane, 0.0012}, {C::n_butane, 0.0012}, {C::isopentane, 0.0004}, {C::n_pentane, 0.0004}, {C::n_hexane, 0.0002},
       {C::hydrogen, 0.095}, {C::carbon_monoxide, 0.010}, {C::n_heptane, 0.0001}, {C::n_octane, 0.0001}},
      {{C::methane, 0.812}, {C::nitrogen, 0.057}, {C::carbon_dioxide, 0.076}, {C::ethane, 0.043}, {C::propane, 0.009},
       {C::isobutane, 0.0015}, {C::n_butane, 0.0015}},
      {{C::methane, 0.826}, {C::nitrogen, 0.117}, {C::carbon_dioxide, 0.011}, {C::ethane, 0.035}, {C::propane, 0.0075},
       {C::isobutane, 0.0012}, {C::n_butane, 0.0012}, {C::isopentane, 0.0004}, {C::n_pentane, 0.0004}, {C::n_hexane, 0.0002},
       {C::n_heptane, 0.0001}},
  };
  return g;
}

// Normalised fractions (the production code normalises too).
template <class S>
Fractions<S> fractions(const Gas& g) {
  Fractions<S> x{};
  S sum(0);
  for (const auto& [c, v] : g) {
    x[index(c)] = S(v);
    sum += S(v);
  }
  for (auto& v : x) v /= sum;
  return x;
}

// ---------------------------------------------------------------------------
// The alterations.

struct Alteration {
  int n;             // term number, 1-based
  std::string what;  // e.g. "u+0.5", "b-1", "k+1", "flag g->none"
  Terms t;
};

char flag_of(const dd::Term& t) {
  if (t.g) return 'g';
  if (t.q) return 'q';
  if (t.f) return 'f';
  if (t.s) return 's';
  if (t.w) return 'w';
  return '-';
}

void set_flag(dd::Term& t, char f) {
  t.g = f == 'g';
  t.q = f == 'q';
  t.f = f == 'f';
  t.s = f == 's';
  t.w = f == 'w';
}

// Rows of item 3 of "Values not confirmed by the checks" (detail_source/README.md).
const std::vector<int>& listed_rows() {
  static const std::vector<int> r{8, 9, 10, 11, 12, 13, 16, 18, 24, 25, 26, 27, 28, 30, 35, 36, 37, 42, 47, 48, 49, 52, 54, 56, 58};
  return r;
}

std::vector<Alteration> alterations_of(int n) {
  std::vector<Alteration> out;
  const Terms base = table();
  const dd::Term& t0 = base[static_cast<std::size_t>(n - 1)];
  auto add = [&](std::string what, auto change) {
    Alteration a{n, std::move(what), base};
    change(a.t[static_cast<std::size_t>(n - 1)]);
    out.push_back(std::move(a));
  };
  add("u+0.5", [](dd::Term& t) { t.u2 += 1; });
  add("u-0.5", [](dd::Term& t) { t.u2 -= 1; });
  if (n >= 13) {
    add("b+1", [](dd::Term& t) { t.b += 1; });
    if (t0.b >= 2) add("b-1", [](dd::Term& t) { t.b -= 1; });
    if (t0.c == 1) {
      add("k+1", [](dd::Term& t) { t.k += 1; });
      if (t0.k >= 2) add("k-1", [](dd::Term& t) { t.k -= 1; });
    }
  }
  const char now = flag_of(t0);
  const std::string choices = n <= 12 ? "-gqfsw" : "-gqf";
  for (char f : choices) {
    if (f == now) continue;
    const std::string name = std::string("flag ") + (now == '-' ? "none" : std::string(1, now)) + "->" + (f == '-' ? "none" : std::string(1, f));
    add(name, [f](dd::Term& t) { set_flag(t, f); });
  }
  return out;
}

// Alterations that do not move Z of the reference mixture at 400 K / 50 MPa
// by more than 1e-12, as measured (see the file comment); every other
// alteration of the listed rows does.
const std::set<std::pair<int, std::string>>& unpinned() {
  static const std::set<std::pair<int, std::string>> s{
      {13, "b+1"},   {13, "k+1"},   {13, "k-1"},          {35, "u+0.5"},      {35, "u-0.5"},     {35, "b+1"},
      {35, "b-1"},   {35, "k+1"},   {35, "k-1"},          {35, "flag f->none"}, {35, "flag f->g"}, {35, "flag f->q"},
  };
  return s;
}

constexpr double pinned_threshold = 1e-12;

}  // namespace

// The plain implementation equals the production code on the unaltered table:
// B, Z at a given density and Z at (T, p), for the reference mixture and the
// ISO gases, in double (1e-13 relative) and in 50-digit arithmetic (1e-30).
TEST(DetailTables, TestEquationMatchesTheProductionCode) {
  const Terms t = table();
  std::vector<Gas> gases = iso_gases();
  gases.push_back(reference_mixture());
  for (const auto& g : gases) {
    ad::Prepared<double> pr;
    ASSERT_TRUE(ad::prepare(fractions<double>(g), pr).ok());
    for (double T : {270.0, 330.0, 400.0})
      for (double P : {6.0e6, 12.0e6, 50.0e6}) {
        const auto r = ad::evaluate(pr, T, P);
        ASSERT_TRUE(r.status.ok());
        const auto e = plain_setup(t, fractions<double>(g), T);
        EXPECT_NEAR(e.B * 1000.0 / r.B_cm3_per_mol, 1.0, 1e-13);
        EXPECT_NEAR(plain_z(e, e.K3 * r.rho_mol_per_L).first / ad::z_from_density(pr, T, r.rho_mol_per_L), 1.0, 1e-13);
        EXPECT_NEAR(plain_Z_at(t, fractions<double>(g), T, P, r.rho_mol_per_L, 1e-15) / r.Z, 1.0, 1e-13) << T << " " << P;
      }
  }
  using mp = boost::multiprecision::cpp_bin_float_50;
  SolveOptions o;
  o.rel_tol = 1e-40;
  o.max_iter = 80;
  for (const auto& g : {reference_mixture(), iso_gases()[3]}) {
    ad::Prepared<mp> pr;
    ASSERT_TRUE(ad::prepare(fractions<mp>(g), pr).ok());
    const mp T(400), P(50000000);
    const auto r = ad::evaluate(pr, T, P, o);
    ASSERT_TRUE(r.status.ok());
    const auto e = plain_setup(t, fractions<mp>(g), T);
    EXPECT_LT(std::abs(static_cast<double>(e.B * mp(1000) / r.B_cm3_per_mol - mp(1))), 1e-30);
    EXPECT_LT(std::abs(static_cast<double>(plain_Z_at(t, fractions<mp>(g), T, P, r.rho_mol_per_L, mp(1e-40)) / r.Z - mp(1))), 1e-30);
  }
}

// The measurement: for each listed row and each alteration, |dZ| of the
// reference mixture at 400 K / 50 MPa, and the largest |dZ| of the ISO gases
// at 270 K / 6 MPa (the Annex C state, five decimals from memory) and of
// gas 3 at 263 K / 11 MPa.
TEST(DetailTables, UnconfirmedRowsArePinnedByTheReferenceMixture) {
  using L = long double;
  const Terms t0 = table();
  const auto xr = fractions<L>(reference_mixture());
  const L rho_r = plain_rho(plain_setup(t0, xr, L(400)), L(50000), L(12.8), L(1e-18));
  const L z_r = plain_Z_at(t0, xr, L(400), L(50.0e6), rho_r, L(1e-18));
  struct IsoState { Fractions<L> x; L T, p, rho, z; };
  std::vector<IsoState> iso;
  for (const auto& g : iso_gases()) iso.push_back({fractions<L>(g), L(270), L(6.0e6), L(0), L(0)});
  iso.push_back({fractions<L>(iso_gases()[2]), L(263), L(11.0e6), L(0), L(0)});
  for (auto& s : iso) {
    s.rho = plain_rho(plain_setup(t0, s.x, s.T), L(s.p / 1000), L(3), L(1e-18));
    s.z = plain_Z_at(t0, s.x, s.T, s.p, s.rho, L(1e-18));
  }
  std::set<int> rows_fully_pinned;
  std::size_t n_all = 0, n_pinned = 0;
  for (int n : listed_rows()) {
    bool all = true;
    for (const auto& a : alterations_of(n)) {
      ++n_all;
      const L dz = plain_Z_at(a.t, xr, L(400), L(50.0e6), rho_r, L(1e-18)) - z_r;
      double iso_max = 0;
      for (const auto& s : iso) {
        const L d = plain_Z_at(a.t, s.x, s.T, s.p, s.rho, L(1e-18)) - s.z;
        iso_max = std::max(iso_max, std::abs(static_cast<double>(d)));
      }
      const bool pinned = std::abs(static_cast<double>(dz)) > pinned_threshold;
      std::printf("term %2d %-14s dZ(reference mixture) = %+.3e  %s   max |dZ| ISO gases = %.1e\n", n, a.what.c_str(),
                  static_cast<double>(dz), pinned ? "pinned  " : "UNPINNED", iso_max);
      // g_48 = 1 is the former table: the plain equation then gives what zcorr
      // 0.1.0 computed with it, Z = 1.1738062 (7 digits), 4.8e-6 above.
      if (n == 48 && a.what == "flag none->g") EXPECT_NEAR(static_cast<double>(z_r + dz), 1.1738062, 5e-8);
      const bool listed = unpinned().count({n, a.what}) != 0;
      EXPECT_EQ(pinned, !listed) << "term " << n << " " << a.what << ": dZ = " << static_cast<double>(dz);
      if (pinned) ++n_pinned;
      all = all && pinned;
    }
    if (all) rows_fully_pinned.insert(n);
  }
  std::printf("%zu of %zu alterations pinned; rows pinned in every alteration:", n_pinned, n_all);
  for (int n : rows_fully_pinned) std::printf(" %d", n);
  std::printf("\n");
}

// The coefficients a_n of the listed rows: a relative change of 1e-3 moves Z
// of the reference mixture at 400 K / 50 MPa by more than 1e-12, except for
// a_25, a_26, a_35 and a_49 (see the file comment).
TEST(DetailTables, CoefficientsOfTheListedRowsArePinned) {
  using L = long double;
  const Terms t0 = table();
  const auto xr = fractions<L>(reference_mixture());
  const L rho_r = plain_rho(plain_setup(t0, xr, L(400)), L(50000), L(12.8), L(1e-18));
  const L z_r = plain_Z_at(t0, xr, L(400), L(50.0e6), rho_r, L(1e-18));
  const std::set<int> weak{25, 26, 35, 49};
  for (int n : listed_rows()) {
    Terms t = t0;
    auto& a = t[static_cast<std::size_t>(n - 1)].a;
    a.mant *= 1001;  // a_n (1 + 1e-3), exactly, in the decimal form the scalar types read
    a.exp10 -= 3;
    a.v *= 1.001;
    const double dz = static_cast<double>(plain_Z_at(t, xr, L(400), L(50.0e6), rho_r, L(1e-18)) - z_r);
    // relative change of a_n that moves Z by 1e-12 (Z is linear in a_n at fixed density)
    const double pinned_to = std::abs(dz) > 0 ? pinned_threshold * 1e-3 / std::abs(dz) : 1.0;
    std::printf("a_%-2d x (1 + 1e-3): dZ(reference mixture) = %+.3e; dZ = 1e-12 takes %.0e relative in a_%d\n", n, dz, pinned_to, n);
    EXPECT_EQ(std::abs(dz) > pinned_threshold, weak.count(n) == 0) << "a_" << n << ": dZ = " << dz;
  }
}
