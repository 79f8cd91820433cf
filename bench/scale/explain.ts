// `npm run bench:scale -- --explain`: for each list endpoint, the SQL statements it sends through the app's pool are
// captured while one request is served, then each SELECT is run again under EXPLAIN (ANALYZE, BUFFERS) as the app role
// with the same parameters. Printed per statement: the plan, and the figures that show whether its cost is bounded —
// the most rows any node handled (rows × loops plus rows its filter removed), sequential scans, sorts that spill.
import type pg from "pg";
import { processCpuMs } from "./cpu";

export interface Captured {
  text: string;
  values: unknown[];
}

/** Wraps pool.query (drizzle's node-postgres driver sends every statement outside a transaction through it). */
export function captureQueries(pool: pg.Pool) {
  let into: Captured[] | null = null;
  const original = pool.query.bind(pool) as (...args: unknown[]) => unknown;
  (pool as unknown as { query: (...args: unknown[]) => unknown }).query = (...args: unknown[]) => {
    if (into) {
      const [first, second] = args;
      const text = typeof first === "string" ? first : (first as { text: string }).text;
      const values = (Array.isArray(second) ? second : ((first as { values?: unknown[] }).values ?? [])) as unknown[];
      into.push({ text, values });
    }
    return original(...args);
  };
  return {
    /** Runs `fn` and answers the statements the pool was sent meanwhile. */
    async during(fn: () => Promise<unknown>) {
      const seen: Captured[] = [];
      into = seen;
      try {
        await fn();
      } finally {
        into = null;
      }
      return seen;
    },
  };
}

export interface PlanFigures {
  plan: string;
  /** the largest rows × loops (+ rows removed by a filter) of any node */
  maxRows: number;
  seqScans: string[];
  spills: boolean;
  buffers: number;
  ms: number;
  /** CPU the database backend spent per run of the statement (not EXPLAIN), from /proc: hardly moved by other load */
  cpuMs: number;
}

/**
 * The backend's CPU per run over `runs` runs. Wall-clock times on a machine shared by many busy processes mostly
 * measure waiting for a core; the CPU a statement burns does not depend on who else runs. The cluster is local.
 */
async function cpuPerRun(client: pg.Client, q: Captured, runs: number) {
  const pid = (await client.query<{ pid: number }>("SELECT pg_backend_pid() AS pid")).rows[0].pid;
  const t0 = processCpuMs(pid);
  for (let i = 0; i < runs; i++) await client.query(q.text, q.values);
  return (processCpuMs(pid) - t0) / runs;
}

/** EXPLAIN (ANALYZE, BUFFERS) of one captured statement, and what its plan says about the cost's growth. */
export async function explain(client: pg.Client, q: Captured, runs = 40): Promise<PlanFigures> {
  const res = await client.query<{ "QUERY PLAN": string }>(`EXPLAIN (ANALYZE, BUFFERS) ${q.text}`, q.values);
  const lines = res.rows.map((r) => r["QUERY PLAN"]);
  let maxRows = 0;
  let rowsHere = 0;
  const seqScans: string[] = [];
  for (const line of lines) {
    const node = /actual time=[\d.]+\.\.[\d.]+ rows=(\d+) loops=(\d+)/.exec(line);
    if (node) {
      rowsHere = Number(node[1]) * Number(node[2]);
      maxRows = Math.max(maxRows, rowsHere);
    }
    const removed = /Rows Removed by (?:Filter|Join Filter|Index Recheck): (\d+)/.exec(line);
    if (removed) maxRows = Math.max(maxRows, rowsHere + Number(removed[1]));
    const seq = /Seq Scan on (\w+)/.exec(line);
    if (seq) seqScans.push(seq[1]);
  }
  const top = lines.find((l) => l.includes("Buffers:")) ?? "";
  const buffers = [...top.matchAll(/(?:hit|read|dirtied|written)=(\d+)/g)].reduce((s, m) => s + Number(m[1]), 0);
  const ms = Number(/Execution Time: ([\d.]+)/.exec(lines.join("\n"))?.[1] ?? NaN);
  return {
    plan: lines.join("\n"),
    maxRows,
    seqScans,
    spills: lines.some((l) => /external|Disk:/.test(l)),
    buffers,
    ms,
    cpuMs: await cpuPerRun(client, q, runs),
  };
}

/** A statement this endpoint sends whatever the table sizes (the session's user, the lab's settings): not a list. */
const isBookkeeping = (text: string) =>
  /from "users" where "users"\."id" = \$1/i.test(text) || /from "settings" where "settings"\."key" = \$1/i.test(text);

export const listStatements = (seen: Captured[]) =>
  seen.filter((q) => /^\s*(select|with)/i.test(q.text) && !isBookkeeping(q.text));
