#!/usr/bin/env bash
# The audit's HTML report in a real browser (headless Chromium): reports are
# written by `zcorr audit --report` for logs with findings, loaded from the
# disk with no network, and the page must lay itself out (its render
# self-check sets data-render-check="ok"), show the findings rows and the SVG
# charts, log nothing to the console, read the same with scripts off, and
# render to a screenshot of some substance.
# Usage: report_chromium.sh ZCORR CHROMIUM WORKDIR DEMO_DB TAMPERED_DB
set -euo pipefail
zcorr=$1 chromium=$2 work=$3 demo_db=$4 tampered_db=$5
mkdir -p "$work"
cd "$work"
rm -rf out && mkdir -p out/config out/cache
# Chromium keeps nothing outside the work folder.
export XDG_CONFIG_HOME="$work/out/config" XDG_CACHE_HOME="$work/out/cache"
fail() { echo "FAIL: $*"; exit 1; }
occurrences() { { grep -o "$1" "$2" || true; } | wc -l; }  # count PATTERN FILE (0 is an answer, not an error)

# A copy of the demo's week with three intervals changed the way a tamperer
# would (Z_f 100 ppm off, beyond the 50 ppm bar), and a contract that the
# week's base pressure does not meet: calc_difference and contract_mismatch.
sqlite3 "$demo_db" ".backup out/demo-changed.db"
sqlite3 out/demo-changed.db "DROP TRIGGER interval_no_update;
  UPDATE interval SET Z_f = Z_f * 1.0001 WHERE seq IN (SELECT seq FROM interval ORDER BY seq LIMIT 3 OFFSET 3000);"
printf 'point = HF-1\nmethod = gerg2008\nbase_T = 15 degC\nbase_p = 101.56 kPa\n' > out/contract.txt

browser() {  # browser NAME EXTRA-ARGS... : a fresh profile each time, no network services
  local name=$1
  shift
  local profile
  profile=$(mktemp -d "$work/out/profile.XXXXXX")
  timeout 60 "$chromium" --headless --no-sandbox --disable-gpu --disable-quic --no-first-run --disable-background-networking \
    --disable-component-update --disable-sync --disable-extensions --user-data-dir="$profile" --enable-logging=stderr --v=0 \
    "$@" > "out/$name.stdout" 2> "out/$name.stderr" || fail "chromium $name exited with $? (out/$name.stderr)"
  rm -rf "$profile"
}

