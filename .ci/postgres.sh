#!/usr/bin/env bash
# Starts a throw-away PostgreSQL server on a free loopback port for the shared-store tests and
# prints the JDBC URL to use; the caller stops it with: pg_ctl -D "$LRBENCH_PG_DIR/data" stop
set -euo pipefail
bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)
[ -x "$bin/initdb" ] || { echo "no PostgreSQL server binaries under /usr/lib/postgresql" >&2; exit 1; }
dir=$(mktemp -d /tmp/lrbench-pg.XXXXXX)
chown postgres "$dir"
port=$(python3 -c 'import socket; s=socket.socket(); s.bind(("127.0.0.1", 0)); print(s.getsockname()[1])')
su postgres -s /bin/sh -c "$bin/initdb -D $dir/data -A trust -U lrbench >$dir/initdb.log 2>&1"
su postgres -s /bin/sh -c "$bin/pg_ctl -D $dir/data -w -l $dir/server.log \
  -o '-p $port -k $dir -c listen_addresses=127.0.0.1' start >/dev/null"
su postgres -s /bin/sh -c "psql -h 127.0.0.1 -p $port -U lrbench -d postgres -qc 'CREATE DATABASE lrbench_test'"
echo "LRBENCH_PG_DIR=$dir"
echo "LRBENCH_PG_BIN=$bin"
echo "LRBENCH_TEST_POSTGRES_URL=jdbc:postgresql://127.0.0.1:$port/lrbench_test?user=lrbench"
