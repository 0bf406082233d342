#!/usr/bin/env bash
# npm run bench: installs what the benchmark needs on a fresh machine (PostgreSQL 15 and Chromium
# via apt-get, node modules via npm ci), then runs scripts/bench/index.ts with the given options.
set -euo pipefail
# shellcheck source=scripts/ensure-deps.sh
. "$(dirname "${BASH_SOURCE[0]}")/ensure-deps.sh"
ensure_system_packages pg browser
ensure_node_modules
cd "$ROOT"
exec node --import tsx scripts/bench/index.ts "$@"
