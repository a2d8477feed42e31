#!/usr/bin/env python3
"""Generates engine/data/gerg2008_data.hpp from the GERG-2008 coefficient CSVs.

Usage:  python3 engine/data/gen/gerg2008_tables.py [CSV_DIR] > engine/data/gerg2008_data.hpp
        (CSV_DIR defaults to engine/data/gen/gerg2008, the project copy of the tables)

Source of the numbers: Kunz & Wagner, J. Chem. Eng. Data 57 (2012) 3032-3091
(GERG-2008), as transcribed and cross-checked in the data set described in
engine/data/gen/gerg2008/PROVENANCE.md. Components are mapped by name onto
the canonical order of engine/core/components.hpp. Numbers are copied as
written in the CSVs (shortest exact decimal form); nothing is rounded or fitted.

Besides the tables, the script assigns each residual term an index into the
list of distinct temperature exponents t and the list of distinct density
"shapes" (d, exponential group). The engine uses these indices to gather equal
terms of all components into one sum (engine/methods/gerg2008.hpp).
"""
import csv
import os
import sys

CANONICAL = [
    "methane", "nitrogen", "carbon_dioxide", "ethane", "propane", "n_butane", "isobutane",
    "n_pentane", "isopentane", "n_hexane", "n_heptane", "n_octane", "n_nonane", "n_decane",
    "hydrogen", "oxygen", "carbon_monoxide", "water", "hydrogen_sulfide", "helium", "argon",
]


def canon(name):
    key = name.strip().lower().replace(" ", "_").replace("-", "_")
    if key not in CANONICAL:
        sys.exit(f"unknown component name {name!r}")
    return CANONICAL.index(key)


def rows(d, f):
    with open(os.path.join(d, f), newline="") as fh:
        return list(csv.DictReader(fh))


def num(s):
    s = s.strip()
    float(s)  # validates
    return s


