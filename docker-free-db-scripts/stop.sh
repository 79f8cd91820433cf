#!/usr/bin/env bash
# Stop the local Ropewalk PostgreSQL cluster if it is running (fine when it is not).
# Env: RW_PGDATA, RW_PGRUN as for start.sh.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

rw_data_state
case "$RW_STATE" in
  absent) rw_say "no cluster in $RW_DATA; nothing to stop"; exit 0 ;;
  foreign) rw_refuse_foreign ;;
esac
rw_require_bindir
rw_lock
if rw_is_running; then rw_stop; else rw_say "cluster $RW_DATA is not running"; fi