check_report() {  # check_report NAME MIN_FINDINGS MIN_CHARTS
  local name=$1 min_findings=$2 min_charts=$3 url="file://$work/out/$1.html"
  browser "$name.dom" --dump-dom "$url"
  local dom="out/$name.dom.stdout"
  grep -q 'data-render-check="ok"' "$dom" ||
    fail "$name: render self-check: $(grep -o 'data-render-check="[^"]*"' "$dom" || echo 'no body attribute')"
  local rows charts
  rows=$(occurrences '<tr class="finding ' "$dom")
  charts=$(occurrences '<svg class="chart"' "$dom")
  [ "$rows" -ge "$min_findings" ] || fail "$name: $rows findings rows, expected at least $min_findings"
  [ "$charts" -ge "$min_charts" ] || fail "$name: $charts charts, expected at least $min_charts"
  grep -q '<path class="v-logged"' "$dom" || fail "$name: the volume chart has no logged line"
  # Nothing from the page on the console: no script error, no refused load, no message at all.
  if grep -E "Uncaught|ERROR:CONSOLE|CONSOLE.*source: file://" "out/$name.dom.stderr"; then fail "$name: console output"; fi

  # Without its script (dropped from a copy; dumping the DOM itself needs scripting on) the report reads the
  # same: the self-check never ran, the content is all there.
  awk '/<script>/ { skip = 1 } !skip { print } /<\/script>/ { skip = 0 }' "out/$name.html" > "out/$name.noscript.html"
  ! grep -q '<script' "out/$name.noscript.html" || fail "$name: the copy still has a script"
  browser "$name.noscript" --dump-dom "file://$work/out/$name.noscript.html"
  grep -q 'data-render-check="pending"' "out/$name.noscript.stdout" || fail "$name: the copy ran a script"
  [ "$(occurrences '<tr class="finding ' "out/$name.noscript.stdout")" -eq "$rows" ] || fail "$name: rows differ without scripts"

  browser "$name.png" --screenshot="$work/out/$name.png" --window-size=1280,2000 "$url"
  [ -f "out/$name.png" ] || fail "$name: no screenshot"
  [ "$(head -c 8 "out/$name.png" | od -An -tx1 | tr -d ' \n')" = "89504e470d0a1a0a" ] || fail "$name: screenshot is not a PNG"
  local size
  size=$(wc -c < "out/$name.png")
  # A blank 1280x2000 page compresses to a few kB; text, tables and charts take far more.
  [ "$size" -gt 60000 ] || fail "$name: screenshot of $size bytes looks empty"
  echo "$name: render check ok, $rows findings rows, $charts charts, screenshot $size bytes"
}

run_audit() {  # run_audit NAME EXPECTED_EXIT ARGS... : writes out/NAME.html
  local name=$1 want=$2
  shift 2
  set +e
  "$zcorr" audit "$@" --report "out/$name.html" > "out/$name.audit.txt" 2> "out/$name.audit.err"
  local rc=$?
  set -e
  [ "$rc" -eq "$want" ] || fail "$name: zcorr audit exited $rc, expected $want: $(cat "out/$name.audit.err")"
  [ -s "out/$name.html" ] || fail "$name: no report written"
}

start=$(date +%s)
run_audit demo 1 --db out/demo-changed.db --contract out/contract.txt
grep -q "calc_difference" out/demo.audit.txt || fail "demo: the changed intervals were not found"
check_report demo 3 2
grep -q '<table class="over-bar wide">' out/demo.dom.stdout || fail "demo: no table of the intervals over the bar"
grep -q '<path class="dev-over"' out/demo.dom.stdout || fail "demo: the deviation chart does not mark the changed intervals"

# The tampered test log (broken chain, and a test-double gas this build cannot recompute).
run_audit tampered 1 --db "$tampered_db"
check_report tampered 2 2
grep -q 'broken_chain' out/tampered.dom.stdout || fail "tampered: no broken_chain row"
grep -q 'no interval of this point could be recomputed' out/tampered.dom.stdout || fail "tampered: the chart does not say nothing was recomputed"

# A copy of the week with a correction set over one day (a reason with markup characters in it): the audit
# has nothing above a notice (the week's pressure spike), the report lists the set and draws the as-recorded line beside the corrected one.
sqlite3 "$demo_db" ".backup out/demo-corrected.db"
"$zcorr" correct --db out/demo-corrected.db --point HF-1 --from 2026-03-04T06:00:00Z --to 2026-03-05T06:00:00Z \
  --base-p "101.56 kPa" --reason 'contract <base_p> is 101.56 kPa & "not" 101.325' > out/correct.txt 2>&1 ||
  fail "zcorr correct: $(cat out/correct.txt)"
run_audit corrected 0 --db out/demo-corrected.db
check_report corrected 1 3
grep -q 'Nothing above a notice' out/corrected.dom.stdout || fail "corrected: the verdict does not say nothing is above a notice"
grep -q '<td class="mono kind">alarm</td><td class="sev notice">notice</td>' out/corrected.dom.stdout ||
  fail "corrected: the week's alarm is not listed as a notice"
grep -q '<section id="corrections">' out/corrected.dom.stdout || fail "corrected: no table of correction sets"
grep -q 'contract &lt;base_p&gt; is 101.56 kPa &amp; "not" 101.325' out/corrected.dom.stdout || fail "corrected: the reason is not shown as text"
grep -q '<path class="v-asrec"' out/corrected.dom.stdout || fail "corrected: no as-recorded line in the volume chart"
grep -q '<path class="v-diff"' out/corrected.dom.stdout || fail "corrected: no chart of what the correction changed"

echo "report in a browser: all checks passed in $(( $(date +%s) - start )) s"
