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
server_pid=""
cleanup() {
  [ -n "$server_pid" ] && kill "$server_pid" 2>/dev/null && wait "$server_pid" 2>/dev/null
  s3_down test
  mail_down test
  pg_down test
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
# a fresh fake S3 for the photo tests and the browser suite's server (exports S3_*)
s3_up test "$TEST_S3_PORT" fresh
# a fresh fake SMTP server with its inbox for the e-mail tests (exports SMTP_*, MAIL_INBOX_URL)
mail_up test "$TEST_SMTP_PORT" "$TEST_MAIL_WEB_PORT" fresh
export NODE_ENV=test LOG_LEVEL="${LOG_LEVEL:-warn}"
tsx_server scripts/db.ts migrate >/dev/null
tsx_server scripts/db.ts seed-if-empty >/dev/null

export TSX_TSCONFIG_PATH=server/tsconfig.json
rm -f tests/artifacts/door-card-ocr.txt
suite "unit (shared computations)" node --import tsx --test --test-reporter=dot $(find tests/unit -name "*.test.ts" | sort)
# the door-card recognition figures per variant (tests/unit/door-card-ocr.test.ts writes them)
if [ -f tests/artifacts/door-card-ocr.txt ]; then sed 's/^/  /' tests/artifacts/door-card-ocr.txt; fi
suite "api (supertest on PostgreSQL)" node --import tsx --test --test-concurrency=1 --test-reporter=spec $(find tests/api -name "*.test.ts" | sort)

ensure_web_build
# the browser suite starts from the demo scenario, untouched by the API suite
tsx_server scripts/db.ts reset >/dev/null
tsx_server scripts/db.ts seed-if-empty >/dev/null
PORT="$E2E_PORT" HOST=127.0.0.1 SIGN_IN_LIMIT=1000 tsx server/index.ts >"$(pg_datadir test)/e2e-server.log" 2>&1 &
server_pid=$!
for _ in $(seq 1 60); do curl -sf "http://127.0.0.1:$E2E_PORT/api/health" >/dev/null && break; sleep 0.5; done
mkdir -p tests/artifacts
suite "browser (Playwright + Chromium)" env E2E_BASE_URL="http://127.0.0.1:$E2E_PORT" playwright test

echo
printf '%s\n' "${summary[@]}"
echo "$(( ${#summary[@]} - failed )) suites passed, $failed failed"
[ "$failed" -eq 0 ]
