#!/usr/bin/env bash
# `npm start`: the demo on this machine, from a fresh clone, in one command.
#   installs what is missing (PostgreSQL 15 via apt-get, npm packages via npm ci), starts the
#   durable dev database (.data/pg, 127.0.0.1:54329, fsync on), migrates, seeds the demo plant
#   once, builds the client, starts the local mailbox (maildev) and the server.
#   Ctrl-C stops the server, the mailbox, then PostgreSQL (if this run started it).
# NODE_ENV defaults to development: the demo accounts share one published password, which a
# production start refuses. Settings: .env (see .env.example).
set -euo pipefail
# shellcheck source=scripts/stack.sh
. "$(dirname "$0")/stack.sh"
new_run_id start
stack_env
export PUBLIC_URL=${PUBLIC_URL:-http://127.0.0.1:$PORT}

stack_prepare "$PORT" "$SMTP_PORT" "$MAILDEV_WEB_PORT"
# the mailbox takes ~2 s to come up: let it do so during the migrations and the seed
start_maildev
stack_migrate_seed

if [ -f index.html ]; then
  # rebuild only when a client source is newer than the last build
  if [ ! -f dist/index.html ] || [ -n "$(find src shared index.html vite.config.ts package-lock.json \
    -newer dist/index.html -print -quit 2>/dev/null)" ]; then
    say 'Building the client (vite build)'
    "$BIN/vite" build --logLevel warn
  fi
else
  say 'No index.html yet: serving the API only.'
fi

say 'Building the server (dist-server/index.js, when a source is newer)'
# serverNodeArgs() of scripts/serverBuild.ts: the bundle with source-mapped stacks and its heap budget
mapfile -t SERVER_ARGS < <(tsnode scripts/serverBuild.ts --print-args)
[ "${#SERVER_ARGS[@]}" -gt 0 ] || { say 'The server bundle could not be built'; exit 1; }
bg 'the server' "$PORT" node "${SERVER_ARGS[@]}"
collect_sign_ins
bg_ready
print_banner "http://127.0.0.1:$PORT"
stack_wait
