// `npm run bench:scale`: list endpoints on a busy lab's year of data (issue 14), in their own database on the loopback
// cluster (ropewalk_bench_scale, kept between runs: seeding takes minutes). Prints p50/p95 per list endpoint and the
// 50-connection throughput of /api/plans. `npm run bench:scale -- --serve PORT` serves the app on that database until
// interrupted (demo accounts, password "ropewalk-demo"). `--reseed` drops and rebuilds the database first. `--explain`
// prints, per endpoint, each SQL statement it runs with its EXPLAIN (ANALYZE, BUFFERS) plan (markdown; docs/scale-figures.md).
import os from "node:os";
import type { AddressInfo } from "node:net";
import { performance } from "node:perf_hooks";
import autocannon from "autocannon";
import pg from "pg";
import { createApp } from "../../server/app";
import { DEMO_PASSWORD } from "../../server/db/seed";
import { quantile, signIn } from "../http-client";
import { appUrl, BENCH_DB, prepare } from "./prepare";
import { listCases, type Asker } from "./lists";
import { captureQueries, explain, listStatements } from "./explain";
import { cpuNow, cpuSpent, type CpuSample } from "./cpu";

const args = process.argv.slice(2);
const servePort = args.includes("--serve") ? Number(args[args.indexOf("--serve") + 1]) : undefined;

/** The cookies of a signed-in demo account (session and CSRF), for GET requests. */
const cookieOf = async (base: string, email: string) => (await signIn(base, email, DEMO_PASSWORD)).cookie;

async function timings(base: string, cookie: string, url: string, n = 60) {
  const ms: number[] = [];
  let status = 0;
  let bytes = 0;
  let cpu0: CpuSample | undefined;
  for (let i = 0; i < n + 5; i++) {
    if (i === 5) cpu0 = await cpuNow(deps.pool);
    const t = performance.now();
    const r = await fetch(base + url, { headers: { cookie } });
    bytes = (await r.arrayBuffer()).byteLength;
    status = r.status;
    if (status !== 200) throw new Error(`${url}: ${status}`);
    if (i >= 5) ms.push(performance.now() - t); // the first five warm caches and plans
  }
  // The node figure includes this process's own fetch client, so it overstates the server's share a little.
  const spent = cpuSpent(cpu0!, await cpuNow(deps.pool));
  const cpu = { node: spent.node / n, db: spent.db / n };
  return { status, bytes, p50: quantile(ms, 0.5), p95: quantile(ms, 0.95), cpu };
}

const load = () =>
  `load average ${os
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(", ")} on ${os.cpus().length} cores`;

const deps = await prepare(args.includes("--reseed"));
const capture = captureQueries(deps.pool);
const server = createApp(deps).listen(servePort ?? 0, "127.0.0.1");
await new Promise((r) => server.once("listening", r));
const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
if (servePort !== undefined) {
  console.log(`serving ${BENCH_DB} on ${base} (demo accounts, password "${DEMO_PASSWORD}"); Ctrl-C stops`);
  process.on("SIGINT", () => process.exit(0));
} else {
  const cookies: Record<Asker, string> = {
    admin: await cookieOf(base, "admin@ropewalk.test"),
    approver: await cookieOf(base, "approver@ropewalk.test"),
  };
  const midAudit = (await deps.pool.query("SELECT max(id) / 2 AS id FROM audit_events")).rows[0].id as string;
  const cases = listCases(midAudit);
  if (args.includes("--explain")) {
    const client = new pg.Client({ connectionString: appUrl });
    await client.connect();
    console.log(`<!-- ${new Date().toISOString()}, ${load()} -->`);
    for (const c of cases) {
      await fetch(base + c.url, { headers: { cookie: cookies[c.as] } }); // warm, as the timings do
      const seen = await capture.during(() => fetch(base + c.url, { headers: { cookie: cookies[c.as] } }));
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
    console.log(load());
    console.log("endpoint                          status    p50 ms    p95 ms     bytes   CPU ms/request: node    db");
    for (const c of cases) {
      const t = await timings(base, cookies[c.as], c.url);
      console.log(
        `${c.label.padEnd(32)}  ${String(t.status).padEnd(6)} ${t.p50.toFixed(1).padStart(8)}  ${t.p95.toFixed(1).padStart(8)}  ${String(t.bytes).padStart(8)}` +
          `  ${t.cpu.node.toFixed(1).padStart(20)}  ${t.cpu.db.toFixed(1).padStart(5)}`,
      );
    }
    console.log(load());
    const before = await cpuNow(deps.pool);
    const run = await autocannon({
      url: `${base}/api/plans`,
      connections: 50,
      duration: 15,
      headers: { cookie: cookies.admin },
    });
    console.log(
      `/api/plans at 50 connections: ${run.requests.average.toFixed(0)} req/s, p50 ${run.latency.p50} ms, p99 ${run.latency.p99} ms, ` +
        `${run.non2xx} non-2xx, ${run.errors} errors, ${run.timeouts} timeouts; ${load()}`,
    );
    const spent = cpuSpent(before, await cpuNow(deps.pool));
    const perRequest = (spent.node + spent.db) / run.requests.total;
    console.log(
      `  CPU per request under that load (this process, autocannon included, and the database): ${perRequest.toFixed(2)} ms, ` +
        `so ${os.cpus().length} idle cores would serve about ${((1000 * os.cpus().length) / perRequest).toFixed(0)} req/s`,
    );
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
