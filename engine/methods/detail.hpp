// zcorr method: the AGA8 detail characterization method.
//
// Implements AGA Report No. 8, 2nd edition (1992, 2nd printing 1994), detail
// characterization method, identical to ISO 12213-2:2006 ("AGA8-92DC"):
//   - mixture size K, energy U, orientation G, quadrupole Q and high-
//     temperature F parameters from the composition (mixing rules);
//   - the mixture second virial coefficient B(T) from the binary parameters;
//   - the 58-term equation in reduced density D = K^3 rho,
//       Z = 1 + B rho - D sum_{n=13}^{18} C*_n
//             + sum_{n=13}^{58} C*_n (b_n - c_n k_n D^k_n) D^b_n exp(-c_n D^k_n),
//       C*_n = a_n (G + 1 - g_n)^g_n (Q^2 + 1 - q_n)^q_n (F + 1 - f_n)^f_n U^u_n T^-u_n;
//   - p = Z rho R T, solved for the gas-phase density at given (T, p).
// Parameter tables: data/detail_data.hpp (ISO 12213-2:2006 Annex B), with
// the gas constant R = 8.31451 J/(mol K) and the molar masses stated there.
//
// Units: T in K, p in Pa at the interface (kPa inside, with rho in mol/dm^3
// and R in kPa dm^3/(mol K)), B in dm^3/mol inside, reported in cm^3/mol.
//
// Shape: prepare(x, prepared) does the composition work once (no T
// dependence); evaluate(prepared, T, p, options) then costs a few
// exponentials per density iteration. Everything here does not throw, does
// not allocate and does no I/O; every loop is bounded (the density solve by
// SolveOptions::max_iter). Templated on the scalar type; table values enter
// as exact decimals in every type (value<S>()).
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <type_traits>

#include "core/components.hpp"
#include "core/composition.hpp"
#include "core/scalar.hpp"
#include "core/solve_options.hpp"
#include "core/status.hpp"
#include "data/detail_data.hpp"

