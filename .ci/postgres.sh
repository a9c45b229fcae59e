#!/usr/bin/env bash
# Throw-away PostgreSQL server for Lapsewatch tests, on 127.0.0.1 only.
#
#   .ci/postgres.sh [start]   install if missing, init the cluster once, start, create the test db,
#                             print the connection URL (the last line of output)
#   .ci/postgres.sh stop      stop the server (the data stay for the next start)
#   .ci/postgres.sh restart   stop and start again (the fault suite uses this mid-run)
#   .ci/postgres.sh status    exit 0 when the server accepts connections
#   .ci/postgres.sh destroy   stop and delete the data folder
#
# Environment: LAPSEWATCH_PG_PORT (default 54329), LAPSEWATCH_PG_DIR (default
# ${TMPDIR:-/tmp}/lapsewatch-pg-<port>), LAPSEWATCH_PG_DB (default lapsewatch_test).
# Run as root (the server then runs as the `postgres` user) or as the user who owns the folder.
# Every step is idempotent: running `start` twice leaves one server running.
set -euo pipefail

port="${LAPSEWATCH_PG_PORT:-54329}"
root_dir="${LAPSEWATCH_PG_DIR:-${TMPDIR:-/tmp}/lapsewatch-pg-${port}}"
db_name="${LAPSEWATCH_PG_DB:-lapsewatch_test}"
data_dir="${root_dir}/data"
socket_dir="${root_dir}/socket"
log_file="${root_dir}/server.log"
action="${1:-start}"

say() { echo "postgres.sh: $*" >&2; }
die() { say "error: $*"; exit 1; }

find_bin_dir() {
  local dir
  for dir in $(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V -r); do
    if [[ -x "${dir}/initdb" && -x "${dir}/pg_ctl" ]]; then echo "${dir}"; return 0; fi
  done
  return 1
}

ensure_installed() {
  if find_bin_dir >/dev/null; then return 0; fi
  [[ "$(id -u)" == 0 ]] || die "PostgreSQL is not installed and installing it needs root"
  say "installing PostgreSQL from Debian's packages"
  export DEBIAN_FRONTEND=noninteractive
  # Update the package lists only when the install cannot find the package without it.
  if ! apt-get install -y -q postgresql >&2; then
    apt-get update -q >&2
    apt-get install -y -q postgresql >&2
  fi
  find_bin_dir >/dev/null || die "PostgreSQL installed but no initdb/pg_ctl under /usr/lib/postgresql/*/bin"
}

# Runs a command as the cluster's owner: `postgres` when we are root, ourselves otherwise.
as_owner() {
  if [[ "$(id -u)" == 0 ]]; then
    runuser -u postgres -- "$@"
  else
    "$@"
  fi
}

is_running() {
  local bin_dir; bin_dir="$(find_bin_dir)" || return 1
  [[ -f "${data_dir}/PG_VERSION" ]] || return 1
  as_owner "${bin_dir}/pg_ctl" -D "${data_dir}" status >/dev/null 2>&1
}

accepts_connections() {
  local bin_dir; bin_dir="$(find_bin_dir)" || return 1
  "${bin_dir}/pg_isready" -q -h 127.0.0.1 -p "${port}" -d postgres -U postgres
}

init_cluster() {
  local bin_dir; bin_dir="$(find_bin_dir)"
  mkdir -p "${root_dir}" "${socket_dir}"
  if [[ "$(id -u)" == 0 ]]; then chown postgres:postgres "${root_dir}" "${socket_dir}"; fi
  if [[ -f "${data_dir}/PG_VERSION" ]]; then return 0; fi
  say "initialising a cluster in ${data_dir}"
  # Trust on loopback only: a throw-away server for tests, never reachable from outside.
  as_owner "${bin_dir}/initdb" -D "${data_dir}" -U postgres --auth=trust --encoding=UTF8 \
    --locale=C.UTF-8 --no-sync >/dev/null
  cat >>"${data_dir}/postgresql.conf" <<CONF
listen_addresses = '127.0.0.1'
port = ${port}
unix_socket_directories = '${socket_dir}'
# A throw-away test server: skipping fsync only risks data on an OS crash, not on restart or kill.
fsync = off
full_page_writes = off
max_connections = 100
CONF
  cat >"${data_dir}/pg_hba.conf" <<HBA
local all all trust
host  all all 127.0.0.1/32 trust
HBA
  if [[ "$(id -u)" == 0 ]]; then chown postgres:postgres "${data_dir}/pg_hba.conf"; fi
}

wait_until_ready() {
  local tries=0
  until accepts_connections; do
    tries=$((tries + 1))
    # 30 s at most: a server that needs longer is broken, and the caller should hear so.
    [[ ${tries} -le 150 ]] || die "server on 127.0.0.1:${port} did not accept connections in 30 s; see ${log_file}"
    sleep 0.2
  done
}

start_server() {
  ensure_installed
  init_cluster
  local bin_dir; bin_dir="$(find_bin_dir)"
  if ! is_running; then
    touch "${log_file}"
    if [[ "$(id -u)" == 0 ]]; then chown postgres:postgres "${log_file}"; fi
    as_owner "${bin_dir}/pg_ctl" -D "${data_dir}" -l "${log_file}" -w -t 30 start >/dev/null \
      || die "pg_ctl start failed; see ${log_file}"
  fi
  wait_until_ready
  local exists
  exists="$("${bin_dir}/psql" -h 127.0.0.1 -p "${port}" -U postgres -d postgres -tAc \
    "SELECT 1 FROM pg_database WHERE datname = '${db_name}'")"
  if [[ "${exists}" != "1" ]]; then
    "${bin_dir}/createdb" -h 127.0.0.1 -p "${port}" -U postgres "${db_name}"
  fi
  echo "postgres://postgres@127.0.0.1:${port}/${db_name}"
}

stop_server() {
  local bin_dir
  bin_dir="$(find_bin_dir)" || { say "PostgreSQL is not installed; nothing to stop"; return 0; }
  if is_running; then
    as_owner "${bin_dir}/pg_ctl" -D "${data_dir}" -m fast -w -t 30 stop >/dev/null
    say "stopped the server on 127.0.0.1:${port}"
  else
    say "no server running from ${data_dir}"
  fi
}

case "${action}" in
  start) start_server ;;
  stop) stop_server ;;
  restart) stop_server; start_server ;;
  status) accepts_connections ;;
  destroy) stop_server; rm -rf "${root_dir}"; say "removed ${root_dir}" ;;
  *) die "unknown action '${action}' (use start, stop, restart, status or destroy)" ;;
esac