def lit(s):
    """C++ double literal from a decimal string, unchanged in value."""
    s = num(s)
    if not any(ch in s for ch in ".eE"):
        s += ".0"
    return s


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    d = sys.argv[1] if len(sys.argv) > 1 else os.path.join(here, "gerg2008")

    fluids = sorted(rows(d, "pure_fluids.csv"), key=lambda r: canon(r["name"]))
    if [canon(r["name"]) for r in fluids] != list(range(21)):
        sys.exit("pure_fluids.csv must list the 21 components once each")
    ideal = {canon(r["name"]): r for r in rows(d, "pure_ideal_gas.csv")}
    resid = rows(d, "pure_residual_terms.csv")
    binary = rows(d, "binary_reducing.csv")
    dep_terms = rows(d, "departure_functions.csv")
    dep_factors = rows(d, "departure_factors.csv")

    t_values = []    # distinct temperature exponents (as decimal strings, compared by value)
    groups = []      # distinct exponential groups: ("pol",), ("exp", c), ("gauss", eta, eps, beta, gamma)
    shapes = []      # distinct (d, group index)

    def t_index(t):
        v = float(t)
        for i, s in enumerate(t_values):
            if float(s) == v:
                return i
        t_values.append(num(t))
        return len(t_values) - 1

    def group_index(g):
        key = tuple([g[0]] + [float(v) for v in g[1:]])
        for i, s in enumerate(groups):
            if tuple([s[0]] + [float(v) for v in s[1:]]) == key:
                return i
        groups.append(g)
        return len(groups) - 1

    def shape_index(dd, g):
        key = (int(dd), g)
        if key not in shapes:
            shapes.append(key)
        return shapes.index(key)

    combos = []      # distinct (t index, shape index): terms that differ only in n

    def combo_index(ti, si):
        if (ti, si) not in combos:
            combos.append((ti, si))
        return combos.index((ti, si))

    group_index(("pol",))  # group 0: no exponential factor

    # Pure-fluid residual terms, grouped by component in canonical order.
    by_comp = {i: [] for i in range(21)}
    for r in resid:
        by_comp[canon(r["name"])].append(r)
    pure_lines, first, count = [], [], []
    for i in range(21):
        terms = sorted(by_comp[i], key=lambda r: int(r["k"]))
        first.append(len(pure_lines))
        count.append(len(terms))
        for r in terms:
            dd = int(r["d_k"])
            if r["term"] == "pol":
                if float(r["c_k"]) != 0.0:
                    sys.exit(f"pol term with c != 0: {r}")
                g = group_index(("pol",))
            elif r["term"] == "exp":
                c = int(r["c_k"])
                if c <= 0 or float(r["c_k"]) != c:
                    sys.exit(f"exp term needs an integer c >= 1: {r}")
                g = group_index(("exp", str(c)))
            else:
                sys.exit(f"unknown term type {r['term']!r}")
            ti, si = t_index(r["t_k"]), shape_index(dd, g)
            ci = combo_index(ti, si)
            pure_lines.append(
                f"    {{{lit(r['n_k'])}, {dd}, {lit(r['t_k'])}, {int(float(r['c_k']))}, {ci}}},"
                f"  // {CANONICAL[i]} k={r['k']}")

    # Departure functions.
    funcs = []
    for r in dep_terms:
        if r["function"] not in funcs:
            funcs.append(r["function"])
    dep_lines, dfirst, dcount = [], [], []
    for fn in funcs:
        terms = sorted([r for r in dep_terms if r["function"] == fn], key=lambda r: int(r["k"]))
        dfirst.append(len(dep_lines))
        dcount.append(len(terms))
        for r in terms:
            dd = int(float(r["d"]))
            if r["term"] == "pol":
                if any(float(r[k]) != 0.0 for k in ("eta", "epsilon", "beta", "gamma")):
                    sys.exit(f"pol departure term with exponential parameters: {r}")
                g = group_index(("pol",))
            elif r["term"] == "exp":
                g = group_index(("gauss", num(r["eta"]), num(r["epsilon"]), num(r["beta"]), num(r["gamma"])))
            else:
                sys.exit(f"unknown term type {r['term']!r}")
            ti, si = t_index(r["t"]), shape_index(dd, g)
            ci = combo_index(ti, si)
            dep_lines.append(
                f"    {{{lit(r['n'])}, {dd}, {lit(r['t'])}, {lit(r['eta'])}, {lit(r['epsilon'])}, "
                f"{lit(r['beta'])}, {lit(r['gamma'])}, {ci}}},  // {fn} k={r['k']}")

    # Binary parameters: every pair i < j in canonical order.
    fac = {}
    for r in dep_factors:
        a, b = canon(r["name_i"]), canon(r["name_j"])
        fac[(min(a, b), max(a, b))] = (r["F_ij"], funcs.index(r["departure_function"]))
    pair_lines, seen = [], set()
    pairs = []
    for r in binary:
        a, b = canon(r["name_i"]), canon(r["name_j"])
        bv, gv, bt, gt = r["beta_v"], r["gamma_v"], r["beta_T"], r["gamma_T"]
        if a > b:  # orientation: beta_ji = 1 / beta_ij (never needed for this data set)
            sys.exit(f"pair {r['name_i']}-{r['name_j']} is stored reversed; add the inversion here")
        pairs.append((a, b, bv, gv, bt, gt))
        seen.add((a, b))
    if len(seen) != 210:
        sys.exit("binary_reducing.csv must have all 210 pairs")
    pairs.sort()
    for a, b, bv, gv, bt, gt in pairs:
        F, fi = fac.get((a, b), ("0", -1))
        pair_lines.append(f"    {{{a}, {b}, {lit(bv)}, {lit(gv)}, {lit(bt)}, {lit(gt)}, {lit(F)}, {fi}}},"
                          f"  // {CANONICAL[a]} - {CANONICAL[b]}")
    if len(fac) != 15:
        sys.exit("departure_factors.csv must have 15 pairs")

    out = []
    w = out.append
    w("// GENERATED by engine/data/gen/gerg2008_tables.py from the CSVs in engine/data/gen/gerg2008/.")
    w("// Do not edit by hand: change the script or the CSVs and regenerate.")
    w("//")
    w("// GERG-2008 wide-range equation of state for natural gases and other mixtures:")
    w("//   O. Kunz, W. Wagner, \"The GERG-2008 wide-range equation of state for natural gases")
    w("//   and other mixtures: an expansion of GERG-2004\", J. Chem. Eng. Data 57 (2012) 3032-3091,")
    w("//   Tables A5 (pure-fluid data), A6 (F_ij), A7 (departure functions), A8 (reducing")
    w("//   parameters), and the pure-fluid equations and ideal-gas parts it specifies.")
    w("// Provenance of the numbers: the machine-readable GERG-2008 tables of the project data set")
    w("//   (engine/data/gen/gerg2008/PROVENANCE.md): pure-fluid data from teqp (usnistgov/teqp,")
    w("//   commit 8f1afca5c2f8, include/teqp/models/GERG/GERG.hpp), binary parameters, F_ij and")
    w("//   departure functions from CoolProp's transcription of Kunz & Wagner Tables A6-A8")
    w("//   (CoolProp/CoolProp, commit ea27c6394887), cross-checked value by value against each other.")
    w("//   Not checked against the printed journal tables or ISO 20765-2 by this project.")
    w("// Units: M in g/mol, rhoc in mol/dm^3, Tc in K. R = 8.314472 J/(mol K) for the whole model;")
    w("//   the ideal-gas part uses R* = 8.314510 J/(mol K) through the ratio R*/R.")
    w("// Ideal-gas n0_1, n0_2: both the transcribed values and the values re-solved for")
    w("//   h0 = s0 = 0 at 298.15 K, 101.325 kPa are given (the data set warns that the transcribed ones")
    w("//   are unreliable). They shift only absolute h, s, u, a, g; zcorr's outputs (Z, density,")
    w("//   derivatives, heat capacities, speed of sound) do not depend on them.")
    w("//")
    w("// Does not throw, does not allocate, does no I/O.")
    w("#pragma once")
    w("")
    w("#include <array>")
    w("#include <cstddef>")
    w("#include <cstdint>")
    w("#include <string_view>")
    w("")
    w("namespace zcorr::gerg2008::data {")
    w("")
    w("inline constexpr double R_J_per_mol_K = 8.314472;       // Kunz & Wagner 2012, GERG-2008 gas constant")
    w("inline constexpr double Rstar_J_per_mol_K = 8.314510;   // Kunz & Wagner 2012, ideal-gas part (R*)")
    w("")
    w("struct PureFluid {")
    w("  std::string_view name;  // canonical name (core/components.hpp), same index")
    w("  double M_g_per_mol;")
    w("  double rhoc_mol_per_dm3;  // reducing (critical) density")
    w("  double Tc_K;              // reducing (critical) temperature")
    w("  std::uint16_t first_term; // into pure_terms")
    w("  std::uint16_t term_count;")
    w("};")
    w("")
    w(f"inline constexpr std::array<PureFluid, 21> pure_fluids{{{{")
    for i, r in enumerate(fluids):
        w(f"    {{\"{CANONICAL[i]}\", {lit(r['M_g_per_mol'])}, {lit(r['rhoc_mol_per_dm3'])}, {lit(r['Tc_K'])}, "
          f"{first[i]}, {count[i]}}},")
    w("}};")
    w("")
    w("// Ideal-gas part of component i (tau_i = Tc_i / T, delta_i = rho / rhoc_i):")
    w("//   alpha0_i = ln delta_i + (R*/R) [n1 + n2 tau_i + n3 ln tau_i + n4 ln|sinh(v4 tau_i)|")
    w("//              - n5 ln cosh(v5 tau_i) + n6 ln|sinh(v6 tau_i)| - n7 ln cosh(v7 tau_i)]")
    w("// A zero coefficient means the term is absent.")
    w("struct IdealGas {")
    w("  double n1, n2;                  // as transcribed")
    w("  double n1_refstate, n2_refstate; // re-solved for h0 = s0 = 0 at 298.15 K, 101.325 kPa")
    w("  double n3, n4, n5, n6, n7;")
    w("  double v4, v5, v6, v7;")
    w("};")
    w("")
    w("inline constexpr std::array<IdealGas, 21> ideal_gas{{")
    for i in range(21):
        r = ideal[i]
        vals = [r[k] for k in ("n0_1", "n0_2", "n0_1_refstate", "n0_2_refstate", "n0_3", "n0_4", "n0_5", "n0_6",
                               "n0_7", "v0_4", "v0_5", "v0_6", "v0_7")]
        w("    {" + ", ".join(lit(v) for v in vals) + f"}},  // {CANONICAL[i]}")
    w("}};")
    w("")
    w("// Distinct temperature exponents t of all residual terms (pure and departure).")
    w(f"inline constexpr std::array<double, {len(t_values)}> t_values{{")
    for k in range(0, len(t_values), 8):
        w("    " + " ".join(lit(v) + "," for v in t_values[k:k + 8]))
    w("};")
    w("")
    w("// Exponential factor groups: kind 0 none; kind 1 exp(-delta^c);")
    w("// kind 2 exp(-eta (delta - epsilon)^2 - beta (delta - gamma)).")
    w("struct ExpGroup {")
    w("  std::uint8_t kind;")
    w("  int c;")
    w("  double eta, epsilon, beta, gamma;")
    w("};")
    w(f"inline constexpr std::array<ExpGroup, {len(groups)}> exp_groups{{{{")
    for g in groups:
        if g[0] == "pol":
            w("    {0, 0, 0.0, 0.0, 0.0, 0.0},")
        elif g[0] == "exp":
            w(f"    {{1, {g[1]}, 0.0, 0.0, 0.0, 0.0}},")
        else:
            w(f"    {{2, 0, {lit(g[1])}, {lit(g[2])}, {lit(g[3])}, {lit(g[4])}}},")
    w("}};")
    w("")
    w("// Distinct density shapes delta^d * (exponential group).")
    w("struct Shape {")
    w("  int d;")
    w("  std::uint8_t group;")
    w("};")
    w(f"inline constexpr std::array<Shape, {len(shapes)}> shapes{{{{")
    for k in range(0, len(shapes), 6):
        w("    " + " ".join(f"{{{s[0]}, {s[1]}}}," for s in shapes[k:k + 6]))
    w("}};")
    w("// Distinct (t, shape) combinations: terms of any component or departure function")
    w("// that share a combination differ only in n and are summed at prepare time.")
    w("struct Combo {")
    w("  std::uint16_t t_index;      // into t_values")
    w("  std::uint16_t shape_index;  // into shapes")
    w("};")
    w(f"inline constexpr std::array<Combo, {len(combos)}> combos{{{{")
    for k in range(0, len(combos), 6):
        w("    " + " ".join(f"{{{c[0]}, {c[1]}}}," for c in combos[k:k + 6]))
    w("}};")
    w(f"inline constexpr int max_d = {max(s[0] for s in shapes)};")
    w(f"inline constexpr int max_c = {max(int(g[1]) for g in groups if g[0] == 'exp')};")
    w("")
    w("// Pure-fluid residual terms: n delta^d tau^t [exp(-delta^c) when c > 0].")
    w("struct PureTerm {")
    w("  double n;")
    w("  int d;")
    w("  double t;")
    w("  int c;")
    w("  std::uint16_t combo;  // into combos")
    w("};")
    w(f"inline constexpr std::array<PureTerm, {len(pure_lines)}> pure_terms{{{{")
    out.extend(pure_lines)
    w("}};")
    w("")
    w("// Departure-function terms: n delta^d tau^t [exp(-eta (delta-epsilon)^2 - beta (delta-gamma))")
    w("// for exponential terms; eta = epsilon = beta = gamma = 0 on polynomial terms].")
    w("struct DepartureTerm {")
    w("  double n;")
    w("  int d;")
    w("  double t;")
    w("  double eta, epsilon, beta, gamma;")
    w("  std::uint16_t combo;  // into combos")
    w("};")
    w(f"inline constexpr std::array<DepartureTerm, {len(dep_lines)}> departure_terms{{{{")
    out.extend(dep_lines)
    w("}};")
    w("")
    w("struct DepartureFunction {")
    w("  std::string_view name;")
    w("  std::uint16_t first_term;")
    w("  std::uint16_t term_count;")
    w("};")
    w(f"inline constexpr std::array<DepartureFunction, {len(funcs)}> departure_functions{{{{")
    for k, fn in enumerate(funcs):
        w(f"    {{\"{fn}\", {dfirst[k]}, {dcount[k]}}},")
    w("}};")
    w("")
    w("// Binary parameters for every pair i < j (canonical indices): reducing-function")
    w("// beta_v, gamma_v, beta_T, gamma_T (Table A8; beta_ji = 1/beta_ij), departure factor F_ij")
    w("// (Table A6) and the departure function used (-1: none).")
    w("struct BinaryPair {")
    w("  std::uint8_t i, j;")
    w("  double beta_v, gamma_v, beta_T, gamma_T;")
    w("  double F;")
    w("  int departure;")
    w("};")
    w(f"inline constexpr std::array<BinaryPair, {len(pair_lines)}> binary_pairs{{{{")
    out.extend(pair_lines)
    w("}};")
    w("")
    w("}  // namespace zcorr::gerg2008::data")
    print("\n".join(out))


if __name__ == "__main__":
    main()
