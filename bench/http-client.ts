import http from "node:http";
import os from "node:os";
import { performance } from "node:perf_hooks";
import autocannon from "autocannon";
import type pg from "pg";
import { cpuNow, cpuSpent, processCpuMs } from "./scale/cpu";

// A tiny HTTP client for the speed bench: node:http, so bytes on the wire (before any decoding) can be counted; and
// `hammer`, the load runs (autocannon).

export interface RawAnswer {
  status: number;
  headers: http.IncomingHttpHeaders;
  /** bytes as sent (still compressed when Content-Encoding is set) */
  body: Buffer;
  ms: number;
}

const agent = new http.Agent({ keepAlive: true, maxSockets: 64 });

export function send(url: string, opts: { method?: string; headers?: Record<string, string>; body?: string } = {}) {
  return new Promise<RawAnswer>((resolve, reject) => {
    const t = performance.now();
    const req = http.request(url, { method: opts.method ?? "GET", headers: opts.headers, agent }, (res) => {
      const chunks: Buffer[] = [];
      res.on("data", (c: Buffer) => chunks.push(c));
      res.on("end", () =>
        resolve({
          status: res.statusCode ?? 0,
          headers: res.headers,
          body: Buffer.concat(chunks),
          ms: performance.now() - t,
        }),
      );
      res.on("error", reject);
    });
    req.on("error", reject);
    req.end(opts.body);
  });
}

/** Signs a demo account in; returns the headers a JSON POST needs (cookies and the CSRF token). */
export async function signIn(base: string, email: string, password: string, extra: Record<string, string> = {}) {
  const jar = new Map<string, string>();
  const take = (h: http.IncomingHttpHeaders) => {
    for (const c of h["set-cookie"] ?? []) {
      const kv = c.split(";")[0];
      jar.set(kv.slice(0, kv.indexOf("=")), kv.slice(kv.indexOf("=") + 1));
    }
    return [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  };
  const s = await send(`${base}/api/auth/session`, { headers: extra });
  let cookie = take(s.headers);
  const csrf = (JSON.parse(s.body.toString()) as { csrfToken: string }).csrfToken;
  const login = await send(`${base}/api/auth/login`, {
    method: "POST",
    headers: { ...extra, "content-type": "application/json", cookie, "x-csrf-token": csrf },
    body: JSON.stringify({ email, password }),
  });
  if (login.status !== 200) throw new Error(`sign-in answered ${login.status}: ${login.body.toString()}`);
  cookie = take(login.headers);
  const token = (JSON.parse(login.body.toString()) as { csrfToken: string }).csrfToken;
  return { ...extra, "content-type": "application/json", cookie, "x-csrf-token": token };
}

export const median = (xs: number[]) => quantile(xs, 0.5);
export function quantile(xs: number[], p: number) {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(p * s.length))];
}

/** Requests each load run sends before it is measured (JIT, pool threads and keep-alive connections warm up). */
export const HAMMER_WARM = 300;
/** Requests each load run measures. */
export const HAMMER_N = 2000;

export interface Hammered {
  rps: number;
  p50: number;
  p99: number;
  failed: string;
  /** CPU milliseconds per measured request: the server process, its database backends, this process (autocannon). */
  cpu: { server: number; db: number; client: number };
}

export const loadNow = () =>
  `load average ${os
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(", ")} on ${os.cpus().length} cores`;

/**
 * POSTs `body` (a fixed string, or a new one per request) at 50 connections with autocannon: warm-up requests first,
 * then HAMMER_N measured ones. autocannon writes prepared request bytes and counts the answer's bytes without
 * parsing or keeping them, so the load generator costs far less CPU than a node:http client that buffers each answer
 * (docs/scale-figures.md "Analyses request, where the time goes"); its CPU is still measured and printed, since it
 * runs on the same cores. `server.pool` is a pool on the server's database: its backends' CPU is counted.
 */
export async function hammer(
  url: string,
  headers: Record<string, string>,
  body: string | (() => string),
  server: { pid?: number; pool?: pg.Pool | null },
): Promise<Hammered> {
  const request = typeof body === "string" ? { body } : { setupRequest: (r: object) => ({ ...r, body: body() }) };
  // autocannon notices the last answer only at its next sample tick (every sampleInt ms; the default 1 000 would
  // round a 2.3 s run up to 3 s), so it samples every 20 ms.
  const run = (amount: number) =>
    autocannon({ url, method: "POST", connections: 50, amount, headers, requests: [request], sampleInt: 20 });
  await run(HAMMER_WARM);
  const sample = async () => {
    const u = process.cpuUsage();
    return {
      mine: server.pool
        ? await cpuNow(server.pool)
        : { node: (u.user + u.system) / 1000, db: new Map<number, number>() },
      server: server.pid === undefined ? 0 : processCpuMs(server.pid),
    };
  };
  const before = await sample();
  const r = await run(HAMMER_N);
  const after = await sample();
  const spent = cpuSpent(before.mine, after.mine);
  const n = r.requests.total;
  const failed = [
    r.non2xx
      ? `${r.non2xx}× non-2xx (${Object.entries(r.statusCodeStats as Record<string, { count: number }>)
          .filter(([code]) => !code.startsWith("2"))
          .map(([code, { count }]) => `${count}× ${code}`)
          .join(", ")})`
      : "",
    r.errors ? `${r.errors} errors` : "",
    r.timeouts ? `${r.timeouts} timeouts` : "",
  ]
    .filter(Boolean)
    .join(", ");
  return {
    rps: n / r.duration,
    p50: r.latency.p50,
    p99: r.latency.p99,
    failed,
    cpu: { server: (after.server - before.server) / n, db: spent.db / n, client: spent.node / n },
  };
}
