#!/usr/bin/env bash
# npm run stop: stop the database clusters that npm start / npm test started.
source "$(dirname "$0")/lib.sh"
pg_down dev
pg_down test
