# Shared shell helpers for scripts/start.sh and scripts/test.sh. Source it; don't run it.
# shellcheck shell=bash

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
DATA_DIR="${CHROMASLATE_DATA_DIR:-$ROOT/.data}"
mkdir -p "$DATA_DIR"
# The S3 client warns at every start that releases after January 2027 will need Node 22. The lock
# file pins releases that run on this machine's Node 20, so the notice is only noise in our logs.
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED="${AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED:-true}"

say() { printf '\033[1;33m[chromaslate]\033[0m %s\n' "$*" >&2; }
die() { printf '\033[1;31m[chromaslate]\033[0m %s\n' "$*" >&2; exit 1; }

# --- npm packages -------------------------------------------------------------------------------
# `npm ci` when node_modules is absent or was installed from another package-lock.json.
ensure_node_modules() {
	local want have=""
	want="$(sha256sum "$ROOT/package-lock.json" | cut -d' ' -f1)"
	[ -f "$ROOT/node_modules/.chromaslate-lock" ] && have="$(cat "$ROOT/node_modules/.chromaslate-lock")"
	if [ ! -d "$ROOT/node_modules" ] || [ "$want" != "$have" ]; then
		say "Installing npm packages (npm ci) ..."
		(cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error) || die "npm ci failed."
		echo "$want" > "$ROOT/node_modules/.chromaslate-lock"
	fi
}

# --- Debian packages ----------------------------------------------------------------------------
# ensure_debian_packages PACKAGE... : each package is checked by a file it installs.
declare -A DEBIAN_PROBE=(
	[mariadb-server]=/usr/sbin/mariadbd
	[colord-data]=/usr/share/colord/cmf/CIE1931-2deg-XYZ.cmf
	[chromium]=/usr/bin/chromium
)
ensure_debian_packages() {
	local missing=() p
	for p in "$@"; do
		[ -e "${DEBIAN_PROBE[$p]:-/nonexistent}" ] || missing+=("$p")
	done
	[ ${#missing[@]} -eq 0 ] && return 0
	if [ "$(id -u)" -ne 0 ]; then
		die "Missing Debian packages: ${missing[*]}. Install them as root: apt-get update && apt-get install -y ${missing[*]}"
	fi
	say "Installing Debian packages: ${missing[*]} (apt-get) ..."
	DEBIAN_FRONTEND=noninteractive apt-get update -qq >/dev/null || die "apt-get update failed."
	DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "${missing[@]}" >/dev/null || die "apt-get install ${missing[*]} failed."
}

# `vite build` with the adapter's notes about dependencies' own code (circular imports inside
# packages, `this` at a module's top level) left out; everything else, and the exit code, kept.
build_app() {
	npx vite build "$@" 2> >(grep -v -e '^Circular dependency: node_modules/' -e "^node_modules/.*The 'this' keyword is equivalent to 'undefined'" >&2)
}

random_secret() { node -e 'process.stdout.write(require("crypto").randomBytes(Number(process.argv[1])).toString("base64url"))' "${1:-24}"; }

# --- services -----------------------------------------------------------------------------------
# Each local service is a pair of functions, service_NAME_start / service_NAME_stop, in
# scripts/lib/services/NAME.sh. start_services NAME... starts them in order and remembers them so
# stop_services stops them in reverse order (called from the scripts' exit trap).
STARTED_SERVICES=()
for f in "$ROOT"/scripts/lib/services/*.sh; do
	# shellcheck source=/dev/null
	. "$f"
done
start_services() {
	local s
	for s in "$@"; do
		"service_${s}_start" || die "Could not start $s."
		STARTED_SERVICES+=("$s")
	done
}
stop_services() {
	local i
	for ((i = ${#STARTED_SERVICES[@]} - 1; i >= 0; i--)); do
		"service_${STARTED_SERVICES[$i]}_stop" || true
	done
	STARTED_SERVICES=()
}
