#!/usr/bin/env bash
# `npm run bench`: the speed figures. Starts a private MariaDB (port 3309, .data/bench-mariadb, a
# fresh database) for the benchmarks that store, runs scripts/bench.ts with the arguments given
# (`-- --json` for one JSON object on stdout, `-- colour` to run only matching modules), stops it.
set -euo pipefail
. "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"
cd "$ROOT"
ensure_debian_packages mariadb-server colord-data
ensure_node_modules
npx svelte-kit sync >/dev/null
export MARIADB_DIR="$DATA_DIR/bench-mariadb" DB_PORT="${BENCH_DB_PORT:-3309}" DB_NAME=chromaslate_bench DB_FRESH=1
trap stop_services EXIT
start_services mariadb
node --import tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:latest >/dev/null
node --import tsx scripts/bench.ts "$@"
