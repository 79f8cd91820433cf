import { execFileSync } from "node:child_process";
import path from "node:path";
import pg from "pg";
import { LOCAL_APP_ROLE, LOCAL_OWNER_ROLE } from "../server/config";
import { everyMethodQuestion } from "./analysis-question";
import { HAMMER_N, HAMMER_WARM, hammer, loadNow, signIn } from "./http-client";
import { startProductionApp } from "./production-app";

// `npm run bench -- analyses`: only the POST /api/analyses load runs of the speed table (8 methods, 50 connections,
// autocannon; a new question each time in both forms, and the same question again), ANALYSES_ROUNDS times (2).
// With BENCH_BEFORE=<checkout of another commit, its dependencies installed> that checkout's production server runs
// beside this one on the same database and the rounds alternate between them, so before and after share the machine's
// load (docs/scale-figures.md "New questions: what repeats between them"). Each line prints the load average and the
// CPU per request of the server, its database backends and the load generator.

const root = path.resolve(import.meta.dirname, "..");
const DEMO = { email: "researcher@ropewalk.test", password: "ropewalk-demo" };

export async function runAnalysesLoadBench() {
  const pgPort = process.env.PGPORT ?? "54329";
  execFileSync("bash", [path.join(root, "docker-free-db-scripts/start.sh"), "ropewalk"], {
    stdio: ["ignore", "ignore", "inherit"],
  });
  const options = {
    databaseUrl: `postgres://${LOCAL_APP_ROLE}@127.0.0.1:${pgPort}/ropewalk`,
    migrationUrl: `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${pgPort}/ropewalk`,
    seed: true,
    tries: 600,
  };
  const apps: { name: string; app: Awaited<ReturnType<typeof startProductionApp>> }[] = [];
  const owner = new pg.Pool({
    connectionString: `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${pgPort}/ropewalk`,
    max: 1,
  });
  try {
    const before = process.env.BENCH_BEFORE;
    if (before) {
      const other = (await import(path.resolve(before, "bench/production-app.ts"))) as {
        startProductionApp: typeof startProductionApp;
      };
      apps.push({ name: "before", app: await other.startProductionApp(options) });
    }
    apps.push({ name: before ? "after" : "this", app: await startProductionApp(options) });
    const analysis = everyMethodQuestion();
    // Every new question in the run is new to both servers: the target moves by one each time.
    let asked = Date.now() % 1_000_000;
    const fresh = (form?: "columns") => () =>
      JSON.stringify({ ...analysis, targetContext: analysis.targetContext + ++asked, ...(form ? { form } : {}) });
    const kinds = [
      ["columns, each new", fresh("columns")],
      ["rows, each new", fresh()],
      ["columns, asked again", JSON.stringify({ ...analysis, form: "columns" })],
    ] as const;
    console.log(
      `\nPOST /api/analyses (${analysis.methods.length} methods), autocannon, 50 connections, ${HAMMER_WARM} requests ` +
        `to warm up, then ${HAMMER_N}; CPU ms per request: server / database / load generator`,
    );
    const headers = new Map<string, Record<string, string>>();
    for (const { name, app } of apps)
      headers.set(name, await signIn(app.base, DEMO.email, DEMO.password, { "x-forwarded-proto": "https" }));
    const rounds = Number(process.env.ANALYSES_ROUNDS ?? 2);
    for (let round = 0; round < rounds; round++)
      for (const { name, app } of apps)
        for (const [kind, body] of kinds) {
          const h = { ...headers.get(name)!, "accept-encoding": "gzip" };
          const r = await hammer(`${app.base}/api/analyses`, h, body, { pid: app.pid, pool: owner });
          const at = new Date().toISOString().slice(11, 19);
          console.log(
            `  ${at} ${name.padEnd(6)} ${kind.padEnd(22)} ${r.rps.toFixed(0).padStart(4)} req/s, p99 ` +
              `${r.p99.toFixed(0).padStart(4)} ms; CPU ${r.cpu.server.toFixed(2)} / ${r.cpu.db.toFixed(2)} / ` +
              `${r.cpu.client.toFixed(2)}${r.failed ? ` (not 200: ${r.failed})` : ""}; ${loadNow()}`,
          );
        }
  } finally {
    await owner.end();
    for (const { app } of apps) await app.stop();
  }
}
