#!/usr/bin/env bash
# Print the state of the local Ropewalk PostgreSQL cluster on stdout:
# running (exit 0), stopped or absent (exit 3). Env: RW_PGDATA as for start.sh.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

rw_data_state
case "$RW_STATE" in
  absent) echo absent; rw_say "no cluster in $RW_DATA"; exit 3 ;;
  foreign) echo absent; rw_say "$RW_DATA exists but is not a Ropewalk cluster (no $RW_MARKER_NAME)"; exit 3 ;;
esac
rw_require_bindir
if rw_is_running; then
  echo running
  rw_say "cluster $RW_DATA is running on 127.0.0.1:$(rw_running_port)"
  exit 0
fi
echo stopped
rw_say "cluster $RW_DATA is stopped"
exit 3
