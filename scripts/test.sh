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
cleanup() {
  [ -n "$server_pid" ] && kill "$server_pid" 2>/dev/null && wait "$server_pid" 2>/dev/null
  if [ -n "$api_pid" ]; then pkill -P "$api_pid" 2>/dev/null; kill "$api_pid" 2>/dev/null; fi
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
suite() { # suite NAME COMMAND...: run one suite, remember how it went
  local name="$1"; shift
  log "Suite: $name"
  if "$@"; then summary+=("passed  $name"); else summary+=("FAILED  $name"); failed=$((failed + 1)); fi
}

# the two projects at once: two cores, and neither waits for the other
suite "type check (client and server)" bash -c 'tsc --noEmit -p . & client=$!; tsc --noEmit -p server; server=$?; wait "$client" && [ "$server" -eq 0 ]'
suite "lint (eslint)" eslint .

pg_up test "$TEST_PG_PORT" fresh
# a fresh fake S3 for the browser suite's server (exports S3_*)
s3_up test "$TEST_S3_PORT" fresh
# a fresh fake SMTP server with its inbox (exports SMTP_*, MAIL_INBOX_URL)
mail_up test "$TEST_SMTP_PORT" "$TEST_MAIL_WEB_PORT" fresh
export NODE_ENV=test LOG_LEVEL="${LOG_LEVEL:-warn}"
tsx_server scripts/db.ts migrate >/dev/null
tsx_server scripts/db.ts seed-if-empty >/dev/null
export TSX_TSCONFIG_PATH=server/tsconfig.json

# The API suite runs beside the unit and browser suites, on a cluster, fake S3 and inbox of its own
# (its restart test stops its cluster; its e-mail tests read its inbox): the browser suite mostly
# waits on the page, so the two cores have room. Its output is printed when the browser suite ends.
api_suite() {
  pg_up test-api "$API_PG_PORT" fresh
  s3_up test-api "$API_S3_PORT" fresh
  mail_up test-api "$API_SMTP_PORT" "$API_MAIL_WEB_PORT" fresh
  tsx_server scripts/db.ts migrate >/dev/null
  tsx_server scripts/db.ts seed-if-empty >/dev/null
  node --import tsx --test --test-concurrency=1 --test-reporter=spec $(find tests/api -name "*.test.ts" | sort)
}
api_log="$(pg_datadir test)/api-suite.log"
log "Suite: api (supertest on PostgreSQL), beside the others; output below when they end"
( api_suite ) >"$api_log" 2>&1 &
api_pid=$!

rm -f tests/artifacts/door-card-ocr.txt
suite "unit (shared computations)" node --import tsx --test --test-reporter=dot $(find tests/unit -name "*.test.ts" | sort)
# the door-card recognition figures per variant (tests/unit/door-card-ocr.test.ts writes them)
if [ -f tests/artifacts/door-card-ocr.txt ]; then sed 's/^/  /' tests/artifacts/door-card-ocr.txt; fi

ensure_web_build
PORT="$E2E_PORT" HOST=127.0.0.1 SIGN_IN_LIMIT=1000 tsx server/index.ts >"$(pg_datadir test)/e2e-server.log" 2>&1 &
server_pid=$!
for _ in $(seq 1 60); do curl -sf "http://127.0.0.1:$E2E_PORT/api/health" >/dev/null && break; sleep 0.5; done
mkdir -p tests/artifacts
suite "browser (Playwright + Chromium)" env E2E_BASE_URL="http://127.0.0.1:$E2E_PORT" playwright test

log "Suite: api (supertest on PostgreSQL), its output"
api_status=0
wait "$api_pid" || api_status=$?
api_pid=""
cat "$api_log"
if [ "$api_status" -eq 0 ]; then summary+=("passed  api (supertest on PostgreSQL)"); else summary+=("FAILED  api (supertest on PostgreSQL)"); failed=$((failed + 1)); fi

echo
printf '%s\n' "${summary[@]}"
echo "$(( ${#summary[@]} - failed )) suites passed, $failed failed"
[ "$failed" -eq 0 ]
