#!/usr/bin/env bash
# Runs a command against a throwaway PostgreSQL cluster (Debian's postgresql package), with
# TEST_POSTGRES_URL naming it and TEST_SERVER_ON_POSTGRES=1 so every server test app gets a
# database of its own there. The cluster lives in a temporary folder and is removed afterwards.
# Without PostgreSQL's server programs it says so and exits 0 (the SQLite run still covers the
# code; .ci/run installs the package so CI always runs this).
set -euo pipefail

bin=""
for dir in /usr/lib/postgresql/*/bin; do
  [ -x "$dir/initdb" ] && bin="$dir"
done
if [ -z "$bin" ]; then
  echo "with-postgres: PostgreSQL server programs not found (apt-get install postgresql); skipped" >&2
  exit 0
fi

root="$(mktemp -d /tmp/tensile-pg.XXXXXX)"
port="${TENSILE_PG_PORT:-55439}"
# PostgreSQL refuses to run as root: use the package's own account then.
run_as=()
if [ "$(id -u)" -eq 0 ]; then
  chown postgres "$root"
  run_as=(su postgres -s /bin/bash -c)
else
  run_as=(bash -c)
fi

stop() {
  "${run_as[@]}" "'$bin/pg_ctl' -D '$root/data' -m immediate stop" >/dev/null 2>&1 || true
  rm -rf "$root"
}
trap stop EXIT

"${run_as[@]}" "'$bin/initdb' -D '$root/data' -A trust -U tensile >'$root/initdb.log' 2>&1"
"${run_as[@]}" "'$bin/pg_ctl' -D '$root/data' -l '$root/server.log' -w \
  -o \"-p $port -k '$root' -c listen_addresses=127.0.0.1 -c fsync=off -c max_connections=200\" start" >/dev/null
"${run_as[@]}" "'$bin/createdb' -h 127.0.0.1 -p $port -U tensile tensile_test"

export TEST_POSTGRES_URL="postgres://tensile@127.0.0.1:$port/tensile_test"
export TEST_SERVER_ON_POSTGRES=1
echo "with-postgres: PostgreSQL $("$bin/postgres" --version | awk '{print $3}') on port $port"
"$@"
