// `npm run bench:scale`: list endpoints on a busy lab's year of data (issue 14), in their own database on the loopback
// cluster (ropewalk_bench_scale, kept between runs: seeding takes minutes). Prints p50/p95 per list endpoint and the
// 50-connection throughput of /api/plans. `npm run bench:scale -- --serve PORT` serves the app on that database until
// interrupted (demo accounts, password "ropewalk-demo"). `--reseed` drops and rebuilds the database first. `--explain`
// prints, per endpoint, each SQL statement it runs with its EXPLAIN (ANALYZE, BUFFERS) plan (markdown; docs/scale-figures.md).
// `--only TEXT` (repeatable) keeps the endpoints whose label contains one of the texts.
// The timings run twice: against the app in this process (development mode, which checks every reply against its
// schema) and against the compiled production server in a child process (bench/scale/production.ts), as deployed.
import os from "node:os";
import type { AddressInfo } from "node:net";
import { performance } from "node:perf_hooks";
import autocannon from "autocannon";
import pg from "pg";
import { createApp } from "../../server/app";
import { DEMO_PASSWORD } from "../../server/db/seed";
import { quantile, signIn } from "../http-client";
import { appUrl, BENCH_DB, prepare } from "./prepare";
import { DEEP_PLAN_ORDERS, listCases, type Asker } from "./lists";
import { captureQueries, explain, listStatements } from "./explain";
import { cpuNow, cpuSpent, type CpuSample } from "./cpu";
import { PROXIED, startProduction } from "./production";

const args = process.argv.slice(2);
const servePort = args.includes("--serve") ? Number(args[args.indexOf("--serve") + 1]) : undefined;
const only = args.flatMap((a, i) => (a === "--only" && args[i + 1] ? [args[i + 1]!] : []));

/** Where the app answers: in this process (development mode) or the compiled production server (a child process). */
interface Target {
  name: string;
  base: string;
  headers: Record<Asker, Record<string, string>>;
  serverPid?: number;
}

/** GET headers of a signed-in demo account: its cookies (session and CSRF), plus `extra` on every request. */
const headersOf = async (base: string, email: string, extra: Record<string, string> = {}) => ({
  ...extra,
  cookie: (await signIn(base, email, DEMO_PASSWORD, extra)).cookie,
});

const askers = async (base: string, extra: Record<string, string> = {}): Promise<Target["headers"]> => ({
  admin: await headersOf(base, "admin@ropewalk.test", extra),
  approver: await headersOf(base, "approver@ropewalk.test", extra),
});

async function timings(t: Target, as: Asker, url: string, n = 60) {
  const ms: number[] = [];
  let status = 0;
  let bytes = 0;
  let cpu0: CpuSample | undefined;
  for (let i = 0; i < n + 5; i++) {
    if (i === 5) cpu0 = await cpuNow(deps.pool, t.serverPid);
    const t0 = performance.now();
    const r = await fetch(t.base + url, { headers: t.headers[as] });
    bytes = (await r.arrayBuffer()).byteLength;
    status = r.status;
    if (status !== 200) throw new Error(`${url}: ${status}`);
    if (i >= 5) ms.push(performance.now() - t0); // the first five warm caches and plans
  }
  // The node figure includes this process's own fetch client, so it overstates the server's share a little.
  const spent = cpuSpent(cpu0!, await cpuNow(deps.pool, t.serverPid));
  const cpu = { node: spent.node / n, db: spent.db / n };
  return { status, bytes, p50: quantile(ms, 0.5), p95: quantile(ms, 0.95), cpu };
}

const load = () =>
  `load average ${os
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(", ")} on ${os.cpus().length} cores`;

async function measureLists(t: Target, cases: ReturnType<typeof listCases>) {
  console.log(`\n${t.name}: ${load()}`);
  console.log("endpoint                          status    p50 ms    p95 ms     bytes   CPU ms/request: node    db");
  for (const c of cases) {
    const r = await timings(t, c.as, c.url);
    console.log(
      `${c.label.padEnd(32)}  ${String(r.status).padEnd(6)} ${r.p50.toFixed(1).padStart(8)}  ${r.p95.toFixed(1).padStart(8)}  ${String(r.bytes).padStart(8)}` +
        `  ${r.cpu.node.toFixed(1).padStart(20)}  ${r.cpu.db.toFixed(1).padStart(5)}`,
    );
  }
  console.log(load());
}

/**
 * Keyset cursors 40 000 plans in under each deep-paged order (DEEP_PLAN_ORDERS), reached as the plans screen reaches
 * them: following nextAfter page by page (100 a page, as the server answers pages by number only up to its capped
 * total). `after` reads page 2 001 of 20; `before` is that page's prevBefore, reading page 2 000 back from it.
 */
