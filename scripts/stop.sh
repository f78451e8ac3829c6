#!/usr/bin/env bash
# npm run stop: stop the database clusters and local S3 servers and mail servers that npm start / npm test started.
source "$(dirname "$0")/lib.sh"
for name in dev test test-api; do
  s3_down "$name"
  mail_down "$name"
  pg_down "$name"
done
