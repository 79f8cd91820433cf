#!/usr/bin/env bash
# Stop the local Ropewalk PostgreSQL cluster and delete its data folder,
# only when the folder carries our marker. Env: RW_PGDATA, RW_PGRUN as for start.sh.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

rw_data_state
case "$RW_STATE" in
  absent) rw_say "no cluster in $RW_DATA; nothing to reset"; exit 0 ;;
  foreign) rw_refuse_foreign ;;
esac
rw_require_bindir
rw_lock
if rw_is_running; then rw_stop; fi
rw_say "deleting $RW_DATA"
rm -rf -- "$RW_DATA"
