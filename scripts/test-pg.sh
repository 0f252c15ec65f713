#!/usr/bin/env bash
# `npm run test:pg`: the migrations and the API tests on PostgreSQL.
#
# With DATABASE_URL=postgres://… set, that server is used (its user must be allowed to create
# databases; the tests create one per test app and drop it again). Without it, a throwaway
# PostgreSQL cluster is made in a temporary folder: Debian's `postgresql` package is installed
# when the server binaries are missing (as root, without starting Debian's own cluster), the
# cluster runs as the `postgres` system user on 127.0.0.1 and a free port with fsync off, and it
# is stopped and deleted at the end, also when a step fails.
#
# Steps: migrations up, down all the way, up again (proves every `down`), then test/api/** with
# test/api/vitest.pg.config.ts. Extra arguments go to vitest (e.g. a single spec file).
set -euo pipefail
cd "$(dirname "$0")/.."
started=$(date +%s)

cluster_dir=""
pg_bin=""
app_data_dir=""
admin_url=""
migrate_db=""   # set while the migrations' database exists
policy=/usr/sbin/policy-rc.d
policy_state=""   # "", "created" or "replaced" while apt-get runs
restore_policy() {
  case "$policy_state" in
    created) rm -f "$policy" ;;
    replaced) mv -f "$policy.test-pg" "$policy" ;;
  esac
  policy_state=""
}
cleanup() {
  local status=$?
  restore_policy
  if [ -n "$migrate_db" ]; then npx tsx scripts/pg-admin.ts "$admin_url" "DROP DATABASE IF EXISTS $migrate_db WITH (FORCE)" >/dev/null 2>&1 || true; fi
  if [ -n "$app_data_dir" ]; then rm -rf "$app_data_dir"; fi
  if [ -n "$cluster_dir" ] && [ -d "$cluster_dir" ]; then
    if [ -n "$pg_bin" ] && [ -f "$cluster_dir/data/postmaster.pid" ]; then
      as_postgres "$pg_bin/pg_ctl" -D "$cluster_dir/data" -m immediate -w stop >/dev/null 2>&1 || true
    fi
    rm -rf "$cluster_dir"
    echo "test:pg: stopped and deleted the throwaway cluster."
  fi
  exit "$status"
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

# Runs a command as the postgres system user (the server refuses to run as root).
as_postgres() {
  if [ "$(id -un)" = "postgres" ]; then
    "$@"
  elif command -v runuser >/dev/null 2>&1; then
    runuser -u postgres -- "$@"
  else
    su postgres -s /bin/sh -c "$(printf '%q ' "$@")"
  fi
}

# The newest installed server's bin folder (Debian: /usr/lib/postgresql/<major>/bin).
find_pg_bin() {
  local dir
  dir=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
  if [ -n "$dir" ] && [ -x "$dir/initdb" ] && [ -x "$dir/pg_ctl" ]; then echo "$dir"; fi
}

# A TCP port nobody listens on, chosen by the kernel.
free_port() {
  node -e "const s = require('node:net').createServer(); s.listen(0, '127.0.0.1', () => { console.log(s.address().port); s.close(); });"
}

if [ -n "${DATABASE_URL:-}" ]; then
  case "$DATABASE_URL" in
    postgres://* | postgresql://*) ;;
    *) echo "test:pg: DATABASE_URL must be a postgres:// address." >&2; exit 2 ;;
  esac
  admin_url="$DATABASE_URL"
  echo "test:pg: using the server in DATABASE_URL."
