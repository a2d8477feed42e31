#!/usr/bin/env bash
# Installs the dependencies, then builds and runs every test twice: a
# Release build with warnings as errors, and an address + undefined-behaviour
# sanitizer build. Also runs `zcorr cases` from the Release build.
set -euo pipefail
here=$(cd "$(dirname "$0")/.." && pwd)
jobs=${ZCORR_JOBS:-2}
bash "$here/scripts/install-deps.sh"

echo "== Release build (warnings are errors)"
cmake -S "$here" -B "$here/build" -DCMAKE_BUILD_TYPE=Release -DZCORR_WERROR=ON -DZCORR_BUILD_TESTS=ON -DZCORR_BUILD_BENCH=ON \
      -DZCORR_REQUIRE_BROWSER=ON
cmake --build "$here/build" -j"$jobs"
ctest --test-dir "$here/build" --no-tests=error --output-on-failure -j"$jobs"
"$here/build/cli/zcorr" cases

echo "== Sanitizer build (address + undefined behaviour)"
cmake -S "$here" -B "$here/build-sanitize" -DCMAKE_BUILD_TYPE=RelWithDebInfo -DZCORR_SANITIZE=ON -DZCORR_WERROR=ON \
      -DZCORR_BUILD_TESTS=ON -DZCORR_BUILD_BENCH=OFF -DZCORR_REQUIRE_BROWSER=ON
cmake --build "$here/build-sanitize" -j"$jobs"
ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1 \
  ctest --test-dir "$here/build-sanitize" --no-tests=error --output-on-failure -j"$jobs"
echo "== all tests passed"
