#!/usr/bin/env bash
# The log against an adversary and an archive: an anchored head catches the
# newest records removed; two recorders through a hard link never both
# succeed; a log left by a writer that exited normally, copied to read-only
# media, verifies and audits. Fictional point and samples (tests/cli/data).
#   log_safety.sh ZCORR WORKDIR POINT_CONF ANALYSES
set -u
zcorr=$1 dir=$2 conf=$3 analyses=$4
rm -rf "$dir" && mkdir -p "$dir" && cd "$dir" || exit 1
fail() { echo "FAIL: $*"; exit 1; }
awk 'BEGIN { print "time,p_kPa,T_degC,V_m3"; for (i = 1; i <= 1080; i++) printf "%d,%.3f,%.3f,%.5f\n", 1772431200 + 10 * i, 5000 + 300 * sin(i / 50), 12, 0.2 }' > s.csv
"$zcorr" record --db a.db --config "$conf" --samples s.csv --analyses "$analyses" > rec.txt || fail "record exit $?"
grep -q "read back  .* records appended by this run, as written" rec.txt || fail "record did not read back: $(cat rec.txt)"
head=$(sed -n 's/^  head               seq \([0-9]*\), hash \([0-9a-f]*\)$/\1:\2/p' rec.txt)
[ -n "$head" ] || fail "no head in the record output"
"$zcorr" verify --db a.db --expect-head "$head" > v0.txt || fail "verify --expect-head on the genuine log: exit $?"
grep -q "in the log, as it was" v0.txt || fail "anchor line: $(cat v0.txt)"

# 1. The newest 60 records removed (a truncation the chain alone cannot see).
cp a.db t.db
seq=${head%%:*}
# A careful forger puts the no-delete triggers back (the verifier reports missing ones).
sqlite3 t.db "SELECT sql || ';' FROM sqlite_schema WHERE type = 'trigger' AND name IN ('log_header_no_delete', 'point_config_no_delete', 'gas_analysis_no_delete', 'interval_no_delete', 'event_no_delete', 'qtr_no_delete')" > triggers.sql
sqlite3 t.db "$(for t in log_header point_config gas_analysis interval event qtr; do
  printf 'DROP TRIGGER IF EXISTS %s_no_delete; DELETE FROM %s WHERE seq > %d;' "$t" "$t" $((seq - 60)); done)" || fail "truncating"
sqlite3 t.db < triggers.sql || fail "restoring the triggers"
"$zcorr" verify --db t.db > /dev/null || fail "a truncated log should verify clean without an anchor (documented)"
"$zcorr" verify --db t.db --expect-head "$head" > v1.txt; rc=$?
[ $rc -eq 1 ] || fail "verify --expect-head on the truncated log: exit $rc"
grep -q "removed .*the log ends at seq $((seq - 60)), before the expected seq $seq" v1.txt || fail "truncation finding: $(cat v1.txt)"
"$zcorr" audit --db t.db --expect-head "$head" > a1.txt; rc=$?
[ $rc -ne 0 ] || fail "audit --expect-head on the truncated log: exit 0"
grep -q "removed" a1.txt || fail "audit names no removal: $(head -40 a1.txt)"
"$zcorr" verify --db a.db --expect-head "nonsense" > /dev/null 2> e.txt; rc=$?
[ $rc -eq 2 ] && grep -q -- "--expect-head" e.txt || fail "a malformed --expect-head: exit $rc, $(cat e.txt)"

# 2. Two recorders through a hard link: never both succeed; the log verifies.
cp a.db h.db && ln h.db h-link.db
awk 'BEGIN { print "time,p_kPa,T_degC,V_m3"; for (i = 1081; i <= 1440; i++) printf "%d,%.3f,%.3f,%.5f\n", 1772431200 + 10 * i, 5000, 12, 0.2 }' > s2.csv
"$zcorr" record --db h.db --config "$conf" --samples s2.csv > r1.txt 2>&1 & p1=$!
"$zcorr" record --db h-link.db --config "$conf" --samples s2.csv > r2.txt 2>&1 & p2=$!
wait $p1; rc1=$?; wait $p2; rc2=$?
if [ $rc1 -eq 0 ] && [ $rc2 -eq 0 ]; then fail "two recorders through a hard link both succeeded"; fi
grep -q "hard links" r1.txt r2.txt || fail "no hard-link refusal: $(cat r1.txt r2.txt)"
"$zcorr" verify --db h.db > /dev/null || fail "the hard-linked log does not verify"

# 3. Read-only media: a tmpfs mounted read-only (needs mount rights), else a
# folder and file the reader cannot write (needs a user other than root).
mkdir ro
if mount -t tmpfs -o size=16m tmpfs ro 2> /dev/null; then
  trap 'umount "$dir/ro" 2> /dev/null' EXIT
  cp a.db ro/ && mount -o remount,ro ro || fail "remounting read-only"
  touch ro/x 2> /dev/null && fail "the tmpfs is writable"
  run() { "$@"; }
elif [ "$(id -u)" -ne 0 ]; then
  cp a.db ro/ && chmod 444 ro/a.db && chmod 555 ro
  run() { "$@"; }
else
  echo "SKIP: neither a mount nor a non-root user is available"; exit 77
fi
[ -e ro/a.db-wal ] && fail "the writer left a -wal beside the copy"
run "$zcorr" verify --db ro/a.db --expect-head "$head" > v2.txt || fail "verify on read-only media: exit $? $(cat v2.txt)"
run "$zcorr" audit --db ro/a.db > a2.txt; rc=$?
[ $rc -eq 0 ] || fail "audit on read-only media: exit $rc $(tail -5 a2.txt)"
ls ro
echo "log safety: anchor, hard link and read-only media all hold"
