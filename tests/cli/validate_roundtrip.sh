#!/bin/sh
# Round trip of the test points (tests/cli/validate.tests.cmake):
#   points written by zcorr, answered as a flow computer showing Z to 6 and C to
#   7 decimals would answer them -> answers exit 0;
#   the same with point pipe-03 answered 0.02 % high in Z_f -> exit 1 naming it;
#   the file as written (nothing answered) -> exit 1.
# Usage: sh validate_roundtrip.sh path/to/zcorr WORKDIR [METHOD]
set -u
ZCORR=$1
W=$2
METHOD=${3:-gerg2008}
mkdir -p "$W"
fail() { echo "FAIL: $*"; exit 1; }

"$ZCORR" validate points --method "$METHOD" --base iso15 --out "$W/points.csv" || fail "points exit $?"

# Fills the reported columns from the expected ones (the why texts hold no commas).
answer() {
  awk -F, -v OFS=, -v plant="$1" '
    /^#/ { print; next }
    !seen { seen = 1; for (i = 1; i <= NF; i++) col[$i] = i; print; next }
    {
      zf = $col["Z_f_expected"]; zb = $col["Z_b_expected"]; c = $col["C_expected"]
      if ($col["point"] == plant) zf = zf * 1.0002
      $col["Z_f_reported"] = sprintf("%.6f", zf)
      $col["Z_b_reported"] = sprintf("%.6f", zb)
      $col["C_reported"] = sprintf("%.7f", c)
      print
    }' "$W/points.csv"
}
answer none > "$W/answered.csv"
answer pipe-03 > "$W/answered_wrong.csv"

out=$("$ZCORR" validate answers --file "$W/answered.csv" 2>&1); rc=$?
[ $rc -eq 0 ] || fail "answered: exit $rc, expected 0
$out"
echo "$out" | grep -q "RESULT: all [0-9]* points within tolerance of zcorr.s recomputation" || fail "answered: no within-tolerance line
$out"

out=$("$ZCORR" validate answers --file "$W/answered_wrong.csv" 2>&1); rc=$?
[ $rc -eq 1 ] || fail "answered_wrong: exit $rc, expected 1
$out"
echo "$out" | grep -q "pipe-03: Z_f reported [0-9.]*, expected [0-9.]*, +[0-9.]* ppm  OUTSIDE" || fail "answered_wrong: pipe-03 not named
$out"
echo "$out" | grep -q "RESULT: 1 of [0-9]* points outside tolerance" || fail "answered_wrong: not exactly one point outside
$out"

out=$("$ZCORR" validate answers --file "$W/points.csv" 2>&1); rc=$?
[ $rc -eq 1 ] || fail "unanswered: exit $rc, expected 1
$out"
echo "$out" | grep -q "Nothing reported to compare" || fail "unanswered: not said
$out"
echo "ok: validate points/answers round trip"
