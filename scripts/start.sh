#!/usr/bin/env bash
# `npm start`: install what is missing, start the local services (MariaDB, mail catcher), migrate,
# seed the demo, build and serve Chromaslate. Ctrl-C stops the app and shuts the services down.
set -euo pipefail
. "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"
cd "$ROOT"

ensure_debian_packages mariadb-server colord-data
ensure_node_modules
# Generates .svelte-kit/tsconfig.json, whose $lib path lets tsx run the seed and server scripts.
npx svelte-kit sync >/dev/null

APP_PID=""
cleanup() {
	trap - EXIT INT TERM
	if [ -n "$APP_PID" ] && kill -0 "$APP_PID" 2>/dev/null; then
		say "Stopping the app ..."
		kill -TERM "$APP_PID" 2>/dev/null || true
		wait "$APP_PID" 2>/dev/null || true
	fi
	stop_services
	say "Stopped."
}
trap cleanup EXIT
trap 'exit 130' INT TERM

start_services mariadb mail s3

[ -f "$DATA_DIR/auth-secret" ] || { random_secret 32 > "$DATA_DIR/auth-secret"; chmod 600 "$DATA_DIR/auth-secret"; }
export AUTH_SECRET="${AUTH_SECRET:-$(cat "$DATA_DIR/auth-secret")}"
export HOST="${HOST:-127.0.0.1}" PORT="${PORT:-3000}"
# Uploads of up to 20 MB (adapter-node refuses bodies over 512 kB by default).
export BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-25M}"
export ORIGIN="${ORIGIN:-http://$HOST:$PORT}" AUTH_URL="${AUTH_URL:-http://$HOST:$PORT}" AUTH_TRUST_HOST=true

say "Migrating the database ..."
node --import tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:latest >/dev/null
node --import tsx scripts/recompute.ts
if [ -f scripts/seed.ts ]; then
	say "Seeding the demo (invented data) ..."
	node --import tsx scripts/seed.ts > "$DATA_DIR/demo-sign-ins.txt"
fi

if [ ! -f build/handler.js ] || [ -n "$(find src static svelte.config.js vite.config.ts tailwind.config.ts package-lock.json -newer build/handler.js -print -quit 2>/dev/null)" ]; then
	say "Building the app ..."
	build_app --logLevel error >/dev/null
fi

node --env-file-if-exists=.env build &
APP_PID=$!
for _ in $(seq 1 120); do
	node -e 'fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))' "http://$HOST:$PORT/api/health" && break
	kill -0 "$APP_PID" 2>/dev/null || die "The app exited during start-up."
	sleep 0.25
done

echo
say "Chromaslate is running at $ORIGIN"
[ -s "$DATA_DIR/demo-sign-ins.txt" ] && cat "$DATA_DIR/demo-sign-ins.txt"
say "Captured mail: $MAIL_DIR. Press Ctrl-C to stop."
wait "$APP_PID"
