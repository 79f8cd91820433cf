#!/usr/bin/env bash
# Start (creating if needed) the local Ropewalk PostgreSQL cluster and make
# sure each database named in the arguments exists (default: ropewalk).
# stdout: per database a DATABASE_URL=... line (the app role) and a
# MIGRATION_DATABASE_URL=... line (the owner role); everything else on stderr.
# The database "postgres" is only reported, never adopted by the owner role.
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
  rw_say "creating cluster in $RW_DATA (superuser $RW_FRESH_SUPERUSER, trust auth, loopback only)"
  # --no-sync: a throwaway dev/test cluster; skipping fsync makes creation fast.
  rw_as_owner "$RW_BIN/initdb" -D "$RW_DATA" -U "$RW_FRESH_SUPERUSER" --auth=trust \
    --encoding=UTF8 --locale=C.UTF-8 --no-sync >"$RW_RUN/initdb.log" 2>&1 ||
    { cat "$RW_RUN/initdb.log" >&2; rw_die "initdb failed (log above)"; }
  rw_as_owner bash -c 'printf "%s\nsuperuser=%s\n" "$1" "$2" >"$3"' _ \
    "PostgreSQL cluster created by Ropewalk docker-free-db-scripts on $(date -u +%FT%TZ)" \
    "$RW_FRESH_SUPERUSER" "$RW_MARKER"
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

rw_psql() {
  local db="$1"; shift
  "$RW_BIN/psql" -X -q -v ON_ERROR_STOP=1 -h 127.0.0.1 -p "$RW_PORT" -U "$RW_SUPER" -d "$db" "$@"
}

# Both roles, idempotently on every start (clusters made before they existed get them too).
# The owner is a member of the app role only so it may end the app's sessions (DROP DATABASE ... FORCE).
ensure_roles() {
  rw_psql postgres -c "SET client_min_messages = warning" -c "
    DO \$\$ BEGIN
      IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = '$RW_ROLE_OWNER') THEN
        CREATE ROLE $RW_ROLE_OWNER LOGIN CREATEDB;
      END IF;
      IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = '$RW_ROLE_APP') THEN
        CREATE ROLE $RW_ROLE_APP LOGIN;
      END IF;
    END \$\$;
    GRANT $RW_ROLE_APP TO $RW_ROLE_OWNER;" || rw_die "could not create roles $RW_ROLE_OWNER and $RW_ROLE_APP"
}

# A database made before the roles existed belongs to the superuser: hand it and
# every object our migrations made in it to the owner role (again harmless).
adopt_database() {
  rw_psql "$1" -c "SET client_min_messages = warning" -c "
    ALTER DATABASE $1 OWNER TO $RW_ROLE_OWNER;
    DO \$\$ DECLARE r record; su oid := (SELECT oid FROM pg_roles WHERE rolname = current_user);
    BEGIN
      FOR r IN SELECT nspname FROM pg_namespace WHERE nspowner = su
          AND nspname NOT LIKE 'pg\\_%' AND nspname NOT IN ('information_schema', 'public') LOOP
        EXECUTE format('ALTER SCHEMA %I OWNER TO $RW_ROLE_OWNER', r.nspname);
      END LOOP;
      -- Tables, views and free sequences; a serial's sequence follows its table.
      FOR r IN SELECT c.oid::regclass AS rel FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
          WHERE c.relowner = su AND c.relkind IN ('r', 'p', 'v', 'm', 'f', 'S')
            AND n.nspname NOT LIKE 'pg\\_%' AND n.nspname <> 'information_schema'
            AND NOT EXISTS (SELECT 1 FROM pg_depend d WHERE d.classid = 'pg_class'::regclass AND d.objid = c.oid
                            AND d.refclassid = 'pg_class'::regclass AND d.deptype IN ('a', 'i')) LOOP
        EXECUTE format('ALTER TABLE %s OWNER TO $RW_ROLE_OWNER', r.rel);
      END LOOP;
      FOR r IN SELECT p.oid::regprocedure AS fn FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace
          WHERE p.proowner = su AND n.nspname NOT LIKE 'pg\\_%' AND n.nspname <> 'information_schema' LOOP
        EXECUTE format('ALTER ROUTINE %s OWNER TO $RW_ROLE_OWNER', r.fn);
      END LOOP;
      FOR r IN SELECT t.oid::regtype AS ty FROM pg_type t JOIN pg_namespace n ON n.oid = t.typnamespace
          WHERE t.typowner = su AND t.typtype IN ('e', 'd') AND n.nspname NOT LIKE 'pg\\_%' AND n.nspname <> 'information_schema' LOOP
        EXECUTE format('ALTER TYPE %s OWNER TO $RW_ROLE_OWNER', r.ty);
      END LOOP;
    END \$\$;" || rw_die "could not hand database $1 to $RW_ROLE_OWNER"
}

ensure_database() {
  local found
  [[ "$1" != postgres ]] || return 0
  found="$(rw_psql postgres -tA -c "select 1 from pg_database where datname = '$1'")" ||
    rw_die "could not query databases on 127.0.0.1:$RW_PORT"
  if [[ "$found" != 1 ]]; then
    rw_say "creating database $1 (owner $RW_ROLE_OWNER)"
    "$RW_BIN/createdb" -h 127.0.0.1 -p "$RW_PORT" -U "$RW_SUPER" -O "$RW_ROLE_OWNER" "$1" ||
      rw_die "createdb $1 failed"
  else
    adopt_database "$1"
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

RW_SUPER="$(rw_superuser)"
ensure_roles
for db in "${dbs[@]}"; do
  ensure_database "$db"
  printf 'DATABASE_URL=postgres://%s@127.0.0.1:%s/%s\n' "$RW_ROLE_APP" "$RW_PORT" "$db"
  printf 'MIGRATION_DATABASE_URL=postgres://%s@127.0.0.1:%s/%s\n' "$RW_ROLE_OWNER" "$RW_PORT" "$db"
done
