#!/usr/bin/env bash
# Kill test of `zcorr correct`: a correction set over a long recorded log is
# killed with SIGKILL at random moments. After every kill the log verifies and
# holds either no correction at all or one whole set (never part of one), and
# the records it had before are unchanged. Usage: kill_correct.sh ZCORR WORKDIR CONFIG ANALYSES
set -euo pipefail
zcorr=$1 work=$2 conf=$3 analyses=$4
mkdir -p "$work"
cd "$work"
rm -f base.db* run.db*
# 8 days of 60-s rows (invented, smooth swings): 11520 intervals.
awk 'BEGIN { print "time,p_kPa,T_degC,V_m3"; t0 = 1772431200;
             for (i = 1; i <= 11520; i++) printf "%d,%.3f,%.3f,%.5f\n", t0 + 60 * i, 5000 + 300 * sin(i / 80), 10 + 2 * cos(i / 120), 1.2 + 0.3 * sin(i / 50) }' > long.csv
"$zcorr" record --db base.db --config "$conf" --samples long.csv --analyses "$analyses" --batch 500 > /dev/null
before=$(sqlite3 base.db "SELECT count(*) || ' ' || max(seq) || ' ' || hex(hash) FROM interval WHERE seq = (SELECT max(seq) FROM interval)")
fresh() { rm -f run.db*; sqlite3 base.db ".backup run.db"; }
correct() { "$zcorr" correct --db run.db --point TEST-CLI --base-p "101.56 kPa" --reason "kill test" > /dev/null 2>&1; }
fresh
start=$(date +%s%N)
correct
run_ms=$(( ($(date +%s%N) - start) / 1000000 ))
kills=0 whole=0
for round in 1 2 3 4 5 6; do
  fresh
  # zcorr itself in the background (not a subshell), so the kill reaches it.
  "$zcorr" correct --db run.db --point TEST-CLI --base-p "101.56 kPa" --reason "kill test" > /dev/null 2>&1 &
  pid=$!
  delay_ms=$(( RANDOM % (run_ms + 1) ))
  sleep "$(printf '%d.%03d' $((delay_ms / 1000)) $((delay_ms % 1000)))"
  if kill -9 "$pid" 2> /dev/null; then kills=$((kills + 1)); fi
  wait "$pid" 2> /dev/null || true
  "$zcorr" verify --db run.db > verify.out || { echo "after kill $round the log does not verify:"; cat verify.out; exit 1; }
  sets=0
  if [ "$(sqlite3 run.db "SELECT count(*) FROM sqlite_schema WHERE name = 'correction_set'")" = 1 ]; then
    sets=$(sqlite3 run.db "SELECT count(*) FROM correction_set")
  fi
  corr=$(sqlite3 run.db "SELECT count(*) FROM interval WHERE corrects_seq IS NOT NULL")
  case "$sets $corr" in
    "0 0") ;;
    "1 11520") whole=$((whole + 1)) ;;
    *) echo "after kill $round: $sets set(s) and $corr correcting intervals: a part of a set"; exit 1 ;;
  esac
  now=$(sqlite3 run.db "SELECT count(*) || ' ' || max(seq) || ' ' || hex(hash) FROM interval WHERE seq = (SELECT max(seq) FROM interval WHERE corrects_seq IS NULL)")
  if [ "$now" != "$before" ]; then echo "after kill $round the recorded intervals changed: '$now' vs '$before'"; exit 1; fi
done
if [ "$kills" -lt 2 ]; then echo "only $kills kills landed: the correction is too short for this machine (${run_ms} ms)"; exit 1; fi
echo "kill test: $kills kills during a ${run_ms} ms correction set, $whole round(s) ended with the whole set; never a part of one"
