#!/usr/bin/env bash
# npm start: prerequisites, then the Node orchestrator (scripts/services/run-all.ts)
# that starts PostgreSQL, fake S3, fake SMTP, seeds, builds the client and runs
# the web server. Ctrl-C stops everything it started.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/services/prerequisites.sh

paraxia_ensure_node_modules
paraxia_ensure_postgresql

exec node --import tsx scripts/services/run-all.ts
