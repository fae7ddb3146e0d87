#!/usr/bin/env bash
# Every test of Edgefield: type checks, unit/integration/reference tests (vitest),
# a production build, the end-to-end tests (Playwright in Debian's Chromium) and the
# kill-and-restart durability test against the same build.
# Usage: npm test          (after npm ci; the README's test command is `npm ci && npm test`)
set -euo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1 PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1

if [ ! -d node_modules ]; then npm ci; fi

# Playwright drives Debian's Chromium, never a downloaded browser.
if [ ! -x /usr/bin/chromium ]; then
  echo "test.sh: installing Debian's chromium for the end-to-end tests" >&2
  SUDO=""; [ "$(id -u)" -eq 0 ] || SUDO="sudo"
  $SUDO apt-get update -qq && $SUDO env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
fi

echo "== type check"
npm run --silent typecheck

echo "== vitest (unit, reference, integration)"
npx vitest run

echo "== production build for the end-to-end tests"
export NEXT_DIST_DIR="${NEXT_DIST_DIR:-.next-e2e}"
npx next build > /tmp/edgefield-e2e-build.log 2>&1 || { tail -n 60 /tmp/edgefield-e2e-build.log; exit 1; }

echo "== no secrets or server-only code in the client bundles"
npx tsx scripts/check-client-bundle.ts "$NEXT_DIST_DIR"

echo "== end-to-end (Playwright, Chromium)"
npx playwright test

echo "== durability: SIGKILL in the middle of writes, 20 rounds; clean SIGTERM shutdown (production build)"
npx vitest run -c vitest.durability.config.mts
