# The local mail catcher (scripts/mail-catcher.ts). Settings: MAIL_PORT (default 2525), MAIL_DIR
# (default $DATA_DIR/mail). The app sends to it through SMTP_HOST/SMTP_PORT.
# shellcheck shell=bash

service_mail_start() {
	export MAIL_PORT="${MAIL_PORT:-2525}" MAIL_DIR="${MAIL_DIR:-$DATA_DIR/mail}"
	export SMTP_HOST=127.0.0.1 SMTP_PORT="$MAIL_PORT" SMTP_SECURE=false
	mkdir -p "$MAIL_DIR"
	(cd "$ROOT" && exec node --import tsx scripts/mail-catcher.ts) >"$DATA_DIR/mail-catcher.log" 2>&1 &
	MAIL_PID=$!
	local i
	for i in $(seq 1 80); do
		(exec 3<>"/dev/tcp/127.0.0.1/$MAIL_PORT") 2>/dev/null && { say "Mail catcher on 127.0.0.1:$MAIL_PORT (messages in $MAIL_DIR)."; return 0; }
		kill -0 "$MAIL_PID" 2>/dev/null || break
		sleep 0.25
	done
	cat "$DATA_DIR/mail-catcher.log" >&2
	return 1
}

service_mail_stop() {
	[ -n "${MAIL_PID:-}" ] || return 0
	kill "$MAIL_PID" 2>/dev/null
	wait "$MAIL_PID" 2>/dev/null || true
	MAIL_PID=""
}
