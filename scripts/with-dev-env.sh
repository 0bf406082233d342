#!/usr/bin/env bash
# Runs one command with the dev settings `npm start` uses (for npm run db:migrate / db:seed):
# .env, the JWT secret file (made if missing) and the dev database URL. The dev database must be
# running (npm run db:start).
set -euo pipefail
# shellcheck source=scripts/ensure-deps.sh
. "$(dirname "$0")/ensure-deps.sh"
cd "$ROOT"
load_dotenv
ensure_jwt_secret
export DATABASE_URL=${DATABASE_URL:-$(db url dev)}
exec "$@"