namespace zcorr::aga8_detail {

// ---------------------------------------------------------------------------
// Table values in the scalar type.

// The printed decimal mant * 10^exp10, exact (correctly rounded) in S. For
// double this is the compiler-rounded literal.
template <class S>
[[nodiscard]] inline S value(const detail_data::Coef& c) noexcept {
  if constexpr (std::is_same_v<S, double>) {
    return c.v;
  } else {
    const S m(c.mant);
    const unsigned e = static_cast<unsigned>(c.exp10 < 0 ? -c.exp10 : c.exp10);
    const S p = num::ipow(S(10), e);
    return c.exp10 < 0 ? S(m / p) : S(m * p);
  }
}

template <class S>
[[nodiscard]] inline S gas_constant() noexcept { return value<S>(detail_data::gas_constant); }

inline constexpr std::size_t n_terms = 58;
inline constexpr std::size_t n_b_terms = 18;      // terms 1..18 make up B
inline constexpr std::size_t first_c_term = 12;   // index of term 13: terms 13..58 make up the density series

// What the code below assumes about the tables, checked when it compiles.
[[nodiscard]] constexpr bool tables_have_expected_shape() noexcept {
  for (std::size_t n = 0; n < n_terms; ++n) {
    const auto& t = detail_data::terms[n];
    for (int f : {t.c, t.g, t.q, t.f, t.s, t.w})
      if (f != 0 && f != 1) return false;                    // every flag is 0 or 1
    if (t.b < 1 || t.b > 9 || t.k < 0 || t.k > 4) return false;  // power tables of D
    if ((t.c == 0) != (t.k == 0)) return false;              // c_n = 0 exactly when k_n = 0
    if (n >= first_c_term && (t.s != 0 || t.w != 0)) return false;  // S, W act in B only
    // The third virial coefficient takes only b_n = 2 terms: every b_n = 1 term
    // of the density series has c_n = 1 and k_n >= 2, and they are terms 13..18.
    if (n >= first_c_term && t.b == 1 && (n >= n_b_terms || t.k < 2)) return false;
  }
  // Each unordered pair at most once, never a component with itself.
  for (std::size_t m = 0; m < detail_data::binaries.size(); ++m) {
    const auto& a = detail_data::binaries[m];
    if (a.i == a.j) return false;
    for (std::size_t n = m + 1; n < detail_data::binaries.size(); ++n) {
      const auto& b = detail_data::binaries[n];
      if ((a.i == b.i && a.j == b.j) || (a.i == b.j && a.j == b.i)) return false;
    }
  }
  for (std::size_t i = 0; i < max_components; ++i)
    if (detail_data::components[i].number < 1 || detail_data::components[i].number > 21) return false;
  return true;
}
static_assert(tables_have_expected_shape(), "detail_data.hpp does not have the shape detail.hpp relies on");

// Row of the binary-parameter table for a pair, or -1 when all four are 1.
struct BinaryIndex {
  std::array<std::array<std::int8_t, max_components>, max_components> row{};
};
[[nodiscard]] constexpr BinaryIndex make_binary_index() noexcept {
  BinaryIndex t{};
  for (auto& r : t.row) r.fill(-1);
  for (std::size_t n = 0; n < detail_data::binaries.size(); ++n) {
    const auto i = index(detail_data::binaries[n].i), j = index(detail_data::binaries[n].j);
    t.row[i][j] = static_cast<std::int8_t>(n);
    t.row[j][i] = static_cast<std::int8_t>(n);
  }
  return t;
}
inline constexpr BinaryIndex binary_index = make_binary_index();

// Terms 13..58 grouped by their density shape (b_n, c_n, k_n): the density
// series then costs one multiply-add per group instead of one per term.
struct TermGroups {
  std::size_t count = 0;
  std::array<std::uint8_t, n_terms> group_of{};  // for terms 13..58
  std::array<int, n_terms> b{}, c{}, k{};        // per group
};
[[nodiscard]] constexpr TermGroups make_groups() noexcept {
  TermGroups g{};
  for (std::size_t n = first_c_term; n < n_terms; ++n) {
    const auto& t = detail_data::terms[n];
    std::size_t found = g.count;
    for (std::size_t m = 0; m < g.count; ++m)
      if (g.b[m] == t.b && g.c[m] == t.c && g.k[m] == t.k) found = m;
    if (found == g.count) {
      g.b[found] = t.b;
      g.c[found] = t.c;
      g.k[found] = t.k;
      ++g.count;
    }
    g.group_of[n] = static_cast<std::uint8_t>(found);
  }
  return g;
}
inline constexpr TermGroups groups = make_groups();

// Terms 13..58 listed group by group: group g holds terms order[start[g]] ..
// order[start[g + 1] - 1], so each group sum stays in a register.
struct GroupOrder {
  std::array<std::uint8_t, n_terms> order{};
  std::array<std::uint8_t, n_terms + 1> start{};
};
[[nodiscard]] constexpr GroupOrder make_group_order() noexcept {
  GroupOrder o{};
  std::size_t k = 0;
  for (std::size_t g = 0; g < groups.count; ++g) {
    o.start[g] = static_cast<std::uint8_t>(k);
    for (std::size_t n = first_c_term; n < n_terms; ++n)
      if (groups.group_of[n] == g) o.order[k++] = static_cast<std::uint8_t>(n);
  }
  o.start[groups.count] = static_cast<std::uint8_t>(k);
  return o;
}
inline constexpr GroupOrder group_order = make_group_order();

// Largest |2 u_n| over the terms [first, last) with u_n < 0, and largest 2 u_n
// with u_n > 0: the sizes of the power tables.
[[nodiscard]] constexpr int max_neg_u2(std::size_t first, std::size_t last) noexcept {
  int m = 0;
  for (std::size_t n = first; n < last; ++n) m = (-detail_data::terms[n].u2 > m) ? -detail_data::terms[n].u2 : m;
  return m;
}
[[nodiscard]] constexpr int max_pos_u2(std::size_t first, std::size_t last) noexcept {
  int m = 0;
  for (std::size_t n = first; n < last; ++n) m = (detail_data::terms[n].u2 > m) ? detail_data::terms[n].u2 : m;
  return m;
}

// x^(m/2) for m in [-Down, Up], from one square root and products.
template <class S, int Up = max_pos_u2(0, n_terms), int Down = max_neg_u2(0, n_terms)>
struct HalfPowers {
  std::array<S, static_cast<std::size_t>(Up + Down) + 1> v;  // v[Down + m] = x^(m/2); filled by set()
  void set(const S& x) noexcept {
    constexpr std::size_t z = static_cast<std::size_t>(Down);
    const S h = num::sqrt_(x);
    v[z] = S(1);
    // x^(m/2) = x^(floor(m/2)/2) * x^(ceil(m/2)/2): a product tree of depth
    // log2(m), not a chain of m dependent multiplications (faster, and the
    // rounding error grows with log2(m) only).
    if constexpr (Up > 0) v[z + 1] = h;
    for (std::size_t m = 2; m <= static_cast<std::size_t>(Up); ++m) v[z + m] = v[z + (m >> 1)] * v[z + m - (m >> 1)];
    if constexpr (Down > 0) v[z - 1] = S(1) / h;
    for (std::size_t m = 2; m <= z; ++m) v[z - m] = v[z - (m >> 1)] * v[z - (m - (m >> 1))];
  }
  [[nodiscard]] const S& operator()(int m2) const noexcept { return v[static_cast<std::size_t>(m2 + Down)]; }
};
// Powers needed by the second-virial terms 1..18 only.
template <class S>
using BHalfPowers = HalfPowers<S, max_pos_u2(0, n_b_terms), max_neg_u2(0, n_b_terms)>;

// ---------------------------------------------------------------------------
// Range of application.
//
// T and p (ISO 12213-1 scope, read in its published abstract: about 263-338 K
// and up to 12 MPa for pipeline-quality gas, about +-0.1 %): normal range.
// Expanded range: AGA Report No. 8 (1994) uncertainty regions 1-4, taken as
// -200 degF to 400 degF (144.26 K to 477.59 K) and up to 40 000 psia
// (275.8 MPa) -- these boundaries are FROM MEMORY, LOW confidence; the
// region-4 uncertainty is about 1 %.
//
// Composition (mole fractions). Normal range = the tighter of the AGA Report
// No. 8 (1994) "normal range" (from memory, medium-high) and the ISO 12213-2
// pipeline-quality limits (from memory, medium), so that "normal" means the
// +-0.1 % claim holds by both documents. Expanded range = the AGA Report No. 8
// "expanded range" (from memory, medium-high). Where AGA 8 gives "to the dew
// point" (hexanes and heavier, water) there is no numeric expanded limit: the
// gas is classed expanded and flagged dew_point_suspected, because the method
// cannot tell whether the state is below the dew point. Not checked: the
// relative-density and heating-value limits of both documents (they need
// ISO 6976 data).
struct RangeLimits {
  double T_normal_min_K = 263.0, T_normal_max_K = 338.0;
  double p_normal_max_Pa = 12.0e6;
  double T_expanded_min_K = (-200.0 + 459.67) / 1.8;  // -200 degF
  double T_expanded_max_K = (400.0 + 459.67) / 1.8;   // 400 degF
  double p_expanded_max_Pa = 40000.0 * 0.45359237 * 9.80665 / (0.0254 * 0.0254);  // 40 000 psia
};
inline constexpr RangeLimits range_limits{};

// One composition limit: the summed fraction of the components in `members`.
struct ComponentLimit {
  std::array<Component, 5> members;
  std::size_t n_members;
  double normal_min, normal_max;      // normal range
  double expanded_min, expanded_max;  // expanded range
  bool to_dew_point;                  // AGA 8 expanded limit is "to the dew point"
};
inline constexpr std::array<ComponentLimit, 16> component_limits{{
    // methane: AGA 8 normal 45-100 %, ISO 12213-2 >= 70 %; expanded 0-100 %
    {{Component::methane}, 1, 0.70, 1.0, 0.0, 1.0, false},
    // nitrogen: AGA 8 0-50 %, ISO <= 20 %; expanded 0-100 %
    {{Component::nitrogen}, 1, 0.0, 0.20, 0.0, 1.0, false},
    // carbon dioxide: AGA 8 0-30 %, ISO <= 20 %; expanded 0-100 %
    {{Component::carbon_dioxide}, 1, 0.0, 0.20, 0.0, 1.0, false},
    // ethane: 0-10 % (both); expanded 0-100 %
    {{Component::ethane}, 1, 0.0, 0.10, 0.0, 1.0, false},
    // propane: 0-3.5 % (both); expanded 0-12 %
    {{Component::propane}, 1, 0.0, 0.035, 0.0, 0.12, false},
    // butanes: 0-1.5 % (both); expanded 0-6 %
    {{Component::n_butane, Component::isobutane}, 2, 0.0, 0.015, 0.0, 0.06, false},
    // pentanes: 0-0.5 % (both); expanded 0-4 %
    {{Component::n_pentane, Component::isopentane}, 2, 0.0, 0.005, 0.0, 0.04, false},
    // hexanes and heavier: 0-0.1 % (both); expanded to the dew point
    {{Component::n_hexane, Component::n_heptane, Component::n_octane, Component::n_nonane, Component::n_decane}, 5,
     0.0, 0.001, 0.0, 1.0, true},
    // heptanes: ISO <= 0.05 %; octanes and heavier: ISO <= 0.05 %
    {{Component::n_heptane}, 1, 0.0, 0.0005, 0.0, 1.0, true},
    {{Component::n_octane, Component::n_nonane, Component::n_decane}, 3, 0.0, 0.0005, 0.0, 1.0, true},
    // hydrogen: 0-10 % (both); expanded 0-100 %
    {{Component::hydrogen}, 1, 0.0, 0.10, 0.0, 1.0, false},
    // carbon monoxide: 0-3 % (both); expanded 0-3 %
    {{Component::carbon_monoxide}, 1, 0.0, 0.03, 0.0, 0.03, false},
    // helium: AGA 8 0-0.2 %, ISO <= 0.5 %; expanded 0-3 %
    {{Component::helium}, 1, 0.0, 0.002, 0.0, 0.03, false},
    // water: AGA 8 0-0.05 %, ISO <= 0.015 %; expanded to the dew point
    {{Component::water}, 1, 0.0, 0.00015, 0.0, 1.0, true},
    // hydrogen sulfide: AGA 8 0-0.02 %; expanded 0-100 %
    {{Component::hydrogen_sulfide}, 1, 0.0, 0.0002, 0.0, 1.0, false},
    // oxygen: not in the AGA 8 normal range; expanded 0-21 %
    {{Component::oxygen}, 1, 0.0, 0.0, 0.0, 0.21, false},
}};
// argon: not in the AGA 8 normal range; expanded 0-1 % (checked in classify_composition).
inline constexpr double argon_expanded_max = 0.01;

// Components whose parameters the verification of the tables could not
// confirm (detail_source/README.md): water, H2S, n-nonane, n-decane, oxygen,
// helium, argon. Above this fraction the result is flagged doubtful_data (a
// rough estimate: below it a 10 % error in one of their parameters moves Z
// by well under 1e-4 in the normal range).
inline constexpr double doubtful_fraction = 1.0e-3;
inline constexpr std::array<Component, 7> unconfirmed_components{
    Component::water,  Component::hydrogen_sulfide, Component::n_nonane, Component::n_decane,
    Component::oxygen, Component::helium,           Component::argon};

[[nodiscard]] constexpr RangeClass worse(RangeClass a, RangeClass b) noexcept {
  return static_cast<std::uint8_t>(a) >= static_cast<std::uint8_t>(b) ? a : b;
}

// Classifies a normalised composition; sets s.range, s.component (the
// component of the worst limit, the largest member of a group) and
// dew_point_suspected.
template <class S>
void classify_composition(const Fractions<S>& x, Status& s) noexcept {
  RangeClass worst = RangeClass::normal;
  std::uint8_t culprit = no_component;
  auto consider = [&](RangeClass r, std::uint8_t comp) {
    if (static_cast<std::uint8_t>(r) > static_cast<std::uint8_t>(worst)) {
      worst = r;
      culprit = comp;
    }
  };
  for (const auto& lim : component_limits) {
    S sum(0);
    std::size_t big = 0;
    for (std::size_t m = 0; m < lim.n_members; ++m) {
      sum += x[index(lim.members[m])];
      if (x[index(lim.members[m])] > x[index(lim.members[big])]) big = m;
    }
    const auto comp = static_cast<std::uint8_t>(index(lim.members[big]));
    RangeClass r = RangeClass::normal;
    if (sum < S(lim.normal_min) || sum > S(lim.normal_max)) r = RangeClass::expanded;
    if (sum < S(lim.expanded_min) || sum > S(lim.expanded_max)) r = RangeClass::outside;
    if (r == RangeClass::expanded && lim.to_dew_point) s.flags |= flag::dew_point_suspected;
    consider(r, comp);
  }
  const S ar = x[index(Component::argon)];
  if (ar > S(0)) consider(ar > S(argon_expanded_max) ? RangeClass::outside : RangeClass::expanded,
                          static_cast<std::uint8_t>(index(Component::argon)));
  s.range = worst;
  s.component = (worst == RangeClass::normal) ? no_component : culprit;
  for (auto c : unconfirmed_components)
    if (x[index(c)] > S(doubtful_fraction)) s.flags |= flag::doubtful_data;
}

template <class S>
[[nodiscard]] RangeClass classify_state(const S& T_K, const S& p_Pa) noexcept {
  const auto& L = range_limits;
  if (T_K < S(L.T_expanded_min_K) || T_K > S(L.T_expanded_max_K) || p_Pa > S(L.p_expanded_max_Pa)) return RangeClass::outside;
  if (T_K < S(L.T_normal_min_K) || T_K > S(L.T_normal_max_K) || p_Pa > S(L.p_normal_max_Pa)) return RangeClass::expanded;
  return RangeClass::normal;
}

// ---------------------------------------------------------------------------
// Composition-dependent part.

template <class S>
struct Prepared {
  Status status{};   // composition check and range class; code ok when usable
  bool ready = false;
  S M_g_per_mol{};   // molar mass, g/mol
  S K3{};            // K^3, dm^3/mol: reduced density D = K3 * rho
  S U{};             // mixture energy parameter, K
  S G{}, Q{}, F{};   // mixture orientation, quadrupole and high-temperature parameters
  // B(T) = sum_{n=1}^{18} Bn[n] T^-u_n, dm^3/mol:
  // Bn[n] = a_n sum_i sum_j x_i x_j E_ij^u_n (K_i K_j)^(3/2) B*_nij.
  std::array<S, n_b_terms> Bn{};
  // C*_n = Cn[n] T^-u_n for n = 13..58 (zero below):
  // Cn[n] = a_n (G + 1 - g_n)^g_n (Q^2 + 1 - q_n)^q_n (F + 1 - f_n)^f_n U^u_n.
  std::array<S, n_terms> Cn{};
};

// Mixing-rule sums for composition x (canonical order, mole fractions).
// The composition must pass check_fractions; a sum that differs from 1
// within its tolerance is normalised here and flagged sum_not_unity. Returns
// (and stores in out.status) invalid_composition for a bad or empty
// composition; otherwise code ok with the range class of the composition (a
// composition outside the expanded range is refused later, per state, unless
// SolveOptions::allow_outside_range).
template <class S>
Status prepare(const Fractions<S>& x_in, Prepared<S>& out) noexcept {
  using namespace detail_data;
  out = Prepared<S>{};
  Status st = check_fractions(x_in);
  if (!st.ok()) {
    out.status = st;
    return st;
  }
  const S sum = fraction_sum(x_in);
  if (!(sum > S(0))) {
    out.status = make_status(Code::invalid_composition);
    return out.status;
  }
  Fractions<S> x{};
  for (std::size_t i = 0; i < max_components; ++i) x[i] = x_in[i] / sum;
  classify_composition(x, st);

  // Present components and their parameters in S.
  std::array<std::size_t, max_components> id{};
  std::size_t n = 0;
  for (std::size_t i = 0; i < max_components; ++i)
    if (x[i] > S(0)) id[n++] = i;
  struct P {
    S x, E, K, G, Q, F, S_, W;
    S K25, E25, K15, sqrtF;
  };
  std::array<P, max_components> c{};
  for (std::size_t a = 0; a < n; ++a) {
    const auto& d = components[id[a]];
    P& p = c[a];
    p.x = x[id[a]];
    p.E = value<S>(d.E);
    p.K = value<S>(d.K);
    p.G = value<S>(d.G);
    p.Q = value<S>(d.Q);
    p.F = value<S>(d.F);
    p.S_ = value<S>(d.S);
    p.W = value<S>(d.W);
    const S sK = num::sqrt_(p.K), sE = num::sqrt_(p.E);
    p.K25 = p.K * p.K * sK;
    p.E25 = p.E * p.E * sE;
    p.K15 = p.K * sK;
    p.sqrtF = num::sqrt_(p.F);
    out.M_g_per_mol += p.x * value<S>(d.M);
  }

  // Mixture size, energy, orientation, quadrupole and high-temperature parameters.
  S K5a(0), U5a(0), G(0), Q(0), F(0);
  for (std::size_t a = 0; a < n; ++a) {
    K5a += c[a].x * c[a].K25;
    U5a += c[a].x * c[a].E25;
    G += c[a].x * c[a].G;
    Q += c[a].x * c[a].Q;
    F += c[a].x * c[a].x * c[a].F;
  }
  S K5 = K5a * K5a, U5 = U5a * U5a;
  std::array<S, n_b_terms> bsum{};
  for (std::size_t a = 0; a < n; ++a) {
    for (std::size_t b = a; b < n; ++b) {
      const int r = binary_index.row[id[a]][id[b]];
      S Es(1), Uij(1), Kij(1), Gs(1);
      if (r >= 0) {
        const auto& bp = binaries[static_cast<std::size_t>(r)];
        Es = value<S>(bp.E);
        Uij = value<S>(bp.U);
        Kij = value<S>(bp.K);
        Gs = value<S>(bp.G);
      }
      const S xx = (a == b) ? S(c[a].x * c[a].x) : S(S(2) * c[a].x * c[b].x);
      if (a != b) {
        // 2 x_i x_j (X_ij^5 - 1) (X_i X_j)^(5/2) and x_i x_j (G*_ij - 1)(G_i + G_j)
        K5 += xx * (num::ipow(Kij, 5u) - S(1)) * c[a].K25 * c[b].K25;
        U5 += xx * (num::ipow(Uij, 5u) - S(1)) * c[a].E25 * c[b].E25;
        G += S(xx / S(2)) * (Gs - S(1)) * (c[a].G + c[b].G);
      }
      // Second-virial pair terms: E_ij = E*_ij sqrt(E_i E_j), G_ij = G*_ij (G_i + G_j)/2.
      BHalfPowers<S> ep;
      ep.set(S(Es * num::sqrt_(S(c[a].E * c[b].E))));
      const S Gij = Gs * (c[a].G + c[b].G) / S(2);
      const S QQ = c[a].Q * c[b].Q, FF = c[a].sqrtF * c[b].sqrtF, SS = c[a].S_ * c[b].S_, WW = c[a].W * c[b].W;
      const S w = xx * c[a].K15 * c[b].K15;
      for (std::size_t t = 0; t < n_b_terms; ++t) {
        const auto& tm = terms[t];
        S f = w * ep(tm.u2);
        if (tm.g != 0) f *= Gij;
        if (tm.q != 0) f *= QQ;
        if (tm.f != 0) f *= FF;
        if (tm.s != 0) f *= SS;
        if (tm.w != 0) f *= WW;
        bsum[t] += f;
      }
    }
  }
  out.K3 = num::pow_(K5, S(S(3) / S(5)));
  out.U = num::pow_(U5, S(S(1) / S(5)));
  out.G = G;
  out.Q = Q;
  out.F = F;
  for (std::size_t t = 0; t < n_b_terms; ++t) out.Bn[t] = value<S>(terms[t].a) * bsum[t];
  HalfPowers<S> up;
  up.set(out.U);
  const S Q2 = Q * Q;
  for (std::size_t t = first_c_term; t < n_terms; ++t) {
    const auto& tm = terms[t];
    S f = value<S>(tm.a) * up(tm.u2);
    if (tm.g != 0) f *= G;
    if (tm.q != 0) f *= Q2;
    if (tm.f != 0) f *= F;
    out.Cn[t] = f;
  }
  out.ready = true;
  out.status = st;
  return st;
}

// ---------------------------------------------------------------------------
// Temperature-dependent part and the equation in density.

// Everything at one temperature that the density series needs.
template <class S>
struct AtTemperature {
  S T{}, RT{};
  S B{}, dBdT{};          // dm^3/mol, dm^3/(mol K)
  S S1{}, dS1dT{};        // sum_{13}^{18} C*_n and its T derivative
  S C{};                  // third virial coefficient, dm^6/mol^2
  std::array<S, groups.count> A, dAdT;  // C*_n summed per density group (all written by at_temperature)
};

template <class S>
void at_temperature(const Prepared<S>& pr, const S& T_K, AtTemperature<S>& at, bool want_T = true) noexcept {
  using namespace detail_data;
  at.T = T_K;
  at.RT = gas_constant<S>() * T_K;
  HalfPowers<S> tp;
  tp.set(S(S(1) / T_K));  // tp(2u) = T^-u
  const S half_invT = S(1) / (S(2) * T_K);  // d(T^-u)/dT = -(2u) T^-u / (2T)
  // Local accumulators: the sums stay in registers.
  S B(0), dB(0), S1(0), dS1(0);
  for (std::size_t t = 0; t < n_b_terms; ++t) {
    const S v = pr.Bn[t] * tp(terms[t].u2);
    B += v;
    if (want_T) dB -= v * S(terms[t].u2);
  }
  for (std::size_t t = first_c_term; t < n_b_terms; ++t) {
    const S v = pr.Cn[t] * tp(terms[t].u2);
    S1 += v;
    if (want_T) dS1 -= v * S(terms[t].u2);
  }
  at.B = B;
  at.dBdT = dB * half_invT;
  at.S1 = S1;
  at.dS1dT = dS1 * half_invT;
  S c2(0);
  for (std::size_t g = 0; g < groups.count; ++g) {
    S a(0), da(0);
    for (std::size_t m = group_order.start[g]; m < group_order.start[g + 1]; ++m) {
      const std::size_t t = group_order.order[m];
      const S v = pr.Cn[t] * tp(terms[t].u2);
      a += v;
      if (want_T) da -= v * S(terms[t].u2);
    }
    at.A[g] = a;
    at.dAdT[g] = da * half_invT;
    // Z = 1 + B rho + C rho^2 + ...: only terms with b_n = 2 contribute to the
    // rho^2 coefficient (every term with b_n = 1 has k_n >= 2), each with b_n C*_n.
    if (groups.b[g] == 2) c2 += S(2) * a;
  }
  at.C = c2 * pr.K3 * pr.K3;
}

// Z and its derivatives at reduced density D (rho = D / K3).
template <class S>
struct DensityPoint {
  S Z{};
  S dZdD{};    // (dZ/dD) at constant T
  S dZdT{};    // (dZ/dT) at constant rho, 1/K
};

template <class S>
[[nodiscard]] DensityPoint<S> z_at_density(const Prepared<S>& pr, const AtTemperature<S>& at, const S& D, bool want_T) noexcept {
  std::array<S, 10> Dp{};
  Dp[0] = S(1);
  for (std::size_t m = 1; m < Dp.size(); ++m) Dp[m] = Dp[m - 1] * D;
  std::array<S, 5> ex{};  // exp(-D^k), k = 1..4
  for (std::size_t k = 1; k < ex.size(); ++k) ex[k] = num::exp_(S(-Dp[k]));
  const S rhoK = S(1) / pr.K3;  // rho = D * rhoK
  DensityPoint<S> r;
  S z = at.B * D * rhoK - D * at.S1;
  S zd = at.B * rhoK - at.S1;
  S zt = want_T ? S(at.dBdT * D * rhoK - D * at.dS1dT) : S(0);
  for (std::size_t g = 0; g < groups.count; ++g) {
    const int b = groups.b[g], c = groups.c[g], k = groups.k[g];
    const auto ub = static_cast<std::size_t>(b), uk = static_cast<std::size_t>(k);
    S shape, dshape;  // D^b (b - c k D^k) e and its D-derivative divided appropriately
    if (c == 0) {
      shape = S(b) * Dp[ub];
      dshape = S(b * b) * Dp[ub - 1];
    } else {
      const S Dk = Dp[uk];
      const S br = S(b) - S(k) * Dk;
      const S e = ex[uk];
      shape = br * Dp[ub] * e;
      // d/dD [(b - k D^k) D^b e^{-D^k}] = D^(b-1) e [ (b - k D^k)^2 - k^2 D^k ]
      dshape = Dp[ub - 1] * e * (br * br - S(k * k) * Dk);
    }
    z += at.A[g] * shape;
    zd += at.A[g] * dshape;
    if (want_T) zt += at.dAdT[g] * shape;
  }
  r.Z = S(1) + z;
  r.dZdD = zd;
  r.dZdT = zt;
  return r;
}

// ---------------------------------------------------------------------------
// State evaluation.

template <class S>
struct StateResult {
  S Z{};
  S rho_mol_per_L{};
  S rho_kg_per_m3{};
  S M_g_per_mol{};
  S B_cm3_per_mol{};     // mixture second virial coefficient at T
  S C_cm6_per_mol2{};    // mixture third virial coefficient at T
  S Z_virial2{};         // 1 + B rho + C rho^2 at the solved density
  S dZdp_per_kPa{};      // (dZ/dp) at constant T
  S dZdT_per_K{};        // (dZ/dT) at constant p
  Status status{};
  int iterations = 0;
};

// Second and third virial coefficients of the prepared mixture at T.
template <class S>
[[nodiscard]] S second_virial_cm3_per_mol(const Prepared<S>& pr, const S& T_K) noexcept {
  AtTemperature<S> at;
  at_temperature(pr, T_K, at);
  return at.B * S(1000);
}
template <class S>
[[nodiscard]] S third_virial_cm6_per_mol2(const Prepared<S>& pr, const S& T_K) noexcept {
  AtTemperature<S> at;
  at_temperature(pr, T_K, at);
  return at.C * S(1.0e6);
}

// Z from the equation at a given molar density (mol/dm^3), without a solve.
template <class S>
[[nodiscard]] S z_from_density(const Prepared<S>& pr, const S& T_K, const S& rho_mol_per_L) noexcept {
  AtTemperature<S> at;
  at_temperature(pr, T_K, at);
  return z_at_density(pr, at, S(pr.K3 * rho_mol_per_L), false).Z;
}

// Samples of dp/drho below a root when the gas branch has to be confirmed.
inline constexpr int gas_branch_samples = 24;

template <class S>
struct DensitySolve {
  S rho{};
  int iterations = 0;
  bool converged = false;
  bool collapsed = false;  // the bracket shrank to nothing without a root
  bool clean = true;       // no bisection, and dp/drho > 0 at every iterate
};

// Safeguarded Newton iteration for p(rho) = p_kPa inside [lo, hi], p(lo) < p.
// A point where dp/drho <= 0 (beyond the first maximum of the gas branch) or
// p >= target shrinks hi; a step that leaves the bracket is replaced by
// bisection. Converged when a Newton step is below tol relative, or when the
// error it leaves, estimated from the quadratic convergence of two successive
// Newton steps (step^3 / previous step^2), is. At most max_iter evaluations.
template <class S>
[[nodiscard]] DensitySolve<S> solve_density(const Prepared<S>& pr, const AtTemperature<S>& at, const S& p, S lo, S hi,
                                            S rho, int max_iter, const S& tol) noexcept {
  DensitySolve<S> r;
  bool newton_before = false;  // the current iterate came from a Newton step
  bool hi_beyond_max = false;  // hi was set by a point with dp/drho <= 0
  S prev_step(1);
  // The bracket has collapsed without a root: to the tolerance, or, when hi
  // lies beyond the first maximum of p(rho), to 1e-9 relative: the pressure is
  // then above what the gas branch reaches, save within 1e-9 of its stability
  // limit, so there is no gas root (this keeps such states from running into
  // the iteration cap).
  auto collapsed = [&]() { return !(hi - lo > tol * hi) || (hi_beyond_max && !(hi - lo > S(1.0e-9) * hi)); };
  if (!(rho > lo && rho < hi)) rho = S(0.5) * (lo + hi);
  for (r.iterations = 1; r.iterations <= max_iter; ++r.iterations) {
    const auto pt = z_at_density(pr, at, S(pr.K3 * rho), false);
    const S pc = pt.Z * rho * at.RT;
    const S dpdrho = at.RT * (pt.Z + rho * pr.K3 * pt.dZdD);
    if (!num::isfinite_(pc) || !num::isfinite_(dpdrho) || !(dpdrho > S(0))) {
      hi = rho;  // beyond the first maximum of p(rho), or unusable: the gas root is below
      hi_beyond_max = true;
      rho = S(0.5) * (lo + hi);
      newton_before = false;
      r.clean = false;
      if (collapsed()) break;
      continue;
    }
    if (pc >= p) {
      hi = rho;
      hi_beyond_max = false;
    } else {
      lo = rho;
    }
    const S next = rho - (pc - p) / dpdrho;
    const S step = num::abs_(S(next - rho)) / rho;  // relative Newton step
    const bool quad = newton_before && S(step * step * step) <= tol * prev_step * prev_step;
    if (step <= tol || quad) {
      if (next >= lo && next <= hi) rho = next;
      r.rho = rho;
      r.converged = true;
      return r;
    }
    newton_before = next > lo && next < hi;
    if (!newton_before) r.clean = false;
    prev_step = step;
    rho = newton_before ? next : S(S(0.5) * (lo + hi));
    if (collapsed()) break;
  }
  if (r.iterations > max_iter) r.iterations = max_iter;
  r.rho = rho;
  r.collapsed = collapsed();
  return r;
}

// Solves p = Z rho R T for the gas-phase molar density and reports Z, the
// densities, B, C and (when derivatives) dZ/dp and dZ/dT. Refuses a state
// outside the expanded range (T, p or composition) with out_of_range unless
// opt.allow_outside_range, then flags it extrapolated. Status.range is the
// worse of the state's and the composition's class.
//
// Density solve: solve_density() from the virial estimate, bracket [0, reduced
// density 6]; a root is accepted only on the gas branch (see below). A
// bracket collapsed without convergence means there is no gas root
// (no_gas_root); max_iter reached gives no_convergence (flag iteration_cap)
// with the last iterate.
template <class S>
[[nodiscard]] StateResult<S> evaluate(const Prepared<S>& pr, const S& T_K, const S& p_Pa, const SolveOptions& opt = {},
                                      bool derivatives = true) noexcept {
  StateResult<S> r;
  if (!pr.ready) {
    r.status = pr.status.ok() ? make_status(Code::invalid_composition) : pr.status;
    return r;
  }
  if (!num::isfinite_(T_K) || !(T_K > S(0))) {
    r.status = make_status(Code::invalid_temperature);
    return r;
  }
  if (!num::isfinite_(p_Pa) || p_Pa < S(0)) {
    r.status = make_status(Code::invalid_pressure);
    return r;
  }
  Status st = pr.status;
  const RangeClass tp = classify_state(T_K, p_Pa);
  if (static_cast<std::uint8_t>(tp) > static_cast<std::uint8_t>(st.range)) {
    st.range = tp;
    st.component = no_component;  // the state, not a component, is the worst
  }
  if (st.range == RangeClass::outside) {
    if (!opt.allow_outside_range) {
      st.code = Code::out_of_range;
      r.status = st;
      return r;
    }
    st.flags |= flag::extrapolated;
  }
  r.M_g_per_mol = pr.M_g_per_mol;

  AtTemperature<S> at;
  at_temperature(pr, T_K, at, derivatives);
  r.B_cm3_per_mol = at.B * S(1000);
  r.C_cm6_per_mol2 = at.C * S(1.0e6);

  const S p = p_Pa / S(1000);  // kPa
  S rho(0);
  DensityPoint<S> pt;
  int it = 0;
  if (p > S(0)) {
    // Start: 1 + B rho = p / (rho R T) solved for rho (ideal gas if B makes it complex).
    const S rid = p / at.RT;
    const S disc = S(1) + S(4) * at.B * rid;
    const S start = disc > S(0) ? S(S(2) * rid / (S(1) + num::sqrt_(disc))) : rid;
    // Hard upper bound: reduced density 6 lies far beyond any liquid density of
    // the method's components.
    const int max_iter = opt.max_iter > 0 ? opt.max_iter : 1;
    auto sol = solve_density(pr, at, p, S(0), S(S(6) / pr.K3), start, max_iter, S(opt.rel_tol));
    it = sol.iterations;
    // Gas branch only: p(rho) must rise monotonically from 0 to the root. In
    // the normal range, a solve that never met dp/drho <= 0 and never needed
    // bisection is taken as it is; otherwise dp/drho is sampled below the
    // root, and if it fails somewhere the root lies beyond the first maximum
    // of p(rho) (a liquid-like root): the solve is repeated below that point,
    // where a gas root exists only if the maximum reaches the pressure.
    if (sol.converged && !(sol.clean && st.range == RangeClass::normal)) {
      for (int k = 1; k < gas_branch_samples; ++k) {
        const S rk = sol.rho * S(k) / S(gas_branch_samples);
        const auto q = z_at_density(pr, at, S(pr.K3 * rk), false);
        if (!(at.RT * (q.Z + rk * pr.K3 * q.dZdD) > S(0))) {
          const int left = max_iter - it > 0 ? max_iter - it : 1;
          sol = solve_density(pr, at, p, S(0), rk, S(rk / S(2)), left, S(opt.rel_tol));
          it += sol.iterations;
          break;
        }
      }
    }
    rho = sol.rho;
    if (derivatives || !sol.converged) {
      pt = z_at_density(pr, at, S(pr.K3 * rho), derivatives);
    } else {
      pt.Z = p / (rho * at.RT);  // the converged density reproduces p; no further evaluation
    }
    if (!sol.converged) {
      if (sol.collapsed) {
        st.code = Code::no_gas_root;
      } else {
        st.code = Code::no_convergence;
        st.flags |= flag::iteration_cap;
      }
    }
  } else {
    pt = z_at_density(pr, at, S(0), derivatives);
  }
  r.iterations = it;
  r.rho_mol_per_L = rho;
  r.rho_kg_per_m3 = rho * pr.M_g_per_mol;
  r.Z = pt.Z;
  r.Z_virial2 = S(1) + at.B * rho + at.C * rho * rho;
  if (derivatives) {
    const S dZdrho = pt.dZdD * pr.K3;                       // (dZ/drho)_T
    const S dpdrho = at.RT * (pt.Z + rho * dZdrho);         // kPa dm^3/mol
    const S dpdT = rho * gas_constant<S>() * (pt.Z + T_K * pt.dZdT);  // (dp/dT)_rho, kPa/K
    r.dZdp_per_kPa = dZdrho / dpdrho;
    r.dZdT_per_K = pt.dZdT - dZdrho * dpdT / dpdrho;
  }
  r.status = st;
  return r;
}

// Compressibility factor and molar density only (the flow-computer path).
template <class S>
[[nodiscard]] ZResult<S> z_factor(const Prepared<S>& pr, const S& T_K, const S& p_Pa, const SolveOptions& opt = {}) noexcept {
  const auto s = evaluate(pr, T_K, p_Pa, opt, false);
  ZResult<S> z;
  z.Z = s.Z;
  z.rho_mol_per_L = s.rho_mol_per_L;
  z.status = s.status;
  z.iterations = s.iterations;
  return z;
}

}  // namespace zcorr::aga8_detail
