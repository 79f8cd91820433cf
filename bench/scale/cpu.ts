// CPU spent, as opposed to time waited. The machine bench:scale runs on is shared by many busy processes, so wall-clock
// figures mostly measure the queue for a core; the CPU a request burns (in this process and in the database backends
// that serve it) does not depend on who else is running, and bounds what one idle core could do. Linux only (/proc).
import fs from "node:fs";
import type pg from "pg";

/** utime + stime of a local process, in milliseconds (clock ticks of 10 ms: USER_HZ is 100 on Linux). */
export function processCpuMs(pid: number) {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, "utf8");
    const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
    return (Number(fields[11]) + Number(fields[12])) * 10; // fields 14 and 15 of proc(5), counted after the command name
  } catch {
    return 0; // the backend ended meanwhile
  }
}

export interface CpuSample {
  node: number;
  /** per backend pid: a pool may close an idle backend or open one between two samples */
  db: Map<number, number>;
}

/**
 * CPU used so far by this process (plus the server's, when it runs in a child process) and by each backend connected
 * to the pool's database, in milliseconds.
 */
export async function cpuNow(pool: pg.Pool, serverPid?: number): Promise<CpuSample> {
  const pids = (
    await pool.query<{ pid: number }>(
      // Client backends only: an autovacuum worker on the same database is not the requests' cost. The backend that
      // answers this query is counted too: leaving it out would count its whole life once another one samples.
      "SELECT pid FROM pg_stat_activity WHERE datname = current_database() AND backend_type = 'client backend'",
    )
  ).rows.map((r) => r.pid);
  const u = process.cpuUsage();
  const server = serverPid === undefined ? 0 : processCpuMs(serverPid);
  return { node: (u.user + u.system) / 1000 + server, db: new Map(pids.map((p) => [p, processCpuMs(p)])) };
}

/** CPU between two samples; a backend seen only in the later one counts from zero (it started meanwhile). */
export function cpuSpent(a: CpuSample, b: CpuSample) {
  let db = 0;
  for (const [pid, ms] of b.db) db += ms - (a.db.get(pid) ?? 0);
  return { node: b.node - a.node, db };
}
