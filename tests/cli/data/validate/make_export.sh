#!/bin/sh
# Makes the flow-computer export used by tests/cli/validate.tests.cmake from
# zcorr itself (see README.md in this folder):
#   exact_export.csv    24 hourly records whose Zf and Zb are zcorr's own
#                       (zcorr z --method METHOD), CF = (P/Pb)(Tb/T)(Zb/Zf) and
#                       Base Vol = CF * Flow Vol computed here from them;
#   planted_export.csv  the same with Zf 0.02 % high on rows 4, 9 and 17
#                       (and CF and Base Vol computed from that wrong Zf).
# Usage: sh make_export.sh path/to/zcorr OUTDIR [METHOD]   (METHOD: gerg2008)
set -eu
ZCORR=$1
OUT=$2
METHOD=${3:-gerg2008}
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT

# 1. The fictional station's hourly readings, as a flow computer prints them:
#    temperature in degF and pressure in psig to 2 decimals, analysis in mol %
#    (a new analysis from 12:00), flow volume in m3 to 3 decimals.
awk 'BEGIN {
  pi = 3.14159265358979
  for (h = 0; h < 24; h++) {
    tF = 48 + 9 * sin((h - 6) * pi / 12)
    pg = 850 + 25 * cos(h * pi / 8)
    vf = 410 + 35 * sin(h * pi / 6) + 3 * h
    if (h < 12) { c1 = "94.10"; c2 = "3.20"; c3 = "0.60"; n2 = "1.40"; co2 = "0.70" }
    else        { c1 = "93.25"; c2 = "3.85"; c3 = "0.75"; n2 = "1.30"; co2 = "0.85" }
    printf "2026-11-03 %02d:00,%.2f,%.2f,%s,%s,%s,%s,%s,%.3f\n", h, tF, pg, c1, c2, c3, n2, co2, vf
  }
}' > "$tmp/readings.csv"

# 2. The same states in zcorr's batch layout (K, kPa absolute, mole fractions),
#    at line conditions and at the base conditions (60 degF, 14.73 psia).
#    Atmospheric pressure 14.5 psia; psi = 0.45359237 * 9.80665 / 0.0254^2 Pa.
awk -F, -v which=line 'BEGIN {
  psi = 0.45359237 * 9.80665 / (0.0254 * 0.0254)
  print "T_K,P_kPa,methane,ethane,propane,nitrogen,carbon_dioxide"
} {
  T = ($2 + 459.67) / 1.8; P = ($3 + 14.5) * psi / 1000
  printf "%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g\n", T, P, $4 * 0.01, $5 * 0.01, $6 * 0.01, $7 * 0.01, $8 * 0.01
}' "$tmp/readings.csv" > "$tmp/line.csv"
awk -F, 'BEGIN {
  psi = 0.45359237 * 9.80665 / (0.0254 * 0.0254)
  print "T_K,P_kPa,methane,ethane,propane,nitrogen,carbon_dioxide"
} {
  printf "%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g\n", (60 + 459.67) / 1.8, 14.73 * psi / 1000, $4 * 0.01, $5 * 0.01, $6 * 0.01, $7 * 0.01, $8 * 0.01
}' "$tmp/readings.csv" > "$tmp/base.csv"

# 3. Z from zcorr.
"$ZCORR" z --method "$METHOD" --input "$tmp/line.csv" > "$tmp/line_z.csv"
"$ZCORR" z --method "$METHOD" --input "$tmp/base.csv" > "$tmp/base_z.csv"
zcol() { awk -F, 'NR == 1 { for (i = 1; i <= NF; i++) if ($i == "Z") c = i; next } { print $c }' "$1"; }
zcol "$tmp/line_z.csv" > "$tmp/zf"
zcol "$tmp/base_z.csv" > "$tmp/zb"
paste -d, "$tmp/readings.csv" "$tmp/zf" "$tmp/zb" > "$tmp/joined.csv"

# 4. The export, exact and with the planted error.
write_export() {
  awk -F, -v plant="$1" 'BEGIN {
    psi = 0.45359237 * 9.80665 / (0.0254 * 0.0254)
    Tb = (60 + 459.67) / 1.8; Pb = 14.73 * psi
    print "Record Time,Flow Temp (F),Static Press (psig),Methane mol%,Ethane mol%,Propane mol%,Nitrogen mol%,CO2 mol%,Zf,Zb,CF,Flow Vol (m3),Base Vol (m3),Alarm"
  } {
    if ($10 == "" || $11 == "") { print "zcorr gave no Z for row " NR > "/dev/stderr"; exit 1 }
    T = ($2 + 459.67) / 1.8; P = ($3 + 14.5) * psi
    zf = $10; zb = $11
    if (plant && (NR == 4 || NR == 9 || NR == 17)) zf = zf * 1.0002
    C = (P / Pb) * (Tb / T) * (zb / zf)
    printf "%s,%s,%s,%s,%s,%s,%s,%s,%.10g,%.10g,%.10g,%s,%.4f,\n", $1, $2, $3, $4, $5, $6, $7, $8, zf, zb, C, $9, C * $9
  }' "$tmp/joined.csv"
}
write_export 0 > "$OUT/exact_export.csv"
write_export 1 > "$OUT/planted_export.csv"
