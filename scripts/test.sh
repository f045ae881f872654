#!/usr/bin/env bash
# npm test [-- vitest arguments]: prerequisites, then scripts/services/run-tests.ts,
# which runs vitest against throw-away services and removes them afterwards.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/services/prerequisites.sh

paraxia_ensure_node_modules
paraxia_ensure_postgresql
paraxia_ensure_test_tools

exec node --import tsx scripts/services/run-tests.ts "$@"
