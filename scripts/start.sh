#!/usr/bin/env bash
# npm start: set up everything on a fresh Debian machine, then serve API + web on one port.
source "$(dirname "$0")/lib.sh"
ensure_node_modules
ensure_postgres
ensure_perl
pg_up dev "${AMPWRIGHT_PG_PORT:-54329}"
# photos go to object storage: a local fake S3 unless S3_BUCKET names a real one
if [ -z "${S3_BUCKET:-}" ]; then s3_up dev "${AMPWRIGHT_S3_PORT:-54330}"; fi
# e-mail goes to a local inbox (MailDev) unless SMTP_HOST names a real relay
if [ -z "${SMTP_HOST:-}" ]; then
  mail_up dev "${AMPWRIGHT_SMTP_PORT:-54331}" "${AMPWRIGHT_MAIL_WEB_PORT:-54332}"
  log "E-mail inbox (nothing leaves this machine): $MAIL_INBOX_URL/"
fi
# a person reads this terminal: readable log lines (JSON stays the default of a bare production process)
export LOG_FORMAT="${LOG_FORMAT:-pretty}"
log "Running migrations…"
tsx_server scripts/db.ts migrate
tsx_server scripts/db.ts seed-if-empty
ensure_web_build
export NODE_ENV="${NODE_ENV:-production}"
log "Ampwright on http://${HOST:-127.0.0.1}:${PORT:-8080}"
log "Demo sign-ins: admin@, electrician@, inspector@, owner@ampwright.test (password: ampwright-demo)"
exec env TSX_TSCONFIG_PATH=server/tsconfig.json tsx server/index.ts
