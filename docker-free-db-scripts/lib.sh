# Shared logic for the local PostgreSQL cluster scripts (start/stop/status/reset).
# Sourced, not run. Human messages go to stderr; only results go to stdout.
#
# Security note: the cluster uses trust authentication (no passwords). That is
# acceptable ONLY because the server listens on 127.0.0.1 and on a unix socket
# in a folder we own, never on an outside address. It is a development/test
# cluster; a deployment points DATABASE_URL elsewhere.
#
# Roles: the cluster's superuser is used by these scripts only. Migrations run
# as ropewalk_owner (owns the databases and every table, may create databases);
# the app connects as ropewalk_app, which owns nothing and only gets the
# privileges server/db/grants.ts hands it.

set -euo pipefail

RW_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
RW_PORT="${PGPORT:-54329}"
RW_DATA="${RW_PGDATA:-$RW_ROOT/.data/postgres}"
RW_RUN="${RW_PGRUN:-$RW_ROOT/.data/postgres-run}"
# Clusters made before the two roles existed have superuser "app"; new ones
# name it "postgres" and record that in the marker (see rw_superuser).
RW_LEGACY_SUPERUSER=app
RW_FRESH_SUPERUSER=postgres
RW_ROLE_OWNER=ropewalk_owner
RW_ROLE_APP=ropewalk_app
RW_MARKER_NAME=.ropewalk-cluster

rw_say() { printf 'db: %s\n' "$*" >&2; }
rw_die() { rw_say "$*"; exit 1; }

# Paths are handed to a postgres user whose working folder differs from ours,
# so make them absolute; pg_ctl also passes -o through a shell, so refuse quotes.
rw_abs() { case "$1" in /*) printf '%s' "$1" ;; *) printf '%s/%s' "$PWD" "$1" ;; esac; }
RW_DATA="$(rw_abs "$RW_DATA")"
RW_RUN="$(rw_abs "$RW_RUN")"
RW_MARKER="$RW_DATA/$RW_MARKER_NAME"
RW_LOG="$RW_RUN/postgres.log"
[[ "$RW_PORT" =~ ^[0-9]+$ ]] && ((RW_PORT >= 1 && RW_PORT <= 65535)) ||
  rw_die "PGPORT must be a TCP port number (1-65535), got '$RW_PORT'"
case "$RW_DATA$RW_RUN" in *[\'\",]*) rw_die "RW_PGDATA/RW_PGRUN must not contain quotes or commas" ;; esac

# The superuser of our cluster: the marker's "superuser=" line, else the legacy name.
rw_superuser() {
  local name
  name="$(sed -n 's/^superuser=//p' "$RW_MARKER" 2>/dev/null | head -n 1)"
  printf '%s' "${name:-$RW_LEGACY_SUPERUSER}"
}

rw_is_root() { [[ "$(id -u)" -eq 0 ]]; }

# The OS user that owns and runs the cluster: initdb/pg_ctl refuse to run as root.
if rw_is_root; then RW_OWNER=postgres; else RW_OWNER="$(id -un)"; fi

# Run a server command as the cluster owner, from "/" so an unreadable working
# folder (e.g. /root) does not bother the postgres user. fd 9 (our lock) is
# closed so a server started here does not keep holding it.
rw_as_owner() {
  if rw_is_root; then (cd / && runuser -u postgres -- "$@" 9>&-); else "$@" 9>&-; fi
}

# Prints the folder holding initdb/pg_ctl/postgres, or nothing.
# pg_config may come from libpq-dev without a server, so check initdb exists.
# A cluster made by an older major version needs that version's binaries.
rw_find_bindir() {
  local d ver=""
  [[ -r "$RW_DATA/PG_VERSION" ]] && ver="$(<"$RW_DATA/PG_VERSION")"
  if [[ -n "$ver" && -x "/usr/lib/postgresql/$ver/bin/initdb" ]]; then
    printf '%s' "/usr/lib/postgresql/$ver/bin"; return 0
  fi
  if command -v pg_config >/dev/null 2>&1; then
    d="$(pg_config --bindir 2>/dev/null || true)"
    if [[ -n "$d" && -x "$d/initdb" && -x "$d/pg_ctl" && -x "$d/postgres" ]]; then
      printf '%s' "$d"; return 0
    fi
  fi
  d="$(printf '%s\n' /usr/lib/postgresql/*/bin | sort -V | tail -n 1)"
  if [[ -x "$d/initdb" && -x "$d/pg_ctl" && -x "$d/postgres" ]]; then printf '%s' "$d"; fi
}

# Sets RW_BIN or fails with what to install.
rw_require_bindir() {
  RW_BIN="$(rw_find_bindir)"
  [[ -n "$RW_BIN" ]] || rw_die "PostgreSQL server binaries (initdb, pg_ctl, postgres) not found." \
    "Install them as root: apt-get install -y postgresql"
}

# Sets RW_STATE: absent (missing or empty), foreign (no marker) or ours.
# A folder we cannot even read belongs to someone else: say so plainly.
rw_data_state() {
  if [[ -d "$RW_DATA" && ! ( -r "$RW_DATA" && -x "$RW_DATA" ) ]]; then
    rw_die "cannot read data folder $RW_DATA (owned by '$(stat -c %U "$RW_DATA")', you are '$(id -un)')"
  fi
  if [[ ! -d "$RW_DATA" ]] || [[ -z "$(ls -A "$RW_DATA")" ]]; then RW_STATE=absent
  elif [[ -f "$RW_MARKER" ]]; then RW_STATE=ours
  else RW_STATE=foreign; fi
}

rw_refuse_foreign() {
  rw_die "refusing to touch $RW_DATA: it exists but was not created by these scripts" \
    "(no $RW_MARKER_NAME marker). Move it away or point RW_PGDATA at another folder."
}

rw_check_owner() {
  local who
  who="$(stat -c %U "$RW_DATA")"
  [[ "$who" == "$RW_OWNER" ]] || rw_die "data folder $RW_DATA is owned by '$who', expected '$RW_OWNER'" \
    "(as root the cluster runs as 'postgres', otherwise as you). Fix with: chown -R $RW_OWNER $RW_DATA"
}

# pg_ctl status: 0 running, 3 not running.
rw_is_running() { rw_as_owner "$RW_BIN/pg_ctl" -D "$RW_DATA" status >/dev/null 2>&1; }

# Port our running server listens on (line 4 of postmaster.pid).
rw_running_port() { sed -n 4p "$RW_DATA/postmaster.pid" 2>/dev/null || true; }

# Serialise the scripts per run folder so two starts cannot race on initdb.
rw_lock() {
  mkdir -p "$RW_RUN"
  if command -v flock >/dev/null 2>&1; then
    exec 9>"$RW_RUN/.scripts.lock"
    flock -w 120 9 || rw_die "timed out waiting for another db script ($RW_RUN/.scripts.lock)"
  fi
}

rw_stop() {
  rw_say "stopping cluster $RW_DATA"
  rw_as_owner "$RW_BIN/pg_ctl" -D "$RW_DATA" -m fast -w -t 60 stop >&2
}
