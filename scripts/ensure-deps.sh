# Shared helpers for scripts/start.sh, test.sh, dev.sh and with-dev-env.sh. Source it, don't run it.
# Pure bash on purpose: `npm start` / `npm test` must work before node_modules exists.

ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
PGBIN=/usr/lib/postgresql/15/bin
BIN=$ROOT/node_modules/.bin

# bold/red only on a terminal; plain text in CI logs
if [ -t 2 ]; then C_BOLD=$'\033[1m' C_RED=$'\033[1;31m' C_OFF=$'\033[0m'; else C_BOLD="" C_RED="" C_OFF=""; fi
say() { printf '%s[filmtrail]%s %s\n' "$C_BOLD" "$C_OFF" "$*" >&2; }
die() { printf '%s[filmtrail]%s %s\n' "$C_RED" "$C_OFF" "$*" >&2; exit 1; }

is_root() { [ "$(id -u)" = 0 ]; }

# Installs the given Debian packages in one apt-get run. Root only: we never guess a sudo password.
apt_install() {
  [ $# -eq 0 ] && return 0
  is_root || die "Missing Debian packages: $*. Install them (apt-get install $*) or run as root."
  say "Installing Debian packages with apt-get: $*"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq "$@" >/dev/null
  if [[ " $* " == *" postgresql-15 "* ]]; then
    # Debian's package starts its own cluster on 5432; Filmtrail runs its own clusters instead.
    (pg_ctlcluster 15 main stop 2>/dev/null || true)
  fi
}

# Lists the Debian packages missing for: pg (PostgreSQL 15), browser (chromium), pdf (pdftoppm).
missing_packages() {
  local want
  for want in "$@"; do
    case $want in
      pg) [ -x "$PGBIN/initdb" ] || echo postgresql-15 ;;
      browser) [ -x /usr/bin/chromium ] || echo chromium ;;
      pdf) command -v pdftoppm >/dev/null 2>&1 || echo poppler-utils ;;
    esac
  done
}

ensure_system_packages() {
  local pkgs
  mapfile -t pkgs < <(missing_packages "$@")
  apt_install "${pkgs[@]}"
}

# `npm ci` when node_modules is missing or older than package-lock.json (npm writes
# node_modules/.package-lock.json on every install, so its age tells when the last install was).
ensure_node_modules() {
  local marker=$ROOT/node_modules/.package-lock.json
  if [ ! -f "$marker" ] || [ "$ROOT/package-lock.json" -nt "$marker" ]; then
    say "Installing npm packages (npm ci, about 30 s)"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error)
    touch "$marker"
  fi
}

# The JWT signing secret lives in .data/jwt-secret (git-ignored, mode 600), made on first run.
ensure_jwt_secret() {
  export JWT_SECRET_FILE=${JWT_SECRET_FILE:-$ROOT/.data/jwt-secret}
  if [ -z "${JWT_SECRET:-}" ] && [ ! -s "$JWT_SECRET_FILE" ]; then
    mkdir -p "$(dirname "$JWT_SECRET_FILE")"
    (umask 077 && od -An -tx1 -N32 /dev/urandom | tr -d ' \n' >"$JWT_SECRET_FILE")
    say "Generated a JWT secret in ${JWT_SECRET_FILE#"$ROOT"/}"
  fi
  [ -f "$JWT_SECRET_FILE" ] && chmod 600 "$JWT_SECRET_FILE"
  return 0
}

# Reads a local .env (see .env.example) for start/dev; tests never read it.
load_dotenv() {
  if [ -f "$ROOT/.env" ]; then
    set -a
    # shellcheck disable=SC1091
    . "$ROOT/.env"
    set +a
  fi
}

# Is the cluster in this data folder running? (runs pg_ctl as the postgres user when root)
pg_running() {
  local pgdata=$1
  [ -s "$pgdata/PG_VERSION" ] || return 1
  if is_root; then
    runuser -u postgres -- "$PGBIN/pg_ctl" -D "$pgdata" status >/dev/null 2>&1
  else
    "$PGBIN/pg_ctl" -D "$pgdata" status >/dev/null 2>&1
  fi
}

# Waits until something listens on 127.0.0.1:port (bash's /dev/tcp: no curl needed).
wait_for_port() {
  local port=$1 seconds=${2:-30} pid=${3:-} i
  for ((i = 0; i < seconds * 10; i++)); do
    if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then return 0; fi
    if [ -n "$pid" ] && ! kill -0 "$pid" 2>/dev/null; then return 1; fi
    sleep 0.1
  done
  return 1
}

port_in_use() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

# Every process a run starts inherits FILMTRAIL_RUN_ID, so leftovers (a server a test forgot,
# a browser in its own process group) are found by it, whatever their parent or group.
new_run_id() { export FILMTRAIL_RUN_ID="$1-$$-$RANDOM"; }

marked_pids() {
  local p pid vars
  [ -n "${FILMTRAIL_RUN_ID:-}" ] || return 0
  for p in /proc/[0-9]*; do
    pid=${p#/proc/}
    # this shell and the subshell running this function carry the mark too
    { [ "$pid" = "$$" ] || [ "$pid" = "$BASHPID" ]; } && continue
    # builtins only (no tr/grep children that would carry the mark themselves)
    mapfile -d '' vars 2>/dev/null <"$p/environ" || continue
    if [[ " ${vars[*]} " == *" FILMTRAIL_RUN_ID=$FILMTRAIL_RUN_ID "* ]]; then echo "$pid"; fi
  done
}

# TERM, a grace period, then KILL for whatever still carries this run's mark.
kill_leftovers() {
  local pids i
  mapfile -t pids < <(marked_pids)
  [ ${#pids[@]} -eq 0 ] && return 0
  say "Stopping ${#pids[@]} leftover process(es): ${pids[*]}"
  kill -TERM "${pids[@]}" 2>/dev/null || true
  for ((i = 0; i < 50; i++)); do
    mapfile -t pids < <(marked_pids)
    [ ${#pids[@]} -eq 0 ] && return 0
    sleep 0.1
  done
  kill -KILL "${pids[@]}" 2>/dev/null || true
}

# Stops one background job (its own process group, thanks to `set -m`) and waits for it.
stop_group() {
  local pid=$1 name=$2 i
  [ -n "$pid" ] && kill -0 "$pid" 2>/dev/null || return 0
  say "Stopping $name"
  kill -TERM -- "-$pid" 2>/dev/null || kill -TERM "$pid" 2>/dev/null || true
  for ((i = 0; i < 100; i++)); do
    kill -0 "$pid" 2>/dev/null || break
    sleep 0.1
  done
  kill -KILL -- "-$pid" 2>/dev/null || true
  wait "$pid" 2>/dev/null || true
}

# scripts/db.sh without this run's mark: the clusters are stopped by pg_ctl, never by kill_leftovers.
db() { env -u FILMTRAIL_RUN_ID bash "$ROOT/scripts/db.sh" "$@"; }

# tsx as a Node loader: one process per program (the `tsx` CLI would add a child node process).
tsnode() { node --import tsx "$@"; }
