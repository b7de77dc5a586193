#!/usr/bin/env bash
# An example CI job: check a freshly built bitstream on a bench board with the Anglebench runner.
# Loading the bitstream is the lab's own step (vendor tools); this script starts after it.
#
# Needs, from the CI secrets and variables:
#   ANGLEBENCH_SERVER   e.g. https://anglebench.lab.example
#   ANGLEBENCH_TOKEN    a personal API token of the CI account (role engineer)
#   BENCH_DEVICE        the board's serial port, e.g. /dev/ttyUSB0, or a bridge: ws://bench-3:5180/?token=…
#   CORE_SLUG           the core under test, e.g. reference-16
#   BUILD_LABEL         the build's label, e.g. the pipeline number and commit
#   BOARD_NAME          optional: the bench board, e.g. "Bay 3 / bench A"
#
# Exit status is the runner's: 0 pass, 1 a limit failed (a regression), 2 the check could not run.
set -euo pipefail

: "${ANGLEBENCH_SERVER:?}" "${ANGLEBENCH_TOKEN:?}" "${BENCH_DEVICE:?}" "${CORE_SLUG:?}" "${BUILD_LABEL:?}"
out="${CI_ARTIFACTS_DIR:-artifacts}"
mkdir -p "$out"

run() {
  local name="$1" plan="$2"
  set +e
  npm run --silent cli -- run --device "$BENCH_DEVICE" --plan "$plan" --core "$CORE_SLUG" \
    --build "$BUILD_LABEL" ${BOARD_NAME:+--board "$BOARD_NAME"} \
    --server "$ANGLEBENCH_SERVER" --token "$ANGLEBENCH_TOKEN" \
    --out "$out/$name.abrc" --json > "$out/$name.json"
  local status=$?
  set -e
  case "$status" in
    0) echo "$name: pass" ;;
    1) echo "$name: FAIL (see $out/$name.json)" ;;
    *) echo "$name: could not run (exit $status)" ;;
  esac
  return "$status"
}

# Every code once, then a coherent tone for the spectral limits. Each run uploads its session.
status=0
run exhaustive exhaustive || status=$?
if [ "$status" -ne 2 ]; then
  run tone tone:127,16384 || { s=$?; [ "$s" -gt "$status" ] && status=$s; }
fi
exit "$status"
