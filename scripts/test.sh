#!/usr/bin/env bash
# `npm test`: install what is missing, start a private MariaDB (port 3308, its own data folder, a
# fresh database) and mail catcher, then run the type check, unit and component tests, integration
# tests against MariaDB, and browser tests in Debian's Chromium. Prints `N passed, N failed` last.
#
# While working on one part: `npm test -- integration e2e` runs only those suites (check, unit,
# integration, e2e), TEST_FILES="tests/integration/auth" narrows Vitest to matching files and
# E2E_FILES="tests/e2e/bench.test.ts" narrows Playwright.
set -uo pipefail
. "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"
cd "$ROOT"
SUITES=("$@")
[ ${#SUITES[@]} -eq 0 ] && SUITES=(check unit integration e2e)
want() { local s; for s in "${SUITES[@]}"; do [ "$s" = "$1" ] && return 0; done; return 1; }

ensure_debian_packages mariadb-server colord-data chromium
ensure_node_modules
npx svelte-kit sync >/dev/null

export CHROMASLATE_TEST=1 NODE_ENV=test
export MARIADB_DIR="$DATA_DIR/test-mariadb" DB_PORT="${TEST_DB_PORT:-3308}" DB_NAME=chromaslate_test DB_FRESH=1
export MAIL_PORT="${TEST_MAIL_PORT:-2526}" MAIL_DIR="$DATA_DIR/test-mail"
export S3_PORT="${TEST_S3_PORT:-4569}" S3_DIR="$DATA_DIR/test-s3"
export AUTH_SECRET="test-secret-not-for-production-$(random_secret 12)"
export TEST_APP_PORT="${TEST_APP_PORT:-3100}"
export ORIGIN="http://127.0.0.1:$TEST_APP_PORT" AUTH_URL="http://127.0.0.1:$TEST_APP_PORT" AUTH_TRUST_HOST=true
rm -rf "$MAIL_DIR" "$S3_DIR"
trap stop_services EXIT
start_services mariadb mail s3

RESULTS="$DATA_DIR/test-results"
rm -rf "$RESULTS"; mkdir -p "$RESULTS"
export TEST_RESULTS_DIR="$RESULTS"

step() { printf '\n\033[1;36m== %s ==\033[0m\n' "$*"; }

EXPECTED=()
# shellcheck disable=SC2086
if want check; then
	step "Type check (svelte-check)"
	EXPECTED+=(check.json)
	if npx svelte-kit sync && npx svelte-check --tsconfig ./tsconfig.json --fail-on-warnings; then
		echo '{"suite":"svelte-check","passed":1,"failed":0}' > "$RESULTS/check.json"
	else
		echo '{"suite":"svelte-check","passed":0,"failed":1}' > "$RESULTS/check.json"
	fi
fi

if want unit; then
	step "Unit and component tests (Vitest)"
	EXPECTED+=(vitest-unit.json)
	npx vitest run --project unit --project component --reporter=default --reporter=json \
		--outputFile.json="$RESULTS/vitest-unit.json" ${TEST_FILES:-}
fi

if want integration || want e2e; then
	node --import tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:latest >/dev/null \
		|| echo '{"suite":"migrate","passed":0,"failed":1}' > "$RESULTS/migrate.json"
fi

if want integration; then
	step "Integration tests against MariaDB (Vitest)"
	EXPECTED+=(vitest-integration.json)
	# Knex imports the .ts migrations with Node's own loader, so the test workers need tsx.
	NODE_OPTIONS="--import tsx" npx vitest run --project integration --reporter=default --reporter=json \
		--outputFile.json="$RESULTS/vitest-integration.json" ${TEST_FILES:-}
fi

if want e2e; then
	step "Browser tests (Playwright on /usr/bin/chromium)"
	EXPECTED+=(playwright.json)
	if build_app --logLevel warn; then
		# The browser tests start from the demo as `npm start` seeds it, not from whatever the
		# integration tests left (shared library uploads, extra projects): empty the database first.
		if want integration; then
			knex_cli() { node --import tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts "$@" >/dev/null; }
			knex_cli migrate:rollback --all && knex_cli migrate:latest \
				|| echo '{"suite":"migrate","passed":0,"failed":1}' > "$RESULTS/migrate.json"
		fi
		if [ -f scripts/seed.ts ]; then
			node --import tsx scripts/seed.ts >/dev/null || echo '{"suite":"seed","passed":0,"failed":1}' > "$RESULTS/seed.json"
		fi
		PLAYWRIGHT_JSON_OUTPUT_NAME="$RESULTS/playwright.json" npx playwright test --reporter=list,json ${E2E_FILES:-}
	else
		echo '{"suite":"vite build","passed":0,"failed":1}' > "$RESULTS/build.json"
	fi
fi

# Stop the services first, so the count is the very last line printed.
stop_services
trap - EXIT
node scripts/lib/count-results.mjs "$RESULTS" "${EXPECTED[@]}"
