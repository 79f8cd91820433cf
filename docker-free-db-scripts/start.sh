#!/usr/bin/env bash
# Start (creating if needed) the local Ropewalk PostgreSQL cluster and make
# sure each database named in the arguments exists (default: ropewalk).
# stdout: one DATABASE_URL=... line per database; everything else on stderr.
# Env: PGPORT (54329), RW_PGDATA (<repo>/.data/postgres), RW_PGRUN (<repo>/.data/postgres-run).
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

dbs=("$@")
((${#dbs[@]})) || dbs=(ropewalk)
for db in "${dbs[@]}"; do
  # Plain identifiers only: they go into SQL and URLs unquoted.
  [[ "$db" =~ ^[a-z_][a-z0-9_]{0,62}$ ]] ||
    rw_die "database name '$db' is not a plain lower-case identifier ([a-z_][a-z0-9_]*)"
done

install_postgresql() {
  rw_is_root || rw_die "PostgreSQL server binaries (initdb, pg_ctl, postgres) not found." \
    "Install them as root: apt-get install -y postgresql   (then run this again)"
  command -v apt-get >/dev/null 2>&1 ||
    rw_die "PostgreSQL server binaries not found and apt-get is missing: install PostgreSQL by hand"
  rw_say "PostgreSQL server not found; installing it: apt-get install -y postgresql"
  export DEBIAN_FRONTEND=noninteractive
  # A fresh machine may have no package lists yet: update once, then retry.
  apt-get install -y postgresql >&2 ||
    { apt-get update >&2 && apt-get install -y postgresql >&2; } ||
    rw_die "apt-get install -y postgresql failed (see apt output above);" \
      "install PostgreSQL by hand and run this again"
}

# Prints who listens on the port, or nothing when it is free.
port_holder() {
  local lines
  if command -v ss >/dev/null 2>&1; then
    lines="$(ss -H -ltnp "sport = :$RW_PORT" 2>/dev/null || true)"
    [[ -n "$lines" ]] || return 0
    local who addr
    addr="$(awk 'NR==1 {print $4}' <<<"$lines")"
    who="$(sed -n 's/.*users:(("\([^"]*\)",pid=\([0-9]*\).*/\1 (pid \2)/p' <<<"$lines" | head -n 1)"
    printf '%s' "${who:-an unknown process} on $addr"
  elif (exec 3<>"/dev/tcp/127.0.0.1/$RW_PORT") 2>/dev/null; then
    printf 'a process on 127.0.0.1:%s (ss is not installed, so its name is unknown)' "$RW_PORT"
  fi
}

# As root the postgres user must be able to walk down to our folders.
make_traversable() {
  local d dirs=() blocked
  for d in "$RW_DATA" "$RW_RUN"; do
    d="$(dirname "$d")"
    while [[ "$d" != / ]]; do dirs+=("$d"); d="$(dirname "$d")"; done
  done
  blocked="$(rw_as_owner bash -c 'for d; do [[ -x "$d" ]] || printf "%s\n" "$d"; done' _ "${dirs[@]}")"
  while IFS= read -r d; do
    [[ -n "$d" ]] || continue
    rw_say "letting the postgres user traverse $d (chmod o+x)"
    chmod o+x "$d"
  done <<<"$blocked"
}

prepare_folders() {
  if rw_is_root; then
    id postgres >/dev/null 2>&1 || rw_die "OS user 'postgres' is missing (it comes with the postgresql package)"
    mkdir -p "$(dirname "$RW_DATA")" "$(dirname "$RW_RUN")"
    [[ "$RW_STATE" == ours ]] || install -d -o postgres -g postgres -m 700 "$RW_DATA"
    install -d -o postgres -g postgres -m 755 "$RW_RUN"
    make_traversable
  else
    [[ "$RW_STATE" == ours ]] || { mkdir -p "$RW_DATA" && chmod 700 "$RW_DATA"; }
  fi
  rw_as_owner test -w "$RW_RUN" || rw_die "folder $RW_RUN is not writable by '$RW_OWNER'"
  # A unix socket path is limited to 107 bytes ("/.s.PGSQL.<port>" is up to 16).
  ((${#RW_RUN} + 16 <= 107)) || rw_die "RW_PGRUN path is too long for a unix socket: $RW_RUN"
}

create_cluster() {
  rw_say "creating cluster in $RW_DATA (user $RW_USER_DB, trust auth, loopback only)"
  # --no-sync: a throwaway dev/test cluster; skipping fsync makes creation fast.
  rw_as_owner "$RW_BIN/initdb" -D "$RW_DATA" -U "$RW_USER_DB" --auth=trust \
    --encoding=UTF8 --locale=C.UTF-8 --no-sync >"$RW_RUN/initdb.log" 2>&1 ||
    { cat "$RW_RUN/initdb.log" >&2; rw_die "initdb failed (log above)"; }
  rw_as_owner bash -c 'printf "%s\n" "$1" >"$2"' _ \
    "PostgreSQL cluster created by Ropewalk docker-free-db-scripts on $(date -u +%FT%TZ)" "$RW_MARKER"
}

start_server() {
  rw_say "starting PostgreSQL on 127.0.0.1:$RW_PORT (socket in $RW_RUN, log $RW_LOG)"
  # listen_addresses=127.0.0.1 is what makes trust auth acceptable (see lib.sh).
  if ! rw_as_owner "$RW_BIN/pg_ctl" -D "$RW_DATA" -l "$RW_LOG" -w -t 30 \
    -o "-k '$RW_RUN' -p $RW_PORT -c listen_addresses=127.0.0.1" start >&2; then
    tail -n 20 "$RW_LOG" >&2 2>/dev/null || true
    rw_die "PostgreSQL did not start on port $RW_PORT (log tail above, full log: $RW_LOG)"
  fi
}

ensure_database() {
  local found
  found="$("$RW_BIN/psql" -X -h 127.0.0.1 -p "$RW_PORT" -U "$RW_USER_DB" -d postgres -tAq \
    -c "select 1 from pg_database where datname = '$1'")" ||
    rw_die "could not query databases on 127.0.0.1:$RW_PORT"
  if [[ "$found" != 1 ]]; then
    rw_say "creating database $1"
    "$RW_BIN/createdb" -h 127.0.0.1 -p "$RW_PORT" -U "$RW_USER_DB" "$1" ||
      rw_die "createdb $1 failed"
  fi
}

RW_BIN="$(rw_find_bindir)"
if [[ -z "$RW_BIN" ]]; then install_postgresql; rw_require_bindir; fi

rw_lock
rw_data_state
[[ "$RW_STATE" != foreign ]] || rw_refuse_foreign
[[ "$RW_STATE" != ours ]] || rw_check_owner

if [[ "$RW_STATE" == ours ]] && rw_is_running; then
  running_port="$(rw_running_port)"
  [[ "$running_port" == "$RW_PORT" ]] || rw_die "our cluster $RW_DATA is already running on port" \
    "$running_port, not $RW_PORT: run with PGPORT=$running_port, or stop it first (npm run db:stop)"
  rw_say "cluster $RW_DATA is already running on 127.0.0.1:$RW_PORT"
else
  holder="$(port_holder)"
  [[ -z "$holder" ]] || rw_die "port $RW_PORT is already in use by $holder;" \
    "stop that process or choose another port with PGPORT=<port>"
  prepare_folders
  [[ "$RW_STATE" == ours ]] || create_cluster
  start_server
fi

for db in "${dbs[@]}"; do
  ensure_database "$db"
  printf 'DATABASE_URL=postgres://%s@127.0.0.1:%s/%s\n' "$RW_USER_DB" "$RW_PORT" "$db"
done
