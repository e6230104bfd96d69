# The local S3 stand-in (scripts/s3-standin.ts). Settings: S3_PORT (default 4568), S3_DIR (default
# $DATA_DIR/s3), S3_BUCKET (chromaslate). The app reaches it through S3_ENDPOINT and S3_* credentials.
# shellcheck shell=bash

service_s3_start() {
	export S3_PORT="${S3_PORT:-4568}" S3_DIR="${S3_DIR:-$DATA_DIR/s3}" S3_BUCKET="${S3_BUCKET:-chromaslate}"
	export S3_ENDPOINT="http://127.0.0.1:$S3_PORT" S3_REGION=us-east-1 S3_ACCESS_KEY_ID=S3RVER S3_SECRET_ACCESS_KEY=S3RVER S3_FORCE_PATH_STYLE=true
	mkdir -p "$S3_DIR"
	(cd "$ROOT" && exec node --import tsx scripts/s3-standin.ts) >"$DATA_DIR/s3-standin.log" 2>&1 &
	S3_PID=$!
	local i
	for i in $(seq 1 80); do
		grep -q listening "$DATA_DIR/s3-standin.log" 2>/dev/null && { say "S3 stand-in on 127.0.0.1:$S3_PORT (bucket $S3_BUCKET, data in $S3_DIR)."; return 0; }
		kill -0 "$S3_PID" 2>/dev/null || break
		sleep 0.25
	done
	cat "$DATA_DIR/s3-standin.log" >&2
	return 1
}

service_s3_stop() {
	[ -n "${S3_PID:-}" ] || return 0
	kill "$S3_PID" 2>/dev/null
	wait "$S3_PID" 2>/dev/null || true
	S3_PID=""
}
