#!/usr/bin/env bash
# npm run stop: stop the database clusters and local S3 servers and mail servers that npm start / npm test started.
source "$(dirname "$0")/lib.sh"
s3_down dev
s3_down test
mail_down dev
mail_down test
pg_down dev
pg_down test
