#!/usr/bin/env bash
# `npm test` (and .ci/run): every check, from a fresh clone, in one command.
#   installs what is missing (PostgreSQL 15, Chromium, poppler-utils via apt-get; npm ci),
#   starts a throwaway PostgreSQL (.data/pg-test, 127.0.0.1:54339, fsync off, wiped each run),
#   then: lint, type-check, client build, vitest (unit, client, api, e2e). Every step runs even
#   after a failure, so one run shows everything; the exit status is non-zero if any failed.
# Options: --quick   skip lint, the client build and the browser (e2e) tests
#          anything else is passed to vitest, e.g. `npm test -- tests/unit`
# Nothing stays running afterwards: the cluster is stopped and leftovers are killed on exit.
set -euo pipefail
# shellcheck source=scripts/ensure-deps.sh
. "$(dirname "$0")/ensure-deps.sh"
cd "$ROOT"
new_run_id test

QUICK=0
VITEST_ARGS=()
for arg in "$@"; do
  case $arg in
    --quick) QUICK=1 ;;
    *) VITEST_ARGS+=("$arg") ;;
  esac
done

started=$SECONDS
if [ "$QUICK" = 1 ]; then ensure_system_packages pg pdf; else ensure_system_packages pg browser pdf; fi
ensure_node_modules

export TEST_PGPORT=${TEST_PGPORT:-54339}
export TEST_ADMIN_DATABASE_URL=postgres://postgres@127.0.0.1:$TEST_PGPORT/postgres
# Tests set their own configuration: nothing from a developer's shell may leak in (the server's
# variables, as in server/config/env.ts and .env.example).
unset NODE_ENV HOST PORT DATABASE_URL DB_POOL_MAX JWT_SECRET JWT_SECRET_FILE JWT_TTL_SECONDS \
  SMTP_HOST SMTP_PORT MAIL_FROM MAILBOX_URL PUBLIC_URL UPLOAD_MAX_BYTES LOG_LEVEL CLIENT_DIST \
  OUTBOX_POLL_MS LOGIN_RATE_LIMIT HEAP_MB

cleanup() {
  local rc=$?
  trap - EXIT INT TERM HUP
  kill_leftovers
  db stop test 2>/dev/null || true
  exit "$rc"
}
trap cleanup EXIT
trap 'exit 130' INT HUP
trap 'exit 143' TERM

db start test

NAMES=()
RESULTS=()
TIMES=()
step() {
  local name=$1 t0=$SECONDS rc=0
  shift
  printf '\n%s== %s ==%s  %s\n' "$C_BOLD" "$name" "$C_OFF" "$*" >&2
  "$@" || rc=$?
  NAMES+=("$name")
  TIMES+=("$((SECONDS - t0))s")
  if [ "$rc" = 0 ]; then RESULTS+=(ok); else RESULTS+=("FAILED (exit $rc)"); fi
  # a step that left something behind must not disturb the next one
  kill_leftovers
}

[ "$QUICK" = 1 ] ||
  step 'lint' "$BIN/eslint" . --cache --cache-strategy content --cache-location node_modules/.cache/eslint/
step 'type-check' "$BIN/vue-tsc" --noEmit -p tsconfig.json
# the browser tests serve dist/
[ "$QUICK" = 1 ] || step 'client build' "$BIN/vite" build --logLevel warn
if [ "$QUICK" = 1 ]; then
  step 'tests' "$BIN/vitest" run --project unit --project client --project api "${VITEST_ARGS[@]}"
else
  step 'tests' "$BIN/vitest" run "${VITEST_ARGS[@]}"
fi

failed=0
printf '\n%s== summary ==%s\n' "$C_BOLD" "$C_OFF" >&2
for i in "${!NAMES[@]}"; do
  printf '  %-13s %-18s %s\n' "${NAMES[$i]}" "${RESULTS[$i]}" "${TIMES[$i]}" >&2
  [ "${RESULTS[$i]}" = ok ] || failed=1
done
printf '  %-13s %-18s %s\n' 'total' "$([ $failed = 0 ] && echo 'all passed' || echo 'FAILED')" \
  "$((SECONDS - started))s" >&2
exit "$failed"
