#!/usr/bin/env bash
# The data-layer tests on a PostgreSQL server (the DATABASE_URL variant of Edgefield).
# Installs Debian's postgresql when missing (root: apt-get), starts a throwaway cluster in a
# temporary folder on a free loopback port, applies the migrations through `npm run
# db:migrate`, runs the data-layer, route-role, auth, backup and atomic-write tests with DATABASE_URL (each
# suite gets a fresh database on that server; the backup test restores a backup of the embedded
# database into it, and `npm run restore` loads one made by `npm run backup`), then stops the
# cluster and removes the folder.
# Usage: npm run test:pg
set -euo pipefail
cd "$(dirname "$0")/.."

SUDO=""; [ "$(id -u)" -eq 0 ] || SUDO="sudo"
find_pgbin() { ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1; }
PGBIN="$(find_pgbin)"
if [ -z "$PGBIN" ] || [ ! -x "$PGBIN/initdb" ]; then
  echo "test-pg: installing Debian's postgresql" >&2
  $SUDO apt-get update -qq
  $SUDO env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql >/dev/null
  PGBIN="$(find_pgbin)"
fi
[ -x "$PGBIN/initdb" ] || { echo "test-pg: no PostgreSQL server binaries found" >&2; exit 1; }

TMP="$(mktemp -d /tmp/edgefield-pg.XXXXXX)"
PORT="$(node -e 'const s=require("net").createServer();s.listen(0,"127.0.0.1",()=>{console.log(s.address().port);s.close()})')"
AS=()
if [ "$(id -u)" -eq 0 ]; then
  # initdb refuses to run as root: the cluster belongs to the postgres user.
  chown postgres "$TMP"
  AS=(runuser -u postgres --)
fi

cleanup() {
  "${AS[@]}" "$PGBIN/pg_ctl" -D "$TMP/data" -m fast -w stop >/dev/null 2>&1 || true
  rm -rf "$TMP"
}
trap cleanup EXIT

"${AS[@]}" "$PGBIN/initdb" -D "$TMP/data" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
"${AS[@]}" "$PGBIN/pg_ctl" -D "$TMP/data" -l "$TMP/server.log" -w \
  -o "-p $PORT -k $TMP -c listen_addresses=127.0.0.1 -c fsync=off" start >/dev/null
echo "test-pg: PostgreSQL $("$PGBIN/postgres" --version | awk '{print $3}') on 127.0.0.1:$PORT"

export DATABASE_URL="postgres://postgres@127.0.0.1:$PORT/postgres"
echo "== migrations through npm run db:migrate"
npm run --silent db:migrate
echo "== data-layer tests on PostgreSQL"
npx vitest run tests/integration/data-layer.test.ts tests/integration/route-roles.test.ts tests/integration/auth-and-seed.test.ts \
  tests/integration/backup.test.ts tests/integration/backup-cli.test.ts tests/integration/atomic-writes.test.ts
