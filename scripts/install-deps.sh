#!/usr/bin/env bash
# Installs zcorr's build and test dependencies from Debian's packages.
# Run as root on a Debian 12 machine (the compiler, CMake, GoogleTest and
# Google Benchmark are assumed present; they are installed too if missing).
set -euo pipefail
# libsqlite3-dev / sqlite3: the interval log (the shell is used by the tamper tests).
# libssl-dev: OpenSSL libcrypto's SHA-256 for the log's hash chain (engine/record).
# chromium: headless, for the test that opens `zcorr audit --report` pages in a real browser
#   (tests/cli/report_chromium.sh); scripts/test.sh configures with ZCORR_REQUIRE_BROWSER=ON.
# bsdutils: util-linux `script`, a terminal for the progress-bar test.
pkgs=(g++ cmake make libgtest-dev libbenchmark-dev libboost-dev libcli11-dev nlohmann-json3-dev
      libsqlite3-dev sqlite3 libssl-dev bsdutils chromium)
missing=()
for p in "${pkgs[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ ${#missing[@]} -gt 0 ]; then
  echo "zcorr: installing ${missing[*]}"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update
  apt-get install -y --no-install-recommends "${missing[@]}"
fi
