#!/usr/bin/env bash
# `npm run dev`: dev database, migrations, demo seed and mailbox as for `npm start`, then the API
# restarting on every server change (tsx watch, :5180) and the Vite dev server with hot reload
# (:5173, proxying /api to the API). Ctrl-C stops all of it.
set -euo pipefail
# shellcheck source=scripts/stack.sh
. "$(dirname "$0")/stack.sh"
new_run_id dev
stack_env
VITE_PORT=5173
# links in e-mails and QR codes point at the page the developer has open
export PUBLIC_URL=${PUBLIC_URL:-http://127.0.0.1:$VITE_PORT}

stack_prepare "$PORT" "$SMTP_PORT" "$MAILDEV_WEB_PORT" "$VITE_PORT"
start_maildev
stack_migrate_seed
bg 'the API (tsx watch)' "$PORT" "$BIN/tsx" watch --clear-screen=false server/index.ts
bg 'the Vite dev server' "$VITE_PORT" "$BIN/vite" --host 127.0.0.1 --port "$VITE_PORT" --strictPort
collect_sign_ins
bg_ready
print_banner "http://127.0.0.1:$VITE_PORT   (API on http://127.0.0.1:$PORT)"
stack_wait
