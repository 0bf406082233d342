# The local stack shared by scripts/start.sh and scripts/dev.sh: dev database, migrations, demo
# seed, mailbox (maildev), background programs and their ordered shutdown. Source it, don't run it.
# Everything listens on 127.0.0.1 only.
# shellcheck source=scripts/ensure-deps.sh
. "$(dirname "${BASH_SOURCE[0]}")/ensure-deps.sh"
cd "$ROOT"

stack_env() {
  load_dotenv
  export NODE_ENV=${NODE_ENV:-development}
  export HOST=127.0.0.1
  export PORT=${PORT:-5180}
  export SMTP_HOST=127.0.0.1
  export SMTP_PORT=${SMTP_PORT:-2525}
  MAILDEV_WEB_PORT=${MAILDEV_WEB_PORT:-2580}
  export MAILBOX_URL=${MAILBOX_URL:-http://127.0.0.1:$MAILDEV_WEB_PORT}
}

BG_PIDS=()
BG_NAMES=()
PG_STARTED_HERE=0
STOPPING=0

# Programs stop in the reverse order they started (server before mailbox), then PostgreSQL,
# but only if this run started it (a cluster that was already up stays up).
stack_shutdown() {
  local i
  [ "$STOPPING" = 1 ] && return
  STOPPING=1
  trap '' INT TERM HUP
  for ((i = ${#BG_PIDS[@]} - 1; i >= 0; i--)); do stop_group "${BG_PIDS[$i]}" "${BG_NAMES[$i]}"; done
  kill_leftovers
  if [ "$PG_STARTED_HERE" = 1 ]; then db stop dev; fi
  say 'Stopped.'
}

# Installs what is missing, checks the ports are free, starts the dev database.
stack_prepare() {
  local port
  ensure_system_packages pg
  ensure_node_modules
  ensure_jwt_secret
  for port in "$@"; do
    port_in_use "$port" && die "Port $port on 127.0.0.1 is taken (is npm start or npm run dev already running?)"
  done
  trap 'stack_shutdown; exit 0' INT TERM HUP
  trap 'stack_shutdown' EXIT
  pg_running "$ROOT/.data/pg" || PG_STARTED_HERE=1
  db start dev
  export DATABASE_URL=${DATABASE_URL:-$(db url dev)}
}

# Migrations, then the demo seed (idempotent: adds only what is missing).
stack_migrate_seed() {
  tsnode server/cli/migrate.ts
  if [ -f server/cli/seed.ts ]; then
    tsnode server/cli/seed.ts
  else
    say 'No server/cli/seed.ts yet: the database has no demo data.'
  fi
}

# bg NAME PORT CMD...: starts CMD in its own process group (`set -m`: the terminal's Ctrl-C then
# reaches only this script, which keeps the shutdown order). bg_ready waits for every PORT.
BG_PORTS=()
bg() {
  local name=$1 port=$2
  shift 2
  set -m
  "$@" </dev/null &
  BG_PIDS+=("$!")
  set +m
  BG_NAMES+=("$name")
  BG_PORTS+=("$port")
}

bg_ready() {
  local i
  for i in "${!BG_PIDS[@]}"; do
    wait_for_port "${BG_PORTS[$i]}" 60 "${BG_PIDS[$i]}" ||
      die "${BG_NAMES[$i]} did not start (see its output above)"
  done
}

start_maildev() {
  mkdir -p .data/mail
  bg 'the mailbox (maildev)' "$MAILDEV_WEB_PORT" "$BIN/maildev" --smtp "$SMTP_PORT" \
    --web "$MAILDEV_WEB_PORT" --ip 127.0.0.1 --web-ip 127.0.0.1 --mail-directory .data/mail --silent
}

# The seed's own list of demo accounts (scripts/sign-ins.ts); runs while the programs start up.
collect_sign_ins() {
  SIGN_INS=$(tsnode scripts/sign-ins.ts 2>/dev/null | sed 's/^/  /' || true)
  [ -n "$SIGN_INS" ] || SIGN_INS='  Demo sign-ins: see README.md (the seed did not say)'
}

print_banner() {
  cat >&2 <<EOF

  Filmtrail is running (NODE_ENV=$NODE_ENV)
    App       $1
    Mailbox   $MAILBOX_URL   (every e-mail the app sends lands here; nothing leaves the machine)
$SIGN_INS
  Ctrl-C stops everything.

EOF
}

# Runs until Ctrl-C or until any background program ends by itself (then stops the rest).
stack_wait() {
  local status=0
  wait -n "${BG_PIDS[@]}" || status=$?
  [ "$STOPPING" = 1 ] && exit 0
  say "A background program exited (status $status); stopping the rest."
  exit "$status"
}
