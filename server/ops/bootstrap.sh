#!/usr/bin/env bash
# Entry point of `npm start`, `npm run dev` and `npm test` on a fresh machine: installs the npm
# packages when they are missing or older than the lock file, then hands over to the TypeScript
# orchestrator (which installs and starts PostgreSQL, the mail server and the app).
set -euo pipefail
cd "$(dirname "$0")/../.."
cmd="${1:?usage: bootstrap.sh start|dev|test}"
shift || true

if [ ! -x node_modules/.bin/tsx ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "Installing npm packages (npm ci)…"
  npm ci --no-audit --no-fund
fi
# node with the tsx loader (not the tsx wrapper process), so SIGTERM and SIGINT reach our own handlers.
exec node --import tsx "server/ops/${cmd}.ts" "$@"
