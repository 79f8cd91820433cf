// PostgreSQL stopped and restarted under a running Ropewalk process. The test owns everything it touches:
// its own cluster (free port, folders under <repo>/.tmp/, started with docker-free-db-scripts) and its own
// server process (`node --import tsx server/index.ts`), so the shared test cluster is never disturbed.
import { execFile, spawn, type ChildProcess } from "node:child_process";
import { execFileSync } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import bcrypt from "bcryptjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb } from "../../server/db/client";
import { migrateDatabase } from "../../server/db/migrate";
import { insertUser } from "../../server/features/users/users.repo";

const repo = resolve(dirname(fileURLToPath(import.meta.url)), "../..");
const LONG = 180_000;
const PASSWORD = "outage-test-password";
const EMAIL = "outage-admin@example.test";
// server/shutdown.ts gives requests 5 s, workers 2 s and the pools 3 s at the most (SHUTDOWN_LIMITS), plus a margin.
const SHUTDOWN_LIMIT_MS = 12_000;

function script(name: string, args: string[], env: Record<string, string>) {
  return new Promise<string>((done, fail) =>
    execFile(
      "bash",
      [join(repo, "docker-free-db-scripts", name), ...args],
      { env: { ...process.env, ...env } },
      (err, stdout, stderr) => (err ? fail(new Error(`${name} failed: ${stderr}`)) : done(stdout)),
    ),
  );
}

