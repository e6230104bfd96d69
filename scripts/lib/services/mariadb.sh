# A private MariaDB on 127.0.0.1. Settings (exported for the app and the tests):
#   MARIADB_DIR   data folder (default $DATA_DIR/mariadb)
#   DB_PORT       TCP port on 127.0.0.1 (default 3307)
#   DB_NAME       database (default chromaslate); DB_USER app user (default chromaslate)
#   DB_FRESH=1    drop and recreate the database (the tests use this)
# The app user's password is generated once and kept in $MARIADB_DIR/app-password (never committed).
# shellcheck shell=bash

mariadb_cli() { mariadb --defaults-file="$MARIADB_DIR/my.cnf" -uroot "$@"; }

service_mariadb_start() {
	MARIADB_DIR="${MARIADB_DIR:-$DATA_DIR/mariadb}"
	export DB_HOST=127.0.0.1 DB_PORT="${DB_PORT:-3307}" DB_NAME="${DB_NAME:-chromaslate}" DB_USER="${DB_USER:-chromaslate}"
	mkdir -p "$MARIADB_DIR/data" "$MARIADB_DIR/tmp"
	local sock="$MARIADB_DIR/mariadb.sock"
	# Unix socket paths over ~107 bytes are refused; fall back to a short path.
	if [ ${#sock} -gt 100 ]; then sock="/tmp/chromaslate-$(echo "$MARIADB_DIR" | sha1sum | cut -c1-10).sock"; fi
	local user_line=""
	[ "$(id -u)" -eq 0 ] && user_line="user=root"
	cat > "$MARIADB_DIR/my.cnf" <<CNF
[mariadbd]
datadir=$MARIADB_DIR/data
tmpdir=$MARIADB_DIR/tmp
socket=$sock
pid-file=$MARIADB_DIR/mariadb.pid
log-error=$MARIADB_DIR/error.log
port=$DB_PORT
bind-address=127.0.0.1
skip-name-resolve
$user_line
character-set-server=utf8mb4
collation-server=utf8mb4_unicode_ci
default-storage-engine=InnoDB
innodb_buffer_pool_size=128M
innodb_log_file_size=48M
max_allowed_packet=64M
performance_schema=OFF
[client]
socket=$sock
port=$DB_PORT
CNF
	if [ ! -d "$MARIADB_DIR/data/mysql" ]; then
		say "Initialising MariaDB data folder $MARIADB_DIR ..."
		mariadb-install-db --defaults-file="$MARIADB_DIR/my.cnf" --user="$(id -un)" \
			--auth-root-authentication-method=socket --skip-test-db >"$MARIADB_DIR/install.log" 2>&1 \
			|| { cat "$MARIADB_DIR/install.log" >&2; return 1; }
	fi
	if mariadb-admin --defaults-file="$MARIADB_DIR/my.cnf" ping >/dev/null 2>&1; then
		say "MariaDB already running on 127.0.0.1:$DB_PORT (reusing it)."
		MARIADB_OURS=0
	else
		# A crash can leave a stale socket, lock and pid file behind.
		rm -f "$sock" "$sock.lock" "$MARIADB_DIR/mariadb.pid"
		/usr/sbin/mariadbd --defaults-file="$MARIADB_DIR/my.cnf" >/dev/null 2>&1 &
		MARIADB_PID=$!
		MARIADB_OURS=1
		local i
		for i in $(seq 1 120); do
			mariadb-admin --defaults-file="$MARIADB_DIR/my.cnf" ping >/dev/null 2>&1 && break
			kill -0 "$MARIADB_PID" 2>/dev/null || { tail -20 "$MARIADB_DIR/error.log" >&2; return 1; }
			sleep 0.25
		done
		mariadb-admin --defaults-file="$MARIADB_DIR/my.cnf" ping >/dev/null 2>&1 || { tail -20 "$MARIADB_DIR/error.log" >&2; return 1; }
		say "MariaDB up on 127.0.0.1:$DB_PORT (data in $MARIADB_DIR)."
	fi
	[ -f "$MARIADB_DIR/app-password" ] || { random_secret 24 > "$MARIADB_DIR/app-password"; chmod 600 "$MARIADB_DIR/app-password"; }
	DB_PASSWORD="$(cat "$MARIADB_DIR/app-password")"
	export DB_PASSWORD
	local drop=""
	[ "${DB_FRESH:-0}" = 1 ] && drop="DROP DATABASE IF EXISTS \`$DB_NAME\`;"
	mariadb_cli <<SQL || return 1
$drop
CREATE DATABASE IF NOT EXISTS \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
CREATE USER IF NOT EXISTS '$DB_USER'@'localhost' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'localhost' IDENTIFIED BY '$DB_PASSWORD';
GRANT ALL PRIVILEGES ON \`$DB_NAME\`.* TO '$DB_USER'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`$DB_NAME\`.* TO '$DB_USER'@'localhost';
FLUSH PRIVILEGES;
SQL
}

service_mariadb_stop() {
	[ "${MARIADB_OURS:-0}" = 1 ] || return 0
	say "Stopping MariaDB ..."
	mariadb-admin --defaults-file="$MARIADB_DIR/my.cnf" -uroot shutdown >/dev/null 2>&1 || kill "$MARIADB_PID" 2>/dev/null
	wait "$MARIADB_PID" 2>/dev/null || true
	MARIADB_OURS=0
}
