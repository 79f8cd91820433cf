// Two app instances on one database, as behind a load balancer: each has its own pools, session store, limiter
// stores, outbox delivery and bound-search bookkeeping; they share only PostgreSQL (and the one SMTP sink).
import crypto from "node:crypto";
import { once } from "node:events";
import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { createDb } from "../../server/db/client";
import type { AppDeps } from "../../server/deps";
import { deliverDueMail, enqueueMail } from "../../server/mailer/outbox";
import { startMailSink, type MailSink } from "../../server/mailer/sink";
import { activeBoundSearches, boundSearchEvents } from "../../server/features/bounds/bounds.service";
import { testConfig } from "../setup/app";
import { testDb } from "../setup/db";
import { createTestUser } from "../setup/users";

type Instance = { deps: AppDeps; url: string; server: Server };
const { pool } = testDb();
let sink: MailSink;
let a: Instance;
let b: Instance;

async function startInstance(): Promise<Instance> {
  const { pool: p, db } = createDb(process.env.TEST_DATABASE_URL!, 5);
  const deps: AppDeps = {
    // The sign-in limiters count in PostgreSQL, as every non-test run does; 3 failures per account and address.
    config: testConfig({ smtpUrl: `smtp://127.0.0.1:${sink.port}`, mailRetryBaseMs: 0, rateLimitStore: "postgres" }),
    pool: p,
    db,
  };
  deps.config.login = { ...deps.config.login, perAccountAddress: 3 };
  const server = createApp(deps).listen(0, "127.0.0.1");
  await once(server, "listening");
  return { deps, server, url: `http://127.0.0.1:${(server.address() as AddressInfo).port}` };
}

beforeAll(async () => {
  sink = await startMailSink({ db: testDb().db, port: 0 });
  a = await startInstance();
  b = await startInstance();
});
afterAll(async () => {
  for (const i of [a, b]) {
    i.server.closeAllConnections();
    i.server.close();
    await i.deps.pool.end();
  }
  await sink.close();
});

/** A Cookie header: the cookies already held, updated by a response's Set-Cookie lines (session and CSRF cookies). */
function jar(held: string | undefined, r: Response) {
  const cookies = new Map((held ? held.split("; ") : []).map((c) => [c.split("=")[0], c] as const));
  for (const line of r.headers.getSetCookie()) {
    const pair = line.split(";")[0];
    cookies.set(pair.split("=")[0], pair);
  }
  return [...cookies.values()].join("; ");
}

/** The session as one instance sees it (a fresh one without a cookie), with its CSRF token. */
async function session(i: Instance, cookie?: string) {
  const r = await fetch(`${i.url}/api/auth/session`, { headers: cookie ? { cookie } : {} });
  const body = (await r.json()) as { csrfToken: string; user: { id: number } | null };
  return { cookie: jar(cookie, r), csrf: body.csrfToken, user: body.user };
}
async function login(i: Instance, email: string, password: string, s?: { cookie: string; csrf: string }) {
  const start = s ?? (await session(i));
  const r = await fetch(`${i.url}/api/auth/login`, {
    method: "POST",
    headers: { "content-type": "application/json", cookie: start.cookie, "x-csrf-token": start.csrf },
    body: JSON.stringify({ email, password }),
  });
  const body = (await r.json()) as { csrfToken?: string };
  return { status: r.status, cookie: jar(start.cookie, r), csrf: body.csrfToken };
}

describe("two instances on one database", () => {
  it("a session made on one instance works on the other, reads and state changes alike", async () => {
    const user = await createTestUser(["researcher"]);
    const signedIn = await login(a, user.email, user.password);
    expect(signedIn.status).toBe(200);
    const onB = await session(b, signedIn.cookie);
    expect(onB.user?.id).toBe(user.id);
    const token = await fetch(`${b.url}/api/tokens`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie: signedIn.cookie, "x-csrf-token": signedIn.csrf! },
      body: JSON.stringify({ name: "made on b", scopes: ["export:read"] }),
    });
    expect(token.status).toBe(201);
    const listedOnA = await fetch(`${a.url}/api/tokens`, { headers: { cookie: signedIn.cookie } });
    expect(((await listedOnA.json()) as { tokens: { name: string }[] }).tokens.map((t) => t.name)).toContain(
      "made on b",
    );
  });

  it("sign-in failures count across instances: the limit is shared, not per process", async () => {
    const user = await createTestUser(["viewer"]);
    const statuses: number[] = [];
    // Alternate instances; in per-process memory neither would ever see more than two failures.
    for (const i of [a, b, a, b]) statuses.push((await login(i, user.email, "wrong-password-x")).status);
    expect(statuses).toEqual([401, 401, 401, 429]);
    // The right password is refused too while the window lasts, on either instance.
    expect((await login(a, user.email, user.password)).status).toBe(429);
  });

  it("each outbox row is delivered exactly once while both instances deliver", async () => {
    const tag = crypto.randomBytes(5).toString("hex");
    const kind = `test.${tag}`;
    const N = 60;
    for (let n = 0; n < N; n++)
      await enqueueMail(a.deps.db, { kind, to: [`${tag}@example.test`], subject: `${tag} #${n}`, body: "x" });
    // Both deliver in small batches at the same time until nothing of this kind is left.
    const deliverAll = async (i: Instance) => {
      let sent = 0;
      for (;;) {
        const r = await deliverDueMail(i.deps, { kinds: [kind], limit: 5 });
        sent += r.sent;
        if (r.sent + r.failed === 0) return sent;
      }
    };
    const [sentA, sentB] = await Promise.all([deliverAll(a), deliverAll(b)]);
    expect(sentA + sentB).toBe(N);
    expect(sentA).toBeGreaterThan(0);
    expect(sentB).toBeGreaterThan(0);
    const received = await pool.query<{ subject: string; n: number }>(
      "SELECT subject, count(*)::int AS n FROM mail_sink_messages WHERE subject LIKE $1 GROUP BY subject",
      [`${tag} #%`],
    );
    expect(received.rows).toHaveLength(N);
    expect(received.rows.every((r) => r.n === 1)).toBe(true);
  });

  it("a search started through one instance stops when its client leaves, and leaves no claim behind", async () => {
    const user = await createTestUser(["viewer"]);
    const s = await login(a, user.email, user.password);
    // d = 8192 up to 2^31 over 10 000 grid candidates: left alone it would run until the search timeout.
    const question = { rotaryDim: 8192, targetContext: 2 ** 31, grid: { from: 1e3, to: 1e13, perDecade: 1000 } };
    const leave = new AbortController();
    const started = once(boundSearchEvents, "start");
    const req = fetch(`${a.url}/api/bounds/base`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie: s.cookie, "x-csrf-token": s.csrf! },
      body: JSON.stringify(question),
      signal: leave.signal,
    }).catch(() => undefined);
    await started;
    expect(activeBoundSearches()).toBe(1);
    const claims = () =>
      pool.query(
        "SELECT 1 FROM base_search_results WHERE rotary_dim = 8192 AND answer IS NULL AND target_context = $1",
        [2 ** 31],
      );
    expect((await claims()).rowCount).toBe(1);
    const exited = once(boundSearchEvents, "exit");
    leave.abort();
    await req;
    // The worker's own exit event: nothing (no waiter on the other instance, no claim) keeps the search alive.
    await exited;
    expect(activeBoundSearches()).toBe(0);
    for (let i = 0; i < 50 && (await claims()).rowCount; i++) await new Promise((r) => setTimeout(r, 20));
    expect((await claims()).rowCount).toBe(0);
  }, 60_000);
});