async function planCursors(base: string) {
  const headers = (await askers(base)).admin;
  const cursors: Record<string, { after: string; before: string }> = {};
  const read = async (url: string) =>
    (await (await fetch(`${base}${url}`, { headers })).json()) as {
      nextAfter?: string | null;
      prevBefore?: string | null;
    };
  for (const order of DEEP_PLAN_ORDERS) {
    let after: string | null | undefined = null;
    for (let page = 1; page <= 400; page++) {
      after = (await read(`/api/plans?${order}&pageSize=100&page=${page}${after ? `&after=${after}` : ""}`)).nextAfter;
      if (!after) break;
    }
    if (!after) continue;
    const before = (await read(`/api/plans?${order}&page=2001&after=${after}`)).prevBefore;
    if (before) cursors[order] = { after, before };
  }
  return cursors;
}

async function throughput(t: Target) {
  const before = await cpuNow(deps.pool, t.serverPid);
  const run = await autocannon({ url: `${t.base}/api/plans`, connections: 50, duration: 15, headers: t.headers.admin });
  console.log(
    `/api/plans at 50 connections (${t.name}): ${run.requests.average.toFixed(0)} req/s, p50 ${run.latency.p50} ms, ` +
      `p99 ${run.latency.p99} ms, ${run.non2xx} non-2xx, ${run.errors} errors, ${run.timeouts} timeouts; ${load()}`,
  );
  const spent = cpuSpent(before, await cpuNow(deps.pool, t.serverPid));
  const perRequest = (spent.node + spent.db) / run.requests.total;
  console.log(
    `  CPU per request under that load (server, autocannon and the database): ${perRequest.toFixed(2)} ms, ` +
      `so ${os.cpus().length} idle cores would serve about ${((1000 * os.cpus().length) / perRequest).toFixed(0)} req/s`,
  );
}

const deps = await prepare(args.includes("--reseed"));
const capture = captureQueries(deps.pool);
const server = createApp(deps).listen(servePort ?? 0, "127.0.0.1");
await new Promise((r) => server.once("listening", r));
const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
if (servePort !== undefined) {
  console.log(`serving ${BENCH_DB} on ${base} (demo accounts, password "${DEMO_PASSWORD}"); Ctrl-C stops`);
  process.on("SIGINT", () => process.exit(0));
} else {
  const midAudit = (await deps.pool.query("SELECT max(id) / 2 AS id FROM audit_events")).rows[0].id as string;
  const cases = listCases(midAudit, await planCursors(base)).filter(
    (c) => only.length === 0 || only.some((o) => c.label.includes(o)),
  );
  if (args.includes("--explain")) {
    const headers = await askers(base);
    const client = new pg.Client({ connectionString: appUrl });
    await client.connect();
    console.log(`<!-- ${new Date().toISOString()}, ${load()} -->`);
    for (const c of cases) {
      await fetch(base + c.url, { headers: headers[c.as] }); // warm, as the timings do
      const seen = await capture.during(() => fetch(base + c.url, { headers: headers[c.as] }));
      console.log(`\n### ${c.label}\n\n\`GET ${c.url}\` (as ${c.as})\n`);
      for (const q of listStatements(seen)) {
        const f = await explain(client, q);
        console.log(
          `- most rows at one node ${f.maxRows}, buffers ${f.buffers}, ${f.ms.toFixed(2)} ms under EXPLAIN, ` +
            `backend CPU ${f.cpuMs.toFixed(2)} ms per run, ` +
            `seq scans: ${f.seqScans.join(", ") || "none"}${f.spills ? ", SPILLS TO DISK" : ""}\n`,
        );
        console.log("```sql\n" + q.text.trim() + "\n-- " + JSON.stringify(q.values) + "\n```\n");
        console.log("```\n" + f.plan + "\n```\n");
      }
    }
    await client.end();
  } else {
    const dev: Target = { name: "in this process, development mode", base, headers: await askers(base) };
    await measureLists(dev, cases);
    await throughput(dev);
    console.log("\nstarting the compiled production server (npm start's path, NODE_ENV=production)…");
    const prod = await startProduction();
    try {
      const target: Target = {
        name: "compiled, NODE_ENV=production",
        base: prod.base,
        serverPid: prod.pid,
        headers: await askers(prod.base, PROXIED),
      };
      await measureLists(target, cases);
      await throughput(target);
    } finally {
      await prod.stop();
    }
  }
  // Requests autocannon left in flight still finish their queries; ending the pool under them logs spurious 500s.
  await new Promise((r) => {
    server.close(r);
    server.closeAllConnections();
  });
  await new Promise((r) => setTimeout(r, 1000));
  await deps.pool.end();
  await deps.sessionPool.end();
}
