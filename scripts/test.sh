#!/usr/bin/env bash
# npm test: the same set-up as npm start on a throwaway cluster, then every suite.
# Exits non-zero when any suite fails; ends with one summary line per suite.
source "$(dirname "$0")/lib.sh"
ensure_node_modules
ensure_postgres
ensure_perl
ensure_chromium
ensure_pdf_tools
ensure_nginx

TEST_PG_PORT="${AMPWRIGHT_TEST_PG_PORT:-54339}"
TEST_S3_PORT="${AMPWRIGHT_TEST_S3_PORT:-54340}"
TEST_SMTP_PORT="${AMPWRIGHT_TEST_SMTP_PORT:-54341}"
TEST_MAIL_WEB_PORT="${AMPWRIGHT_TEST_MAIL_WEB_PORT:-54342}"
E2E_PORT="${AMPWRIGHT_E2E_PORT:-8090}"
API_PG_PORT="${AMPWRIGHT_TEST_API_PG_PORT:-54343}"
API_S3_PORT="${AMPWRIGHT_TEST_API_S3_PORT:-54344}"
API_SMTP_PORT="${AMPWRIGHT_TEST_API_SMTP_PORT:-54345}"
API_MAIL_WEB_PORT="${AMPWRIGHT_TEST_API_MAIL_WEB_PORT:-54346}"
server_pid=""
api_pid=""
checks_pid=""
cleanup() {
  [ -n "$server_pid" ] && kill "$server_pid" 2>/dev/null && wait "$server_pid" 2>/dev/null
  for pid in "$api_pid" "$checks_pid"; do
    if [ -n "$pid" ]; then pkill -P "$pid" 2>/dev/null; kill "$pid" 2>/dev/null; fi
  done
  s3_down test
  mail_down test
  pg_down test
  s3_down test-api
  mail_down test-api
  pg_down test-api
}
trap cleanup EXIT

declare -a summary=()
failed=0
# record NAME STATUS: one summary line per suite, in the order they are reported
record() {
  if [ "$2" -eq 0 ]; then summary+=("passed  $1"); else summary+=("FAILED  $1"); failed=$((failed + 1)); fi
}

pg_up test "$TEST_PG_PORT" fresh
# a fresh fake S3 for the browser suite's server (exports S3_*)
s3_up test "$TEST_S3_PORT" fresh
# a fresh fake SMTP server with its inbox (exports SMTP_*, MAIL_INBOX_URL)
mail_up test "$TEST_SMTP_PORT" "$TEST_MAIL_WEB_PORT" fresh
export NODE_ENV=test LOG_LEVEL="${LOG_LEVEL:-warn}"
tsx_server scripts/db.ts migrate >/dev/null
tsx_server scripts/db.ts seed-if-empty >/dev/null
export TSX_TSCONFIG_PATH=server/tsconfig.json
logs="$(pg_datadir test)"

# The browser suite is most of the time, and mostly waits on the page; everything else runs beside
# it so the two cores stay busy: type check, lint and unit one after another, and the API suite on
# a cluster, fake S3 and inbox of its own (its restart test stops its own cluster, its e-mail tests
# read its own inbox). Their output is printed when the browser suite ends.
checks() {
  local status=0
  # the two projects at once: two cores, and neither waits for the other
  bash -c 'tsc --noEmit -p . & client=$!; tsc --noEmit -p server; server=$?; wait "$client" && [ "$server" -eq 0 ]' || status=$?
  echo "type check (client and server)|$status" >>"$logs/checks.status"
  status=0; eslint . || status=$?
  echo "lint (eslint)|$status" >>"$logs/checks.status"
  rm -f tests/artifacts/door-card-ocr.txt
  status=0; node --import tsx --test --test-reporter=dot $(find tests/unit -name "*.test.ts" | sort) || status=$?
  echo "unit (shared computations)|$status" >>"$logs/checks.status"
  # the door-card recognition figures per variant (tests/unit/door-card-ocr.test.ts writes them)
  if [ -f tests/artifacts/door-card-ocr.txt ]; then sed 's/^/  /' tests/artifacts/door-card-ocr.txt; fi
}
api_suite() {
  pg_up test-api "$API_PG_PORT" fresh
  s3_up test-api "$API_S3_PORT" fresh
  mail_up test-api "$API_SMTP_PORT" "$API_MAIL_WEB_PORT" fresh
  tsx_server scripts/db.ts migrate >/dev/null
  tsx_server scripts/db.ts seed-if-empty >/dev/null
  node --import tsx --test --test-concurrency=1 --test-reporter=spec $(find tests/api -name "*.test.ts" | sort)
}
rm -f "$logs/checks.status"
log "The API suite, and the type check, lint and unit, run beside the browser suite; their output follows it"
# the browser suite is the longest path: what runs beside it yields the CPU to it (nice), and fills
# the time the browser suite spends waiting on pages
( renice -n 10 -p "$BASHPID" >/dev/null; api_suite ) >"$logs/api-suite.log" 2>&1 &
api_pid=$!
# the web build before the checks start, so that it cannot write .expo/types under the type check
# (in a warm clone it is only a hash check)
ensure_web_build
( renice -n 10 -p "$BASHPID" >/dev/null; checks ) >"$logs/checks.log" 2>&1 &
checks_pid=$!

PORT="$E2E_PORT" HOST=127.0.0.1 SIGN_IN_LIMIT=1000 tsx server/index.ts >"$logs/e2e-server.log" 2>&1 &
server_pid=$!
for _ in $(seq 1 60); do curl -sf "http://127.0.0.1:$E2E_PORT/api/health" >/dev/null && break; sleep 0.5; done
mkdir -p tests/artifacts
log "Suite: browser (Playwright + Chromium)"
browser_status=0
env E2E_BASE_URL="http://127.0.0.1:$E2E_PORT" playwright test || browser_status=$?

log "Suites beside it: type check, lint, unit"
wait "$checks_pid" || true
checks_pid=""
cat "$logs/checks.log"
for name in "type check (client and server)" "lint (eslint)" "unit (shared computations)"; do
  status="$(grep -F "$name|" "$logs/checks.status" 2>/dev/null | tail -1 | cut -d'|' -f2)"
  record "$name" "${status:-1}"
done
record "browser (Playwright + Chromium)" "$browser_status"
log "Suite beside it: api (supertest on PostgreSQL)"
api_status=0
wait "$api_pid" || api_status=$?
api_pid=""
cat "$logs/api-suite.log"
record "api (supertest on PostgreSQL)" "$api_status"

echo
printf '%s\n' "${summary[@]}"
echo "$(( ${#summary[@]} - failed )) suites passed, $failed failed"
[ "$failed" -eq 0 ]