async function freePort(): Promise<number> {
  return new Promise((done, fail) => {
    const s = createServer();
    s.once("error", fail);
    s.listen(0, "127.0.0.1", () => {
      const addr = s.address();
      s.close(() => done(typeof addr === "object" && addr ? addr.port : 0));
    });
  });
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Every Set-Cookie of a response as one Cookie header, merged over what the jar already held. */
function mergeCookies(jar: string, res: Response) {
  const map = new Map(
    jar
      .split("; ")
      .filter(Boolean)
      .map((c) => [c.split("=")[0], c] as const),
  );
  for (const line of res.headers.getSetCookie()) {
    const pair = line.split(";")[0];
    map.set(pair.split("=")[0], pair);
  }
  return [...map.values()].join("; ");
}

/** The postmaster of our own cluster and its children (backends, checkpointer, ...), by process id. */
function clusterPids(dataDir: string): number[] {
  const postmaster = Number(readFileSync(join(dataDir, "postmaster.pid"), "utf8").split("\n")[0]);
  const children = execFileSync("pgrep", ["-P", String(postmaster)], { encoding: "utf8" })
    .split("\n")
    .filter(Boolean)
    .map(Number);
  return [postmaster, ...children];
}

describe("PostgreSQL stops and returns under a running app", { timeout: LONG }, () => {
  let tmp = "";
  let env: Record<string, string> = {};
  let base = "";
  let server: ChildProcess | undefined;
  let log = "";
  let cookie = "";

  const call = async (path: string, init: RequestInit = {}) => {
    const started = performance.now();
    const r = await fetch(base + path, {
      ...init,
      headers: { cookie, ...init.headers },
      signal: AbortSignal.timeout(30_000),
    });
    const body = r.headers.get("content-type")?.includes("json") ? await r.json() : await r.text();
    return { status: r.status, body, ms: performance.now() - started, headers: r.headers };
  };
  /** Polls `path` until it answers `status`; returns the time it took and the slowest single answer. */
  const until = async (path: string, status: number, limitMs = 60_000) => {
    const t0 = performance.now();
    let slowest = 0;
    for (;;) {
      const r = await call(path);
      slowest = Math.max(slowest, r.ms);
      if (r.status === status) return { afterMs: performance.now() - t0, slowest, last: r };
      if (performance.now() - t0 > limitMs)
        throw new Error(`${path} never answered ${status}; last ${r.status} ${JSON.stringify(r.body)}`);
      await sleep(100);
    }
  };

  beforeAll(async () => {
    mkdirSync(join(repo, ".tmp"), { recursive: true });
    tmp = mkdtempSync(join(repo, ".tmp", "db-outage-"));
    env = { PGPORT: String(await freePort()), RW_PGDATA: join(tmp, "data"), RW_PGRUN: join(tmp, "run") };
    const out = await script("start.sh", ["rw_outage"], env);
    const url = /^DATABASE_URL=(\S+)/m.exec(out)![1];
    // Migrations as the owner role, the rest as the app role, as in production.
    await migrateDatabase(/^MIGRATION_DATABASE_URL=(\S+)/m.exec(out)![1], url);
    const { pool, db } = createDb(url, 1);
    // A low bcrypt cost is enough here: this test is about the database, not about password hashing.
    await insertUser(db, {
      email: EMAIL,
      name: "Outage Admin",
      roles: ["admin"],
      passwordHash: await bcrypt.hash(PASSWORD, 4),
    });
    await pool.end();

    const port = await freePort();
    base = `http://127.0.0.1:${port}`;
    server = spawn(process.execPath, ["--import", "tsx", join(repo, "server/index.ts")], {
      cwd: repo,
      env: {
        ...process.env,
        NODE_ENV: "test",
        DATABASE_URL: url,
        HOST: "127.0.0.1",
        PORT: String(port),
        PUBLIC_URL: base,
        CLIENT_DIR: join(tmp, "no-client"),
        SMTP_URL: "smtp://127.0.0.1:9",
        DB_CONNECT_TIMEOUT_MS: "2000",
        DB_STATEMENT_TIMEOUT_MS: "3000",
      },
      stdio: ["ignore", "pipe", "pipe"],
    });
    server.stdout!.on("data", (c) => (log += c));
    server.stderr!.on("data", (c) => (log += c));
    for (let i = 0; ; i++) {
      if (server.exitCode !== null) throw new Error(`server exited at start:\n${log}`);
      const up = await fetch(`${base}/api/health`).then(
        (r) => r.status === 200,
        () => false,
      );
      if (up) break;
      if (i > 600) throw new Error(`server did not start:\n${log}`);
      await sleep(100);
    }
    const anon = await fetch(`${base}/api/auth/session`);
    cookie = mergeCookies("", anon);
    const { csrfToken } = (await anon.json()) as { csrfToken: string };
    const login = await fetch(`${base}/api/auth/login`, {
      method: "POST",
      headers: { cookie, origin: base, "content-type": "application/json", "x-csrf-token": csrfToken },
      body: JSON.stringify({ email: EMAIL, password: PASSWORD }),
    });
    expect(login.status).toBe(200);
    cookie = mergeCookies(cookie, login);
  }, LONG);

  afterAll(async () => {
    if (server && server.exitCode === null) {
      const exited = new Promise((r) => server!.once("exit", r));
      server.kill("SIGTERM");
      // Only a safety net when a test above failed before the shutdown test ran: kill after 15 s.
      const late = setTimeout(() => server!.kill("SIGKILL"), 15_000);
      await exited;
      clearTimeout(late);
    }
    if (tmp) {
      await script("stop.sh", [], env).catch(() => undefined);
      rmSync(tmp, { recursive: true, force: true });
    }
  }, LONG);

  it("answers 503 while it is down, stays alive, and recovers without a restart", async () => {
    expect((await call("/api/users")).status).toBe(200);

    await script("stop.sh", [], env);
    const down = await until("/api/health", 503);
    expect(down.last.body).toEqual({ ok: false, db: "down" });
    expect(down.slowest).toBeLessThan(5000); // the requirement: health answers 503 within 5 s

    const users = await call("/api/users");
    expect(users.status).toBe(503);
    expect(users.body.error.code).toBe("database_unavailable");
    expect(users.headers.get("retry-after")).toBe("5");
    const models = await call("/api/models");
    expect([models.status, models.body.error?.code]).toEqual([503, "database_unavailable"]);
    expect(server!.exitCode).toBeNull();

    await script("start.sh", ["rw_outage"], env);
    const back = await until("/api/health", 200);
    const again = await call("/api/users");
    expect(again.status).toBe(200); // same session: it was stored in the database and survives the outage
    expect(server!.exitCode).toBeNull();
    // Connection internals (the cancel key, the client object) never reach the log.
    expect(log).not.toMatch(/secretKey|processID|_ending/);
    console.log(
      `[db outage] health 503 after ${Math.round(down.afterMs)} ms (slowest answer ${Math.round(down.slowest)} ms); ` +
        `back to 200 ${Math.round(back.afterMs)} ms after PostgreSQL was started again`,
    );
  });

  it("a hung PostgreSQL (its processes stopped) gives 503s within seconds, not long hangs, and recovers", async () => {
    expect((await call("/api/users")).status).toBe(200);
    const pids = clusterPids(env.RW_PGDATA);
    for (const pid of pids) process.kill(pid, "SIGSTOP");
    let health, users;
    try {
      health = await call("/api/health");
      users = await call("/api/users");
    } finally {
      for (const pid of pids) process.kill(pid, "SIGCONT");
    }
    expect(health.status).toBe(503);
    expect(health.ms).toBeLessThan(5000);
    expect([users.status, users.body.error?.code]).toEqual([503, "database_unavailable"]);
    // statement timeout 3 s plus the client's one-second read margin (DB_STATEMENT_TIMEOUT_MS in the server's env)
    expect(users.ms).toBeLessThan(10_000);
    const back = await until("/api/users", 200);
    expect(server!.exitCode).toBeNull();
    console.log(
      `[db hung] health 503 in ${Math.round(health.ms)} ms, /api/users 503 in ${Math.round(users.ms)} ms; ` +
        `served again ${Math.round(back.afterMs)} ms after the processes were resumed`,
    );
  });
  it("after the outage, SIGTERM ends the process cleanly within seconds, with no SIGKILL", async () => {
    // The outage above left a failed transaction behind (a pool connection that never came back, until drizzle-orm was
    // patched: tests/api/db-transaction-release.test.ts); this call leaves an idle keep-alive socket. Neither may hold
    // the stop: exit code 0 means every stage of server/shutdown.ts finished within its limit.
    const idle = await call("/api/users");
    expect(idle.status).toBe(200);
    const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((r) =>
      server!.once("exit", (code, signal) => r({ code, signal })),
    );
    const t0 = performance.now();
    server!.kill("SIGTERM");
    const result = await Promise.race([exited, sleep(SHUTDOWN_LIMIT_MS + 5000).then(() => "still running" as const)]);
    const ms = performance.now() - t0;
    expect(result, log).toEqual({ code: 0, signal: null });
    expect(ms).toBeLessThan(SHUTDOWN_LIMIT_MS);
    console.log(`[db outage] exited ${Math.round(ms)} ms after SIGTERM`);
  });
});