else
  pg_bin=$(find_pg_bin)
  if [ -z "$pg_bin" ]; then
    if [ "$(id -u)" -ne 0 ]; then
      echo "test:pg: no PostgreSQL server binaries, and installing them needs root. Install Debian's postgresql package or set DATABASE_URL." >&2
      exit 2
    fi
    echo "test:pg: installing Debian's postgresql package (its own cluster is not started)."
    export DEBIAN_FRONTEND=noninteractive
    # policy-rc.d exit 101 tells invoke-rc.d not to start services (Debian's own cluster) while
    # packages install; the previous policy comes back afterwards, also on failure (trap).
    if [ -e "$policy" ]; then cp -p "$policy" "$policy.test-pg"; policy_state=replaced; else policy_state=created; fi
    printf '#!/bin/sh\nexit 101\n' >"$policy"
    chmod +x "$policy"
    apt-get update -qq
    apt-get install -y -qq --no-install-recommends postgresql >/dev/null
    restore_policy
    pg_bin=$(find_pg_bin)
    if [ -z "$pg_bin" ]; then echo "test:pg: the postgresql package installed no server binaries." >&2; exit 2; fi
  fi
  if ! id postgres >/dev/null 2>&1; then
    echo "test:pg: there is no postgres system user to run the server as." >&2
    exit 2
  fi
  cluster_dir=$(mktemp -d /tmp/tidemark-pg.XXXXXX)
  chown postgres "$cluster_dir"
  port=$(free_port)
  echo "test:pg: throwaway cluster with $("$pg_bin/postgres" --version) in $cluster_dir on 127.0.0.1:$port."
  # C.UTF-8 sorts text by code point, as SQLite does by default.
  as_postgres "$pg_bin/initdb" -D "$cluster_dir/data" -U postgres --auth=trust --encoding=UTF8 --locale=C.UTF-8 >"$cluster_dir/initdb.log" 2>&1 ||
    { cat "$cluster_dir/initdb.log" >&2; exit 1; }
  # Durability is pointless for a throwaway cluster: fsync off for speed.
  as_postgres "$pg_bin/pg_ctl" -D "$cluster_dir/data" -l "$cluster_dir/server.log" -w -t 60 start \
    -o "-h 127.0.0.1 -p $port -k $cluster_dir -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=200" >/dev/null ||
    { cat "$cluster_dir/server.log" >&2; exit 1; }
  admin_url="postgres://postgres@127.0.0.1:$port/postgres"
fi

# The migrations, on a database of their own: up, down all the way, up again. The CLI's data
# folder (secret.key) is a temporary one, so data/ is left alone.
app_data_dir=$(mktemp -d /tmp/tidemark-pg-data.XXXXXX)
export TIDEMARK_DATA_DIR="$app_data_dir"
migrate_db="tidemark_migrate_$$"
psql_admin() { npx tsx scripts/pg-admin.ts "$admin_url" "$1"; }
psql_admin "DROP DATABASE IF EXISTS $migrate_db WITH (FORCE)"
psql_admin "CREATE DATABASE $migrate_db"
migrate_url=$(node -e "const u = new URL(process.argv[1]); u.pathname = '/' + process.argv[2]; console.log(u.toString());" "$admin_url" "$migrate_db")
echo "test:pg: migrations up, down, up."
DATABASE_URL="$migrate_url" npx tsx server/cli/migrate.ts
DATABASE_URL="$migrate_url" npx tsx server/cli/migrate.ts --revert-all
# Every `down` must leave nothing behind: no table but TypeORM's log, no sequence, no function.
leftovers=$(npx tsx scripts/pg-admin.ts "$migrate_url" "SELECT string_agg(kind || ' ' || name, ', ') FROM (
  SELECT 'table' AS kind, table_name::text AS name FROM information_schema.tables WHERE table_schema = 'public' AND table_name <> 'migrations'
  UNION ALL SELECT 'sequence', sequence_name::text FROM information_schema.sequences WHERE sequence_schema = 'public' AND sequence_name <> 'migrations_id_seq'
  UNION ALL SELECT 'function', routine_name::text FROM information_schema.routines WHERE routine_schema = 'public') AS left_over")
if [ "$leftovers" != "null" ] && [ -n "$leftovers" ]; then
  echo "test:pg: the migrations' down steps left behind: $leftovers" >&2
  exit 1
fi
DATABASE_URL="$migrate_url" npx tsx server/cli/migrate.ts
psql_admin "DROP DATABASE $migrate_db WITH (FORCE)"
migrate_db=""
migrated=$(date +%s)

echo "test:pg: API tests on PostgreSQL."
set +e
TIDEMARK_TEST_PG_URL="$admin_url" npx vitest run --config test/api/vitest.pg.config.ts "$@"
tests_status=$?
set -e
left=$(npx tsx scripts/pg-admin.ts "$admin_url" "SELECT datname FROM pg_database WHERE datname LIKE 'tidemark\\_t\\_%'" || true)
if [ -n "$left" ]; then
  echo "test:pg: test databases left behind (a test app was not closed); dropping them:" $left >&2
  for name in $left; do psql_admin "DROP DATABASE IF EXISTS $name WITH (FORCE)"; done
fi
echo "test:pg: migrations $((migrated - started)) s, tests $(($(date +%s) - migrated)) s, total $(($(date +%s) - started)) s."
exit "$tests_status"
