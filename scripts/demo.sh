#!/usr/bin/env bash
# Installs the dependencies, builds zcorr and runs the demo scenario.
set -euo pipefail
here=$(cd "$(dirname "$0")/.." && pwd)
bash "$here/scripts/install-deps.sh"
cmake -S "$here" -B "$here/build" -DCMAKE_BUILD_TYPE=Release -DZCORR_BUILD_TESTS=OFF -DZCORR_BUILD_BENCH=OFF >/dev/null
cmake --build "$here/build" -j2 --target zcorr
"$here/build/cli/zcorr" demo
